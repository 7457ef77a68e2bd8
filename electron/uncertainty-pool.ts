/**
 * Runs the uncertainty of many homes (a portfolio) on worker threads, off the main thread.
 * Homes go out in batches to whichever worker is free; each home's draws use its place in
 * the list as their stream, so the figures are the same for any number of workers, any batch
 * size and any order of completion.
 *
 * Each worker has a second batch waiting while it runs one, so it never idles for the round
 * trip of a message; and batches shrink towards the end of the list (from 100 homes down to
 * 10), so the workers finish together instead of one running a last full batch alone.
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
import type { WeatherYear } from '../core/weather.ts';
import {
  runSettings,
  type FigureSpread,
  type UncertaintyOptions,
} from '../core/uncertainty/monte-carlo.ts';
import { spreadOf } from '../core/uncertainty/summary.ts';
import {
  POOL_WORKER_MARK,
  type HomeUncertainty,
  type UncertaintyBatch,
  type UncertaintyBatchResult,
} from './uncertainty-worker.ts';

export type { HomeUncertainty } from './uncertainty-worker.ts';

/** Homes per batch: small enough to share the work evenly, large enough to keep messages few. */
const DEFAULT_BATCH_HOMES = 100;
/** The smallest batch the shrinking batches come down to at the end of a portfolio. */
const MIN_BATCH_HOMES = 10;
/** Batches sent to a worker before it answers: the one it runs and the one waiting. */
const BATCHES_IN_FLIGHT = 2;
const MAX_WORKERS = 64;
/**
 * A worker's young generation, MB: twice V8's default (48 MB, whose new space is two 16 MB
 * halves). Planning a home makes many short-lived objects; with the larger space a worker
 * collects them about a third as often (a 3,000-home batch run: 110 scavenges at the
 * default, 63 here), and the collector's threads compete less with the workers for the cores.
 */
const WORKER_LIMITS = { maxYoungGenerationSizeMb: 96 };

export interface PortfolioRequest {
  /** Home files (parsed or raw JSON), each checked by the worker. */
  homes: readonly unknown[];
  options: Omit<UncertaintyOptions, 'stream'>;
  /** The project's measure library; the shipped one when absent. */
  libraryTypes?: readonly MeasureType[];
  /** The weather year of each home planned hour by hour (null on degree days), by place. */
  weather?: readonly (WeatherYear | null)[];
  /** Homes in every batch; by default 100, shrinking to 10 over the last batches. */
  batchHomes?: number;
  /** Also add the homes up draw by draw: the program's range (`lastProgramRange`). */
  programTotals?: boolean;
  /** With programTotals: a program-wide bias's ± fraction (core/uncertainty/program-range.ts). */
  programBias?: number;
}

/**
 * The program's range: the homes' figures added draw by draw (homes independent, each on its
 * own stream), so its percentiles are those of the program's total, not sums of the homes'
 * percentiles. Homes that could not be run add nothing.
 */
export interface ProgramRange {
  draws: number;
  seed: number;
  /** The program-wide bias's ± fraction; null when the homes were independent. */
  programBias: number | null;
  homes: number;
  annualSavingsUsd: FigureSpread;
  npvUsd: FigureSpread;
}

export interface UncertaintyPool {
  readonly workers: number;
  /** Every home's outcome, in the order of `request.homes`. */
  run(request: PortfolioRequest): Promise<HomeUncertainty[]>;
  /**
   * Milliseconds the last run's workers spent planning homes and drawing, summed over
   * workers (wall clock), and the CPU time their threads had in that run, from the start of
   * each one's first batch to the end of its last (null where the system does not tell it).
   */
  readonly lastRunTiming: { evaluateMs: number; drawMs: number; cpuMs: number | null };
  /** The last run's program range, when it asked for `programTotals`; else null. */
  readonly lastProgramRange: ProgramRange | null;
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
  if (!url.pathname.endsWith('.ts'))
    return new Worker(url, { workerData, resourceLimits: WORKER_LIMITS });
  // tsx's ESM entry (its CommonJS entry cannot register the loader from an eval worker).
  const tsxApi = import.meta.resolve('tsx/esm/api');
  const bootstrap =
    `import(${JSON.stringify(tsxApi)})` +
    `.then((api) => { api.register(); return import(${JSON.stringify(url.href)}); });`;
  return new Worker(bootstrap, { eval: true, workerData, resourceLimits: WORKER_LIMITS });
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
  const lastRunTiming: UncertaintyPool['lastRunTiming'] = { evaluateMs: 0, drawMs: 0, cpuMs: null };

  let lastProgramRange: ProgramRange | null = null;

