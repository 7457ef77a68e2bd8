/**
 * The distributions of a low / likely / high estimate: PERT (a Beta distribution stretched
 * over [low, high]) and triangular, each sampled by its inverse CDF from one uniform number.
 *
 * PERT is sampled from a precomputed table of its standardized quantiles: 1,024 equal steps
 * of probability, each quantile found by Newton's method on the regularized incomplete beta
 * function, with linear interpolation between them. The table depends only on where the
 * likely value sits between low and high (to 12 significant digits), so measures whose ranges
 * have the same shape share one table; tables are kept in a bounded cache (a pure function of
 * their key, so the cache changes no result). Interpolating gives the exact probability of every step and a
 * uniform spread within it; the mean of the sampled distribution differs from the PERT mean
 * by less than 1e-4 of the range (checked in test/reference/distributions.test.ts).
 *
 * References (the citations from memory): PERT parameters α = 1 + 4(m − a)/(b − a),
 * β = 1 + 4(b − m)/(b − a) and mean (a + 4m + b)/6 (Malcolm, Roseboom, Clark & Fazar 1959,
 * Operations Research 7(5); the Beta form as in Vose, Risk Analysis); triangular inverse CDF
 * (Johnson, Kotz & Balakrishnan, Continuous Univariate Distributions vol. 2); incomplete beta
 * by its continued fraction with the modified Lentz method and log-gamma by Lanczos's
 * approximation (Press et al., Numerical Recipes, 3rd ed., §6.1 and §6.4). Checked in
 * test/reference/distributions.test.ts against formulajs (jstat) and the binomial sum.
 */
import { InputError } from '../errors.ts';
import type { Range } from '../schema.ts';

export const DISTRIBUTIONS = ['pert', 'triangular'] as const;
export type Distribution = (typeof DISTRIBUTIONS)[number];

/** Steps of probability in a PERT quantile table. */
export const PERT_TABLE_STEPS = 1024;

/** PERT's Beta shape parameters for a range. Null when the range is a point. */
export function pertShape(range: Range): { alpha: number; beta: number } | null {
  const width = range.high - range.low;
  if (!(width > 0)) return null;
  return {
    alpha: 1 + (4 * (range.likely - range.low)) / width,
    beta: 1 + (4 * (range.high - range.likely)) / width,
  };
}

/** PERT mean (a + 4m + b)/6. */
export function pertMean(range: Range): number {
  return (range.low + 4 * range.likely + range.high) / 6;
}

/** PERT variance: the Beta variance αβ/((α+β)²(α+β+1)) times (b − a)²; here α + β = 6. */
export function pertVariance(range: Range): number {
  const shape = pertShape(range);
  if (!shape) return 0;
  const width = range.high - range.low;
  const sum = shape.alpha + shape.beta;
  return ((shape.alpha * shape.beta) / (sum * sum * (sum + 1))) * width * width;
}

/** Triangular mean (a + c + b)/3. */
export function triangularMean(range: Range): number {
  return (range.low + range.likely + range.high) / 3;
}

/** Triangular variance (a² + b² + c² − ab − ac − bc)/18. */
export function triangularVariance(range: Range): number {
  const { low: a, likely: c, high: b } = range;
  return (a * a + b * b + c * c - a * b - a * c - b * c) / 18;
}

/**
 * The triangular inverse CDF.
 *
 * @param range - low a, likely c, high b (a ≤ c ≤ b)
 * @param fraction - u in [0, 1]
 * @returns x = a + √(u(b−a)(c−a)) for u < F_c, else b − √((1−u)(b−a)(b−c)), F_c = (c−a)/(b−a)
 */
export function triangularQuantile(range: Range, fraction: number): number {
  const { low, likely, high } = range;
  const width = high - low;
  if (!(width > 0)) return likely;
  if (fraction * width < likely - low) return low + Math.sqrt(fraction * width * (likely - low));
  return high - Math.sqrt((1 - fraction) * width * (high - likely));
}

/** Lanczos coefficients (g = 7, nine terms), as commonly tabulated for double precision. */
const LANCZOS_G = 7;
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
] as const;

/** ln Γ(x) for x > 0 by Lanczos's approximation (relative error about 1e-15). */
export function logGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let sum = LANCZOS[0];
  for (let index = 1; index < LANCZOS.length; index += 1) {
    sum += (LANCZOS[index] ?? 0) / (z + index);
  }
  const t = z + LANCZOS_G + 0.5;
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

const CF_TINY = 1e-300;
const CF_EPSILON = 1e-15;
const CF_MAX_ITERATIONS = 300;

/** The continued fraction of I_x(a, b), modified Lentz (Numerical Recipes `betacf`). */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < CF_TINY) d = CF_TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= CF_MAX_ITERATIONS; m += 1) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < CF_EPSILON) break;
  }
  return h;
}

/**
 * The regularized incomplete beta function I_x(a, b), the CDF of Beta(a, b) at x.
 *
 * @param x - in [0, 1]
 * @param a - shape α > 0
 * @param b - shape β > 0
 */
export function regularizedIncompleteBeta(x: number, a: number, b: number): number {
  return incompleteBetaWithNorm(x, a, b, logGamma(a + b) - logGamma(a) - logGamma(b));
}

