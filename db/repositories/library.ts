/**
 * The project's edits to the measure library. The shipped defaults live in core/ and never
 * change; an edit row overrides some of a type's defaults, and deleting it restores them.
 */
import {
  libraryWithEdits,
  MEASURE_LIBRARY,
  measureTypeEditSchema,
  SHIPPED_LIBRARY,
  type MeasureLookup,
  type MeasureTypeEdit,
} from '../../core/measure-library.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { found, readJson, validated } from './_rows.ts';

/** Every edit, by measure type id. */
export function listLibraryEdits(read: ReadAccess): Map<string, MeasureTypeEdit> {
  const rows = read
    .statement('SELECT type_id, data FROM measure_library_edits ORDER BY type_id')
    .all() as {
    type_id: string;
    data: string;
  }[];
  return new Map(rows.map((row) => [row.type_id, readJson<MeasureTypeEdit>(row.data)]));
}

/** The library with this project's edits applied. */
export function effectiveLibrary(read: ReadAccess): MeasureLookup {
  return libraryWithEdits(MEASURE_LIBRARY, listLibraryEdits(read));
}

/** Saves (replaces) the edit of one type. */
export function saveLibraryEdit(write: WriteAccess, typeId: string, input: unknown): void {
  found(SHIPPED_LIBRARY.find(typeId), `measure type "${typeId}"`, 'typeId');
  const edit = validated(measureTypeEditSchema, input);
  write
    .statement(
      `INSERT INTO measure_library_edits (type_id, data, updated_at) VALUES (?, ?, ?)
       ON CONFLICT (type_id) DO UPDATE SET data = excluded.data, updated_at = excluded.updated_at`,
    )
    .run(typeId, JSON.stringify(edit), write.now);
}

/** Back to the shipped defaults for one type. */
export function resetLibraryEdit(write: WriteAccess, typeId: string): void {
  write.statement('DELETE FROM measure_library_edits WHERE type_id = ?').run(typeId);
}
