/**
 * A financed package's figures as term and value pairs, for the Plan section and the
 * proposal alike, in the words a household reads.
 */
import { formatNumber, formatUsd } from '../core/format.ts';
import type { EvaluationReport } from '../core/report.ts';

export type LoanFigures = NonNullable<EvaluationReport['package']['financing']>;

/** The loan's terms, its payment against the savings, and the totals over time. */
export function loanFacts(loan: LoanFigures): { term: string; value: string }[] {
  const usd = (amount: number) => formatUsd(amount, { cents: true });
  return [
    { term: 'Borrowed', value: usd(loan.principalUsd) },
    {
      term: 'Loan',
      value: `${formatNumber(loan.aprNominal * 100, 2)} % APR over ${formatNumber(loan.months)} months`,
    },
    { term: 'Monthly payment', value: usd(loan.monthlyPaymentUsd) },
    { term: 'Monthly savings, first year', value: usd(loan.monthlySavingsUsd) },
    {
      term: 'Each month, first year',
      value: `${usd(Math.abs(loan.netMonthlyUsd))} ${loan.netMonthlyUsd < 0 ? 'out of pocket' : 'ahead'}`,
    },
    { term: 'First year, savings less payments', value: usd(loan.firstYearNetUsd) },
    { term: 'Paid back in all', value: usd(loan.totalPaidUsd) },
    { term: 'Savings over the measures’ lives', value: usd(loan.lifetimeSavingsUsd) },
    { term: 'Ahead at the end, in today’s dollars', value: usd(loan.lifetimeNetUsd) },
  ];
}

/** What the loan figures leave out, said beside them. */
export const LOAN_NOTE =
  'Savings in today’s dollars, not discounted; each measure counts over its own life. A lender’s fees and the tax treatment are not included.';