/** I_x(a, b) given log(Γ(a+b)/(Γ(a)Γ(b))), so a table of quantiles works it out once. */
function incompleteBetaWithNorm(x: number, a: number, b: number, logNorm: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const logFront = logNorm + a * Math.log(x) + b * Math.log(1 - x);
  const front = Math.exp(logFront);
  // The fraction converges fast below the mean; above it, use I_x(a,b) = 1 − I_{1−x}(b,a).
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(x, a, b)) / a;
  return 1 - (front * betaContinuedFraction(1 - x, b, a)) / b;
}

/** Beta(a, b) density at x in (0, 1). */
function betaDensity(x: number, a: number, b: number, logNorm: number): number {
  return Math.exp(logNorm + (a - 1) * Math.log(x) + (b - 1) * Math.log(1 - x));
}

const NEWTON_STEPS = 60;
const QUANTILE_TOLERANCE = 1e-14;

/**
 * The quantiles of Beta(α, β) at 0, 1/steps, …, 1: Newton's method on I_x kept inside a
 * bisection bracket, each search starting from the quantile before it.
 */
export function betaQuantileTable(alpha: number, beta: number, steps: number): Float64Array {
  const table = new Float64Array(steps + 1);
  const logNorm = logGamma(alpha + beta) - logGamma(alpha) - logGamma(beta);
  table[0] = 0;
  table[steps] = 1;
  let previous = 0;
  for (let index = 1; index < steps; index += 1) {
    const target = index / steps;
    let lower = previous;
    let upper = 1;
    let x = previous > 0 ? previous : target;
    for (let step = 0; step < NEWTON_STEPS; step += 1) {
      const error = incompleteBetaWithNorm(x, alpha, beta, logNorm) - target;
      if (error > 0) upper = x;
      else lower = x;
      const density = betaDensity(x, alpha, beta, logNorm);
      let next = density > 0 ? x - error / density : Number.NaN;
      if (!(next > lower && next < upper)) next = (lower + upper) / 2;
      if (Math.abs(next - x) < QUANTILE_TOLERANCE || upper - lower < QUANTILE_TOLERANCE) {
        x = next;
        break;
      }
      x = next;
    }
    table[index] = x;
    previous = x;
  }
  return table;
}

/**
 * PERT quantile tables by the likely value's place in the range, to 12 significant digits: the
 * same shape of range computed from scaled numbers differs in the last bits, and a difference
 * of 1e-12 in the mode's place moves no quantile by more than about 1e-11 of the range. Bounded,
 * since keys come from user input; the oldest table goes first.
 */
const TABLE_CACHE = new Map<number, Float64Array>();
const TABLE_CACHE_LIMIT = 512;
const MODE_SHARE_DIGITS = 12;

/**
 * The standardized PERT quantile table (on [0, 1]) of ranges whose likely value sits at
 * `modeShare` = (m − a)/(b − a).
 */
export function pertQuantileTable(modeShare: number): Float64Array {
  const key = Number(modeShare.toPrecision(MODE_SHARE_DIGITS));
  let table = TABLE_CACHE.get(key);
  if (!table) {
    table = betaQuantileTable(1 + 4 * key, 1 + 4 * (1 - key), PERT_TABLE_STEPS);
    if (TABLE_CACHE.size >= TABLE_CACHE_LIMIT) {
      const oldest = TABLE_CACHE.keys().next();
      if (!oldest.done) TABLE_CACHE.delete(oldest.value);
    }
    TABLE_CACHE.set(key, table);
  }
  return table;
}

/**
 * A point of a quantile table at fraction u, interpolated linearly.
 *
 * @param table - quantiles at 0, 1/steps, …, 1
 * @param fraction - u in [0, 1)
 */
export function tableQuantile(table: Float64Array, fraction: number): number {
  const steps = table.length - 1;
  const position = fraction * steps;
  const index = Math.min(steps - 1, Math.floor(position));
  const lower = table[index] ?? 0;
  return lower + (position - index) * ((table[index + 1] ?? 1) - lower);
}

/**
 * The PERT inverse CDF of a range (table-based, see the module notes).
 *
 * @returns the point for a degenerate range (low = high)
 */
export function pertQuantile(range: Range, fraction: number): number {
  const width = range.high - range.low;
  if (!(width > 0)) return range.likely;
  const table = pertQuantileTable((range.likely - range.low) / width);
  return range.low + width * tableQuantile(table, fraction);
}

/** The inverse CDF of a range under a distribution. */
export function rangeQuantile(distribution: Distribution, range: Range, fraction: number): number {
  return distribution === 'pert'
    ? pertQuantile(range, fraction)
    : triangularQuantile(range, fraction);
}

/**
 * Checks a range is usable: finite, low ≤ likely ≤ high.
 *
 * @param path - the field to name in the error
 */
export function requireRange(path: string, range: Range): void {
  const { low, likely, high } = range;
  if (!isUsableRange(range)) {
    throw InputError.at(
      path,
      `expected finite numbers with low ≤ likely ≤ high, got ${low} / ${likely} / ${high}`,
    );
  }
}

/** True when a range is finite with low ≤ likely ≤ high (what `requireRange` asks). */
export function isUsableRange(range: Range): boolean {
  const { low, likely, high } = range;
  return (
    Number.isFinite(low) &&
    Number.isFinite(likely) &&
    Number.isFinite(high) &&
    low <= likely &&
    likely <= high
  );
}
