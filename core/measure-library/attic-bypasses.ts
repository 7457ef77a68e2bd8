/**
 * Attic bypasses: holes from the living space into the attic (top plates, chases, hatches and
 * stairs, recessed lights, plumbing and flue chases, kneewalls, soffits).
 */
import {
  COST_DEMO,
  EFFECT_MOVING,
  EFFECT_RIGID,
  EFFECT_SEALANT,
  in2FromCm2,
  in2PerFtFromCm2PerM,
  lifeFromMemory,
  memory,
  nistNote,
  practice,
  range,
} from './building-blocks.ts';
import { uses } from './materials.ts';
import type { MeasureType } from './types.ts';

export const ATTIC_BYPASS_MEASURES: readonly MeasureType[] = [
  {
    id: 'attic-top-plates',
    name: 'Top plates from the attic',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(in2PerFtFromCm2PerM(0.5), in2PerFtFromCm2PerM(1.5), 0.25),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 0.35, laborHoursPerUnit: 0.04 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses(
        'sealant-tube',
        1.5,
        'A bead along each joint of plate and ceiling drywall: two joints on an interior wall, one on an exterior wall; 1.5 ft of bead per ft of plate on average',
      ),
    ],
    sources: {
      leakageArea: nistNote('ceiling-wall joint (per metre)', '0.5 cm²/m', '1.5 cm²/m'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years, sealant protected in the attic'),
      cost: COST_DEMO,
    },
    description:
      'From the attic, the crew pulls back insulation and seals the joint between wall top plates and the ceiling below with caulk or foam.',
  },
  {
    id: 'attic-chases',
    name: 'Open chases and wall cavities to the attic',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(4, 12, 40),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 1.5 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses('foam-board-sheet', 8, 'One cap over a chase opening of about 2 × 4 ft = 8 ft²'),
      uses('foam-can-24oz', 12, 'A bead round the cap: 2 × (2 + 4) = 12 ft'),
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of an open duct chase or balloon-frame bay seen from the attic; sizes vary widely',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years for rigid blocking'),
      cost: COST_DEMO,
    },
    description:
      'Caps open chases and wall cavities at the attic floor with rigid board or drywall cut to fit, sealing the edges with foam or caulk.',
  },
  {
    id: 'attic-hatch',
    name: 'Attic hatch',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(18), in2FromCm2(30), 10),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 30, laborHoursPerUnit: 1 },
    cautionCodes: ['lead-safe-work', 'vermiculite'],
    materials: [
      uses(
        'weatherstrip',
        9,
        'Round a 22 × 30 in hatch frame: 2 × (22 + 30) / 12 = 8.7 ft, taken as 9',
      ),
      uses(
        'foam-board-sheet',
        5,
        'One layer on the back of the 22 × 30 in panel: 22 × 30 / 144 = 4.6 ft², taken as 5',
      ),
      uses('sealant-tube', 9, 'The frame’s trim to the ceiling, the same 9 ft'),
    ],
    sources: {
      leakageArea: nistNote('attic door', '18 cm² per item', '30 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years; the gasket wears'),
      cost: COST_DEMO,
    },
    description:
      'Weatherstrips the hatch frame, adds latches or weight so the panel presses on the gasket, and insulates the back of the panel.',
  },
  {
    id: 'attic-pull-down-stair',
    name: 'Attic pull-down stair',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(4, 10, 25),
    sealingEffectiveness: range(0.5, 0.75, 0.9),
    defaultCost: { materialsUsdPerUnit: 150, laborHoursPerUnit: 2 },
    cautionCodes: ['lead-safe-work', 'vermiculite'],
    materials: [
      uses('attic-stair-cover', 1, 'One cover per stair'),
      uses(
        'sealant-tube',
        14,
        'The stair frame to the ceiling round a 25 × 54 in opening: 2 × (25 + 54) / 12 = 13.2 ft, taken as 14',
      ),
    ],
    sources: {
      leakageArea: memory(
        'Folding stairs leak more than a flat hatch: gaps at the frame, hinges and rough opening; sizes recalled from field tests',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the stair frame to the ceiling and fits an insulated, gasketed cover over the stair on the attic side.',
  },
  {
    id: 'recessed-lights',
    name: 'Recessed lights',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.25, 0.6, 3),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 0.5 },
    cautionCodes: ['recessed-light-rating', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses('recessed-light-cover', 1, 'One cover per fixture'),
      uses(
        'sealant-tube',
        4.5,
        'The cover’s base to the ceiling, about 13 × 13 in: 4 × 13 / 12 = 4.3 ft, taken as 4.5',
      ),
    ],
    sources: {
      leakageArea: memory(
        'ASHRAE Handbook of Fundamentals component leakage table, recessed light about 4 cm² (0.6 in²) each as best estimate; the high value reflects field reports of 2–3 in² for old non-IC cans',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Covers each non-airtight fixture from the attic with a cover rated for the purpose and seals it to the ceiling, or has it replaced with an IC-AT fixture.',
  },
  {
    id: 'plumbing-chase',
    name: 'Plumbing chase',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(3, 10, 30),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 20, laborHoursPerUnit: 1 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses('foam-board-sheet', 6, 'One cap over a chase of about 2 × 3 ft = 6 ft²'),
      uses(
        'foam-can-24oz',
        13,
        'Round the cap, 2 × (2 + 3) = 10 ft, and about 3 ft round the pipes',
      ),
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of the open wall or vent-stack chase above a bathroom or kitchen',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Blocks the plumbing wall or vent-stack chase at the attic floor with rigid board and seals around the pipes.',
  },
  {
    id: 'flue-chase',
    name: 'Flue and chimney chase',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(6, 20, 60),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 40, laborHoursPerUnit: 2 },
    cautionCodes: ['flue-clearance', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses(
        'sheet-metal',
        6,
        'Flashing over a gap round the flue of about 2 × 3 ft = 6 ft²; no foam or board near the flue',
      ),
      uses(
        'high-temperature-sealant-tube',
        13,
        'The metal’s edge, 2 × (2 + 3) = 10 ft, and round a 10-inch flue, π × 10 / 12 = 2.6 ft, taken as 3',
      ),
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of the gap around a chimney or flue where it passes the attic floor',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years for sheet metal'),
      cost: COST_DEMO,
    },
    description:
      'Closes the gap around the flue or chimney with sheet metal and high-temperature sealant, keeping the required clearance to anything combustible.',
  },
  {
    id: 'kneewalls',
    name: 'Kneewalls and the floor behind them',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.2, 0.6, 2),
    sealingEffectiveness: range(0.6, 0.8, 0.9),
    defaultCost: { materialsUsdPerUnit: 2.5, laborHoursPerUnit: 0.15 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite', 'lead-safe-work'],
    materials: [
      uses(
        'foam-board-sheet',
        0.75,
        'A block in each joist bay under the wall: 14.5 × 9.25 in = 0.93 ft² every 16 in, 0.93 × 12 / 16 = 0.70 ft² per ft, taken as 0.75',
      ),
      uses(
        'foam-can-24oz',
        3,
        'Round each block: 2 × (14.5 + 9.25) / 12 = 4.0 ft every 16 in, 4.0 × 12 / 16 = 3.0 ft per ft',
      ),
    ],
    sources: {
      leakageArea: memory(
        'Open joist bays under kneewalls; per-foot sizes recalled from zonal pressure tests of storey-and-a-half houses',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Blocks the floor joist bays beneath the kneewall with rigid material and seals the kneewall itself, including its access door.',
  },
  {
    id: 'dropped-soffit',
    name: 'Dropped soffit',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(4, 12, 40),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 35, laborHoursPerUnit: 2 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    materials: [
      uses('foam-board-sheet', 20, 'One cover over a soffit of about 10 × 2 ft = 20 ft²'),
      uses('foam-can-24oz', 24, 'Round the cover: 2 × (10 + 2) = 24 ft'),
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate for a kitchen or bath soffit open to the attic along its length',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Covers the top of the soffit from the attic with rigid board and seals its edges to the framing.',
  },
];
