/**
 * The uncertainty pool on real worker threads: a portfolio's figures are the same on one
 * worker and on two, in fixed and in shrinking batches, and equal to running each home in
 * this thread (`evaluateHome`, then `packageUncertainty`) with its place in the list as its
 * stream. A home that does not parse gets its error, naming the field, and the others still
 * run.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { packageUncertainty } from '../../core/uncertainty/monte-carlo.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import {
  openUncertaintyPool,
  portfolioUncertainty,
  type HomeUncertainty,
  type UncertaintyPool,
} from '../../electron/uncertainty-pool.ts';

const OPTIONS = { draws: 400, seed: 20_261_201, vary: { escalation: true } } as const;
const BROKEN = { ...DEMO_HOMES[0], leakageTest: { cfm50: -5 } };
const HOMES: unknown[] = [...DEMO_HOMES, BROKEN, ...DEMO_HOMES.slice(0, 3)];

describe('uncertainty pool', () => {
  let two: UncertaintyPool;
  beforeAll(() => {
    two = openUncertaintyPool({ workers: 2 });
  });
  afterAll(async () => {
    await two.close();
  });

  it('gives the same figures on one worker and on two, in any batch size', async () => {
    const onOne = await portfolioUncertainty({ homes: HOMES, options: OPTIONS }, { workers: 1 });
    const onTwo = await two.run({ homes: HOMES, options: OPTIONS, batchHomes: 3 });
    expect(onTwo).toEqual(onOne);
    expect(onOne.map((result) => result.index)).toEqual(HOMES.map((_, index) => index));
  });

  it('equals each home run in this thread with its place in the list as its stream', async () => {
    const results = await two.run({ homes: HOMES, options: OPTIONS, batchHomes: 5 });
    HOMES.forEach((home, index) => {
      const result = results[index] as HomeUncertainty;
      if (home === BROKEN) {
        expect(result.ok).toBe(false);
        if (!result.ok) expect(result.error.field).toBe('leakageTest.cfm50');
        return;
      }
      expect(result).toEqual({
        index,
        ok: true,
        value: packageUncertainty(evaluateHome(home), { ...OPTIONS, stream: index }),
      });
    });
  });

  it('shares a longer portfolio in shrinking batches with the same figures, histograms only when asked', async () => {
    const homes: unknown[] = Array.from({ length: 8 }, () => HOMES).flat();
    const options = { draws: 50, seed: 3 };
    const shrinking = await two.run({ homes, options });
    const fixed = await portfolioUncertainty({ homes, options, batchHomes: 7 }, { workers: 1 });
    expect(shrinking).toEqual(fixed);
    const timing = two.lastRunTiming;
    expect(timing.evaluateMs).toBeGreaterThan(0);
    expect(timing.drawMs).toBeGreaterThan(0);
    // Linux tells each thread's CPU time (proc(5)); elsewhere the pool says it does not know.
    if (process.platform === 'linux') expect(timing.cpuMs).toBeGreaterThanOrEqual(0);
    else expect(timing.cpuMs).toBeNull();

    const bare = await two.run({ homes, options: { ...options, histogramBins: 0 } });
    bare.forEach((result, index) => {
      const full = shrinking[index] as HomeUncertainty;
      expect(result.ok).toBe(full.ok);
      if (!result.ok || !full.ok) return;
      expect(result.value.histograms.npvUsd.counts).toEqual([]);
      expect({ ...result.value, histograms: null }).toEqual({ ...full.value, histograms: null });
    });
  });

  it('refuses bad options before any work, naming the field', async () => {
    await expect(two.run({ homes: HOMES, options: { draws: 10, seed: 1.5 } })).rejects.toThrow(
      /seed: expected a whole number/,
    );
    expect(() => openUncertaintyPool({ workers: 0 })).toThrow(/workers: expected a whole number/);
  });
});
