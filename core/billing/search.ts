/**
 * Golden-section search for the minimum of a function of one variable on an interval.
 */

/** (√5 − 1)/2, the share of the bracket kept at each step. */
const INVERSE_GOLDEN_RATIO = (Math.sqrt(5) - 1) / 2;

/**
 * The point of [low, high] where a unimodal function is least, to within a tolerance.
 *
 * @param objective - the function to minimize
 * @param low - the lower end of the bracket
 * @param high - the upper end (≥ low)
 * @param tolerance - the width of the final bracket, in the variable's unit (> 0)
 * @returns the middle of the final bracket
 *
 * Notes: each step drops the part of the bracket beyond the worse of two inner points at
 * the golden ratio, keeping the other inner point, so one new evaluation a step narrows the
 * bracket by 0.618. A function with several minima in the bracket gives one of them.
 *
 * References: W. H. Press et al., Numerical Recipes, 3rd ed., §10.2 (golden section search).
 */
export function goldenSectionMinimum(
  objective: (x: number) => number,
  low: number,
  high: number,
  tolerance: number,
): number {
  let a = low;
  let b = high;
  let c = b - INVERSE_GOLDEN_RATIO * (b - a);
  let d = a + INVERSE_GOLDEN_RATIO * (b - a);
  let fc = objective(c);
  let fd = objective(d);
  while (b - a > tolerance) {
    if (fc <= fd) {
      [b, d, fd] = [d, c, fc];
      c = b - INVERSE_GOLDEN_RATIO * (b - a);
      fc = objective(c);
    } else {
      [a, c, fc] = [c, d, fd];
      d = a + INVERSE_GOLDEN_RATIO * (b - a);
      fd = objective(d);
    }
  }
  return (a + b) / 2;
}
