/**
 * Summaries of Monte Carlo samples: quantiles, means and histograms.
 *
 * A run needs only six order statistics of each figure (the two values around P10, P50 and
 * P90), so they are found without sorting every draw: one pass lays the values out in 256
 * buckets by value (a distribution pass, as in bucket sort), and each wanted place is then
 * selected within its bucket of a few values (Hoare's FIND). The values are those of a sorted
 * copy, signed zeros included, in about a tenth of a sort's time for 1,000 draws. Values with
 * a NaN are sorted as before.
 *
 * References: R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The
 * American Statistician 50(4), 1996, definition 7 (the default of R and numpy, and Excel's
 * PERCENTILE.INC); C. A. R. Hoare, "Algorithm 65: Find", Communications of the ACM 4(7), 1961.
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

/** The probabilities of a spread, ascending. */
const SPREAD_PROBABILITIES = [0.1, 0.5, 0.9] as const;

function requireQuantileInput(count: number, probability: number): void {
  if (count === 0) throw new RangeError('quantile of no values');
  if (!(probability >= 0 && probability <= 1)) {
    throw new RangeError(`quantile: expected a probability from 0 to 1, got ${probability}`);
  }
}

/** x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]) from the two order statistics around h. */
function interpolate(position: number, lower: number, lowerValue: number, upperValue: number) {
  return lowerValue + (position - lower) * (upperValue - lowerValue);
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
  requireQuantileInput(count, probability);
  const position = (count - 1) * probability;
  const lower = Math.floor(position);
  const lowerValue = sorted[lower] ?? Number.NaN;
  if (lower + 1 >= count) return lowerValue;
  return interpolate(position, lower, lowerValue, sorted[lower + 1] ?? Number.NaN);
}

/**
 * Moves the k-th smallest of `values[from..to]` (0-based k, ends included) to index k, with
 * nothing larger before it and nothing smaller after it (Hoare's FIND).
 */
function selectInPlace(values: Float64Array, from: number, to: number, k: number): number {
  let low = from;
  let high = to;
  while (low < high) {
    const middle = (low + high) >>> 1;
    // The median of three as the pivot keeps sorted and reversed input linear.
    let a = values[low] as number;
    let b = values[middle] as number;
    const c = values[high] as number;
    if (a > b) [a, b] = [b, a];
    const pivot = c < a ? a : c > b ? b : c;
    let i = low;
    let j = high;
    while (i <= j) {
      while ((values[i] as number) < pivot) i += 1;
      while ((values[j] as number) > pivot) j -= 1;
      if (i <= j) {
        const swap = values[i] as number;
        values[i] = values[j] as number;
        values[j] = swap;
        i += 1;
        j -= 1;
      }
    }
    if (k <= j) high = j;
    else if (k >= i) low = i;
    else break;
  }
  return values[k] as number;
}

/**
 * A sorted copy puts −0 before +0; selection sees them as equal. Where a selected value is a
 * zero, the sign at its sorted place is the one a sort would give.
 */
function zeroAt(original: Float64Array, sortedIndex: number): number {
  let negatives = 0;
  let negativeZeros = 0;
  for (let index = 0; index < original.length; index += 1) {
    const value = original[index] as number;
    if (value < 0) negatives += 1;
    else if (value === 0 && Object.is(value, -0)) negativeZeros += 1;
  }
  return sortedIndex >= negatives && sortedIndex < negatives + negativeZeros ? -0 : 0;
}

/** Buckets of the distribution pass: a few values each for 1,000 draws. */
const BUCKETS = 256;

/** Buffers reused from run to run: a portfolio summarizes thousands of homes. */
let workBuffer = new Float64Array(0);
let bucketBuffer = new Uint16Array(0);
const bucketStarts = new Int32Array(BUCKETS + 1);

/**
 * Finds order statistics of `values` (finite, not all equal) with a distribution pass: each
 * value goes to one of 256 buckets by ⌊(x − min)·256/(max − min)⌋, which never decreases as x
 * grows, so bucket b holds exactly the values of the sorted places its count spans. The values
 * are laid out bucket by bucket in `work`, and a place is then selected within its bucket.
 *
 * @returns the function from a sorted place to its value, or null when the scale overflows
 */
