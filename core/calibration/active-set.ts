/**
 * The active-set loop of Lawson and Hanson's non-negative least squares on the normal
 * equations with unit-length columns, and the test for columns the data cannot fix. The method
 * and its sources are described in nnls.ts, which is the public door.
 */
import { DEPENDENCE_PIVOT, choleskyOf, choleskySolve } from './cholesky.ts';
import type { NormalEquations } from './nnls-input.ts';

/**
 * The main loop stops at wᵢ ≤ this × max(‖b‖, max |Aᵀb|ᵢ) (unit columns): what remains is
 * rounding, and growing such a column would lower ‖A·x − b‖² by about wᵢ², nothing.
 */
const GRADIENT_TOLERANCE = 1e-10;

/** A free column takes part in a dependence when its coefficient (unit columns) exceeds this. */
const COMBINATION_TOLERANCE = 1e-8;

/** A safeguard against cycling by rounding; the method ends in far fewer passes. */
function passLimit(columns: number): number {
  return 10 * columns + 10;
}

/** The problem with unit-length columns: AᵀA with a unit diagonal, Aᵀb, and the lengths. */
export interface ScaledSystem {
  columns: number;
  gram: Float64Array;
  projection: Float64Array;
  /** ‖aⱼ‖ of each column of A; 0 for a column of zeros. */
  lengths: Float64Array;
  tolerance: number;
}

/**
 * Scales every column of A to unit length: (AᵀA)ᵢⱼ / (‖aᵢ‖‖aⱼ‖) and (Aᵀb)ᵢ / ‖aᵢ‖. The
 * solution of the scaled problem is xᵢ·‖aᵢ‖; zero columns stay zero.
 */
export function scaledSystem(system: NormalEquations): ScaledSystem {
  const { columns, gram, projection, targetSquaredNorm } = system;
  const lengths = new Float64Array(columns);
  for (let j = 0; j < columns; j += 1) lengths[j] = Math.sqrt(gram[j * columns + j] as number);
  const scaledGram = new Float64Array(columns * columns);
  const scaledProjection = new Float64Array(columns);
  let largest = Math.sqrt(targetSquaredNorm);
  for (let i = 0; i < columns; i += 1) {
    const lengthI = lengths[i] as number;
    if (lengthI === 0) continue;
    scaledProjection[i] = (projection[i] as number) / lengthI;
    largest = Math.max(largest, Math.abs(scaledProjection[i] as number));
    for (let j = 0; j < columns; j += 1) {
      const lengthJ = lengths[j] as number;
      if (lengthJ === 0) continue;
      scaledGram[i * columns + j] =
        i === j ? 1 : (gram[i * columns + j] as number) / (lengthI * lengthJ);
    }
  }
  const tolerance = GRADIENT_TOLERANCE * largest;
  return { columns, gram: scaledGram, projection: scaledProjection, lengths, tolerance };
}

/** The places of the set flags, ascending. */
export function indicesWhere(flags: Uint8Array): number[] {
  const indices: number[] = [];
  flags.forEach((flag, index) => {
    if (flag) indices.push(index);
  });
  return indices;
}

/** The unconstrained solution on the free columns (0 elsewhere), or null if they depend. */
function freeSolution(system: ScaledSystem, free: Uint8Array): Float64Array | null {
  const indices = indicesWhere(free);
  const lower = choleskyOf(system.gram, system.columns, indices);
  if (!lower) return null;
  const partial = choleskySolve(
    lower,
    indices.map((index) => system.projection[index] as number),
  );
  const solution = new Float64Array(system.columns);
  indices.forEach((index, place) => (solution[index] = partial[place] as number));
  return solution;
}

/** The bound column with the largest gradient above the tolerance, or −1. */
function mostImproving(
  system: ScaledSystem,
  solution: Float64Array,
  free: Uint8Array,
  refused: Uint8Array,
): number {
  const { columns, gram, projection, lengths, tolerance } = system;
  let best = -1;
  let bestGradient = tolerance;
  for (let j = 0; j < columns; j += 1) {
    if (free[j] || refused[j] || lengths[j] === 0) continue;
    let gradient = projection[j] as number;
    for (let i = 0; i < columns; i += 1) {
      gradient -= (gram[j * columns + i] as number) * (solution[i] as number);
    }
    if (gradient > bestGradient) {
      best = j;
      bestGradient = gradient;
    }
  }
  return best;
}

