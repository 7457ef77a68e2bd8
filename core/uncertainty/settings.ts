/**
 * The options of an uncertainty run and their checks: how many draws, the seed and stream,
 * the distribution, and which conditions vary besides the measures, with their default
 * spreads.
 */
import { InputError } from '../errors.ts';
import { DISTRIBUTIONS, type Distribution } from './distributions.ts';
import { asSeed } from './random.ts';

/**
 * Default spread of each fuel's real escalation rate: ± 1 percentage point a year around the
 * home file's rate. Common practice: the projected rates of NIST Handbook 135's annual
 * supplement (from the EIA's Annual Energy Outlook) are a central case, and a point either way
 * is a usual sensitivity range.
 */
export const DEFAULT_ESCALATION_PLUS_MINUS_RATE = 0.01;

/**
 * Default shortfall of in-service equipment efficiency below the home file's: from the rating
 * down to 15 % below it, most likely at it. Common practice: installed furnaces, boilers, heat
 * pumps and air conditioners run at or below their rated efficiency (sizing, installation,
 * maintenance).
 */
export const DEFAULT_EFFICIENCY_BELOW_RATING_FRACTION = 0.15;

/**
 * Default relative spread of N (and, for the other infiltration methods, of the natural
 * infiltration they give): ± 25 %. Common practice: the LBL climate factor is an estimate for
 * a typical house of its zone, height and shielding, not for this one.
 */
export const DEFAULT_N_FACTOR_PLUS_MINUS_FRACTION = 0.25;

/** Bins of each histogram when none is asked for. */
export const DEFAULT_HISTOGRAM_BINS = 20;

/** The most draws one run takes (memory: a few Float64Arrays of this length). */
export const MAX_DRAWS = 1_000_000;

export interface VariationOptions {
  /** Vary each fuel's real escalation rate by ± this (fraction per year). */
  escalation?: boolean | { plusMinusRate: number };
  /** Vary heating and cooling efficiency from the rating down by this fraction. */
  efficiency?: boolean | { belowRatingFraction: number };
  /** Vary N (natural infiltration's divisor) by ± this fraction. */
  nFactor?: boolean | { plusMinusFraction: number };
}

export interface UncertaintyOptions {
  draws: number;
  seed: number;
  distribution?: Distribution;
  vary?: VariationOptions;
  /** Which stream of the seed: a home's place in a portfolio (0 by default). */
  stream?: number;
  /**
   * Bins of each histogram (20 by default); 0 for none (empty edges and counts), as a
   * portfolio that keeps only the percentiles needs.
   */
  histogramBins?: number;
}

/** The variations a run used, each null when not varied. */
export interface ResolvedVariations {
  escalationPlusMinusRate: number | null;
  efficiencyBelowRatingFraction: number | null;
  nFactorPlusMinusFraction: number | null;
}

/** Settings of a run, checked. */
export interface RunSettings {
  draws: number;
  seed: number;
  stream: number;
  distribution: Distribution;
  vary: ResolvedVariations;
  histogramBins: number;
}

function requireWhole(path: string, value: unknown, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min || value > max) {
    throw InputError.at(
      path,
      `expected a whole number from ${min} to ${max}, got ${String(value)}`,
    );
  }
  return value;
}

function spreadOption(
  path: string,
  option: boolean | Record<string, number> | undefined,
  key: string,
  fallback: number,
  max: number,
): number | null {
  if (option === undefined || option === false) return null;
  if (option === true) return fallback;
  const value = option[key];
  if (typeof value !== 'number' || !(value >= 0 && value <= max)) {
    throw InputError.at(
      `${path}.${key}`,
      `expected a number from 0 to ${max}, got ${String(value)}`,
    );
  }
  return value;
}

/** Checks the options of a run, naming the field at fault. */
export function runSettings(options: UncertaintyOptions): RunSettings {
  const draws = requireWhole('draws', options.draws, 1, MAX_DRAWS);
  const seed = asSeed(options.seed);
  if (seed === null) {
    throw InputError.at(
      'seed',
      `expected a whole number from 0 to 4294967295, got ${String(options.seed)}`,
    );
  }
  const distribution = options.distribution ?? 'pert';
  if (!DISTRIBUTIONS.includes(distribution)) {
    throw InputError.at(
      'distribution',
      `expected "pert" or "triangular", got ${String(distribution)}`,
    );
  }
  const vary = options.vary ?? {};
  return {
    draws,
    seed,
    stream: requireWhole('stream', options.stream ?? 0, 0, 2 ** 31 - 1),
    distribution,
    vary: {
      escalationPlusMinusRate: spreadOption(
        'vary.escalation',
        vary.escalation,
        'plusMinusRate',
        DEFAULT_ESCALATION_PLUS_MINUS_RATE,
        0.1,
      ),
      efficiencyBelowRatingFraction: spreadOption(
        'vary.efficiency',
        vary.efficiency,
        'belowRatingFraction',
        DEFAULT_EFFICIENCY_BELOW_RATING_FRACTION,
        0.9,
      ),
      nFactorPlusMinusFraction: spreadOption(
        'vary.nFactor',
        vary.nFactor,
        'plusMinusFraction',
        DEFAULT_N_FACTOR_PLUS_MINUS_FRACTION,
        0.9,
      ),
    },
    histogramBins: requireWhole(
      'histogramBins',
      options.histogramBins ?? DEFAULT_HISTOGRAM_BINS,
      0,
      1000,
    ),
  };
}
