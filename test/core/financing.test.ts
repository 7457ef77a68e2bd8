/**
 * A package paid for with a loan, checked against independent computations in the test:
 * the level payment against @formulajs/formulajs PMT (the spreadsheet function), the loan's
 * total against the amortization written out here, and the savings over each measure's life
 * against the closed form of a geometric series, S·((1 + e)^L − 1)/e.
 */
import { PMT } from '@formulajs/formulajs';
import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { evaluateHome, reportOf } from '../../core/evaluate.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { validBaseHome } from '../_lib/base-home.ts';

const TERMS = { aprNominal: 0.069, months: 60 };

function financedEvaluation() {
  const home = { ...validBaseHome(), financing: TERMS };
  return evaluateHome(home);
}

describe('a financed package', () => {
  const evaluation = financedEvaluation();
  const report = reportOf(evaluation);
  const financing = report.package.financing;
  const prices = buildPriceBook(evaluation.home);

  it('is there for a home with loan terms and a package to pay for', () => {
    expect(report.package.costUsd).toBeGreaterThan(0);
    expect(financing).not.toBeNull();
  });

  it('pays the level payment PMT gives, to the cent (formulajs PMT)', () => {
    if (financing === null) throw new Error('no financing');
    const pmt = -PMT(TERMS.aprNominal / 12, TERMS.months, report.package.costUsd);
    expect(financing.monthlyPaymentUsd).toBeCloseTo(Math.round(pmt * 100) / 100, 2);
    expect(financing.principalUsd).toBe(report.package.costUsd);
  });

  it('adds up every payment of the amortization, the last one settling the balance', () => {
    if (financing === null) throw new Error('no financing');
    // Written out here: interest to the cent each month, a level payment, the last month
    // paying what is left.
    const rate = new Decimal(TERMS.aprNominal).div(12);
    const payment = new Decimal(financing.monthlyPaymentUsd);
    let balance = new Decimal(report.package.costUsd);
    let paid = new Decimal(0);
    let firstYear = new Decimal(0);
    for (let month = 1; month <= TERMS.months; month++) {
      const interest = balance.times(rate).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
      const principal =
        month === TERMS.months ? balance : Decimal.min(payment.minus(interest), balance);
      balance = balance.minus(principal);
      paid = paid.plus(interest).plus(principal);
      if (month <= 12) firstYear = firstYear.plus(interest).plus(principal);
    }
    expect(financing.totalPaidUsd).toBe(paid.toNumber());
    expect(financing.firstYearNetUsd).toBe(
      new Decimal(report.package.annualSavingsUsd).minus(firstYear).toNumber(),
    );
    // More is paid than was borrowed, at a positive rate.
    expect(financing.totalPaidUsd).toBeGreaterThan(report.package.costUsd);
  });

  it('counts each measure’s savings over its own life by the geometric series', () => {
    if (financing === null) throw new Error('no financing');
    const heatingGrowth = prices.heating.escalationRateReal;
    const electricityGrowth = prices.electricity?.escalationRateReal ?? 0;
    const series = (rate: number, years: number) =>
      rate === 0 ? years : ((1 + rate) ** years - 1) / rate;
    let expected = 0;
    for (const entry of evaluation.plan.entries.filter((candidate) => candidate.included)) {
      const worth = prices.annualWorth(entry.step.saved);
      const life = entry.step.measure.lifeYears;
      expected +=
        worth.heatingUsd.toNumber() * series(heatingGrowth, life) +
        worth.electricityUsd.toNumber() * series(electricityGrowth, life);
    }
    // Each measure's total is rounded to the cent: within a cent per measure.
    const measures = report.package.measureIds.length;
    expect(Math.abs(financing.lifetimeSavingsUsd - expected)).toBeLessThanOrEqual(0.01 * measures);
    expect(financing.lifetimeNetUsd).toBeCloseTo(
      financing.lifetimeSavingsUsd - financing.totalPaidUsd,
      2,
    );
  });

  it('is absent without loan terms', () => {
    expect(reportOf(evaluateHome(validBaseHome())).package.financing).toBeNull();
  });
});
