/**
 * The Job panel's rules (ui/job-stages.ts) against the core's own rule: for every status a job
 * can stand at and every status it could be moved to, core/job-status.ts `nextStatus` is asked
 * whether the move goes through without a reason, only with one, or not at all, and the moves
 * the panel offers must be exactly those, with the same need for a reason. The rule itself is
 * common practice of weatherization programs, in the core's words (its module header).
 */
import { describe, expect, it } from 'vitest';
import {
  JOB_STAGES,
  JOB_STATUSES,
  nextStatus,
  type JobStage,
  type JobStatusEntry,
} from '../../core/job-status.ts';
import { InputError } from '../../core/errors.ts';
import {
  allowedMoves,
  changeDateOf,
  countsByStatus,
  localIsoDate,
  STAGE_ORDER,
  STATUS_ORDER,
  type JobStanding,
} from '../../ui/job-stages.ts';

const FIRST: Pick<JobStatusEntry, 'at' | 'by'> = { at: '2026-03-02', by: 'Auditor A' };

/** A history that leaves the job standing as given, each entry as the core makes it. */
function historyOf(standing: JobStanding): JobStatusEntry[] {
  const start = nextStatus([], { to: standing.stage, ...FIRST });
  if (standing.status === standing.stage) return [start];
  const stopped = nextStatus([start], {
    to: standing.status,
    at: '2026-03-03',
    by: 'Auditor A',
    reason: 'the client asked',
  });
  return [start, stopped];
}

/** What the core says of one move: allowed without a reason, only with one, or refused. */
function coreVerdict(history: JobStatusEntry[], to: string): 'free' | 'reason' | 'refused' {
  const change = { to, at: '2026-03-04', by: 'Crew lead B' };
  const attempt = (reason?: string) => {
    try {
      nextStatus(history, reason === undefined ? change : { ...change, reason });
      return true;
    } catch (error) {
      if (!(error instanceof InputError)) throw error;
      return false;
    }
  };
  if (attempt()) return 'free';
  return attempt('a reason in words') ? 'reason' : 'refused';
}

/** Every place a job can stand: each stage, and on hold or declined at each stage but closed. */
const STANDINGS: JobStanding[] = [
  ...JOB_STAGES.map((stage) => ({ status: stage, stage })),
  ...JOB_STAGES.filter((stage) => stage !== 'closed').flatMap((stage: JobStage) => [
    { status: 'onHold' as const, stage },
    { status: 'declined' as const, stage },
  ]),
];

describe('allowedMoves', () => {
  it('lists the stages and statuses in the core’s order', () => {
    expect(STAGE_ORDER).toEqual(JOB_STAGES);
    expect([...STATUS_ORDER].sort()).toEqual([...JOB_STATUSES].sort());
  });

  for (const standing of STANDINGS) {
    const name =
      standing.status === standing.stage
        ? standing.stage
        : `${standing.status} at ${standing.stage}`;
    it(`offers from ${name} exactly the moves nextStatus takes`, () => {
      const history = historyOf(standing);
      const expected = JOB_STATUSES.flatMap((to) => {
        const verdict = coreVerdict(history, to);
        return verdict === 'refused' ? [] : [{ to, needsReason: verdict === 'reason' }];
      });
      const offered = allowedMoves(standing);
      const byStatus = (a: { to: string }, b: { to: string }) => a.to.localeCompare(b.to);
      expect([...offered].sort(byStatus)).toEqual([...expected].sort(byStatus));
      // The moves without a reason (the way the work goes on) come first.
      const firstWithReason = offered.findIndex((move) => move.needsReason);
      if (firstWithReason >= 0) {
        expect(offered.slice(firstWithReason).every((move) => move.needsReason)).toBe(true);
      }
    });
  }

  it('starts a job audited on the next stage, and lets it skip only "scoped"', () => {
    const moves = allowedMoves({ status: 'audited', stage: 'audited' });
    expect(moves.slice(0, 2)).toEqual([
      { to: 'scoped', needsReason: false },
      { to: 'approved', needsReason: false },
    ]);
    expect(moves.some((move) => move.to === 'inProgress')).toBe(false);
  });
});

describe('the dates and counts', () => {
  it('gives the local calendar date of a moment, as a date box holds it', () => {
    const moment = new Date(2026, 0, 5, 23, 59);
    expect(localIsoDate(moment)).toBe('2026-01-05');
    expect(localIsoDate(new Date(2026, 11, 31, 0, 0))).toBe('2026-12-31');
  });

  it('reads the calendar date of a stored date or UTC date-time', () => {
    expect(changeDateOf('2026-03-02')).toBe('2026-03-02');
    expect(changeDateOf('2026-03-02T14:05:00Z')).toBe('2026-03-02');
  });

  it('lists every status in the order of the work, none as 0, unknown ones last', () => {
    const counts = [
      { status: 'approved', homes: 3 },
      { status: 'audited', homes: 9 },
      { status: 'someNewState', homes: 1 },
      { status: 'onHold', homes: 2 },
    ];
    const rows = countsByStatus(counts);
    expect(rows.map((row) => row.status)).toEqual([...STATUS_ORDER, 'someNewState']);
    expect(rows.find((row) => row.status === 'audited')?.homes).toBe(9);
    expect(rows.find((row) => row.status === 'scoped')?.homes).toBe(0);
    // No home is lost or counted twice: the rows add up to the store's counts (3+9+1+2).
    expect(rows.reduce((sum, row) => sum + row.homes, 0)).toBe(15);
    expect(countsByStatus([]).every((row) => row.homes === 0)).toBe(true);
  });
});
