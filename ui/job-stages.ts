/**
 * The Job panel's pure rules: which statuses a job may move to from where it stands, which of
 * those moves need a reason, today's date as the form's default, and the counts of homes by
 * status in the order the work goes.
 *
 * Notes: the rule is core/job-status.ts `nextStatus` (its module header says it in words); the
 * screens cannot import it (it brings zod, which the page's Content Security Policy keeps out),
 * so the moves it allows are written here again and test/ui/job-stages.test.ts checks them
 * against `nextStatus` for every status a job can stand at and every status it could move to.
 * The store still judges each change (jobs.changeStatus); this only decides what is offered.
 */
import type { ChannelResponse } from '../electron/channels.ts';

export type JobHistoryReply = ChannelResponse<'jobs.history'>;
export type JobStatus = JobHistoryReply['status'];
export type JobStage = JobHistoryReply['stage'];

/** The six stages in the order the work goes (core/job-status.ts JOB_STAGES). */
export const STAGE_ORDER: readonly JobStage[] = [
  'audited',
  'scoped',
  'approved',
  'inProgress',
  'testedOut',
  'closed',
];

/** Every status: the stages, then the two that stop a job. */
export const STATUS_ORDER: readonly JobStatus[] = [...STAGE_ORDER, 'onHold', 'declined'];

/** A status a job may move to, and whether the move needs a reason. */
export interface JobMove {
  to: JobStatus;
  needsReason: boolean;
}

/** Where a job stands: its status and, for on hold and declined, the stage it had reached. */
export interface JobStanding {
  status: JobStatus;
  stage: JobStage;
}

/** Stages a forward move may pass over: a scope may be written and approved at one visit. */
const SKIPPABLE: ReadonlySet<JobStage> = new Set<JobStage>(['scoped']);

function indexOf(stage: JobStage): number {
  return STAGE_ORDER.indexOf(stage);
}

function forwardAllowed(from: JobStage, to: JobStage): boolean {
  const passed = STAGE_ORDER.slice(indexOf(from) + 1, indexOf(to));
  return indexOf(to) > indexOf(from) && passed.every((stage) => SKIPPABLE.has(stage));
}

/** The moves from a stage (the job neither on hold nor declined). */
function movesFromStage(stage: JobStage): JobMove[] {
  const moves: JobMove[] = [];
  for (const to of STAGE_ORDER) {
    if (to === stage) continue;
    if (indexOf(to) < indexOf(stage)) moves.push({ to, needsReason: true });
    else if (forwardAllowed(stage, to)) moves.push({ to, needsReason: false });
  }
  if (stage !== 'closed') {
    moves.push({ to: 'onHold', needsReason: true }, { to: 'declined', needsReason: true });
  }
  return moves;
}

/**
 * The statuses a job may move to from where it stands, forward moves first in the order of
 * the work, then going back, then on hold and declined.
 *
 * @param standing - the job's status and stage (jobs.history gives both)
 * @returns each move with whether it needs a reason; never the status the job has
 */
export function allowedMoves(standing: JobStanding): JobMove[] {
  const { status, stage } = standing;
  let moves: JobMove[];
  if (status === 'onHold') {
    moves = [
      { to: stage, needsReason: false },
      { to: 'declined', needsReason: true },
    ];
  } else if (status === 'declined') {
    moves = [
      { to: 'closed', needsReason: false },
      ...STAGE_ORDER.filter((to) => to !== 'closed' && indexOf(to) <= indexOf(stage)).map((to) => ({
        to,
        needsReason: true,
      })),
    ];
  } else {
    moves = movesFromStage(stage);
  }
  const forward = moves.filter((move) => !move.needsReason);
  return [...forward, ...moves.filter((move) => move.needsReason)];
}

/** The move the form starts with: the next step forward, else the first move offered. */
export function firstMove(moves: readonly JobMove[]): JobMove | null {
  return moves[0] ?? null;
}

/**
 * A date as the form's date box holds it, in the person's own calendar.
 *
 * @param now - the moment (passed in so the rule is pure)
 * @returns `YYYY-MM-DD` of `now` in the local time zone
 */
export function localIsoDate(now: Date): string {
  const month = String(now.getMonth() + 1).padStart(2, '0');
  const day = String(now.getDate()).padStart(2, '0');
  return `${now.getFullYear()}-${month}-${day}`;
}

/** A change's date as stored (`YYYY-MM-DD` or a UTC date-time): its calendar date. */
export function changeDateOf(at: string): string {
  return at.slice(0, 10);
}

/**
 * The homes of each status, every status listed (none is 0) in the order of the work, then any
 * status the screens do not know (a newer file's), as the store names it.
 *
 * @param counts - the store's counts (portfolio.summary byJobStatus), in any order
 */
export function countsByStatus(
  counts: readonly { status: string; homes: number }[],
): { status: string; homes: number }[] {
  const known = STATUS_ORDER.map((status) => ({
    status,
    homes: counts
      .filter((count) => count.status === status)
      .reduce((sum, count) => sum + count.homes, 0),
  }));
  const others = counts.filter(
    (count) => !(STATUS_ORDER as readonly string[]).includes(count.status),
  );
  return [...known, ...others.map(({ status, homes }) => ({ status, homes }))];
}
