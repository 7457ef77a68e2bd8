/**
 * Internal rate of return of a series of cash flows: the discount rate at which their net
 * present value is zero, found by a float64 scan and narrowing, then Decimal bisection.
 * Money in is decimal.js; the rate out is a Decimal, never rounded here.
 */
import Decimal from 'decimal.js';
import { readDecimal } from './present-value.ts';

/** Bisection stops when the bracket is narrower than this, fraction per period. */
const IRR_RATE_TOLERANCE = new Decimal('1e-12');

/** The float64 search narrows a bracket to this before Decimal takes over. */
const IRR_FLOAT_BRACKET_WIDTH = 1e-9;

/** Grid of rates searched for a change of sign: steps of 0.01, 0.1 and 1 up to 100. */
const IRR_SEARCH_RATES: readonly Decimal[] = buildSearchRates([
  { from: '-0.99', to: '1', step: '0.01' },
  { from: '1', to: '10', step: '0.1' },
  { from: '10', to: '100', step: '1' },
]);

const IRR_SEARCH_RATES_FLOAT: readonly number[] = IRR_SEARCH_RATES.map((rate) => rate.toNumber());

/** Indices i of the grid intervals [r_i, r_i+1], nearest zero first. */
const IRR_INTERVALS_NEAREST_ZERO: readonly number[] = IRR_SEARCH_RATES_FLOAT.slice(1)
  .map((high, index) => ({
    index,
    distance: Math.min(Math.abs(high), Math.abs(IRR_SEARCH_RATES_FLOAT[index] ?? 0)),
  }))
  .sort((a, b) => a.distance - b.distance || a.index - b.index)
  .map((interval) => interval.index);

function buildSearchRates(spans: readonly { from: string; to: string; step: string }[]): Decimal[] {
  const rates: Decimal[] = [];
  for (const span of spans) {
    const start =
      rates.length === 0 ? new Decimal(span.from) : new Decimal(span.from).plus(span.step);
    for (let rate = start; rate.lte(span.to); rate = rate.plus(span.step)) {
      rates.push(rate);
    }
  }
  return rates;
}

/** Σ c_k·(1 + r)^−k by Horner's rule in 1/(1 + r). */
function netPresentValueAt(cashFlows: readonly Decimal[], rate: Decimal): Decimal {
  const discount = new Decimal(1).div(rate.plus(1));
  let sum = new Decimal(0);
  for (let k = cashFlows.length - 1; k >= 0; k -= 1) {
    sum = sum.times(discount).plus(cashFlows[k] ?? 0);
  }
  return sum;
}

/** The same sum in float64, only to find and narrow brackets cheaply. */
function netPresentValueFloat(cashFlows: readonly number[], rate: number): number {
  const discount = 1 / (1 + rate);
  let sum = 0;
  for (let k = cashFlows.length - 1; k >= 0; k -= 1) {
    sum = sum * discount + (cashFlows[k] ?? 0);
  }
  return sum;
}

/**
 * Internal rate of return of yearly (or other periodic) cash flows.
 *
 * @param cashFlowsUsd - Cash flows, USD, the first at time 0 and one per period after it.
 * @returns IRR, fraction per period; null when the flows are not of both signs, or NPV does
 *   not change sign between −0.99 and 100 (no root searched there).
 *
 * @remarks
 * Notes: the rate r with Σ_{k=0..N} c_k·(1 + r)^−k = 0. Rates from −0.99 to 100 are scanned
 * in float64 for a change of sign of NPV (steps 0.01, 0.1, 1), the bracket is narrowed in
 * float64 to 1e-9, checked in Decimal, and bisected in Decimal until narrower than 1e-12; the
 * midpoint is returned, within 5e-13 of a root of the Decimal NPV. When the flows have
 * several roots, the one nearest zero is returned.
 *
 * With `options.toleranceRate` of 1e-9 or more (a rate only to be reported, say to four
 * decimals), the float64 narrowing alone finds the root to that width and no Decimal
 * bisection is done: the same root, a thousand times cheaper.
 *
 * References: 10 CFR 436.22 and NIST Handbook 135 (2020 edition), internal rate of return.
 */
export function internalRateOfReturn(
  cashFlowsUsd: readonly Decimal.Value[],
  options: { toleranceRate?: number } = {},
): Decimal | null {
  const toleranceRate = options.toleranceRate ?? 0;
  if (toleranceRate >= IRR_FLOAT_BRACKET_WIDTH) {
    return floatRoot(readFloatFlows(cashFlowsUsd), toleranceRate);
  }
  const cashFlows = cashFlowsUsd.map((flow, index) => readDecimal(`cashFlowsUsd[${index}]`, flow));
  const hasInflow = cashFlows.some((flow) => flow.isPositive() && !flow.isZero());
  const hasOutflow = cashFlows.some((flow) => flow.isNegative() && !flow.isZero());
  if (!hasInflow || !hasOutflow) {
    return null;
  }
  const floatFlows = cashFlows.map((flow) => flow.toNumber());
  const floatValues = IRR_SEARCH_RATES_FLOAT.map((rate) => netPresentValueFloat(floatFlows, rate));
  for (const index of IRR_INTERVALS_NEAREST_ZERO) {
    const lowValue = floatValues[index] ?? NaN;
    const highValue = floatValues[index + 1] ?? NaN;
    if (lowValue === 0 || highValue === 0 || lowValue < 0 !== highValue < 0) {
      // Float64 can misjudge the sign at a grid rate that is all but a root; the Decimal
      // change of sign is then in the interval next to it.
      for (const candidate of [index, index - 1, index + 1]) {
        const root = refineRoot(cashFlows, floatFlows, candidate);
        if (root) {
          return root;
        }
      }
    }
  }
  return null;
}

