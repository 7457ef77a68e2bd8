/**
 * The uncertainty engine: the float64 package kernel against the exact plan, quantiles and a
 * known case, degenerate ranges, the chance SIR ≥ 1, seeds and bad options.
 *
 * The demo homes are only inputs here: the kernel is checked against the engine's own exact
 * plan (reportOf) and against a replay through applyMeasure written in this test, never against
 * the demo's figures. Quantiles are checked against @formulajs/formulajs 4.6.1 PERCENTILE.INC
 * (Excel; Hyndman–Fan definition 7, as numpy's default) and a hand case.
 */
import * as formula from '@formulajs/formulajs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import { evaluateHome, reportOf, type Evaluation } from '../../core/evaluate.ts';
import {
  aim2ShelterFactor,
  aim2StackFactor,
  aim2WindFactor,
} from '../../core/infiltration/aim2.ts';
import { lookupOf, MEASURE_LIBRARY } from '../../core/measure-library.ts';
import {
  compileMeasuresKernel,
  compilePackageKernel,
  emptyFigures,
  escalatedFactorFloat,
  hypotOfTwo,
} from '../../core/plan/kernel.ts';
import { escalatedUniformPresentValueFactor } from '../../core/economics/index.ts';
import {
  aim2Flows,
  shelterFunction,
  stackFactorFunction,
  windFactorFunction,
} from '../../core/plan/kernel-aim2.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { applyMeasure, stateAfter, stateOf } from '../../core/plan/step.ts';
import { ventilationAfterPackage } from '../../core/plan/ventilation-fan.ts';
import { LEAK_LOCATIONS, type HomeFileInput } from '../../core/schema.ts';
import {
  triangularMean,
  triangularQuantile,
  triangularVariance,
} from '../../core/uncertainty/distributions.ts';
import { kernelUncertainty, packageUncertainty } from '../../core/uncertainty/monte-carlo.ts';
import { homePackageOf } from '../../core/uncertainty/portfolio-home.ts';
import { Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import { histogramOf, quantileSorted, spreadOf } from '../../core/uncertainty/summary.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';

function reference(result: number | Error): number {
  if (result instanceof Error) throw new Error(`formulajs returned ${result.message}`);
  return result;
}

/** The base test house with its measures replaced by `measures`. */
function baseHomeWith(measures: HomeFileInput['measures']): HomeFileInput {
  return { ...(validBaseHome() as unknown as HomeFileInput), measures };
}

function directMeasure(
  id: string,
  range: { low: number; likely: number; high: number },
  costUsd: number,
): HomeFileInput['measures'][number] {
  return {
    id,
    type: 'attic-top-plates',
    reductionCfm50: range,
    cost: { materialsUsd: costUsd, laborHours: 0, laborRateUsdPerHour: 0 },
    lifeYears: 20,
  };
}

/**
 * The package replayed in this test through applyMeasure with the given reductions, valued
 * with the price book's annualWorth and presentValueFloat parts and the package's fan cost.
 */
function replayPackage(evaluation: Evaluation, reductions: readonly number[]) {
  const { model, plan, home } = evaluation;
  const prices = buildPriceBook(home);
  const measures = plan.entries.filter((e) => e.included).map((e) => e.step.measure);
  let state = stateOf(model, model.testIn);
  let cfm50After = model.testInCfm50;
  let annualUsd = 0;
  let pvUsd = 0;
  let costUsd = 0;
  let sirSavings = 0;
  let sirCost = 0;
  measures.forEach((measure, index) => {
    const r = reductions[index] ?? 0;
    const step = applyMeasure(
      model,
      state,
      { ...measure, estimateCfm50: { low: r, likely: r, high: r } },
      'likely',
    );
    state = stateAfter(step);
    cfm50After = step.cfm50After;
    const heatingUsd = step.saved.heatingFuelUnits * prices.heating.usdPerUnitFloat;
    const kwh = step.saved.coolingKwh + step.saved.ventilationFanKwh;
    const electricityUsd = kwh === 0 ? 0 : kwh * (prices.electricity?.usdPerUnitFloat ?? NaN);
    const pv = prices.presentValueFloat(heatingUsd, electricityUsd, measure.lifeYears);
    annualUsd += heatingUsd + electricityUsd;
    pvUsd += pv;
    costUsd += measure.cost.totalUsdFloat;
    if (!measure.cost.healthAndSafety) {
      sirSavings += pv;
      sirCost += measure.cost.totalUsdFloat;
    }
  });
  const fan = ventilationAfterPackage({ model, prices, leakageAfter: state.leakage }).addedFan;
  costUsd += fan ? fan.costUsd.toNumber() : 0;
  return {
    cfm50After,
    annualUsd,
    npvUsd: pvUsd - costUsd,
    sir: sirCost > 0 ? sirSavings / sirCost : NaN,
  };
}

const EVALUATIONS = DEMO_HOMES.map((home) => ({ home, evaluation: evaluateHome(home) }));

describe('package kernel', () => {
  it('equals the exact plan at the likely point for every demo home', () => {
    for (const { home, evaluation } of EVALUATIONS) {
      const report = reportOf(evaluation).package;
      const kernel = compilePackageKernel(evaluation);
      expect(kernel.measureIds, home.name).toEqual(report.measureIds);
      const figures = kernel.evaluate(
        Float64Array.from(kernel.ranges, (range) => range.likely),
        kernel.baseConditions,
        emptyFigures(),
      );
      // The report rounds each step's money to the cent and the package SIR to 4 decimals.
      const cents = 0.005 * (kernel.measureIds.length + 1) + 1e-9;
      expect(figures.cfm50After, home.name).toBeCloseTo(report.cfm50After, 9);
      expect(Math.abs(figures.annualSavingsUsd - report.annualSavingsUsd), home.name).toBeLessThan(
        cents,
      );
      expect(Math.abs(figures.npvUsd - report.npvUsd), home.name).toBeLessThan(2 * cents);
      if (report.sir === null) expect(figures.sir).toBeNaN();
      else expect(Math.abs(figures.sir - report.sir), home.name).toBeLessThan(5.1e-5);
      expect(figures.fanAdded, home.name).toBe(report.ventilation.fanAdded);
    }
  });

  it('equals the exact low and high replays of the plan for every demo home', () => {
    for (const { home, evaluation } of EVALUATIONS) {
      const report = reportOf(evaluation).package;
      const kernel = compilePackageKernel(evaluation);
      for (const point of ['low', 'high'] as const) {
        const figures = kernel.evaluate(
          Float64Array.from(kernel.ranges, (range) => range[point]),
          kernel.baseConditions,
          emptyFigures(),
        );
        const cents = 0.005 * (kernel.measureIds.length + 1) + 1e-9;
        expect(
          Math.abs(figures.annualSavingsUsd - report.annualSavingsUsdRange[point]),
          `${home.name} ${point}`,
        ).toBeLessThan(cents);
      }
    }
  });

  it('equals a replay through applyMeasure for random reductions, every method (AIM-2 by location too)', () => {
    const random = new Xoshiro128StarStar(99, 0, 0);
    for (const { home, evaluation } of EVALUATIONS) {
      const kernel = compilePackageKernel(evaluation);
      for (let trial = 0; trial < 6; trial += 1) {
        // Up to 1.6 × the high estimate, so the location and floor limits are met too.
        const reductions = kernel.ranges.map((range) => random.nextFraction() * 1.6 * range.high);
        const figures = kernel.evaluate(
          Float64Array.from(reductions),
          kernel.baseConditions,
          emptyFigures(),
        );
        const expected = replayPackage(evaluation, reductions);
        const label = `${home.name} (${home.infiltrationMethod}) trial ${trial}`;
        expect(figures.cfm50After, label).toBeCloseTo(expected.cfm50After, 9);
        expect(figures.annualSavingsUsd, label).toBeCloseTo(expected.annualUsd, 6);
        expect(figures.npvUsd, label).toBeCloseTo(expected.npvUsd, 6);
        if (Number.isNaN(expected.sir)) expect(figures.sir).toBeNaN();
        else expect(figures.sir, label).toBeCloseTo(expected.sir, 9);
      }
    }
  });
});

describe('draw conditions', () => {
  it('value efficiency and N as a home with those efficiencies and that N would be valued', () => {
    const base = evaluateHome(validBaseHome());
    const testIn = base.model.testInCfm50;
    const nFactor = testIn / base.model.airflow(base.model.testIn).heatingCfm;
    const changed = validBaseHome() as unknown as HomeFileInput;
    changed.heating.efficiency *= 0.9;
    if (changed.cooling) changed.cooling.seer *= 0.85;
    changed.nFactorOverride = nFactor * 1.2;
    const changedEvaluation = evaluateHome(changed);
    const kernel = compilePackageKernel(base);
    const likely = Float64Array.from(kernel.ranges, (range) => range.likely);
    const drawn = kernel.evaluate(
      likely,
      {
        ...kernel.baseConditions,
        heatingEfficiencyFactor: 0.9,
        coolingEfficiencyFactor: 0.85,
        infiltrationDivisor: 1.2,
      },
      emptyFigures(),
    );
    // The base home's package valued on the changed home's model and prices.
    const expected = compilePackageKernel({
      home: changedEvaluation.home,
      model: changedEvaluation.model,
      plan: base.plan,
    }).evaluate(likely, kernel.baseConditions, emptyFigures());
    expect(drawn.annualSavingsUsd).toBeCloseTo(expected.annualSavingsUsd, 9);
    expect(drawn.npvUsd).toBeCloseTo(expected.npvUsd, 9);
    expect(drawn.sir).toBeCloseTo(expected.sir, 12);
  });

  it('value escalation by UPV* (NIST Handbook 135): UPV*(3 %, 1 %, 20) = 16.382723 and the Decimal factor', () => {
    expect(escalatedFactorFloat(0.03, 0.01, 20)).toBeCloseTo(16.382723, 6);
    expect(escalatedFactorFloat(0.03, 0.03, 20)).toBe(20);
    for (const [d, e, n] of [
      [0.03, 0.005, 15],
      [0.05, -0.01, 30],
      [0.02, 0.035, 12],
    ] as const) {
      expect(escalatedFactorFloat(d, e, n)).toBeCloseTo(
        escalatedUniformPresentValueFactor({
          discountRateReal: d,
          escalationRateReal: e,
          years: n,
        }).toNumber(),
        10,
      );
    }
  });
});

describe('AIM-2 flows of the kernel', () => {
  it('equal the model airflow for random leakage states of every AIM-2 demo home', () => {
    const random = new Xoshiro128StarStar(17, 0, 0);
    const aim2Homes = EVALUATIONS.filter(({ home }) => home.infiltrationMethod === 'aim2');
    expect(aim2Homes.length).toBeGreaterThan(0);
    for (const { home, evaluation } of aim2Homes) {
      const flows = aim2Flows(evaluation.model);
      const out = new Float64Array(2);
      for (let trial = 0; trial < 20; trial += 1) {
        // Each location keeps 5 % to 100 % of its test-in leakage.
        const leakage = Float64Array.from(
          LEAK_LOCATIONS,
          (location) => evaluation.model.testIn[location] * (0.05 + 0.95 * random.nextFraction()),
        );
        const total = leakage.reduce((sum, value) => sum + value, 0);
        flows(leakage, total, out);
        const expected = evaluation.model.airflow({
          ceiling: leakage[0] ?? 0,
          wall: leakage[1] ?? 0,
          floor: leakage[2] ?? 0,
          flue: leakage[3] ?? 0,
        });
        expect(out[0], home.name).toBeCloseTo(expected.heatingCfm, 9);
        expect(out[1], home.name).toBeCloseTo(expected.coolingCfm, 9);
      }
    }
  });

  it('take the stack, wind and shelter factors of the model to the last bit, every foundation, with and without a flue', () => {
    const random = new Xoshiro128StarStar(23, 0, 0);
    for (let trial = 0; trial < 3000; trial += 1) {
      const n = 0.5 + 0.3 * random.nextFraction();
      const heightFt = 8 + 20 * random.nextFraction();
      const flueHeightFt = trial % 3 === 0 ? undefined : heightFt * (1 + 3 * random.nextFraction());
      // Leakage by location (the flue empty in every fifth trial), as the kernel forms shares.
      const parts = [0, 1, 2, 3].map((location) =>
        location === 3 && trial % 5 === 0 ? 0 : 1000 * random.nextFraction(),
      );
      const total = parts.reduce((sum, part) => sum + part, 0);
      const [ceiling, , floor, flue] = parts.map((part) => part / total) as number[];
      const shares = {
        exponentN: n,
        ceilingShare: ceiling ?? 0,
        floorShare: floor ?? 0,
        flueShare: flue ?? 0,
      };
      const r = shares.ceilingShare + shares.floorShare;
      const x = shares.ceilingShare - shares.floorShare;
      const y = shares.flueShare;
      expect(stackFactorFunction(n, flueHeightFt, heightFt)(r, x, y)).toBe(
        aim2StackFactor({
          ...shares,
          flueHeightRatio: flueHeightFt === undefined ? undefined : flueHeightFt / heightFt,
        }),
      );
      for (const foundation of ['basement', 'slab', 'crawlspace'] as const) {
        expect(windFactorFunction(n, foundation)(r, x, y)).toBe(
          aim2WindFactor({ ...shares, foundation }),
        );
      }
      const shelterClass = (1 + (trial % 5)) as 1 | 2 | 3 | 4 | 5;
      expect(shelterFunction(shelterClass)(y)).toBe(
        aim2ShelterFactor({ shelterClass, flueShare: y }),
      );
    }
    expectInputError(
      () => windFactorFunction(0.65, 'stilts' as 'slab')(0.5, 0.1, 0),
      'foundation',
      /expected "basement", "slab" or "crawlspace"/,
    );
  });
});

describe('two-number hypot of the kernel', () => {
  it('equals Math.hypot to the last bit: random magnitudes, near-equal pairs, zeros, infinities, NaN', () => {
    const specials = [
      0,
      -0,
      1,
      -1,
      5e-324,
      2 ** -1022,
      1.7976931348623157e308,
      Infinity,
      -Infinity,
      NaN,
    ];
    for (const a of specials)
      for (const b of specials) expect(hypotOfTwo(a, b)).toBe(Math.hypot(a, b));
    const random = new Xoshiro128StarStar(31, 0, 0);
    const mismatches: [number, number][] = [];
    for (let trial = 0; trial < 200_000; trial += 1) {
      const exponent = Math.floor(random.nextFraction() * 600) - 300;
      const spread = trial % 3 === 0 ? Math.floor(random.nextFraction() * 10) - 5 : 0;
      const a = (random.nextFraction() - 0.2) * 10 ** exponent;
      const b =
        trial % 7 === 0
          ? a * (1 + 1e-15)
          : (random.nextFraction() - 0.2) * 10 ** (spread === 0 ? exponent - 2 : exponent + spread);
      if (!Object.is(hypotOfTwo(a, b), Math.hypot(a, b))) mismatches.push([a, b]);
    }
    expect(mismatches).toEqual([]);
  });
});

describe('quantiles', () => {
  it('follow Hyndman–Fan definition 7: a hand case', () => {
    // h = (n − 1)·p: [1, 2, 3, 4] at p = 0.1 → 1 + 0.3·(2 − 1) = 1.3; at 0.5 → 2.5.
    expect(quantileSorted([1, 2, 3, 4], 0.1)).toBeCloseTo(1.3, 12);
    expect(quantileSorted([1, 2, 3, 4], 0.5)).toBeCloseTo(2.5, 12);
    expect(quantileSorted([1, 2, 3, 4], 1)).toBe(4);
    expect(quantileSorted([7], 0.9)).toBe(7);
  });

  it('agree with formulajs PERCENTILE.INC on seeded data', () => {
    const random = new Xoshiro128StarStar(5, 1, 0);
    for (const size of [2, 3, 10, 101, 1000]) {
      const values = Array.from({ length: size }, () => random.nextFraction() * 1000 - 200);
      const sorted = Float64Array.from(values).sort();
      for (const p of [0, 0.1, 0.25, 0.5, 0.9, 1]) {
        expect(quantileSorted(sorted, p)).toBeCloseTo(
          reference(formula.PERCENTILE.INC(values, p)),
          9,
        );
      }
    }
  });

  it('of a one-measure home match the triangular inverse CDF and the symmetric PERT median', () => {
    // 3200 CFM50 at test-in; one measure of 200 / 300 / 600 CFM50 meets no limit, so
    // CFM50 after = 3200 − reduction and its P10 is 3200 − Q(0.9).
    const evaluation = evaluateHome(
      baseHomeWith([directMeasure('m1', { low: 200, likely: 300, high: 600 }, 50)]),
    );
    const draws = 40_000;
    const run = packageUncertainty(evaluation, { draws, seed: 3, distribution: 'triangular' });
    const range = { low: 200, likely: 300, high: 600 };
    const density = (x: number) =>
      x <= 300 ? (2 * (x - 200)) / (400 * 100) : (2 * (600 - x)) / (400 * 300);
    for (const [p, got] of [
      [0.1, run.cfm50After.p90],
      [0.5, run.cfm50After.p50],
      [0.9, run.cfm50After.p10],
    ] as const) {
      const x = triangularQuantile(range, p);
      // Standard error of a sample quantile: √(p(1 − p)/N) / f(x_p).
      const error = Math.sqrt((p * (1 - p)) / draws) / density(x);
      expect(Math.abs(3200 - got - x)).toBeLessThan(4 * error);
    }
    expect(Math.abs(run.cfm50After.mean - (3200 - triangularMean(range)))).toBeLessThan(
      (4 * Math.sqrt(triangularVariance(range))) / Math.sqrt(draws),
    );

    const symmetric = evaluateHome(
      baseHomeWith([directMeasure('m1', { low: 100, likely: 300, high: 500 }, 50)]),
    );
    const pert = packageUncertainty(symmetric, { draws, seed: 3 });
    // Beta(3, 3) is symmetric: its median is the middle of the range; density there 1.875/400.
    expect(Math.abs(pert.cfm50After.p50 - 2900)).toBeLessThan(
      (4 * Math.sqrt(0.25 / draws)) / (1.875 / 400),
    );
  });

  it('histogram counts every draw once in equal bins from min to max', () => {
    const values = Float64Array.from([0, 1, 2, 3, 4, 5, 6, 7, 8, 10]);
    const histogram = histogramOf(values, 5);
    expect(histogram.edges).toEqual([0, 2, 4, 6, 8, 10]);
    expect(histogram.counts).toEqual([2, 2, 2, 2, 2]);
    expect(histogramOf(Float64Array.from([3, 3]), 5)).toEqual({ edges: [3, 3], counts: [2] });
  });

  it('by selection equal those of a sorted copy to the last bit: ties, signed zeros, infinities, NaN', () => {
    const random = new Xoshiro128StarStar(41, 0, 0);
    const kinds: (() => number)[] = [
      () => random.nextFraction() * 1000 - 200,
      () => Math.floor(random.nextFraction() * 3) - 1,
      () => [0, -0, 1, -1][Math.floor(random.nextFraction() * 4)] ?? 0,
      () => (random.nextFraction() < 0.5 ? -0 : 0),
      () => (random.nextFraction() < 0.1 ? Infinity : random.nextFraction()),
      () => (random.nextFraction() - 0.5) * 3.5 * 1e308,
      () => random.nextFraction() * 2e-323,
      () => (random.nextFraction() < 0.9 ? 7 : random.nextFraction()),
      () => (random.nextFraction() < 0.05 ? NaN : random.nextFraction()),
    ];
    for (let trial = 0; trial < 3000; trial += 1) {
      const size = 1 + Math.floor(random.nextFraction() * (trial % 10 === 0 ? 2500 : 40));
      const kind = kinds[trial % kinds.length] as () => number;
      const values = Float64Array.from({ length: size }, kind);
      if (trial % 11 === 0) values.sort();
      const unchanged = Float64Array.from(values);
      const spread = spreadOf(values);
      const sorted = Float64Array.from(values).sort();
      expect(spread.p10).toBe(quantileSorted(sorted, 0.1));
      expect(spread.p50).toBe(quantileSorted(sorted, 0.5));
      expect(spread.p90).toBe(quantileSorted(sorted, 0.9));
      expect(values).toEqual(unchanged);
    }
  });

  it('come with no histograms when none are asked for, and the same spreads', () => {
    const evaluation = evaluateHome(validBaseHome());
    const options = { draws: 1500, seed: 9, vary: { nFactor: true } };
    const withHistograms = packageUncertainty(evaluation, options);
    const without = packageUncertainty(evaluation, { ...options, histogramBins: 0 });
    expect(without.histograms).toEqual({
      npvUsd: { edges: [], counts: [] },
      annualSavingsUsd: { edges: [], counts: [] },
    });
    expect({ ...without, histograms: null }).toEqual({ ...withHistograms, histograms: null });
    expect(histogramOf(Float64Array.from([1, 2, 3]), 0)).toEqual({ edges: [], counts: [] });
  });
});

describe('packageUncertainty', () => {
  const evaluation = evaluateHome(validBaseHome());

  it('gives the same figures for the same seed, twice', () => {
    const options = { draws: 2000, seed: 42, vary: { escalation: true, efficiency: true } };
    expect(packageUncertainty(evaluation, options)).toEqual(
      packageUncertainty(evaluation, options),
    );
  });

  it('gives different figures for different seeds and streams', () => {
    const a = packageUncertainty(evaluation, { draws: 2000, seed: 42 });
    const b = packageUncertainty(evaluation, { draws: 2000, seed: 43 });
    const c = packageUncertainty(evaluation, { draws: 2000, seed: 42, stream: 1 });
    expect(a.npvUsd.mean).not.toBe(b.npvUsd.mean);
    expect(a.npvUsd.mean).not.toBe(c.npvUsd.mean);
  });

  it('is the likely point in every draw when every range is degenerate; chance SIR ≥ 1 is 0 or 1', () => {
    const home = baseHomeWith([
      directMeasure('m1', { low: 300, likely: 300, high: 300 }, 200),
      directMeasure('m2', { low: 150, likely: 150, high: 150 }, 150),
    ]);
    const likely = evaluateHome(home);
    const report = reportOf(likely).package;
    expect(report.sir).not.toBeNull();
    const sir = report.sir ?? NaN;
    expect(sir).toBeGreaterThan(1);
    const run = packageUncertainty(likely, { draws: 500, seed: 1 });
    expect(run.cfm50After).toEqual({
      p10: report.cfm50After,
      p50: report.cfm50After,
      p90: report.cfm50After,
      mean: report.cfm50After,
    });
    expect(run.npvUsd.p10).toBe(run.npvUsd.p90);
    expect(run.npvUsd.p50).toBeCloseTo(report.npvUsd, 1);
    expect(run.chanceSirAtLeastOne).toBe(1);

    // The same package valued at prices scaled so its SIR is 0.5: every saving scales with the
    // prices (both fuels scaled alike), so the SIR does too.
    const scale = 0.5 / sir;
    const cheap = structuredClone(home);
    const cheapPrices = cheap.prices as Record<string, { usdPerUnit: number }>;
    for (const price of Object.values(cheapPrices)) price.usdPerUnit *= scale;
    const cheapEvaluation = evaluateHome(cheap);
    const below = packageUncertainty(
      { home: cheapEvaluation.home, model: cheapEvaluation.model, plan: likely.plan },
      { draws: 500, seed: 1 },
    );
    expect(below.chanceSirAtLeastOne).toBe(0);
    expect(below.sir?.p50).toBeCloseTo(0.5, 4);
  });

  it('widens the spread of NPV when escalation, efficiency and N vary too', () => {
    const plain = packageUncertainty(evaluation, { draws: 4000, seed: 8 });
    const varied = packageUncertainty(evaluation, {
      draws: 4000,
      seed: 8,
      vary: { escalation: true, efficiency: true, nFactor: true },
    });
    expect(varied.npvUsd.p90 - varied.npvUsd.p10).toBeGreaterThan(
      plain.npvUsd.p90 - plain.npvUsd.p10,
    );
    expect(varied.vary).toEqual({
      escalationPlusMinusRate: 0.01,
      efficiencyBelowRatingFraction: 0.15,
      nFactorPlusMinusFraction: 0.25,
    });
    // The measures use the first numbers of each draw, so varying more leaves them alone.
    expect(varied.measureIds).toEqual(plain.measureIds);
    expect(varied.histograms.npvUsd.counts.reduce((a, b) => a + b, 0)).toBe(4000);
  });

  it('refuses bad options, naming the field', () => {
    expectInputError(
      () => packageUncertainty(evaluation, { draws: 0, seed: 1 }),
      'draws',
      /whole number from 1/,
    );
    expectInputError(
      () => packageUncertainty(evaluation, { draws: 10, seed: -1 }),
      'seed',
      /whole number from 0/,
    );
    expectInputError(
      () =>
        packageUncertainty(evaluation, {
          draws: 10,
          seed: 1,
          distribution: 'uniform' as 'pert',
        }),
      'distribution',
      /"pert" or "triangular"/,
    );
    expectInputError(
      () =>
        packageUncertainty(evaluation, {
          draws: 10,
          seed: 1,
          vary: { escalation: { plusMinusRate: 0.5 } },
        }),
      'vary.escalation.plusMinusRate',
      /from 0 to 0.1/,
    );
  });
});

/** What a run gives: its value, or the error it throws (message and field). */
function outcomeOf<T>(run: () => T): { value: T } | { error: string; field: string | null } {
  try {
    return { value: run() };
  } catch (error) {
    return error instanceof InputError
      ? { error: error.message, field: error.field }
      : { error: String(error), field: null };
  }
}

describe('a portfolio home', () => {
  const homes = fc.sample(homeArbitrary({ measureCount: { min: 1, max: 8 } }), {
    seed: 17,
    numRuns: 60,
  });
  // A project's library: every type's leakage area per unit half as large again.
  const projectLibrary = lookupOf(
    MEASURE_LIBRARY.map((type) => {
      const { low, likely, high } = type.leakageAreaIn2PerUnit;
      return {
        ...type,
        leakageAreaIn2PerUnit: { low: low * 1.5, likely: likely * 1.5, high: high * 1.5 },
      };
    }),
  );
  const variants = homes.flatMap((home, index) => {
    const noElectricity = structuredClone(home);
    delete (noElectricity.prices as Record<string, unknown>).electricity;
    const badTest = structuredClone(home);
    if (index % 6 === 0) badTest.leakageTest = { cfm50: -5 };
    return [
      { home, library: undefined },
      { home: noElectricity, library: undefined },
      { home, library: projectLibrary },
      { home: badTest, library: undefined },
    ];
  });

  it('gets the package evaluateHome plans, or its error, for generated and broken homes', () => {
    let planned = 0;
    let refused = 0;
    const options = { draws: 60, seed: 5, vary: { efficiency: true } };
    variants.forEach(({ home, library }, stream) => {
      const settings = library ? { library } : {};
      const expected = outcomeOf(() =>
        packageUncertainty(evaluateHome(home, settings), { ...options, stream }),
      );
      const got = outcomeOf(() =>
        kernelUncertainty(compileMeasuresKernel(homePackageOf(home, settings)), {
          ...options,
          stream,
        }),
      );
      expect(got).toEqual(expected);
      if ('value' in expected) planned += 1;
      else refused += 1;
    });
    // Both kinds are met: packages planned, and refusals for each broken kind.
    expect(planned).toBeGreaterThan(60);
    expect(refused).toBeGreaterThan(20);
  });

  it('meets the cases its checks are for: a refusal only the plan money makes, a home planned without an electricity price', () => {
    const refusals = new Set<string>();
    let plannedWithoutElectricity = 0;
    for (const { home, library } of variants) {
      const got = outcomeOf(() => homePackageOf(home, library ? { library } : {}));
      if ('error' in got) refusals.add(got.error);
      else if (!('electricity' in home.prices)) plannedWithoutElectricity += 1;
    }
    // The price book's annualWorth asks for it when a step's savings include electricity.
    expect(refusals).toContain(
      'prices.electricity: is required for cooling and ventilation fans: expected { usdPerUnit } per kWh',
    );
    expect(refusals).toContain('leakageTest.cfm50: expected a number greater than 0, got -5');
    expect(plannedWithoutElectricity).toBeGreaterThan(0);
  });
});
