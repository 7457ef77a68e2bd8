/**
 * The checks of a realization fit's input, and the homes turned into the rows of the fit: for
 * each home, the measure types it had (as column numbers) with their estimated CFM50 and the
 * CFM50 its test-out measured. Every refusal is an InputError naming the field.
 */
import { InputError } from '../errors.ts';

/** A home tested before and after its work. */
export interface TestedHome {
  homeId: number;
  /** Test-in CFM50 − test-out CFM50 (negative when the house measured leakier after). */
  measuredReductionCfm50: number;
  /** By measure type: the estimated CFM50 reduction of the type's completed measures (≥ 0). */
  estimatedByType: Readonly<Record<string, number>>;
}

/** A home as a row of the fit: the types it had (estimates above 0) and what it measured. */
export interface DesignRow {
  /** Column numbers (places in `Design.typeIds`) of the types with an estimate above 0. */
  columns: Int32Array;
  /** Their estimated CFM50 reductions, in the same order. */
  estimatesCfm50: Float64Array;
  measuredCfm50: number;
}

/** The homes as the rows of A (estimates by type) and b (measured reductions). */
export interface Design {
  /** Every type reported, in code-unit order. */
  typeIds: string[];
  rows: DesignRow[];
}

/** The largest seed the generator takes, 2^32 − 1. */
const LARGEST_SEED = 4_294_967_295;

/** More resamples than this add nothing a percentile interval can show. */
const MOST_RESAMPLES = 1_000_000;

function byCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

function checkedHome(home: TestedHome, path: string): void {
  if (home === null || typeof home !== 'object') {
    throw InputError.at(
      path,
      'expected a home with homeId, measuredReductionCfm50, estimatedByType',
    );
  }
  if (typeof home.homeId !== 'number' || !Number.isSafeInteger(home.homeId)) {
    throw InputError.at(`${path}.homeId`, `expected a whole number, got ${String(home.homeId)}`);
  }
  const measured = home.measuredReductionCfm50;
  if (typeof measured !== 'number' || !Number.isFinite(measured)) {
    throw InputError.at(
      `${path}.measuredReductionCfm50`,
      `expected a finite number of CFM50 (test-in − test-out), got ${String(measured)}`,
    );
  }
  const estimates = home.estimatedByType;
  if (estimates === null || typeof estimates !== 'object' || Array.isArray(estimates)) {
    throw InputError.at(`${path}.estimatedByType`, 'expected estimated CFM50 by measure type');
  }
  for (const [typeId, estimate] of Object.entries(estimates)) {
    if (typeId === '') throw InputError.at(`${path}.estimatedByType`, 'expected no empty type id');
    if (typeof estimate !== 'number' || !Number.isFinite(estimate) || estimate < 0) {
      throw InputError.at(
        `${path}.estimatedByType.${typeId}`,
        `expected an estimated reduction of at least 0 CFM50, got ${String(estimate)}`,
      );
    }
  }
}

function checkedTypeIds(typeIds: readonly string[]): void {
  if (!Array.isArray(typeIds)) throw InputError.at('typeIds', 'expected a list of type ids');
  const seen = new Set<string>();
  typeIds.forEach((typeId, index) => {
    if (typeof typeId !== 'string' || typeId === '') {
      throw InputError.at(`typeIds[${index}]`, 'expected a measure type id');
    }
    if (seen.has(typeId)) throw InputError.at(`typeIds[${index}]`, `"${typeId}" is listed twice`);
    seen.add(typeId);
  });
}

function rowOf(home: TestedHome, columnOf: ReadonlyMap<string, number>): DesignRow {
  const entries = Object.entries(home.estimatedByType)
    .filter(([, estimate]) => estimate > 0)
    .map(([typeId, estimate]) => [columnOf.get(typeId) as number, estimate] as const)
    .sort((a, b) => a[0] - b[0]);
  return {
    columns: Int32Array.from(entries, ([column]) => column),
    estimatesCfm50: Float64Array.from(entries, ([, estimate]) => estimate),
    measuredCfm50: home.measuredReductionCfm50,
  };
}

/**
 * Checks the homes and lays them out as rows. The types are those of `typeIds` and every type
 * any home names, in code-unit order (so the result does not depend on the locale).
 *
 * @throws InputError at `homes`, `homes[i].homeId` (also when repeated),
 *   `homes[i].measuredReductionCfm50`, `homes[i].estimatedByType.<type>`, `typeIds[i]`
 */
export function designOf(homes: readonly TestedHome[], typeIds: readonly string[]): Design {
  if (!Array.isArray(homes)) throw InputError.at('homes', 'expected a list of tested homes');
  checkedTypeIds(typeIds);
  const firstPlace = new Map<number, number>();
  const types = new Set(typeIds);
  homes.forEach((home, index) => {
    checkedHome(home, `homes[${index}]`);
    const earlier = firstPlace.get(home.homeId);
    if (earlier !== undefined) {
      throw InputError.at(`homes[${index}].homeId`, `${home.homeId} is also homes[${earlier}]`);
    }
    firstPlace.set(home.homeId, index);
    for (const typeId of Object.keys(home.estimatedByType)) types.add(typeId);
  });
  const sortedTypes = [...types].sort(byCodeUnits);
  const columnOf = new Map(sortedTypes.map((typeId, column) => [typeId, column]));
  return { typeIds: sortedTypes, rows: homes.map((home) => rowOf(home, columnOf)) };
}

/**
 * Checks the bootstrap's settings.
 *
 * @throws InputError at `seed` (a whole number from 0 to 2^32 − 1), `resamples` (1 to
 *   1,000,000) or `level` (between 0 and 1, ends excluded)
 */
export function checkBootstrapSettings(seed: number, resamples: number, level: number): void {
  if (!Number.isSafeInteger(seed) || seed < 0 || seed > LARGEST_SEED) {
    throw InputError.at('seed', `expected a whole number from 0 to ${LARGEST_SEED}, got ${seed}`);
  }
  if (!Number.isSafeInteger(resamples) || resamples < 1 || resamples > MOST_RESAMPLES) {
    throw InputError.at(
      'resamples',
      `expected a whole number from 1 to ${MOST_RESAMPLES}, got ${resamples}`,
    );
  }
  if (!(typeof level === 'number' && level > 0 && level < 1)) {
    throw InputError.at('level', `expected a share between 0 and 1 (0.95 for 95 %), got ${level}`);
  }
}
