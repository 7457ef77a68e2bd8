/**
 * Summaries of Monte Carlo samples: quantiles, means and histograms.
 *
 * References: R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The
 * American Statistician 50(4), 1996, definition 7 (the default of R and numpy, and Excel's
 * PERCENTILE.INC).
 */

/** P10, P50 and P90 (Hyndman–Fan definition 7) and the mean of a figure over the draws. */
export interface FigureSpread {
  p10: number;
  p50: number;
  p90: number;
  mean: number;
}

/** Equal-width bins from the smallest draw to the largest; the last bin is closed. */
export interface Histogram {
  /** bins + 1 edges, ascending. */
  edges: number[];
  counts: number[];
}

/**
 * The quantile of sorted values by Hyndman–Fan definition 7.
 *
 * @param sorted - ascending values (at least one)
 * @param probability - p in [0, 1]
 * @returns x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]), h = (n − 1)·p (0-based)
 */
export function quantileSorted(sorted: ArrayLike<number>, probability: number): number {
  const count = sorted.length;
  if (count === 0) throw new RangeError('quantile of no values');
  if (!(probability >= 0 && probability <= 1)) {
    throw new RangeError(`quantile: expected a probability from 0 to 1, got ${probability}`);
  }
  const position = (count - 1) * probability;
  const lower = Math.floor(position);
  const lowerValue = sorted[lower] ?? Number.NaN;
  if (lower + 1 >= count) return lowerValue;
  return lowerValue + (position - lower) * ((sorted[lower + 1] ?? Number.NaN) - lowerValue);
}

/** A buffer reused for sorted copies: a portfolio summarizes thousands of homes. */
let sortBuffer = new Float64Array(0);

/** P10 / P50 / P90 and mean of values (not changed: a sorted copy is used). */
export function spreadOf(values: Float64Array): FigureSpread {
  if (sortBuffer.length < values.length) sortBuffer = new Float64Array(values.length);
  const sorted = sortBuffer.subarray(0, values.length);
  sorted.set(values);
  sorted.sort();
  let sum = 0;
  for (let index = 0; index < values.length; index += 1) sum += values[index] ?? 0;
  return {
    p10: quantileSorted(sorted, 0.1),
    p50: quantileSorted(sorted, 0.5),
    p90: quantileSorted(sorted, 0.9),
    mean: sum / values.length,
  };
}

/**
 * Histogram of values in `bins` equal bins over [min, max]; a value on an inner edge goes to
 * the bin above it, the largest value to the last bin. All values equal: one bin [x, x].
 */
export function histogramOf(values: Float64Array, bins: number): Histogram {
  let min = Infinity;
  let max = -Infinity;
  for (let index = 0; index < values.length; index += 1) {
    const value = values[index] ?? 0;
    if (value < min) min = value;
    if (value > max) max = value;
  }
  if (values.length === 0) return { edges: [], counts: [] };
  if (!(max > min)) return { edges: [min, max], counts: [values.length] };
  const width = (max - min) / bins;
  const edges = Array.from({ length: bins + 1 }, (_, index) =>
    index === bins ? max : min + index * width,
  );
  const counts = new Array<number>(bins).fill(0);
  for (let index = 0; index < values.length; index += 1) {
    const bin = Math.min(bins - 1, Math.floor(((values[index] ?? 0) - min) / width));
    counts[bin] = (counts[bin] ?? 0) + 1;
  }
  return { edges, counts };
}
