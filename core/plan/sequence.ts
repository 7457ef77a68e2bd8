/**
 * Orders the measures of a plan. Health-and-safety measures go first, in the order given
 * (they are done whatever they save). Then, step by step, the best remaining measure by the
 * chosen ranking is taken, valued on the leakage the earlier ones left, as long as it still
 * passes SIR ≥ 1. What is left fails the test after the package and is listed, flagged,
 * after it.
 *
 * The weatherization rule behind this: each measure and the package must have SIR ≥ 1, with
 * measures ranked and each valued after the savings of those before it (10 CFR 440.21; the
 * interaction wording from memory).
 */
import type { HomeModel } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import type { Ranking } from '../schema.ts';
import type { PriceBook } from './prices.ts';
import {
  applyMeasure,
  quickWorth,
  stateAfter,
  type PlanState,
  type QuickWorth,
  type StepOutcome,
} from './step.ts';

export interface SequencedPlan {
  /** The package, in the order applied. */
  included: StepOutcome[];
  /** Measures left out (SIR < 1 after the package, or declined), each valued as the next step. */
  excluded: StepOutcome[];
  finalState: PlanState;
}

/** True when `a` ranks before `b` under `ranking`. */
function ranksBefore(ranking: Ranking, a: QuickWorth, b: QuickWorth): boolean {
  switch (ranking) {
    case 'sir':
      return a.sir > b.sir;
    case 'npv':
      return a.npvUsd > b.npvUsd;
    case 'payback':
      return a.paybackYears < b.paybackYears;
    case 'cce':
      return a.cceUsdPerMMBtu < b.cceUsdPerMMBtu;
  }
}

/**
 * Sequences a home's measures.
 *
 * @param options.ranking - the criterion choosing each next measure
 */
export function sequenceMeasures(options: {
  model: HomeModel;
  prices: PriceBook;
  measures: readonly PreparedMeasure[];
  startState: PlanState;
  ranking: Ranking;
}): SequencedPlan {
  const { model, prices, measures, ranking } = options;
  let state = options.startState;
  const included: StepOutcome[] = [];

  for (const measure of measures) {
    if (measure.status === 'declined' || !measure.cost.healthAndSafety) continue;
    const outcome = applyMeasure(model, state, measure);
    included.push(outcome);
    state = stateAfter(outcome);
  }

  let candidates = measures.filter((m) => m.status !== 'declined' && !m.cost.healthAndSafety);
  while (candidates.length > 0) {
    let best: { outcome: StepOutcome; worth: QuickWorth } | null = null;
    for (const measure of candidates) {
      const outcome = applyMeasure(model, state, measure);
      const worth = quickWorth(prices, outcome);
      if (!(worth.sir >= 1)) continue;
      if (best === null || ranksBefore(ranking, worth, best.worth)) best = { outcome, worth };
    }
    if (best === null) break;
    included.push(best.outcome);
    state = stateAfter(best.outcome);
    const chosen = best.outcome.measure;
    candidates = candidates.filter((m) => m !== chosen);
  }

  const leftOut = [...candidates, ...measures.filter((m) => m.status === 'declined')];
  const excluded = leftOut
    .map((measure) => ({
      outcome: applyMeasure(model, state, measure),
      order: measures.indexOf(measure),
    }))
    .map((entry) => ({ ...entry, worth: quickWorth(prices, entry.outcome) }))
    .sort((a, b) => {
      const declinedA = a.outcome.measure.status === 'declined';
      const declinedB = b.outcome.measure.status === 'declined';
      if (declinedA !== declinedB) return declinedA ? 1 : -1;
      if (ranksBefore(ranking, a.worth, b.worth)) return -1;
      if (ranksBefore(ranking, b.worth, a.worth)) return 1;
      return a.order - b.order;
    })
    .map((entry) => entry.outcome);

  return { included, excluded, finalState: state };
}
