/**
 * A measure's form as plain data, and how it becomes the measure the store is sent: each box
 * read in the system it was typed in, the estimate chosen, what the form does not show kept
 * from the stored measure.
 *
 * A box that was not typed into keeps the stored value exactly: showing 350 cfm as 165.18 L/s
 * and saving it back would otherwise change the store by the rounding of the box.
 */
import { cfm50FromElaIn2 } from '../core/leakage/areas.ts';
import type { LeakLocation, Measure, MeasureStatus, Range } from '../core/schema.ts';
import { parseNumber } from './text.ts';
import {
  boxText,
  RANGE_KEYS,
  storedOfTyped,
  type EstimateMethod,
  type FieldContext,
  type FieldKey,
  type NumberKey,
} from './measure-fields.ts';
import type { UnitSystem } from './quantities.ts';

/** What was typed into a box, with the system it was typed in. */
export interface TypedText {
  text: string;
  units: UnitSystem;
}

/** A measure's form as plain data. */
export interface DraftValues {
  method: EstimateMethod;
  /** Values in stored units the boxes start from, shown until something is typed. */
  base: Partial<Record<NumberKey, number>>;
  typed: Partial<Record<NumberKey, TypedText>>;
  /** '' follows the library type's location. */
  location: LeakLocation | '';
  healthAndSafety: boolean;
  note: string;
}

/** What a box shows: what was typed (converted if the system changed since), else the base. */
export function textOfField(
  draft: DraftValues,
  key: NumberKey,
  context: FieldContext,
  fallbackStored?: number,
): string {
  const typed = draft.typed[key];
  if (typed !== undefined) {
    if (typed.units === context.units) return typed.text;
    const number = parseNumber(typed.text);
    if (number === null) return typed.text;
    return boxText(key, storedOfTyped(key, number, { ...context, units: typed.units }), context);
  }
  const stored = draft.base[key] ?? fallbackStored;
  return stored === undefined ? '' : boxText(key, stored, context);
}

/** A box's value in stored units: undefined when empty, null when not a number. */
export function valueOfField(
  draft: DraftValues,
  key: NumberKey,
  workUnit: string,
): number | null | undefined {
  const typed = draft.typed[key];
  if (typed === undefined) return draft.base[key];
  if (typed.text.trim() === '') return undefined;
  const number = parseNumber(typed.text);
  return number === null ? null : storedOfTyped(key, number, { units: typed.units, workUnit });
}

const NOT_A_NUMBER = 'Enter a number, in digits (such as 12 or 7.5).';

/** What stays of a measure when its form is saved: who it is and what the form does not show. */
export interface MeasureFrame {
  id: string;
  type: string;
  workUnit: string;
  status?: MeasureStatus | undefined;
  /** The measure's own per-unit figures, kept while it is estimated by quantity. */
  byUnits?: Measure['byUnits'];
}

/**
 * The measure a form describes, or the problems that keep it from being one (boxes that are
 * empty or hold no number; the store judges the rest).
 */
export function measureOfDraft(
  draft: DraftValues,
  frame: MeasureFrame,
): { measure: Measure } | { problems: Partial<Record<FieldKey, string>> } {
  const problems: Partial<Record<FieldKey, string>> = {};
  const required = (key: NumberKey): number => {
    const value = valueOfField(draft, key, frame.workUnit);
    if (value === undefined || value === null) {
      problems[key] = NOT_A_NUMBER;
      return 0;
    }
    return value;
  };
  const range = (keys: readonly [NumberKey, NumberKey, NumberKey]): Range => ({
    low: required(keys[0]),
    likely: required(keys[1]),
    high: required(keys[2]),
  });
  const cost: Measure['cost'] = {
    materialsUsd: required('materialsUsd'),
    laborHours: required('laborHours'),
    laborRateUsdPerHour: required('laborRateUsdPerHour'),
    markupFraction: required('markup'),
  };
  if (draft.healthAndSafety) cost.healthAndSafety = true;
  const measure: Measure = { id: frame.id, type: frame.type, cost };
  if (draft.location !== '') measure.location = draft.location;
  if (draft.method === 'byUnits') {
    measure.byUnits = { ...frame.byUnits, units: required('units') };
  } else if (draft.method === 'direct') {
    measure.reductionCfm50 = range(RANGE_KEYS.direct);
  } else {
    measure.shareOfLocation = { share: range(RANGE_KEYS.share) };
  }
  const life = valueOfField(draft, 'lifeYears', frame.workUnit);
  if (life === null) problems.lifeYears = 'Enter a whole number of years, in digits (such as 20).';
  else if (life !== undefined) measure.lifeYears = life;
  if (frame.status !== undefined && frame.status !== 'planned') measure.status = frame.status;
  const note = draft.note.trim();
  if (note !== '') measure.note = draft.note;
  return Object.keys(problems).length > 0 ? { problems } : { measure };
}

