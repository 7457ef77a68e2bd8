// Reference checks of core/economics/loan.ts against the annuity formula's worked value and
// @formulajs/formulajs 4.6.1 (Excel PMT, FV, IPMT return the opposite sign of the amounts).
import Decimal from 'decimal.js';
import * as formula from '@formulajs/formulajs';
import { describe, expect, it } from 'vitest';
import { expectInputError } from '../_lib/expect-input-error.ts';
import {
  loanMonthlyPaymentRoundedUsd,
  loanMonthlyPaymentUsd,
  loanSchedule,
  monthlyCashFlow,
} from '../../core/economics/index.ts';

/** A formulajs result as a number; a formulajs error value fails the test. */
function reference(result: number | Error): number {
  if (result instanceof Error) {
    throw new Error(`formulajs returned ${result.message}`);
  }
  return result;
}

/** Future value of one dollar a month for `months` months (Excel FV), the drift multiplier. */
function annuityGrowth(monthlyRate: number, months: number): number {
  return reference(formula.FV(monthlyRate, months, -1, 0));
}

const PRINCIPALS_USD = [1000, 5000, 12345.67, 30000];
const APRS = [0, 0.0349, 0.06, 0.18];
const TERMS_MONTHS = [1, 12, 60, 180];

describe('level monthly payment', () => {
  it('$5,000 at 6 % APR over 60 months is $96.66/month', () => {
    // REFERENCES check value derived from PMT = P·r/(1 − (1+r)^−N), r = APR/12.
    const terms = { principalUsd: 5000, aprNominal: 0.06, months: 60 };
    expect(loanMonthlyPaymentRoundedUsd(terms).toString()).toBe('96.66');
    expect(loanMonthlyPaymentUsd(terms).toDecimalPlaces(2).toString()).toBe('96.66');
  });

  it('equals Excel PMT over a grid of loans, APR 0 included', () => {
    // Excel PMT(APR/12, N, −P); at a zero rate it is P/N.
    for (const principal of PRINCIPALS_USD) {
      for (const apr of APRS) {
        for (const months of TERMS_MONTHS) {
          const expected = reference(formula.PMT(apr / 12, months, -principal));
          const terms = { principalUsd: principal, aprNominal: apr, months };
          const payment = loanMonthlyPaymentUsd(terms);
          expect(Math.abs(payment.toNumber() - expected)).toBeLessThanOrEqual(1e-12 * expected);
          const rounded = loanMonthlyPaymentRoundedUsd(terms);
          expect(rounded.decimalPlaces()).toBeLessThanOrEqual(2);
          expect(Math.abs(rounded.toNumber() - expected)).toBeLessThanOrEqual(0.005 + 1e-9);
        }
      }
    }
  });

  it('is P/N at a zero APR', () => {
    // The annuity formula's limit r → 0 (common practice: an interest-free loan).
    const payment = loanMonthlyPaymentUsd({ principalUsd: '1200', aprNominal: 0, months: 48 });
    expect(payment.toString()).toBe('25');
  });
});

describe('amortization schedule to the cent', () => {
  it('ends at 0.00 and its principal parts sum exactly to the principal', () => {
    // Common practice of level-payment amortization; drift bounds against Excel FV and IPMT:
    // each month the balance can stray from the exact one by at most a cent (half a cent of
    // payment rounding, half of interest rounding), compounded at the loan's rate.
    for (const principal of PRINCIPALS_USD) {
      for (const apr of APRS) {
        for (const months of TERMS_MONTHS) {
          const terms = { principalUsd: principal, aprNominal: apr, months };
          const rate = apr / 12;
          const exactPayment = reference(formula.PMT(rate, months, -principal));
          const rounded = loanMonthlyPaymentRoundedUsd(terms);
          const rows = loanSchedule(terms);
          expect(rows).toHaveLength(months);
          let principalSum = new Decimal(0);
          let previousBalance = new Decimal(principal);
          for (const row of rows) {
            for (const amount of [row.paymentUsd, row.interestUsd, row.principalUsd]) {
              expect(amount.decimalPlaces()).toBeLessThanOrEqual(2);
            }
            expect(row.paymentUsd.eq(row.interestUsd.plus(row.principalUsd))).toBe(true);
            expect(row.balanceUsd.eq(previousBalance.minus(row.principalUsd))).toBe(true);
            expect(
              row.interestUsd.eq(
                previousBalance.times(rate).toDecimalPlaces(2, Decimal.ROUND_HALF_UP),
              ),
            ).toBe(true);
            if (row.month < months) {
              expect(row.paymentUsd.eq(rounded)).toBe(true);
            }
            const drift = 0.01 * annuityGrowth(rate, row.month);
            const exactBalance = -reference(formula.FV(rate, row.month, -exactPayment, principal));
            expect(Math.abs(row.balanceUsd.toNumber() - exactBalance)).toBeLessThanOrEqual(drift);
            if (rate > 0) {
              const exactInterest = -reference(formula.IPMT(rate, row.month, months, principal));
              const interestDrift = 0.005 + rate * 0.01 * annuityGrowth(rate, row.month - 1);
              expect(Math.abs(row.interestUsd.toNumber() - exactInterest)).toBeLessThanOrEqual(
                interestDrift + 1e-9,
              );
            }
            principalSum = principalSum.plus(row.principalUsd);
            previousBalance = row.balanceUsd;
          }
          expect(principalSum.eq(principal)).toBe(true);
          expect(rows.at(-1)?.balanceUsd.toFixed(2)).toBe('0.00');
          const last = rows.at(-1)?.paymentUsd.toNumber() ?? NaN;
          expect(Math.abs(last - exactPayment)).toBeLessThanOrEqual(
            0.01 * annuityGrowth(rate, months),
          );
        }
      }
    }
  });

  it('never overpays a tiny loan whose rounded payment is too large', () => {
    // $0.10 over 15 months interest-free: PMT rounds to $0.01 (common practice: round half
    // up), which would pay the loan off after 10 months.
    const rows = loanSchedule({ principalUsd: '0.10', aprNominal: 0, months: 15 });
    for (const row of rows) {
      expect(row.balanceUsd.isNegative()).toBe(false);
    }
    const paid = rows.reduce((total, row) => total.plus(row.principalUsd), new Decimal(0));
    expect(paid.toString()).toBe('0.1');
    expect(rows.at(-1)?.balanceUsd.isZero()).toBe(true);
  });

  it('a zero principal gives a schedule of zeros', () => {
    // Common practice: nothing borrowed, nothing owed.
    const rows = loanSchedule({ principalUsd: 0, aprNominal: 0.06, months: 12 });
    expect(rows.every((row) => row.paymentUsd.isZero() && row.balanceUsd.isZero())).toBe(true);
  });
});

