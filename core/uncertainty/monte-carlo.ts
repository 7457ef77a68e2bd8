/**
 * What a home's package may turn out to be: Monte Carlo over every package measure's low /
 * likely / high CFM50 estimate (PERT by default, triangular as an option), and optionally over
 * fuel price escalation, equipment efficiency and the natural-infiltration factor N. Seeded
 * and reproducible: draw k of stream s under seed S uses numbers that depend on (S, s, k)
 * alone, so the figures are the same run after run and however the draws are shared among
 * workers. Node and a browser draw the very same numbers; their figures agree to
 * floating-point accuracy, not always to the last bit, because engines may round Math.log,
 * Math.exp and Math.pow differently (ECMA-262 leaves them implementation-approximated).
 *
 * The package is the plan's (its measures in the order applied); each draw replays it with
 * sampled reductions through the float64 kernel (core/plan/kernel.ts).
 */
import type { Evaluation } from '../evaluate.ts';
import {
  compilePackageKernel,
  emptyFigures,
  type DrawConditions,
  type PackageKernel,
} from '../plan/kernel.ts';
import type { Range } from '../schema.ts';
import {
  PERT_TABLE_STEPS,
  pertQuantileTable,
  rangeQuantile,
  requireRange,
  triangularQuantile,
  type Distribution,
} from './distributions.ts';
import { Xoshiro128StarStar } from './random.ts';
import {
  runSettings,
  type ResolvedVariations,
  type RunSettings,
  type UncertaintyOptions,
} from './settings.ts';
import { histogramOf, spreadOf, type FigureSpread, type Histogram } from './summary.ts';

export type { FigureSpread, Histogram } from './summary.ts';
export * from './settings.ts';

/** Random numbers a draw uses after its measures': one per varied condition, always taken. */
const CONDITION_SLOTS = 5;

export interface PackageUncertainty {
  draws: number;
  seed: number;
  stream: number;
  distribution: Distribution;
  vary: ResolvedVariations;
  measureIds: string[];
  cfm50After: FigureSpread;
  annualSavingsUsd: FigureSpread;
  npvUsd: FigureSpread;
  /** Null when the package has no energy measure with a cost. */
  sir: FigureSpread | null;
  /** Share of draws with package SIR ≥ 1; null when there is no SIR. */
  chanceSirAtLeastOne: number | null;
  /** Share of draws in which the tighter house needs a ventilation fan beyond its own. */
  chanceFanAdded: number;
  histograms: { npvUsd: Histogram; annualSavingsUsd: Histogram };
}

/** The per-draw figures of a run, one entry per draw. */
export interface DrawSamples {
  cfm50After: Float64Array;
  annualSavingsUsd: Float64Array;
  npvUsd: Float64Array;
  sir: Float64Array;
  fanAdded: Uint8Array;
}

/**
 * One set of sample arrays reused from run to run (a portfolio runs thousands of homes): the
 * summary copies what it keeps, so reuse changes no result.
 */
let scratch: DrawSamples | null = null;

function scratchSamples(draws: number): DrawSamples {
  if (scratch?.npvUsd.length !== draws) scratch = allocateSamples(draws);
  return scratch;
}

/** Allocates the samples of `draws` draws. */
export function allocateSamples(draws: number): DrawSamples {
  return {
    cfm50After: new Float64Array(draws),
    annualSavingsUsd: new Float64Array(draws),
    npvUsd: new Float64Array(draws),
    sir: new Float64Array(draws),
    fanAdded: new Uint8Array(draws),
  };
}

/**
 * Runs draws `firstDraw` … `firstDraw + samples.npvUsd.length − 1` of a kernel into `samples`.
 * Draw k's figures depend only on (seed, stream, k).
 */
