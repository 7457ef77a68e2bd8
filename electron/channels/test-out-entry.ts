/**
 * Recording a test-out from the work order: the reading stored as a test-out the way the Leak
 * test section stores one (db/repositories/leakage-tests.ts), the result set beside the work
 * order's target and the plan's estimate (core/test-out.ts, the portfolio's own reckoning),
 * and the job moved to tested out by the status rule (db/repositories/jobs.ts), all in one
 * write: a refused status change stores no reading.
 */
import { InputError } from '../../core/errors.ts';
import { formatNumber } from '../../core/format.ts';
import { testOutResults, type TestOutResult } from '../../core/test-out.ts';
import { buildWorkOrder, type TestOutTarget } from '../../core/work-order.ts';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';
import { changeJobStatus, jobHistory, type JobStatusRecord } from '../../db/repositories/jobs.ts';
import { addLeakageTest } from '../../db/repositories/leakage-tests.ts';
import type { WriteAccess } from '../../db/store.ts';

export interface TestOutEntry {
  homeId: number;
  cfm50: number;
  /** `YYYY-MM-DD`. */
  testedOn: string;
  by: string;
  /** The approved measures, as the work order was built; the plan's package when left out. */
  measureIds?: readonly string[];
  note?: string;
}

export interface TestOutOutcome {
  testId: number;
  /** The reading against the work order's target and the estimate of its measures. */
  result: TestOutResult;
  target: TestOutTarget;
  /** Whether the reading is at or under the target CFM50. */
  targetMet: boolean;
  /** Whether the reading is under the 62.2 stop level (ventilation needed), when there is one. */
  belowStopLevel: boolean;
  /** The result in plain words, one sentence each. */
  sentences: string[];
  /** The status change made; null when the job was already tested out (a test repeated). */
  job: JobStatusRecord | null;
}

/** The request's names for the fields the status rule names. */
const STATUS_FIELDS: Readonly<Record<string, string>> = {
  at: 'testedOn',
  by: 'by',
  to: '',
  reason: '',
};

function cfm50Words(value: number): string {
  return `${formatNumber(value)} CFM50`;
}

/** The result in words: against the target, against the estimate, and the stop level. */
function sentencesOf(outcome: Omit<TestOutOutcome, 'sentences' | 'testId' | 'job'>): string[] {
  const { result, target, targetMet, belowStopLevel } = outcome;
  const reading = result.testOutCfm50;
  const sentences = [
    targetMet
      ? `Test-out ${cfm50Words(reading)}: at or under the target of ${cfm50Words(target.targetCfm50)}.`
      : `Test-out ${cfm50Words(reading)}: ${cfm50Words(reading - target.targetCfm50)} above the target of ${cfm50Words(target.targetCfm50)}.`,
  ];
  if (result.estimatedReductionCfm50 > 0 && result.realizationRate !== null) {
    sentences.push(
      `The work removed ${cfm50Words(result.measuredReductionCfm50)} of the ${cfm50Words(result.estimatedReductionCfm50)} estimated for it (${formatNumber(result.realizationRate * 100)} %).`,
    );
  }
  if (belowStopLevel && target.thresholdCfm50 !== null) {
    sentences.push(
      `The reading is below the stop level of ${cfm50Words(Math.ceil(target.thresholdCfm50))}: ASHRAE 62.2 now asks for more ventilation (${formatNumber(target.requiredCfm)} cfm in all) than infiltration and the house's fans give. Add ventilation before the job is closed.`,
    );
  }
  if (target.kind === 'fanPlanned') {
    sentences.push(
      `The package includes a ventilation fan of ${formatNumber(target.addedFanCfm)} cfm: check that it is installed, measure its flow and set it to run as 62.2 requires.`,
    );
  }
  return [...sentences, ...result.review, target.caution];
}

/** A status refusal under the request's own field names. */
function underRequestFields(error: InputError): InputError {
  return new InputError(
    error.problems.map((problem) => ({
      path: STATUS_FIELDS[problem.path] ?? problem.path,
      message: problem.message,
    })),
  );
}

/**
 * Stores a test-out and moves the job to tested out.
 *
 * @returns the stored test's id, the result, the target and the status change
 * @throws InputError naming `cfm50`, `testedOn`, `by`, `measureIds` or (for a job that cannot
 *   move to tested out from where it stands) the whole request; nothing is written then
 */
export function recordTestOut(write: WriteAccess, entry: TestOutEntry): TestOutOutcome {
  const testId = addLeakageTest(write, entry.homeId, {
    kind: 'testOut',
    cfm50: entry.cfm50,
    testedOn: entry.testedOn,
    note: entry.note ?? `Recorded from the work order by ${entry.by.trim()}.`,
  });
  const { evaluation } = evaluateStoredHome(write, entry.homeId);
  const order = buildWorkOrder(
    evaluation,
    entry.measureIds === undefined ? {} : { measureIds: entry.measureIds },
  );
  const [result] = testOutResults([
    {
      homeId: entry.homeId,
      name: order.homeName,
      testInCfm50: order.target.testInCfm50,
      testOutCfm50: entry.cfm50,
      targetCfm50: order.target.targetCfm50,
      done: order.measures.map((measure) => ({
        id: measure.id,
        type: measure.typeId,
        estimatedReductionCfm50: measure.expectedReductionCfm50,
      })),
      packageAssumed: false,
    },
  ]);
  if (result === undefined) throw new Error('expected one test-out result');
  const { target } = order;
  const targetMet = entry.cfm50 <= target.targetCfm50;
  const belowStopLevel =
    target.kind === 'stopAt' &&
    target.thresholdCfm50 !== null &&
    entry.cfm50 < target.thresholdCfm50;
  let job: JobStatusRecord | null = null;
  if (jobHistory(write, entry.homeId).status !== 'testedOut') {
    try {
      job = changeJobStatus(write, entry.homeId, {
        to: 'testedOut',
        at: entry.testedOn,
        by: entry.by,
      });
    } catch (error) {
      if (error instanceof InputError) throw underRequestFields(error);
      throw error;
    }
  }
  const figures = { result, target, targetMet, belowStopLevel };
  return { testId, ...figures, sentences: sentencesOf(figures), job };
}
