/**
 * The job's status rule (core/job-status.ts). The rule is Sealwork's own, written from the
 * common practice of weatherization programs (no work without approval, no closing without a
 * test-out, reasons for stopping or going back); each check below states the rule it holds.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import {
  checkedHistory,
  currentStatus,
  JOB_STAGES,
  JOB_STATUS_LABELS,
  JOB_STATUSES,
  jobStatusChangeSchema,
  jobStatusEntrySchema,
  nextStatus,
  type JobStage,
  type JobStatusChange,
  type JobStatusEntry,
} from '../../core/job-status.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

/** Applies changes one after another; every one must be accepted. */
function historyOf(changes: readonly JobStatusChange[]): JobStatusEntry[] {
  const history: JobStatusEntry[] = [];
  for (const change of changes) history.push(nextStatus(history, change));
  return history;
}

function change(to: string, at: string, extra: Partial<JobStatusChange> = {}): JobStatusChange {
  return { to, at, by: 'R. Okafor', ...extra };
}

/** A job at `stage`, moved there one step at a time from audited, on 1 March 2026 onwards. */
function jobAt(stage: JobStage): JobStatusEntry[] {
  const upTo = JOB_STAGES.slice(0, JOB_STAGES.indexOf(stage) + 1);
  return historyOf(
    upTo.map((to, index) => change(to, `2026-03-${String(index + 1).padStart(2, '0')}`)),
  );
}

describe('job stages and labels', () => {
  it('lists the six stages in order, then the two stopping states, each with a label', () => {
    expect(JOB_STAGES).toEqual([
      'audited',
      'scoped',
      'approved',
      'inProgress',
      'testedOut',
      'closed',
    ]);
    expect(JOB_STATUSES).toEqual([...JOB_STAGES, 'declined', 'onHold']);
    for (const status of JOB_STATUSES) expect(JOB_STATUS_LABELS[status].trim()).not.toBe('');
    expect(JOB_STATUS_LABELS.inProgress).toBe('In progress');
    expect(JOB_STATUS_LABELS.testedOut).toBe('Tested out');
    expect(JOB_STATUS_LABELS.onHold).toBe('On hold');
  });

  it('parses a change request in shape only, leaving the rule to nextStatus', () => {
    const request = { to: 'scoped', at: '2026-03-02', by: 'A' };
    expect(jobStatusChangeSchema.parse(request)).toEqual(request);
    expect(jobStatusChangeSchema.safeParse({ ...request, extra: true }).success).toBe(false);
    expect(jobStatusChangeSchema.safeParse({ ...request, by: 7 }).success).toBe(false);
  });

  it('validates a stored entry with its zod schema', () => {
    const entry = {
      status: 'onHold',
      at: '2026-03-04',
      by: 'A',
      reason: 'permit',
      fromStage: 'approved',
    };
    expect(jobStatusEntrySchema.parse(entry)).toEqual(entry);
    expect(jobStatusEntrySchema.safeParse({ ...entry, status: 'paused' }).success).toBe(false);
    expect(jobStatusEntrySchema.safeParse({ ...entry, at: '2026-02-30' }).success).toBe(false);
    expect(jobStatusEntrySchema.safeParse({ ...entry, by: '  ' }).success).toBe(false);
    expect(jobStatusEntrySchema.safeParse({ ...entry, extra: 1 }).success).toBe(false);
  });
});

describe('moving forward', () => {
  it('goes through every stage one step at a time, recording date and who', () => {
    const history = jobAt('closed');
    expect(history.map((entry) => entry.status)).toEqual([...JOB_STAGES]);
    expect(history[0]).toEqual({ status: 'audited', at: '2026-03-01', by: 'R. Okafor' });
    expect(currentStatus(history)).toBe('closed');
    expect(currentStatus([])).toBeNull();
  });

  it('may skip "scoped" (scope written and approved at one visit)', () => {
    const entry = nextStatus(jobAt('audited'), change('approved', '2026-03-02'));
    expect(entry.status).toBe('approved');
  });

  it('never skips approval, the work or the test-out', () => {
    expectInputError(
      () => nextStatus(jobAt('audited'), change('inProgress', '2026-03-02')),
      'to',
      /"Approved"/,
    );
    expectInputError(
      () => nextStatus(jobAt('approved'), change('testedOut', '2026-03-04')),
      'to',
      /"In progress"/,
    );
    expectInputError(
      () => nextStatus(jobAt('inProgress'), change('closed', '2026-03-05')),
      'to',
      /"Tested out"/,
    );
    expectInputError(
      () => nextStatus(jobAt('scoped'), change('closed', '2026-03-05')),
      'to',
      /"Approved"/,
    );
  });

  it('refuses the status the job already has and an unknown one', () => {
    expectInputError(
      () => nextStatus(jobAt('approved'), change('approved', '2026-03-04')),
      'to',
      /already/,
    );
    expectInputError(
      () => nextStatus(jobAt('approved'), change('finished', '2026-03-04')),
      'to',
      /expected one of/,
    );
  });

  it('starts at any stage (a job entered after the fact), never on hold or declined', () => {
    expect(nextStatus([], change('inProgress', '2026-03-01')).status).toBe('inProgress');
    expectInputError(
      () => nextStatus([], change('onHold', '2026-03-01', { reason: 'x' })),
      'to',
      /starts at a stage/,
    );
    expectInputError(
      () => nextStatus([], change('declined', '2026-03-01', { reason: 'x' })),
      'to',
      /starts at a stage/,
    );
  });
});