export function runDraws(
  kernel: PackageKernel,
  settings: RunSettings,
  firstDraw: number,
  samples: DrawSamples,
): void {
  const { distribution, vary } = settings;
  kernel.ranges.forEach((range, index) =>
    requireRange(`measures.${kernel.measureIds[index]}.estimateCfm50`, range),
  );
  // Local copies: under a CommonJS transform every read of an imported binding is a call.
  const triangular = triangularQuantile;
  const quantileOf = rangeQuantile;
  const count = kernel.ranges.length;
  const lows = Float64Array.from(kernel.ranges, (range) => range.low);
  const widths = Float64Array.from(kernel.ranges, (range) => range.high - range.low);
  const tables = kernel.ranges.map((range) =>
    distribution === 'pert' && range.high > range.low
      ? pertQuantileTable((range.likely - range.low) / (range.high - range.low))
      : null,
  );
  const steps = PERT_TABLE_STEPS;

  const base = kernel.baseConditions;
  const escalation = vary.escalationPlusMinusRate;
  const efficiency = vary.efficiencyBelowRatingFraction;
  const nFactor = vary.nFactorPlusMinusFraction;
  const heatingEscalation =
    escalation === null ? null : aroundPoint(base.heatingEscalationRate, escalation);
  const electricityEscalation =
    escalation === null ? null : aroundPoint(base.electricityEscalationRate, escalation);
  const efficiencyRange = efficiency === null ? null : { low: 1 - efficiency, likely: 1, high: 1 };
  const nRange = nFactor === null ? null : { low: 1 - nFactor, likely: 1, high: 1 + nFactor };

  const random = new Xoshiro128StarStar();
  const reductions = new Float64Array(count);
  const conditions: DrawConditions = { ...base };
  const figures = emptyFigures();
  const fractions = new Float64Array(CONDITION_SLOTS);
  const drawCount = samples.npvUsd.length;
  for (let offset = 0; offset < drawCount; offset += 1) {
    random.reseed(settings.seed, settings.stream, firstDraw + offset);
    for (let index = 0; index < count; index += 1) {
      const fraction = random.nextFraction();
      const width = widths[index] ?? 0;
      const table = tables[index];
      if (!(width > 0)) {
        reductions[index] = kernel.ranges[index]?.likely ?? 0;
      } else if (table) {
        const position = fraction * steps;
        const cell = Math.min(steps - 1, Math.floor(position));
        const lower = table[cell] ?? 0;
        reductions[index] =
          (lows[index] ?? 0) +
          width * (lower + (position - cell) * ((table[cell + 1] ?? 1) - lower));
      } else {
        reductions[index] = triangular(kernel.ranges[index] as Range, fraction);
      }
    }
    // The conditions always take the next numbers, so varying more leaves the measures alone.
    for (let slot = 0; slot < CONDITION_SLOTS; slot += 1) fractions[slot] = random.nextFraction();
    if (heatingEscalation && electricityEscalation) {
      conditions.heatingEscalationRate = quantileOf(
        distribution,
        heatingEscalation,
        fractions[0] ?? 0,
      );
      conditions.electricityEscalationRate = quantileOf(
        distribution,
        electricityEscalation,
        fractions[1] ?? 0,
      );
    }
    if (efficiencyRange) {
      conditions.heatingEfficiencyFactor = quantileOf(
        distribution,
        efficiencyRange,
        fractions[2] ?? 0,
      );
      conditions.coolingEfficiencyFactor = quantileOf(
        distribution,
        efficiencyRange,
        fractions[3] ?? 0,
      );
    }
    if (nRange)
      conditions.infiltrationDivisor = quantileOf(distribution, nRange, fractions[4] ?? 0);
    kernel.evaluate(reductions, conditions, figures);
    samples.cfm50After[offset] = figures.cfm50After;
    samples.annualSavingsUsd[offset] = figures.annualSavingsUsd;
    samples.npvUsd[offset] = figures.npvUsd;
    samples.sir[offset] = figures.sir;
    samples.fanAdded[offset] = figures.fanAdded ? 1 : 0;
  }
}

function aroundPoint(point: number, plusMinus: number): Range {
  return { low: point - plusMinus, likely: point, high: point + plusMinus };
}

/** The summary of a run's samples. */
export function summarizeSamples(
  kernel: Pick<PackageKernel, 'measureIds'>,
  settings: RunSettings,
  samples: DrawSamples,
): PackageUncertainty {
  const draws = samples.npvUsd.length;
  let sirCount = 0;
  let sirAtLeastOne = 0;
  let fanCount = 0;
  for (let index = 0; index < draws; index += 1) {
    const sir = samples.sir[index] ?? Number.NaN;
    if (!Number.isNaN(sir)) {
      sirCount += 1;
      if (sir >= 1) sirAtLeastOne += 1;
    }
    if (samples.fanAdded[index] === 1) fanCount += 1;
  }
  return {
    draws,
    seed: settings.seed,
    stream: settings.stream,
    distribution: settings.distribution,
    vary: { ...settings.vary },
    measureIds: [...kernel.measureIds],
    cfm50After: spreadOf(samples.cfm50After),
    annualSavingsUsd: spreadOf(samples.annualSavingsUsd),
    npvUsd: spreadOf(samples.npvUsd),
    sir: sirCount === draws && draws > 0 ? spreadOf(samples.sir) : null,
    chanceSirAtLeastOne: sirCount === 0 ? null : sirAtLeastOne / sirCount,
    chanceFanAdded: fanCount / draws,
    histograms: {
      npvUsd: histogramOf(samples.npvUsd, settings.histogramBins),
      annualSavingsUsd: histogramOf(samples.annualSavingsUsd, settings.histogramBins),
    },
  };
}

/**
 * The uncertainty of an evaluated home's package.
 *
 * @param evaluation - from `evaluateHome`
 * @param options.draws - number of draws (1 to 1,000,000)
 * @param options.seed - whole number from 0 to 2^32 − 1
 * @param options.distribution - 'pert' (default) or 'triangular'
 * @param options.vary - escalation, efficiency and N variations (each off unless asked)
 * @returns P10 / P50 / P90 and mean of CFM50 after, annual savings and NPV, the chance the
 *   package SIR is at least 1, and histograms of NPV and annual savings
 * @throws InputError naming the option at fault
 *
 * Notes: quantiles by Hyndman & Fan's definition 7 (numpy's and Excel PERCENTILE.INC's).
 */
export function packageUncertainty(
  evaluation: Pick<Evaluation, 'home' | 'model' | 'plan'>,
  options: UncertaintyOptions,
): PackageUncertainty {
  const settings = runSettings(options);
  const kernel = compilePackageKernel(evaluation);
  const samples = scratchSamples(settings.draws);
  runDraws(kernel, settings, 0, samples);
  return summarizeSamples(kernel, settings, samples);
}
