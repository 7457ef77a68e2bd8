/**
 * The House section's edits. A box shows the stored value (in the chosen units) until
 * something is typed; what is typed stays in the box until the store accepts it, so a
 * refusal never loses it. Each field is saved on its own, as soon as it is changed.
 */
import type { House } from '../../core/schema.ts';
import {
  fieldLabel,
  HOUSE_FIELDS,
  requestPathOf,
  withField,
  type HouseFieldKey,
} from '../house-fields.ts';
import { inputText, storedValue } from '../quantities.ts';
import type { WorkspaceState } from './workspace.svelte.ts';

export type SaveStatus =
  | { kind: 'idle' }
  | { kind: 'saving'; label: string }
  | { kind: 'saved'; label: string }
  | { kind: 'refused'; label: string; why: string };

/** Text typed as a number: separators allowed ("1,850"), nothing else. */
function parseNumber(text: string): number | null {
  const cleaned = text.trim().replace(/,/g, '');
  if (cleaned === '' || !/^[-+]?(\d+\.?\d*|\.\d+)$/.test(cleaned)) return null;
  return Number(cleaned);
}

export class HouseEditor {
  #workspace: WorkspaceState;
  /** What was typed and not yet saved, by field. */
  typed = $state<Partial<Record<HouseFieldKey, string>>>({});
  errors = $state<Partial<Record<HouseFieldKey, string>>>({});
  status = $state<SaveStatus>({ kind: 'idle' });

  house = $derived.by((): House | null => this.#workspace.record?.home.data.house ?? null);

  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
  }

  /** The text a field's box shows: what was typed, else the stored value. */
  textOf(key: HouseFieldKey): string {
    const typed = this.typed[key];
    if (typed !== undefined) return typed;
    const house = this.house;
    if (house === null) return '';
    const spec = HOUSE_FIELDS.find((field) => field.key === key);
    const value = house[key];
    if (spec?.kind === 'number' && spec.quantity !== undefined && typeof value === 'number') {
      return inputText(spec.quantity, value, this.#workspace.units);
    }
    return String(value);
  }

  edit(key: HouseFieldKey, text: string): void {
    this.typed[key] = text;
  }

  /** Saves a field's typed text, or says in plain words why it cannot. */
  async commit(key: HouseFieldKey): Promise<void> {
    const text = this.typed[key];
    const house = this.house;
    const spec = HOUSE_FIELDS.find((field) => field.key === key);
    if (text === undefined || house === null || spec === undefined) return;
    const label = fieldLabel(key);
    let value: number | string;
    if (spec.kind === 'number') {
      const typedNumber = parseNumber(text);
      if (typedNumber === null) {
        this.#refuse(key, label, 'enter a number, in digits (such as 1850 or 7.5).');
        return;
      }
      value =
        spec.quantity === undefined
          ? typedNumber
          : storedValue(spec.quantity, typedNumber, this.#workspace.units);
    } else {
      value = key === 'shelterClass' ? Number(text) : text;
    }
    if (house[key] === value) {
      this.#settle(key);
      return;
    }
    this.status = { kind: 'saving', label };
    const outcome = await this.#workspace.saveHouse(withField(house, key, value));
    // A newer edit of the same field has taken its place; its own save reports.
    if (this.typed[key] !== text) return;
    if (outcome.ok) {
      this.#settle(key);
      this.status = { kind: 'saved', label };
      return;
    }
    const own = outcome.problems.find((problem) => problem.path === requestPathOf(key));
    this.#refuse(key, label, `${own?.message ?? outcome.message}.`);
  }

  #refuse(key: HouseFieldKey, label: string, why: string): void {
    this.errors[key] = why.charAt(0).toUpperCase() + why.slice(1);
    this.status = { kind: 'refused', label, why };
  }

  #settle(key: HouseFieldKey): void {
    delete this.typed[key];
    delete this.errors[key];
  }
}
