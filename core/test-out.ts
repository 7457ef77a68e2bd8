/**
 * What the test after the work says about the estimates: for each home with a test-out, the
 * leakage measured against the leakage the plan expected, the realization rate (measured
 * reduction ÷ estimated reduction of the work done), the share of the target reached, and a
 * flag for review when the house tested leakier after the work than before. Across homes, a
 * realization rate per measure type by proportional allocation: each home's measured
 * reduction is shared among its done measures in proportion to their estimates, and a type's
 * rate is what it was allocated over what it was estimated (common practice; the calibration
 * module fits the types jointly by non-negative least squares instead).
 */
import { fitOfTest, type Evaluation } from './evaluate.ts';
import { InputError } from './errors.ts';
import type { HomeFile } from './schema.ts';

/** A done measure as the plan valued it. */
export interface DoneMeasure {
  id: string;
  type: string;
  /** The reduction the plan expected of it where it stands in the sequence, CFM50. */
  estimatedReductionCfm50: number;
}

export interface TestOutInput {
  homeId: number;
  name: string;
  testInCfm50: number;
  testOutCfm50: number;
  /** The leakage the package aims at, CFM50. */
  targetCfm50: number;
  done: DoneMeasure[];
  /** True when no measure is marked done and the whole package is taken as the work done. */
  packageAssumed: boolean;
}

export interface TestOutResult extends TestOutInput {
  measuredReductionCfm50: number;
  estimatedReductionCfm50: number;
  /** Measured ÷ estimated reduction; null when nothing was estimated. */
  realizationRate: number | null;
  /** Measured reduction ÷ (test-in − target); null when the target is the test-in. */
  targetReachedFraction: number | null;
  /** Why the home wants a second look, in words; empty when it does not. */
  review: string[];
}

export interface TypeRealization {
  type: string;
  homes: number;
  measures: number;
  estimatedReductionCfm50: number;
  allocatedReductionCfm50: number;
  /** Allocated ÷ estimated; null when nothing was estimated. */
  realizationRate: number | null;
}

/** A realization rate outside this band is worth a second look (common practice). */
export const REVIEW_REALIZATION_BAND = { low: 0.25, high: 2 } as const;

/** The latest test-out of a home file (by date, then by order), or null. */
export function latestTestOut(
  home: HomeFile,
): NonNullable<HomeFile['otherLeakageTests']>[number] | null {
  const outs = (home.otherLeakageTests ?? [])
    .map((test, index) => ({ test, index }))
    .filter(({ test }) => test.kind === 'testOut');
  outs.sort(
    (a, b) => (a.test.testedOn ?? '').localeCompare(b.test.testedOn ?? '') || a.index - b.index,
  );
  return outs.at(-1)?.test ?? null;
}

/**
 * The test-out input of an evaluated home, or null when it has no test-out.
 *
 * @param homeId - the home's id in the project
 * @param evaluation - its evaluation (the test-out is the latest of its other tests)
 */
export function testOutInputOf(homeId: number, evaluation: Evaluation): TestOutInput | null {
  const test = latestTestOut(evaluation.home);
  if (test === null) return null;
  const { kind: _kind, ...shape } = test;
  const testOutCfm50 = fitOfTest(shape).cfm50;
  const entries = evaluation.plan.entries;
  const doneEntries = entries.filter(
    (entry) => entry.included && entry.step.measure.status === 'done',
  );
  const packageAssumed = doneEntries.length === 0;
  const worked = packageAssumed ? entries.filter((entry) => entry.included) : doneEntries;
  return {
    homeId,
    name: evaluation.home.name,
    testInCfm50: evaluation.plan.package.cfm50Before,
    testOutCfm50,
    targetCfm50: evaluation.plan.package.cfm50After,
    done: worked.map((entry) => ({
      id: entry.step.measure.id,
      type: entry.step.measure.type.id,
      estimatedReductionCfm50: entry.step.appliedCfm50,
    })),
    packageAssumed,
  };
}

function requireInput(input: TestOutInput, index: number): void {
  for (const field of ['testInCfm50', 'testOutCfm50', 'targetCfm50'] as const) {
    const value = input[field];
    if (!(Number.isFinite(value) && value >= 0)) {
      throw InputError.at(`homes[${index}].${field}`, `expected CFM50 of at least 0, got ${value}`);
    }
  }
}

/** Each home's test-out against its estimate. */
export function testOutResults(inputs: readonly TestOutInput[]): TestOutResult[] {
  return inputs.map((input, index) => {
    requireInput(input, index);
    const measured = input.testInCfm50 - input.testOutCfm50;
    const estimated = input.done.reduce((sum, measure) => sum + measure.estimatedReductionCfm50, 0);
    const aimed = input.testInCfm50 - input.targetCfm50;
    const realizationRate = estimated > 0 ? measured / estimated : null;
    const review: string[] = [];
    if (input.testOutCfm50 > input.testInCfm50) {
      review.push(
        `The test-out (${Math.round(input.testOutCfm50)} CFM50) shows more leakage than the test-in (${Math.round(input.testInCfm50)} CFM50): check the tests' set-up and the work.`,
      );
    } else if (
      realizationRate !== null &&
      (realizationRate < REVIEW_REALIZATION_BAND.low ||
        realizationRate > REVIEW_REALIZATION_BAND.high)
    ) {
      review.push(
        `The work removed ${Math.round(realizationRate * 100)} % of the leakage estimated for it: check the estimates and the tests.`,
      );
    }
    return {
      ...input,
      measuredReductionCfm50: measured,
      estimatedReductionCfm50: estimated,
      realizationRate,
      targetReachedFraction: aimed > 0 ? measured / aimed : null,
      review,
    };
  });
}

/** Realization rate per measure type, each home's measured reduction shared by estimate. */
export function realizationByType(results: readonly TestOutResult[]): TypeRealization[] {
  const types = new Map<
    string,
    { homes: Set<number>; measures: number; estimated: number; allocated: number }
  >();
  for (const result of results) {
    const estimated = result.estimatedReductionCfm50;
    for (const measure of result.done) {
      const entry = types.get(measure.type) ?? {
        homes: new Set<number>(),
        measures: 0,
        estimated: 0,
        allocated: 0,
      };
      entry.homes.add(result.homeId);
      entry.measures += 1;
      entry.estimated += measure.estimatedReductionCfm50;
      if (estimated > 0) {
        entry.allocated +=
          result.measuredReductionCfm50 * (measure.estimatedReductionCfm50 / estimated);
      }
      types.set(measure.type, entry);
    }
  }
  return [...types.entries()]
    .map(([type, entry]) => ({
      type,
      homes: entry.homes.size,
      measures: entry.measures,
      estimatedReductionCfm50: entry.estimated,
      allocatedReductionCfm50: entry.allocated,
      realizationRate: entry.estimated > 0 ? entry.allocated / entry.estimated : null,
    }))
    .sort((a, b) => a.type.localeCompare(b.type));
}
