/**
 * Doors and windows: weatherstripping and sealing of exterior doors and operable windows.
 */
import {
  COST_DEMO,
  EFFECT_MOVING,
  in2FromCm2,
  lifeFromMemory,
  memory,
  nistNote,
  range,
} from './building-blocks.ts';
import { uses } from './materials.ts';
import type { MeasureType } from './types.ts';

export const DOOR_AND_WINDOW_MEASURES: readonly MeasureType[] = [
  {
    id: 'door-weatherstrip',
    name: 'Exterior door weatherstripping',
    group: 'doorsAndWindows',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(in2FromCm2(12), in2FromCm2(21), 8),
    sealingEffectiveness: range(0.3, 0.5, 0.7),
    defaultCost: { materialsUsdPerUnit: 40, laborHoursPerUnit: 1 },
    cautionCodes: ['lead-safe-work'],
    materials: [
      uses(
        'weatherstrip',
        17,
        'Two 7-ft jambs and a 3-ft head of a 36 × 80 in door: 7 + 7 + 3 = 17 ft',
      ),
      uses('door-sweep', 1, 'One sweep per door'),
      uses('sealant-tube', 17, 'The casing to the wall round the same frame, 17 ft'),
    ],
    sources: {
      leakageArea: nistNote('exterior single door', '12 cm² per item', '21 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('10 years; weatherstrip wears with use'),
      cost: COST_DEMO,
    },
    description:
      'Adjusts the door and strike, replaces the weatherstripping and door sweep, and caulks the frame to the wall.',
  },
  {
    id: 'window-sealing',
    name: 'Window sealing',
    group: 'doorsAndWindows',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(0.3, 1, 3),
    sealingEffectiveness: range(0.2, 0.4, 0.6),
    defaultCost: { materialsUsdPerUnit: 8, laborHoursPerUnit: 0.5 },
    cautionCodes: ['lead-safe-work'],
    materials: [
      uses('sealant-tube', 16, 'Trim to wall round a 3 × 5 ft window: 2 × (3 + 5) = 16 ft'),
      uses(
        'weatherstrip',
        13,
        'The sashes of a 3 × 5 ft double-hung window: two 5-ft sides and the 3-ft meeting rail, 13 ft',
      ),
    ],
    sources: {
      leakageArea: memory(
        'ASHRAE component leakage table, operable windows by type and weatherstripping; per-window sizes recalled',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('10 years'),
      cost: COST_DEMO,
    },
    description:
      'Caulks the window trim and frame, adds weatherstripping to the sashes, and repairs locks so the sashes close tight.',
  },
];
