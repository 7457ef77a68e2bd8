/**
 * Non-negative least squares: the x ≥ 0 that minimises ‖A·x − b‖², for small dense problems
 * (up to some ten thousand rows and a few dozen columns).
 *
 * The method is Lawson and Hanson's active set. Every column starts bound at zero; each pass
 * frees the bound column whose gradient wᵢ = [Aᵀ(b − A·x)]ᵢ most favours growing, solves the
 * unconstrained problem on the free columns, and, where that solution leaves the feasible
 * region, steps back to its edge and binds the column that reached zero. It stops when no
 * bound column has wᵢ > 0 (the Kuhn–Tucker conditions), which it reaches in finitely many
 * passes. As in Bro and De Jong's variant, the free-set problems are solved from AᵀA and Aᵀb
 * (so the rows are read once and a bootstrap can reweight them cheaply), by Cholesky after
 * scaling every column of A to unit length (the problem and x ≥ 0 are unchanged by positive
 * column scales; the scaling makes AᵀA's diagonal 1 and its pivots comparable).
 *
 * Rank deficiency is reported rather than resolved. A column of zeros never enters and is
 * undetermined: nothing in the data fixes it, and its 0 is no estimate. A column that is (to
 * the pivot tolerance) a combination of the free columns is refused on entry; at the end,
 * every bound column that is such a combination, and the free columns it combines, are
 * undetermined too: moving along that combination changes x and not A·x. Each bound column is
 * tested on its own; a non-uniqueness that needs two bound columns at once is not looked for.
 *
 * References: C. L. Lawson and R. J. Hanson, Solving Least Squares Problems, Prentice-Hall,
 * 1974, ch. 23, algorithm NNLS (chapter from memory); R. Bro and S. De Jong, "A fast
 * non-negativity-constrained least squares algorithm", Journal of Chemometrics 11(5), 1997
 * (from memory). Checked against every subset solved by brute force in
 * test/reference/nnls.test.ts.
 */
import { activeSet, indicesWhere, scaledSystem, undeterminedFlags } from './active-set.ts';
import {
  denseMatrixOf,
  normalEquationsOf,
  normalEquationsOfDense,
  vectorOf,
  type DenseMatrix,
  type MatrixInput,
  type NormalEquations,
} from './nnls-input.ts';

export type { DenseMatrix, MatrixInput, NormalEquations } from './nnls-input.ts';

/** The solution of a non-negative least-squares problem. */
export interface NnlsResult {
  /** x, one value per column, each ≥ 0. */
  solution: Float64Array;
  /** ‖A·x − b‖, in the unit of b. */
  residualNorm: number;
  /** Passes of the main loop (each frees one column). */
  iterations: number;
  /** Columns held at 0 by x ≥ 0 (the data would push them below 0), ascending. */
  atZero: number[];
  /** Columns the data cannot fix (no data, or a combination of other columns), ascending. */
  undetermined: number[];
}

function solveChecked(system: NormalEquations): NnlsResult {
  const scaled = scaledSystem(system);
  const { solution: scaledSolution, free, iterations } = activeSet(scaled);
  const undetermined = undeterminedFlags(scaled, free);
  const solution = new Float64Array(system.columns);
  const atZero: number[] = [];
  for (let j = 0; j < system.columns; j += 1) {
    const length = scaled.lengths[j] as number;
    solution[j] = length > 0 ? (scaledSolution[j] as number) / length : 0;
    if (!free[j] && !undetermined[j]) atZero.push(j);
  }
  return {
    solution,
    residualNorm: residualFromNormal(system, solution),
    iterations,
    atZero,
    undetermined: indicesWhere(undetermined),
  };
}

/** √(bᵀb − 2xᵀAᵀb + xᵀAᵀAx), floored at 0 (it loses digits when the fit is near exact). */
function residualFromNormal(system: NormalEquations, solution: Float64Array): number {
  const { columns, gram, projection, targetSquaredNorm } = system;
  let squared = targetSquaredNorm;
  for (let i = 0; i < columns; i += 1) {
    const xi = solution[i] as number;
    if (xi === 0) continue;
    squared -= 2 * xi * (projection[i] as number);
    for (let j = 0; j < columns; j += 1) {
      squared += xi * (gram[i * columns + j] as number) * (solution[j] as number);
    }
  }
  return Math.sqrt(Math.max(0, squared));
}

function residualFromDense(matrix: DenseMatrix, target: Float64Array, solution: Float64Array) {
  let squared = 0;
  for (let row = 0; row < matrix.rows; row += 1) {
    let residual = -(target[row] as number);
    for (let j = 0; j < matrix.columns; j += 1) {
      residual += (matrix.values[row * matrix.columns + j] as number) * (solution[j] as number);
    }
    squared += residual * residual;
  }
  return Math.sqrt(squared);
}

/**
 * Non-negative least squares on a dense matrix.
 *
 * @param matrix - A, m×k: rows of numbers, or a `DenseMatrix` (row by row in a Float64Array)
 * @param target - b, m values in any unit
 * @returns x ≥ 0 minimising ‖A·x − b‖², with ‖A·x − b‖ computed from A (in b's unit)
 * @throws InputError naming `matrix…` or `target…` when shapes differ or a value is not finite
 *
 * Notes: the Kuhn–Tucker conditions hold at the result: wᵢ = 0 where xᵢ > 0 and wᵢ ≤ 0 where
 * xᵢ = 0, w = Aᵀ(b − A·x) (to the tolerances above).
 */
export function solveNnls(matrix: MatrixInput, target: ArrayLike<number>): NnlsResult {
  const dense = denseMatrixOf(matrix);
  const checkedTarget = vectorOf('target', target, dense.rows);
  const result = solveChecked(normalEquationsOfDense(dense, checkedTarget));
  result.residualNorm = residualFromDense(dense, checkedTarget, result.solution);
  return result;
}

/**
 * Non-negative least squares from the normal equations (AᵀA, Aᵀb, bᵀb), for callers that
 * build them more cheaply than from a dense A (sparse rows, reweighted rows).
 *
 * @returns as `solveNnls`; ‖A·x − b‖ from the normal equations (accurate to about
 *   √(1e-16 · bᵀb) where the fit is near exact)
 * @throws InputError naming `columns`, `gram…`, `projection…` or `targetSquaredNorm`
 */
export function solveNnlsNormal(system: NormalEquations): NnlsResult {
  return solveChecked(normalEquationsOf(system));
}
