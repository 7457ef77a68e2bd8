/**
 * The range of outcomes of any package of a home's measures, not only the plan's own: a
 * proposal's options and the best package within a budget each get their P10 / P50 / P90.
 *
 * The Monte Carlo engine replays the plan's included measures in the plan's order. A chosen
 * package is replayed the way `packageFigures` values it — health-and-safety measures first,
 * then the chosen energy measures, each group in the plan's order — by handing the engine the
 * same evaluation with only those entries, in that order, marked included.
 */
import type { Evaluation } from '../evaluate.ts';
import { InputError } from '../errors.ts';
import type { ProposalTier, ProposalTierRange } from '../plan/options.ts';
import {
  packageUncertainty,
  type PackageUncertainty,
  type UncertaintyOptions,
} from './monte-carlo.ts';

type Evaluated = Pick<Evaluation, 'home' | 'model' | 'plan'>;

/**
 * The evaluation with exactly `measureIds` included, health and safety first, in plan order.
 *
 * @throws InputError naming `measureIds` when an id is not one of the home's measures
 */
export function withPackage(evaluation: Evaluated, measureIds: readonly string[]): Evaluated {
  const wanted = new Set(measureIds);
  const entries = evaluation.plan.entries;
  for (const id of wanted) {
    if (!entries.some((entry) => entry.step.measure.id === id)) {
      throw InputError.at('measureIds', `"${id}" is not one of the home's measures`);
    }
  }
  const chosen = entries
    .filter((entry) => wanted.has(entry.step.measure.id))
    .map((entry) => ({ ...entry, included: true }));
  const healthAndSafety = chosen.filter((entry) => entry.step.measure.cost.healthAndSafety);
  const energy = chosen.filter((entry) => !entry.step.measure.cost.healthAndSafety);
  return { ...evaluation, plan: { ...evaluation.plan, entries: [...healthAndSafety, ...energy] } };
}

/**
 * The uncertainty of one package of the home's measures.
 *
 * @param measureIds - the package's measures, health-and-safety ones included (any order)
 * @param options - draws, seed, distribution and variations, as for `packageUncertainty`
 */
export function measuresUncertainty(
  evaluation: Evaluated,
  measureIds: readonly string[],
  options: UncertaintyOptions,
): PackageUncertainty {
  return packageUncertainty(withPackage(evaluation, measureIds), options);
}

/** The part of a run a proposal shows. */
export function tierRangeOf(uncertainty: PackageUncertainty): ProposalTierRange {
  const percentiles = ({ p10, p50, p90 }: { p10: number; p50: number; p90: number }) => ({
    p10,
    p50,
    p90,
  });
  return {
    annualSavingsUsd: percentiles(uncertainty.annualSavingsUsd),
    npvUsd: percentiles(uncertainty.npvUsd),
    chanceSirAtLeastOne: uncertainty.chanceSirAtLeastOne ?? 0,
  };
}

/**
 * Each option with its range, every option drawn with the same seed and stream so their
 * ranges compare like with like (common random numbers: a measure two options share gets
 * the same draws when it stands at the same place in both).
 */
export function withRanges(
  evaluation: Evaluated,
  tiers: readonly ProposalTier[],
  options: UncertaintyOptions,
): ProposalTier[] {
  return tiers.map((tier) => ({
    ...tier,
    range: tierRangeOf(measuresUncertainty(evaluation, tier.measureIds, options)),
  }));
}
