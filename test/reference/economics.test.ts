// Reference checks of core/economics against published formulas and worked values, and
// against @formulajs/formulajs 4.6.1 (Excel semantics: NPV discounts its first value one
// period; PV, PMT and FV return the opposite sign of the amounts given).
import Decimal from 'decimal.js';
import * as formula from '@formulajs/formulajs';
import { describe, expect, it } from 'vitest';
import { expectInputError } from '../_lib/expect-input-error.ts';
import {
  adjustedInternalRateOfReturn,
  capitalRecoveryFactor,
  costOfSavedEnergy,
  discountedPaybackYears,
  escalatedUniformPresentValueFactor,
  internalRateOfReturn,
  netPresentValue,
  presentValueOfAnnualAmount,
  realDiscountRate,
  savingsToInvestmentRatio,
  simplePaybackYears,
  singlePresentValueFactor,
  uniformPresentValueFactor,
} from '../../core/economics/index.ts';

/** A formulajs result as a number; a formulajs error value fails the test. */
function reference(result: number | Error): number {
  if (result instanceof Error) {
    throw new Error(`formulajs returned ${result.message}`);
  }
  return result;
}

/** Asserts |actual − expected| ≤ relative·max(1, |expected|). */
function expectClose(actual: Decimal, expected: number, relative: number): void {
  const scale = Math.max(1, Math.abs(expected));
  expect(Math.abs(actual.toNumber() - expected)).toBeLessThanOrEqual(relative * scale);
}

/** Yearly amounts A·(1 + e)^k, k = 1..n: the stream NIST Handbook 135's UPV* values. */
function escalatingStream(amountUsd: number, escalation: number, years: number): number[] {
  return Array.from({ length: years }, (_, index) => amountUsd * (1 + escalation) ** (index + 1));
}

const DISCOUNT_RATES = [0, 0.01, 0.03, 0.07, 0.12];
const ESCALATION_RATES = [-0.02, 0, 0.01, 0.03, 0.05];
const LIVES_YEARS = [1, 5, 15, 30, 50];

describe('present-value factors: check values', () => {
  it('UPV(3 %, 20) and UPV*(3 %, 1 %, 20)', () => {
    // NIST Handbook 135 (2020) UPV and UPV* formulas; values derived by hand to 6 places.
    expect(uniformPresentValueFactor(0.03, 20).toDecimalPlaces(6).toString()).toBe('14.877475');
    const upvStar = escalatedUniformPresentValueFactor({
      discountRateReal: 0.03,
      escalationRateReal: 0.01,
      years: 20,
    });
    expect(upvStar.toDecimalPlaces(6).toString()).toBe('16.382723');
  });

  it('CRF(3 %, 15) = 0.083767', () => {
    // Meier, Wright & Rosenfeld (1983) CRF = d/(1 − (1+d)^−n); value derived by hand.
    expect(capitalRecoveryFactor('0.03', 15).toDecimalPlaces(6).toString()).toBe('0.083767');
  });
});

