/**
 * Measures of economic worth of an energy measure: net savings (NPV), savings-to-investment
 * ratio, adjusted and plain internal rate of return, simple and discounted payback, and the
 * cost of saved energy. Money in and out is decimal.js, never rounded here.
 */
import Decimal from 'decimal.js';
import {
  capitalRecoveryFactor,
  readDecimal,
  readNonNegative,
  readRate,
  readWholeNumber,
} from './present-value.ts';

/** Options shared by {@link netPresentValue} and {@link savingsToInvestmentRatio}. */
export interface SavingsAndInvestment {
  /** Present value of the measure's savings over its life, USD. */
  presentValueSavingsUsd: Decimal.Value;
  /** Present value of the investment (cost at time 0), USD, zero or more. */
  investmentUsd: Decimal.Value;
}

/**
 * Net savings (net present value) of a measure.
 *
 * @param options - PV of savings (USD) and investment (USD).
 * @returns NPV, USD; positive when the measure pays.
 *
 * @remarks
 * Notes: NPV = PV(savings) − PV(investment).
 *
 * References: 10 CFR 436.21 (net savings).
 */
export function netPresentValue(options: SavingsAndInvestment): Decimal {
  const savings = readDecimal('presentValueSavingsUsd', options.presentValueSavingsUsd);
  const investment = readNonNegative('investmentUsd', options.investmentUsd);
  return savings.minus(investment);
}

/**
 * Savings-to-investment ratio.
 *
 * @param options - PV of savings (USD) and investment (USD).
 * @returns SIR, dimensionless; null when the investment is zero (the ratio is undefined).
 *
 * @remarks
 * Notes: SIR = PV(savings) / PV(investment).
 *
 * References: 10 CFR 436.21 (savings-to-investment ratio).
 */
export function savingsToInvestmentRatio(options: SavingsAndInvestment): Decimal | null {
  const savings = readDecimal('presentValueSavingsUsd', options.presentValueSavingsUsd);
  const investment = readNonNegative('investmentUsd', options.investmentUsd);
  return investment.isZero() ? null : savings.div(investment);
}

/** Options of {@link adjustedInternalRateOfReturn}. */
export interface AdjustedRateOptions {
  /** Real discount rate at which savings are reinvested, fraction per year, above −1. */
  discountRateReal: Decimal.Value;
  /** Savings-to-investment ratio, dimensionless, or null when it is undefined. */
  sir: Decimal.Value | null;
  /** Study period, a whole number of years ≥ 1. */
  years: number;
}

/**
 * Adjusted internal rate of return: the yearly rate earned by the investment when its
 * savings are reinvested at the discount rate.
 *
 * @param options - Discount rate (fraction/yr), SIR, years.
 * @returns AIRR, fraction per year; null when SIR is null, zero or negative.
 *
 * @remarks
 * Notes: AIRR = (1 + d)·SIR^(1/n) − 1; AIRR > d exactly when SIR > 1.
 *
 * References: 10 CFR 436.22 (adjusted internal rate of return); NIST Handbook 135 (2020).
 */
export function adjustedInternalRateOfReturn(options: AdjustedRateOptions): Decimal | null {
  const discount = readRate('discountRateReal', options.discountRateReal);
  const count = readWholeNumber('years', options.years, 1);
  if (options.sir === null) {
    return null;
  }
  const ratio = readDecimal('sir', options.sir);
  if (!ratio.isPositive() || ratio.isZero()) {
    return null;
  }
  return discount
    .plus(1)
    .times(ratio.pow(new Decimal(1).div(count)))
    .minus(1);
}

/** Options of {@link simplePaybackYears}. */
export interface SimplePaybackOptions {
  /** Investment, USD, zero or more. */
  investmentUsd: Decimal.Value;
  /** Savings in the first year, USD per year. */
  firstYearSavingsUsd: Decimal.Value;
}

/**
 * Simple payback period.
 *
 * @param options - Investment (USD) and first-year savings (USD/yr).
 * @returns Payback, years; null when the savings are zero or negative (it never pays back).
 *
 * @remarks
 * Notes: SPB = investment / first-year savings.
 *
 * References: 10 CFR 436.23 (simple payback).
 */
export function simplePaybackYears(options: SimplePaybackOptions): Decimal | null {
  const investment = readNonNegative('investmentUsd', options.investmentUsd);
  const savings = readDecimal('firstYearSavingsUsd', options.firstYearSavingsUsd);
  if (!savings.isPositive() || savings.isZero()) {
    return null;
  }
  return investment.div(savings);
}