describe('monthly cash flow of a financed package', () => {
  it('each year of months sums to the escalated yearly savings; net = savings − payment', () => {
    // Year y's savings S·(1+e)^(y−1) from Excel FV(e, y−1, 0, −S) (NIST Handbook 135
    // escalation); the split into months is common practice.
    for (const annualSavings of [0, 480, 1234.56]) {
      for (const escalation of [-0.01, 0, 0.025]) {
        for (const months of [1, 12, 60, 121]) {
          const rows = monthlyCashFlow({
            loanPaymentUsd: '96.66',
            months,
            annualSavingsUsd: annualSavings,
            escalationRateReal: escalation,
          });
          expect(rows).toHaveLength(months);
          for (const row of rows) {
            expect(row.savingsUsd.decimalPlaces()).toBeLessThanOrEqual(2);
            expect(row.loanPaymentUsd.toString()).toBe('96.66');
            expect(row.netUsd.eq(row.savingsUsd.minus(row.loanPaymentUsd))).toBe(true);
          }
          for (let year = 1; year * 12 <= months; year += 1) {
            const yearRows = rows.slice((year - 1) * 12, year * 12);
            const total = yearRows.reduce((sum, row) => sum.plus(row.savingsUsd), new Decimal(0));
            const expected = reference(formula.FV(escalation, year - 1, 0, -annualSavings));
            expect(Math.abs(total.toNumber() - expected)).toBeLessThanOrEqual(0.005 + 1e-9);
            for (const row of yearRows) {
              expect(Math.abs(row.savingsUsd.toNumber() - expected / 12)).toBeLessThanOrEqual(0.06);
            }
          }
        }
      }
    }
  });

  it('does not mutate its options', () => {
    // Common practice: pure functions leave their arguments as they were.
    const options = Object.freeze({
      loanPaymentUsd: new Decimal('96.66'),
      months: 24,
      annualSavingsUsd: new Decimal(900),
      escalationRateReal: '0.02',
    });
    monthlyCashFlow(options);
    expect(options.loanPaymentUsd.toString()).toBe('96.66');
    expect(options.annualSavingsUsd.toString()).toBe('900');
  });
});

describe('bad loan input', () => {
  it('names the option and what was expected', () => {
    // Common practice (core/errors.ts contract): InputError names the field at fault.
    const terms = { principalUsd: 5000, aprNominal: 0.06, months: 60 };
    expectInputError(() => loanSchedule({ ...terms, months: 0 }), 'months', /at least 1/);
    expectInputError(() => loanSchedule({ ...terms, months: 12.5 }), 'months', /whole number/);
    expectInputError(
      () => loanMonthlyPaymentUsd({ ...terms, principalUsd: -1 }),
      'principalUsd',
      /zero or more/,
    );
    expectInputError(
      () => loanMonthlyPaymentUsd({ ...terms, aprNominal: -0.01 }),
      'aprNominal',
      /zero or more/,
    );
    expectInputError(
      () => loanMonthlyPaymentUsd({ ...terms, aprNominal: NaN }),
      'aprNominal',
      /finite/,
    );
    expectInputError(
      () =>
        monthlyCashFlow({
          loanPaymentUsd: 96.66,
          months: 12,
          annualSavingsUsd: 'n/a',
        }),
      'annualSavingsUsd',
      /finite/,
    );
    expectInputError(
      () =>
        monthlyCashFlow({
          loanPaymentUsd: 96.66,
          months: 12,
          annualSavingsUsd: 500,
          escalationRateReal: -2,
        }),
      'escalationRateReal',
      /above -1/,
    );
  });
});