/** A stored measure's estimate method. */
export function methodOf(measure: Measure): EstimateMethod {
  if (measure.reductionCfm50 !== undefined) return 'direct';
  if (measure.shareOfLocation !== undefined) return 'share';
  return 'byUnits';
}

/**
 * A stored measure as a form to change it.
 *
 * @param planEstimateCfm50 - the plan's reading of the measure's estimate, to start the direct
 *   boxes from when the measure is estimated another way (rounded to whole CFM50)
 */
export function draftOfMeasure(measure: Measure, planEstimateCfm50?: Range): DraftValues {
  const base: Partial<Record<NumberKey, number>> = {
    materialsUsd: measure.cost.materialsUsd,
    laborHours: measure.cost.laborHours,
    laborRateUsdPerHour: measure.cost.laborRateUsdPerHour,
    markup: measure.cost.markupFraction ?? 0,
  };
  if (measure.byUnits !== undefined) base.units = measure.byUnits.units;
  const direct =
    measure.reductionCfm50 ??
    (planEstimateCfm50 === undefined ? undefined : roundedRange(planEstimateCfm50));
  if (direct !== undefined) {
    base.cfmLow = direct.low;
    base.cfmLikely = direct.likely;
    base.cfmHigh = direct.high;
  }
  const share = measure.shareOfLocation?.share;
  if (share !== undefined) {
    base.shareLow = share.low;
    base.shareLikely = share.likely;
    base.shareHigh = share.high;
  }
  if (measure.lifeYears !== undefined) base.lifeYears = measure.lifeYears;
  return {
    method: methodOf(measure),
    base,
    typed: {},
    location: measure.location ?? '',
    healthAndSafety: measure.cost.healthAndSafety ?? false,
    note: measure.note ?? '',
  };
}

/** A range to whole numbers, as a starting point to type over. */
export function roundedRange(range: Range): Range {
  return {
    low: Math.round(range.low),
    likely: Math.round(range.likely),
    high: Math.round(range.high),
  };
}

/**
 * The CFM50 an amount of work removes by the library's per-unit figures, as the plan counts
 * it: units × leakage area per unit (ELA at 4 Pa, in²) × share sealed, turned into CFM50 at
 * the house's flow exponent.
 *
 * @param unitsCount - the amount of work, in the type's IP unit (ft, ft², a count)
 * @param areaIn2PerUnit - ELA per unit, in² (low / likely / high)
 * @param sealed - fraction of that leakage the work removes, 0..1 (low / likely / high)
 * @param exponentN - the house's flow exponent
 * @returns CFM50 removed, low / likely / high
 */
export function byUnitsEstimateCfm50(options: {
  unitsCount: number;
  areaIn2PerUnit: Range;
  sealed: Range;
  exponentN: number;
}): Range {
  const { unitsCount, areaIn2PerUnit, sealed, exponentN } = options;
  const cfm50 = (area: number, fraction: number) =>
    cfm50FromElaIn2(unitsCount * area * fraction, exponentN);
  return {
    low: cfm50(areaIn2PerUnit.low, sealed.low),
    likely: cfm50(areaIn2PerUnit.likely, sealed.likely),
    high: cfm50(areaIn2PerUnit.high, sealed.high),
  };
}

/** JSON with every object's keys in order, so two equal measures read the same. */
function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical);
  if (value === null || typeof value !== 'object') return value;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, inner]) => inner !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return Object.fromEntries(entries.map(([key, inner]) => [key, canonical(inner)]));
}

/** Whether two measures hold the same fields and values, whatever their keys' order. */
export function sameMeasure(a: Measure, b: Measure): boolean {
  return JSON.stringify(canonical(a)) === JSON.stringify(canonical(b));
}
