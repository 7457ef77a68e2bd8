/**
 * The variable-base degree-day fit (Fels 1986, "PRISM: an introduction", Energy and
 * Buildings 9) against outside references: bills generated here from a known τ, α and β
 * (recovered exactly when noise-free), the `simple-statistics` package's linearRegression
 * and rSquared at a fixed τ, the normal equations solved by matrix inverse, a brute-force
 * search over τ, and ASHRAE Guideline 14's CV(RMSE) and NMBE worked by hand.
 */
import { linearRegression, linearRegressionLine, rSquared } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  dayNumberOf,
  fitDegreeDays,
  fitDegreeDaysAtBase,
  guideline14Statistics,
  isoDateOf,
  measuredSavings,
  measuredSavingsFromBills,
  type DailyTemperature,
  type DegreeDayFit,
  type UtilityBill,
} from '../../core/billing.ts';
import { InputError } from '../../core/errors.ts';
import type { Fuel } from '../../core/schema.ts';

/** mulberry32 (T. Ettinger, public domain): a seeded stream of fractions in [0, 1). */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** A standard normal draw by Box–Muller. */
function gaussian(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

const FIRST_DAY = dayNumberOf('2021-01-01') ?? NaN;

/** An invented climate: 50 °F mean, 22 °F swing, coldest around January 20. */
function seasonalMeanF(dayOfYear: number): number {
  return 50 - 22 * Math.cos((2 * Math.PI * (dayOfYear - 20)) / 365.25);
}

/** Daily means from 2021-01-01: the seasonal sine plus seeded noise of `noiseF` (1 σ). */
function dailySeries(seed: number, dayCount: number, noiseF = 5): DailyTemperature[] {
  const random = mulberry32(seed);
  return Array.from({ length: dayCount }, (_, d) => ({
    date: isoDateOf(FIRST_DAY + d),
    meanTempF: seasonalMeanF(d) + noiseF * gaussian(random),
  }));
}

/** The noise-free normal year: the seasonal sine alone, 365 days. */
const NORMAL_MEANS_F = Array.from({ length: 365 }, (_, d) => seasonalMeanF(d));
const NORMAL_YEAR = { dailyMeanTempsF: NORMAL_MEANS_F };

interface TrueModel {
  baseTempF: number;
  alpha: number;
  beta: number;
  kind?: 'heating' | 'cooling';
}

function degreeDays(meansF: readonly number[], model: TrueModel): number {
  const sign = model.kind === 'cooling' ? -1 : 1;
  return meansF.reduce((sum, t) => sum + Math.max(0, sign * (model.baseTempF - t)), 0);
}

/** NAC worked here: 365·α + β·DD_normal(τ). */
function trueNac(model: TrueModel): number {
  return 365 * model.alpha + model.beta * degreeDays(NORMAL_MEANS_F, model);
}

interface BillSpec {
  temperatures: readonly DailyTemperature[];
  model: TrueModel;
  count: number;
  /** First bill's start, days after 2021-01-01. */
  offsetDays?: number;
  fuel?: Fuel;
  /** Seeded multiplicative noise on use, 1 σ as a fraction (0 for none). */
  noise?: { seed: number; share: number };
}

/** Bills of 28–33 days, use = α·days + β·DD(τ) (times 1 + noise). */
function makeBills(spec: BillSpec): UtilityBill[] {
  const lengths = [30, 29, 33, 31, 28, 32];
  const random = mulberry32(spec.noise?.seed ?? 1);
  const bills: UtilityBill[] = [];
  let start = spec.offsetDays ?? 5;
  for (let k = 0; k < spec.count; k++) {
    const end = start + (lengths[k % lengths.length] ?? 30);
    const means = spec.temperatures.slice(start, end).map((t) => t.meanTempF);
    const exact =
      spec.model.alpha * (end - start) + spec.model.beta * degreeDays(means, spec.model);
    const factor = spec.noise ? 1 + spec.noise.share * gaussian(random) : 1;
    bills.push({
      periodStart: isoDateOf(FIRST_DAY + start),
      periodEnd: isoDateOf(FIRST_DAY + end),
      use: exact * factor,
      fuel: spec.fuel ?? 'naturalGas',
    });
    start = end;
  }
  return bills;
}

/** Per-day points (HDD/day, use/day) and days of each bill, worked here from the series. */
function perDayPoints(
  bills: readonly UtilityBill[],
  temps: readonly DailyTemperature[],
  baseF: number,
) {
  return bills.map((bill) => {
    const start = (dayNumberOf(bill.periodStart) ?? 0) - FIRST_DAY;
    const end = (dayNumberOf(bill.periodEnd) ?? 0) - FIRST_DAY;
    const means = temps.slice(start, end).map((t) => t.meanTempF);
    const days = end - start;
    const hdd = degreeDays(means, { baseTempF: baseF, alpha: 0, beta: 0 });
    return { x: hdd / days, y: bill.use / days, days };
  });
}

const relative = (value: number, truth: number) => Math.abs(value / truth - 1);

const TEMPS = dailySeries(42, 3 * 365);
// τ off the search's 0.25 °F grid, so that the narrowing, not the grid, must find it.
const HEATING: TrueModel = { baseTempF: 61.37, alpha: 1.2, beta: 0.16 };

describe('noise-free bills from a known τ, α, β (generated here)', () => {
  const bills = makeBills({ temperatures: TEMPS, model: HEATING, count: 24 });

  it.each(['days', 'none'] as const)('recovers them exactly, weighting %s', (weighting) => {
    const fit = fitDegreeDays({ bills, temperatures: TEMPS, normalYear: NORMAL_YEAR, weighting });
    expect(Math.abs(fit.baseTempF - HEATING.baseTempF)).toBeLessThan(0.01);
    expect(relative(fit.baseLoadPerDay, HEATING.alpha)).toBeLessThan(1e-6);
    expect(relative(fit.usePerDegreeDay, HEATING.beta)).toBeLessThan(1e-6);
    expect(relative(fit.normalizedAnnualUse, trueNac(HEATING))).toBeLessThan(1e-6);
    expect(fit.rSquared).toBeGreaterThan(1 - 1e-9);
    expect(fit.cvRmse).toBeLessThan(1e-6);
    expect(fit.warnings).toEqual([]);
  });

  it('normalizes the same through a degree-day function as through daily normals', () => {
    const byDays = fitDegreeDays({ bills, temperatures: TEMPS, normalYear: NORMAL_YEAR });
    const normalYear = {
      degreeDaysPerYear: (baseTempF: number) =>
        degreeDays(NORMAL_MEANS_F, { ...HEATING, baseTempF }),
    };
    const byFunction = fitDegreeDays({ bills, temperatures: TEMPS, normalYear });
    expect(byFunction.normalizedAnnualUse).toBeCloseTo(byDays.normalizedAnnualUse, 9);
  });

  it('recovers a cooling model (kWh above τ = 68.13 °F) the same way', () => {
    const cooling: TrueModel = { baseTempF: 68.13, alpha: 14, beta: 1.9, kind: 'cooling' };
    const kwh = makeBills({ temperatures: TEMPS, model: cooling, count: 24, fuel: 'electricity' });
    const fit = fitDegreeDays({
      bills: kwh,
      temperatures: TEMPS,
      normalYear: NORMAL_YEAR,
      kind: 'cooling',
      baseRangeF: { minF: 55, maxF: 80 },
    });
    expect(Math.abs(fit.baseTempF - cooling.baseTempF)).toBeLessThan(0.01);
    expect(relative(fit.baseLoadPerDay, 14)).toBeLessThan(1e-6);
    expect(relative(fit.usePerDegreeDay, 1.9)).toBeLessThan(1e-6);
    expect(fit.unit).toBe('kWh');
  });
});

describe('seeded noisy bills (4 % noise on use, 1 σ)', () => {
  const bills = makeBills({
    temperatures: TEMPS,
    model: HEATING,
    count: 24,
    noise: { seed: 7, share: 0.04 },
  });
  const fit = fitDegreeDays({ bills, temperatures: TEMPS, normalYear: NORMAL_YEAR });

  it('stays within ±1.5 °F of τ, ±10 % of α and β, ±3 % of NAC', () => {
    // Tolerances: with 4 % noise on 24 bills, τ, α and β trade off against one another
    // (a higher τ with a lower α fits almost as well); NAC, their combination, is far
    // better pinned down, as Fels 1986 notes of PRISM's NAC.
    expect(Math.abs(fit.baseTempF - HEATING.baseTempF)).toBeLessThan(1.5);
    expect(relative(fit.baseLoadPerDay, HEATING.alpha)).toBeLessThan(0.1);
    expect(relative(fit.usePerDegreeDay, HEATING.beta)).toBeLessThan(0.1);
    expect(relative(fit.normalizedAnnualUse, trueNac(HEATING))).toBeLessThan(0.03);
  });

  it('fits the bills no worse than the true model does (the least-squares property)', () => {
    const sse = (baseF: number, alpha: number, beta: number) =>
      perDayPoints(bills, TEMPS, baseF).reduce(
        (sum, p) => sum + p.days * (p.y - alpha - beta * p.x) ** 2,
        0,
      );
    const atFit = sse(fit.baseTempF, fit.baseLoadPerDay, fit.usePerDegreeDay);
    expect(atFit).toBeLessThanOrEqual(sse(HEATING.baseTempF, HEATING.alpha, HEATING.beta));
  });

  it('finds the τ a brute-force search over 40–80 °F in 0.01 °F steps finds (simple-statistics OLS)', () => {
    let bestSse = Infinity;
    for (let k = 0; k <= 4000; k++) {
      const points = perDayPoints(bills, TEMPS, 40 + k / 100).map((p) => [p.x, p.y]);
      const { m, b } = linearRegression(points);
      const sse = points.reduce((sum, [x = 0, y = 0]) => sum + (y - b - m * x) ** 2, 0);
      bestSse = Math.min(bestSse, sse);
    }
    const ols = fitDegreeDays({
      bills,
      temperatures: TEMPS,
      normalYear: NORMAL_YEAR,
      weighting: 'none',
    });
    const points = perDayPoints(bills, TEMPS, ols.baseTempF);
    const fitSse = points.reduce(
      (sum, p) => sum + (p.y - ols.baseLoadPerDay - ols.usePerDegreeDay * p.x) ** 2,
      0,
    );
    expect(fitSse).toBeLessThanOrEqual(bestSse * (1 + 1e-12));
  });
});

describe('the regression at a fixed τ against simple-statistics', () => {
  const bills = makeBills({
    temperatures: TEMPS,
    model: HEATING,
    count: 18,
    noise: { seed: 11, share: 0.06 },
  });
  const baseTempF = 60;
  const points = perDayPoints(bills, TEMPS, baseTempF);
  const at = (weighting: 'days' | 'none') =>
    fitDegreeDaysAtBase({
      bills,
      temperatures: TEMPS,
      normalYear: NORMAL_YEAR,
      baseTempF,
      weighting,
    });

  it('equals linearRegression and rSquared on the per-day points, unweighted', () => {
    const data = points.map((p) => [p.x, p.y]);
    const line = linearRegression(data);
    const fit = at('none');
    expect(relative(fit.baseLoadPerDay, line.b)).toBeLessThan(1e-12);
    expect(relative(fit.usePerDegreeDay, line.m)).toBeLessThan(1e-12);
    expect(relative(fit.rSquared ?? NaN, rSquared(data, linearRegressionLine(line)))).toBeLessThan(
      1e-12,
    );
  });

  it('equals them on each point repeated once per billed day, weighted by days', () => {
    const data = points.flatMap((p) => Array.from({ length: p.days }, () => [p.x, p.y]));
    const line = linearRegression(data);
    const fit = at('days');
    expect(relative(fit.baseLoadPerDay, line.b)).toBeLessThan(1e-10);
    expect(relative(fit.usePerDegreeDay, line.m)).toBeLessThan(1e-10);
    expect(relative(fit.rSquared ?? NaN, rSquared(data, linearRegressionLine(line)))).toBeLessThan(
      1e-10,
    );
  });

  it('gives the standard errors of s²·(XᵀWX)⁻¹, the normal equations inverted here', () => {
    const fit = at('days');
    let sw = 0;
    let swx = 0;
    let swxx = 0;
    let sse = 0;
    for (const p of points) {
      sw += p.days;
      swx += p.days * p.x;
      swxx += p.days * p.x * p.x;
      sse += p.days * (p.y - fit.baseLoadPerDay - fit.usePerDegreeDay * p.x) ** 2;
    }
    const variance = sse / (points.length - 2);
    const determinant = sw * swxx - swx * swx;
    const seAlpha = Math.sqrt((variance * swxx) / determinant);
    const seBeta = Math.sqrt((variance * sw) / determinant);
    expect(relative(fit.standardErrorBaseLoadPerDay ?? NaN, seAlpha)).toBeLessThan(1e-8);
    expect(relative(fit.standardErrorUsePerDegreeDay ?? NaN, seBeta)).toBeLessThan(1e-8);
  });
});

describe('ASHRAE Guideline 14 statistics', () => {
  it('match a hand computation', () => {
    // y = 10, 12, 14, 20; ŷ = 11, 12, 13, 19; p = 2, so n − p = 2.
    // Residuals y − ŷ: −1, 0, 1, 1. Σr² = 3, Σr = 1, ȳ = 56/4 = 14.
    // CV(RMSE) = √(3/2)/14 = 1.2247449/14 = 0.08748178.
    // NMBE = 1/(2·14) = 0.03571429.
    const stats = guideline14Statistics([10, 12, 14, 20], [11, 12, 13, 19], 2);
    expect(stats.cvRmse).toBeCloseTo(0.08748178, 8);
    expect(stats.nmbe).toBeCloseTo(0.03571429, 8);
    expect(stats.degreesOfFreedom).toBe(2);
  });

  it('gives NMBE 0 for a fit weighted by days: its residuals in use sum to 0', () => {
    // The intercept's normal equation: Σ daysᵢ·(yᵢ − ŷᵢ) = Σ(useᵢ − fittedUseᵢ) = 0.
    const bills = makeBills({
      temperatures: TEMPS,
      model: HEATING,
      count: 14,
      noise: { seed: 3, share: 0.1 },
    });
    const fit = fitDegreeDays({ bills, temperatures: TEMPS, normalYear: NORMAL_YEAR });
    expect(Math.abs(fit.nmbe)).toBeLessThan(1e-12);
  });
});

describe('warnings', () => {
  const codes = (fit: DegreeDayFit) => fit.warnings.map((warning) => warning.code);
  const fitOf = (bills: UtilityBill[], baseRangeF?: { minF: number; maxF: number }) =>
    fitDegreeDays({
      bills,
      temperatures: TEMPS,
      normalYear: NORMAL_YEAR,
      ...(baseRangeF ? { baseRangeF } : {}),
    });

  it('flags τ at the edge of the range searched', () => {
    const bills = makeBills({
      temperatures: TEMPS,
      model: { ...HEATING, baseTempF: 66 },
      count: 24,
    });
    const fit = fitOf(bills, { minF: 40, maxF: 60 });
    expect(fit.baseTempF).toBeCloseTo(60, 2);
    expect(codes(fit)).toContain('base-at-range-edge');
  });

  it('flags use that falls as degree days rise (β ≤ 0)', () => {
    const bills = makeBills({
      temperatures: TEMPS,
      model: { baseTempF: 60, alpha: 9, beta: -0.05 },
      count: 24,
    });
    expect(codes(fitOf(bills))).toContain('no-weather-slope');
  });

  it('flags a fit too poor to trust (40 % noise) by CV(RMSE) and R²', () => {
    const bills = makeBills({
      temperatures: TEMPS,
      model: HEATING,
      count: 24,
      noise: { seed: 5, share: 0.4 },
    });
    const fit = fitOf(bills);
    expect(fit.cvRmse).toBeGreaterThan(0.15);
    expect(codes(fit)).toEqual(expect.arrayContaining(['poor-cv-rmse']));
  });

  it('flags fewer than 8 bills (common practice)', () => {
    const bills = makeBills({ temperatures: TEMPS, model: HEATING, count: 6, offsetDays: 200 });
    expect(codes(fitOf(bills))).toContain('few-bills');
  });
});

describe('measured savings', () => {
  const preModel: TrueModel = { baseTempF: 62.21, alpha: 1.2, beta: 0.18 };
  const postModel: TrueModel = { baseTempF: 58.64, alpha: 1.1, beta: 0.13 };
  const preBills = makeBills({ temperatures: TEMPS, model: preModel, count: 13 });
  const postBills = makeBills({
    temperatures: TEMPS,
    model: postModel,
    count: 13,
    offsetDays: 400,
  });
  const shared = { temperatures: TEMPS, normalYear: NORMAL_YEAR };
  const pre = fitDegreeDays({ ...shared, bills: preBills });
  const post = fitDegreeDays({ ...shared, bills: postBills });

  it('are NAC_pre − NAC_post, worked here from the true models, against the estimate', () => {
    const expected = trueNac(preModel) - trueNac(postModel);
    const result = measuredSavings({ pre, post, estimatedSavingsPerYear: 300 });
    expect(relative(result.savingsPerYear, expected)).toBeLessThan(1e-6);
    expect(relative(result.savingsShare ?? NaN, expected / trueNac(preModel))).toBeLessThan(1e-6);
    expect(relative(result.realizationRate ?? NaN, expected / 300)).toBeLessThan(1e-6);
    expect(result.unit).toBe('therm');
    expect(result.warnings).toEqual([]);
  });

  it('fit both bill sets the same way from bills', () => {
    const fromBills = measuredSavingsFromBills({
      ...shared,
      preBills,
      postBills,
      estimatedSavingsPerYear: 300,
    });
    expect(fromBills).toEqual(measuredSavings({ pre, post, estimatedSavingsPerYear: 300 }));
  });

  it('carry both fits’ warnings and say when use rose or there is no estimate', () => {
    const result = measuredSavings({ pre: post, post: pre, estimatedSavingsPerYear: 0 });
    expect(result.warnings.map((w) => `${w.from}:${w.code}`)).toEqual([
      'savings:use-rose',
      'savings:no-estimate',
    ]);
    expect(result.realizationRate).toBeNull();
  });

  it('refuse another fuel or another normal year after, naming the field', () => {
    const otherYear = fitDegreeDays({
      bills: postBills,
      temperatures: TEMPS,
      normalYear: { dailyMeanTempsF: NORMAL_MEANS_F.map((t) => t + 2) },
    });
    const input = {
      pre,
      post: { ...otherYear, fuel: 'propane' as const },
      estimatedSavingsPerYear: 1,
    };
    let paths: string[] = [];
    try {
      measuredSavings(input);
    } catch (error) {
      if (error instanceof InputError) paths = error.problems.map((p) => p.path);
    }
    expect(paths).toEqual(['post.fuel', 'post.normalDegreeDays65F']);
  });

  it('name the bill set of a bad bill', () => {
    const bad = postBills.map((bill, i) => (i === 2 ? { ...bill, use: -1 } : bill));
    expect(() =>
      measuredSavingsFromBills({ ...shared, preBills, postBills: bad, estimatedSavingsPerYear: 1 }),
    ).toThrow('postBills[2].use: expected a number of at least 0, got -1');
  });
});
