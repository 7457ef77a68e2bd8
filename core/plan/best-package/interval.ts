/**
 * Interval arithmetic with first derivatives, for the AIM-2 bound (aim2-box.ts): each quantity
 * is an interval holding every value it takes over a box of leak shares, with an interval for
 * each of its partial derivatives (by the ceiling, floor and flue shares) holding every value
 * those take there.
 *
 * Why each rule holds (the fundamental property of interval arithmetic: an operation on
 * intervals that holds every result of the operation on their members keeps holding through
 * any composition).
 * - a + b, a − b, k·a, a·b: by the end points (a product is extreme at a corner); 0·∞ is taken
 *   as 0, the limit a bounded interval reaches, so an infinite end only spreads where a
 *   non-zero member meets it.
 * - a / b: a·[1/b.hi, 1/b.lo] for b > 0; anything else is refused (null), never guessed.
 * - a^p (constant p, a ≥ 0): monotone in a (rising for p > 0, falling for p < 0), so its end
 *   points; 0^p for p < 0 is +∞. Its derivative p·a^(p−1)·a′ by the same rule.
 * - a² for any a: 0 when a holds 0, else the squares of the end points.
 * - min(a, b), |a|: the value by monotonicity; the derivative, where the function has one, is
 *   that of the branch in force, so it lies in the hull of the branches' derivative intervals
 *   when either may be in force (one branch alone when the intervals do not overlap).
 * - b^e for b in [0, 1], e > 0 (aim2-box.ts's ceiling-share power): rising in b, falling in e,
 *   so [b.lo^e.hi, b.hi^e.lo]; its derivatives e·b^(e−1) (b^t is monotone in b and in t on
 *   each side of t = 0, so extreme at the corners of each side) and b^e·ln b (rising in e for
 *   b < 1; in b falling to its least at b = exp(−1/e), then rising: least at e.lo and the
 *   clamped turning point, most at e.hi and an end point; 0 at b = 0 and b = 1).
 * Float rounding is not directed; the callers widen every result by a relative margin.
 */

/** Every value a quantity takes over a box. */
export interface Interval {
  lo: number;
  hi: number;
}

/** A quantity over a box and its derivatives by the box's variables (ceiling, floor, flue). */
export interface Dual {
  v: Interval;
  d: [Interval, Interval, Interval];
}

const ZERO: Interval = { lo: 0, hi: 0 };

function product(a: number, b: number): number {
  const p = a * b;
  return Number.isNaN(p) ? 0 : p;
}

export function iAdd(a: Interval, b: Interval): Interval {
  return { lo: a.lo + b.lo, hi: a.hi + b.hi };
}

export function iSub(a: Interval, b: Interval): Interval {
  return { lo: a.lo - b.hi, hi: a.hi - b.lo };
}

export function iScale(a: Interval, k: number): Interval {
  return k >= 0
    ? { lo: product(k, a.lo), hi: product(k, a.hi) }
    : { lo: product(k, a.hi), hi: product(k, a.lo) };
}

export function iMul(a: Interval, b: Interval): Interval {
  const p1 = product(a.lo, b.lo);
  const p2 = product(a.lo, b.hi);
  const p3 = product(a.hi, b.lo);
  const p4 = product(a.hi, b.hi);
  return { lo: Math.min(p1, p2, p3, p4), hi: Math.max(p1, p2, p3, p4) };
}

function hull(a: Interval, b: Interval): Interval {
  return { lo: Math.min(a.lo, b.lo), hi: Math.max(a.hi, b.hi) };
}

/** a^p for a ≥ 0 and a constant p; null when a reaches below 0. */
export function iPow(a: Interval, p: number): Interval | null {
  if (!(a.lo >= 0)) return null;
  if (p === 0) return { lo: 1, hi: 1 };
  const atLo = a.lo ** p;
  const atHi = a.hi ** p;
  return p > 0 ? { lo: atLo, hi: atHi } : { lo: atHi, hi: atLo };
}

export function constant(value: number): Dual {
  return { v: { lo: value, hi: value }, d: [ZERO, ZERO, ZERO] };
}

/** The box's variable `index` (0 ceiling, 1 floor, 2 flue share) over [lo, hi]. */
export function variable(index: 0 | 1 | 2, range: Interval): Dual {
  const one: Interval = { lo: 1, hi: 1 };
  return {
    v: range,
    d: [index === 0 ? one : ZERO, index === 1 ? one : ZERO, index === 2 ? one : ZERO],
  };
}

export function add(a: Dual, b: Dual): Dual {
  return {
    v: iAdd(a.v, b.v),
    d: [iAdd(a.d[0], b.d[0]), iAdd(a.d[1], b.d[1]), iAdd(a.d[2], b.d[2])],
  };
}

export function sub(a: Dual, b: Dual): Dual {
  return {
    v: iSub(a.v, b.v),
    d: [iSub(a.d[0], b.d[0]), iSub(a.d[1], b.d[1]), iSub(a.d[2], b.d[2])],
  };
}

export function scale(a: Dual, k: number): Dual {
  return { v: iScale(a.v, k), d: [iScale(a.d[0], k), iScale(a.d[1], k), iScale(a.d[2], k)] };
}

export function plus(a: Dual, k: number): Dual {
  return { v: { lo: a.v.lo + k, hi: a.v.hi + k }, d: a.d };
}

/** (a·b)′ = a′·b + a·b′ for each derivative. */
function productRule(aPart: Interval, b: Interval, a: Interval, bPart: Interval): Interval {
  return iAdd(iMul(aPart, b), iMul(a, bPart));
}