function bucketedOrder(
  values: Float64Array,
  work: Float64Array,
  min: number,
  max: number,
): ((place: number) => number) | null {
  const scale = BUCKETS / (max - min);
  if (!Number.isFinite(scale)) return null;
  const count = values.length;
  if (bucketBuffer.length < count) bucketBuffer = new Uint16Array(count);
  const bucketOf = bucketBuffer;
  const starts = bucketStarts;
  starts.fill(0);
  const last = BUCKETS - 1;
  for (let index = 0; index < count; index += 1) {
    // (x − min)·scale is from 0 to about 256, so truncation is the floor.
    let bucket = (((values[index] as number) - min) * scale) | 0;
    if (bucket > last) bucket = last;
    bucketOf[index] = bucket;
    starts[bucket + 1] = (starts[bucket + 1] as number) + 1;
  }
  for (let bucket = 1; bucket <= BUCKETS; bucket += 1) {
    starts[bucket] = (starts[bucket] as number) + (starts[bucket - 1] as number);
  }
  // Lay the values out bucket by bucket: `starts[b]` walks from bucket b's first place.
  for (let index = 0; index < count; index += 1) {
    const bucket = bucketOf[index] as number;
    const place = starts[bucket] as number;
    work[place] = values[index] as number;
    starts[bucket] = place + 1;
  }
  // Each start has moved to the next bucket's: bucket b now spans [starts[b−1], starts[b]).
  return (place) => {
    // The first bucket whose end is past the place: a binary search of the ends.
    let low = 0;
    let high = last;
    while (low < high) {
      const middle = (low + high) >>> 1;
      if ((starts[middle] as number) <= place) low = middle + 1;
      else high = middle;
    }
    const first = low === 0 ? 0 : (starts[low - 1] as number);
    return selectInPlace(work, first, (starts[low] as number) - 1, place);
  };
}

/**
 * The quantiles of `values` at the probabilities, equal to `quantileSorted` of a sorted copy.
 * `work` is a buffer as long as `values`; `min` and `max` are the values' extremes.
 */
function quantilesBySelection(
  values: Float64Array,
  work: Float64Array,
  extremes: { min: number; max: number },
  probabilities: readonly number[],
): number[] {
  const { min, max } = extremes;
  const count = values.length;
  let order: (place: number) => number;
  if (min === max) {
    order = () => min;
  } else {
    const bucketed =
      Number.isFinite(min) && Number.isFinite(max) ? bucketedOrder(values, work, min, max) : null;
    if (bucketed) {
      order = bucketed;
    } else {
      work.set(values);
      order = (place) => selectInPlace(work, 0, count - 1, place);
    }
  }
  const valueAt = (place: number): number => {
    const value = order(place);
    return value === 0 ? zeroAt(values, place) : value;
  };
  return probabilities.map((probability) => {
    requireQuantileInput(count, probability);
    const position = (count - 1) * probability;
    const lower = Math.floor(position);
    const lowerValue = valueAt(lower);
    if (lower + 1 >= count) return lowerValue;
    return interpolate(position, lower, lowerValue, valueAt(lower + 1));
  });
}

/** P10 / P50 / P90 and mean of values (not changed). */
export function spreadOf(values: Float64Array): FigureSpread {
  if (workBuffer.length < values.length) workBuffer = new Float64Array(values.length);
  const work = workBuffer.subarray(0, values.length);
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let index = 0; index < values.length; index += 1) {
    const value = values[index] as number;
    sum += value;
    if (value < min) min = value;
    if (value > max) max = value;
  }
  let quantiles: number[];
  if (Number.isNaN(sum)) {
    // NaN draws (or infinities of both signs): a sorted copy puts NaN last, as before.
    work.set(values);
    work.sort();
    quantiles = SPREAD_PROBABILITIES.map((probability) => quantileSorted(work, probability));
  } else {
    quantiles = quantilesBySelection(values, work, { min, max }, SPREAD_PROBABILITIES);
  }
  return {
    p10: quantiles[0] as number,
    p50: quantiles[1] as number,
    p90: quantiles[2] as number,
    mean: sum / values.length,
  };
}

/**
 * Histogram of values in `bins` equal bins over [min, max]; a value on an inner edge goes to
 * the bin above it, the largest value to the last bin. All values equal: one bin [x, x].
 * No bins asked for (0): no edges and no counts.
 */
export function histogramOf(values: Float64Array, bins: number): Histogram {
  if (bins === 0) return { edges: [], counts: [] };
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