  return {
    workers: count,
    lastRunTiming,
    get lastProgramRange() {
      return lastProgramRange;
    },
    async run(request) {
      if (busy) throw new Error('the uncertainty pool is already running a portfolio');
      runSettings({ ...request.options, stream: 0 });
      const batchHomes = request.batchHomes;
      if (batchHomes !== undefined && (!Number.isInteger(batchHomes) || batchHomes < 1)) {
        throw InputError.at(
          'batchHomes',
          `expected a whole number of at least 1, got ${batchHomes}`,
        );
      }
      const batches = batchesOf(request, count).map((batch) =>
        request.programTotals
          ? {
              ...batch,
              programTotals: true,
              ...(request.programBias === undefined ? {} : { programBias: request.programBias }),
            }
          : batch,
      );
      const results = new Array<HomeUncertainty>(request.homes.length);
      const draws = request.options.draws;
      const savingsCents = new Float64Array(request.programTotals ? draws : 0);
      const npvCents = new Float64Array(request.programTotals ? draws : 0);
      lastProgramRange = null;
      busy = true;
      lastRunTiming.evaluateMs = 0;
      lastRunTiming.drawMs = 0;
      lastRunTiming.cpuMs = null;
      const cpu = new CpuSpans();
      try {
        let next = 0;
        // Lanes: each takes the next batch when its last one is back, so a worker has up to
        // BATCHES_IN_FLIGHT batches at once, run one after the other.
        const lanes = workers.flatMap((worker) =>
          Array.from({ length: BATCHES_IN_FLIGHT }, () => worker),
        );
        await Promise.all(
          lanes.map(async (worker) => {
            while (next < batches.length) {
              const batch = batches[next] as UncertaintyBatch;
              next += 1;
              const done = await worker.run(batch);
              for (const result of done.results) results[result.index] = result;
              if (done.totals) {
                // Whole cents: exact sums, the same in any order of batches.
                for (let draw = 0; draw < draws; draw += 1) {
                  savingsCents[draw] =
                    (savingsCents[draw] ?? 0) + (done.totals.annualSavingsCents[draw] ?? 0);
                  npvCents[draw] = (npvCents[draw] ?? 0) + (done.totals.npvCents[draw] ?? 0);
                }
              }
              lastRunTiming.evaluateMs += done.evaluateMs;
              lastRunTiming.drawMs += done.drawMs;
              cpu.add(worker, done.threadCpuMs);
            }
          }),
        );
        lastRunTiming.cpuMs = cpu.totalMs();
        if (request.programTotals) {
          const toUsd = (cents: Float64Array) => cents.map((value) => value / 100);
          lastProgramRange = {
            draws,
            seed: request.options.seed,
            programBias: request.programBias ?? null,
            homes: results.filter((result) => result.ok).length,
            annualSavingsUsd: spreadOf(toUsd(savingsCents)),
            npvUsd: spreadOf(toUsd(npvCents)),
          };
        }
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

/** Each worker's thread CPU time over a run: its first batch's start to its last's end. */
class CpuSpans {
  private readonly spans = new Map<WatchedWorker, { first: number; last: number }>();
  private unknown = false;

  add(worker: WatchedWorker, span: UncertaintyBatchResult['threadCpuMs']): void {
    if (span === null) {
      this.unknown = true;
      return;
    }
    const known = this.spans.get(worker);
    this.spans.set(worker, {
      first: Math.min(known?.first ?? span.before, span.before),
      last: Math.max(known?.last ?? span.after, span.after),
    });
  }

  totalMs(): number | null {
    if (this.unknown) return null;
    let total = 0;
    for (const { first, last } of this.spans.values()) total += last - first;
    return total;
  }
}

/**
 * The batches of a request: `batchHomes` each when given; otherwise 100 homes while many
 * remain, then about a quarter of what remains per worker, down to 10.
 */
function batchesOf(request: PortfolioRequest, workerCount: number): UncertaintyBatch[] {
  const batches: UncertaintyBatch[] = [];
  const total = request.homes.length;
  for (let first = 0; first < total;) {
    const remaining = total - first;
    const size =
      request.batchHomes ??
      Math.min(
        DEFAULT_BATCH_HOMES,
        Math.max(MIN_BATCH_HOMES, Math.ceil(remaining / (4 * workerCount))),
      );
    batches.push({
      batchId: batches.length,
      firstIndex: first,
      homes: request.homes.slice(first, first + size),
      ...(request.weather ? { weather: request.weather.slice(first, first + size) } : {}),
      options: request.options,
      ...(request.libraryTypes ? { libraryTypes: request.libraryTypes } : {}),
    });
    first += size;
  }
  return batches;
}

/** A worker with its failure kept: an error before or between batches fails the next run. */
interface WatchedWorker {
  thread: Worker;
  run(batch: UncertaintyBatch): Promise<UncertaintyBatchResult>;
}

interface PendingBatch {
  resolve: (result: UncertaintyBatchResult) => void;
  reject: (error: Error) => void;
}

function watched(thread: Worker): WatchedWorker {
  let failure: Error | null = null;
  const pending = new Map<number, PendingBatch>();
  const fail = (error: Error) => {
    failure = error;
    for (const batch of pending.values()) batch.reject(error);
    pending.clear();
  };
  thread.on('error', fail);
  thread.on('exit', (code) => fail(new Error(`an uncertainty worker stopped (exit code ${code})`)));
  thread.on('message', (result: UncertaintyBatchResult) => {
    const batch = pending.get(result.batchId);
    if (batch) {
      pending.delete(result.batchId);
      batch.resolve(result);
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
        pending.set(batch.batchId, { resolve, reject });
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
