/**
 * Measured savings from bills before and after the work: the drop in normalized annual use
 * (both years' bills restated for the same typical year, so a mild winter after the work
 * is not taken for savings), set against the plan's estimate.
 */
import { InputError, type InputProblem } from '../errors.ts';
import type { FuelFacts } from '../fuels.ts';
import type { Fuel } from '../schema.ts';
import { temperatureProblems } from './bills.ts';
import { checkNormalYear, type DegreeDayKind } from './degree-days.ts';
import type { BillingWarning } from './fit-quality.ts';
import { fitDegreeDays, type DegreeDayFit, type DegreeDayFitInput } from './prism.ts';

/** The fits before and after, and the estimate to hold them against. */
export interface SavingsInput {
  /** The fit of the bills before the work. */
  pre: DegreeDayFit;
  /** The fit of the bills after the work: same fuel, kind and normal year. */
  post: DegreeDayFit;
  /** The plan's estimate of the yearly savings, in the fits' fuel unit per year. */
  estimatedSavingsPerYear: number;
}

/** A warning of the comparison: from the fit before, the fit after, or the savings. */
export interface SavingsWarning {
  from: 'pre' | 'post' | 'savings';
  code: BillingWarning['code'] | 'use-rose' | 'no-estimate';
  message: string;
}

/** Savings measured from the bills, in the fuel's unit and as a share, against the estimate. */
export interface MeasuredSavings {
  fuel: Fuel;
  unit: FuelFacts['unit'];
  kind: DegreeDayKind;
  /** NAC before, fuel unit per year. */
  preNormalizedAnnualUse: number;
  /** NAC after, fuel unit per year. */
  postNormalizedAnnualUse: number;
  /** NAC_pre − NAC_post, fuel unit per year (negative when use rose). */
  savingsPerYear: number;
  /** savings / NAC_pre, a fraction; null when NAC_pre is not above 0. */
  savingsShare: number | null;
  /** The estimate given, fuel unit per year. */
  estimatedSavingsPerYear: number;
  /** Measured savings / estimated savings; null when the estimate is 0. */
  realizationRate: number | null;
  /** Both fits' warnings, then the comparison's. */
  warnings: SavingsWarning[];
}

/** Two normal years agreeing to this share at 65 °F are taken to be the same. */
const SAME_NORMAL_YEAR_TOLERANCE = 1e-9;

function comparisonProblems(input: SavingsInput): InputProblem[] {
  const { pre, post } = input;
  const problems: InputProblem[] = [];
  if (post.fuel !== pre.fuel) {
    problems.push({
      path: 'post.fuel',
      message: `expected ${pre.fuel} as before, got ${post.fuel}`,
    });
  }
  if (post.kind !== pre.kind) {
    problems.push({
      path: 'post.kind',
      message: `expected ${pre.kind} as before, got ${post.kind}`,
    });
  }
  const pre65 = pre.normalDegreeDays65F;
  const gap = Math.abs(post.normalDegreeDays65F - pre65);
  if (!(gap <= SAME_NORMAL_YEAR_TOLERANCE * Math.max(1, Math.abs(pre65)))) {
    problems.push({
      path: 'post.normalDegreeDays65F',
      message: `expected the normal year of the fit before (${pre65.toFixed(1)} degree days at 65 °F), got ${post.normalDegreeDays65F.toFixed(1)}: normalize both to the same year`,
    });
  }
  if (!Number.isFinite(input.estimatedSavingsPerYear)) {
    problems.push({
      path: 'estimatedSavingsPerYear',
      message: `expected a number in ${pre.unit} per year, got ${input.estimatedSavingsPerYear}`,
    });
  }
  return problems;
}

