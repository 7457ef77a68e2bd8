/**
 * The Measures section's work: the library to add from, the new measure (measure-adding), the
 * forms that change stored measures (each kept as typed until the store accepts it, so a refusal
 * loses nothing), status changes and deletions. After any change the open home is read again
 * and its plan evaluated again.
 */
import { call } from '../bridge.ts';
import { roundToCents, usd } from '../../core/money.ts';
import type { MeasureType } from '../../core/measure-library/types.ts';
import type { MeasureReport } from '../../core/report.ts';
import type { Measure, MeasureStatus } from '../../core/schema.ts';
import type { FieldContext } from '../measure-fields.ts';
import { draftOfMeasure, sameMeasure } from '../measure-form.ts';
import { NewMeasure } from './measure-adding.svelte.ts';
import { sentence } from '../text.ts';
import { MeasureDraft, type ActionStatus } from './measure-draft.svelte.ts';
import type { HomeRecord, WorkspaceState } from './workspace.svelte.ts';

export type { ActionStatus } from './measure-draft.svelte.ts';
export type MeasureEntry = HomeRecord['measures'][number];

/** A measure's cost as line items in dollars, each to the cent, and their total. */
export interface CostLines {
  materialsUsd: number;
  laborUsd: number;
  markupUsd: number;
  totalUsd: number;
}

/**
 * A measure's cost line items, rounded as the core rounds them.
 *
 * @param cost - materials (USD), labour hours (h) × rate (USD/h), markup fraction (0..5)
 * @returns materials, labour, markup and total, in USD to the cent
 *
 * Notes: materials and labour are each rounded to the cent; markup = (materials + labour) ×
 * fraction, rounded to the cent; total = the sum of the three, exact.
 */
export function costLinesOf(cost: Measure['cost']): CostLines {
  const materials = roundToCents(usd(cost.materialsUsd));
  const labor = roundToCents(usd(cost.laborHours).times(cost.laborRateUsdPerHour));
  const markup = roundToCents(materials.plus(labor).times(cost.markupFraction ?? 0));
  return {
    materialsUsd: materials.toNumber(),
    laborUsd: labor.toNumber(),
    markupUsd: markup.toNumber(),
    totalUsd: materials.plus(labor).plus(markup).toNumber(),
  };
}

export class MeasuresEditor {
  #workspace: WorkspaceState;
  library = $state.raw<readonly MeasureType[]>([]);
  libraryFailure = $state<string | null>(null);
  /** The new measure's form. */
  readonly adding: NewMeasure;

  /** Forms open on stored measures, by the measure's store id. */
  editing = $state<Record<number, MeasureDraft>>({});
  /** Problems with a stored measure's status change or deletion, by its store id. */
  rowErrors = $state<Record<number, string>>({});
  rowStatus = $state<ActionStatus>({ kind: 'idle' });

  entries = $derived.by((): readonly MeasureEntry[] => this.#workspace.record?.measures ?? []);

  /** An open form on a stored measure holds changes that are not saved until Save. */
  hasUnsaved = $derived(Object.keys(this.editing).length > 0);

  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
    this.adding = new NewMeasure({
      workspace,
      library: () => this.library,
      reload: (homeId) => this.#reload(homeId),
    });
  }

