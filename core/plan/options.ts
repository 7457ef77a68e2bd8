/**
 * Options for a proposal: three packages a client can choose from, each with its cost,
 * savings, payback, NPV, SIR and measures.
 *
 * - 'first-step' (First step): the best NPV among packages whose energy measures cost at most
 *   a share of the recommended package's (40 % unless stated) or a stated budget, each
 *   measure with SIR ≥ 1 where it stands.
 * - 'recommended' (Recommended): the plan's own package (core/plan.ts).
 * - 'thorough' (Thorough): the most savings a year with the package SIR ≥ 1, within a stated
 *   budget or none.
 *
 * The first and last come from the exact search (core/plan/best-package.ts); all three are
 * valued the same way (packageFigures), so they compare figure for figure. A tier's range of
 * outcomes comes from the uncertainty engine; `range` is left out until it is filled.
 */
import type { Evaluation } from '../evaluate.ts';
import { InputError } from '../errors.ts';
import type { Decimal } from '../money.ts';
import { bestPackage, packageFigures, type PackageFigures } from './best-package.ts';
import { buildPriceBook } from './prices.ts';

/** Share of the recommended package's energy cost the first step may spend, by default. */
export const FIRST_STEP_SHARE_DEFAULT = 0.4;

export type ProposalTierId = 'first-step' | 'recommended' | 'thorough';

/** Percentiles of a tier's outcomes over the estimates' ranges (the uncertainty engine's). */
export interface ProposalTierRange {
  annualSavingsUsd: { p10: number; p50: number; p90: number };
  npvUsd: { p10: number; p50: number; p90: number };
  /** Chance the package SIR is at least 1, 0–1. */
  chanceSirAtLeastOne: number;
}

export interface ProposalTier {
  id: ProposalTierId;
  name: string;
  /** What the tier is, in a sentence for the proposal. */
  description: string;
  measureIds: string[];
  costUsd: Decimal;
  /** The part of the cost that is health and safety (its measures and any fan). */
  healthAndSafetyCostUsd: Decimal;
  annualSavingsUsd: Decimal;
  simplePaybackYears: Decimal | null;
  npvUsd: Decimal;
  sir: Decimal | null;
  fanAdded: boolean;
  /** Set once the uncertainty engine has run over the tier's measures. */
  range?: ProposalTierRange;
}

export interface ProposalOptionsSettings {
  /** Energy-measure budget of the first step, USD; by default a share of the recommended. */
  firstStepBudgetUsd?: number;
  /** That share, 0–1 (default 0.4); ignored when firstStepBudgetUsd is given. */
  firstStepShare?: number;
  /** Energy-measure budget of the thorough package, USD (default: none). */
  thoroughBudgetUsd?: number;
}

function tierOf(
  id: ProposalTierId,
  name: string,
  description: string,
  figures: PackageFigures,
): ProposalTier {
  return {
    id,
    name,
    description,
    measureIds: figures.measureIds,
    costUsd: figures.costUsd,
    healthAndSafetyCostUsd: figures.healthAndSafetyCostUsd,
    annualSavingsUsd: figures.annualSavingsUsd,
    simplePaybackYears: figures.simplePaybackYears,
    npvUsd: figures.npvUsd,
    sir: figures.sir,
    fanAdded: figures.fanAdded,
  };
}

/**
 * The three options of a proposal.
 *
 * @param evaluation - the home's evaluation (evaluateHome)
 * @param settings.firstStepBudgetUsd - the first step's energy budget, USD
 * @param settings.firstStepShare - else its share of the recommended energy cost, 0–1
 * @param settings.thoroughBudgetUsd - the thorough package's energy budget, USD
 * @returns first step, recommended, thorough, in that order
 * @throws InputError naming a setting out of range
 */
export function proposalOptions(
  evaluation: Evaluation,
  settings: ProposalOptionsSettings = {},
): ProposalTier[] {
  const share = settings.firstStepShare ?? FIRST_STEP_SHARE_DEFAULT;
  if (!(share >= 0 && share <= 1)) {
    throw InputError.at('firstStepShare', 'expected a share from 0 to 1');
  }
  for (const field of ['firstStepBudgetUsd', 'thoroughBudgetUsd'] as const) {
    const budget = settings[field];
    if (budget !== undefined && !(budget >= 0)) {
      throw InputError.at(field, 'expected a number of dollars of at least 0 (or Infinity)');
    }
  }
  const prices = buildPriceBook(evaluation.home);
  const recommendedIds = evaluation.plan.entries
    .filter((entry) => entry.included && !entry.step.measure.cost.healthAndSafety)
    .map((entry) => entry.step.measure.id);
  const recommended = packageFigures(evaluation, recommendedIds, prices);
  const firstBudgetUsd =
    settings.firstStepBudgetUsd ?? recommended.budgetCostUsd.times(share).toNumber();
  const first = bestPackage(evaluation, {
    budgetUsd: firstBudgetUsd,
    objective: 'npv',
    everyMeasureSirAtLeastOne: true,
  });
  const thorough = bestPackage(evaluation, {
    budgetUsd: settings.thoroughBudgetUsd ?? Infinity,
    objective: 'savings',
    packageSirAtLeastOne: true,
  });
  return [
    tierOf(
      'first-step',
      'First step',
      'The measures worth most for a smaller spend, each paying back its cost over its life.',
      first,
    ),
    tierOf(
      'recommended',
      'Recommended',
      'The plan: each measure taken in turn while it pays.',
      recommended,
    ),
    tierOf(
      'thorough',
      'Thorough',
      'The most energy saved while the package as a whole still pays back its cost.',
      thorough,
    ),
  ];
}
