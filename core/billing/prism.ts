/**
 * The variable-base degree-day fit of a house's bills (PRISM), and its normalized annual
 * use: what the house would use in a typical year.
 *
 * Per bill, use per day = α + β·DD(τ)/days: α the base load (water heating, cooking, pilot
 * lights: use that does not follow the weather), β the use per degree day, τ the outdoor
 * temperature below which the house needs heat (above which it needs cooling, for the
 * cooling variant). For each τ, α and β are found by least squares; τ is the one that
 * leaves the least residual sum of squares, searched on a fine grid and then narrowed by
 * golden-section search. The normalized annual use is NAC = 365·α + β·DD_normal(τ).
 *
 * Bills are weighted by their days (a 35-day bill counts more than a 25-day one), as PRISM
 * does (from memory); `weighting: 'none'` gives ordinary least squares on the bills.
 */
import type { FuelFacts } from '../fuels.ts';
import type { Fuel } from '../schema.ts';
import { fuelUnit } from './bills.ts';
import { isoDateOf } from './dates.ts';
import {
  DAYS_PER_NORMAL_YEAR,
  normalYearDegreeDaysF,
  sumDegreeDaysF,
  type DegreeDayKind,
} from './degree-days.ts';
import {
  prepareFit,
  temperatureFProblems,
  type BillWeighting,
  type DegreeDayFitInput,
  type Prepared,
} from './fit-input.ts';
import { fitWarnings, guideline14Statistics, type BillingWarning } from './fit-quality.ts';
import { weightedLineFit, type LineFit } from './least-squares.ts';
import { goldenSectionMinimum } from './search.ts';

export type { BillWeighting, DegreeDayFitInput } from './fit-input.ts';

/** One bill as the fit sees it. */
export interface FittedBill {
  index: number;
  periodStart: string;
  periodEnd: string;
  days: number;
  /** The bill's degree days at the fitted τ, °F·day. */
  degreeDaysF: number;
  /** Measured use, fuel unit. */
  use: number;
  /** α·days + β·DD(τ), fuel unit. */
  fittedUse: number;
}

/** A fitted degree-day model of one fuel's bills, with its normalized annual use. */
export interface DegreeDayFit {
  kind: DegreeDayKind;
  fuel: Fuel;
  unit: FuelFacts['unit'];
  weighting: BillWeighting;
  /** τ, °F. */
  baseTempF: number;
  /** The range τ was searched in, °F; null when τ was given. */
  searchRangeF: { minF: number; maxF: number } | null;
  /** p: 3 (α, β, τ) when τ was searched, 2 when given. */
  parameterCount: number;
  /** α, fuel unit per day. */
  baseLoadPerDay: number;
  /** β, fuel unit per °F·day. */
  usePerDegreeDay: number;
  /** Standard errors of α and β at the fitted τ (τ taken as known); null without spare bills. */
  standardErrorBaseLoadPerDay: number | null;
  standardErrorUsePerDegreeDay: number | null;
  /** R² of the per-day fit (weighted as the fit is); null when every bill's use per day is equal. */
  rSquared: number | null;
  /** ASHRAE Guideline 14 CV(RMSE) of the bills' use, a fraction. */
  cvRmse: number;
  /** ASHRAE Guideline 14 NMBE of the bills' use, a fraction. */
  nmbe: number;
  /** The normal year's degree days at τ, °F·day per year. */
  normalDegreeDaysF: number;
  /** The normal year's degree days at 65 °F, so two fits' normal years can be compared. */
  normalDegreeDays65F: number;
  /** NAC = 365·α + β·DD_normal(τ), fuel unit per year. */
  normalizedAnnualUse: number;
  billCount: number;
  dayCount: number;
  bills: FittedBill[];
  warnings: BillingWarning[];
}

/** τ searched over 40–80 °F unless told otherwise. Common practice for heating. */
export const DEFAULT_BASE_RANGE_F = { minF: 40, maxF: 80 } as const;

/** Step of the grid over τ before narrowing, °F. */
export const BASE_GRID_STEP_F = 0.25;

/** Golden-section search stops when τ is bracketed this closely, °F (well within ±0.01). */
export const BASE_TOLERANCE_F = 1e-6;

/** The per-day regression at one τ, and each bill's degree days there. */
function regressAt(prepared: Prepared, baseTempF: number): { line: LineFit; degreeDays: number[] } {
  const count = prepared.weather.length;
  const xs = new Float64Array(count);
  const ys = new Float64Array(count);
  const weights = new Float64Array(count);
  const degreeDays: number[] = [];
  prepared.weather.forEach(({ bill, dailyMeansF }, i) => {
    const dd = sumDegreeDaysF(dailyMeansF, baseTempF, prepared.kind);
    degreeDays.push(dd);
    xs[i] = dd / bill.days;
    ys[i] = bill.use / bill.days;
    weights[i] = prepared.weighting === 'days' ? bill.days : 1;
  });
  return { line: weightedLineFit(xs, ys, weights), degreeDays };
}

/** τ (°F) in the range with the least residual sum of squares: the grid, then golden section. */
function searchBase(prepared: Prepared, range: { minF: number; maxF: number }): number {
  const sse = (baseTempF: number) => regressAt(prepared, baseTempF).line.residualSumOfSquares;
  const steps = Math.ceil((range.maxF - range.minF) / BASE_GRID_STEP_F);
  let bestF = range.minF;
  let bestSse = Infinity;
  for (let k = 0; k <= steps; k++) {
    const baseF = Math.min(range.maxF, range.minF + k * BASE_GRID_STEP_F);
    const value = sse(baseF);
    if (value < bestSse) [bestF, bestSse] = [baseF, value];
  }
  const lowF = Math.max(range.minF, bestF - BASE_GRID_STEP_F);
  const highF = Math.min(range.maxF, bestF + BASE_GRID_STEP_F);
  const refined = goldenSectionMinimum(sse, lowF, highF, BASE_TOLERANCE_F);
  return sse(refined) <= bestSse ? refined : bestF;
}

