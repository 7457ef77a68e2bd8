/**
 * Runs the uncertainty of many homes (a portfolio) on worker threads, off the main thread.
 * Homes go out in batches to whichever worker is free; each home's draws use its place in
 * the list as their stream, so the figures are the same for any number of workers and any
 * order of completion.
 *
 * The worker is TypeScript. Under tsx or vitest it starts from a two-line bootstrap that
 * registers tsx's loader in the worker and then imports it: Node 20 does not apply a
 * `--import tsx` of `execArgv` to a worker's own entry file. A compiled build (a .js worker
 * beside this module) is started directly.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { InputError } from '../core/errors.ts';
import type { MeasureType } from '../core/measure-library.ts';
import { runSettings, type UncertaintyOptions } from '../core/uncertainty/monte-carlo.ts';
import {
  POOL_WORKER_MARK,
  type HomeUncertainty,
  type UncertaintyBatch,
  type UncertaintyBatchResult,
} from './uncertainty-worker.ts';

export type { HomeUncertainty } from './uncertainty-worker.ts';

/** Homes per batch: small enough to share the work evenly, large enough to keep messages few. */
const DEFAULT_BATCH_HOMES = 100;
const MAX_WORKERS = 64;

export interface PortfolioRequest {
  /** Home files (parsed or raw JSON), each checked by the worker. */
  homes: readonly unknown[];
  options: Omit<UncertaintyOptions, 'stream'>;
  /** The project's measure library; the shipped one when absent. */
  libraryTypes?: readonly MeasureType[];
  batchHomes?: number;
}

export interface UncertaintyPool {
  readonly workers: number;
  /** Every home's outcome, in the order of `request.homes`. */
  run(request: PortfolioRequest): Promise<HomeUncertainty[]>;
  /** Milliseconds the last run's workers spent evaluating and drawing, summed over workers. */
  readonly lastRunTiming: { evaluateMs: number; drawMs: number };
  close(): Promise<void>;
}

function workerUrl(): URL {
  const self = new URL(import.meta.url);
  const extension = self.pathname.endsWith('.ts') ? '.ts' : '.js';
  return new URL(`./uncertainty-worker${extension}`, self);
}

function startWorker(): Worker {
  const url = workerUrl();
  const workerData = { mark: POOL_WORKER_MARK };
  if (!url.pathname.endsWith('.ts')) return new Worker(url, { workerData });
  // tsx's ESM entry (its CommonJS entry cannot register the loader from an eval worker).
  const tsxApi = import.meta.resolve('tsx/esm/api');
  const bootstrap =
    `import(${JSON.stringify(tsxApi)})` +
    `.then((api) => { api.register(); return import(${JSON.stringify(url.href)}); });`;
  return new Worker(bootstrap, { eval: true, workerData });
}

/**
 * Opens a pool.
 *
 * @param options.workers - worker threads (1 to 64; the machine's parallelism by default)
 * @throws InputError when `workers` is not a whole number in range
 */
export function openUncertaintyPool(options: { workers?: number } = {}): UncertaintyPool {
  const count = options.workers ?? Math.max(1, availableParallelism());
  if (!Number.isInteger(count) || count < 1 || count > MAX_WORKERS) {
    throw InputError.at(
      'workers',
      `expected a whole number from 1 to ${MAX_WORKERS}, got ${count}`,
    );
  }
  const workers = Array.from({ length: count }, () => watched(startWorker()));
  let busy = false;
  const lastRunTiming = { evaluateMs: 0, drawMs: 0 };

  return {
    workers: count,
    lastRunTiming,
    async run(request) {
      if (busy) throw new Error('the uncertainty pool is already running a portfolio');
      runSettings({ ...request.options, stream: 0 });
      const batchHomes = request.batchHomes ?? DEFAULT_BATCH_HOMES;
      if (!Number.isInteger(batchHomes) || batchHomes < 1) {
        throw InputError.at(
          'batchHomes',
          `expected a whole number of at least 1, got ${batchHomes}`,
        );
      }
      const batches: UncertaintyBatch[] = [];
      for (let first = 0; first < request.homes.length; first += batchHomes) {
        batches.push({
          batchId: batches.length,
          firstIndex: first,
          homes: request.homes.slice(first, first + batchHomes),
          options: request.options,
          ...(request.libraryTypes ? { libraryTypes: request.libraryTypes } : {}),
        });
      }
      const results = new Array<HomeUncertainty>(request.homes.length);
      busy = true;
      lastRunTiming.evaluateMs = 0;
      lastRunTiming.drawMs = 0;
      try {
        let next = 0;
        await Promise.all(
          workers.map(async (worker) => {
            while (next < batches.length) {
              const batch = batches[next] as UncertaintyBatch;
              next += 1;
              const done = await worker.run(batch);
              for (const result of done.results) results[result.index] = result;
              lastRunTiming.evaluateMs += done.evaluateMs;
              lastRunTiming.drawMs += done.drawMs;
            }
          }),
        );
      } finally {
        busy = false;
      }
      return results;
    },
    async close() {
      await Promise.all(workers.map((worker) => worker.thread.terminate()));
    },
  };
}

/** A worker with its failure kept: an error before or between batches fails the next run. */
interface WatchedWorker {
  thread: Worker;
  run(batch: UncertaintyBatch): Promise<UncertaintyBatchResult>;
}

function watched(thread: Worker): WatchedWorker {
  let failure: Error | null = null;
  let pending: {
    batchId: number;
    resolve: (r: UncertaintyBatchResult) => void;
    reject: (e: Error) => void;
  } | null = null;
  const fail = (error: Error) => {
    failure = error;
    pending?.reject(error);
    pending = null;
  };
  thread.on('error', fail);
  thread.on('exit', (code) => fail(new Error(`an uncertainty worker stopped (exit code ${code})`)));
  thread.on('message', (result: UncertaintyBatchResult) => {
    if (pending && result.batchId === pending.batchId) {
      const { resolve } = pending;
      pending = null;
      resolve(result);
    }
  });
  return {
    thread,
    run(batch) {
      return new Promise((resolve, reject) => {
        if (failure) {
          reject(failure);
          return;
        }
        pending = { batchId: batch.batchId, resolve, reject };
        thread.postMessage(batch);
      });
    },
  };
}

/** Opens a pool, runs one portfolio and closes the pool. */
export async function portfolioUncertainty(
  request: PortfolioRequest,
  options: { workers?: number } = {},
): Promise<HomeUncertainty[]> {
  const pool = openUncertaintyPool(options);
  try {
    return await pool.run(request);
  } finally {
    await pool.close();
  }
}
