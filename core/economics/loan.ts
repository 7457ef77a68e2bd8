/**
 * A financed package: the level monthly payment of an amortizing loan, its schedule to the
 * cent, and the month-by-month cash flow of savings against payments.
 */
import Decimal from 'decimal.js';
import { roundToCents } from '../money.ts';
import { InputError } from '../errors.ts';
import { readDecimal, readNonNegative, readRate, readWholeNumber } from './present-value.ts';

const MONTHS_PER_YEAR = 12;

/** Terms of an amortizing loan with level monthly payments. */
export interface LoanTerms {
  /** Amount borrowed, USD, zero or more. */
  principalUsd: Decimal.Value;
  /** Nominal annual percentage rate, fraction per year (0.06 for 6 %), zero or more. */
  aprNominal: Decimal.Value;
  /** Term, a whole number of months ≥ 1. */
  months: number;
}

function readLoanTerms(terms: LoanTerms): { principal: Decimal; monthlyRate: Decimal } {
  const principal = readNonNegative('principalUsd', terms.principalUsd);
  const apr = readRate('aprNominal', terms.aprNominal);
  if (apr.isNegative() && !apr.isZero()) {
    throw InputError.at('aprNominal', `expected an APR of zero or more, got ${apr.toString()}`);
  }
  readWholeNumber('months', terms.months, 1);
  return { principal, monthlyRate: apr.div(MONTHS_PER_YEAR) };
}

/**
 * Level monthly payment of an amortizing loan, not rounded (see
 * {@link loanMonthlyPaymentRoundedUsd} for the amount billed).
 *
 * @param terms - Principal (USD), APR (fraction/yr), term (months).
 * @returns Payment, USD per month.
 *
 * @remarks
 * Notes: PMT = P·r/(1 − (1 + r)^−N), r = APR/12; PMT = P/N when APR = 0.
 *
 * References: the standard annuity payment, as in NIST Handbook 135 (2020 edition) uniform
 * capital recovery with a monthly period.
 */
export function loanMonthlyPaymentUsd(terms: LoanTerms): Decimal {
  const { principal, monthlyRate } = readLoanTerms(terms);
  if (monthlyRate.isZero()) {
    return principal.div(terms.months);
  }
  const remainingFactor = monthlyRate.plus(1).pow(-terms.months);
  return principal.times(monthlyRate).div(new Decimal(1).minus(remainingFactor));
}

/**
 * Level monthly payment rounded to the cent, half away from zero: the amount billed.
 *
 * @param terms - Principal (USD), APR (fraction/yr), term (months).
 * @returns Payment, USD per month, to the cent.
 *
 * @remarks
 * Notes: round(PMT, 0.01 USD), PMT as in {@link loanMonthlyPaymentUsd}.
 *
 * References: as {@link loanMonthlyPaymentUsd}.
 */
export function loanMonthlyPaymentRoundedUsd(terms: LoanTerms): Decimal {
  return roundToCents(loanMonthlyPaymentUsd(terms));
}

/** One month of a loan schedule, every amount to the cent. */
export interface LoanScheduleMonth {
  /** Month number, 1 for the first payment. */
  month: number;
  /** Payment made this month, USD. */
  paymentUsd: Decimal;
  /** Interest part of the payment, USD. */
  interestUsd: Decimal;
  /** Principal part of the payment, USD. */
  principalUsd: Decimal;
  /** Balance owed after the payment, USD. */
  balanceUsd: Decimal;
}

/**
 * Amortization schedule to the cent.
 *
 * @param terms - Principal (USD), APR (fraction/yr), term (months).
 * @returns One row per month: payment, interest, principal and balance, USD to the cent.
 *
 * @remarks
 * Notes: the principal is taken to the cent first. Each month interest = round(balance·r)
 * and principal part = payment − interest, with payment the rounded PMT. The last month pays whatever balance is left (plus its interest),
 * so the balance ends at exactly 0.00 and the principal parts sum exactly to the principal;
 * the rounding leaves the last payment a few cents off the others. A principal part never
 * exceeds the balance, so a payment rounded up cannot overpay before the last month.
 *
 * References: common practice of level-payment amortization; PMT as in
 * {@link loanMonthlyPaymentUsd}.
 */