/** Options of {@link discountedPaybackYears}. */
export interface DiscountedPaybackOptions {
  /** Investment, USD, zero or more. */
  investmentUsd: Decimal.Value;
  /** Savings in the first year, USD per year; year k's are this × (1 + e)^(k − 1). */
  firstYearSavingsUsd: Decimal.Value;
  /** Real discount rate, fraction per year, above −1. */
  discountRateReal: Decimal.Value;
  /** Real escalation rate of the savings, fraction per year, above −1; 0 when omitted. */
  escalationRateReal?: Decimal.Value;
  /** Longest period searched, a whole number of years ≥ 1 (usually the measure's life). */
  maxYears: number;
}

/**
 * Discounted payback: years until the cumulative discounted savings reach the investment.
 *
 * @param options - Investment (USD), first-year savings (USD/yr), rates (fractions/yr),
 *   years searched.
 * @returns Payback, years (fractional); 0 for no investment; null when the savings never
 *   reach the investment within `maxYears`.
 *
 * @remarks
 * Notes: savings fall at the end of each year, PV_k = S·(1 + e)^(k−1)·(1 + d)^−k. With
 * k the first year whose cumulative sum C_k ≥ I, payback = (k − 1) + (I − C_{k−1})/PV_k:
 * the cumulative sum is taken as growing linearly within that year. The result lies in the
 * same year as a continuous discounted payback (as from NPER): at or after it when d > e
 * (the cumulative curve is concave), at or before it when d < e, equal when d = e = 0. With S = A·(1 + e) the stream
 * is the one valued by presentValueOfAnnualAmount with annualAmountUsd A.
 *
 * References: NIST Handbook 135 (2020 edition), discounted payback; 10 CFR 436.23.
 */
export function discountedPaybackYears(options: DiscountedPaybackOptions): Decimal | null {
  const investment = readNonNegative('investmentUsd', options.investmentUsd);
  const firstYearSavings = readDecimal('firstYearSavingsUsd', options.firstYearSavingsUsd);
  const discount = readRate('discountRateReal', options.discountRateReal);
  const escalation = readRate('escalationRateReal', options.escalationRateReal ?? 0);
  const maxYears = readWholeNumber('maxYears', options.maxYears, 1);
  if (investment.isZero()) {
    return new Decimal(0);
  }
  if (!firstYearSavings.isPositive() || firstYearSavings.isZero()) {
    return null;
  }
  const escalationFactor = escalation.plus(1);
  const discountFactor = discount.plus(1);
  let cumulative = new Decimal(0);
  let yearSavings = firstYearSavings;
  let discountToToday = new Decimal(1).div(discountFactor);
  for (let year = 1; year <= maxYears; year += 1) {
    const presentValue = yearSavings.times(discountToToday);
    const next = cumulative.plus(presentValue);
    if (next.gte(investment)) {
      return investment
        .minus(cumulative)
        .div(presentValue)
        .plus(year - 1);
    }
    cumulative = next;
    yearSavings = yearSavings.times(escalationFactor);
    discountToToday = discountToToday.div(discountFactor);
  }
  return null;
}

/** Options of {@link costOfSavedEnergy}. */
export interface CostOfSavedEnergyOptions {
  /** Investment, USD, zero or more. */
  investmentUsd: Decimal.Value;
  /** Real discount rate, fraction per year, above −1. */
  discountRateReal: Decimal.Value;
  /** Life of the measure, a whole number of years ≥ 1. */
  years: number;
  /** Energy saved per year, in whatever unit the caller reports (MMBtu, kWh, therms, ...). */
  annualEnergySaved: Decimal.Value;
}

/**
 * Cost of saved energy: the investment spread evenly over the life and divided by the energy
 * it saves each year.
 *
 * @param options - Investment (USD), discount rate (fraction/yr), years, energy saved per
 *   year (any energy unit per year).
 * @returns CCE, USD per unit of the energy passed in; null when the energy saved is zero or
 *   negative.
 *
 * @remarks
 * Notes: CCE = investment·CRF(d, n) / annual energy saved, CRF = d/(1 − (1 + d)^−n).
 *
 * References: Meier, Wright & Rosenfeld (1983), Supplying Energy Through Greater Efficiency.
 */
export function costOfSavedEnergy(options: CostOfSavedEnergyOptions): Decimal | null {
  const investment = readNonNegative('investmentUsd', options.investmentUsd);
  const energy = readDecimal('annualEnergySaved', options.annualEnergySaved);
  const recovery = capitalRecoveryFactor(options.discountRateReal, options.years);
  if (!energy.isPositive() || energy.isZero()) {
    return null;
  }
  return investment.times(recovery).div(energy);
}

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
 * References: 10 CFR 436.22 and NIST Handbook 135 (2020 edition), internal rate of return.
 */
export function internalRateOfReturn(cashFlowsUsd: readonly Decimal.Value[]): Decimal | null {
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
