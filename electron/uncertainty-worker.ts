/**
 * One worker of the uncertainty pool (electron/uncertainty-pool.ts): it evaluates each home
 * of a batch and runs its package's Monte Carlo with the home's place in the portfolio as its
 * stream, so a home's figures are the same whichever worker runs it.
 */
import { performance } from 'node:perf_hooks';
import { parentPort, workerData } from 'node:worker_threads';
import { InputError } from '../core/errors.ts';
import { evaluateHome } from '../core/evaluate.ts';
import { lookupOf, type MeasureType } from '../core/measure-library.ts';
import {
  packageUncertainty,
  type PackageUncertainty,
  type UncertaintyOptions,
} from '../core/uncertainty/monte-carlo.ts';

/** A batch of homes: `homes[i]` is the portfolio's home `firstIndex + i`. */
export interface UncertaintyBatch {
  batchId: number;
  firstIndex: number;
  homes: readonly unknown[];
  options: Omit<UncertaintyOptions, 'stream'>;
  /** The project's measure library; the shipped one when absent. */
  libraryTypes?: readonly MeasureType[];
}

/** One home's outcome: its figures, or why it could not be run. */
export type HomeUncertainty =
  | { index: number; ok: true; value: PackageUncertainty }
  | { index: number; ok: false; error: { message: string; field?: string } };

export interface UncertaintyBatchResult {
  batchId: number;
  results: HomeUncertainty[];
  /** Milliseconds the batch spent evaluating homes and drawing their packages. */
  evaluateMs: number;
  drawMs: number;
}

/** Runs one batch; exported so the pool's callers and tests can run it in-process too. */
export function runBatch(batch: UncertaintyBatch): UncertaintyBatchResult {
  const library = batch.libraryTypes ? lookupOf(batch.libraryTypes) : undefined;
  let evaluateMs = 0;
  let drawMs = 0;
  const results = batch.homes.map((home, offset): HomeUncertainty => {
    const index = batch.firstIndex + offset;
    try {
      const started = performance.now();
      const evaluation = evaluateHome(home, library ? { library } : {});
      const evaluated = performance.now();
      evaluateMs += evaluated - started;
      const value = packageUncertainty(evaluation, { ...batch.options, stream: index });
      drawMs += performance.now() - evaluated;
      return { index, ok: true, value };
    } catch (error) {
      if (error instanceof InputError) {
        return { index, ok: false, error: { message: error.message, field: error.field } };
      }
      return { index, ok: false, error: { message: String(error) } };
    }
  });
  return { batchId: batch.batchId, results, evaluateMs, drawMs };
}

/** Marks a worker started by the pool (test runners run their own files in worker threads). */
export const POOL_WORKER_MARK = 'sealwork-uncertainty-worker';

if (parentPort && (workerData as { mark?: unknown } | null)?.mark === POOL_WORKER_MARK) {
  const port = parentPort;
  port.on('message', (batch: UncertaintyBatch) => port.postMessage(runBatch(batch)));
}
