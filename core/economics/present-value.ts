/**
 * Present-value factors of life-cycle cost analysis: single and uniform present value, the
 * uniform factor for an amount that escalates at a constant real rate, the capital recovery
 * factor, and the conversion of a nominal discount rate to a real one.
 *
 * All arithmetic is in decimal.js at its default configuration (20 significant digits). Each
 * module in this folder reads its inputs through the `read*` helpers here, so a bad input is
 * reported the same way everywhere.
 */
import Decimal from 'decimal.js';
import { InputError } from '../errors.ts';

/**
 * Below this gap between discount and escalation rate, the closed form of the uniform factor
 * loses digits to cancellation (its relative error grows like 1e-20 / gap at 20 significant
 * digits), so the series is summed year by year instead; at 1e-4 both ways agree to ~1e-16.
 */
const CLOSED_FORM_MIN_RATE_GAP = new Decimal('1e-4');

/**
 * Reads a number, numeric string or Decimal as a finite Decimal.
 *
 * @param path - Name of the option, used in the error (e.g. `investmentUsd`).
 * @param value - The input, in the option's own unit.
 * @returns The value as a Decimal, same unit.
 * @throws InputError when the value is not a finite number.
 */
export function readDecimal(path: string, value: Decimal.Value): Decimal {
  let parsed: Decimal;
  try {
    parsed = new Decimal(value);
  } catch {
    throw InputError.at(path, `expected a finite number, got ${String(value)}`);
  }
  if (!parsed.isFinite()) {
    throw InputError.at(path, `expected a finite number, got ${String(value)}`);
  }
  return parsed;
}

/**
 * Reads a rate given as a fraction per period (0.03 for 3 %); it must be above −1, since a
 * rate of −100 % or less has no present value.
 *
 * @param path - Name of the option, used in the error (e.g. `discountRateReal`).
 * @param value - The rate, fraction per period.
 * @returns The rate as a Decimal, fraction per period.
 * @throws InputError when the rate is not finite or is −1 or less.
 */
export function readRate(path: string, value: Decimal.Value): Decimal {
  const rate = readDecimal(path, value);
  if (rate.lte(-1)) {
    throw InputError.at(
      path,
      `expected a rate above -1 (a fraction per period, e.g. 0.03 for 3 %), got ${rate.toString()}`,
    );
  }
  return rate;
}

/**
 * Reads an amount that may not be negative.
 *
 * @param path - Name of the option, used in the error (e.g. `investmentUsd`).
 * @param value - The amount, in the option's own unit (USD for money).
 * @returns The amount as a Decimal, same unit.
 * @throws InputError when the amount is not finite or is negative.
 */
export function readNonNegative(path: string, value: Decimal.Value): Decimal {
  const amount = readDecimal(path, value);
  if (amount.isNegative() && !amount.isZero()) {
    throw InputError.at(path, `expected zero or more, got ${amount.toString()}`);
  }
  return amount;
}

/**
 * Reads a whole count of periods (years or months).
 *
 * @param path - Name of the option, used in the error (e.g. `years`).
 * @param value - The count, periods.
 * @param minimum - The smallest count allowed, periods.
 * @returns The count, periods.
 * @throws InputError when the count is not a whole number at least `minimum`.
 */
export function readWholeNumber(path: string, value: number, minimum: number): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < minimum) {
    throw InputError.at(
      path,
      `expected a whole number of at least ${minimum}, got ${String(value)}`,
    );
  }
  return value;
}

/** Σ_{k=1..n} ratio^k summed year by year (Horner), exact when ratio = 1. */
function sumOfPowers(ratio: Decimal, years: number): Decimal {
  let sum = new Decimal(0);
  for (let year = 0; year < years; year += 1) {
    sum = sum.plus(1).times(ratio);
  }
  return sum;
}

/** UPV* once the inputs are read; UPV is the case e = 0. */
function escalatedFactor(
  discountRateReal: Decimal,
  escalationRateReal: Decimal,
  years: number,
): Decimal {
  const rateGap = discountRateReal.minus(escalationRateReal);
  const ratio = escalationRateReal.plus(1).div(discountRateReal.plus(1));
  if (rateGap.abs().lt(CLOSED_FORM_MIN_RATE_GAP)) {
    return sumOfPowers(ratio, years);
  }
  return escalationRateReal
    .plus(1)
    .div(rateGap)
    .times(new Decimal(1).minus(ratio.pow(years)));
}

/**
 * Single present value factor: what one dollar received `years` from now is worth today.
 *
 * @param discountRateReal - Real discount rate, fraction per year (0.03 for 3 %), above −1.
 * @param years - Years from now, a whole number ≥ 1.
 * @returns SPV, dimensionless (USD today per USD in year t).
 *
 * @remarks
 * Notes: SPV = (1 + d)^−t.
 *
 * References: NIST Handbook 135 (2020 edition), Life-Cycle Costing Manual for the Federal
 * Energy Management Program, discounting formulas; ASTM E917.
 */
export function singlePresentValueFactor(discountRateReal: Decimal.Value, years: number): Decimal {
  const rate = readRate('discountRateReal', discountRateReal);
  const count = readWholeNumber('years', years, 1);
  return rate.plus(1).pow(-count);
}

/**
 * Uniform present value factor: today's worth of one dollar a year at the end of each of
 * `years` years.
 *
 * @param discountRateReal - Real discount rate, fraction per year, above −1.
 * @param years - Number of yearly amounts, a whole number ≥ 1.
 * @returns UPV, years (USD today per USD a year).
 *
 * @remarks
 * Notes: UPV = (1 − (1 + d)^−n) / d, and UPV = n when d = 0. Near d = 0 the equal sum
 * Σ_{k=1..n} (1 + d)^−k is taken instead, so the factor is continuous there.
 *
 * References: NIST Handbook 135 (2020 edition), discounting formulas; ASTM E917.
 */
