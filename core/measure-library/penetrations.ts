/**
 * Penetrations: pipes, wires, electrical boxes, duct boots and the vents of fans and dryers.
 */
import {
  COST_DEMO,
  EFFECT_MOVING,
  EFFECT_SEALANT,
  in2FromCm2,
  lifeFromMemory,
  memory,
  nistNote,
  practice,
  range,
} from './building-blocks.ts';
import { uses } from './materials.ts';
import type { MeasureType } from './types.ts';

export const PENETRATION_MEASURES: readonly MeasureType[] = [
  {
    id: 'plumbing-penetrations',
    name: 'Pipe penetrations',
    group: 'penetration',
    location: 'floor',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.1, 0.5, 2),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 4, laborHoursPerUnit: 0.25 },
    cautionCodes: ['spray-foam-handling', 'lead-safe-work'],
    materials: [
      uses(
        'foam-can-12oz',
        1,
        'Round a pipe hole of about 3.5 in: π × 3.5 / 12 = 0.92 ft, taken as 1',
      ),
    ],
    sources: {
      leakageArea: practice(
        'Oversized holes around supply and drain pipes through floors and walls',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description: 'Seals around pipes where they pass through floors and walls with foam or caulk.',
  },
  {
    id: 'wiring-penetrations',
    name: 'Wiring penetrations',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.05, 0.2, 0.6),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 2, laborHoursPerUnit: 0.15 },
    cautionCodes: ['knob-and-tube-wiring', 'spray-foam-handling', 'lead-safe-work'],
    materials: [
      uses(
        'sealant-tube',
        0.5,
        'A drilled cable hole of about 3/4 in is π × 0.75 / 12 = 0.2 ft round; 0.5 ft of bead fills and covers it',
      ),
    ],
    sources: {
      leakageArea: memory('Drilled holes for cables through plates and walls; recalled sizes'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description: 'Seals holes drilled for cables through top plates, floors and exterior walls.',
  },
  {
    id: 'electrical-box-gaskets',
    name: 'Outlet and switch gaskets on exterior walls',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.05, 0.15, 0.4),
    sealingEffectiveness: range(0.3, 0.5, 0.7),
    defaultCost: { materialsUsdPerUnit: 0.5, laborHoursPerUnit: 0.05 },
    cautionCodes: ['knob-and-tube-wiring'],
    materials: [
      uses('outlet-gasket', 1, 'One gasket per cover plate'),
      uses(
        'sealant-tube',
        1,
        'Round a single-gang box of about 2 × 3 in where it meets the drywall: 2 × (2 + 3) / 12 = 0.83 ft, taken as 1',
      ),
    ],
    sources: {
      leakageArea: memory('ASHRAE component leakage table, outlets and switches without gaskets'),
      effectiveness: practice('Gaskets under cover plates stop the leak at the plate only'),
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Fits foam gaskets under outlet and switch cover plates on exterior walls and seals gaps around the boxes.',
  },
  {
    id: 'duct-boots',
    name: 'Duct boots to ceiling and floor',
    group: 'penetration',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(1), in2FromCm2(5), 3),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 5, laborHoursPerUnit: 0.3 },
    cautionCodes: ['lead-safe-work'],
    materials: [
      uses(
        'duct-mastic-pail',
        2.5,
        'Round a 4 × 10 in boot where it meets the drywall or floor: 2 × (4 + 10) / 12 = 2.3 ft, taken as 2.5',
      ),
    ],
    sources: {
      leakageArea: nistNote('HVAC ceiling penetration', '1 cm² per item', '5 cm² per item'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Removes each register and seals the gap between the duct boot and the drywall or floor with caulk or mastic.',
  },
  {
    id: 'exhaust-fan-vents',
    name: 'Bath and exhaust fan housings',
    group: 'penetration',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(10), in2FromCm2(20), 6),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 15, laborHoursPerUnit: 0.75 },
    cautionCodes: ['exhaust-termination', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses(
        'sealant-tube',
        3.5,
        'The housing to the ceiling, about 10 × 10 in: 4 × 10 / 12 = 3.3 ft, taken as 3.5',
      ),
      uses('backdraft-damper', 1, 'One damper per fan, where none works'),
    ],
    sources: {
      leakageArea: nistNote('bathroom exhaust vent', '10 cm² per item', '20 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the fan housing to the ceiling, repairs or adds the backdraft damper, and makes sure the duct ends outdoors.',
  },
  {
    id: 'range-hood-damper',
    name: 'Kitchen exhaust damper',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(5), in2FromCm2(40), 10),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 0.75 },
    cautionCodes: ['exhaust-termination'],
    materials: [
      uses('backdraft-damper', 1, 'One damper per hood'),
      uses(
        'sealant-tube',
        2,
        'Round a 7-inch duct where it passes the wall: π × 7 / 12 = 1.8 ft, taken as 2',
      ),
    ],
    sources: {
      leakageArea: nistNote('kitchen exhaust vent', '5 cm² per item', '40 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Replaces a stuck or missing backdraft damper on the kitchen exhaust and seals the duct where it passes the wall.',
  },
  {
    id: 'dryer-vent',
    name: 'Dryer vent',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.5, 1.5, 5),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 30, laborHoursPerUnit: 1 },
    cautionCodes: ['dryer-vent'],
    materials: [
      uses('metal-dryer-duct', 8, 'A run of about 8 ft from dryer to wall'),
      uses('dryer-vent-hood', 1, 'One hood outside'),
      uses(
        'sealant-tube',
        1.5,
        'Round the 4-inch duct at the wall: π × 4.25 / 12 = 1.1 ft, taken as 1.5',
      ),
    ],
    sources: {
      leakageArea: memory(
        'ASHRAE component leakage table, dryer vent with and without a working damper; recalled',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Replaces a torn or plastic dryer duct with metal duct, fits a hood with a working damper outside, and seals the wall opening around the duct.',
  },
];
