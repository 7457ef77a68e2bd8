/**
 * Non-negative least squares against outside checks:
 * - brute force written here: every subset of columns solved without constraints by its normal
 *   equations (Gaussian elimination with partial pivoting), the feasible (all ≥ 0) solutions
 *   kept, the smallest residual taken — the optimum has a support of independent columns, so
 *   this finds it (Lawson and Hanson 1974, ch. 23, from memory);
 * - the example of MATLAB's lsqnonneg documentation (values from memory), whose answer
 *   scipy.optimize.nnls 1.17.1 (run by hand on this machine) gives as x = (0, 0.6929344) with
 *   ‖r‖² = 0.8314559512633124;
 * - a case derived by hand in its comment.
 * Random problems come from the project's seeded generator, so a failure reproduces.
 */
import { describe, expect, it } from 'vitest';
import { solveNnls, solveNnlsNormal } from '../../core/calibration.ts';
import { Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

type Matrix = number[][];

function residualNorm(matrix: Matrix, x: ArrayLike<number>, target: number[]): number {
  let squared = 0;
  matrix.forEach((row, r) => {
    const residual = row.reduce((sum, value, c) => sum + value * (x[c] as number), 0) - target[r]!;
    squared += residual * residual;
  });
  return Math.sqrt(squared);
}

/** Gaussian elimination with partial pivoting; null when a pivot is (nearly) zero. */
function solveLinear(matrix: Matrix, rhs: number[]): number[] | null {
  const size = rhs.length;
  const a = matrix.map((row, r) => [...row, rhs[r]!]);
  const scale = Math.max(...matrix.flat().map(Math.abs), Number.MIN_VALUE);
  for (let col = 0; col < size; col += 1) {
    let pivot = col;
    for (let r = col + 1; r < size; r += 1) {
      if (Math.abs(a[r]![col]!) > Math.abs(a[pivot]![col]!)) pivot = r;
    }
    if (Math.abs(a[pivot]![col]!) < 1e-11 * scale) return null;
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    for (let r = col + 1; r < size; r += 1) {
      const factor = a[r]![col]! / a[col]![col]!;
      for (let c = col; c <= size; c += 1) a[r]![c]! -= factor * a[col]![c]!;
    }
  }
  const x = new Array<number>(size).fill(0);
  for (let r = size - 1; r >= 0; r -= 1) {
    let sum = a[r]![size]!;
    for (let c = r + 1; c < size; c += 1) sum -= a[r]![c]! * x[c]!;
    x[r] = sum / a[r]![r]!;
  }
  return x;
}

/** The best feasible unconstrained solution over every subset of columns. */
function bruteForce(matrix: Matrix, target: number[]): { x: number[]; residual: number } {
  const columns = matrix[0]!.length;
  const none = new Array<number>(columns).fill(0);
  let best = { x: none, residual: residualNorm(matrix, none, target) };
  for (let mask = 1; mask < 1 << columns; mask += 1) {
    const subset = [...Array(columns).keys()].filter((c) => mask & (1 << c));
    const gram = subset.map((i) =>
      subset.map((j) => matrix.reduce((sum, row) => sum + row[i]! * row[j]!, 0)),
    );
    const projection = subset.map((i) =>
      matrix.reduce((sum, row, r) => sum + row[i]! * target[r]!, 0),
    );
    const z = solveLinear(gram, projection);
    if (!z || z.some((value) => value < 0)) continue;
    const x = new Array<number>(columns).fill(0);
    subset.forEach((c, place) => (x[c] = z[place]!));
    const residual = residualNorm(matrix, x, target);
    if (residual < best.residual) best = { x, residual };
  }
  return best;
}

function randomProblem(generator: Xoshiro128StarStar, rows: number, columns: number, low: number) {
  const uniform = () => low + (10 - low) * generator.nextFraction();
  const matrix = Array.from({ length: rows }, () => Array.from({ length: columns }, uniform));
  const target = Array.from({ length: rows }, () => -10 + 20 * generator.nextFraction());
  return { matrix, target };
}

function between(generator: Xoshiro128StarStar, min: number, max: number): number {
  return min + Math.floor(generator.nextFraction() * (max - min + 1));
}

const SEED = 20_240_611;

/**
 * Residuals agree to 1e-9 of the brute force's; a near-exact fit's residual is rounding in both
 * (about 1e-15 ‖b‖), so below 1e-3 ‖b‖ they are held to 1e-12 ‖b‖ instead.
 */
function expectSameResidual(ours: number, brute: number, target: number[]): void {
  const floor = 1e-3 * Math.hypot(...target);
  expect(Math.abs(ours - brute)).toBeLessThanOrEqual(1e-9 * Math.max(brute, floor));
}

describe('NNLS against brute force over every subset (2–5 columns)', () => {
  it('matches the residual to 1e-9 relative and x to 1e-6 when the problem has full rank', () => {
    const generator = new Xoshiro128StarStar();
    for (let problem = 0; problem < 400; problem += 1) {
      generator.reseed(SEED, 1, problem);
      const columns = between(generator, 2, 5);
      const rows = between(generator, columns, 12);
      // Half the problems have A ≥ 0, as estimates by type are.
      const { matrix, target } = randomProblem(generator, rows, columns, problem % 2 ? 0 : -10);
      const ours = solveNnls(matrix, target);
      const brute = bruteForce(matrix, target);
      expectSameResidual(ours.residualNorm, brute.residual, target);
      brute.x.forEach((value, c) => {
        expect(Math.abs(ours.solution[c]! - value)).toBeLessThanOrEqual(1e-6 * Math.max(1, value));
      });
      expect(ours.undetermined).toEqual([]);
      expect(ours.atZero).toEqual(brute.x.flatMap((value, c) => (value === 0 ? [c] : [])));
    }
  });

  it('matches the residual when there are fewer rows than columns', () => {
    const generator = new Xoshiro128StarStar();
    for (let problem = 0; problem < 200; problem += 1) {
      generator.reseed(SEED, 2, problem);
      const columns = between(generator, 3, 5);
      const rows = between(generator, 1, columns - 1);
      const { matrix, target } = randomProblem(generator, rows, columns, -10);
      const ours = solveNnls(matrix, target);
      const brute = bruteForce(matrix, target);
      expectSameResidual(ours.residualNorm, brute.residual, target);
      expect([...ours.solution].every((value) => value >= 0)).toBe(true);
    }
  });

  it('splits a repeated column’s value between its copies and calls them undetermined', () => {
    const generator = new Xoshiro128StarStar();
    for (let problem = 0; problem < 100; problem += 1) {
      generator.reseed(SEED, 3, problem);
      const columns = between(generator, 2, 4);
      const { matrix, target } = randomProblem(generator, columns + 4, columns, 0);
      const brute = bruteForce(matrix, target);
      const doubled = matrix.map((row) => [...row, row[0]!]);
      const ours = solveNnls(doubled, target);
      expectSameResidual(ours.residualNorm, brute.residual, target);
      const sum = ours.solution[0]! + ours.solution[columns]!;
      expect(Math.abs(sum - brute.x[0]!)).toBeLessThanOrEqual(1e-6 * Math.max(1, brute.x[0]!));
      if (brute.x[0]! > 0) {
        expect(ours.undetermined).toContain(0);
        expect(ours.undetermined).toContain(columns);
      }
    }
  });
});

describe('NNLS on known cases', () => {
  it('gives MATLAB’s lsqnonneg example (confirmed with scipy.optimize.nnls 1.17.1)', () => {
    const matrix = [
      [0.0372, 0.2869],
      [0.6861, 0.7071],
      [0.6233, 0.6245],
      [0.6344, 0.617],
    ];
    const target = [0.8587, 0.1781, 0.0747, 0.8405];
    const result = solveNnls(matrix, target);
    expect(result.solution[0]).toBe(0);
    expect(result.solution[1]).toBeCloseTo(0.6929344, 7);
    expect(result.residualNorm ** 2).toBeCloseTo(0.8314559512633124, 12);
    // With column 0 bound, column 1 alone: x₁ = a₁·b / a₁·a₁ (one-column least squares).
    const a1 = matrix.map((row) => row[1]!);
    const x1 = a1.reduce((s, v, r) => s + v * target[r]!, 0) / a1.reduce((s, v) => s + v * v, 0);
    expect(result.solution[1]).toBeCloseTo(x1, 12);
    expect(result.atZero).toEqual([0]);
  });

  it('gives the hand-derived answer x = (1.5, 0), ‖r‖ = √1.5', () => {
    // A = [[1,0],[0,1],[1,1]], b = (2, −1, 1). Unconstrained: AᵀA = [[2,1],[1,2]], Aᵀb = (3, 0),
    // x = (2, −1), infeasible. With x₂ = 0: min (x₁−2)² + 1 + (x₁−1)² at x₁ = 1.5, ‖r‖² = 1.5;
    // there w₂ = a₂ᵀr = (0,1,1)·(0.5, −1, −0.5) = −1.5 ≤ 0, so it is optimal. With x₁ = 0 the
    // best is x₂ = 0, ‖r‖² = 6.
    const result = solveNnls(
      [
        [1, 0],
        [0, 1],
        [1, 1],
      ],
      [2, -1, 1],
    );
    expect(result.solution[0]).toBeCloseTo(1.5, 14);
    expect(result.solution[1]).toBe(0);
    expect(result.residualNorm).toBeCloseTo(Math.sqrt(1.5), 14);
    expect(result.atZero).toEqual([1]);
    expect(result.iterations).toBe(1);
  });

  it('reports a column of zeros undetermined at 0, and no rows as all undetermined', () => {
    const result = solveNnls(
      [
        [1, 0],
        [2, 0],
      ],
      [1, 2],
    );
    expect([...result.solution]).toEqual([1, 0]);
    expect(result.undetermined).toEqual([1]);
    const empty = solveNnls({ rows: 0, columns: 3, values: new Float64Array(0) }, []);
    expect(empty.undetermined).toEqual([0, 1, 2]);
    expect(empty.residualNorm).toBe(0);
  });

  it('gives the same answer from rows, a Float64Array and the normal equations, unchanged input', () => {
    const matrix = [
      [3, 1, 0],
      [1, 2, 1],
      [0, 1, 4],
      [2, 2, 2],
    ];
    const target = [1, -2, 3, 0.5];
    const copy = structuredClone(matrix);
    const fromRows = solveNnls(matrix, target);
    const flat = { rows: 4, columns: 3, values: Float64Array.from(matrix.flat()) };
    const fromFlat = solveNnls(flat, Float64Array.from(target));
    const gram = [0, 1, 2].flatMap((i) =>
      [0, 1, 2].map((j) => matrix.reduce((s, row) => s + row[i]! * row[j]!, 0)),
    );
    const projection = [0, 1, 2].map((i) =>
      matrix.reduce((s, row, r) => s + row[i]! * target[r]!, 0),
    );
    const targetSquaredNorm = target.reduce((s, v) => s + v * v, 0);
    const fromNormal = solveNnlsNormal({ columns: 3, gram, projection, targetSquaredNorm });
    expect([...fromFlat.solution]).toEqual([...fromRows.solution]);
    fromRows.solution.forEach((value, c) => expect(fromNormal.solution[c]).toBeCloseTo(value, 12));
    expect(fromNormal.residualNorm).toBeCloseTo(fromRows.residualNorm, 7);
    expect(matrix).toEqual(copy);
  });
});

describe('NNLS input checks name the argument', () => {
  const ok = [
    [1, 2],
    [3, 4],
  ];
  it('refuses wrong shapes and values that are not finite', () => {
    expectInputError(() => solveNnls([], []), 'matrix', /at least one row/);
    expectInputError(() => solveNnls([[1, 2], [3]], [1, 2]), 'matrix[1]', /row of 2 numbers/);
    expectInputError(() => solveNnls([[1, NaN]], [1]), 'matrix[0][1]', /finite/);
    expectInputError(() => solveNnls(ok, [1]), 'target', /expected 2 numbers/);
    expectInputError(() => solveNnls(ok, [1, Infinity]), 'target[1]', /finite/);
    const values = Float64Array.from([1, 2, 3, NaN]);
    expectInputError(
      () => solveNnls({ rows: 2, columns: 2, values }, [1, 2]),
      'matrix.values[3]',
      /row 1, column 1/,
    );
    expectInputError(
      () => solveNnls({ rows: 2, columns: 3, values }, [1, 2]),
      'matrix.values',
      /2 × 3/,
    );
  });

  it('refuses normal equations that are not AᵀA, Aᵀb and bᵀb', () => {
    const base = { columns: 2, gram: [1, 0.5, 0.5, 1], projection: [1, 1], targetSquaredNorm: 4 };
    expectInputError(
      () => solveNnlsNormal({ ...base, gram: [1, 0.5, 0.4, 1] }),
      'gram[2]',
      /symmetric/,
    );
    expectInputError(
      () => solveNnlsNormal({ ...base, gram: [-1, 0, 0, 1] }),
      'gram[0]',
      /diagonal/,
    );
    expectInputError(
      () => solveNnlsNormal({ ...base, projection: [1] }),
      'projection',
      /2 numbers/,
    );
    expectInputError(
      () => solveNnlsNormal({ ...base, targetSquaredNorm: -1 }),
      'targetSquaredNorm',
      /at least 0/,
    );
    expectInputError(() => solveNnlsNormal({ ...base, columns: 1.5 }), 'columns', /whole number/);
  });
});
