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
import { isUsableRange, requireRange, type Distribution } from './distributions.ts';
import { drawFractions, streamKeyOf } from './random.ts';
import {
  conditionSamplers,
  drawConditions,
  reductionSamplers,
  sampleReductions,
} from './samplers.ts';
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
 * Draw k's figures depend only on (seed, stream, k) — and, when given, on `reductionScale[k]`,
 * a factor on every measure's drawn reduction in draw k (a bias shared by a program's homes).
 */
export function runDraws(
  kernel: PackageKernel,
  settings: RunSettings,
  firstDraw: number,
  samples: DrawSamples,
  reductionScale?: Float64Array,
): void {
  const count = kernel.ranges.length;
  for (let index = 0; index < count; index += 1) {
    const range = kernel.ranges[index] as Range;
    // The field's path is built only for the error: a portfolio checks every home's ranges.
    if (!isUsableRange(range)) {
      requireRange(`measures.${kernel.measureIds[index]}.estimateCfm50`, range);
    }
  }
  const samplers = reductionSamplers(settings.distribution, kernel.ranges);
  const varied = conditionSamplers(kernel, settings);
  const conditionsVary =
    varied.heatingEscalation !== null ||
    varied.electricityEscalation !== null ||
    varied.efficiency !== null ||
    varied.nFactor !== null;

  const streamKey = streamKeyOf(settings.seed, settings.stream);
  // A draw's numbers: its measures' first, then (when any varies) the conditions'.
  const numbers = count + (conditionsVary ? CONDITION_SLOTS : 0);
  const fractions = new Float64Array(numbers);
  const conditionFractions = fractions.subarray(count);
  const reductions = new Float64Array(count);
  const conditions: DrawConditions = { ...kernel.baseConditions };
  const figures = emptyFigures();
  const { cfm50After, annualSavingsUsd, npvUsd, sir, fanAdded } = samples;
  const drawCount = npvUsd.length;
  for (let offset = 0; offset < drawCount; offset += 1) {
    drawFractions(streamKey, firstDraw + offset, fractions, numbers);
    sampleReductions(samplers, fractions, reductions);
    if (reductionScale) {
      const scale = reductionScale[firstDraw + offset] ?? 1;
      for (let index = 0; index < count; index += 1)
        reductions[index] = (reductions[index] as number) * scale;
    }
    // The conditions always take the next numbers, so varying more leaves the measures alone;
    // when none varies, nothing reads them.
    if (conditionsVary) drawConditions(varied, conditionFractions, conditions);
    kernel.evaluate(reductions, conditions, figures);
    cfm50After[offset] = figures.cfm50After;
    annualSavingsUsd[offset] = figures.annualSavingsUsd;
    npvUsd[offset] = figures.npvUsd;
    sir[offset] = figures.sir;
    fanAdded[offset] = figures.fanAdded ? 1 : 0;
  }
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
 * @param options.histogramBins - bins of each histogram (20 by default; 0 for none)
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
  return runKernel(compilePackageKernel(evaluation), settings);
}

/**
 * The uncertainty of a compiled package kernel: `packageUncertainty` without the evaluation
 * (a portfolio compiles its homes' kernels from their sequenced measures).
 *
 * @throws InputError naming the option at fault
 */
export function kernelUncertainty(
  kernel: PackageKernel,
  options: UncertaintyOptions,
): PackageUncertainty {
  return runKernel(kernel, runSettings(options));
}

function runKernel(kernel: PackageKernel, settings: RunSettings): PackageUncertainty {
  const samples = scratchSamples(settings.draws);
  runDraws(kernel, settings, 0, samples);
  return summarizeSamples(kernel, settings, samples);
}
