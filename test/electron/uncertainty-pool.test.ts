/**
 * The uncertainty pool on real worker threads: a portfolio's figures are the same on one
 * worker and on two, in fixed and in shrinking batches, and equal to running each home in
 * this thread (`evaluateHome`, then `packageUncertainty`) with its place in the list as its
 * stream. A home that does not parse gets its error, naming the field, and the others still
 * run.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { quantile } from 'simple-statistics';
import { programRange } from '../../core/uncertainty/program-range.ts';
import { compilePackageKernel } from '../../core/plan/kernel.ts';
import {
  allocateSamples,
  packageUncertainty,
  runDraws,
  runSettings,
} from '../../core/uncertainty/monte-carlo.ts';
import type { WeatherYear } from '../../core/weather.ts';
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

  it('adds the homes up draw by draw, as this thread does, the same on one worker and two', async () => {
    const request = { homes: HOMES, options: OPTIONS, programTotals: true, batchHomes: 4 };
    await two.run(request);
    const onTwo = two.lastProgramRange;
    const one = openUncertaintyPool({ workers: 1 });
    try {
      await one.run({ ...request, batchHomes: 7 });
      expect(one.lastProgramRange).toEqual(onTwo);
    } finally {
      await one.close();
    }
    // Independently: each home's draws in this thread, added per draw in whole cents, then
    // simple-statistics' quantile (type 7, as numpy's) of the totals.
    const savings = new Array<number>(OPTIONS.draws).fill(0);
    let homes = 0;
    HOMES.forEach((home, index) => {
      if (home === BROKEN) return;
      homes += 1;
      const settings = runSettings({ ...OPTIONS, stream: index });
      const samples = allocateSamples(OPTIONS.draws);
      runDraws(compilePackageKernel(evaluateHome(home)), settings, 0, samples);
      samples.annualSavingsUsd.forEach((usd, draw) => {
        savings[draw] = (savings[draw] ?? 0) + Math.round(usd * 100);
      });
    });
    const totalsUsd = savings.map((cents) => cents / 100);
    expect(onTwo?.homes).toBe(homes);
    expect(onTwo?.annualSavingsUsd.p10).toBeCloseTo(quantile(totalsUsd, 0.1), 6);
    expect(onTwo?.annualSavingsUsd.p90).toBeCloseTo(quantile(totalsUsd, 0.9), 6);
    // The program's P10 is above the sum of the homes' P10s: independent homes offset.
    const results = await two.run({ homes: HOMES, options: OPTIONS });
    const sumOfP10 = results.reduce(
      (sum, result) => sum + (result.ok ? result.value.annualSavingsUsd.p10 : 0),
      0,
    );
    expect(onTwo?.annualSavingsUsd.p10).toBeGreaterThan(sumOfP10);
    expect(two.lastProgramRange).toBeNull();
    // The page's one-thread path (core/uncertainty/program-range.ts) draws the same program.
    const single = programRange(HOMES, { draws: OPTIONS.draws, seed: OPTIONS.seed });
    expect(single.failed.map((failure) => failure.field)).toEqual(['leakageTest.cfm50']);
    expect(single.homes).toBe(onTwo?.homes);
    await two.run({
      homes: HOMES,
      options: { draws: OPTIONS.draws, seed: OPTIONS.seed, histogramBins: 0 },
      programTotals: true,
    });
    expect(two.lastProgramRange?.annualSavingsUsd).toEqual(single.annualSavingsUsd);
    expect(two.lastProgramRange?.npvUsd).toEqual(single.npvUsd);
    // A program-wide bias: the pool and the one-thread path again agree.
    await two.run({
      homes: HOMES,
      options: { draws: OPTIONS.draws, seed: OPTIONS.seed, histogramBins: 0 },
      programTotals: true,
      programBias: 0.2,
    });
    const biased = programRange(HOMES, {
      draws: OPTIONS.draws,
      seed: OPTIONS.seed,
      programBias: 0.2,
    });
    expect(two.lastProgramRange?.annualSavingsUsd).toEqual(biased.annualSavingsUsd);
    expect(two.lastProgramRange?.programBias).toBe(0.2);
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

  it('plans homes hour by hour on the weather years given, as the one-thread path does', async () => {
    // A year whose temperature swings through the seasons and the day, wind with it.
    const hours = 8760;
    const year: WeatherYear = {
      name: 'Swinging',
      elevationFt: 0,
      outdoorF: Float64Array.from(
        { length: hours },
        (_, hour) => 50 - 30 * Math.cos((2 * Math.PI * hour) / hours) + 6 * Math.sin(hour / 3.8),
      ),
      windMph: Float64Array.from(
        { length: hours },
        (_, hour) => 5 + 4 * Math.abs(Math.sin(hour / 29)),
      ),
      humidityRatio: new Float64Array(hours).fill(0.006),
    };
    const hourly = DEMO_HOMES.slice(0, 4).map((home) => ({ ...home, hourlyWeather: {} }));
    const homes: unknown[] = [...hourly, ...DEMO_HOMES.slice(4, 6)];
    const weather = homes.map((_, index) => (index < hourly.length ? year : null));
    const options = { draws: 200, seed: 11, histogramBins: 0 };
    await two.run({ homes, weather, options, programTotals: true, batchHomes: 2 });
    const single = programRange(homes, options, undefined, (index) => weather[index] ?? undefined);
    expect(single.failed).toEqual([]);
    expect(two.lastProgramRange?.homes).toBe(homes.length);
    expect(two.lastProgramRange?.npvUsd).toEqual(single.npvUsd);
    // Without the years the hourly homes are refused, naming what they ask for.
    const without = programRange(homes, options);
    expect(without.failed.map((failure) => failure.field)).toEqual(
      hourly.map(() => 'hourlyWeather'),
    );
  });

  it('refuses bad options before any work, naming the field', async () => {
    await expect(two.run({ homes: HOMES, options: { draws: 10, seed: 1.5 } })).rejects.toThrow(
      /seed: expected a whole number/,
    );
    expect(() => openUncertaintyPool({ workers: 0 })).toThrow(/workers: expected a whole number/);
  });
});
