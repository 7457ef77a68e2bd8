/**
 * The small linear solves of the least-squares fits: a Cholesky factorization of the part of
 * a Gram matrix (AᵀA) that belongs to a chosen set of columns, and the two triangular solves.
 * The sets hold at most a few dozen columns, so each solve factors afresh; a pivot that is
 * (nearly) zero says a column is a combination of the others and the set is refused.
 *
 * References: G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed., §4.2 (Cholesky)
 * and §3.1 (triangular systems) (from memory).
 */

/**
 * Smallest accepted Cholesky pivot² of a unit-diagonal Gram matrix. The pivot² of a column is
 * sin² of the angle between it and the span of the columns before it; below 1e-10 (an angle
 * under 1e-5 rad) rounding in AᵀA (about 1e-16 of its entries, squared condition) leaves it
 * meaningless, so the column is treated as dependent.
 */
export const DEPENDENCE_PIVOT = 1e-10;

/**
 * Factors the rows and columns `indices` of a symmetric, unit-diagonal Gram matrix as L·Lᵀ.
 *
 * @param gram - k×k row by row
 * @param columnCount - k
 * @param indices - the chosen columns, in order
 * @returns L (p×p row by row, lower triangle), or null when a column depends on earlier ones
 */
export function choleskyOf(
  gram: Float64Array,
  columnCount: number,
  indices: readonly number[],
): Float64Array | null {
  const size = indices.length;
  const lower = new Float64Array(size * size);
  for (let row = 0; row < size; row += 1) {
    const gramRow = (indices[row] as number) * columnCount;
    for (let column = 0; column <= row; column += 1) {
      let sum = gram[gramRow + (indices[column] as number)] as number;
      for (let inner = 0; inner < column; inner += 1) {
        sum -= (lower[row * size + inner] as number) * (lower[column * size + inner] as number);
      }
      if (column < row) {
        lower[row * size + column] = sum / (lower[column * size + column] as number);
      } else {
        if (!(sum > DEPENDENCE_PIVOT)) return null;
        lower[row * size + row] = Math.sqrt(sum);
      }
    }
  }
  return lower;
}

/**
 * Solves L·Lᵀ·z = rhs.
 *
 * @param lower - the factor from `choleskyOf` (p×p)
 * @param rhs - p values (not changed)
 * @returns z, p values
 */
export function choleskySolve(lower: Float64Array, rhs: ArrayLike<number>): Float64Array {
  const size = rhs.length;
  const solution = new Float64Array(size);
  for (let row = 0; row < size; row += 1) {
    let sum = rhs[row] as number;
    for (let inner = 0; inner < row; inner += 1) {
      sum -= (lower[row * size + inner] as number) * (solution[inner] as number);
    }
    solution[row] = sum / (lower[row * size + row] as number);
  }
  for (let row = size - 1; row >= 0; row -= 1) {
    let sum = solution[row] as number;
    for (let inner = row + 1; inner < size; inner += 1) {
      sum -= (lower[inner * size + row] as number) * (solution[inner] as number);
    }
    solution[row] = sum / (lower[row * size + row] as number);
  }
  return solution;
}
