/**
 * The money a step is worth, in Decimal: a year's savings, their present value over the
 * measure's life, NPV, SIR, AIRR, paybacks, cost of saved energy and IRR.
 */
import {
  adjustedInternalRateOfReturn,
  costOfSavedEnergy,
  internalRateOfReturn,
  netPresentValue,
  savingsToInvestmentRatio,
  simplePaybackYears,
} from '../economics/index.ts';
import { Decimal } from '../money.ts';
import type { PriceBook } from './prices.ts';
import type { StepOutcome } from './step.ts';

export interface MeasureWorth {
  annualSavingsUsd: Decimal;
  pvSavingsUsd: Decimal;
  npvUsd: Decimal;
  /** Null for a health-and-safety measure (not tested) or one that costs nothing. */
  sir: Decimal | null;
  airr: Decimal | null;
  simplePaybackYears: Decimal | null;
  discountedPaybackYears: Decimal | null;
  cceUsdPerMMBtu: Decimal | null;
  irr: Decimal | null;
}

/**
 * Year-by-year real savings, escalated per fuel: s_t = heating·(1+e_h)^t + electricity·(1+e_e)^t,
 * t = 1…life, the same convention as the UPV* factor (NIST Handbook 135).
 */
function savingsByYear(
  prices: PriceBook,
  heatingUsd: Decimal,
  electricityUsd: Decimal,
  lifeYears: number,
): Decimal[] {
  const heatingGrowth = new Decimal(1).plus(prices.heating.escalationRateReal);
  const electricityGrowth = new Decimal(1).plus(prices.electricity?.escalationRateReal ?? 0);
  const flows: Decimal[] = [];
  let heating = heatingUsd;
  let electricity = electricityUsd;
  for (let year = 1; year <= lifeYears; year += 1) {
    heating = heating.times(heatingGrowth);
    electricity = electricity.times(electricityGrowth);
    flows.push(heating.plus(electricity));
  }
  return flows;
}

/**
 * Discounted payback from year-by-year savings: the year in which the cumulative discounted
 * savings reach the investment, interpolated linearly within that year; null if never
 * within the life. NIST Handbook 135 (discounted payback).
 */
function discountedPaybackFromFlows(
  investmentUsd: Decimal,
  flowsUsd: readonly Decimal[],
  discountRateReal: number,
): Decimal | null {
  if (investmentUsd.isZero()) return new Decimal(0);
  const growth = new Decimal(1).plus(discountRateReal);
  let cumulative = new Decimal(0);
  let discount = new Decimal(1);
  for (let index = 0; index < flowsUsd.length; index += 1) {
    discount = discount.div(growth);
    const discounted = (flowsUsd[index] ?? new Decimal(0)).times(discount);
    const next = cumulative.plus(discounted);
    if (next.gte(investmentUsd) && discounted.gt(0)) {
      return new Decimal(index).plus(investmentUsd.minus(cumulative).div(discounted));
    }
    cumulative = next;
  }
  return null;
}

/** Every money figure of a step. */
export function worthOfStep(prices: PriceBook, outcome: StepOutcome): MeasureWorth {
  const { measure, saved } = outcome;
  const worth = prices.annualWorth(saved);
  const pvSavingsUsd = prices.presentValue(worth, measure.lifeYears);
  const investmentUsd = measure.cost.totalUsd;
  const testable = !measure.cost.healthAndSafety && investmentUsd.gt(0);
  const sir = testable
    ? savingsToInvestmentRatio({ presentValueSavingsUsd: pvSavingsUsd, investmentUsd })
    : null;
  const flows = savingsByYear(prices, worth.heatingUsd, worth.electricityUsd, measure.lifeYears);
  return {
    annualSavingsUsd: worth.totalUsd,
    pvSavingsUsd,
    npvUsd: netPresentValue({ presentValueSavingsUsd: pvSavingsUsd, investmentUsd }),
    sir,
    airr:
      sir === null
        ? null
        : adjustedInternalRateOfReturn({
            discountRateReal: prices.discountRateReal,
            sir,
            years: measure.lifeYears,
          }),
    simplePaybackYears: simplePaybackYears({ investmentUsd, firstYearSavingsUsd: worth.totalUsd }),
    discountedPaybackYears: discountedPaybackFromFlows(
      investmentUsd,
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
    irr: investmentUsd.gt(0) ? internalRateOfReturn([investmentUsd.negated(), ...flows]) : null,
  };
}
