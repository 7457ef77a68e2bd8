/**
 * The plan of a home: its measures sequenced and valued one after another, the package they
 * make, its ventilation need and its worth over a range of estimates.
 */
import type { AnnualEnergy } from './energy.ts';
import { savingsToInvestmentRatio, simplePaybackYears } from './economics/index.ts';
import { totalCfm50, type HomeModel } from './home-model.ts';
import type { PreparedMeasure } from './measures.ts';
import { Decimal, sumUsd } from './money.ts';
import { sequenceMeasures } from './plan/sequence.ts';
import {
  applyMeasure,
  stateAfter,
  stateOf,
  type PlanState,
  type StepOutcome,
} from './plan/step.ts';
import { financingOf, type PlanFinancing } from './plan/financing.ts';
import { ventilationAfterPackage, type VentilationOutcome } from './plan/ventilation-fan.ts';
import { worthOfStep, type MeasureWorth } from './plan/worth.ts';
import type { PriceBook } from './plan/prices.ts';
import type { Range, Ranking } from './schema.ts';

export interface PlanEntry {
  /** Position in the plan: the package first in the order applied, then what was left out. */
  rank: number;
  included: boolean;
  step: StepOutcome;
  worth: MeasureWorth;
  /** The year's savings with every included measure at its low, likely and high estimate. */
  annualSavingsUsdRange: { low: Decimal; likely: Decimal; high: Decimal };
  /** A measure that is not health and safety and fails SIR ≥ 1 where the plan puts it. */
  sirBelowOne: boolean;
}

export interface PackageEnergy {
  heatingFuelUnits: number;
  coolingKwh: number;
  /** Ventilation fan electricity saved (negative when the package adds a fan), kWh. */
  ventilationFanKwh: number;
  siteMMBtu: number;
  co2Kg: number;
}

export interface PlanPackage {
  measureIds: string[];
  cfm50Before: number;
  cfm50After: number;
  annualSavings: PackageEnergy;
  annualSavingsUsd: Decimal;
  annualSavingsUsdRange: { low: Decimal; likely: Decimal; high: Decimal };
  costUsd: Decimal;
  healthAndSafetyCostUsd: Decimal;
  pvSavingsUsd: Decimal;
  npvUsd: Decimal;
  /** PV of the savings of the energy measures (net of the ventilation they call for) ÷ their cost. */
  sir: Decimal | null;
  simplePaybackYears: Decimal | null;
  ventilation: VentilationOutcome;
  financing: PlanFinancing | null;
}

export interface PlanResult {
  ranking: Ranking;
  entries: PlanEntry[];
  package: PlanPackage;
}

/** Replays the package's steps in order with one point of every estimate range. */
function replay(
  model: HomeModel,
  start: PlanState,
  measures: readonly PreparedMeasure[],
  estimate: keyof Range,
): StepOutcome[] {
  let state = start;
  return measures.map((measure) => {
    const outcome = applyMeasure(model, state, measure, estimate);
    state = stateAfter(outcome);
    return outcome;
  });
}

function sumEnergy(steps: readonly StepOutcome[]): AnnualEnergy {
  const total: AnnualEnergy = {
    heatingLoadBtu: 0,
    coolingLoadBtu: 0,
    heatingFuelUnits: 0,
    coolingKwh: 0,
    ventilationFanKwh: 0,
    siteMMBtu: 0,
    co2Kg: 0,
  };
  for (const { saved } of steps) {
    total.heatingLoadBtu += saved.heatingLoadBtu;
    total.coolingLoadBtu += saved.coolingLoadBtu;
    total.heatingFuelUnits += saved.heatingFuelUnits;
    total.coolingKwh += saved.coolingKwh;
    total.ventilationFanKwh += saved.ventilationFanKwh;
    total.siteMMBtu += saved.siteMMBtu;
    total.co2Kg += saved.co2Kg;
  }
  return total;
}

/** Annual savings of each of a package's steps and their total. */
function packageAnnualUsd(
  prices: PriceBook,
  steps: readonly StepOutcome[],
): { stepsUsd: Decimal[]; totalUsd: Decimal } {
  const stepsUsd = steps.map((step) => prices.annualWorth(step.saved).totalUsd);
  return { stepsUsd, totalUsd: sumUsd(stepsUsd) };
}

/**
 * Plans a home.
 *
 * @param options.ranking - the criterion ordering the measures (SIR by default)
 * @returns the ranked entries and the package
 */
