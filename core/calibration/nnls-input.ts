/**
 * The checks and shapes of a least-squares problem's input: a dense matrix given as rows of
 * numbers or as one Float64Array, a target vector, or the normal equations (AᵀA, Aᵀb, bᵀb).
 * Every refusal is an InputError naming the argument and the entry at fault.
 */
import { InputError } from '../errors.ts';

/** A dense matrix stored row by row in one array: entry (r, c) is `values[r · columns + c]`. */
export interface DenseMatrix {
  rows: number;
  columns: number;
  values: Float64Array;
}

/** A matrix as rows of numbers (each row as long as the first), or a `DenseMatrix`. */
export type MatrixInput = readonly (readonly number[])[] | DenseMatrix;

/** The normal equations of min ‖A·x − b‖²: what the solution depends on, without A itself. */
export interface NormalEquations {
  /** k, the number of unknowns (columns of A). */
  columns: number;
  /** AᵀA, k×k row by row; symmetric. */
  gram: ArrayLike<number>;
  /** Aᵀb, k values. */
  projection: ArrayLike<number>;
  /** bᵀb = ‖b‖². */
  targetSquaredNorm: number;
}

function requireCount(path: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isSafeInteger(value) || value < 0) {
    throw InputError.at(path, `expected a whole number of at least 0, got ${String(value)}`);
  }
  return value;
}

function requireFiniteAt(path: string, value: unknown): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw InputError.at(path, `expected a finite number, got ${String(value)}`);
  }
  return value;
}

function isDenseMatrix(matrix: MatrixInput): matrix is DenseMatrix {
  return !Array.isArray(matrix);
}

function denseFromRows(rows: readonly (readonly number[])[]): DenseMatrix {
  const first = rows[0];
  if (!Array.isArray(first) || first.length === 0) {
    throw InputError.at(
      rows.length === 0 ? 'matrix' : 'matrix[0]',
      'expected at least one row of at least one number (or a DenseMatrix with its column count)',
    );
  }
  const columns = first.length;
  const values = new Float64Array(rows.length * columns);
  rows.forEach((row, rowIndex) => {
    if (!Array.isArray(row) || row.length !== columns) {
      throw InputError.at(`matrix[${rowIndex}]`, `expected a row of ${columns} numbers, as row 0`);
    }
    row.forEach((value, column) => {
      values[rowIndex * columns + column] = requireFiniteAt(
        `matrix[${rowIndex}][${column}]`,
        value,
      );
    });
  });
  return { rows: rows.length, columns, values };
}

function checkedDense(matrix: DenseMatrix): DenseMatrix {
  const rows = requireCount('matrix.rows', matrix.rows);
  const columns = requireCount('matrix.columns', matrix.columns);
  if (!(matrix.values instanceof Float64Array) || matrix.values.length !== rows * columns) {
    throw InputError.at('matrix.values', `expected a Float64Array of ${rows} × ${columns} numbers`);
  }
  matrix.values.forEach((value, index) => {
    if (!Number.isFinite(value)) {
      const where = `row ${Math.floor(index / columns)}, column ${index % columns}`;
      throw InputError.at(`matrix.values[${index}]`, `expected a finite number (${where})`);
    }
  });
  return matrix;
}

/**
 * The matrix as one row-by-row array, checked: rectangular, every entry finite.
 *
 * @throws InputError at `matrix`, `matrix[r]`, `matrix[r][c]`, `matrix.rows`, `matrix.values[i]`…
 */
export function denseMatrixOf(matrix: MatrixInput): DenseMatrix {
  if (matrix === null || typeof matrix !== 'object') {
    throw InputError.at('matrix', 'expected rows of numbers or a DenseMatrix');
  }
  return isDenseMatrix(matrix) ? checkedDense(matrix) : denseFromRows(matrix);
}

/**
 * A vector of `length` finite numbers, copied.
 *
 * @param path - the argument's name, for the error
 * @throws InputError at `path` (wrong length) or `path[i]` (not finite)
 */
export function vectorOf(path: string, vector: ArrayLike<number>, length: number): Float64Array {
  if (vector === null || typeof vector !== 'object' || vector.length !== length) {
    throw InputError.at(path, `expected ${length} numbers`);
  }
  const copy = new Float64Array(length);
  for (let index = 0; index < length; index += 1) {
    copy[index] = requireFiniteAt(`${path}[${index}]`, vector[index]);
  }
  return copy;
}

/**
 * The normal equations, checked and copied: shapes, finite entries, a symmetric Gram matrix
 * with a diagonal of at least 0, and bᵀb of at least 0.
 *
 * @throws InputError at `columns`, `gram`, `gram[i]`, `projection`, `projection[i]`,
 *   `targetSquaredNorm`
 */
export function normalEquationsOf(system: NormalEquations): NormalEquations {
  const columns = requireCount('columns', system.columns);
  const gram = vectorOf('gram', system.gram, columns * columns);
  const projection = vectorOf('projection', system.projection, columns);
  const targetSquaredNorm = requireFiniteAt('targetSquaredNorm', system.targetSquaredNorm);
  if (targetSquaredNorm < 0) throw InputError.at('targetSquaredNorm', 'expected bᵀb of at least 0');
  for (let row = 0; row < columns; row += 1) {
    if ((gram[row * columns + row] as number) < 0) {
      throw InputError.at(`gram[${row * columns + row}]`, 'expected AᵀA: a diagonal of at least 0');
    }
    for (let column = 0; column < row; column += 1) {
      const below = gram[row * columns + column] as number;
      const above = gram[column * columns + row] as number;
      if (Math.abs(below - above) > 1e-12 * Math.max(Math.abs(below), Math.abs(above))) {
        throw InputError.at(`gram[${row * columns + column}]`, 'expected AᵀA: a symmetric matrix');
      }
    }
  }
  return { columns, gram, projection, targetSquaredNorm };
}

/**
 * AᵀA, Aᵀb and bᵀb of a dense problem.
 *
 * @param matrix - A, m×k
 * @param target - b, m values
 */
export function normalEquationsOfDense(matrix: DenseMatrix, target: Float64Array): NormalEquations {
  const { rows, columns, values } = matrix;
  const gram = new Float64Array(columns * columns);
  const projection = new Float64Array(columns);
  let targetSquaredNorm = 0;
  for (let row = 0; row < rows; row += 1) {
    const offset = row * columns;
    const targetValue = target[row] as number;
    targetSquaredNorm += targetValue * targetValue;
    for (let i = 0; i < columns; i += 1) {
      const entry = values[offset + i] as number;
      if (entry === 0) continue;
      projection[i] = (projection[i] as number) + entry * targetValue;
      for (let j = 0; j <= i; j += 1) {
        gram[i * columns + j] =
          (gram[i * columns + j] as number) + entry * (values[offset + j] as number);
      }
    }
  }
  for (let i = 0; i < columns; i += 1) {
    for (let j = 0; j < i; j += 1) gram[j * columns + i] = gram[i * columns + j] as number;
  }
  return { columns, gram, projection, targetSquaredNorm };
}