export function uniformPresentValueFactor(discountRateReal: Decimal.Value, years: number): Decimal {
  const rate = readRate('discountRateReal', discountRateReal);
  const count = readWholeNumber('years', years, 1);
  return escalatedFactor(rate, new Decimal(0), count);
}

/** Options of {@link escalatedUniformPresentValueFactor}. */
export interface EscalatedFactorOptions {
  /** Real discount rate, fraction per year, above −1. */
  discountRateReal: Decimal.Value;
  /** Real escalation rate of the yearly amount, fraction per year, above −1. */
  escalationRateReal: Decimal.Value;
  /** Number of yearly amounts, a whole number ≥ 1. */
  years: number;
}

/**
 * Modified uniform present value factor: today's worth of an amount of one dollar a year at
 * base-year prices that escalates at a constant real rate, paid at the end of each year.
 *
 * @param options - Discount rate (fraction/yr), escalation rate (fraction/yr), years.
 * @returns UPV*, years (USD today per USD a year at base-year prices).
 *
 * @remarks
 * Notes: UPV* = ((1 + e)/(d − e))·(1 − ((1 + e)/(1 + d))^n), and UPV* = n when e = d.
 * Year k's amount is (1 + e)^k at base-year prices, so the first year's is already escalated
 * once. When |d − e| < 1e-4 the equal sum Σ_{k=1..n} ((1 + e)/(1 + d))^k is taken instead of
 * the closed form, which would lose digits to cancellation; at e = d it gives n exactly.
 *
 * References: NIST Handbook 135 (2020 edition), the UPV* factor; ASTM E917.
 */
export function escalatedUniformPresentValueFactor(options: EscalatedFactorOptions): Decimal {
  const discount = readRate('discountRateReal', options.discountRateReal);
  const escalation = readRate('escalationRateReal', options.escalationRateReal);
  const count = readWholeNumber('years', options.years, 1);
  return escalatedFactor(discount, escalation, count);
}

/** Options of {@link realDiscountRate}. */
export interface RealDiscountRateOptions {
  /** Nominal discount rate (including inflation), fraction per year, above −1. */
  nominalRate: Decimal.Value;
  /** General inflation rate, fraction per year, above −1. */
  inflationRate: Decimal.Value;
}

/**
 * Real discount rate from a nominal one and the inflation rate.
 *
 * @param options - Nominal rate and inflation rate, fractions per year.
 * @returns Real discount rate, fraction per year.
 *
 * @remarks
 * Notes: d = (1 + D)/(1 + I) − 1.
 *
 * References: NIST Handbook 135 (2020 edition), real and nominal discount rates.
 */
export function realDiscountRate(options: RealDiscountRateOptions): Decimal {
  const nominal = readRate('nominalRate', options.nominalRate);
  const inflation = readRate('inflationRate', options.inflationRate);
  return nominal.plus(1).div(inflation.plus(1)).minus(1);
}

/** Options of {@link presentValueOfAnnualAmount}. */
export interface AnnualAmountOptions {
  /** Yearly amount at base-year (today's) prices, USD per year. */
  annualAmountUsd: Decimal.Value;
  /** Real discount rate, fraction per year, above −1. */
  discountRateReal: Decimal.Value;
  /** Real escalation rate of the amount, fraction per year, above −1; 0 when omitted. */
  escalationRateReal?: Decimal.Value;
  /** Number of yearly amounts, a whole number ≥ 1. */
  years: number;
}

/**
 * Present value of a yearly amount (savings or costs) over a number of years, not rounded.
 *
 * @param options - Amount (USD/yr at base-year prices), rates (fractions/yr), years.
 * @returns Present value, USD.
 *
 * @remarks
 * Notes: PV = A·UPV*(d, e, n), which is A·UPV(d, n) when e = 0. Year k's amount is
 * A·(1 + e)^k, so a first-year amount S corresponds to A = S/(1 + e).
 *
 * References: NIST Handbook 135 (2020 edition), present value of recurring amounts.
 */
export function presentValueOfAnnualAmount(options: AnnualAmountOptions): Decimal {
  const amount = readDecimal('annualAmountUsd', options.annualAmountUsd);
  const discount = readRate('discountRateReal', options.discountRateReal);
  const escalation = readRate('escalationRateReal', options.escalationRateReal ?? 0);
  const count = readWholeNumber('years', options.years, 1);
  return amount.times(escalatedFactor(discount, escalation, count));
}

/**
 * Capital recovery factor: the level yearly amount over `years` years whose present value is
 * one dollar.
 *
 * @param discountRateReal - Real discount rate, fraction per year, above −1.
 * @param years - Number of years, a whole number ≥ 1.
 * @returns CRF, per year (USD a year per USD today).
 *
 * @remarks
 * Notes: CRF = d/(1 − (1 + d)^−n) = 1/UPV(d, n), which is 1/n when d = 0.
 *
 * References: Meier, Wright & Rosenfeld (1983), Supplying Energy Through Greater Efficiency;
 * NIST Handbook 135 (2020 edition).
 */
export function capitalRecoveryFactor(discountRateReal: Decimal.Value, years: number): Decimal {
  const rate = readRate('discountRateReal', discountRateReal);
  const count = readWholeNumber('years', years, 1);
  return new Decimal(1).div(escalatedFactor(rate, new Decimal(0), count));
}