/**
 * Lawson and Hanson's inner loop: while the free-set solution z has a value ≤ 0, step from x
 * towards z as far as x stays ≥ 0, bind the columns that reached 0, and solve again.
 */
function stepToFeasible(
  system: ScaledSystem,
  solution: Float64Array,
  free: Uint8Array,
  firstTrial: Float64Array,
): void {
  let trial = firstTrial;
  for (;;) {
    let step = Infinity;
    let leaving = -1;
    for (let j = 0; j < system.columns; j += 1) {
      const value = trial[j] as number;
      if (!free[j] || value > 0) continue;
      const current = solution[j] as number;
      const ratio = current - value > 0 ? current / (current - value) : 0;
      if (ratio < step) [step, leaving] = [ratio, j];
    }
    if (leaving < 0) {
      solution.set(trial);
      return;
    }
    for (let j = 0; j < system.columns; j += 1) {
      if (!free[j]) continue;
      const moved =
        (solution[j] as number) + step * ((trial[j] as number) - (solution[j] as number));
      if (j === leaving || !(moved > 0)) [free[j], solution[j]] = [0, 0];
      else solution[j] = moved;
    }
    const next = freeSolution(system, free);
    // A subset of independent columns is independent; a refusal here is a defect.
    if (!next) throw new Error('nnls: a subset of the free columns was found dependent');
    trial = next;
  }
}

/**
 * Lawson and Hanson's main loop on the scaled problem.
 *
 * @returns the scaled solution, which columns are free (not held at 0), and the passes made
 */
export function activeSet(system: ScaledSystem): {
  solution: Float64Array;
  free: Uint8Array;
  iterations: number;
} {
  const solution = new Float64Array(system.columns);
  const free = new Uint8Array(system.columns);
  const refused = new Uint8Array(system.columns);
  let iterations = 0;
  for (;;) {
    const entering = mostImproving(system, solution, free, refused);
    if (entering < 0) return { solution, free, iterations };
    free[entering] = 1;
    const trial = freeSolution(system, free);
    // Lawson and Hanson refuse a column that depends on the free ones, or whose free-set
    // value is not positive (possible only by rounding), and try the next best.
    if (!trial || !((trial[entering] as number) > 0)) {
      [free[entering], refused[entering]] = [0, 1];
      continue;
    }
    refused.fill(0);
    iterations += 1;
    if (iterations > passLimit(system.columns)) {
      throw new Error(`nnls: no solution after ${iterations - 1} passes (rounding cycle)`);
    }
    stepToFeasible(system, solution, free, trial);
  }
}

/** Zero columns, and bound columns that are combinations of free ones with those free ones. */
export function undeterminedFlags(system: ScaledSystem, free: Uint8Array): Uint8Array {
  const { columns, gram, lengths } = system;
  const flags = new Uint8Array(columns);
  const freeIndices = indicesWhere(free);
  const lower = choleskyOf(gram, columns, freeIndices);
  if (!lower) throw new Error('nnls: the free columns of the solution were found dependent');
  for (let j = 0; j < columns; j += 1) {
    if (lengths[j] === 0) flags[j] = 1;
    if (free[j] || lengths[j] === 0) continue;
    const cross = freeIndices.map((index) => gram[index * columns + j] as number);
    const coefficients = choleskySolve(lower, cross);
    let explained = 0;
    cross.forEach((value, place) => (explained += value * (coefficients[place] as number)));
    if (1 - explained > DEPENDENCE_PIVOT) continue;
    flags[j] = 1;
    freeIndices.forEach((index, place) => {
      if (Math.abs(coefficients[place] as number) > COMBINATION_TOLERANCE) flags[index] = 1;
    });
  }
  return flags;
}