export function mul(a: Dual, b: Dual): Dual {
  return {
    v: iMul(a.v, b.v),
    d: [
      productRule(a.d[0], b.v, a.v, b.d[0]),
      productRule(a.d[1], b.v, a.v, b.d[1]),
      productRule(a.d[2], b.v, a.v, b.d[2]),
    ],
  };
}

/**
 * a·r for r a range constant over the box (known only to lie in r, with no derivative): the
 * product rule with r′ = 0, whose terms a·[0, 0] are [0, 0] (`product` takes 0·∞ as 0).
 */
export function mulByRange(a: Dual, r: Interval): Dual {
  return { v: iMul(a.v, r), d: [iMul(a.d[0], r), iMul(a.d[1], r), iMul(a.d[2], r)] };
}

/** a / b for b > 0 over the box; null otherwise. */
export function div(a: Dual, b: Dual): Dual | null {
  if (!(b.v.lo > 0)) return null;
  const inverse: Interval = { lo: 1 / b.v.hi, hi: 1 / b.v.lo };
  const quotient = iMul(a.v, inverse);
  const aOverB2 = iMul(a.v, iMul(inverse, inverse));
  const part = (aPart: Interval, bPart: Interval) =>
    iSub(iMul(aPart, inverse), iMul(aOverB2, bPart));
  return { v: quotient, d: [part(a.d[0], b.d[0]), part(a.d[1], b.d[1]), part(a.d[2], b.d[2])] };
}

/** a^p for a constant p and a ≥ 0; null when a reaches below 0. */
export function pow(a: Dual, p: number): Dual | null {
  const value = iPow(a.v, p);
  const slope = iPow(a.v, p - 1);
  if (value === null || slope === null) return null;
  const factor = iScale(slope, p);
  return { v: value, d: [iMul(factor, a.d[0]), iMul(factor, a.d[1]), iMul(factor, a.d[2])] };
}

export function square(a: Dual): Dual {
  const lo2 = a.v.lo * a.v.lo;
  const hi2 = a.v.hi * a.v.hi;
  const v: Interval =
    a.v.lo <= 0 && a.v.hi >= 0
      ? { lo: 0, hi: Math.max(lo2, hi2) }
      : { lo: Math.min(lo2, hi2), hi: Math.max(lo2, hi2) };
  const twice = iScale(a.v, 2);
  return { v, d: [iMul(twice, a.d[0]), iMul(twice, a.d[1]), iMul(twice, a.d[2])] };
}

export function min(a: Dual, b: Dual): Dual {
  const v: Interval = { lo: Math.min(a.v.lo, b.v.lo), hi: Math.min(a.v.hi, b.v.hi) };
  if (a.v.hi <= b.v.lo) return { v, d: a.d };
  if (b.v.hi <= a.v.lo) return { v, d: b.d };
  return { v, d: [hull(a.d[0], b.d[0]), hull(a.d[1], b.d[1]), hull(a.d[2], b.d[2])] };
}

export function abs(a: Dual): Dual {
  if (a.v.lo >= 0) return a;
  if (a.v.hi <= 0) return scale(a, -1);
  const v: Interval = { lo: 0, hi: Math.max(-a.v.lo, a.v.hi) };
  const either = (part: Interval) => hull(part, iScale(part, -1));
  return { v, d: [either(a.d[0]), either(a.d[1]), either(a.d[2])] };
}

/** b^t at b = 0: 1 for t = 0, 0 above, +∞ below. */
function powAt(b: number, t: number): number {
  if (b === 0) return t === 0 ? 1 : t > 0 ? 0 : Infinity;
  return b ** t;
}

/** b^e·ln b, 0 at b = 0. */
function powLog(b: number, e: number): number {
  return b === 0 ? 0 : b ** e * Math.log(b);
}

/** b^e for b in [0, 1] and e > 0 over the box; null outside that domain. */
export function powInUnit(base: Dual, exponent: Dual): Dual | null {
  const b = base.v;
  const e = exponent.v;
  if (!(b.lo >= 0 && b.hi <= 1 && e.lo > 0)) return null;
  const value: Interval = { lo: powAt(b.lo, e.hi), hi: powAt(b.hi, e.lo) };
  // b^(e−1) at the corners of each side of e − 1 = 0.
  const tLo = e.lo - 1;
  const tHi = e.hi - 1;
  const corners = [powAt(b.lo, tLo), powAt(b.lo, tHi), powAt(b.hi, tLo), powAt(b.hi, tHi)];
  if (tLo < 0 && tHi > 0) corners.push(1);
  const powerBelow: Interval = { lo: Math.min(...corners), hi: Math.max(...corners) };
  const byBase = iMul(e, powerBelow);
  const turning = Math.min(b.hi, Math.max(b.lo, Math.exp(-1 / e.lo)));
  const byExponent: Interval = {
    lo: Math.min(powLog(turning, e.lo), 0),
    hi: Math.max(powLog(b.lo, e.hi), powLog(b.hi, e.hi)),
  };
  const part = (basePart: Interval, exponentPart: Interval) =>
    iAdd(iMul(byBase, basePart), iMul(byExponent, exponentPart));
  return {
    v: value,
    d: [
      part(base.d[0], exponent.d[0]),
      part(base.d[1], exponent.d[1]),
      part(base.d[2], exponent.d[2]),
    ],
  };
}
