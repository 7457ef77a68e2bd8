/**
 * What a step is worth. Money is Decimal: a year's savings, their present value over the
 * measure's life, NPV, the SIR, cost of saved energy. Rates and times that are reported to
 * four decimals and never summed as money (AIRR, IRR, discounted payback) are computed in
 * float64 from the same cents, which keeps a 20-measure plan within a few milliseconds.
 */
import {
  costOfSavedEnergy,
  internalRateOfReturn,
  netPresentValue,
  savingsToInvestmentRatio,
  simplePaybackYears,
} from '../economics/index.ts';
import type { Decimal } from '../money.ts';
import type { PriceBook } from './prices.ts';
import type { StepOutcome } from './step.ts';

/** IRR is reported to four decimals; finding it to 1e-8 is ample. */
const IRR_REPORT_TOLERANCE = 1e-8;

export interface MeasureWorth {
  annualSavingsUsd: Decimal;
  pvSavingsUsd: Decimal;
  npvUsd: Decimal;
  /** Null for a health-and-safety measure (not tested) or one that costs nothing. */
  sir: Decimal | null;
  /** Adjusted internal rate of return, fraction per year; null where the SIR is. */
  airr: number | null;
  simplePaybackYears: Decimal | null;
  /** Years until discounted savings repay the cost; null if never within the life. */
  discountedPaybackYears: number | null;
  cceUsdPerMMBtu: Decimal | null;
  /** Internal rate of return over the life, fraction per year; null when there is none. */
  irr: number | null;
}

/**
 * Year-by-year real savings, escalated per fuel: s_t = heating·(1+e_h)^t + electricity·(1+e_e)^t,
 * t = 1…life, the same convention as the UPV* factor (NIST Handbook 135).
 */
function savingsByYear(
  prices: PriceBook,
  heatingUsd: number,
  electricityUsd: number,
  lifeYears: number,
): number[] {
  const heatingGrowth = 1 + prices.heating.escalationRateReal;
  const electricityGrowth = 1 + (prices.electricity?.escalationRateReal ?? 0);
  const flows: number[] = [];
  for (let year = 1; year <= lifeYears; year += 1) {
    flows.push(heatingUsd * heatingGrowth ** year + electricityUsd * electricityGrowth ** year);
  }
  return flows;
}

/**
 * Discounted payback from year-by-year savings: the year in which the cumulative discounted
 * savings reach the investment, interpolated linearly within that year; null if never
 * within the life. NIST Handbook 135 (discounted payback).
 */
export function discountedPaybackFromFlows(
  investmentUsd: number,
  flowsUsd: readonly number[],
  discountRateReal: number,
): number | null {
  if (investmentUsd === 0) return 0;
  let cumulative = 0;
  for (let index = 0; index < flowsUsd.length; index += 1) {
    const discounted = (flowsUsd[index] ?? 0) / (1 + discountRateReal) ** (index + 1);
    if (cumulative + discounted >= investmentUsd && discounted > 0) {
      return index + (investmentUsd - cumulative) / discounted;
    }
    cumulative += discounted;
  }
  return null;
}

/**
 * AIRR = (1 + d)·SIR^(1/n) − 1 (10 CFR 436.22); the Decimal form is
 * `adjustedInternalRateOfReturn` in core/economics, which the tests hold this to.
 */
function adjustedRate(
  discountRateReal: number,
  sir: Decimal | null,
  lifeYears: number,
): number | null {
  if (sir === null || !sir.gt(0)) return null;
  return (1 + discountRateReal) * sir.toNumber() ** (1 / lifeYears) - 1;
}

/** Every figure of worth of a step. */
export function worthOfStep(prices: PriceBook, outcome: StepOutcome): MeasureWorth {
  const { measure, saved } = outcome;
  const worth = prices.annualWorth(saved);
  const pvSavingsUsd = prices.presentValue(worth, measure.lifeYears);
  const investmentUsd = measure.cost.totalUsd;
  const testable = !measure.cost.healthAndSafety && investmentUsd.gt(0);
  const sir = testable
    ? savingsToInvestmentRatio({ presentValueSavingsUsd: pvSavingsUsd, investmentUsd })
    : null;
  const investmentFloat = measure.cost.totalUsdFloat;
  const flows = savingsByYear(
    prices,
    worth.heatingUsd.toNumber(),
    worth.electricityUsd.toNumber(),
    measure.lifeYears,
  );
  const irr =
    investmentFloat > 0
      ? internalRateOfReturn([-investmentFloat, ...flows], { toleranceRate: IRR_REPORT_TOLERANCE })
      : null;
  return {
    annualSavingsUsd: worth.totalUsd,
    pvSavingsUsd,
    npvUsd: netPresentValue({ presentValueSavingsUsd: pvSavingsUsd, investmentUsd }),
    sir,
    airr: adjustedRate(prices.discountRateReal, sir, measure.lifeYears),
    simplePaybackYears: simplePaybackYears({ investmentUsd, firstYearSavingsUsd: worth.totalUsd }),
    discountedPaybackYears: discountedPaybackFromFlows(
      investmentFloat,
      flows,
      prices.discountRateReal,
    ),
    cceUsdPerMMBtu:
      saved.siteMMBtu > 0
        ? costOfSavedEnergy({
            investmentUsd,
            discountRateReal: prices.discountRateReal,
            years: measure.lifeYears,
            annualEnergySaved: saved.siteMMBtu,
          })
        : null,
    irr: irr === null ? null : irr.toNumber(),
  };
}
