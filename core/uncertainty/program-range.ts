/**
 * The range of a whole program: every home's package drawn on its own stream (homes
 * independent), the homes added draw by draw, each home's figure rounded to whole cents first
 * so the sums are exact and do not depend on the order of adding. Its percentiles are the
 * program's, not sums of the homes' percentiles: independent homes partly offset each other.
 * The same arithmetic as the worker pool's `programTotals` (electron/uncertainty-pool.ts), in
 * one thread, for the page's worker.
 */
import { InputError } from '../errors.ts';
import type { MeasureLookup } from '../measure-library.ts';
import { compileMeasuresKernel } from '../plan/kernel.ts';
import { allocateSamples, runDraws, runSettings } from './monte-carlo.ts';
import { Xoshiro128StarStar } from './random.ts';
import { rangeSampler, sampleRange } from './samplers.ts';
import { homePackageOf } from './portfolio-home.ts';
import { spreadOf, type FigureSpread } from './summary.ts';
import type { WeatherYear } from '../weather/hourly-airflow.ts';

/**
 * The stream of the program-wide bias: above any home's place in a portfolio (streams are
 * whole numbers below 2^31), so the bias never shares numbers with a home.
 */
export const PROGRAM_BIAS_STREAM = 2 ** 31 - 1;

/**
 * A factor per draw on every home's drawn reductions: how much the program's estimates as a
 * whole may run high or low (a crew, a season, an auditor's habit), PERT from 1 − x to 1 + x,
 * most likely 1. With it the homes are no longer independent: a draw that is low is low
 * everywhere, and the program's range widens.
 *
 * @param plusMinusFraction - x, from 0 to 0.9
 */
export function programBiasScale(
  seed: number,
  draws: number,
  plusMinusFraction: number,
): Float64Array {
  if (!(plusMinusFraction >= 0 && plusMinusFraction <= 0.9)) {
    throw InputError.at(
      'programBias',
      `expected a fraction from 0 to 0.9, got ${plusMinusFraction}`,
    );
  }
  const sampler = rangeSampler('pert', {
    low: 1 - plusMinusFraction,
    likely: 1,
    high: 1 + plusMinusFraction,
  });
  const random = new Xoshiro128StarStar();
  return Float64Array.from({ length: draws }, (_, draw) => {
    random.reseed(seed, PROGRAM_BIAS_STREAM, draw);
    return sampleRange(sampler, random.nextFraction());
  });
}

export interface ProgramRangeResult {
  draws: number;
  seed: number;
  /** The program-wide bias's ± fraction; null when the homes were independent. */
  programBias: number | null;
  /** Homes drawn, and those that could not be planned (with why). */
  homes: number;
  failed: { index: number; message: string; field?: string }[];
  annualSavingsUsd: FigureSpread;
  npvUsd: FigureSpread;
}

/**
 * The program's range of annual savings and NPV.
 *
 * @param homes - home files; home i draws on stream i
 * @param options.draws - draws a home (1 to 100,000)
 * @param options.seed - whole number from 0 to 2^32 − 1
 * @param options.programBias - a program-wide bias's ± fraction (programBiasScale); none when absent
 * @param library - the project's measure library
 * @param weatherOf - the weather year of home i when it is planned hour by hour
 * @throws InputError naming `draws` or `seed` when out of range
 */
export function programRange(
  homes: readonly unknown[],
  options: { draws: number; seed: number; programBias?: number },
  library?: MeasureLookup,
  weatherOf?: (index: number) => WeatherYear | undefined,
): ProgramRangeResult {
  if (!(Number.isInteger(options.draws) && options.draws >= 1 && options.draws <= 100_000)) {
    throw InputError.at('draws', `expected a whole number from 1 to 100000, got ${options.draws}`);
  }
  runSettings({ draws: options.draws, seed: options.seed });
  const bias = options.programBias ?? null;
  const scale = bias === null ? undefined : programBiasScale(options.seed, options.draws, bias);
  const savingsCents = new Float64Array(options.draws);
  const npvCents = new Float64Array(options.draws);
  const samples = allocateSamples(options.draws);
  const failed: ProgramRangeResult['failed'] = [];
  homes.forEach((home, index) => {
    try {
      const weather = weatherOf?.(index);
      const kernel = compileMeasuresKernel(
        homePackageOf(home, { ...(library ? { library } : {}), ...(weather ? { weather } : {}) }),
      );
      const settings = runSettings({
        draws: options.draws,
        seed: options.seed,
        stream: index,
        histogramBins: 0,
      });
      runDraws(kernel, settings, 0, samples, scale);
      for (let draw = 0; draw < options.draws; draw += 1) {
        savingsCents[draw] =
          (savingsCents[draw] ?? 0) + Math.round((samples.annualSavingsUsd[draw] ?? 0) * 100);
        npvCents[draw] = (npvCents[draw] ?? 0) + Math.round((samples.npvUsd[draw] ?? 0) * 100);
      }
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      failed.push({
        index,
        message: error.message,
        ...(error.field ? { field: error.field } : {}),
      });
    }
  });
  const toUsd = (cents: Float64Array) => cents.map((value) => value / 100);
  return {
    draws: options.draws,
    seed: options.seed,
    programBias: bias,
    homes: homes.length - failed.length,
    failed,
    annualSavingsUsd: spreadOf(toUsd(savingsCents)),
    npvUsd: spreadOf(toUsd(npvCents)),
  };
}