describe('present-value factors against formulajs', () => {
  it('SPV equals PV(d, t, 0, −1) over a grid', () => {
    // NIST Handbook 135 SPV = (1+d)^−t; Excel PV of a future value of 1.
    for (const rate of DISCOUNT_RATES) {
      for (const years of LIVES_YEARS) {
        const expected = reference(formula.PV(rate, years, 0, -1));
        expectClose(singlePresentValueFactor(rate, years), expected, 1e-13);
      }
    }
  });

  it('UPV equals PV(d, n, −1) and CRF equals PMT(d, n, −1) over a grid', () => {
    // NIST Handbook 135 UPV; Meier, Wright & Rosenfeld (1983) CRF = 1/UPV; Excel PV and PMT.
    for (const rate of DISCOUNT_RATES) {
      for (const years of LIVES_YEARS) {
        expectClose(
          uniformPresentValueFactor(rate, years),
          reference(formula.PV(rate, years, -1)),
          1e-13,
        );
        expectClose(
          capitalRecoveryFactor(rate, years),
          reference(formula.PMT(rate, years, -1)),
          1e-13,
        );
      }
    }
  });

  it('PV of escalating savings equals NPV of the explicit stream over a grid', () => {
    // NIST Handbook 135 PV = A·UPV*(d, e, n); Excel NPV of A(1+e)^k, k = 1..n. The grid holds
    // e = d (0/0 and 3 %/3 %), where UPV* = n.
    for (const rate of DISCOUNT_RATES) {
      for (const escalation of ESCALATION_RATES) {
        for (const years of LIVES_YEARS) {
          const stream = escalatingStream(250, escalation, years);
          const expected = reference(formula.NPV(rate, ...stream));
          const actual = presentValueOfAnnualAmount({
            annualAmountUsd: 250,
            discountRateReal: rate,
            escalationRateReal: escalation,
            years,
          });
          expectClose(actual, expected, 1e-12);
        }
      }
    }
  });

  it('UPV* is exactly n at e = d and smooth just beside it', () => {
    // NIST Handbook 135: UPV* = n when e = d. Beside it, Excel NPV of the explicit stream (a
    // plain sum, free of the closed form's cancellation); the offsets straddle the point where
    // the code changes from the closed form to the sum.
    for (const years of [1, 20, 50]) {
      const exact = escalatedUniformPresentValueFactor({
        discountRateReal: '0.04',
        escalationRateReal: '0.04',
        years,
      });
      expect(exact.toString()).toBe(String(years));
      for (const offset of [1e-12, 1e-9, 9.999e-5, 1.0001e-4, 1e-3]) {
        for (const sign of [-1, 1]) {
          const escalation = 0.04 + sign * offset;
          const expected = reference(formula.NPV(0.04, ...escalatingStream(1, escalation, years)));
          const actual = escalatedUniformPresentValueFactor({
            discountRateReal: 0.04,
            escalationRateReal: escalation,
            years,
          });
          expectClose(actual, expected, 1e-13);
        }
      }
    }
  });

  it('UPV at d = 0 is n, and near it matches NPV of fifty 1s', () => {
    // NIST Handbook 135: UPV = n when d = 0. Near it, Excel NPV of the explicit stream (Excel
    // PV's closed form loses digits there in float64, so it is no reference at tiny d).
    expect(uniformPresentValueFactor(0, 50).toString()).toBe('50');
    for (const rate of [1e-10, -1e-7, 5e-5, 2e-4]) {
      const expected = reference(formula.NPV(rate, ...Array<number>(50).fill(1)));
      expectClose(uniformPresentValueFactor(rate, 50), expected, 1e-13);
    }
  });

  it('a real rate discounts real amounts as the nominal rate discounts nominal ones', () => {
    // NIST Handbook 135 d = (1+D)/(1+I) − 1: Excel NPV at D of amounts inflated at I equals
    // the PV at d of the same amounts in constant dollars.
    for (const nominal of [0.02, 0.05, 0.08]) {
      for (const inflation of [0, 0.02, 0.035]) {
        for (const years of [1, 15, 40]) {
          const real = realDiscountRate({ nominalRate: nominal, inflationRate: inflation });
          const expected = reference(
            formula.NPV(nominal, ...escalatingStream(100, inflation, years)),
          );
          const actual = presentValueOfAnnualAmount({
            annualAmountUsd: 100,
            discountRateReal: real,
            years,
          });
          expectClose(actual, expected, 1e-12);
        }
      }
    }
  });
});

describe('measures of worth: the $500 measure saving $80/yr for 15 yr at 3 % real', () => {
  // REFERENCES check values derived from NIST Handbook 135 (PV) and 10 CFR 436.21–436.23.
  const presentValueSavingsUsd = presentValueOfAnnualAmount({
    annualAmountUsd: 80,
    discountRateReal: 0.03,
    years: 15,
  });

  it('PV 955.03, NPV 455.03, SIR 1.9101, payback 6.25 yr', () => {
    // NIST Handbook 135 PV; 10 CFR 436.21 net savings and SIR; 10 CFR 436.23 simple payback.
    expect(presentValueSavingsUsd.toDecimalPlaces(2).toString()).toBe('955.03');
    const npv = netPresentValue({ presentValueSavingsUsd, investmentUsd: 500 });
    expect(npv.toDecimalPlaces(2).toString()).toBe('455.03');
    const sir = savingsToInvestmentRatio({ presentValueSavingsUsd, investmentUsd: 500 });
    expect(sir?.toDecimalPlaces(4).toString()).toBe('1.9101');
    const payback = simplePaybackYears({ investmentUsd: 500, firstYearSavingsUsd: 80 });
    expect(payback?.toString()).toBe('6.25');
  });

  it('CCE $5.2354/MMBtu at 8 MMBtu/yr', () => {
    // Meier, Wright & Rosenfeld (1983) CCE = I·CRF / energy; value derived by hand.
    const cce = costOfSavedEnergy({
      investmentUsd: 500,
      discountRateReal: 0.03,
      years: 15,
      annualEnergySaved: 8,
    });
    expect(cce?.toDecimalPlaces(4).toString()).toBe('5.2354');
  });

  it('PV, NPV and SIR agree with Excel NPV of the cash flows', () => {
    // Excel NPV over the yearly savings; 10 CFR 436.21 definitions.
    const pv = reference(formula.NPV(0.03, ...Array<number>(15).fill(80)));
    expectClose(presentValueSavingsUsd, pv, 1e-13);
    const sir = savingsToInvestmentRatio({ presentValueSavingsUsd, investmentUsd: 500 });
    expect(sir).not.toBeNull();
    expectClose(sir ?? new Decimal(0), pv / 500, 1e-13);
  });
});

