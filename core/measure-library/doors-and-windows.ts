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