export function planHome(options: {
  model: HomeModel;
  prices: PriceBook;
  measures: readonly PreparedMeasure[];
  ranking: Ranking;
}): PlanResult {
  const { model, prices, measures, ranking } = options;
  const start = stateOf(model, model.testIn);
  const sequenced = sequenceMeasures({ model, prices, measures, startState: start, ranking });
  const includedMeasures = sequenced.included.map((step) => step.measure);

  const low = packageAnnualUsd(prices, replay(model, start, includedMeasures, 'low'));
  const high = packageAnnualUsd(prices, replay(model, start, includedMeasures, 'high'));

  const entries: PlanEntry[] = [];
  sequenced.included.forEach((step, index) => {
    const worth = worthOfStep(prices, step);
    entries.push({
      rank: index + 1,
      included: true,
      step,
      worth,
      annualSavingsUsdRange: {
        low: low.stepsUsd[index] ?? new Decimal(0),
        likely: worth.annualSavingsUsd,
        high: high.stepsUsd[index] ?? new Decimal(0),
      },
      sirBelowOne: worth.sir !== null && worth.sir.lt(1),
    });
  });
  const finalState = sequenced.finalState;
  for (const step of sequenced.excluded) {
    const worth = worthOfStep(prices, step);
    const range = (estimate: keyof Range) =>
      prices.annualWorth(applyMeasure(model, finalState, step.measure, estimate).saved).totalUsd;
    entries.push({
      rank: entries.length + 1,
      included: false,
      step,
      worth,
      annualSavingsUsdRange: {
        low: range('low'),
        likely: worth.annualSavingsUsd,
        high: range('high'),
      },
      sirBelowOne: worth.sir !== null && worth.sir.lt(1),
    });
  }

  const included = entries.filter((entry) => entry.included);
  const ventilation = ventilationAfterPackage({ model, prices, leakageAfter: finalState.leakage });
  return {
    ranking,
    entries,
    package: buildPackage({
      model,
      prices,
      included,
      ventilation,
      lowUsd: low.totalUsd,
      highUsd: high.totalUsd,
    }),
  };
}

function buildPackage(options: {
  model: HomeModel;
  prices: PriceBook;
  included: readonly PlanEntry[];
  ventilation: VentilationOutcome;
  lowUsd: Decimal;
  highUsd: Decimal;
}): PlanPackage {
  const { model, included, ventilation } = options;
  const energy = sumEnergy(included.map((entry) => entry.step));
  const annualSavings: PackageEnergy = {
    heatingFuelUnits: energy.heatingFuelUnits,
    coolingKwh: energy.coolingKwh,
    ventilationFanKwh: energy.ventilationFanKwh,
    siteMMBtu: energy.siteMMBtu,
    co2Kg: energy.co2Kg,
  };

  const fanCostUsd = ventilation.addedFan?.costUsd ?? new Decimal(0);
  const measureCosts = included.map((entry) => entry.step.measure.cost);
  const costUsd = sumUsd(measureCosts.map((cost) => cost.totalUsd)).plus(fanCostUsd);
  const healthAndSafetyCostUsd = sumUsd(
    measureCosts.filter((cost) => cost.healthAndSafety).map((cost) => cost.totalUsd),
  ).plus(fanCostUsd);
  const annualSavingsUsd = sumUsd(included.map((entry) => entry.worth.annualSavingsUsd));
  const pvSavingsUsd = sumUsd(included.map((entry) => entry.worth.pvSavingsUsd));

  const energyMeasures = included.filter((entry) => !entry.step.measure.cost.healthAndSafety);
  const sirInvestmentUsd = sumUsd(energyMeasures.map((entry) => entry.step.measure.cost.totalUsd));
  const sirSavingsUsd = sumUsd(energyMeasures.map((entry) => entry.worth.pvSavingsUsd));

  return {
    measureIds: included.map((entry) => entry.step.measure.id),
    cfm50Before: model.testInCfm50,
    cfm50After: included.at(-1)?.step.cfm50After ?? model.testInCfm50,
    annualSavings,
    annualSavingsUsd,
    annualSavingsUsdRange: { low: options.lowUsd, likely: annualSavingsUsd, high: options.highUsd },
    costUsd,
    healthAndSafetyCostUsd,
    pvSavingsUsd,
    npvUsd: pvSavingsUsd.minus(costUsd),
    sir: sirInvestmentUsd.gt(0)
      ? savingsToInvestmentRatio({
          presentValueSavingsUsd: sirSavingsUsd,
          investmentUsd: sirInvestmentUsd,
        })
      : null,
    simplePaybackYears: simplePaybackYears({
      investmentUsd: costUsd,
      firstYearSavingsUsd: annualSavingsUsd,
    }),
    ventilation,
    financing: financingOf({
      terms: model.home.financing,
      costUsd,
      annualSavingsUsd,
      prices: options.prices,
      steps: included.map((entry) => entry.step),
    }),
  };
}

export { totalCfm50 };
export type { PlanFinancing };