describe('going back', () => {
  it('needs a non-empty reason, and keeps it', () => {
    const job = jobAt('inProgress');
    expectInputError(() => nextStatus(job, change('scoped', '2026-03-05')), 'reason', /going back/);
    expectInputError(
      () => nextStatus(job, change('scoped', '2026-03-05', { reason: '   ' })),
      'reason',
      /going back/,
    );
    const entry = nextStatus(
      job,
      change('scoped', '2026-03-05', { reason: ' Client added the attic. ' }),
    );
    expect(entry).toEqual({
      status: 'scoped',
      at: '2026-03-05',
      by: 'R. Okafor',
      reason: 'Client added the attic.',
    });
  });

  it('reopens a closed job only with a reason', () => {
    const job = jobAt('closed');
    expectInputError(
      () => nextStatus(job, change('inProgress', '2026-03-07')),
      'reason',
      /going back/,
    );
    expect(
      nextStatus(job, change('inProgress', '2026-03-07', { reason: 'Callback: hatch gasket' }))
        .status,
    ).toBe('inProgress');
  });
});

describe('on hold and declined', () => {
  it('need a reason and record the stage reached', () => {
    const job = jobAt('approved');
    expectInputError(() => nextStatus(job, change('onHold', '2026-03-04')), 'reason', /On hold/);
    expectInputError(() => nextStatus(job, change('declined', '2026-03-04')), 'reason', /Declined/);
    const held = nextStatus(
      job,
      change('onHold', '2026-03-04', { reason: 'Waiting for the electrician' }),
    );
    expect(held).toMatchObject({
      status: 'onHold',
      fromStage: 'approved',
      reason: 'Waiting for the electrician',
    });
  });

  it('resume at the stage held, without a reason, and nowhere else', () => {
    const job = jobAt('inProgress');
    job.push(nextStatus(job, change('onHold', '2026-03-05', { reason: 'Knob-and-tube found' })));
    expectInputError(
      () => nextStatus(job, change('testedOut', '2026-03-06')),
      'to',
      /"In progress"/,
    );
    expectInputError(
      () => nextStatus(job, change('approved', '2026-03-06', { reason: 'x' })),
      'to',
      /resumes/,
    );
    expect(nextStatus(job, change('inProgress', '2026-03-09')).status).toBe('inProgress');
    const declined = nextStatus(
      job,
      change('declined', '2026-03-09', { reason: 'Client sold the house' }),
    );
    expect(declined.fromStage).toBe('inProgress');
  });

  it('a declined job is closed, or reopened with a reason no later than where it stood', () => {
    const job = jobAt('scoped');
    job.push(nextStatus(job, change('declined', '2026-03-03', { reason: 'Too costly' })));
    expect(nextStatus(job, change('closed', '2026-03-10')).status).toBe('closed');
    expectInputError(() => nextStatus(job, change('scoped', '2026-03-10')), 'reason', /reopened/);
    expect(nextStatus(job, change('scoped', '2026-03-10', { reason: 'Grant found' })).status).toBe(
      'scoped',
    );
    expectInputError(
      () => nextStatus(job, change('approved', '2026-03-10', { reason: 'x' })),
      'to',
      /"Scoped" or an earlier/,
    );
    expectInputError(
      () => nextStatus(job, change('onHold', '2026-03-10', { reason: 'x' })),
      'to',
      /declined job/,
    );
  });

  it('a closed job cannot be held or declined', () => {
    expectInputError(
      () => nextStatus(jobAt('closed'), change('onHold', '2026-03-07', { reason: 'x' })),
      'to',
      /closed job/,
    );
  });
});

