/**
 * A project's own edits to the measure library. The shipped defaults never change; an edit
 * overrides some of a type's defaults, and its numbers are marked "user edit" so every figure
 * still says where it comes from. Removing the edit restores the shipped values.
 */
import { z } from 'zod';
import { rangeSchema } from '../_lib/range-schema.ts';
import type { MeasureType, SourceNote } from './types.ts';

export const measureTypeEditSchema = z.strictObject({
  name: z.string().min(1).max(120).optional(),
  defaultLifeYears: z.int().min(1).max(100).optional(),
  leakageAreaIn2PerUnit: rangeSchema({ min: 0, max: 10_000 }).optional(),
  sealingEffectiveness: rangeSchema({ min: 0, max: 1 }).optional(),
  defaultCost: z
    .strictObject({
      materialsUsdPerUnit: z.number().min(0).max(100_000),
      laborHoursPerUnit: z.number().min(0).max(1_000),
    })
    .optional(),
  /** Why the defaults were changed (a program's field data, a supplier's price…). */
  note: z.string().max(2000).optional(),
});
export type MeasureTypeEdit = z.output<typeof measureTypeEditSchema>;

/** A measure library to look types up in: the shipped one, or one with a project's edits. */
export interface MeasureLookup {
  find(id: string): MeasureType | undefined;
  all(): readonly MeasureType[];
}

/** Builds a lookup over a list of types. */
export function lookupOf(types: readonly MeasureType[]): MeasureLookup {
  const byId = new Map(types.map((type) => [type.id, type]));
  return { find: (id) => byId.get(id), all: () => types };
}

/** A type with an edit applied; the edited numbers' sources say "user edit". */
export function applyEdit(type: MeasureType, edit: MeasureTypeEdit): MeasureType {
  const source: SourceNote = { mark: 'user edit', citation: edit.note ?? 'edited in this project' };
  return {
    ...type,
    ...(edit.name === undefined ? {} : { name: edit.name }),
    ...(edit.defaultLifeYears === undefined ? {} : { defaultLifeYears: edit.defaultLifeYears }),
    ...(edit.leakageAreaIn2PerUnit === undefined
      ? {}
      : { leakageAreaIn2PerUnit: { ...edit.leakageAreaIn2PerUnit } }),
    ...(edit.sealingEffectiveness === undefined
      ? {}
      : { sealingEffectiveness: { ...edit.sealingEffectiveness } }),
    ...(edit.defaultCost === undefined ? {} : { defaultCost: { ...edit.defaultCost } }),
    sources: {
      leakageArea: edit.leakageAreaIn2PerUnit === undefined ? type.sources.leakageArea : source,
      effectiveness: edit.sealingEffectiveness === undefined ? type.sources.effectiveness : source,
      life: edit.defaultLifeYears === undefined ? type.sources.life : source,
      cost: edit.defaultCost === undefined ? type.sources.cost : source,
    },
  };
}

/** The library with a project's edits applied, in the shipped order. */
export function libraryWithEdits(
  shipped: readonly MeasureType[],
  edits: ReadonlyMap<string, MeasureTypeEdit>,
): MeasureLookup {
  return lookupOf(
    shipped.map((type) => {
      const edit = edits.get(type.id);
      return edit ? applyEdit(type, edit) : type;
    }),
  );
}
