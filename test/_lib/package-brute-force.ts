/**
 * Every package of a home valued by a plain replay, for checking the best-package search:
 * each subset of the energy measures applied in the plan's order (declined dropped), after the
 * health-and-safety measures, with the core's own step (`applyMeasure`), its own worth of a
 * step (`worthOfStep`) and its own ventilation check (`ventilationAfterPackage`), and the
 * package totals summed as core/plan.ts sums them. Nothing here comes from
 * core/plan/best-package.ts. Subsets share their prefixes, so 2^n packages take 2^n steps.
 */
import Decimal from 'decimal.js';
import type { Evaluation } from '../../core/evaluate.ts';
import type { PreparedMeasure } from '../../core/measures.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { applyMeasure, stateAfter, stateOf, type PlanState } from '../../core/plan/step.ts';
import { ventilationAfterPackage } from '../../core/plan/ventilation-fan.ts';
import { worthOfStep } from '../../core/plan/worth.ts';

export interface ReplayedPackage {
  /** Positions of the chosen energy measures in the plan's order, ascending. */
  positions: number[];
  measureIds: string[];
  energyCostUsd: Decimal;
  costUsd: Decimal;
  annualSavingsUsd: Decimal;
  npvUsd: Decimal;
  sir: Decimal | null;
  /** Whether every chosen energy measure with a cost has SIR ≥ 1 where it stands. */
  everySirAtLeastOne: boolean;
}

interface Totals {
  pv: Decimal;
  annual: Decimal;
  energyPv: Decimal;
  energyCost: Decimal;
  cost: Decimal;
}

/** The energy measures of an evaluation in plan order, and the health-and-safety ones. */
export function measuresInPlanOrder(evaluation: Evaluation): {
  healthAndSafety: PreparedMeasure[];
  energy: PreparedMeasure[];
} {
  const measures = evaluation.plan.entries
    .map((entry) => entry.step.measure)
    .filter((measure) => measure.status !== 'declined');
  return {
    healthAndSafety: measures.filter((measure) => measure.cost.healthAndSafety),
    energy: measures.filter((measure) => !measure.cost.healthAndSafety),
  };
}

/**
 * Values every package of a home.
 *
 * @returns one entry per subset of the energy measures (2^n of them)
 */
export function everyPackage(evaluation: Evaluation): ReplayedPackage[] {
  const { model } = evaluation;
  const prices = buildPriceBook(evaluation.home);
  const { healthAndSafety, energy } = measuresInPlanOrder(evaluation);
  let state: PlanState = stateOf(model, model.testIn);
  const base: Totals = {
    pv: new Decimal(0),
    annual: new Decimal(0),
    energyPv: new Decimal(0),
    energyCost: new Decimal(0),
    cost: new Decimal(0),
  };
  for (const measure of healthAndSafety) {
    const outcome = applyMeasure(model, state, measure);
    const worth = worthOfStep(prices, outcome);
    base.pv = base.pv.plus(worth.pvSavingsUsd);
    base.annual = base.annual.plus(worth.annualSavingsUsd);
    base.cost = base.cost.plus(measure.cost.totalUsd);
    state = stateAfter(outcome);
  }
  const packages: ReplayedPackage[] = [];
  const record = (at: PlanState, positions: number[], totals: Totals, everySir: boolean) => {
    const fan = ventilationAfterPackage({ model, prices, leakageAfter: at.leakage }).addedFan;
    const costUsd = totals.cost.plus(fan?.costUsd ?? 0);
    packages.push({
      positions,
      measureIds: [
        ...healthAndSafety.map((measure) => measure.id),
        ...positions.map((position) => energy[position]?.id ?? '?'),
      ],
      energyCostUsd: totals.energyCost,
      costUsd,
      annualSavingsUsd: totals.annual,
      npvUsd: totals.pv.minus(costUsd),
      sir: totals.energyCost.gt(0) ? totals.energyPv.div(totals.energyCost) : null,
      everySirAtLeastOne: everySir,
    });
  };
  const extend = (
    at: PlanState,
    from: number,
    positions: number[],
    totals: Totals,
    ok: boolean,
  ) => {
    record(at, positions, totals, ok);
    for (let position = from; position < energy.length; position += 1) {
      const measure = energy[position];
      if (!measure) continue;
      const outcome = applyMeasure(model, at, measure);
      const worth = worthOfStep(prices, outcome);
      extend(
        stateAfter(outcome),
        position + 1,
        [...positions, position],
        {
          pv: totals.pv.plus(worth.pvSavingsUsd),
          annual: totals.annual.plus(worth.annualSavingsUsd),
          energyPv: totals.energyPv.plus(worth.pvSavingsUsd),
          energyCost: totals.energyCost.plus(measure.cost.totalUsd),
          cost: totals.cost.plus(measure.cost.totalUsd),
        },
        ok && (worth.sir === null || worth.sir.gte(1)),
      );
    }
  };
  extend(state, 0, [], base, true);
  return packages;
}

export interface BruteForceQuery {
  budgetUsd: number;
  objective: 'npv' | 'savings' | 'sir';
  everyMeasureSirAtLeastOne: boolean;
  packageSirAtLeastOne: boolean;
}

/**
 * The best of the packages by the documented rule: the budget covers the energy measures;
 * the highest score (a null SIR lowest), then the lower cost, then fewer measures, then the
 * earliest positions.
 */
export function bestByBruteForce(
  packages: readonly ReplayedPackage[],
  query: BruteForceQuery,
): ReplayedPackage {
  const scoreOf = (entry: ReplayedPackage) =>
    query.objective === 'npv'
      ? entry.npvUsd
      : query.objective === 'savings'
        ? entry.annualSavingsUsd
        : entry.sir;
  const feasible = packages.filter(
    (entry) =>
      entry.energyCostUsd.lte(query.budgetUsd) &&
      (!query.everyMeasureSirAtLeastOne || entry.everySirAtLeastOne) &&
      (!query.packageSirAtLeastOne || entry.sir === null || entry.sir.gte(1)),
  );
  let best: ReplayedPackage | undefined;
  for (const entry of feasible) {
    if (best === undefined) {
      best = entry;
      continue;
    }
    const a = scoreOf(entry);
    const b = scoreOf(best);
    let better: boolean | null = null;
    if (a === null && b !== null) better = false;
    else if (a !== null && b === null) better = true;
    else if (a !== null && b !== null && !a.eq(b)) better = a.gt(b);
    if (better === null && !entry.costUsd.eq(best.costUsd)) better = entry.costUsd.lt(best.costUsd);
    if (better === null && entry.positions.length !== best.positions.length) {
      better = entry.positions.length < best.positions.length;
    }
    if (better === null) {
      const index = entry.positions.findIndex((position, i) => position !== best?.positions[i]);
      better = index >= 0 && (entry.positions[index] ?? 0) < (best.positions[index] ?? 0);
    }
    if (better) best = entry;
  }
  if (best === undefined) throw new Error('no feasible package: the empty one should be');
  return best;
}
