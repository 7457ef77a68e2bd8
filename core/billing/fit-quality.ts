/**
 * How far a billing fit can be trusted: the ASHRAE Guideline 14 statistics of its bills and
 * the warnings, in plain words, of a fit too poor, too short or of the wrong shape to rely on.
 */
import type { DegreeDayKind } from './degree-days.ts';

/** ASHRAE Guideline 14's goodness of fit of a model to measured data. */
export interface Guideline14Statistics {
  /** CV(RMSE), a fraction of the mean measured value (0.15 = 15 %). */
  cvRmse: number;
  /** NMBE, a fraction of the mean measured value; > 0 when the model reads low. */
  nmbe: number;
  /** ȳ, the mean measured value, in its unit. */
  meanObserved: number;
  /** n − p. */
  degreesOfFreedom: number;
}

/**
 * Most CV(RMSE) of monthly data for a model to count as calibrated: 15 %. From memory:
 * ASHRAE Guideline 14 (2002 and 2014), calibration criteria for monthly data.
 */
export const MONTHLY_CV_RMSE_MAX = 0.15;

/** Most |NMBE| of monthly data: 5 %. From memory: ASHRAE Guideline 14, as above. */
export const MONTHLY_NMBE_MAX = 0.05;

/**
 * Least R² of the per-day fit worth normalizing with: 0.7. Common practice (PRISM users'
 * screening of houses whose use follows the weather; the figure is from memory).
 */
export const R_SQUARED_MIN = 0.7;

/** Fewer bills than this and τ, α and β are poorly pinned down. Common practice. */
export const RECOMMENDED_MIN_BILLS = 8;

/** τ this close to an end of the searched range, °F, is taken to be stopped by it. */
export const RANGE_EDGE_MARGIN_F = 0.01;

export type BillingWarningCode =
  | 'few-bills'
  | 'poor-cv-rmse'
  | 'poor-nmbe'
  | 'low-r-squared'
  | 'no-weather-slope'
  | 'base-at-range-edge';

/** Something about a fit that does not stop it but should be read before trusting it. */
export interface BillingWarning {
  code: BillingWarningCode;
  message: string;
}

/**
 * CV(RMSE) and NMBE of a model's predictions against measured values.
 *
 * @param observed - the measured values yᵢ (a bill's use, say), in their unit
 * @param predicted - the model's ŷᵢ for the same points, same unit
 * @param parameterCount - p, the parameters the model fitted (3 for α, β and τ)
 * @returns CV(RMSE) and NMBE as fractions, ȳ, and n − p
 * @throws RangeError when n ≤ p or ȳ = 0 (the callers refuse such inputs first)
 *
 * Notes: with n points and ȳ = Σy/n,
 * CV(RMSE) = √(Σ(yᵢ − ŷᵢ)²/(n − p)) / ȳ and NMBE = Σ(yᵢ − ŷᵢ) / ((n − p)·ȳ).
 *
 * References: ASHRAE Guideline 14-2014, Measurement of Energy, Demand, and Water Savings
 * (definitions of CV(RMSE) and NMBE with n − p; from memory).
 */
export function guideline14Statistics(
  observed: readonly number[],
  predicted: readonly number[],
  parameterCount: number,
): Guideline14Statistics {
  const count = observed.length;
  const degreesOfFreedom = count - parameterCount;
  const meanObserved = observed.reduce((sum, y) => sum + y, 0) / count;
  if (degreesOfFreedom <= 0 || !(meanObserved !== 0)) {
    throw new RangeError('Guideline 14 statistics need n > p and a mean other than 0');
  }
  let squares = 0;
  let bias = 0;
  observed.forEach((y, i) => {
    const residual = y - (predicted[i] ?? 0);
    squares += residual * residual;
    bias += residual;
  });
  return {
    cvRmse: Math.sqrt(squares / degreesOfFreedom) / meanObserved,
    nmbe: bias / (degreesOfFreedom * meanObserved),
    meanObserved,
    degreesOfFreedom,
  };
}

/** What a fit's warnings are read from. */
export interface FitSummary {
  kind: DegreeDayKind;
  billCount: number;
  usePerDegreeDay: number;
  /** The fuel's unit, for messages. */
  unit: string;
  rSquared: number | null;
  statistics: Guideline14Statistics;
  baseTempF: number;
  /** The searched range of τ, °F; null when τ was given. */
  searchRangeF: { minF: number; maxF: number } | null;
}

const percent = (fraction: number) => `${(fraction * 100).toFixed(1)} %`;

function rangeEdgeWarning(summary: FitSummary): BillingWarning[] {
  const range = summary.searchRangeF;
  if (!range) return [];
  const atMin = summary.baseTempF - range.minF <= RANGE_EDGE_MARGIN_F;
  const atMax = range.maxF - summary.baseTempF <= RANGE_EDGE_MARGIN_F;
  if (!atMin && !atMax) return [];
  const edge = atMin ? range.minF : range.maxF;
  return [
    {
      code: 'base-at-range-edge',
      message: `the best base temperature sits at the ${atMin ? 'bottom' : 'top'} of the range searched (${edge} °F): the true one may lie beyond it; widen the range or check the bills`,
    },
  ];
}

/**
 * The warnings of a fit, in plain words.
 *
 * @param summary - the fit's figures
 * @returns warnings for fewer than 8 bills, CV(RMSE) over 15 %, |NMBE| over 5 %, R² under
 *   0.7, a slope of zero or less, and τ stopped at an end of the range searched
 */
export function fitWarnings(summary: FitSummary): BillingWarning[] {
  const warnings: BillingWarning[] = [];
  const { statistics, rSquared } = summary;
  const degreeDays = summary.kind === 'heating' ? 'heating' : 'cooling';
  if (summary.billCount < RECOMMENDED_MIN_BILLS) {
    warnings.push({
      code: 'few-bills',
      message: `only ${summary.billCount} bills; a year of monthly bills (at least ${RECOMMENDED_MIN_BILLS}, better 12) is needed to pin down the base temperature`,
    });
  }
  if (statistics.cvRmse > MONTHLY_CV_RMSE_MAX) {
    warnings.push({
      code: 'poor-cv-rmse',
      message: `the bills scatter around the fit by ${percent(statistics.cvRmse)} (CV(RMSE)); ASHRAE Guideline 14 asks at most ${percent(MONTHLY_CV_RMSE_MAX)} for monthly data, so the fit is too poor to trust`,
    });
  }
  if (Math.abs(statistics.nmbe) > MONTHLY_NMBE_MAX) {
    warnings.push({
      code: 'poor-nmbe',
      message: `the fit ${statistics.nmbe > 0 ? 'under' : 'over'}states the bills by ${percent(Math.abs(statistics.nmbe))} on average (NMBE); ASHRAE Guideline 14 asks within ±${percent(MONTHLY_NMBE_MAX)}`,
    });
  }
  if (rSquared !== null && rSquared < R_SQUARED_MIN) {
    warnings.push({
      code: 'low-r-squared',
      message: `the weather explains only ${percent(rSquared)} of the bills' variation (R²); below ${percent(R_SQUARED_MIN)} the normalized use is not reliable`,
    });
  }
  if (summary.usePerDegreeDay <= 0) {
    warnings.push({
      code: 'no-weather-slope',
      message: `use does not rise with ${degreeDays} degree days (slope ${summary.usePerDegreeDay.toPrecision(3)} ${summary.unit} per °F·day): these bills do not show ${degreeDays} with this fuel, or the temperatures are of another place or time`,
    });
  }
  return [...warnings, ...rangeEdgeWarning(summary)];
}