describe('measures of worth against formulajs', () => {
  const INVESTMENTS_USD = [100, 500, 4200];
  const SAVINGS_USD_PER_YEAR = [15, 80, 650];

  it('AIRR equals RRI of the investment and its savings reinvested at d', () => {
    // 10 CFR 436.22: AIRR is the rate that grows the investment to the savings' value at the
    // end of the study period, reinvested at d; Excel FV and RRI give that rate directly.
    for (const rate of [0, 0.03, 0.07]) {
      for (const years of [1, 15, 50]) {
        for (const investment of INVESTMENTS_USD) {
          const savings = 80;
          const sir = savingsToInvestmentRatio({
            presentValueSavingsUsd: presentValueOfAnnualAmount({
              annualAmountUsd: savings,
              discountRateReal: rate,
              years,
            }),
            investmentUsd: investment,
          });
          const future = reference(formula.FV(rate, years, -savings, 0));
          const expected = reference(formula.RRI(years, investment, future));
          const airr = adjustedInternalRateOfReturn({ discountRateReal: rate, sir, years });
          expect(airr).not.toBeNull();
          expectClose(airr ?? new Decimal(NaN), expected, 1e-12);
          // 10 CFR 436.22: AIRR exceeds d exactly when SIR exceeds 1.
          expect(airr?.gt(rate)).toBe(sir?.gt(1));
        }
      }
    }
  });

  it('simple payback equals NPER at a zero rate', () => {
    // 10 CFR 436.23 simple payback; Excel NPER(0, S, −I) = I/S.
    for (const investment of INVESTMENTS_USD) {
      for (const savings of SAVINGS_USD_PER_YEAR) {
        const expected = reference(formula.NPER(0, savings, -investment));
        const payback = simplePaybackYears({
          investmentUsd: investment,
          firstYearSavingsUsd: savings,
        });
        expectClose(payback ?? new Decimal(NaN), expected, 1e-14);
        const discounted = discountedPaybackYears({
          investmentUsd: investment,
          firstYearSavingsUsd: savings,
          discountRateReal: 0,
          maxYears: 400,
        });
        // With no discounting the cumulative savings are linear, so interpolation is exact.
        expectClose(discounted ?? new Decimal(NaN), expected, 1e-14);
      }
    }
  });

  it('discounted payback lies in the same year as NPER', () => {
    // Excel NPER(d*, S/(1+e), −I), d* = (1+d)/(1+e) − 1, gives the continuous payback of
    // savings S(1+e)^(k−1) discounted at d (NIST Handbook 135 discounting). The cumulative
    // curve is concave when d > e and convex when d < e, so the linear step within the year
    // is at or after NPER in the first case and at or before it in the second.
    for (const rate of [0.01, 0.03, 0.07, 0.12]) {
      for (const escalation of [-0.02, 0, 0.02]) {
        for (const investment of INVESTMENTS_USD) {
          for (const savings of SAVINGS_USD_PER_YEAR) {
            const effectiveRate = (1 + rate) / (1 + escalation) - 1;
            const nper = formula.NPER(effectiveRate, savings / (1 + escalation), -investment);
            const maxYears = 30;
            const payback = discountedPaybackYears({
              investmentUsd: investment,
              firstYearSavingsUsd: savings,
              discountRateReal: rate,
              escalationRateReal: escalation,
              maxYears,
            });
            if (typeof nper !== 'number' || !Number.isFinite(nper) || nper > maxYears) {
              expect(payback).toBeNull();
              continue;
            }
            expect(payback).not.toBeNull();
            const years = payback?.toNumber() ?? NaN;
            expect(Math.ceil(years - 1e-9)).toBe(Math.ceil(nper - 1e-9));
            if (rate > escalation) {
              expect(years).toBeGreaterThanOrEqual(nper - 1e-9);
            } else {
              expect(years).toBeLessThanOrEqual(nper + 1e-9);
            }
          }
        }
      }
    }
  });

  it('discounted payback within the life exactly when NPV ≥ 0', () => {
    // NIST Handbook 135: a measure whose discounted savings reach the investment within the
    // study period has non-negative net savings, and only then. First-year savings A(1+e)
    // make the stream the one UPV* values.
    for (const rate of [0, 0.03, 0.07]) {
      for (const escalation of [-0.02, 0, 0.03]) {
        for (const years of [1, 10, 25]) {
          for (const investment of INVESTMENTS_USD) {
            const pv = presentValueOfAnnualAmount({
              annualAmountUsd: 80,
              discountRateReal: rate,
              escalationRateReal: escalation,
              years,
            });
            const npv = netPresentValue({ presentValueSavingsUsd: pv, investmentUsd: investment });
            const payback = discountedPaybackYears({
              investmentUsd: investment,
              firstYearSavingsUsd: new Decimal(80).times(1 + escalation),
              discountRateReal: rate,
              escalationRateReal: escalation,
              maxYears: years,
            });
            expect(payback !== null).toBe(!npv.isNegative());
          }
        }
      }
    }
  });

  it('CCE equals PMT(d, n, −I) / energy', () => {
    // Meier, Wright & Rosenfeld (1983) CCE = I·CRF / energy; Excel PMT gives I·CRF.
    for (const rate of DISCOUNT_RATES) {
      for (const years of LIVES_YEARS) {
        for (const energy of [0.5, 8, 1200]) {
          const expected = reference(formula.PMT(rate, years, -500)) / energy;
          const cce = costOfSavedEnergy({
            investmentUsd: 500,
            discountRateReal: rate,
            years,
            annualEnergySaved: energy,
          });
          expectClose(cce ?? new Decimal(NaN), expected, 1e-13);
        }
      }
    }
  });

  it('IRR agrees with Excel IRR on measure cash flows', () => {
    // Excel IRR (formulajs stops at |NPV| < 1e-10); ours is within 5e-13 of a root.
    for (const investment of INVESTMENTS_USD) {
      for (const savings of SAVINGS_USD_PER_YEAR) {
        for (const escalation of [-0.02, 0, 0.03]) {
          for (const years of [1, 3, 10, 25, 50]) {
            const flows = [-investment, ...escalatingStream(savings, escalation, years)];
            const expected = formula.IRR(flows);
            const actual = internalRateOfReturn(flows);
            if (typeof expected !== 'number' || expected < -0.99 || expected > 100) {
              continue;
            }
            expect(actual).not.toBeNull();
            expectClose(actual ?? new Decimal(NaN), expected, 1e-8);
            const npvAtRoot = reference(formula.NPV(actual?.toNumber() ?? NaN, ...flows.slice(1)));
            expect(Math.abs(npvAtRoot - investment)).toBeLessThan(1e-7 * investment);
          }
        }
      }
    }
  });

  it('IRR picks the root nearest zero when there are two, and finds exact grid roots', () => {
    // −100 + 230/(1+r) − 132/(1+r)² has roots 10 % and 20 %; Excel IRR finds each from a
    // guess near it. [−100, 110] has IRR exactly 10 % (Excel IRR).
    const twoRoots = [-100, 230, -132];
    const nearLow = reference(formula.IRR(twoRoots, 0.05));
    const nearHigh = reference(formula.IRR(twoRoots, 0.3));
    expect(nearLow).toBeCloseTo(0.1, 9);
    expect(nearHigh).toBeCloseTo(0.2, 9);
    expectClose(internalRateOfReturn(twoRoots) ?? new Decimal(NaN), nearLow, 1e-9);
    expect(internalRateOfReturn([-100, 110])?.toString()).toBe('0.1');
    expectClose(internalRateOfReturn([-100, 50, 50]) ?? new Decimal(NaN), 0, 1e-12);
  });

  it('IRR is null without a change of sign, as Excel IRR gives #NUM!', () => {
    // Excel IRR returns #NUM! when the flows are not of both signs.
    for (const flows of [[100, 50], [-100, -50], [0, 0, 0], [-100], []]) {
      expect(internalRateOfReturn(flows)).toBeNull();
    }
    expect(formula.IRR([100, 50])).toBeInstanceOf(Error);
  });
});

