/**
 * Summaries of Monte Carlo samples: quantiles, means and histograms.
 *
 * A run needs only six order statistics of each figure (the two values around P10, P50 and
 * P90), so they are found without sorting every draw: one pass counts the values in 256
 * buckets by value (a distribution pass, as in bucket sort), a second copies out only the
 * values of the buckets that hold a wanted place, and each wanted place is then selected
 * within its bucket of a few values (Hoare's FIND). The values are those of a sorted
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
/** Values in each bucket, then (running sums) where each bucket ends among the sorted places. */
const bucketEnds = new Int32Array(BUCKETS);
/** Where a wanted bucket's values go in the work buffer; −1 for a bucket not wanted. */
const bucketCursor = new Int32Array(BUCKETS);
/** The sorted places wanted (the two around each probability's h) and their values. */
const wantedPlaces = new Int32Array(2 * SPREAD_PROBABILITIES.length);
const wantedValues = new Float64Array(2 * SPREAD_PROBABILITIES.length);

/** The bucket holding a sorted place: the first whose end (in `bucketEnds`) is past it. */
function bucketOfPlace(place: number): number {
  let low = 0;
  let high = BUCKETS - 1;
  while (low < high) {
    const middle = (low + high) >>> 1;
    if ((bucketEnds[middle] as number) <= place) low = middle + 1;
    else high = middle;
  }
  return low;
}

/**
 * The values at the sorted places in `wantedPlaces` (any order), into `wantedValues`, found
 * with a distribution pass: each value goes to one of 256 buckets by ⌊(x − min)·256/(max −
 * min)⌋, which never decreases as x grows, so bucket b holds exactly the values of the sorted
 * places its count spans. Only the buckets holding a wanted place (at most six) are copied
 * into `work`, and each place is then selected within its bucket.
 *
 * @returns false when the scale overflows (nothing found)
 */
function orderByBuckets(values: Float64Array, work: Float64Array, min: number, max: number) {
  const scale = BUCKETS / (max - min);
  if (!Number.isFinite(scale)) return false;
  const count = values.length;
  const ends = bucketEnds;
  const cursor = bucketCursor;
  const last = BUCKETS - 1;
  ends.fill(0);
  for (let index = 0; index < count; index += 1) {
    // (x − min)·scale is from 0 to about 256, so truncation is the floor.
    let bucket = (((values[index] as number) - min) * scale) | 0;
    if (bucket > last) bucket = last;
    ends[bucket] = (ends[bucket] as number) + 1;
  }
  for (let bucket = 1; bucket < BUCKETS; bucket += 1) {
    ends[bucket] = (ends[bucket] as number) + (ends[bucket - 1] as number);
  }
  // The wanted buckets, each given its stretch of `work` in turn.
  cursor.fill(-1);
  let used = 0;
  for (let wanted = 0; wanted < wantedPlaces.length; wanted += 1) {
    const bucket = bucketOfPlace(wantedPlaces[wanted] as number);
    if (cursor[bucket] === -1) {
      cursor[bucket] = used;
      used += (ends[bucket] as number) - (bucket === 0 ? 0 : (ends[bucket - 1] as number));
    }
  }
  for (let index = 0; index < count; index += 1) {
    const value = values[index] as number;
    let valueBucket = ((value - min) * scale) | 0;
    if (valueBucket > last) valueBucket = last;
    const at = cursor[valueBucket] as number;
    if (at !== -1) {
      work[at] = value;
      cursor[valueBucket] = at + 1;
    }
  }
  // Each wanted bucket's cursor has moved to its stretch's end.
  for (let wanted = 0; wanted < wantedPlaces.length; wanted += 1) {
    const place = wantedPlaces[wanted] as number;
    const bucket = bucketOfPlace(place);
    const first = bucket === 0 ? 0 : (ends[bucket - 1] as number);
    const stretchEnd = cursor[bucket] as number;
    const stretchStart = stretchEnd - ((ends[bucket] as number) - first);
    wantedValues[wanted] = selectInPlace(
      work,
      stretchStart,
      stretchEnd - 1,
      stretchStart + place - first,
    );
  }
  return true;
}

/**
 * The quantiles of `values` at the spread's probabilities into `out`, equal to
 * `quantileSorted` of a sorted copy. `work` is a buffer as long as `values`; `min` and `max`
 * are the values' extremes.
 */
function spreadBySelection(
  values: Float64Array,
  work: Float64Array,
  extremes: { min: number; max: number },
  out: FigureSpread,
): void {
  const { min, max } = extremes;
  const count = values.length;
  for (let index = 0; index < SPREAD_PROBABILITIES.length; index += 1) {
    const probability = SPREAD_PROBABILITIES[index] as number;
    requireQuantileInput(count, probability);
    const lower = Math.floor((count - 1) * probability);
    wantedPlaces[2 * index] = lower;
    wantedPlaces[2 * index + 1] = lower + 1 >= count ? lower : lower + 1;
  }
  if (min === max) {
    wantedValues.fill(min);
  } else if (!(
    Number.isFinite(min) &&
    Number.isFinite(max) &&
    orderByBuckets(values, work, min, max)
  )) {
    work.set(values);
    for (let wanted = 0; wanted < wantedPlaces.length; wanted += 1) {
      wantedValues[wanted] = selectInPlace(work, 0, count - 1, wantedPlaces[wanted] as number);
    }
  }
  for (let wanted = 0; wanted < wantedPlaces.length; wanted += 1) {
    if (wantedValues[wanted] === 0) {
      wantedValues[wanted] = zeroAt(values, wantedPlaces[wanted] as number);
    }
  }
  const quantile = (index: number) => {
    const position = (count - 1) * (SPREAD_PROBABILITIES[index] as number);
    const lower = Math.floor(position);
    const lowerValue = wantedValues[2 * index] as number;
    if (lower + 1 >= count) return lowerValue;
    return interpolate(position, lower, lowerValue, wantedValues[2 * index + 1] as number);
  };
  out.p10 = quantile(0);
  out.p50 = quantile(1);
  out.p90 = quantile(2);
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
  const spread: FigureSpread = { p10: 0, p50: 0, p90: 0, mean: sum / values.length };
  if (Number.isNaN(sum)) {
    // NaN draws (or infinities of both signs): a sorted copy puts NaN last, as before.
    work.set(values);
    work.sort();
    spread.p10 = quantileSorted(work, SPREAD_PROBABILITIES[0]);
    spread.p50 = quantileSorted(work, SPREAD_PROBABILITIES[1]);
    spread.p90 = quantileSorted(work, SPREAD_PROBABILITIES[2]);
  } else {
    spreadBySelection(values, work, { min, max }, spread);
  }
  return spread;
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
