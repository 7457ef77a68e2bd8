/**
 * Realization factors by measure type: how much of the estimated CFM50 reduction of each type
 * of measure the test-outs actually measured.
 *
 * Each tested home gives one equation, measured ≈ Σ_type factor_type · estimated_type, with no
 * intercept (no work, no expected reduction). The factors are the non-negative least-squares
 * fit over all homes (nnls.ts): a type whose homes measured no more than the other types
 * explain is held at 0 rather than given a negative factor. A type no home had, or one always
 * done with another in the same proportion, cannot be told apart by the data: its factor is
 * reported undetermined (null), never guessed. Intervals come from a bootstrap of the homes
 * (bootstrap.ts), deterministic for a seed.
 *
 * Two plain ratios stand beside the fit. A home's rate is its measured over its total estimated
 * reduction. A type's single-type ratio is Σ measured / Σ estimated over the homes that had that
 * type alone, where the measured reduction belongs to the type with no sharing out. Splitting a
 * mixed home's measured reduction by the types' shares of its estimate is not offered: it would
 * give every type of the home the home's own rate, an assumption rather than a finding.
 */
import { InputError } from '../errors.ts';
import { bootstrapFactors, fitRows, percentileInterval, type FactorInterval } from './bootstrap.ts';
import type { NnlsResult } from './nnls.ts';
import {
  checkBootstrapSettings,
  designOf,
  type Design,
  type DesignRow,
  type TestedHome,
} from './realization-input.ts';

export type { FactorInterval } from './bootstrap.ts';
export type { TestedHome } from './realization-input.ts';

/**
 * Fewer homes than this with a type and its factor is flagged as too few to trust (common
 * practice: a handful of homes is the least a program would generalise from).
 */
export const FEW_HOMES_THRESHOLD = 5;

/** Bootstrap resamples unless told otherwise. */
export const DEFAULT_RESAMPLES = 1000;

/** The interval's level unless told otherwise: P2.5 to P97.5. */
export const DEFAULT_LEVEL = 0.95;

/** `fitted`: above 0; `at-zero`: held at 0 by factor ≥ 0; `undetermined`: not fixed by the data. */
export type FactorStatus = 'fitted' | 'at-zero' | 'undetermined';

/** What the test-outs say of one measure type. */
export interface TypeRealization {
  typeId: string;
  /** Measured CFM50 per estimated CFM50 of this type (≥ 0); null when undetermined. */
  factor: number | null;
  status: FactorStatus;
  /** The bootstrap's percentile interval of the factor; null when undetermined. */
  interval: FactorInterval | null;
  /** Resamples that determined the factor, of the fit's `resamples`. */
  resamplesUsed: number;
  /** Homes with an estimate above 0 for this type (n). */
  homes: number;
  /** n < FEW_HOMES_THRESHOLD: too few homes to trust the factor. */
  fewHomes: boolean;
  /** Σ measured / Σ estimated over the homes that had this type alone; null when none did. */
  singleTypeRatio: number | null;
  /** The homes of `singleTypeRatio`. */
  singleTypeHomes: number;
}

/** One home's measured reduction against its estimate. */
export interface HomeRealization {
  homeId: number;
  measuredReductionCfm50: number;
  /** Σ of the home's estimates by type. */
  estimatedReductionCfm50: number;
  /** Measured / estimated; null when the estimate is 0. */
  rate: number | null;
}

/** The fit of every type, the homes' rates and what the fit was made with. */
export interface RealizationFit {
  /** By type, in code-unit order of the type ids. */
  types: TypeRealization[];
  /** In the order given. */
  homes: HomeRealization[];
  /** Σ measured / Σ estimated over the homes with an estimate above 0; null when none. */
  programRate: number | null;
  /** ‖measured − Σ factor · estimated‖ over the homes, CFM50 (the same for every best fit). */
  residualNormCfm50: number;
  /** Passes of the non-negative least-squares fit on all homes. */
  iterations: number;
  seed: number;
  resamples: number;
  level: number;
}

/** How to fit. */
export interface RealizationOptions {
  /** The bootstrap generator's seed, a whole number from 0 to 2^32 − 1. */
  seed: number;
  /** Bootstrap resamples; DEFAULT_RESAMPLES when omitted. */
  resamples?: number;
  /** The interval's level, between 0 and 1; DEFAULT_LEVEL when omitted. */
  level?: number;
  /** Types to report even when no home had them (they come out undetermined). */
  typeIds?: readonly string[];
}

