/**
 * The Library screen's state: the project's measure types (with its edits applied), the
 * shipped types to show beside edited ones, and the edits saved or taken back.
 */
import type { MeasureType } from '../../core/measure-library/types.ts';
import { call } from '../bridge.ts';
import { TypeEditForm } from './type-edit-form.svelte.ts';

export type SaveOutcome =
  { ok: true } | { ok: false; message: string; problems: { path: string; message: string }[] };

/** An edit as library.saveEdit takes it; only the figures given are overridden. */
export interface TypeEdit {
  defaultLifeYears?: number;
  leakageAreaIn2PerUnit?: { low: number; likely: number; high: number };
  sealingEffectiveness?: { low: number; likely: number; high: number };
  defaultCost?: { materialsUsdPerUnit: number; laborHoursPerUnit: number };
  note?: string;
}

export class LibraryState {
  types = $state<MeasureType[]>([]);
  shipped = $state<MeasureType[]>([]);
  editedIds = $state<string[]>([]);
  loaded = $state(false);
  failure = $state<string | null>(null);
  /** The edit forms open, by type id: kept with the library so leaving the screen keeps them. */
  forms = $state<Record<string, TypeEditForm>>({});

  /** Whether an open form holds figures or a note not saved yet. */
  hasUnsaved = $derived(Object.values(this.forms).some((form) => form.hasUnsaved));

  /** Opens (or keeps open) the edit form of a type, filled from its figures now. */
  openForm(type: MeasureType): TypeEditForm {
    const open = this.forms[type.id];
    if (open !== undefined) return open;
    const form = new TypeEditForm(this, type);
    this.forms[type.id] = form;
    return form;
  }

  /** Closes a type's edit form; what was typed there is dropped. */
  closeForm(typeId: string): void {
    delete this.forms[typeId];
  }

  /** Reads the library and the shipped types. */
  async load(): Promise<void> {
    const [list, shipped] = await Promise.all([
      call('library.list', {}),
      call('library.shipped', {}),
    ]);
    if (!list.ok || !shipped.ok) {
      this.failure = list.ok ? (shipped.ok ? null : shipped.error.message) : list.error.message;
      return;
    }
    this.types = list.value.types;
    this.editedIds = list.value.editedIds;
    this.shipped = shipped.value;
    this.failure = null;
    this.loaded = true;
  }

  isEdited(typeId: string): boolean {
    return this.editedIds.includes(typeId);
  }

  shippedOf(typeId: string): MeasureType | undefined {
    return this.shipped.find((type) => type.id === typeId);
  }

  /** Saves (replaces) a type's edit, then reads the library again. */
  async saveEdit(typeId: string, edit: TypeEdit): Promise<SaveOutcome> {
    const reply = await call('library.saveEdit', { typeId, edit });
    if (!reply.ok) {
      return { ok: false, message: reply.error.message, problems: reply.error.problems ?? [] };
    }
    await this.load();
    return { ok: true };
  }

  /** Takes a type back to its shipped figures, then reads the library again. */
  async reset(typeId: string): Promise<SaveOutcome> {
    const reply = await call('library.reset', { typeId });
    if (!reply.ok) {
      return { ok: false, message: reply.error.message, problems: reply.error.problems ?? [] };
    }
    await this.load();
    return { ok: true };
  }
}
