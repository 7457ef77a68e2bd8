/**
 * The boxes of a measure's form (adding one, or changing a stored one): the unit of each box
 * in the chosen system, the request path the store names it by, and how what is typed
 * becomes the stored measure. The store's own rules decide what is valid; the screen only
 * turns text into numbers, and says the store's refusals in the units on the screen.
 * How a whole form becomes a measure is in measure-form.ts.
 */
import { formatNumber, formatUsd } from '../core/format.ts';
import type { LeakLocation } from '../core/schema.ts';
import {
  shownValue,
  shownWork,
  storedValue,
  storedWork,
  workUnitOf,
  type UnitSystem,
} from './quantities.ts';
import { sentence } from './text.ts';

/** The three ways a measure's CFM50 reduction is estimated (core/measures.ts). */
export type EstimateMethod = 'byUnits' | 'direct' | 'share';

export const ESTIMATE_METHODS: readonly EstimateMethod[] = ['byUnits', 'direct', 'share'];

// A record over every location, so a location added to the schema fails to compile here
// until the form offers it (the screens cannot import the schema's zod values).
const LOCATIONS: Readonly<Record<LeakLocation, true>> = {
  ceiling: true,
  wall: true,
  floor: true,
  flue: true,
};

/** The leak locations a measure can name, in the schema's order. */
export const LEAK_LOCATIONS_SHOWN = Object.keys(LOCATIONS) as LeakLocation[];

export type NumberKey =
  | 'units'
  | 'cfmLow'
  | 'cfmLikely'
  | 'cfmHigh'
  | 'shareLow'
  | 'shareLikely'
  | 'shareHigh'
  | 'materialsUsd'
  | 'laborHours'
  | 'laborRateUsdPerHour'
  | 'markup'
  | 'lifeYears';

/** What a problem can be shown beside: a box, one of the two ranges as a whole, a choice. */
export type FieldKey =
  NumberKey | 'cfmRange' | 'shareRange' | 'location' | 'healthAndSafety' | 'note';

/** What a box's unit depends on: the project's system and the library type's unit of work. */
export interface FieldContext {
  units: UnitSystem;
  /** The library type's unit (`each`, `linearFt`, `ft2`, `job`). */
  workUnit: string;
}

/** The low / likely / high boxes of the two range estimates, in that order. */
export const RANGE_KEYS = {
  direct: ['cfmLow', 'cfmLikely', 'cfmHigh'],
  share: ['shareLow', 'shareLikely', 'shareHigh'],
} as const satisfies Record<'direct' | 'share', readonly NumberKey[]>;

interface NumberSpec {
  /** The box's path inside the request's `measure`. */
  path: string;
  unit: (context: FieldContext) => string;
  toShown: (stored: number, context: FieldContext) => number;
  toStored: (shown: number, context: FieldContext) => number;
}

const same = (value: number) => value;

const FLOW: Omit<NumberSpec, 'path'> = {
  unit: (context) => (context.units === 'IP' ? 'CFM50' : 'L/s at 50 Pa'),
  toShown: (cfm, context) => shownValue('flowCfm', cfm, context.units),
  toStored: (shown, context) => storedValue('flowCfm', shown, context.units),
};

/** Fractions (0..1 shares, the markup) are typed as percentages. */
const PERCENT: Omit<NumberSpec, 'path'> = {
  unit: () => '%',
  toShown: (fraction) => fraction * 100,
  toStored: (percent) => percent / 100,
};

const SPECS: Readonly<Record<NumberKey, NumberSpec>> = {
  units: {
    path: 'byUnits.units',
    unit: (context) => workUnitOf(context.workUnit, context.units),
    toShown: (count, context) => shownWork(count, context.workUnit, context.units),
    toStored: (count, context) => storedWork(count, context.workUnit, context.units),
  },
  cfmLow: { path: 'reductionCfm50.low', ...FLOW },
  cfmLikely: { path: 'reductionCfm50.likely', ...FLOW },
  cfmHigh: { path: 'reductionCfm50.high', ...FLOW },
  shareLow: { path: 'shareOfLocation.share.low', ...PERCENT },
  shareLikely: { path: 'shareOfLocation.share.likely', ...PERCENT },
  shareHigh: { path: 'shareOfLocation.share.high', ...PERCENT },
  materialsUsd: { path: 'cost.materialsUsd', unit: () => '$', toShown: same, toStored: same },
  laborHours: { path: 'cost.laborHours', unit: () => 'hours', toShown: same, toStored: same },
  laborRateUsdPerHour: {
    path: 'cost.laborRateUsdPerHour',
    unit: () => '$/h',
    toShown: same,
    toStored: same,
  },
  markup: { path: 'cost.markupFraction', ...PERCENT },
  lifeYears: { path: 'lifeYears', unit: () => 'years', toShown: same, toStored: same },
};

