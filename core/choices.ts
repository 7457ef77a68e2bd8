/**
 * What a plan offers beyond its ranking, in one place for every host: the range of outcomes
 * of the plan's package (Monte Carlo), the best package within a budget (exact search) and
 * the three options of a proposal with their ranges. The command line, the channels and the
 * page's worker all call these, so their figures are the same.
 */
import { reportOf, type Evaluation } from './evaluate.ts';
import {
  bestPackageReport,
  optionReport,
  uncertaintyReport,
  type BestPackageReport,
  type OptionReport,
  type UncertaintyReport,
} from './choices-report.ts';
import { bestPackage, type PackageObjective } from './plan/best-package.ts';
import { proposalOptions, type ProposalOptionsSettings } from './plan/options.ts';
import type { EvaluationReport } from './report.ts';
import type { Distribution } from './uncertainty/distributions.ts';
import { packageUncertainty, type VariationOptions } from './uncertainty/monte-carlo.ts';
import { withRanges } from './uncertainty/package-ranges.ts';

export type {
  BestPackageReport,
  OptionReport,
  SpreadReport,
  UncertaintyReport,
} from './choices-report.ts';

/** Draws of a run when a seed is given without them. */
export const DEFAULT_DRAWS = 10_000;
/** The seed of a run when draws are given without one. */
export const DEFAULT_SEED = 1;

/** A Monte Carlo run asked for: both fields optional, one of them enough to ask. */
export interface RangesRequest {
  draws?: number;
  seed?: number;
  distribution?: Distribution;
  vary?: VariationOptions;
}

/** A best-package search asked for. */
export interface BudgetRequest {
  /** What the energy measures may cost, USD; Infinity (or null) for no limit. */
  budgetUsd: number | null;
  objective?: PackageObjective;
  everyMeasureSirAtLeastOne?: boolean;
  packageSirAtLeastOne?: boolean;
}

export interface ChoicesRequest extends RangesRequest {
  /** Search the best package too (left out: no search). */
  budget?: BudgetRequest;
}

/** The evaluation report with the choices asked for. */
export interface EvaluationWithChoices extends EvaluationReport {
  uncertainty?: UncertaintyReport;
  bestPackage?: BestPackageReport;
}

/** Whether a request asks for a run, and its settings with the defaults filled in. */
function runOf(request: RangesRequest) {
  if (request.draws === undefined && request.seed === undefined) return null;
  return {
    draws: request.draws ?? DEFAULT_DRAWS,
    seed: request.seed ?? DEFAULT_SEED,
    ...(request.distribution ? { distribution: request.distribution } : {}),
    ...(request.vary ? { vary: request.vary } : {}),
  };
}

/** The JSON of the plan's package's range of outcomes. */
export function uncertaintyReportOf(
  evaluation: Evaluation,
  request: RangesRequest,
): UncertaintyReport {
  return uncertaintyReport(
    packageUncertainty(evaluation, runOf(request) ?? { draws: DEFAULT_DRAWS, seed: DEFAULT_SEED }),
  );
}

/** The best package's JSON for a budget request. */
export function bestPackageFor(evaluation: Evaluation, budget: BudgetRequest): BestPackageReport {
  const constraints = {
    everyMeasureSirAtLeastOne: budget.everyMeasureSirAtLeastOne ?? false,
    packageSirAtLeastOne: budget.packageSirAtLeastOne ?? false,
  };
  const best = bestPackage(evaluation, {
    budgetUsd: budget.budgetUsd ?? Infinity,
    ...(budget.objective ? { objective: budget.objective } : {}),
    ...constraints,
  });
  return bestPackageReport(best, constraints);
}

/**
 * The evaluation report with the plan's range of outcomes and the best package, as asked.
 *
 * @throws InputError naming the option at fault (draws, seed, distribution, budgetUsd, …)
 */
export function reportWithChoices(
  evaluation: Evaluation,
  request: ChoicesRequest,
): EvaluationWithChoices {
  const report: EvaluationWithChoices = reportOf(evaluation);
  const run = runOf(request);
  if (run) report.uncertainty = uncertaintyReportOf(evaluation, run);
  if (request.budget) report.bestPackage = bestPackageFor(evaluation, request.budget);
  return report;
}

/**
 * The proposal's three options, each with its range when a run is asked for.
 *
 * @throws InputError naming the setting at fault
 */
export function proposalOptionsReport(
  evaluation: Evaluation,
  request: ProposalOptionsSettings & RangesRequest = {},
): OptionReport[] {
  const { draws, seed, distribution, vary, ...settings } = request;
  const tiers = proposalOptions(evaluation, settings);
  const run = runOf({ draws, seed, distribution, vary });
  return (run ? withRanges(evaluation, tiers, run) : tiers).map(optionReport);
}