/**
 * The normalized savings of a pair of fits, against an estimate.
 *
 * @param input - the fit before and after the work (same fuel, kind and normal year), and
 *   the estimated savings in the fuel's unit per year
 * @returns NAC before and after, the savings (unit/year) and their share of NAC before,
 *   the realization rate, and the warnings of both fits and of the comparison
 * @throws InputError naming the field: another fuel, kind or normal year after than before,
 *   an estimate that is not a number
 *
 * Notes: savings = NAC_pre − NAC_post; share = savings / NAC_pre; realization rate =
 * savings / estimate.
 *
 * References: M. F. Fels, "PRISM: an introduction", Energy and Buildings 9 (1986) 5–18
 * (savings as the change in normalized annual consumption).
 */
export function measuredSavings(input: SavingsInput): MeasuredSavings {
  const problems = comparisonProblems(input);
  if (problems.length > 0) throw new InputError(problems);
  const { pre, post, estimatedSavingsPerYear } = input;
  const savingsPerYear = pre.normalizedAnnualUse - post.normalizedAnnualUse;
  const warnings: SavingsWarning[] = [
    ...pre.warnings.map((warning) => ({ from: 'pre' as const, ...warning })),
    ...post.warnings.map((warning) => ({ from: 'post' as const, ...warning })),
  ];
  if (savingsPerYear < 0) {
    warnings.push({
      from: 'savings',
      code: 'use-rose',
      message: `normalized use rose by ${(-savingsPerYear).toFixed(1)} ${pre.unit} a year after the work: look for a change in the household or another fuel's use`,
    });
  }
  if (estimatedSavingsPerYear === 0) {
    warnings.push({
      from: 'savings',
      code: 'no-estimate',
      message: 'the estimate is 0, so there is no realization rate',
    });
  }
  return {
    fuel: pre.fuel,
    unit: pre.unit,
    kind: pre.kind,
    preNormalizedAnnualUse: pre.normalizedAnnualUse,
    postNormalizedAnnualUse: post.normalizedAnnualUse,
    savingsPerYear,
    savingsShare: pre.normalizedAnnualUse > 0 ? savingsPerYear / pre.normalizedAnnualUse : null,
    estimatedSavingsPerYear,
    realizationRate:
      estimatedSavingsPerYear === 0 ? null : savingsPerYear / estimatedSavingsPerYear,
    warnings,
  };
}

/** The bills before and after the work, on one set of temperatures and one normal year. */
export interface BillsSavingsInput extends Omit<DegreeDayFitInput, 'bills'> {
  preBills: DegreeDayFitInput['bills'];
  postBills: DegreeDayFitInput['bills'];
  /** The plan's estimate of the yearly savings, in the bills' fuel unit per year. */
  estimatedSavingsPerYear: number;
}

/** Runs a fit, saying its problems under `prefix` (`preBills[3].use`). */
function under<T>(prefix: string, run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(
      error.problems.map((problem) => ({
        path: problem.path.replace(/^bills/, prefix),
        message: problem.message,
      })),
    );
  }
}

/**
 * Fits the bills before and after the work the same way and compares them.
 *
 * @param input - the bills before and after (one fuel, use in its unit), the daily means
 *   (°F) covering both, the normal year, the estimate (unit/year), and the fit's options
 * @returns the savings of `measuredSavings` on the two `fitDegreeDays` fits
 * @throws InputError naming the field (`postBills[2].periodEnd`, `temperatures[40].date`)
 *
 * Notes: both fits use the same temperatures, normal year, kind, weighting and range, so
 * their normalized uses are comparable by construction.
 *
 * References: as `measuredSavings` and `fitDegreeDays`.
 */
export function measuredSavingsFromBills(input: BillsSavingsInput): MeasuredSavings {
  const { preBills, postBills, estimatedSavingsPerYear, ...shared } = input;
  const problems = [...temperatureProblems(shared.temperatures)];
  try {
    checkNormalYear(shared.normalYear);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    problems.push(...error.problems);
  }
  if (problems.length > 0) throw new InputError(problems);
  const pre = under('preBills', () => fitDegreeDays({ ...shared, bills: preBills }));
  const post = under('postBills', () => fitDegreeDays({ ...shared, bills: postBills }));
  return measuredSavings({ pre, post, estimatedSavingsPerYear });
}