/** Cash flows as finite float64 numbers, each checked as `readDecimal` checks it. */
function readFloatFlows(cashFlowsUsd: readonly Decimal.Value[]): number[] {
  return cashFlowsUsd.map((flow, index) =>
    typeof flow === 'number' && Number.isFinite(flow)
      ? flow
      : readDecimal(`cashFlowsUsd[${index}]`, flow).toNumber(),
  );
}

/**
 * The root nearest zero found in float64 alone, to `toleranceRate`: grid intervals are
 * tried nearest zero first, and NPV is computed only at the grid rates they need.
 */
function floatRoot(floatFlows: readonly number[], toleranceRate: number): Decimal | null {
  if (!floatFlows.some((flow) => flow > 0) || !floatFlows.some((flow) => flow < 0)) return null;
  const values = new Map<number, number>();
  const valueAt = (index: number) => {
    let value = values.get(index);
    if (value === undefined) {
      value = netPresentValueFloat(floatFlows, IRR_SEARCH_RATES_FLOAT[index] ?? NaN);
      values.set(index, value);
    }
    return value;
  };
  for (const index of IRR_INTERVALS_NEAREST_ZERO) {
    const lowValue = valueAt(index);
    const highValue = valueAt(index + 1);
    let low = IRR_SEARCH_RATES_FLOAT[index] ?? NaN;
    let high = IRR_SEARCH_RATES_FLOAT[index + 1] ?? NaN;
    if (lowValue === 0) return new Decimal(low);
    if (highValue === 0) return new Decimal(high);
    if (lowValue < 0 === highValue < 0) continue;
    const lowIsNegative = lowValue < 0;
    while (high - low > toleranceRate) {
      const middle = (low + high) / 2;
      if (netPresentValueFloat(floatFlows, middle) < 0 === lowIsNegative) low = middle;
      else high = middle;
    }
    return new Decimal((low + high) / 2);
  }
  return null;
}

/** A root in grid interval `index` to 1e-12, or null when Decimal finds no sign change. */
function refineRoot(
  cashFlows: readonly Decimal[],
  floatFlows: readonly number[],
  index: number,
): Decimal | null {
  const low = IRR_SEARCH_RATES[index];
  const high = IRR_SEARCH_RATES[index + 1];
  if (!low || !high) {
    return null;
  }
  const lowValue = netPresentValueAt(cashFlows, low);
  const highValue = netPresentValueAt(cashFlows, high);
  if (lowValue.isZero() || highValue.isZero()) {
    return lowValue.isZero() ? low : high;
  }
  const lowIsNegative = lowValue.isNegative();
  if (lowIsNegative === highValue.isNegative()) {
    return null;
  }
  let floatLow = low.toNumber();
  let floatHigh = high.toNumber();
  while (floatHigh - floatLow > IRR_FLOAT_BRACKET_WIDTH) {
    const middle = (floatLow + floatHigh) / 2;
    if (netPresentValueFloat(floatFlows, middle) < 0 === lowIsNegative) {
      floatLow = middle;
    } else {
      floatHigh = middle;
    }
  }
  // Float64 may misjudge a sign within rounding of the root; keep the grid bracket then.
  const narrowLow = new Decimal(floatLow);
  const narrowHigh = new Decimal(floatHigh);
  const narrowHolds =
    netPresentValueAt(cashFlows, narrowLow).isNegative() === lowIsNegative &&
    netPresentValueAt(cashFlows, narrowHigh).isNegative() !== lowIsNegative;
  return bisect(
    cashFlows,
    narrowHolds ? narrowLow : low,
    narrowHolds ? narrowHigh : high,
    lowIsNegative,
  );
}

function bisect(
  cashFlows: readonly Decimal[],
  lowRate: Decimal,
  highRate: Decimal,
  lowIsNegative: boolean,
): Decimal {
  let low = lowRate;
  let high = highRate;
  while (high.minus(low).gte(IRR_RATE_TOLERANCE)) {
    const middle = low.plus(high).div(2);
    const value = netPresentValueAt(cashFlows, middle);
    if (value.isZero()) {
      return middle;
    }
    if (value.isNegative() === lowIsNegative) {
      low = middle;
    } else {
      high = middle;
    }
  }
  return low.plus(high).div(2);
}
