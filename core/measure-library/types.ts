/**
 * The shape of an entry of the measure library, and of the note that says where each of its
 * numbers comes from.
 */
import type { LeakLocation, Range } from '../schema.ts';
import type { CautionCode } from '../safety/types.ts';
import type { MaterialUse } from './materials.ts';

export type { MaterialUse } from './materials.ts';

export interface SourceNote {
  mark: 'published' | 'from memory' | 'common practice' | 'demo default' | 'user edit';
  citation: string;
}

export interface MeasureType {
  /** kebab-case id used in home files. */
  id: string;
  name: string;
  group: 'atticBypass' | 'rimAndSill' | 'penetration' | 'doorsAndWindows' | 'other';
  /** Where the leak is, for the AIM-2 leak distribution. */
  location: LeakLocation;
  unit: 'each' | 'linearFt' | 'ft2' | 'job';
  defaultLifeYears: number;
  /** ELA at 4 Pa of one unit before sealing, in² (per ft for linearFt, per ft² for ft2). */
  leakageAreaIn2PerUnit: Range;
  /** Fraction of that leakage the work removes, 0..1. */
  sealingEffectiveness: Range;
  /** Invented demo defaults (see sources.cost). */
  defaultCost: { materialsUsdPerUnit: number; laborHoursPerUnit: number };
  cautionCodes: readonly CautionCode[];
  sources: {
    leakageArea: SourceNote;
    effectiveness: SourceNote;
    life: SourceNote;
    cost: SourceNote;
  };
  /** What the crew does, in one or two sentences. */
  description: string;
  /**
   * What the work uses per unit of the measure (per ft, ft², each or job), in each
   * material's use unit; the work order multiplies by the quantity and sums across measures.
   * Absent for a type that names none (a project's own type, say): no bill of materials.
   */
  materials?: readonly MaterialUse[];
}