describe('edges', () => {
  it('zero investment: SIR undefined, paybacks zero, NPV the savings, CCE zero', () => {
    // 10 CFR 436.21: SIR divides by the investment, so it is undefined here (not Infinity);
    // 10 CFR 436.22 AIRR rests on SIR, so it is undefined too.
    const pv = presentValueOfAnnualAmount({
      annualAmountUsd: 80,
      discountRateReal: 0.03,
      years: 15,
    });
    expect(savingsToInvestmentRatio({ presentValueSavingsUsd: pv, investmentUsd: 0 })).toBeNull();
    expect(
      adjustedInternalRateOfReturn({ discountRateReal: 0.03, sir: null, years: 15 }),
    ).toBeNull();
    expect(netPresentValue({ presentValueSavingsUsd: pv, investmentUsd: 0 }).eq(pv)).toBe(true);
    expect(simplePaybackYears({ investmentUsd: 0, firstYearSavingsUsd: 80 })?.isZero()).toBe(true);
    const discounted = discountedPaybackYears({
      investmentUsd: 0,
      firstYearSavingsUsd: 0,
      discountRateReal: 0.03,
      maxYears: 15,
    });
    expect(discounted?.isZero()).toBe(true);
    const cce = costOfSavedEnergy({
      investmentUsd: 0,
      discountRateReal: 0.03,
      years: 15,
      annualEnergySaved: 8,
    });
    expect(cce?.isZero()).toBe(true);
  });

  it('zero or negative savings: no payback, SIR 0, no AIRR, no CCE', () => {
    // 10 CFR 436.23: payback is undefined without positive savings; 10 CFR 436.22 AIRR needs
    // SIR > 0 for the root; Meier, Wright & Rosenfeld (1983): CCE needs energy saved.
    for (const savings of [0, -25]) {
      expect(simplePaybackYears({ investmentUsd: 500, firstYearSavingsUsd: savings })).toBeNull();
      const discounted = discountedPaybackYears({
        investmentUsd: 500,
        firstYearSavingsUsd: savings,
        discountRateReal: 0.03,
        maxYears: 50,
      });
      expect(discounted).toBeNull();
      const cce = costOfSavedEnergy({
        investmentUsd: 500,
        discountRateReal: 0.03,
        years: 15,
        annualEnergySaved: savings,
      });
      expect(cce).toBeNull();
    }
    const sir = savingsToInvestmentRatio({ presentValueSavingsUsd: 0, investmentUsd: 500 });
    expect(sir?.isZero()).toBe(true);
    expect(adjustedInternalRateOfReturn({ discountRateReal: 0.03, sir, years: 15 })).toBeNull();
    expect(
      adjustedInternalRateOfReturn({ discountRateReal: 0.03, sir: -0.5, years: 15 }),
    ).toBeNull();
  });

  it('a 1-year life: UPV = SPV = 1/(1+d), CRF = 1+d, payback within the year', () => {
    // NIST Handbook 135: with n = 1 the uniform series is one end-of-year amount; Excel PV.
    for (const rate of DISCOUNT_RATES) {
      const expected = reference(formula.PV(rate, 1, -1));
      expectClose(uniformPresentValueFactor(rate, 1), expected, 1e-15);
      expectClose(singlePresentValueFactor(rate, 1), expected, 1e-15);
      expectClose(capitalRecoveryFactor(rate, 1), 1 + rate, 1e-15);
      const payback = discountedPaybackYears({
        investmentUsd: 50,
        firstYearSavingsUsd: 100,
        discountRateReal: rate,
        maxYears: 1,
      });
      // Linear within year 1: I / PV(year 1) = 50 / (100/(1+d)).
      expectClose(payback ?? new Decimal(NaN), (50 * (1 + rate)) / 100, 1e-15);
    }
  });

  it('a payback past maxYears is null', () => {
    // 10 CFR 436.23 simple payback is 25 yr here, so the discounted payback is later still.
    const payback = discountedPaybackYears({
      investmentUsd: 2000,
      firstYearSavingsUsd: 80,
      discountRateReal: 0.03,
      maxYears: 24,
    });
    expect(payback).toBeNull();
  });

  it('does not mutate its inputs', () => {
    // Common practice: pure functions leave their arguments as they were.
    const flows = Object.freeze([new Decimal(-500), '80', 80, new Decimal('80.5')]);
    const before = flows.map((flow) => String(flow));
    expect(internalRateOfReturn(flows)).not.toBeNull();
    expect(flows.map((flow) => String(flow))).toEqual(before);
    const options = Object.freeze({
      annualAmountUsd: new Decimal(80),
      discountRateReal: new Decimal('0.03'),
      escalationRateReal: '0.01',
      years: 15,
    });
    presentValueOfAnnualAmount(options);
    expect(options.annualAmountUsd.toString()).toBe('80');
    expect(options.discountRateReal.toString()).toBe('0.03');
  });
});

