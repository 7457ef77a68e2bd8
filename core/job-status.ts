/**
 * Where a home's job stands after the audit, and the rule for moving it on. The job runs
 * through six stages in order: audited → scoped → approved → in progress → tested out →
 * closed. Two more states stop it: declined (the client says no) and on hold (waiting on
 * something: a permit, an electrician, the client), each with a reason.
 *
 * The history of a job is its list of changes, oldest first; each says what the job moved to,
 * when, who moved it and, where the rule asks for one, why. `nextStatus` checks one change
 * against the history and returns the entry to append; nothing is written until it returns.
 *
 * The rule (common practice of weatherization programs, in our words):
 * - Forward one step at a time, or skipping only "scoped": a scope may be written and approved
 *   at one visit. Approval, the work and the test-out are never skipped: no work without the
 *   client's approval, no test-out without work, no closing without the test-out that checks
 *   ventilation and combustion safety after the sealing.
 * - Backward to any earlier stage (a reopened closed job included) only with a reason.
 * - On hold and declined only with a reason, from any stage before closed; on hold from
 *   on hold and declined from declined are refused (nothing changes).
 * - From on hold: resume at the stage held (no reason needed), or decline (with one).
 * - From declined: close it (filing the job, no reason needed), or reopen it with a reason at
 *   the stage it was declined at or an earlier one.
 * - A change may not be dated before the last one; `by` must name someone.
 */
import { z } from 'zod';
import { InputError } from './errors.ts';
import { instantOf, isBefore, whenSchema } from './job-status/dates.ts';

/** The job's stages in the order the work goes. */
export const JOB_STAGES = [
  'audited',
  'scoped',
  'approved',
  'inProgress',
  'testedOut',
  'closed',
] as const;
export type JobStage = (typeof JOB_STAGES)[number];

