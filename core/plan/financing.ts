/**
 * A package paid for with a loan: the monthly payment against the monthly savings, what the
 * first year leaves in the household's pocket, and what the whole life of the work does,
 * every amount in decimal dollars to the cent.
 */
import { loanMonthlyPaymentRoundedUsd, loanSchedule } from '../economics/index.ts';
import { Decimal, roundToCents, sumUsd } from '../money.ts';
import type { PriceBook } from './prices.ts';
import type { StepOutcome } from './step.ts';

const MONTHS_PER_YEAR = 12;

export interface PlanFinancing {
  principalUsd: Decimal;
  aprNominal: number;
  months: number;
  /** The level payment billed each month (the last one settles the balance exactly). */
  monthlyPaymentUsd: Decimal;
  /** First year's savings per month, to the cent. */
  monthlySavingsUsd: Decimal;
  /** Savings less payment, per month in the first year. */
  netMonthlyUsd: Decimal;
  /** Every payment of the loan added up: principal and interest. */
  totalPaidUsd: Decimal;
  /** The first year's savings less the payments made in that year. */
  firstYearNetUsd: Decimal;
  /** The savings over each measure's own life, in today's dollars, not discounted. */
  lifetimeSavingsUsd: Decimal;
  /** Lifetime savings less every payment: what the household is ahead at the end. */
  lifetimeNetUsd: Decimal;
}

/**
 * The savings of a step over its life: year y is the first year's savings of each fuel
 * escalated (1 + e)^(y − 1), as the monthly cash flow counts them (core/economics/loan.ts).
 */
function lifetimeSavingsOf(prices: PriceBook, step: StepOutcome): Decimal {
  const worth = prices.annualWorth(step.saved);
  const heatingGrowth = new Decimal(1).plus(prices.heating.escalationRateReal);
  const electricityGrowth = new Decimal(1).plus(prices.electricity?.escalationRateReal ?? 0);
  let total = new Decimal(0);
  for (let year = 0; year < step.measure.lifeYears; year += 1) {
    total = total
      .plus(worth.heatingUsd.times(heatingGrowth.pow(year)))
      .plus(worth.electricityUsd.times(electricityGrowth.pow(year)));
  }
  return roundToCents(total);
}

/**
 * The package's loan figures, or null without loan terms or with nothing to pay for.
 *
 * @param options.terms - APR (nominal, fraction per year) and months of the loan
 * @param options.costUsd - the package's whole cost, borrowed in full
 * @param options.annualSavingsUsd - the package's first-year savings
 * @param options.steps - the package's steps, for each measure's savings over its life
 *
 * References: level-payment amortization as in core/economics/loan.ts (common practice of
 * financed retrofits); escalation of savings as in NIST Handbook 135.
 */
export function financingOf(options: {
  terms: { aprNominal: number; months: number } | undefined;
  costUsd: Decimal;
  annualSavingsUsd: Decimal;
  prices: PriceBook;
  steps: readonly StepOutcome[];
}): PlanFinancing | null {
  const { terms, costUsd, annualSavingsUsd, prices, steps } = options;
  if (!terms || costUsd.isZero()) return null;
  const loan = { principalUsd: costUsd, aprNominal: terms.aprNominal, months: terms.months };
  const monthlyPaymentUsd = loanMonthlyPaymentRoundedUsd(loan);
  const schedule = loanSchedule(loan);
  const totalPaidUsd = sumUsd(schedule.map((month) => month.paymentUsd));
  const firstYearPaidUsd = sumUsd(
    schedule.slice(0, MONTHS_PER_YEAR).map((month) => month.paymentUsd),
  );
  const monthlySavingsUsd = roundToCents(annualSavingsUsd.div(MONTHS_PER_YEAR));
  const lifetimeSavingsUsd = sumUsd(steps.map((step) => lifetimeSavingsOf(prices, step)));
  return {
    principalUsd: costUsd,
    aprNominal: terms.aprNominal,
    months: terms.months,
    monthlyPaymentUsd,
    monthlySavingsUsd,
    netMonthlyUsd: monthlySavingsUsd.minus(monthlyPaymentUsd),
    totalPaidUsd,
    firstYearNetUsd: roundToCents(annualSavingsUsd).minus(firstYearPaidUsd),
    lifetimeSavingsUsd,
    lifetimeNetUsd: lifetimeSavingsUsd.minus(totalPaidUsd),
  };
}
