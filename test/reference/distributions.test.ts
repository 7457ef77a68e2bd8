// Reference checks of core/uncertainty: the seeded generator against an independent BigInt
// implementation of xoshiro128** (Blackman & Vigna 2021, reference code xoshiro128starstar.c);
// PERT and triangular sampling against their published means and variances (the PERT and
// triangular formulas of the project's REFERENCES page: PERT mean (a + 4m + b)/6 with
// α = 1 + 4(m − a)/(b − a), β = 1 + 4(b − m)/(b − a); the Beta variance αβ/((α+β)²(α+β+1));
// the triangular mean (a + b + c)/3 and variance (a² + b² + c² − ab − ac − bc)/18, Johnson,
// Kotz & Balakrishnan, Continuous Univariate Distributions vol. 2, from memory); the
// incomplete beta function against the binomial sum for whole shapes (Abramowitz & Stegun
// 26.5.24, from memory) and against @formulajs/formulajs 4.6.1 BETA.DIST / BETA.INV (Excel
// semantics). Every sample uses a fixed seed.
import * as formula from '@formulajs/formulajs';
import { describe, expect, it } from 'vitest';
import {
  betaQuantileTable,
  logGamma,
  PERT_TABLE_STEPS,
  pertMean,
  pertQuantile,
  pertShape,
  pertVariance,
  regularizedIncompleteBeta,
  triangularMean,
  triangularQuantile,
  triangularVariance,
} from '../../core/uncertainty/distributions.ts';
import { mix32, Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import type { Range } from '../../core/schema.ts';

function reference(result: number | Error): number {
  if (result instanceof Error) throw new Error(`formulajs returned ${result.message}`);
  return result;
}

const MASK = 0xffff_ffffn;
const rotl = (x: bigint, k: bigint) => ((x << k) | (x >> (32n - k))) & MASK;

/** xoshiro128** in BigInt, written again from the reference C code (uint32_t arithmetic). */
function referenceXoshiro(state: [bigint, bigint, bigint, bigint], count: number): number[] {
  const s = [...state];
  const out: number[] = [];
  for (let i = 0; i < count; i += 1) {
    const [s0, s1, s2, s3] = s as [bigint, bigint, bigint, bigint];
    out.push(Number((rotl((s1 * 5n) & MASK, 7n) * 9n) & MASK));
    const t = (s1 << 9n) & MASK;
    let n2 = s2 ^ s0;
    const n3 = s3 ^ s1;
    const n1 = s1 ^ n2;
    const n0 = s0 ^ n3;
    n2 ^= t;
    s[0] = n0;
    s[1] = n1;
    s[2] = n2;
    s[3] = rotl(n3, 11n);
  }
  return out;
}

/** Sample mean, variance and fourth central moment of `count` draws of `draw(u)`. */
function moments(count: number, seed: number, draw: (fraction: number) => number) {
  const random = new Xoshiro128StarStar(seed, 0, 0);
  const values = new Float64Array(count);
  let sum = 0;
  for (let i = 0; i < count; i += 1) {
    values[i] = draw(random.nextFraction());
    sum += values[i] ?? 0;
  }
  const mean = sum / count;
  let m2 = 0;
  let m4 = 0;
  for (const value of values) {
    const d = value - mean;
    m2 += d * d;
    m4 += d * d * d * d;
  }
  return { mean, variance: m2 / (count - 1), fourth: m4 / count };
}

const DRAWS = 200_000;
const RANGES: Range[] = [
  { low: 100, likely: 150, high: 300 },
  { low: 0, likely: 0, high: 1 },
  { low: 0, likely: 1, high: 1 },
  { low: -5, likely: 2, high: 3 },
  { low: 40, likely: 60, high: 80 },
  { low: 10, likely: 10.3, high: 47 },
];

describe('xoshiro128**', () => {
  it('matches a BigInt rewrite of the reference code, 2,000 outputs', () => {
    const state: [number, number, number, number] = [
      0x12345678, 0x9abcdef0, 0x0fedcba9, 0x87654321,
    ];
    const random = new Xoshiro128StarStar();
    random.setState(state);
    const ours = Array.from({ length: 2000 }, () => random.nextUint32());
    expect(ours).toEqual(
      referenceXoshiro(state.map(BigInt) as [bigint, bigint, bigint, bigint], 2000),
    );
  });

  it('gives 11520 first from the state {1, 2, 3, 4}: rotl(2·5, 7)·9 by hand', () => {
    const random = new Xoshiro128StarStar();
    random.setState([1, 2, 3, 4]);
    expect(random.nextUint32()).toBe(11_520);
  });

  it('refuses an all-zero state, which the reference code forbids', () => {
    expect(() => new Xoshiro128StarStar().setState([0, 0, 0, 0])).toThrow(/not all zero/);
  });

  it('mix32 matches MurmurHash3 fmix32 computed in BigInt', () => {
    const fmix = (value: bigint) => {
      let h = value & MASK;
      h ^= h >> 16n;
      h = (h * 0x85ebca6bn) & MASK;
      h ^= h >> 13n;
      h = (h * 0xc2b2ae35n) & MASK;
      h ^= h >> 16n;
      return Number(h);
    };
    for (const word of [0, 1, 2, 0xdeadbeef, 0xffffffff, 123_456_789]) {
      expect(mix32(word)).toBe(fmix(BigInt(word)));
    }
  });

  it('spreads fractions evenly: chi-square over 64 bins below the 0.999 point (≈ 103.4)', () => {
    // Chi-square critical value for 63 degrees of freedom at 0.999: about 103.4 (from memory).
    const random = new Xoshiro128StarStar(2026, 3, 0);
    const counts = new Array<number>(64).fill(0);
    const n = 640_000;
    for (let i = 0; i < n; i += 1) {
      const bin = Math.floor(random.nextFraction() * 64);
      counts[bin] = (counts[bin] ?? 0) + 1;
    }
    const expected = n / 64;
    const chi = counts.reduce((sum, c) => sum + (c - expected) ** 2 / expected, 0);
    expect(chi).toBeLessThan(103.4);
  });
});

describe('incomplete beta and its quantiles', () => {
  it('log-gamma gives ln((k−1)!) for whole k and ln(√π) at ½', () => {
    let factorial = 1;
    for (let k = 1; k <= 12; k += 1) {
      expect(logGamma(k)).toBeCloseTo(Math.log(factorial), 12);
      factorial *= k;
    }
    expect(logGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 12);
  });

  it('equals the binomial sum for whole shapes (the PERT shapes at m on a quarter of the range)', () => {
    const choose = (n: number, k: number) => {
      let c = 1;
      for (let i = 1; i <= k; i += 1) c = (c * (n - k + i)) / i;
      return c;
    };
    for (const [a, b] of [
      [1, 5],
      [2, 4],
      [3, 3],
      [4, 2],
      [5, 1],
    ] as const) {
      const n = a + b - 1;
      for (const x of [0.01, 0.1, 0.37, 0.5, 0.81, 0.99]) {
        let sum = 0;
        for (let j = a; j <= n; j += 1) sum += choose(n, j) * x ** j * (1 - x) ** (n - j);
        expect(regularizedIncompleteBeta(x, a, b)).toBeCloseTo(sum, 13);
      }
    }
  });

  // formulajs computes BETA.DIST with jstat, whose continued fraction stops once a step
  // changes it by less than 3e-7: agreement is checked to 1e-7.
  it('agrees with formulajs BETA.DIST for fractional shapes', () => {
    for (const [a, b] of [
      [1.3, 4.7],
      [2.2, 3.8],
      [4.9, 1.1],
      [1.04, 4.96],
    ] as const) {
      for (const x of [0.02, 0.2, 0.45, 0.7, 0.97]) {
        expect(regularizedIncompleteBeta(x, a, b)).toBeCloseTo(
          reference(formula.BETA.DIST(x, a, b, true)),
          7,
        );
      }
    }
  });

  it('tabulates quantiles that formulajs BETA.INV confirms, and I_x(q_k) = k/steps', () => {
    for (const [a, b] of [
      [2.2, 3.8],
      [4.6, 1.4],
      [1, 5],
    ] as const) {
      const table = betaQuantileTable(a, b, PERT_TABLE_STEPS);
      for (const k of [1, 10, 256, 512, 900, 1023]) {
        const u = k / PERT_TABLE_STEPS;
        expect(regularizedIncompleteBeta(table[k] ?? NaN, a, b)).toBeCloseTo(u, 12);
        expect(table[k]).toBeCloseTo(reference(formula.BETA.INV(u, a, b)), 6);
      }
      for (let k = 1; k <= PERT_TABLE_STEPS; k += 1) {
        expect(table[k] ?? NaN).toBeGreaterThan(table[k - 1] ?? NaN);
      }
    }
  });
});

describe('PERT sampling', () => {
  it('has α and β of the published form', () => {
    expect(pertShape({ low: 100, likely: 150, high: 300 })).toEqual({ alpha: 2, beta: 4 });
    expect(pertShape({ low: 5, likely: 5, high: 5 })).toBeNull();
  });

  for (const range of RANGES) {
    it(`keeps the sample mean within 4σ/√N of (a + 4m + b)/6, and the variance of Beta, for ${range.low}/${range.likely}/${range.high}`, () => {
      const sample = moments(DRAWS, 11, (u) => pertQuantile(range, u));
      const sigma = Math.sqrt(pertVariance(range));
      expect(Math.abs(sample.mean - pertMean(range))).toBeLessThan((4 * sigma) / Math.sqrt(DRAWS));
      // Standard error of a sample variance: √((μ4 − σ⁴)/N).
      const varianceError = Math.sqrt((sample.fourth - sample.variance ** 2) / DRAWS);
      expect(Math.abs(sample.variance - sigma ** 2)).toBeLessThan(4 * varianceError);
    });
  }

  it('stays within the range and gives the point of a degenerate one', () => {
    const range = { low: 10, likely: 10.3, high: 47 };
    for (const u of [0, 1e-9, 0.5, 0.999_999_999]) {
      const x = pertQuantile(range, u);
      expect(x).toBeGreaterThanOrEqual(10);
      expect(x).toBeLessThanOrEqual(47);
    }
    expect(pertQuantile({ low: 7, likely: 7, high: 7 }, 0.3)).toBe(7);
  });
});

describe('triangular sampling', () => {
  for (const range of RANGES) {
    it(`keeps the sample mean within 4σ/√N of (a + b + c)/3, and the variance, for ${range.low}/${range.likely}/${range.high}`, () => {
      const sample = moments(DRAWS, 12, (u) => triangularQuantile(range, u));
      const sigma = Math.sqrt(triangularVariance(range));
      expect(Math.abs(sample.mean - triangularMean(range))).toBeLessThan(
        (4 * sigma) / Math.sqrt(DRAWS),
      );
      const varianceError = Math.sqrt((sample.fourth - sample.variance ** 2) / DRAWS);
      expect(Math.abs(sample.variance - sigma ** 2)).toBeLessThan(4 * varianceError);
    });
  }

  it('inverts the triangular CDF F(x) = (x−a)²/((b−a)(c−a)) below c, 1 − (b−x)²/((b−a)(b−c)) above', () => {
    const { low: a, likely: c, high: b } = { low: 2, likely: 5, high: 11 };
    const cdf = (x: number) =>
      x <= c ? (x - a) ** 2 / ((b - a) * (c - a)) : 1 - (b - x) ** 2 / ((b - a) * (b - c));
    for (const u of [0.01, 0.2, 1 / 3, 0.5, 0.9, 0.999]) {
      expect(cdf(triangularQuantile({ low: a, likely: c, high: b }, u))).toBeCloseTo(u, 12);
    }
    expect(triangularQuantile({ low: 4, likely: 4, high: 4 }, 0.8)).toBe(4);
  });
});
