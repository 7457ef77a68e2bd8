/**
 * Other measures: the garage-to-house wall, the fireplace damper and the floor-wall joints.
 */
import {
  COST_DEMO,
  EFFECT_SEALANT,
  in2PerFtFromCm2PerM,
  lifeFromMemory,
  nistNote,
  practice,
  range,
} from './building-blocks.ts';
import { uses } from './materials.ts';
import type { MeasureType } from './types.ts';

export const OTHER_MEASURES: readonly MeasureType[] = [
  {
    id: 'garage-house-wall',
    name: 'Wall and ceiling between garage and house',
    group: 'other',
    location: 'wall',
    unit: 'job',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(5, 15, 40),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 60, laborHoursPerUnit: 3 },
    cautionCodes: [
      'attached-garage',
      'spray-foam-handling',
      'lead-safe-work',
      'knob-and-tube-wiring',
    ],
    materials: [
      uses(
        'fire-rated-sealant-tube',
        60,
        'About 40 ft of rim and 20 ft round penetrations between garage and house, 60 ft in all',
      ),
      uses('weatherstrip', 17, 'The house door’s two 7-ft jambs and 3-ft head, 17 ft'),
      uses('door-sweep', 1, 'One sweep on the house door'),
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate for penetrations, the rim and the door between an attached garage and the house',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals penetrations, the rim and the door frame between garage and house with fire-rated sealant and weatherstrips the house door.',
  },
  {
    id: 'fireplace-damper',
    name: 'Fireplace damper',
    group: 'other',
    location: 'flue',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(10, 30, 60),
    sealingEffectiveness: range(0.5, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 180, laborHoursPerUnit: 1.5 },
    cautionCodes: ['fireplace'],
    materials: [
      uses('chimney-seal', 1, 'One per flue'),
      uses(
        'high-temperature-sealant-tube',
        12,
        'The surround to the wall round an opening of about 4 × 2 ft: 2 × (4 + 2) = 12 ft',
      ),
    ],
    sources: {
      leakageArea: {
        mark: 'published',
        citation:
          'Energy Options Northwest (1990) field study: ELA of closed fireplace dampers averaged about 30 in²; as reported by Battic Door, "Seal Fireplace Dampers With Weatherstripping to Conserve Energy" (environmental-expert.com); secondary source, low and high are our allowance',
      },
      effectiveness: practice(
        'A top-sealing damper or a chimney plug closes most of a leaky damper; the range allows for poor fit',
      ),
      life: lifeFromMemory('10 years; gaskets and plugs wear'),
      cost: COST_DEMO,
    },
    description:
      'Fits a top-sealing damper or a removable chimney plug and seals the fireplace surround to the wall.',
  },
  {
    id: 'baseboard-sealing',
    name: 'Baseboards and floor-wall joints',
    group: 'other',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2PerFtFromCm2PerM(0.8), in2PerFtFromCm2PerM(4), 0.4),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 0.25, laborHoursPerUnit: 0.03 },
    cautionCodes: ['lead-safe-work'],
    materials: [uses('sealant-tube', 1, 'One bead along the floor-wall joint per ft')],
    sources: {
      leakageArea: nistNote('floor-wall joint (per metre)', '0.8 cm²/m', '4 cm²/m'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Caulks the joint between floor and wall along exterior walls, behind or under the baseboard.',
  },
];
