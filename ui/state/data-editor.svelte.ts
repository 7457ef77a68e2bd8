/**
 * The edits of a home's description (house, climate, equipment, prices): a box shows the
 * stored value in the chosen units until something is typed; what is typed stays in the box
 * until the store accepts it, so a refusal never loses it. A field is saved as soon as it is
 * changed, with the other fields of its part typed before it (see `partOf`).
 */
import type { HomeData } from '../../core/schema.ts';
import { draftPart, listWords, messageInShownUnits, storedText } from '../data-edit.ts';
import { partOf, requestPath, type DataFieldSpec } from '../data-fields.ts';
import type { SaveStatus } from './save-status.ts';
import type { WorkspaceState } from './workspace.svelte.ts';
import { capitalized } from '../text.ts';

/** The label a part's save is reported under. */
const PART_LABELS: Readonly<Record<string, string>> = {
  house: 'House',
  climate: 'Climate',
  heating: 'Heating',
  cooling: 'Cooling',
  economics: 'Analysis',
  financing: 'Loan',
};

export class DataEditor {
  #workspace: WorkspaceState;
  readonly specs: readonly DataFieldSpec[];
  /** What was typed and not yet saved, by field id. */
  typed = $state<Record<string, string>>({});
  errors = $state<Record<string, string>>({});
  status = $state<SaveStatus>({ kind: 'idle' });

  hasUnsaved = $derived(Object.keys(this.typed).length > 0);

  data = $derived.by((): HomeData | null => this.#workspace.record?.home.data ?? null);

  /** The description with every acceptable typed value in place: it decides which fields show. */
  preview = $derived.by((): HomeData | null => {
    let data = this.data;
    if (data === null) return null;
    for (const part of new Set(this.specs.map(partOf))) {
      data = draftPart(data, this.specs, this.typed, part, this.#workspace.units).data;
    }
    return data;
  });

  constructor(workspace: WorkspaceState, specs: readonly DataFieldSpec[]) {
    this.#workspace = workspace;
    this.specs = specs;
  }

  /** The fields to show now. */
  shown(specs: readonly DataFieldSpec[]): DataFieldSpec[] {
    const preview = this.preview;
    if (preview === null) return [];
    return specs.filter((spec) => spec.shownWhen?.(preview) ?? true);
  }

  /** The text a field's box shows: what was typed, else the stored value. */
  textOf(spec: DataFieldSpec): string {
    const typed = this.typed[spec.id];
    if (typed !== undefined) return typed;
    const data = this.data;
    return data === null ? '' : storedText(spec, data, this.#workspace.units);
  }

  edit(spec: DataFieldSpec, text: string): void {
    this.typed[spec.id] = text;
  }

  /** Saves a field's part with what was typed in it, or says in plain words why it cannot. */
  async commit(spec: DataFieldSpec): Promise<void> {
    const data = this.data;
    const text = this.typed[spec.id];
    if (data === null || text === undefined) return;
    const part = partOf(spec);
    const draft = draftPart(data, this.specs, this.typed, part, this.#workspace.units);
    for (const other of this.specs.filter((field) => partOf(field) === part)) {
      const why = draft.errors[other.id];
      if (why === undefined) delete this.errors[other.id];
      else this.errors[other.id] = capitalized(why);
    }
    const own = draft.errors[spec.id];
    if (own !== undefined) {
      this.status = { kind: 'refused', label: spec.label, why: own };
      return;
    }
    const label = PART_LABELS[part] ?? spec.label;
    if (draft.missing.length > 0) {
      this.status = {
        kind: 'waiting',
        label,
        why: `${label.toLowerCase()} is saved once ${listWords(draft.missing)} ${
          draft.missing.length === 1 ? 'is' : 'are'
        } filled in.`,
      };
      return;
    }
    if (JSON.stringify(draft.data) === JSON.stringify(data)) {
      this.#settle(draft.applied);
      this.status = { kind: 'idle' };
      return;
    }
    const sent = { ...this.typed };
    this.status = { kind: 'saving', label: spec.label };
    const outcome = await this.#workspace.saveHome({ data: draft.data }, spec.label);
    // Typed again while the save was out: the newer text stays and its own save reports.
    const unchanged = draft.applied.filter((id) => this.typed[id] === sent[id]);
    if (outcome.ok) {
      this.#settle(unchanged);
      this.status = { kind: 'saved', label: spec.label };
      return;
    }
    const units = this.#workspace.units;
    let ownWhy: string | null = null;
    for (const field of this.specs.filter((other) => draft.applied.includes(other.id))) {
      const problem = outcome.problems.find((p) => p.path === requestPath(field.path));
      if (problem === undefined) continue;
      const why = capitalized(`${messageInShownUnits(problem.message, field, units)}.`);
      this.errors[field.id] = why;
      // The status line names the field typed in; another field of its part is named here.
      if (field.id === spec.id) ownWhy = why;
      else ownWhy ??= `${field.label}: ${why}`;
    }
    if (ownWhy === null) {
      this.errors[spec.id] = capitalized(outcome.message);
      ownWhy = outcome.message;
    }
    this.status = { kind: 'refused', label: spec.label, why: ownWhy };
  }

  #settle(ids: readonly string[]): void {
    for (const id of ids) {
      delete this.typed[id];
      delete this.errors[id];
    }
  }
}