describe('bad input', () => {
  it('names the option and what was expected', () => {
    // Common practice (core/errors.ts contract): InputError names the field at fault.
    expectInputError(() => uniformPresentValueFactor(0.03, -5), 'years', /whole number/);
    expectInputError(() => uniformPresentValueFactor(0.03, 0), 'years', /at least 1/);
    expectInputError(() => singlePresentValueFactor(0.03, 2.5), 'years', /whole number/);
    expectInputError(() => uniformPresentValueFactor(-1, 10), 'discountRateReal', /above -1/);
    expectInputError(() => capitalRecoveryFactor('-1.5', 10), 'discountRateReal', /above -1/);
    expectInputError(() => uniformPresentValueFactor(NaN, 10), 'discountRateReal', /finite/);
    expectInputError(
      () => realDiscountRate({ nominalRate: Infinity, inflationRate: 0.02 }),
      'nominalRate',
      /finite/,
    );
    expectInputError(
      () =>
        escalatedUniformPresentValueFactor({
          discountRateReal: 0.03,
          escalationRateReal: -1,
          years: 10,
        }),
      'escalationRateReal',
      /above -1/,
    );
    expectInputError(
      () => netPresentValue({ presentValueSavingsUsd: 'lots', investmentUsd: 500 }),
      'presentValueSavingsUsd',
      /finite/,
    );
    expectInputError(
      () => simplePaybackYears({ investmentUsd: -1, firstYearSavingsUsd: 80 }),
      'investmentUsd',
      /zero or more/,
    );
    expectInputError(
      () =>
        discountedPaybackYears({
          investmentUsd: 500,
          firstYearSavingsUsd: 80,
          discountRateReal: 0.03,
          maxYears: 1.5,
        }),
      'maxYears',
      /whole number/,
    );
    expectInputError(
      () => adjustedInternalRateOfReturn({ discountRateReal: 0.03, sir: 1.2, years: 7.5 }),
      'years',
      /whole number/,
    );
    expectInputError(() => internalRateOfReturn([-100, 50, NaN]), 'cashFlowsUsd[2]', /finite/);
  });
});

describe('internal rate of return to a reporting tolerance', () => {
  it('agrees with the full Decimal search and with formulajs IRR', async () => {
    const formulajs = await import('@formulajs/formulajs');
    const { internalRateOfReturn } = await import('../../core/economics/index.ts');
    for (const [cost, saving, years] of [
      [500, 80, 15],
      [1200, 95, 25],
      [300, 150, 3],
      [900, 40, 20],
    ] as const) {
      const flows = [-cost, ...Array.from({ length: years }, () => saving)];
      const exact = internalRateOfReturn(flows);
      const quick = internalRateOfReturn(flows, { toleranceRate: 1e-8 });
      // @formulajs/formulajs IRR (Excel semantics) as the outside reference.
      const reference = formulajs.IRR(flows) as number;
      expect(quick?.toNumber()).toBeCloseTo(exact?.toNumber() ?? NaN, 7);
      expect(quick?.toNumber()).toBeCloseTo(reference, 7);
    }
  });
});