describe('dates and who', () => {
  it('refuses a date before the last change, accepts the same day', () => {
    const job = jobAt('scoped');
    expectInputError(
      () => nextStatus(job, change('approved', '2026-03-01')),
      'at',
      /no earlier than the last change, 2026-03-02/,
    );
    expect(nextStatus(job, change('approved', '2026-03-02')).status).toBe('approved');
  });

  it('compares a date with a time at the day when either has no time', () => {
    const job = historyOf([change('audited', '2026-03-05T14:00:00Z')]);
    expect(nextStatus(job, change('scoped', '2026-03-05')).status).toBe('scoped');
    expectInputError(
      () => nextStatus(job, change('scoped', '2026-03-05T13:59:00Z')),
      'at',
      /no earlier/,
    );
    expectInputError(() => nextStatus(job, change('scoped', '2026-03-04')), 'at', /no earlier/);
  });

  it('refuses dates that are not ISO or not real', () => {
    for (const at of [
      '2026-02-29',
      '05/03/2026',
      '2026-3-5',
      '',
      '2026-03-05T25:00:00Z',
      '2026-03-05T10:00:00+02:00',
    ]) {
      expectInputError(() => nextStatus([], change('audited', at)), 'at', /YYYY-MM-DD/);
    }
    expect(nextStatus([], change('audited', '2028-02-29')).at).toBe('2028-02-29');
  });

  it('requires who made the change', () => {
    expectInputError(
      () => nextStatus([], { to: 'audited', at: '2026-03-01', by: '  ' }),
      'by',
      /who/,
    );
  });

  it('does not change the history it is given', () => {
    const job = Object.freeze(jobAt('approved').map((entry) => Object.freeze(entry)));
    const before = JSON.stringify(job);
    nextStatus(job, change('inProgress', '2026-03-04'));
    expect(JSON.stringify(job)).toBe(before);
  });
});

describe('checkedHistory', () => {
  it('accepts a stored history the rule made and names the first bad entry', () => {
    const job = jobAt('inProgress');
    expect(checkedHistory(JSON.parse(JSON.stringify(job)) as unknown[])).toEqual(job);
    const broken = [...job, { status: 'closed', at: '2026-03-09', by: 'X' }];
    expectInputError(() => checkedHistory(broken), 'history[4].status', /"Tested out"/);
    const misdated = [...job, { status: 'testedOut', at: '2026-02-01', by: 'X' }];
    expectInputError(() => checkedHistory(misdated), 'history[4].at', /no earlier/);
    expectInputError(
      () => checkedHistory([{ status: 'audited', at: '2026-03-01' }]),
      'history[0].by',
      /.+/,
    );
    const wrongStage = [
      ...job,
      { status: 'onHold', at: '2026-03-09', by: 'X', reason: 'r', fromStage: 'audited' },
    ];
    expectInputError(() => checkedHistory(wrongStage), 'history[4].fromStage', /inProgress/);
  });
});

describe('property: any accepted history keeps the rule', () => {
  const attempt = fc.record({
    to: fc.constantFrom(...JOB_STATUSES, 'bogus'),
    dayStep: fc.integer({ min: -1, max: 6 }),
    by: fc.constantFrom('A. Crew', 'B. Auditor', 'C. Lead', '  '),
    reason: fc.option(fc.constantFrom('Client asked', '', '  ', 'Permit pending'), {
      nil: undefined,
    }),
  });

  it('is in date order, every backward step and every stop has a reason, forward skips pass only "scoped"', () => {
    // How often each kind of move was accepted, so the property is seen to reach them all.
    const seen = { back: 0, skip: 0, resume: 0, stop: 0 };
    fc.assert(
      fc.property(fc.array(attempt, { minLength: 5, maxLength: 40, size: 'max' }), (attempts) => {
        const history: JobStatusEntry[] = [];
        let day = Date.UTC(2026, 0, 1);
        for (const step of attempts) {
          day += step.dayStep * 86_400_000;
          const at = new Date(day).toISOString().slice(0, 10);
          try {
            history.push(
              nextStatus(history, {
                to: step.to,
                at,
                by: step.by,
                ...(step.reason === undefined ? {} : { reason: step.reason }),
              }),
            );
          } catch (error) {
            expect(error).toBeInstanceOf(InputError);
          }
        }
        const stageOf = (entry: JobStatusEntry): JobStage =>
          (JOB_STAGES as readonly string[]).includes(entry.status)
            ? (entry.status as JobStage)
            : (entry.fromStage as JobStage);
        for (let index = 1; index < history.length; index += 1) {
          const before = history[index - 1] as JobStatusEntry;
          const entry = history[index] as JobStatusEntry;
          expect(entry.at >= before.at).toBe(true);
          expect(entry.by.trim()).not.toBe('');
          if (entry.status === 'onHold' || entry.status === 'declined') {
            expect(entry.reason?.trim()).toBeTruthy();
            expect(entry.fromStage).toBe(stageOf(before));
            seen.stop += 1;
            continue;
          }
          const from = JOB_STAGES.indexOf(stageOf(before));
          const to = JOB_STAGES.indexOf(entry.status as JobStage);
          if (before.status === 'onHold') {
            expect(entry.status).toBe(before.fromStage);
            seen.resume += 1;
          } else if (to < from) {
            expect(entry.reason?.trim()).toBeTruthy();
            seen.back += 1;
          } else if (before.status !== 'declined') {
            for (const passed of JOB_STAGES.slice(from + 1, to)) expect(passed).toBe('scoped');
            if (to > from + 1) seen.skip += 1;
          }
        }
        expect(checkedHistory(JSON.parse(JSON.stringify(history)) as unknown[])).toEqual(history);
      }),
      { seed: 9, numRuns: 300 },
    );
    for (const [kind, count] of Object.entries(seen)) expect(count, kind).toBeGreaterThan(0);
  });
});
