/**
 * Weighted least squares of a straight line, y = a + b·x, with the statistics a billing fit
 * reports. A float64 kernel: the search over base temperatures calls it many times.
 */

/** A straight line fitted to weighted points, with how well the points pin it down. */
export interface LineFit {
  /** a, in y's unit. */
  intercept: number;
  /** b, in y's unit per x's unit. */
  slope: number;
  /** Σ wᵢ·(yᵢ − a − b·xᵢ)², the weighted residual sum of squares. */
  residualSumOfSquares: number;
  /** Σ wᵢ·(yᵢ − ȳ)², ȳ the weighted mean. */
  totalSumOfSquares: number;
  /** 1 − SSE/SST; null when every y is the same (nothing to explain). */
  rSquared: number | null;
  /** Standard error of a; null without a spare degree of freedom or without spread in x. */
  standardErrorIntercept: number | null;
  /** Standard error of b; null likewise. */
  standardErrorSlope: number | null;
}

/**
 * Fits y = a + b·x by weighted least squares.
 *
 * @param xs - the x of each point
 * @param ys - the y of each point (same length)
 * @param weights - each point's weight, > 0 (all 1 for ordinary least squares)
 * @returns a, b, the sums of squares, R² and the standard errors of a and b
 *
 * Notes: with W = Σw, x̄ = Σw·x/W, ȳ = Σw·y/W, Sxx = Σw(x − x̄)², Sxy = Σw(x − x̄)(y − ȳ):
 * b = Sxy/Sxx, a = ȳ − b·x̄. With s² = SSE/(n − 2), the weights read as relative precisions:
 * SE(b) = s/√Sxx, SE(a) = s·√(1/W + x̄²/Sxx). When every x is the same (Sxx = 0) the line is
 * flat at ȳ (b = 0), which is what the data can say. Integer weights give the same a, b and
 * R² as ordinary least squares on each point repeated w times.
 *
 * References: N. R. Draper and H. Smith, Applied Regression Analysis, 3rd ed., Wiley 1998,
 * ch. 9 (weighted least squares).
 */
export function weightedLineFit(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  weights: ArrayLike<number>,
): LineFit {
  const count = xs.length;
  let weightSum = 0;
  let sumX = 0;
  let sumY = 0;
  for (let i = 0; i < count; i++) {
    const w = weights[i] ?? 0;
    weightSum += w;
    sumX += w * (xs[i] ?? 0);
    sumY += w * (ys[i] ?? 0);
  }
  const meanX = sumX / weightSum;
  const meanY = sumY / weightSum;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < count; i++) {
    const w = weights[i] ?? 0;
    const dx = (xs[i] ?? 0) - meanX;
    const dy = (ys[i] ?? 0) - meanY;
    sxx += w * dx * dx;
    sxy += w * dx * dy;
    syy += w * dy * dy;
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  const intercept = meanY - slope * meanX;
  let sse = 0;
  for (let i = 0; i < count; i++) {
    const residual = (ys[i] ?? 0) - intercept - slope * (xs[i] ?? 0);
    sse += (weights[i] ?? 0) * residual * residual;
  }
  const degreesOfFreedom = count - 2;
  const s = degreesOfFreedom > 0 ? Math.sqrt(sse / degreesOfFreedom) : null;
  const known = s !== null && sxx > 0;
  return {
    intercept,
    slope,
    residualSumOfSquares: sse,
    totalSumOfSquares: syy,
    rSquared: syy > 0 ? 1 - sse / syy : null,
    standardErrorIntercept: known ? s * Math.sqrt(1 / weightSum + (meanX * meanX) / sxx) : null,
    standardErrorSlope: known ? s / Math.sqrt(sxx) : null,
  };
}