export function loanSchedule(terms: LoanTerms): LoanScheduleMonth[] {
  const { principal, monthlyRate } = readLoanTerms(terms);
  const payment = loanMonthlyPaymentRoundedUsd(terms);
  const rows: LoanScheduleMonth[] = [];
  let balance = roundToCents(principal);
  for (let month = 1; month <= terms.months; month += 1) {
    const interest = roundToCents(balance.times(monthlyRate));
    const principalPart =
      month === terms.months ? balance : Decimal.min(payment.minus(interest), balance);
    balance = balance.minus(principalPart);
    rows.push({
      month,
      paymentUsd: interest.plus(principalPart),
      interestUsd: interest,
      principalUsd: principalPart,
      balanceUsd: balance,
    });
  }
  return rows;
}

/** Options of {@link monthlyCashFlow}. */
export interface MonthlyCashFlowOptions {
  /** Monthly loan payment, USD per month, zero or more; rounded to the cent. */
  loanPaymentUsd: Decimal.Value;
  /** Number of months, a whole number ≥ 1. */
  months: number;
  /** Savings in the first year, USD per year. */
  annualSavingsUsd: Decimal.Value;
  /** Real escalation rate of the savings, fraction per year, above −1; 0 when omitted. */
  escalationRateReal?: Decimal.Value;
}

/** One month of a financed package's cash flow, every amount to the cent. */
export interface MonthlyCashFlowMonth {
  /** Month number, 1 for the first. */
  month: number;
  /** Energy savings this month, USD. */
  savingsUsd: Decimal;
  /** Loan payment this month, USD. */
  loanPaymentUsd: Decimal;
  /** Savings minus payment, USD; negative when the payment is larger. */
  netUsd: Decimal;
}

/**
 * Month-by-month savings against a loan payment.
 *
 * @param options - Payment (USD/month), months, first-year savings (USD/yr), escalation
 *   (fraction/yr).
 * @returns One row per month: savings, payment and net, USD to the cent.
 *
 * @remarks
 * Notes: year y's savings are round(S·(1 + e)^(y−1)) and its months get a twelfth of that,
 * rounded, with the twelfth month taking the remainder, so a whole year's months sum exactly
 * to the year's rounded savings. Net = savings − payment, from the rounded amounts.
 *
 * References: common practice of financed-retrofit cash flow; escalation as in NIST
 * Handbook 135 (2020 edition).
 */
export function monthlyCashFlow(options: MonthlyCashFlowOptions): MonthlyCashFlowMonth[] {
  const payment = roundToCents(readNonNegative('loanPaymentUsd', options.loanPaymentUsd));
  const months = readWholeNumber('months', options.months, 1);
  const annualSavings = readDecimal('annualSavingsUsd', options.annualSavingsUsd);
  const escalation = readRate('escalationRateReal', options.escalationRateReal ?? 0);
  const rows: MonthlyCashFlowMonth[] = [];
  let yearSavings = roundToCents(annualSavings);
  let yearSavingsUnrounded = annualSavings;
  let monthSavings = roundToCents(yearSavings.div(MONTHS_PER_YEAR));
  for (let month = 1; month <= months; month += 1) {
    const monthOfYear = ((month - 1) % MONTHS_PER_YEAR) + 1;
    if (monthOfYear === 1 && month > 1) {
      yearSavingsUnrounded = yearSavingsUnrounded.times(escalation.plus(1));
      yearSavings = roundToCents(yearSavingsUnrounded);
      monthSavings = roundToCents(yearSavings.div(MONTHS_PER_YEAR));
    }
    const savings =
      monthOfYear === MONTHS_PER_YEAR
        ? yearSavings.minus(monthSavings.times(MONTHS_PER_YEAR - 1))
        : monthSavings;
    rows.push({
      month,
      savingsUsd: savings,
      loanPaymentUsd: payment,
      netUsd: savings.minus(payment),
    });
  }
  return rows;
}
