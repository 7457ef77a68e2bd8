/**
 * The interval rules of core/plan/best-package/interval.ts: at points drawn inside random
 * boxes, each operation's value lies in its value interval and its partial derivatives
 * (central finite differences of the same operation on plain numbers, an independent
 * computation) lie in its derivative intervals.
 */
import { describe, expect, it } from 'vitest';
import {
  abs,
  add,
  div,
  min,
  mul,
  plus,
  pow,
  powInUnit,
  scale,
  square,
  sub,
  variable,
  type Dual,
} from '../../core/plan/best-package/interval.ts';

/** A seeded uniform [0, 1) generator (an LCG: the constants of Numerical Recipes). */
function uniformFrom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

type Point = [number, number, number];

interface Case {
  name: string;
  /** The operation on duals over the box, or null when refused. */
  onBox: (x: Dual, y: Dual, z: Dual) => Dual | null;
  /** The same operation on plain numbers. */
  atPoint: (p: Point) => number;
  /** The box of each variable, from two uniforms. */
  ranges: [number, number][];
}

const CASES: Case[] = [
  {
    name: 'x·y − 2z + 0.5',
    onBox: (x, y, z) => plus(sub(mul(x, y), scale(z, 2)), 0.5),
    atPoint: ([x, y, z]) => x * y - 2 * z + 0.5,
    ranges: [
      [-2, 2],
      [-1, 3],
      [0, 1],
    ],
  },
  {
    name: '(x + y)/(1 + z)',
    onBox: (x, y, z) => div(add(x, y), plus(z, 1)),
    atPoint: ([x, y, z]) => (x + y) / (1 + z),
    ranges: [
      [-1, 1],
      [0, 2],
      [0, 1],
    ],
  },
  {
    name: '(x² + y)^0.77',
    onBox: (x, y) => pow(add(square(x), y), 0.77),
    atPoint: ([x, y]) => (x * x + y) ** 0.77,
    ranges: [
      [-1, 1],
      [0.01, 1],
      [0, 1],
    ],
  },
  {
    name: 'y^−0.2·x',
    onBox: (x, y) => {
      const power = pow(y, -0.2);
      return power === null ? null : mul(power, x);
    },
    atPoint: ([x, y]) => y ** -0.2 * x,
    ranges: [
      [-1, 1],
      [0.05, 1],
      [0, 1],
    ],
  },
  {
    name: 'min(x, 1 − 2z) + |y − x|^1.5',
    onBox: (x, y, z) => {
      const held = pow(abs(sub(y, x)), 1.5);
      return held === null ? null : add(min(x, plus(scale(z, -2), 1)), held);
    },
    atPoint: ([x, y, z]) => Math.min(x, 1 - 2 * z) + Math.abs(y - x) ** 1.5,
    ranges: [
      [-1, 1],
      [-1, 1],
      [0, 1],
    ],
  },
  {
    name: 'x^(1.5 − z) for x in [0, 1]',
    onBox: (x, _y, z) => powInUnit(x, plus(scale(z, -1), 1.5)),
    atPoint: ([x, , z]) => x ** (1.5 - z),
    ranges: [
      [0.02, 1],
      [0, 1],
      [0, 1],
    ],
  },
];

describe('interval rules with derivatives', () => {
  for (const testCase of CASES) {
    it(`hold every value and derivative of ${testCase.name}`, () => {
      const next = uniformFrom(20261203 + testCase.name.length);
      let checked = 0;
      for (let trial = 0; trial < 300; trial += 1) {
        const box = testCase.ranges.map(([low, high]) => {
          const a = low + (high - low) * next();
          const b = low + (high - low) * next();
          return { lo: Math.min(a, b), hi: Math.max(a, b) };
        });
        const [bx, by, bz] = box;
        if (bx === undefined || by === undefined || bz === undefined) throw new Error('box');
        const result = testCase.onBox(variable(0, bx), variable(1, by), variable(2, bz));
        if (result === null) continue;
        for (let sample = 0; sample < 10; sample += 1) {
          const point = box.map((range) => range.lo + (range.hi - range.lo) * next()) as Point;
          const value = testCase.atPoint(point);
          const tolerance = 1e-9 * (1 + Math.abs(value));
          expect(value).toBeGreaterThanOrEqual(result.v.lo - tolerance);
          expect(value).toBeLessThanOrEqual(result.v.hi + tolerance);
          for (let at = 0; at < 3; at += 1) {
            const range = box[at];
            if (range === undefined) continue;
            const h = 1e-6 * (1 + Math.abs(point[at] ?? 0));
            // Stay inside the box (a one-sided difference near its ends), away from kinks.
            const ahead = [...point] as Point;
            const behind = [...point] as Point;
            ahead[at] = Math.min(range.hi, (point[at] ?? 0) + h);
            behind[at] = Math.max(range.lo, (point[at] ?? 0) - h);
            const span = (ahead[at] ?? 0) - (behind[at] ?? 0);
            if (span <= 0) continue;
            const slope = (testCase.atPoint(ahead) - testCase.atPoint(behind)) / span;
            const part = result.d[at];
            if (part === undefined) continue;
            const slack = 1e-4 * (1 + Math.abs(slope));
            expect(slope, `${testCase.name} ∂${at}`).toBeGreaterThanOrEqual(part.lo - slack);
            expect(slope, `${testCase.name} ∂${at}`).toBeLessThanOrEqual(part.hi + slack);
            checked += 1;
          }
        }
      }
      expect(checked).toBeGreaterThan(1000);
    });
  }
});
