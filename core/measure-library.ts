/**
 * The library of air-sealing measure types: where each leak is, how big one unit of it
 * typically is before sealing (ELA at 4 Pa), how much of it the work removes, how long the
 * work lasts, a demo cost, and the cautions the work may call for. Every number carries a
 * source note saying where it comes from and how sure we are of it.
 *
 * Marks: "published" (the named source states the value), "from memory" (recalled, not
 * checked against the source), "common practice" (a trade judgement with no single source),
 * "demo default" (the invented demo scenario's numbers; never a fact).
 *
 * Sizes are ELA at 4 Pa (C_D = 1), the area the ASHRAE Handbook of Fundamentals uses for
 * component leakage; CFM50 ≈ 18 × ELA in² for a whole house (see REFERENCES.md).
 */
import { ATTIC_BYPASS_MEASURES } from './measure-library/attic-bypasses.ts';
import { DOOR_AND_WINDOW_MEASURES } from './measure-library/doors-and-windows.ts';
import { OTHER_MEASURES } from './measure-library/other.ts';
import { PENETRATION_MEASURES } from './measure-library/penetrations.ts';
import { RIM_AND_SILL_MEASURES } from './measure-library/rim-and-sill.ts';
import type { MeasureType } from './measure-library/types.ts';
import { lookupOf, type MeasureLookup } from './measure-library/edits.ts';

export type { MeasureType, SourceNote } from './measure-library/types.ts';
export {
  applyEdit,
  libraryWithEdits,
  lookupOf,
  measureTypeEditSchema,
  type MeasureLookup,
  type MeasureTypeEdit,
} from './measure-library/edits.ts';

/** Every measure type, group by group in the order the library lists them. */
export const MEASURE_LIBRARY: readonly MeasureType[] = [
  ...ATTIC_BYPASS_MEASURES,
  ...RIM_AND_SILL_MEASURES,
  ...PENETRATION_MEASURES,
  ...DOOR_AND_WINDOW_MEASURES,
  ...OTHER_MEASURES,
];

const BY_ID: ReadonlyMap<string, MeasureType> = new Map(
  MEASURE_LIBRARY.map((type) => [type.id, type]),
);

/**
 * Looks up a measure type by id.
 *
 * @param id - a kebab-case measure type id, e.g. "attic-top-plates"
 * @returns the type, or undefined when the library has no such id
 */
export function findMeasureType(id: string): MeasureType | undefined {
  return BY_ID.get(id);
}

/** The shipped library as a lookup. */
export const SHIPPED_LIBRARY: MeasureLookup = lookupOf(MEASURE_LIBRARY);
