/**
 * The program's range (core/uncertainty/program-range.ts). Independent checks: the bias
 * factors' sample mean within 4σ/√N of the PERT mean (a + 4m + b)/6 (REFERENCES.md), σ² =
 * (μ − a)(b − μ)/7 for the PERT (from memory); with no bias the program's draws are the sum of
 * each home's own draws in whole cents (runDraws, home i on stream i), its quantiles
 * simple-statistics' (type 7); a shared bias widens the program's range.
 */
import fc from 'fast-check';
import { quantile } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { compilePackageKernel } from '../../core/plan/kernel.ts';
import { allocateSamples, runDraws, runSettings } from '../../core/uncertainty/monte-carlo.ts';
import { programBiasScale, programRange } from '../../core/uncertainty/program-range.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';

const homes = fc.sample(homeArbitrary({ measureCount: { min: 1, max: 6 } }), {
  seed: 31,
  numRuns: 12,
});
const DRAWS = 500;
const SEED = 8;

describe('the program’s range', () => {
  it('adds each home’s own draws in whole cents when the homes are independent', () => {
    const range = programRange(homes, { draws: DRAWS, seed: SEED });
    const totals = new Array<number>(DRAWS).fill(0);
    homes.forEach((home, index) => {
      const samples = allocateSamples(DRAWS);
      runDraws(
        compilePackageKernel(evaluateHome(home)),
        runSettings({ draws: DRAWS, seed: SEED, stream: index }),
        0,
        samples,
      );
      samples.annualSavingsUsd.forEach((usd, draw) => {
        totals[draw] = (totals[draw] ?? 0) + Math.round(usd * 100);
      });
    });
    const usd = totals.map((cents) => cents / 100);
    expect(range.homes).toBe(homes.length);
    expect(range.programBias).toBeNull();
    expect(range.annualSavingsUsd.p10).toBeCloseTo(quantile(usd, 0.1), 6);
    expect(range.annualSavingsUsd.p90).toBeCloseTo(quantile(usd, 0.9), 6);
  });

  it('draws a bias whose mean is the PERT mean, and a bias of 0 changes nothing', () => {
    const draws = 10_000;
    const scale = programBiasScale(SEED, draws, 0.3);
    const mean = scale.reduce((sum, value) => sum + value, 0) / draws;
    const sigma = Math.sqrt((0.3 * 0.3) / 7);
    expect(Math.abs(mean - 1)).toBeLessThan((4 * sigma) / Math.sqrt(draws));
    expect(Math.min(...scale)).toBeGreaterThanOrEqual(0.7);
    expect(Math.max(...scale)).toBeLessThanOrEqual(1.3);
    const none = programRange(homes, { draws: DRAWS, seed: SEED });
    const zero = programRange(homes, { draws: DRAWS, seed: SEED, programBias: 0 });
    expect(zero.annualSavingsUsd).toEqual(none.annualSavingsUsd);
  });

  it('widens the range with a program-wide bias, the same for the same seed', () => {
    const none = programRange(homes, { draws: DRAWS, seed: SEED });
    const biased = programRange(homes, { draws: DRAWS, seed: SEED, programBias: 0.3 });
    const width = (range: typeof none) => range.annualSavingsUsd.p90 - range.annualSavingsUsd.p10;
    expect(width(biased)).toBeGreaterThan(width(none));
    expect(programRange(homes, { draws: DRAWS, seed: SEED, programBias: 0.3 })).toEqual(biased);
    expectInputError(
      () => programRange(homes, { draws: DRAWS, seed: SEED, programBias: 2 }),
      'programBias',
      /0 to 0.9/,
    );
  });
});