function estimateOf(row: DesignRow): number {
  return row.estimatesCfm50.reduce((sum, estimate) => sum + estimate, 0);
}

function homeRealization(home: TestedHome, row: DesignRow): HomeRealization {
  const estimated = estimateOf(row);
  return {
    homeId: home.homeId,
    measuredReductionCfm50: home.measuredReductionCfm50,
    estimatedReductionCfm50: estimated,
    rate: estimated > 0 ? home.measuredReductionCfm50 / estimated : null,
  };
}

function programRateOf(rows: readonly DesignRow[]): number | null {
  let measured = 0;
  let estimated = 0;
  for (const row of rows) {
    if (row.columns.length === 0) continue;
    measured += row.measuredCfm50;
    estimated += estimateOf(row);
  }
  return estimated > 0 ? measured / estimated : null;
}

function singleTypeRatioOf(rows: readonly DesignRow[], column: number) {
  let measured = 0;
  let estimated = 0;
  let homes = 0;
  for (const row of rows) {
    if (row.columns.length !== 1 || row.columns[0] !== column) continue;
    measured += row.measuredCfm50;
    estimated += row.estimatesCfm50[0] as number;
    homes += 1;
  }
  return { singleTypeRatio: homes > 0 ? measured / estimated : null, singleTypeHomes: homes };
}

function homesWithType(rows: readonly DesignRow[], column: number): number {
  return rows.filter((row) => row.columns.includes(column)).length;
}

function residualNormOf(rows: readonly DesignRow[], factors: Float64Array): number {
  let squared = 0;
  for (const row of rows) {
    let residual = row.measuredCfm50;
    row.columns.forEach((column, place) => {
      residual -= (factors[column] as number) * (row.estimatesCfm50[place] as number);
    });
    squared += residual * residual;
  }
  return Math.sqrt(squared);
}

function statusOf(column: number, undetermined: number[], atZero: number[]): FactorStatus {
  if (undetermined.includes(column)) return 'undetermined';
  return atZero.includes(column) ? 'at-zero' : 'fitted';
}

function typeRealizations(
  design: Design,
  fit: NnlsResult,
  refits: Float64Array[],
  level: number,
): TypeRealization[] {
  return design.typeIds.map((typeId, column) => {
    const status = statusOf(column, fit.undetermined, fit.atZero);
    const determined = status !== 'undetermined';
    const sorted = refits[column] as Float64Array;
    const homes = homesWithType(design.rows, column);
    return {
      typeId,
      factor: determined ? (fit.solution[column] as number) : null,
      status,
      interval: determined ? percentileInterval(sorted, level) : null,
      resamplesUsed: sorted.length,
      homes,
      fewHomes: homes < FEW_HOMES_THRESHOLD,
      ...singleTypeRatioOf(design.rows, column),
    };
  });
}

/**
 * Fits the realization factor of each measure type to the homes' test-outs.
 *
 * @param homes - the tested homes: measured CFM50 reduction and estimated CFM50 by type
 * @param options - the bootstrap's seed, resamples and level; types to report regardless
 * @returns the factors with their intervals, the homes' rates and the program's rate
 * @throws InputError naming the field (`homes[3].measuredReductionCfm50`, `seed`, …)
 *
 * Notes: factors minimise Σ_homes (measured − Σ_type factor · estimated)² with factors ≥ 0;
 * a type's interval is P((1 − level)/2) to P((1 + level)/2), Hyndman–Fan definition 7, of its
 * refits on `resamples` resamples of the homes drawn with replacement.
 */
export function fitRealization(
  homes: readonly TestedHome[],
  options: RealizationOptions,
): RealizationFit {
  if (options === null || typeof options !== 'object') {
    throw InputError.at('options', 'expected the options of the fit, with its seed');
  }
  const resamples = options.resamples ?? DEFAULT_RESAMPLES;
  const level = options.level ?? DEFAULT_LEVEL;
  checkBootstrapSettings(options.seed, resamples, level);
  const design = designOf(homes, options.typeIds ?? []);
  const fit = fitRows(design);
  const refits = bootstrapFactors(design, { seed: options.seed, resamples });
  return {
    types: typeRealizations(design, fit, refits, level),
    homes: homes.map((home, index) => homeRealization(home, design.rows[index] as DesignRow)),
    programRate: programRateOf(design.rows),
    residualNormCfm50: residualNormOf(design.rows, fit.solution),
    iterations: fit.iterations,
    seed: options.seed,
    resamples,
    level,
  };
}