  /** The units of a form's boxes, for a measure of `type`. */
  contextOf(type: MeasureType | null | undefined): FieldContext {
    return { units: this.#workspace.units, workUnit: type?.unit ?? 'each' };
  }

  /** Reads the library and the project's labour rate and markup, and prefills the form. */
  async load(): Promise<void> {
    const [library, settings] = await Promise.all([
      call('library.list', {}),
      call('settings.get', {}),
    ]);
    if (settings.ok) this.adding.useSettings(settings.value);
    if (!library.ok) {
      this.libraryFailure = library.error.message;
      return;
    }
    this.library = library.value.types;
    this.libraryFailure = null;
    // Kept across visits to the section: a type already chosen (and what was typed) stays.
    const first = this.library[0];
    if (first !== undefined && this.adding.typeId === '') this.adding.choose(first.id);
  }

  typeOf(typeId: string): MeasureType | undefined {
    return this.library.find((type) => type.id === typeId);
  }

  /** The plan's figures for a measure, from the open home's latest evaluation. */
  reportOf(measureId: string): MeasureReport | undefined {
    return this.#workspace.report?.measures.find((measure) => measure.id === measureId);
  }

  /** Opens the form that changes a stored measure, filled from what is stored. */
  startEdit(entry: MeasureEntry): void {
    if (this.editing[entry.id] !== undefined) return;
    const planned = this.reportOf(entry.measure.id)?.estimateCfm50;
    this.editing[entry.id] = new MeasureDraft(draftOfMeasure(entry.measure, planned));
  }

  /** Closes a measure's form; what was typed there is dropped. */
  cancelEdit(entry: MeasureEntry): void {
    delete this.editing[entry.id];
  }

  /** Saves a measure's form; true once the store has it (the form is then closed). */
  async saveEdit(entry: MeasureEntry): Promise<boolean> {
    const homeId = this.#workspace.homeId;
    const draft = this.editing[entry.id];
    // The stored measure as it is now: its status may have changed while the form was open.
    const current = this.entries.find((candidate) => candidate.id === entry.id) ?? entry;
    if (homeId === null || draft === undefined || draft.status.kind === 'working') return false;
    const { measure: stored } = current;
    const type = this.typeOf(stored.type);
    const made = draft.build({
      id: stored.id,
      type: stored.type,
      workUnit: type?.unit ?? 'each',
      status: stored.status,
      byUnits: stored.byUnits,
    });
    if ('problems' in made) {
      draft.status = { kind: 'refused', words: 'Not saved: see the marked boxes.' };
      return false;
    }
    if (sameMeasure(made.measure, stored)) {
      delete this.editing[entry.id];
      this.rowStatus = { kind: 'done', words: `No change to ${stored.id}.` };
      return true;
    }
    draft.status = { kind: 'working', words: `Saving ${stored.id}…` };
    const reply = await call('measures.update', { id: entry.id, measure: made.measure });
    if (!reply.ok) {
      const unplaced = draft.refuse(reply.error.problems ?? [], this.contextOf(type));
      const rest = unplaced.map((problem) => sentence(problem.message)).join(' ');
      const words = rest !== '' ? rest : reply.error.problems ? '' : reply.error.message;
      draft.status = {
        kind: 'refused',
        words: `Not saved: ${words === '' ? 'see the marked boxes.' : sentence(words)}`,
      };
      return false;
    }
    // The form stays (saying "Saving…") until the home is read again, so a form opened next
    // starts from what is now stored.
    this.#workspace.remember({
      homeId,
      label: `Changed ${stored.id}`,
      revert: () => call('measures.update', { id: entry.id, measure: stored }),
    });
    await this.#reload(homeId);
    delete this.editing[entry.id];
    delete this.rowErrors[entry.id];
    this.rowStatus = { kind: 'done', words: `Saved ${stored.id}; the plan is evaluated again.` };
    return true;
  }

  /** Marks a stored measure planned, done or declined. */
  async setStatus(entry: MeasureEntry, status: MeasureStatus): Promise<void> {
    const homeId = this.#workspace.homeId;
    if (homeId === null || (entry.measure.status ?? 'planned') === status) return;
    this.rowStatus = { kind: 'working', words: `Saving ${entry.measure.id}…` };
    const measure: Measure = { ...entry.measure, status };
    if (status === 'planned') delete measure.status;
    const reply = await call('measures.update', { id: entry.id, measure });
    // The home and its plan are asked for first, so they are on their way while the page
    // says what was done.
    const reloaded = reply.ok ? this.#reload(homeId) : Promise.resolve();
    this.#settleRow(entry, reply, `${entry.measure.id} is now ${status}.`);
    if (!reply.ok) return;
    const before = entry.measure;
    this.#workspace.remember({
      homeId,
      label: `${before.id} ${status}`,
      revert: () => call('measures.update', { id: entry.id, measure: before }),
    });
    await reloaded;
  }

  /** Deletes a stored measure (the page has asked for confirmation first). */
  async remove(entry: MeasureEntry): Promise<void> {
    const homeId = this.#workspace.homeId;
    if (homeId === null) return;
    this.rowStatus = { kind: 'working', words: `Deleting ${entry.measure.id}…` };
    const reply = await call('measures.delete', { id: entry.id });
    this.#settleRow(entry, reply, `Deleted ${entry.measure.id}.`);
    if (reply.ok) {
      delete this.editing[entry.id];
      const deleted = entry.measure;
      this.#workspace.remember({
        homeId,
        label: `Deleted ${deleted.id}`,
        // Back at the end of the list: the plan's order comes from the ranking, not the list.
        revert: async () => {
          const again = await call('measures.add', { homeId, measure: deleted });
          return again.ok ? { ok: true } : again;
        },
      });
      await this.#reload(homeId);
    }
  }

  #settleRow(
    entry: MeasureEntry,
    reply: { ok: true } | { ok: false; error: { message: string } },
    words: string,
  ): void {
    if (reply.ok) {
      delete this.rowErrors[entry.id];
      this.rowStatus = { kind: 'done', words };
    } else {
      this.rowErrors[entry.id] = reply.error.message;
      this.rowStatus = {
        kind: 'refused',
        words: `Nothing changed for ${entry.measure.id}: ${reply.error.message}`,
      };
    }
  }

  /** Reads the home again and asks for its plan again, if it is still the open one. */
  async #reload(homeId: number): Promise<void> {
    if (this.#workspace.homeId !== homeId) return;
    await this.#workspace.reloadHome();
  }
}
