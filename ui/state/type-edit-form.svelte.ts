/**
 * The form that edits one measure type's figures. The boxes start at the type's current
 * figures (effectiveness as percents); on saving, only the figures that were changed, or were
 * already the project's own, go into the edit, so a figure left alone keeps its source.
 */
import type { MeasureType } from '../../core/measure-library/types.ts';
import type { LibraryState, TypeEdit } from './library.svelte.ts';
import { parseNumber } from '../text.ts';

export const EDIT_BOXES = [
  { key: 'life', label: 'Life', unit: 'years', path: 'defaultLifeYears' },
  { key: 'leakLow', label: 'Leakage area, low', unit: 'in²', path: 'leakageAreaIn2PerUnit.low' },
  {
    key: 'leakLikely',
    label: 'Leakage area, likely',
    unit: 'in²',
    path: 'leakageAreaIn2PerUnit.likely',
  },
  { key: 'leakHigh', label: 'Leakage area, high', unit: 'in²', path: 'leakageAreaIn2PerUnit.high' },
  { key: 'effLow', label: 'Effectiveness, low', unit: '%', path: 'sealingEffectiveness.low' },
  {
    key: 'effLikely',
    label: 'Effectiveness, likely',
    unit: '%',
    path: 'sealingEffectiveness.likely',
  },
  { key: 'effHigh', label: 'Effectiveness, high', unit: '%', path: 'sealingEffectiveness.high' },
  { key: 'materials', label: 'Materials', unit: '$', path: 'defaultCost.materialsUsdPerUnit' },
  { key: 'hours', label: 'Labour', unit: 'h', path: 'defaultCost.laborHoursPerUnit' },
] as const;

export type BoxKey = (typeof EDIT_BOXES)[number]['key'];

/** A number without float noise, for a box (0.35 × 100 → "35"). */
export function plainNumber(value: number): string {
  return String(Number(value.toPrecision(12)));
}

/**
 * A figure for reading: three significant digits below 100 (0.0236220… → 0.0236), whole
 * numbers above, so converted figures do not show their conversion's noise.
 */
export function figureText(value: number): string {
  if (Math.abs(value) >= 100) return String(Math.round(value));
  return String(Number(value.toPrecision(3)));
}

function boxTexts(type: MeasureType): Record<BoxKey, string> {
  const leak = type.leakageAreaIn2PerUnit;
  const eff = type.sealingEffectiveness;
  return {
    life: plainNumber(type.defaultLifeYears),
    // Four digits are plenty for a leak's size; a box left alone is not saved at all.
    leakLow: plainNumber(Number(leak.low.toPrecision(4))),
    leakLikely: plainNumber(Number(leak.likely.toPrecision(4))),
    leakHigh: plainNumber(Number(leak.high.toPrecision(4))),
    effLow: plainNumber(eff.low * 100),
    effLikely: plainNumber(eff.likely * 100),
    effHigh: plainNumber(eff.high * 100),
    materials: plainNumber(type.defaultCost.materialsUsdPerUnit),
    hours: plainNumber(type.defaultCost.laborHoursPerUnit),
  };
}

export class TypeEditForm {
  #library: LibraryState;
  #type: MeasureType;
  #initial: Record<BoxKey, string>;
  texts = $state<Record<BoxKey, string>>(
    Object.fromEntries(EDIT_BOXES.map((box) => [box.key, ''])) as Record<BoxKey, string>,
  );
  note = $state('');
  errors = $state<Partial<Record<BoxKey | 'note', string>>>({});
  /** A refusal that names no one box. */
  failure = $state<string | null>(null);
  saving = $state(false);
  #initialNote = '';

  /** Whether a figure or the note differs from what the form opened with. */
  hasUnsaved = $derived.by(
    () =>
      this.note !== this.#initialNote ||
      EDIT_BOXES.some((box) => this.texts[box.key] !== this.#initial[box.key]),
  );

  constructor(library: LibraryState, type: MeasureType) {
    this.#library = library;
    this.#type = type;
    this.#initial = boxTexts(type);
    this.texts = { ...this.#initial };
    const own = Object.values(type.sources).find((source) => source.mark === 'user edit');
    this.note = own?.citation ?? '';
    this.#initialNote = this.note;
  }

  /** Saves the edit; true when the store took it. */
  async save(): Promise<boolean> {
    this.errors = {};
    this.failure = null;
    const numbers: Partial<Record<BoxKey, number>> = {};
    for (const box of EDIT_BOXES) {
      const value = parseNumber(this.texts[box.key]);
      if (value === null) this.errors[box.key] = 'Enter a number, in digits.';
      else numbers[box.key] = box.unit === '%' ? value / 100 : value;
    }
    if (this.note.trim() === '')
      this.errors.note = 'Say why the figures change (a source, field data).';
    if (Object.keys(this.errors).length > 0) return false;
    const edit = this.#editOf(numbers as Record<BoxKey, number>);
    this.saving = true;
    const outcome = await this.#library.saveEdit(this.#type.id, edit);
    this.saving = false;
    if (outcome.ok) return true;
    for (const problem of outcome.problems) {
      const box = EDIT_BOXES.find((candidate) => candidate.path === problem.path);
      // The store speaks of fractions; a percent box's refusal gives its numbers as percents.
      const message =
        box?.unit === '%'
          ? problem.message.replace(
              /-?\d+(\.\d+)?/g,
              (number) => `${plainNumber(Number(number) * 100)} %`,
            )
          : problem.message;
      const text = message.charAt(0).toUpperCase() + message.slice(1) + '.';
      if (box) this.errors[box.key] = text;
      else if (problem.path === 'note') this.errors.note = text;
    }
    if (Object.keys(this.errors).length === 0) this.failure = outcome.message;
    return false;
  }

  #editOf(numbers: Record<BoxKey, number>): TypeEdit {
    const sources = this.#type.sources;
    // A figure goes into the edit when it was already the project's own or its boxes changed.
    const keep = (mark: string, keys: readonly BoxKey[]): boolean =>
      mark === 'user edit' || keys.some((key) => this.texts[key].trim() !== this.#initial[key]);
    const edit: TypeEdit = { note: this.note.trim() };
    if (keep(sources.life.mark, ['life'])) edit.defaultLifeYears = numbers.life;
    if (keep(sources.leakageArea.mark, ['leakLow', 'leakLikely', 'leakHigh'])) {
      edit.leakageAreaIn2PerUnit = {
        low: numbers.leakLow,
        likely: numbers.leakLikely,
        high: numbers.leakHigh,
      };
    }
    if (keep(sources.effectiveness.mark, ['effLow', 'effLikely', 'effHigh'])) {
      edit.sealingEffectiveness = {
        low: numbers.effLow,
        likely: numbers.effLikely,
        high: numbers.effHigh,
      };
    }
    if (keep(sources.cost.mark, ['materials', 'hours'])) {
      edit.defaultCost = {
        materialsUsdPerUnit: numbers.materials,
        laborHoursPerUnit: numbers.hours,
      };
    }
    return edit;
  }
}
