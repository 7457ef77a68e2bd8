/**
 * The bootstrap of the realization factors: the homes are drawn with replacement, as many as
 * there are, the factors are fitted again on each such resample, and the spread of the refits
 * gives a percentile interval for each type.
 *
 * Resample r draws from the project's seeded generator reseeded with (seed, stream 0, draw r),
 * so its homes depend on the seed and r alone. A home is drawn as ⌊u·m⌋ of a fraction u in
 * [0, 1) in steps of 2^−32, so each of m homes has a chance within m/2^32 of 1/m (under 1e-5
 * of it for m ≤ 40,000). A drawn home counts once per draw: the fit reweights AᵀA, Aᵀb and bᵀb
 * by the draw counts, so a resample costs one pass over the homes' few types, not a new matrix.
 *
 * A resample in which a type's factor is undetermined (none of its homes drawn, or its homes
 * drawn only with a type it cannot be told apart from) gives that type nothing; its interval is
 * of the resamples that do, whose number is reported beside it.
 *
 * References: B. Efron and R. J. Tibshirani, An Introduction to the Bootstrap, Chapman & Hall,
 * 1993, ch. 6 (resampling cases) and ch. 13 (percentile intervals) (chapters from memory);
 * R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The American
 * Statistician 50(4), 1996, definition 7.
 */
import { Xoshiro128StarStar } from '../uncertainty/random.ts';
import { quantileSorted } from '../uncertainty/summary.ts';
import { solveNnlsNormal, type NnlsResult, type NormalEquations } from './nnls.ts';
import type { Design } from './realization-input.ts';

/** The generator stream of the bootstrap; each resample is one draw of it. */
const BOOTSTRAP_STREAM = 0;

/** A percentile interval of a factor, from its bootstrap refits. */
export interface FactorInterval {
  low: number;
  high: number;
  /** The interval's level: 0.95 for P2.5 to P97.5. */
  level: number;
}

/** The rows laid end to end, so a resample's pass over them reads three flat arrays. */
interface PackedRows {
  columns: number;
  /** Row r's entries are at places rowStarts[r] to rowStarts[r + 1] − 1. */
  rowStarts: Int32Array;
  entryColumns: Int32Array;
  entryEstimatesCfm50: Float64Array;
  measuredCfm50: Float64Array;
}

function packRows(design: Design): PackedRows {
  const rowStarts = new Int32Array(design.rows.length + 1);
  design.rows.forEach(
    (row, index) => (rowStarts[index + 1] = (rowStarts[index] as number) + row.columns.length),
  );
  const entries = rowStarts[design.rows.length] as number;
  const entryColumns = new Int32Array(entries);
  const entryEstimatesCfm50 = new Float64Array(entries);
  design.rows.forEach((row, index) => {
    entryColumns.set(row.columns, rowStarts[index]);
    entryEstimatesCfm50.set(row.estimatesCfm50, rowStarts[index]);
  });
  const measuredCfm50 = Float64Array.from(design.rows, (row) => row.measuredCfm50);
  return {
    columns: design.typeIds.length,
    rowStarts,
    entryColumns,
    entryEstimatesCfm50,
    measuredCfm50,
  };
}

/**
 * AᵀA, Aᵀb and bᵀb of the rows, each row counted `weights[i]` times (once without weights).
 * A row's columns ascend, so its products fill AᵀA's lower triangle, mirrored at the end.
 */
function normalEquationsOfPacked(packed: PackedRows, weights: Uint32Array | null): NormalEquations {
  const { columns, rowStarts, entryColumns, entryEstimatesCfm50, measuredCfm50 } = packed;
  const gram = new Float64Array(columns * columns);
  const projection = new Float64Array(columns);
  let targetSquaredNorm = 0;
  for (let row = 0; row < measuredCfm50.length; row += 1) {
    const weight = weights ? (weights[row] as number) : 1;
    if (weight === 0) continue;
    const measured = measuredCfm50[row] as number;
    targetSquaredNorm += weight * measured * measured;
    const end = rowStarts[row + 1] as number;
    for (let i = rowStarts[row] as number; i < end; i += 1) {
      const offset = (entryColumns[i] as number) * columns;
      const weighted = weight * (entryEstimatesCfm50[i] as number);
      const columnI = entryColumns[i] as number;
      projection[columnI] = (projection[columnI] as number) + weighted * measured;
      for (let j = rowStarts[row] as number; j <= i; j += 1) {
        const place = offset + (entryColumns[j] as number);
        gram[place] = (gram[place] as number) + weighted * (entryEstimatesCfm50[j] as number);
      }
    }
  }
  for (let i = 0; i < columns; i += 1) {
    for (let j = 0; j < i; j += 1) gram[j * columns + i] = gram[i * columns + j] as number;
  }
  return { columns, gram, projection, targetSquaredNorm };
}

/**
 * The non-negative least-squares factors of the rows.
 *
 * @param design - the rows: estimated CFM50 by type (A) and measured CFM50 (b)
 */
export function fitRows(design: Design): NnlsResult {
  return solveNnlsNormal(normalEquationsOfPacked(packRows(design), null));
}

/**
 * Draws m homes with replacement for resample `draw`, into `counts` (m entries, overwritten):
 * how many times each home was drawn.
 */
function drawCounts(
  generator: Xoshiro128StarStar,
  seed: number,
  draw: number,
  counts: Uint32Array,
): void {
  const homeCount = counts.length;
  counts.fill(0);
  generator.reseed(seed, BOOTSTRAP_STREAM, draw);
  for (let pick = 0; pick < homeCount; pick += 1) {
    const home = Math.floor(generator.nextFraction() * homeCount);
    counts[home] = (counts[home] as number) + 1;
  }
}

/**
 * The refitted factor of each type over the resamples in which it is determined, ascending.
 *
 * @param design - the homes as rows (at least one)
 * @param settings - the generator's seed and the number of resamples
 * @returns one ascending array per type (in `design.typeIds` order), as long as the resamples
 *   that determined that type
 */
export function bootstrapFactors(
  design: Design,
  settings: { seed: number; resamples: number },
): Float64Array[] {
  const typeCount = design.typeIds.length;
  const factors = design.typeIds.map(() => new Float64Array(settings.resamples));
  const filled = new Int32Array(typeCount);
  const generator = new Xoshiro128StarStar();
  const counts = new Uint32Array(design.rows.length);
  const packed = packRows(design);
  for (let draw = 0; draw < settings.resamples; draw += 1) {
    drawCounts(generator, settings.seed, draw, counts);
    const fit = solveNnlsNormal(normalEquationsOfPacked(packed, counts));
    const undetermined = new Set(fit.undetermined);
    for (let column = 0; column < typeCount; column += 1) {
      if (undetermined.has(column)) continue;
      const place = filled[column] as number;
      (factors[column] as Float64Array)[place] = fit.solution[column] as number;
      filled[column] = place + 1;
    }
  }
  return factors.map((values, column) => values.slice(0, filled[column] as number).sort());
}

/**
 * The percentile interval of ascending refits at `level`: P((1 − level)/2) to
 * P((1 + level)/2) by Hyndman–Fan definition 7.
 *
 * @returns the interval, or null when there are no refits
 */
export function percentileInterval(sorted: Float64Array, level: number): FactorInterval | null {
  if (sorted.length === 0) return null;
  const tail = (1 - level) / 2;
  return { low: quantileSorted(sorted, tail), high: quantileSorted(sorted, 1 - tail), level };
}
