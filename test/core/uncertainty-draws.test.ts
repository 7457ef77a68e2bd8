// The draw loop's parts (core/uncertainty/random.ts `streamKeyOf`, `reseedInStream`,
// `drawFractions`; samplers.ts `reductionSamplers`, `sampleReductions`; distributions.ts
// `isUsableRange`) against independent computations written here:
// - a draw's numbers against xoshiro128** and MurmurHash3's fmix32 rewritten in BigInt from
//   the reference code (Blackman & Vigna, xoshiro128starstar.c; Appleby, MurmurHash3), with the
//   state built from (seed, stream, draw) as random.ts documents it;
// - reductions against the triangular inverse CDF in closed form (Johnson, Kotz & Balakrishnan,
//   Continuous Univariate Distributions vol. 2, from memory) and PERT against
//   @formulajs/formulajs 4.6.1 BETA.INV with α = 1 + 4(m − a)/(b − a), β = 1 + 4(b − m)/(b − a)
//   (Malcolm et al. 1959, from memory), within the table's interpolation error;
// - and each against the engine's own one-number path (`reseed`, `sampleRange`), bit for bit,
//   since the draw loop must give the very figures those give;
// - summary.ts `spreadOf` of a few values (where the places around P10, P50 and P90 overlap)
//   against Hyndman & Fan's definition 7 worked here on a sorted copy (The American
//   Statistician 50(4), 1996: x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]), h = (n − 1)p).
import * as formula from '@formulajs/formulajs';
import { describe, expect, it } from 'vitest';
import type { Range } from '../../core/schema.ts';
import { isUsableRange, requireRange } from '../../core/uncertainty/distributions.ts';
import { drawFractions, streamKeyOf, Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import {
  rangeSampler,
  reductionSamplers,
  sampleRange,
  sampleReductions,
} from '../../core/uncertainty/samplers.ts';
import { spreadOf } from '../../core/uncertainty/summary.ts';

const MASK = 0xffff_ffffn;
const GOLDEN = 0x9e3779b9n;
const rotl = (x: bigint, k: bigint) => ((x << k) | (x >> (32n - k))) & MASK;

function fmix(value: bigint): bigint {
  let h = value & MASK;
  h ^= h >> 16n;
  h = (h * 0x85ebca6bn) & MASK;
  h ^= h >> 13n;
  h = (h * 0xc2b2ae35n) & MASK;
  h ^= h >> 16n;
  return h;
}

/** The first `count` fractions of draw `draw` of stream `stream` under `seed`, in BigInt. */
function referenceFractions(seed: number, stream: number, draw: number, count: number) {
  const key = fmix(
    (fmix(fmix(BigInt(seed)) ^ BigInt(stream)) + ((GOLDEN * BigInt(draw + 1)) & MASK)) & MASK,
  );
  const s = [1n, 2n, 3n, 4n].map((word) => fmix((key + ((GOLDEN * word) & MASK)) & MASK));
  const out: number[] = [];
  for (let i = 0; i < count; i += 1) {
    const [s0, s1, s2, s3] = s as [bigint, bigint, bigint, bigint];
    out.push(Number((rotl((s1 * 5n) & MASK, 7n) * 9n) & MASK) / 2 ** 32);
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

const KEYS = [
  { seed: 0, stream: 0, draw: 0 },
  { seed: 20_261_201, stream: 7, draw: 999 },
  { seed: 0xffff_ffff, stream: 2 ** 31 - 1, draw: 123_456 },
  { seed: 42, stream: 9_999, draw: 1 },
];

describe('drawFractions', () => {
  it('gives the BigInt rewrite of the reference code for a draw built from (seed, stream, draw)', () => {
    for (const { seed, stream, draw } of KEYS) {
      const out = new Float64Array(12);
      drawFractions(streamKeyOf(seed, stream), draw, out, 12);
      expect([...out]).toEqual(referenceFractions(seed, stream, draw, 12));
    }
  });

  it('gives the generator’s own numbers after reseed, and reseedInStream is reseed', () => {
    for (const { seed, stream, draw } of KEYS) {
      const generator = new Xoshiro128StarStar(seed, stream, draw);
      const fromKey = new Xoshiro128StarStar();
      fromKey.reseedInStream(streamKeyOf(seed, stream), draw);
      const out = new Float64Array(9);
      drawFractions(streamKeyOf(seed, stream), draw, out, 9);
      for (const value of out) {
        expect(value).toBe(generator.nextFraction());
        expect(fromKey.nextFraction()).toBe(value);
      }
    }
  });

  it('writes only `count` places and none when asked for none', () => {
    const out = new Float64Array([-1, -1, -1, -1]);
    drawFractions(streamKeyOf(1, 2), 3, out, 2);
    expect(out[0]).toBeGreaterThanOrEqual(0);
    expect(out[1]).toBeLessThan(1);
    expect([out[2], out[3]]).toEqual([-1, -1]);
    drawFractions(streamKeyOf(1, 2), 3, out.subarray(2), 0);
    expect([out[2], out[3]]).toEqual([-1, -1]);
  });
});

const RANGES: Range[] = [
  { low: 100, likely: 150, high: 300 },
  { low: 40, likely: 40, high: 40 },
  { low: 0, likely: 0, high: 1 },
  { low: 10, likely: 10.3, high: 47 },
  { low: 5, likely: 20, high: 20 },
];
const FRACTIONS = [0, 1e-9, 0.1, 0.25, 0.5, 0.731, 0.9, 0.999_999];

describe('sampleReductions', () => {
  it('gives sampleRange’s value of every measure, PERT and triangular, bit for bit', () => {
    for (const distribution of ['pert', 'triangular'] as const) {
      const samplers = reductionSamplers(distribution, RANGES);
      const out = new Float64Array(RANGES.length);
      for (const fraction of FRACTIONS) {
        sampleReductions(samplers, new Float64Array(RANGES.length).fill(fraction), out);
        RANGES.forEach((range, index) => {
          expect(out[index]).toBe(sampleRange(rangeSampler(distribution, range), fraction));
        });
      }
    }
  });

  it('gives the triangular inverse CDF in closed form and a point range’s value', () => {
    const samplers = reductionSamplers('triangular', RANGES);
    const out = new Float64Array(RANGES.length);
    for (const u of FRACTIONS) {
      sampleReductions(samplers, new Float64Array(RANGES.length).fill(u), out);
      RANGES.forEach(({ low: a, likely: c, high: b }, index) => {
        const expected =
          b === a
            ? c
            : u < (c - a) / (b - a)
              ? a + Math.sqrt(u * (b - a) * (c - a))
              : b - Math.sqrt((1 - u) * (b - a) * (b - c));
        expect(out[index]).toBeCloseTo(expected, 9);
      });
    }
  });

  it('gives PERT quantiles within 1e-4 of the range of formulajs BETA.INV', () => {
    const samplers = reductionSamplers('pert', RANGES);
    const out = new Float64Array(RANGES.length);
    for (const u of FRACTIONS.filter((value) => value > 0.01 && value < 0.99)) {
      sampleReductions(samplers, new Float64Array(RANGES.length).fill(u), out);
      RANGES.forEach(({ low: a, likely: m, high: b }, index) => {
        if (b === a) {
          expect(out[index]).toBe(m);
          return;
        }
        const alpha = 1 + (4 * (m - a)) / (b - a);
        const beta = 1 + (4 * (b - m)) / (b - a);
        const inverse = formula.BETA.INV(u, alpha, beta, a, b);
        if (inverse instanceof Error) throw new Error(`formulajs returned ${inverse.message}`);
        const expected = inverse;
        expect(Math.abs((out[index] ?? Number.NaN) - expected)).toBeLessThan(1e-4 * (b - a));
      });
    }
  });

  it('takes no measures without error', () => {
    const samplers = reductionSamplers('pert', []);
    expect(samplers.count).toBe(0);
    expect(() =>
      sampleReductions(samplers, new Float64Array(0), new Float64Array(0)),
    ).not.toThrow();
  });
});

describe('isUsableRange', () => {
  it('is what requireRange asks: finite, low ≤ likely ≤ high', () => {
    const cases: [Range, boolean][] = [
      [{ low: 1, likely: 2, high: 3 }, true],
      [{ low: 2, likely: 2, high: 2 }, true],
      [{ low: -1, likely: 0, high: 0 }, true],
      [{ low: 3, likely: 2, high: 4 }, false],
      [{ low: 1, likely: 5, high: 4 }, false],
      [{ low: Number.NaN, likely: 2, high: 3 }, false],
      [{ low: 1, likely: 2, high: Infinity }, false],
      [{ low: -Infinity, likely: 2, high: 3 }, false],
    ];
    for (const [range, usable] of cases) {
      expect(isUsableRange(range)).toBe(usable);
      if (usable) expect(() => requireRange('r', range)).not.toThrow();
      else expect(() => requireRange('r', range)).toThrow(/^r: expected finite numbers/);
    }
  });
});

describe('spreadOf of a few values', () => {
  const definition7 = (values: readonly number[], probability: number) => {
    const sorted = [...values].sort((a, b) => a - b);
    const h = (sorted.length - 1) * probability;
    const lower = Math.floor(h);
    const x = sorted[lower] as number;
    const next = sorted[Math.min(lower + 1, sorted.length - 1)] as number;
    return x + (h - lower) * (next - x);
  };

  it('gives definition 7 for 1 to 6 values, in every order tried, ties included', () => {
    const lists = [
      [5],
      [9, 2],
      [3, 1, 2],
      [4, 4, 1],
      [10, -3, 7, 7],
      [1, 8, 2, 9, 3],
      [6, 6, 6, 1, 6, 2],
    ];
    for (const list of lists) {
      for (const order of [list, [...list].reverse(), [...list.slice(1), ...list.slice(0, 1)]]) {
        const spread = spreadOf(Float64Array.from(order));
        expect(spread.p10).toBeCloseTo(definition7(order, 0.1), 12);
        expect(spread.p50).toBeCloseTo(definition7(order, 0.5), 12);
        expect(spread.p90).toBeCloseTo(definition7(order, 0.9), 12);
        expect(spread.mean).toBeCloseTo(
          order.reduce((sum, value) => sum + value, 0) / order.length,
          12,
        );
      }
    }
  });
});
