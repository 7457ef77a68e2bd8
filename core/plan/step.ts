/**
 * One step of a plan: a measure applied to what the earlier measures left. The step removes
 * what it can (never more than is left at its location, never below the leakage floor) and
 * is worth the energy that difference saves.
 */
import { energySaved, type AnnualEnergy } from '../energy.ts';
import { totalCfm50, type HomeModel, type LeakageByLocation } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import type { Range } from '../schema.ts';
import type { PriceBook } from './prices.ts';

/** What limited a step's reduction below its estimate, if anything. */
export type StepLimit = 'location' | 'floor' | null;

export interface StepOutcome {
  measure: PreparedMeasure;
  cfm50Before: number;
  cfm50After: number;
  appliedCfm50: number;
  limitedBy: StepLimit;
  leakageBefore: LeakageByLocation;
  leakageAfter: LeakageByLocation;
  energyAfter: AnnualEnergy;
  saved: AnnualEnergy;
}

/** A leakage state and the energy it costs, so each step computes the "before" once. */
export interface PlanState {
  leakage: LeakageByLocation;
  energy: AnnualEnergy;
}

/** The state of a leakage level. */
export function stateOf(model: HomeModel, leakage: LeakageByLocation): PlanState {
  return { leakage, energy: model.energyOf(leakage) };
}

/**
 * Applies one measure's estimate to a state.
 *
 * @param estimate - which point of the measure's range to apply
 */
export function applyMeasure(
  model: HomeModel,
  state: PlanState,
  measure: PreparedMeasure,
  estimate: keyof Range = 'likely',
): StepOutcome {
  const cfm50Before = totalCfm50(state.leakage);
  const wanted = Math.max(0, measure.estimateCfm50[estimate]);
  const leftAtLocation = state.leakage[measure.location];
  const aboveFloor = Math.max(0, cfm50Before - model.floorCfm50);
  const appliedCfm50 = Math.min(wanted, leftAtLocation, aboveFloor);
  let limitedBy: StepLimit = null;
  if (appliedCfm50 < wanted) limitedBy = leftAtLocation <= aboveFloor ? 'location' : 'floor';

  const leakageAfter = { ...state.leakage, [measure.location]: leftAtLocation - appliedCfm50 };
  const energyAfter = appliedCfm50 === 0 ? state.energy : model.energyOf(leakageAfter);
  return {
    measure,
    cfm50Before,
    cfm50After: cfm50Before - appliedCfm50,
    appliedCfm50,
    limitedBy,
    leakageBefore: state.leakage,
    leakageAfter,
    energyAfter,
    saved: energySaved(state.energy, energyAfter),
  };
}

/** The state a step leaves behind. */
export function stateAfter(outcome: StepOutcome): PlanState {
  return { leakage: outcome.leakageAfter, energy: outcome.energyAfter };
}

/** Float figures of a step, used to rank candidates; reported money is recomputed in Decimal. */
export interface QuickWorth {
  sir: number;
  npvUsd: number;
  paybackYears: number;
  cceUsdPerMMBtu: number;
}

/** Quick float64 worth of a step, for ranking. Infinite SIR for a free measure that saves. */
export function quickWorth(prices: PriceBook, outcome: StepOutcome): QuickWorth {
  const heatingUsd = outcome.saved.heatingFuelUnits * prices.heating.usdPerUnitFloat;
  const electricKwh = outcome.saved.coolingKwh + outcome.saved.ventilationFanKwh;
  const electricityUsd =
    electricKwh === 0 ? 0 : electricKwh * (prices.electricity?.usdPerUnitFloat ?? 0);
  const annualUsd = heatingUsd + electricityUsd;
  const life = outcome.measure.lifeYears;
  const pvUsd = prices.presentValueFloat(heatingUsd, electricityUsd, life);
  const costUsd = outcome.measure.cost.totalUsdFloat;
  const crf =
    prices.discountRateReal === 0
      ? 1 / life
      : prices.discountRateReal / (1 - (1 + prices.discountRateReal) ** -life);
  return {
    sir: costUsd > 0 ? pvUsd / costUsd : pvUsd > 0 ? Infinity : 0,
    npvUsd: pvUsd - costUsd,
    paybackYears: annualUsd > 0 ? costUsd / annualUsd : Infinity,
    cceUsdPerMMBtu:
      outcome.saved.siteMMBtu > 0 ? (costUsd * crf) / outcome.saved.siteMMBtu : Infinity,
  };
}
