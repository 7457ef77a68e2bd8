/**
 * Turning what was typed into a home's fields into the home description the store is asked
 * to save, without touching what is stored: pure functions over plain data, so the rules
 * (blank means "remove" only where a field may be absent, a new group waits for its required
 * fields, percentages become fractions, SI becomes the stored unit) are tested on their own.
 */
import type { HomeData } from '../core/schema.ts';
import { groupOf, partOf, type DataFieldSpec } from './data-fields.ts';
import { formatNumber } from '../core/format.ts';
import { inputText, shownValue, storedValue, unitOf, type UnitSystem } from './quantities.ts';
import { parseNumber } from './text.ts';

type Tree = Record<string, unknown>;

function isTree(value: unknown): value is Tree {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** The value at `path` inside `data`, or undefined. */
export function valueAt(data: unknown, path: readonly string[]): unknown {
  let node: unknown = data;
  for (const step of path) {
    if (!isTree(node)) return undefined;
    node = node[step];
  }
  return node;
}

/** A copy of `data` with `path` set to `value` (or removed, for `undefined`); `data` is untouched. */
function withValue(data: Tree, path: readonly string[], value: unknown): Tree {
  const [step, ...rest] = path;
  if (step === undefined) return data;
  const copy: Tree = { ...data };
  if (rest.length === 0) {
    if (value === undefined) delete copy[step];
    else copy[step] = value;
    return copy;
  }
  const child = isTree(copy[step]) ? (copy[step] as Tree) : {};
  copy[step] = withValue(child, rest, value);
  return copy;
}

/** The text a field's box shows for the stored value, in the chosen units. */
export function storedText(spec: DataFieldSpec, data: HomeData, units: UnitSystem): string {
  const value = valueAt(data, spec.path);
  switch (spec.kind) {
    case 'number': {
      if (typeof value !== 'number') return '';
      if (spec.percent === true) return String(Math.round(value * 100 * 100) / 100);
      return spec.quantity === undefined ? String(value) : inputText(spec.quantity, value, units);
    }
    case 'text':
      return typeof value === 'string' ? value : '';
    case 'choice':
      if (spec.stores === 'presence')
        return value === undefined || value === null ? 'none' : 'present';
      if (spec.stores === 'yesNo') return value === false ? 'no' : 'yes';
      if (spec.stores === 'flag') return value === true ? 'yes' : 'no';
      return value === undefined ? '' : String(value);
  }
}

/** What one typed text stores: a value, a removal, or a refusal in plain words. */
type Parsed =
  | { kind: 'value'; value: unknown }
  | { kind: 'remove' }
  | { kind: 'removeGroup' }
  | { kind: 'wrong'; why: string };

function parseTyped(spec: DataFieldSpec, text: string, data: HomeData, units: UnitSystem): Parsed {
  const blank = text.trim() === '';
  if (blank && spec.removesGroupWhenBlank === true) return { kind: 'removeGroup' };
  if (blank && spec.optional === true) return { kind: 'remove' };
  switch (spec.kind) {
    case 'number': {
      if (blank) return { kind: 'wrong', why: 'this figure is needed; enter a number.' };
      const typed = parseNumber(text);
      if (typed === null) {
        return { kind: 'wrong', why: 'enter a number, in digits (such as 1850 or 7.5).' };
      }
      if (spec.percent === true) return { kind: 'value', value: typed / 100 };
      return {
        kind: 'value',
        value: spec.quantity === undefined ? typed : storedValue(spec.quantity, typed, units),
      };
    }
    case 'text':
      return blank
        ? { kind: 'wrong', why: 'this is needed; type a name.' }
        : { kind: 'value', value: text.trim() };
    case 'choice': {
      if (spec.stores === 'number') return { kind: 'value', value: Number(text) };
      if (spec.stores === 'yesNo' || spec.stores === 'flag') {
        return { kind: 'value', value: text === 'yes' };
      }
      if (spec.stores === 'presence') {
        if (text === 'none') return { kind: 'value', value: null };
        const current = valueAt(data, spec.path);
        return { kind: 'value', value: isTree(current) ? current : {} };
      }
      return { kind: 'value', value: text };
    }
  }
}

export interface Draft {
  /** The home description with every acceptable typed value in place. */
  data: HomeData;
  /** Fields whose text cannot be stored as typed, with why. */
  errors: Record<string, string>;
  /** Fields whose typed value is in `data`. */
  applied: string[];
  /** Required fields still blank in a group the home does not have yet, by label. */
  missing: string[];
}

/**
 * The home description as it would be with the typed texts of one part.
 *
 * @param data - the stored home description
 * @param specs - every field the screen shows
 * @param typed - the typed texts, by field id
 * @param part - the part to draft (see `partOf`); fields of other parts are left out
 * @param units - the units the texts were typed in
 * @returns the draft: the data to save, the refusals, and what a new group still lacks
 */
export function draftPart(
  data: HomeData,
  specs: readonly DataFieldSpec[],
  typed: Readonly<Record<string, string>>,
  part: string,
  units: UnitSystem,
): Draft {
  let draft = data as Tree;
  const errors: Record<string, string> = {};
  const applied: string[] = [];
  for (const spec of specs) {
    const text = typed[spec.id];
    if (text === undefined || partOf(spec) !== part) continue;
    const parsed = parseTyped(spec, text, draft as HomeData, units);
    if (parsed.kind === 'wrong') {
      errors[spec.id] = parsed.why;
      continue;
    }
    applied.push(spec.id);
    if (parsed.kind === 'removeGroup') draft = withValue(draft, groupOf(spec), undefined);
    else draft = withValue(draft, spec.path, parsed.kind === 'value' ? parsed.value : undefined);
  }
  return { data: draft as HomeData, errors, applied, missing: missingIn(draft, specs, applied) };
}

/** Required fields left blank in the groups the applied fields touch. */
function missingIn(
  draft: Tree,
  specs: readonly DataFieldSpec[],
  applied: readonly string[],
): string[] {
  const groups = new Set<string>();
  for (const spec of specs) {
    if (!applied.includes(spec.id)) continue;
    // Top-level values stand alone; only a part (climate, a fuel's price) is saved whole.
    if (groupOf(spec).length > 0) groups.add(groupOf(spec).join('.'));
    // Saying a part is present (cooling: an air conditioner) opens its own fields' group.
    if (spec.kind === 'choice' && spec.stores === 'presence') groups.add(spec.path.join('.'));
  }
  const missing: string[] = [];
  const seenPaths = new Set<string>();
  for (const spec of specs) {
    const group = groupOf(spec);
    if (!groups.has(group.join('.')) || !isTree(valueAt(draft, group))) continue;
    if (spec.optional === true && spec.removesGroupWhenBlank !== true) continue;
    if (spec.shownWhen !== undefined && !spec.shownWhen(draft as HomeData)) continue;
    const path = spec.path.join('.');
    if (seenPaths.has(path)) continue;
    seenPaths.add(path);
    if (valueAt(draft, spec.path) === undefined) missing.push(spec.label);
  }
  return missing;
}

/** Words joining labels: "A", "A and B", "A, B and C". */
export function listWords(labels: readonly string[]): string {
  if (labels.length <= 1) return labels.join('');
  return `${labels.slice(0, -1).join(', ')} and ${labels.at(-1) ?? ''}`;
}

/**
 * A refusal of the store (which speaks in stored units: "expected a number of at most 15000,
 * got 20000") with its figures in the units the field is typed in: "… at most 4,572 m, got
 * 6,096 m", "… at most 100 %". Messages of other fields, or without figures, are unchanged.
 */
export function messageInShownUnits(
  message: string,
  spec: DataFieldSpec,
  units: UnitSystem,
): string {
  if (spec.kind !== 'number') return message;
  return message.replace(
    /\b(at most|at least|greater than|less than|got) (-?\d+(?:\.\d+)?)\b/g,
    (_whole, words: string, figure: string) => {
      const stored = Number(figure);
      if (spec.percent === true) {
        const percent = stored * 100;
        return `${words} ${formatNumber(percent, Number.isInteger(percent) ? 0 : 1)} %`;
      }
      if (spec.quantity !== undefined) {
        const shown = shownValue(spec.quantity, stored, units);
        return `${words} ${formatNumber(shown, Math.abs(shown) < 10 ? 2 : 0)} ${unitOf(spec.quantity, units)}`;
      }
      return spec.unit === undefined ? `${words} ${figure}` : `${words} ${figure} ${spec.unit}`;
    },
  );
}
