/**
 * Rim and sill: the joints where the framing meets the foundation and where floors meet the
 * walls between storeys.
 */
import {
  COST_DEMO,
  EFFECT_SEALANT,
  lifeFromMemory,
  memory,
  practice,
  range,
} from './building-blocks.ts';
import { uses } from './materials.ts';
import type { MeasureType } from './types.ts';

export const RIM_AND_SILL_MEASURES: readonly MeasureType[] = [
  {
    id: 'rim-joist',
    name: 'Rim joist above the foundation',
    group: 'rimAndSill',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.04, 0.15, 0.5),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 1.5, laborHoursPerUnit: 0.05 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring'],
    materials: [
      uses(
        'foam-board-sheet',
        0.75,
        'A piece in each rim bay: 14.5 × 9.25 in = 0.93 ft² every 16 in, 0.93 × 12 / 16 = 0.70 ft² per ft, taken as 0.75',
      ),
      uses(
        'foam-can-24oz',
        3,
        'Round each piece: 2 × (14.5 + 9.25) / 12 = 4.0 ft every 16 in, 4.0 × 12 / 16 = 3.0 ft per ft',
      ),
    ],
    sources: {
      leakageArea: memory(
        'Joints of sill, rim and subfloor per foot of perimeter; recalled from component tables and basement tests',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the rim joist bays from the basement or crawlspace with spray foam, or with rigid board cut to fit and sealed at its edges.',
  },
  {
    id: 'band-joist',
    name: 'Band joist between storeys',
    group: 'rimAndSill',
    location: 'wall',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.04, 0.15, 0.5),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 2, laborHoursPerUnit: 0.1 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'lead-safe-work'],
    materials: [
      uses(
        'foam-can-24oz',
        2,
        'Through openings, the band’s joints above and below it: 2 ft of bead per ft',
      ),
    ],
    sources: {
      leakageArea: memory('Taken as the rim joist per foot; not separately measured'),
      effectiveness: practice(
        'Reached only through openings or from outside, so less of the joint is sealed than at a basement rim',
      ),
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the band joist between floors where it can be reached, through small openings or during siding work.',
  },
  {
    id: 'sill-plate',
    name: 'Sill plate on the foundation',
    group: 'rimAndSill',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.03, 0.1, 0.4),
    sealingEffectiveness: range(0.6, 0.8, 0.9),
    defaultCost: { materialsUsdPerUnit: 0.5, laborHoursPerUnit: 0.03 },
    cautionCodes: ['spray-foam-handling'],
    materials: [
      uses(
        'backer-rod',
        1,
        'The sill-to-foundation gap is often wider than a bead can bridge: one run of rod per ft',
      ),
      uses('sealant-tube', 1, 'One bead over the rod per ft'),
    ],
    sources: {
      leakageArea: memory(
        'Sill-to-foundation joint per foot, uncaulked; recalled component values',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description: 'Caulks or foams the joint between the sill plate and the foundation wall.',
  },
];
