/**
 * Measures of economic worth of an energy measure: net savings (NPV), savings-to-investment
 * ratio, adjusted internal rate of return, simple and discounted payback, and the cost of
 * saved energy; the plain internal rate of return is in internal-rate-of-return.ts. Money in
 * and out is decimal.js, never rounded here.
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
