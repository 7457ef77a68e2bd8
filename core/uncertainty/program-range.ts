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
import { homePackageOf } from './portfolio-home.ts';
import { spreadOf, type FigureSpread } from './summary.ts';

export interface ProgramRangeResult {
  draws: number;
  seed: number;
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
 * @param library - the project's measure library
 * @throws InputError naming `draws` or `seed` when out of range
 */
export function programRange(
  homes: readonly unknown[],
  options: { draws: number; seed: number },
  library?: MeasureLookup,
): ProgramRangeResult {
  if (!(Number.isInteger(options.draws) && options.draws >= 1 && options.draws <= 100_000)) {
    throw InputError.at('draws', `expected a whole number from 1 to 100000, got ${options.draws}`);
  }
  runSettings({ draws: options.draws, seed: options.seed });
  const savingsCents = new Float64Array(options.draws);
  const npvCents = new Float64Array(options.draws);
  const samples = allocateSamples(options.draws);
  const failed: ProgramRangeResult['failed'] = [];
  homes.forEach((home, index) => {
    try {
      const kernel = compileMeasuresKernel(homePackageOf(home, library ? { library } : {}));
      const settings = runSettings({ ...options, stream: index, histogramBins: 0 });
      runDraws(kernel, settings, 0, samples);
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
    homes: homes.length - failed.length,
    failed,
    annualSavingsUsd: spreadOf(toUsd(savingsCents)),
    npvUsd: spreadOf(toUsd(npvCents)),
  };
}