/** Every status a job can have: a stage, or one of the two that stop it. */
export const JOB_STATUSES = [...JOB_STAGES, 'declined', 'onHold'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** What each status is called on screen and on paper. */
export const JOB_STATUS_LABELS: Readonly<Record<JobStatus, string>> = {
  audited: 'Audited',
  scoped: 'Scoped',
  approved: 'Approved',
  inProgress: 'In progress',
  testedOut: 'Tested out',
  closed: 'Closed',
  declined: 'Declined',
  onHold: 'On hold',
};

/** Stages a forward move may pass over (see the rule above). */
const SKIPPABLE: ReadonlySet<JobStage> = new Set<JobStage>(['scoped']);

/** One change of a job's status, as stored. */
export const jobStatusEntrySchema = z.strictObject({
  status: z.enum(JOB_STATUSES),
  at: whenSchema,
  by: z.string().max(200).regex(/\S/, 'expected who made the change'),
  reason: z.string().max(2000).regex(/\S/, 'expected a reason in words').optional(),
  /** For on hold and declined: the stage the job had reached. */
  fromStage: z.enum(JOB_STAGES).optional(),
});
export type JobStatusEntry = z.output<typeof jobStatusEntrySchema>;

/** A change asked for. */
export interface JobStatusChange {
  to: string;
  /** ISO date `YYYY-MM-DD` or UTC date-time. */
  at: string;
  by: string;
  reason?: string;
}

/**
 * The shape of a change as a request carries it (a channel's request schema); the rule
 * itself is `nextStatus`, which names the field at fault.
 */
export const jobStatusChangeSchema = z.strictObject({
  to: z.string().max(40),
  at: z.string().max(40),
  by: z.string().max(200),
  reason: z.string().max(2000).optional(),
});

function isStage(status: string): status is JobStage {
  return (JOB_STAGES as readonly string[]).includes(status);
}

function isStatus(status: string): status is JobStatus {
  return (JOB_STATUSES as readonly string[]).includes(status);
}

function stageIndex(stage: JobStage): number {
  return JOB_STAGES.indexOf(stage);
}

/** The stage an entry stands at: its own, or the one held or declined at. */
function standingStage(entry: JobStatusEntry): JobStage {
  if (isStage(entry.status)) return entry.status;
  // Entries made by nextStatus always carry fromStage for these two.
  return entry.fromStage ?? 'audited';
}

function needReason(change: JobStatusChange, why: string): string {
  const reason = change.reason?.trim() ?? '';
  if (reason === '') throw InputError.at('reason', `expected a reason: ${why}`);
  return reason;
}

function words(status: JobStatus): string {
  return `"${JOB_STATUS_LABELS[status]}"`;
}

/** A forward move from `from` to `to`, refusing a skip over a stage that may not be skipped. */
function checkForward(from: JobStage, to: JobStage): void {
  const passed = JOB_STAGES.slice(stageIndex(from) + 1, stageIndex(to));
  const unskippable = passed.find((stage) => !SKIPPABLE.has(stage));
  if (unskippable !== undefined) {
    throw InputError.at(
      'to',
      `cannot go from ${words(from)} to ${words(to)} without ${words(unskippable)}: only "Scoped" may be skipped`,
    );
  }
}

/** The entry for a change from a stage (not on hold, not declined). */
function fromStageEntry(
  current: JobStage,
  change: JobStatusChange,
  to: JobStatus,
): Omit<JobStatusEntry, 'at' | 'by'> {
  if (to === 'onHold' || to === 'declined') {
    if (current === 'closed') {
      throw InputError.at('to', `a closed job cannot be put ${words(to)}; reopen it first`);
    }
    const reason = needReason(change, `say why the job is ${words(to)}`);
    return { status: to, reason, fromStage: current };
  }
  if (stageIndex(to) > stageIndex(current)) {
    checkForward(current, to);
    const reason = change.reason?.trim();
    return reason ? { status: to, reason } : { status: to };
  }
  const reason = needReason(change, `going back from ${words(current)} to ${words(to)}`);
  return { status: to, reason };
}

/** The entry for a change away from on hold. */
function fromHoldEntry(
  held: JobStage,
  change: JobStatusChange,
  to: JobStatus,
): Omit<JobStatusEntry, 'at' | 'by'> {
  if (to === 'declined') {
    return {
      status: to,
      reason: needReason(change, 'say why the job is declined'),
      fromStage: held,
    };
  }
  if (to !== held) {
    throw InputError.at('to', `a job on hold resumes at the stage held, ${words(held)}`);
  }
  const reason = change.reason?.trim();
  return reason ? { status: to, reason } : { status: to };
}

/** The entry for a change away from declined. */
function fromDeclinedEntry(
  declinedAt: JobStage,
  change: JobStatusChange,
  to: JobStatus,
): Omit<JobStatusEntry, 'at' | 'by'> {
  if (to === 'closed') {
    const reason = change.reason?.trim();
    return reason ? { status: to, reason } : { status: to };
  }
  if (to === 'onHold' || !isStage(to) || stageIndex(to) > stageIndex(declinedAt)) {
    throw InputError.at(
      'to',
      `a declined job is closed, or reopened at ${words(declinedAt)} or an earlier stage`,
    );
  }
  return { status: to, reason: needReason(change, 'say why the declined job is reopened') };
}

/**
 * Checks one change of a job's status against its history.
 *
 * @param history - the job's changes so far, oldest first (made by this function); not changed
 * @param change.to - the status to move to (one of {@link JOB_STATUSES})
 * @param change.at - when, as an ISO date or UTC date-time; not before the last change
 * @param change.by - who made the change (not blank)
 * @param change.reason - why; required going back, for on hold and declined, and reopening
 * @returns the entry to append to the history
 * @throws InputError naming `to`, `at`, `by` or `reason` when the change breaks the rule
 *
 * Notes: the rule is in this module's header. The first change may be any stage (a job entered
 * after the fact starts where it stands), but not on hold or declined, which need a stage.
 */
export function nextStatus(
  history: readonly JobStatusEntry[],
  change: JobStatusChange,
): JobStatusEntry {
  const by = change.by.trim();
  if (by === '') throw InputError.at('by', 'expected who made the change');
  if (by.length > 200) throw InputError.at('by', 'expected at most 200 characters');
  if (instantOf(change.at) === null) {
    throw InputError.at(
      'at',
      `expected a real date as YYYY-MM-DD or a UTC time as YYYY-MM-DDTHH:MM:SSZ, got "${change.at}"`,
    );
  }
  if (change.reason !== undefined && change.reason.length > 2000) {
    throw InputError.at('reason', 'expected at most 2000 characters');
  }
  const to = change.to;
  if (!isStatus(to)) {
    throw InputError.at('to', `expected one of ${JOB_STATUSES.join(', ')}, got "${to}"`);
  }
  const last = history.at(-1);
  if (last !== undefined && isBefore(change.at, last.at)) {
    throw InputError.at('at', `expected a date no earlier than the last change, ${last.at}`);
  }
  const made = entryFor(last, change, to);
  return { ...made, at: change.at, by };
}

function entryFor(
  last: JobStatusEntry | undefined,
  change: JobStatusChange,
  to: JobStatus,
): Omit<JobStatusEntry, 'at' | 'by'> {
  if (last === undefined) {
    if (!isStage(to)) {
      throw InputError.at('to', `a job starts at a stage, not ${words(to)}`);
    }
    const reason = change.reason?.trim();
    return reason ? { status: to, reason } : { status: to };
  }
  if (last.status === to) throw InputError.at('to', `the job is already ${words(to)}`);
  if (last.status === 'onHold') return fromHoldEntry(standingStage(last), change, to);
  if (last.status === 'declined') return fromDeclinedEntry(standingStage(last), change, to);
  return fromStageEntry(standingStage(last), change, to);
}

/** The job's status now: its last entry's, or null before any change. */
export function currentStatus(history: readonly JobStatusEntry[]): JobStatus | null {
  return history.at(-1)?.status ?? null;
}

/**
 * Checks a whole stored history by replaying it through {@link nextStatus}.
 *
 * @param entries - the stored entries, oldest first (e.g. read back from the project file)
 * @returns the entries, each as the rule makes it
 * @throws InputError naming `history[i].field` at the first entry the rule refuses
 */
export function checkedHistory(entries: readonly unknown[]): JobStatusEntry[] {
  const history: JobStatusEntry[] = [];
  entries.forEach((raw, index) => {
    const parsed = jobStatusEntrySchema.safeParse(raw);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const field = issue?.path.join('.') ?? '';
      throw InputError.at(
        `history[${index}]${field === '' ? '' : `.${field}`}`,
        issue?.message ?? 'expected a status change',
      );
    }
    const entry = parsed.data;
    const made = replayed(history, entry, index);
    if (entry.fromStage !== undefined && entry.fromStage !== made.fromStage) {
      throw InputError.at(
        `history[${index}].fromStage`,
        `expected "${made.fromStage ?? 'none'}", the stage the job stood at`,
      );
    }
    history.push(made);
  });
  return history;
}

/** One stored entry through the rule, its error moved to the entry's own field. */
function replayed(
  history: readonly JobStatusEntry[],
  entry: JobStatusEntry,
  index: number,
): JobStatusEntry {
  try {
    return nextStatus(history, {
      to: entry.status,
      at: entry.at,
      by: entry.by,
      ...(entry.reason === undefined ? {} : { reason: entry.reason }),
    });
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    const field = error.field === 'to' ? 'status' : error.field;
    throw InputError.at(`history[${index}].${field}`, error.problems[0]?.message ?? error.message);
  }
}
