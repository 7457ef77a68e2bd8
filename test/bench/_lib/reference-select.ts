/**
 * The reference kernel's summary: P10, P50 and P90 of a figure's draws by selection, no sort.
 * A minimal one, as a bare kernel would write it: Hoare's FIND for the three lower places,
 * then a scan for the value just above each.
 *
 * References: C. A. R. Hoare, "Algorithm 65: Find", Communications of the ACM 4(7), 1961;
 * R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The American
 * Statistician 50(4), 1996, definition 7: x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋+1] − x[⌊h⌋]), h = (n − 1)·p.
 */

/**
 * Moves the k-th smallest of values[from..to] to place k, nothing larger before it and
 * nothing smaller after it (Hoare's FIND with a median-of-three pivot).
 */
function select(values: Float64Array, from: number, to: number, k: number): void {
  let low = from;
  let high = to;
  while (low < high) {
    let a = values[low]!;
    let b = values[(low + high) >>> 1]!;
    const c = values[high]!;
    if (a > b) {
      const swap = a;
      a = b;
      b = swap;
    }
    const pivot = c < a ? a : c > b ? b : c;
    let i = low;
    let j = high;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const swap = values[i]!;
        values[i++] = values[j]!;
        values[j--] = swap;
      }
    }
    if (k <= j) high = j;
    else if (k >= i) low = i;
    else return;
  }
}

/** The smallest of values[from..to]. */
function smallest(values: Float64Array, from: number, to: number): number {
  let least = values[from]!;
  for (let index = from + 1; index <= to; index++)
    if (values[index]! < least) least = values[index]!;
  return least;
}

/**
 * P10, P50 and P90 (definition 7) of values[0..count−1] into out[at..at+2]; reorders values.
 * The three lower places are selected (P50's first, then P10's below it and P90's above), so
 * the value after each lower place is the smallest of the stretch up to the next selected one.
 */
export function spreadBySelection(
  values: Float64Array,
  count: number,
  out: Float64Array,
  at: number,
) {
  const h10 = (count - 1) * 0.1;
  const h50 = (count - 1) * 0.5;
  const h90 = (count - 1) * 0.9;
  const l10 = Math.floor(h10);
  const l50 = Math.floor(h50);
  const l90 = Math.floor(h90);
  select(values, 0, count - 1, l50);
  if (l10 < l50) select(values, 0, l50 - 1, l10);
  if (l90 > l50) select(values, l50 + 1, count - 1, l90);
  const last = count - 1;
  const next = (place: number, selectedAbove: number) =>
    place + 1 > last ? values[place]! : smallest(values, place + 1, selectedAbove);
  const x10 = values[l10]!;
  const x50 = values[l50]!;
  const x90 = values[l90]!;
  const y10 = next(l10, l10 < l50 ? l50 : l90 > l50 ? l90 : last);
  const y50 = next(l50, l90 > l50 ? l90 : last);
  const y90 = next(l90, last);
  out[at] = l10 + 1 > last ? x10 : x10 + (h10 - l10) * (y10 - x10);
  out[at + 1] = l50 + 1 > last ? x50 : x50 + (h50 - l50) * (y50 - x50);
  out[at + 2] = l90 + 1 > last ? x90 : x90 + (h90 - l90) * (y90 - x90);
}
