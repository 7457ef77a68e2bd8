/**
 * One worker of the uncertainty pool (electron/uncertainty-pool.ts): it plans each home of a
 * batch and runs its package's Monte Carlo with the home's place in the portfolio as its
 * stream, so a home's figures are the same whichever worker runs it.
 *
 * A home is planned by `homePackageOf`: the package `evaluateHome` would plan, errors
 * included, without the plan's Decimal money that a Monte Carlo run never reads (most of
 * `evaluateHome`'s time, which was most of a portfolio's).
 */
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { parentPort, workerData } from 'node:worker_threads';
import { InputError } from '../core/errors.ts';
import { lookupOf, type MeasureType } from '../core/measure-library.ts';
import type { WeatherYear } from '../core/weather.ts';
import { compileMeasuresKernel } from '../core/plan/kernel.ts';
import {
  allocateSamples,
  kernelUncertainty,
  runDraws,
  runSettings,
  summarizeSamples,
  type DrawSamples,
  type PackageUncertainty,
  type UncertaintyOptions,
} from '../core/uncertainty/monte-carlo.ts';
import { homePackageOf } from '../core/uncertainty/portfolio-home.ts';
import { programBiasScale } from '../core/uncertainty/program-range.ts';

/** A batch of homes: `homes[i]` is the portfolio's home `firstIndex + i`. */
export interface UncertaintyBatch {
  batchId: number;
  firstIndex: number;
  homes: readonly unknown[];
  /** `weather[i]`: home i's weather year when it is planned hour by hour, else null. */
  weather?: readonly (WeatherYear | null)[];
  options: Omit<UncertaintyOptions, 'stream'>;
  /** The project's measure library; the shipped one when absent. */
  libraryTypes?: readonly MeasureType[];
  /** Add up the batch's homes draw by draw (the program's totals), in whole cents. */
  programTotals?: boolean;
  /** With programTotals: a program-wide bias's ± fraction on every home's reductions. */
  programBias?: number;
}

/**
 * The batch's homes added draw by draw: entry k is the sum over the homes of draw k, each
 * home's figure rounded to whole cents first. Sums of whole cents are exact in float64 (up to
 * 2^53 cents), so the program's totals do not depend on how homes were batched or ordered.
 */
export interface DrawTotals {
  annualSavingsCents: Float64Array;
  npvCents: Float64Array;
}

/** One home's outcome: its figures, or why it could not be run. */
export type HomeUncertainty =
  | { index: number; ok: true; value: PackageUncertainty }
  | { index: number; ok: false; error: { message: string; field?: string } };

export interface UncertaintyBatchResult {
  batchId: number;
  results: HomeUncertainty[];
  /** Milliseconds the batch spent planning homes and drawing their packages. */
  evaluateMs: number;
  drawMs: number;
  /**
   * The thread's own CPU time before and after the batch, ms, to 10 ms; null where the
   * system does not tell it. Beside the wall-clock figures it shows whether the worker ran
   * or waited for a core that other work held.
   */
  threadCpuMs: { before: number; after: number } | null;
  /** With `programTotals`: the batch's draw-by-draw sums. */
  totals?: DrawTotals;
}

function addCents(into: Float64Array, values: Float64Array): void {
  for (let draw = 0; draw < into.length; draw += 1) {
    into[draw] = (into[draw] ?? 0) + Math.round((values[draw] ?? 0) * 100);
  }
}

/** Clock ticks a second of Linux's per-thread CPU times (USER_HZ; `getconf CLK_TCK`). */
const CLOCK_TICKS_PER_SECOND = 100;

/** This thread's CPU time so far, ms (user and system), from Linux's /proc; null elsewhere. */
export function threadCpuMs(): number | null {
  try {
    const stat = readFileSync('/proc/thread-self/stat', 'utf8');
    // The fields after the command name, from the state (field 3): utime is field 14 and
    // stime field 15 (proc(5)).
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(fields[11]) + Number(fields[12]);
    return Number.isFinite(ticks) ? (ticks * 1000) / CLOCK_TICKS_PER_SECOND : null;
  } catch {
    return null;
  }
}

/** Runs one batch; exported so the pool's callers and tests can run it in-process too. */
export function runBatch(batch: UncertaintyBatch): UncertaintyBatchResult {
  const cpuBefore = threadCpuMs();
  const library = batch.libraryTypes ? lookupOf(batch.libraryTypes) : undefined;
  let evaluateMs = 0;
  let drawMs = 0;
  const draws = batch.options.draws;
  const totals: DrawTotals | undefined = batch.programTotals
    ? { annualSavingsCents: new Float64Array(draws), npvCents: new Float64Array(draws) }
    : undefined;
  let samples: DrawSamples | null = null;
  const scale =
    totals && batch.programBias !== undefined
      ? programBiasScale(batch.options.seed, draws, batch.programBias)
      : undefined;
  const results = batch.homes.map((home, offset): HomeUncertainty => {
    const index = batch.firstIndex + offset;
    try {
      const started = performance.now();
      const weather = batch.weather?.[offset] ?? undefined;
      const planned = homePackageOf(home, {
        ...(library ? { library } : {}),
        ...(weather ? { weather } : {}),
      });
      const evaluated = performance.now();
      evaluateMs += evaluated - started;
      const kernel = compileMeasuresKernel(planned);
      let value: PackageUncertainty;
      if (totals) {
        const settings = runSettings({ ...batch.options, stream: index });
        samples ??= allocateSamples(settings.draws);
        runDraws(kernel, settings, 0, samples, scale);
        value = summarizeSamples(kernel, settings, samples);
        addCents(totals.annualSavingsCents, samples.annualSavingsUsd);
        addCents(totals.npvCents, samples.npvUsd);
      } else {
        value = kernelUncertainty(kernel, { ...batch.options, stream: index });
      }
      drawMs += performance.now() - evaluated;
      return { index, ok: true, value };
    } catch (error) {
      if (error instanceof InputError) {
        return { index, ok: false, error: { message: error.message, field: error.field } };
      }
      return { index, ok: false, error: { message: String(error) } };
    }
  });
  const cpuAfter = threadCpuMs();
  const threadCpu =
    cpuBefore === null || cpuAfter === null ? null : { before: cpuBefore, after: cpuAfter };
  return {
    batchId: batch.batchId,
    results,
    evaluateMs,
    drawMs,
    threadCpuMs: threadCpu,
    ...(totals ? { totals } : {}),
  };
}

/** Marks a worker started by the pool (test runners run their own files in worker threads). */
export const POOL_WORKER_MARK = 'sealwork-uncertainty-worker';

if (parentPort && (workerData as { mark?: unknown } | null)?.mark === POOL_WORKER_MARK) {
  const port = parentPort;
  port.on('message', (batch: UncertaintyBatch) => port.postMessage(runBatch(batch)));
}