function buildFit(
  prepared: Prepared,
  baseTempF: number,
  searchRangeF: { minF: number; maxF: number } | null,
): DegreeDayFit {
  const { line, degreeDays } = regressAt(prepared, baseTempF);
  const alpha = line.intercept;
  const beta = line.slope;
  const bills = prepared.weather.map(({ bill }, i): FittedBill => {
    const degreeDaysF = degreeDays[i] ?? 0;
    return {
      index: bill.index,
      periodStart: isoDateOf(bill.startDay),
      periodEnd: isoDateOf(bill.endDay),
      days: bill.days,
      degreeDaysF,
      use: bill.use,
      fittedUse: alpha * bill.days + beta * degreeDaysF,
    };
  });
  const parameterCount = searchRangeF ? 3 : 2;
  const statistics = guideline14Statistics(
    bills.map((bill) => bill.use),
    bills.map((bill) => bill.fittedUse),
    parameterCount,
  );
  const normalDegreeDaysF = normalYearDegreeDaysF(prepared.normalYear, baseTempF, prepared.kind);
  const unit = fuelUnit(prepared.fuel);
  const warnings = fitWarnings({
    kind: prepared.kind,
    billCount: bills.length,
    usePerDegreeDay: beta,
    unit,
    rSquared: line.rSquared,
    statistics,
    baseTempF,
    searchRangeF,
  });
  return {
    kind: prepared.kind,
    fuel: prepared.fuel,
    unit,
    weighting: prepared.weighting,
    baseTempF,
    searchRangeF,
    parameterCount,
    baseLoadPerDay: alpha,
    usePerDegreeDay: beta,
    standardErrorBaseLoadPerDay: line.standardErrorIntercept,
    standardErrorUsePerDegreeDay: line.standardErrorSlope,
    rSquared: line.rSquared,
    cvRmse: statistics.cvRmse,
    nmbe: statistics.nmbe,
    normalDegreeDaysF,
    normalDegreeDays65F: normalYearDegreeDaysF(prepared.normalYear, 65, prepared.kind),
    normalizedAnnualUse: DAYS_PER_NORMAL_YEAR * alpha + beta * normalDegreeDaysF,
    billCount: bills.length,
    dayCount: bills.reduce((sum, bill) => sum + bill.days, 0),
    bills,
    warnings,
  };
}

/**
 * Fits the variable-base degree-day model to a fuel's bills (PRISM).
 *
 * @param input - bills of one fuel (use in its unit), daily means (°F) covering them, the
 *   normal year, and optionally the kind (heating), weighting (days) and range of τ (40–80 °F)
 * @returns τ (°F), α (unit/day), β (unit per °F·day), their standard errors, R², CV(RMSE),
 *   NMBE, NAC (unit/year), each bill fitted, and warnings
 * @throws InputError naming the field: a bad bill or temperature, bills of two fuels, fewer
 *   than 4 bills, a bill missing a day's temperature, a bad range or normal year
 *
 * Notes: yᵢ = useᵢ/daysᵢ, xᵢ = DDᵢ(τ)/daysᵢ; α, β by least squares weighted by daysᵢ (or
 * not); τ minimizes Σwᵢ(yᵢ − α − β·xᵢ)² over the range, on a 0.25 °F grid narrowed by golden
 * section to 1e-6 °F. NAC = 365·α + β·DD_normal(τ). CV(RMSE) and NMBE are of the bills' use
 * (yᵢ·daysᵢ against α·daysᵢ + β·DDᵢ) with p = 3; see fit-quality.ts.
 *
 * References: M. F. Fels, "PRISM: an introduction", Energy and Buildings 9 (1986) 5–18;
 * ASHRAE Guideline 14-2014 (CV(RMSE), NMBE).
 */
export function fitDegreeDays(input: DegreeDayFitInput): DegreeDayFit {
  const range = input.baseRangeF ?? DEFAULT_BASE_RANGE_F;
  const rangeProblems = [
    ...temperatureFProblems('baseRangeF.minF', range.minF),
    ...temperatureFProblems('baseRangeF.maxF', range.maxF),
  ];
  if (rangeProblems.length === 0 && !(range.maxF > range.minF)) {
    const message = `expected more than minF (${range.minF} °F), got ${range.maxF}`;
    rangeProblems.push({ path: 'baseRangeF.maxF', message });
  }
  const prepared = prepareFit(input, 3, rangeProblems);
  const searchRangeF = { minF: range.minF, maxF: range.maxF };
  return buildFit(prepared, searchBase(prepared, searchRangeF), searchRangeF);
}

/**
 * Fits the degree-day model at a given base temperature (no search).
 *
 * @param input - as for `fitDegreeDays`, with `baseTempF`, the base τ (°F)
 * @returns the fit at that τ, with p = 2
 * @throws InputError as for `fitDegreeDays`, with at least 3 bills
 *
 * Notes: the same regression as `fitDegreeDays` at the one τ.
 *
 * References: as `fitDegreeDays`.
 */
export function fitDegreeDaysAtBase(
  input: DegreeDayFitInput & { baseTempF: number },
): DegreeDayFit {
  const prepared = prepareFit(input, 2, temperatureFProblems('baseTempF', input.baseTempF));
  return buildFit(prepared, input.baseTempF, null);
}