/** Paths of the request's `measure` that are not one box. */
const OTHER_PATHS: Readonly<Record<string, FieldKey>> = {
  byUnits: 'units',
  reductionCfm50: 'cfmRange',
  shareOfLocation: 'shareRange',
  'shareOfLocation.share': 'shareRange',
  location: 'location',
  'cost.healthAndSafety': 'healthAndSafety',
  note: 'note',
};

/** The unit shown beside a box. */
export function unitOfField(key: NumberKey, context: FieldContext): string {
  return SPECS[key].unit(context);
}

/** A stored value as a box shows it: in the shown unit, at most two decimals, no separators. */
export function boxText(key: NumberKey, stored: number, context: FieldContext): string {
  return String(Math.round(SPECS[key].toShown(stored, context) * 100) / 100);
}

/** A number typed into a box (in the shown unit), in the stored unit. */
export function storedOfTyped(key: NumberKey, shown: number, context: FieldContext): number {
  return SPECS[key].toStored(shown, context);
}

/** At most two decimals, trailing zeros dropped: "47,194.74", "30,480", "7.5". */
function trimmed(value: number): string {
  const text = formatNumber(value, 2);
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}

/** Stored values as words in the shown unit: "$1,000,000", "500%", "47,194.74 L/s at 50 Pa". */
function valuesInWords(key: NumberKey, stored: readonly number[], context: FieldContext): string {
  const spec = SPECS[key];
  const shown = stored.map((value) => spec.toShown(value, context));
  switch (key) {
    case 'materialsUsd':
      return shown
        .map((value) => formatUsd(value, { cents: !Number.isInteger(value) }))
        .join(' / ');
    case 'laborRateUsdPerHour':
      return shown
        .map((value) => `${formatUsd(value, { cents: !Number.isInteger(value) })}/h`)
        .join(' / ');
    case 'lifeYears':
      return shown
        .map((value) => `${trimmed(value)} ${value === 1 ? 'year' : 'years'}`)
        .join(' / ');
    default: {
      const unit = spec.unit(context);
      if (unit === '%') return shown.map((value) => `${trimmed(value)}%`).join(' / ');
      return `${shown.map(trimmed).join(' / ')} ${unit}`;
    }
  }
}

const NUMBER = String.raw`-?\d+(?:\.\d+)?(?:e[-+]?\d+)?`;
/** The figures the store's messages quote (core/_lib/zod-problems.ts, the range rule). */
const QUOTED = new RegExp(
  String.raw`\b(at least|at most|greater than|less than|got) (${NUMBER}(?: / ${NUMBER})*)`,
  'g',
);

/**
 * A store's message about a box, its figures said in the box's shown unit. The store speaks
 * in stored units (cfm, ft, fractions); a person working in SI, or typing percentages, reads
 * the limit in the unit beside the box.
 *
 * @param key - the box (for a whole range, its first box)
 * @param message - the store's words, such as "expected a number of at most 100000, got 150000"
 * @returns the same words with each quoted figure converted and its unit beside it
 */
export function messageInShownUnits(
  key: NumberKey,
  message: string,
  context: FieldContext,
): string {
  return message.replace(QUOTED, (_all, words: string, figures: string) => {
    const values = figures.split(' / ').map(Number);
    return `${words} ${valuesInWords(key, values, context)}`;
  });
}

/** The field a request path names, or null when the path is not one of the form's. */
export function fieldOfPath(path: string, prefix = 'measure.'): FieldKey | null {
  if (!path.startsWith(prefix)) return null;
  const inner = path.slice(prefix.length);
  const box = (Object.keys(SPECS) as NumberKey[]).find((key) => SPECS[key].path === inner);
  return box ?? OTHER_PATHS[inner] ?? null;
}

export interface Problem {
  path: string;
  message: string;
}

/**
 * The store's refusal, each problem beside its field in plain words and shown units.
 *
 * @returns the first problem of each field, as a sentence; the problems of no field
 */
export function refusalsByField(
  problems: readonly Problem[],
  context: FieldContext,
  prefix = 'measure.',
): { errors: Partial<Record<FieldKey, string>>; unplaced: Problem[] } {
  const errors: Partial<Record<FieldKey, string>> = {};
  const unplaced: Problem[] = [];
  for (const problem of problems) {
    const field = fieldOfPath(problem.path, prefix);
    if (field === null) {
      unplaced.push(problem);
      continue;
    }
    const box: NumberKey | null =
      field === 'cfmRange'
        ? 'cfmLow'
        : field === 'shareRange'
          ? 'shareLow'
          : field in SPECS
            ? (field as NumberKey)
            : null;
    const words =
      box === null ? problem.message : messageInShownUnits(box, problem.message, context);
    errors[field] ??= sentence(words);
  }
  return { errors, unplaced };
}
