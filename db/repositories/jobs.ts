/**
 * A home's job status and its history. The status a home stands at is `homes.job_stage`
 * (what the Homes list filters and the portfolio counts by); every change is a row of
 * `job_status_history`, checked by core's `nextStatus` against the history so far and written
 * in one transaction with the new status, so the two never disagree.
 *
 * A home with no recorded change (a new home, or one from before the history was kept) stands
 * at the stage stored on it; the rule then starts from that stage, undated.
 */
import {
  nextStatus,
  type JobStage,
  type JobStatus,
  type JobStatusChange,
  type JobStatusEntry,
} from '../../core/job-status.ts';
import { classifySqliteError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { getHome, touchHome } from './homes.ts';

/**
 * The date a stage without a recorded change is taken to have started: before any real
 * change, so the first recorded change may carry any date a job can have.
 */
const UNDATED = '1900-01-01';

/** Who the stage without a recorded change is attributed to in the rule (never stored). */
const UNRECORDED = 'not recorded';

/** One stored change of a job's status. */
export interface JobStatusRecord extends JobStatusEntry {
  id: number;
  homeId: number;
  /** When the change was written to the project file (UTC). */
  createdAt: string;
}

/** A home's job: where it stands and how it got there. */
export interface JobHistory {
  homeId: number;
  status: JobStatus;
  /** For on hold and declined: the stage the job had reached; else the status itself. */
  stage: JobStage;
  /** The changes, oldest first; empty when none was recorded. */
  entries: JobStatusRecord[];
}

interface HistoryRow {
  id: number;
  home_id: number;
  stage: JobStatus;
  changed_at: string;
  changed_by: string;
  reason: string | null;
  from_stage: JobStage | null;
  created_at: string;
}

function recordOf(row: HistoryRow): JobStatusRecord {
  return {
    id: row.id,
    homeId: row.home_id,
    status: row.stage,
    at: row.changed_at,
    by: row.changed_by,
    ...(row.reason === null ? {} : { reason: row.reason }),
    ...(row.from_stage === null ? {} : { fromStage: row.from_stage }),
    createdAt: row.created_at,
  };
}

function entryOf(record: JobStatusRecord): JobStatusEntry {
  return {
    status: record.status,
    at: record.at,
    by: record.by,
    ...(record.reason === undefined ? {} : { reason: record.reason }),
    ...(record.fromStage === undefined ? {} : { fromStage: record.fromStage }),
  };
}

function historyRows(read: ReadAccess, homeId: number): JobStatusRecord[] {
  const rows = read
    .statement('SELECT * FROM job_status_history WHERE home_id = ? ORDER BY id')
    .all(homeId) as HistoryRow[];
  return rows.map(recordOf);
}

function stageOf(status: JobStatus, entries: readonly JobStatusRecord[]): JobStage {
  if (status !== 'onHold' && status !== 'declined') return status;
  return entries.at(-1)?.fromStage ?? 'audited';
}

/**
 * A home's job status and its recorded changes.
 *
 * @throws DbError notFound (`homeId`) for a home that does not exist or is deleted
 */
export function jobHistory(read: ReadAccess, homeId: number): JobHistory {
  const { jobStatus } = getHome(read, homeId);
  const entries = historyRows(read, homeId);
  return { homeId, status: jobStatus, stage: stageOf(jobStatus, entries), entries };
}

/** The history the rule checks a change against: the recorded one, or the stored stage. */
function ruleHistory(history: JobHistory): JobStatusEntry[] {
  if (history.entries.length > 0) return history.entries.map(entryOf);
  return [{ status: history.status, at: UNDATED, by: UNRECORDED }];
}

/**
 * Changes a home's job status by the rule of core/job-status.ts and records the change.
 *
 * @param change.to - the status to move to
 * @param change.at - when, `YYYY-MM-DD` or a UTC time; not before the last recorded change
 * @param change.by - who made the change
 * @param change.reason - why (going back, on hold, declined, reopening)
 * @returns the recorded change
 * @throws InputError naming `to`, `at`, `by` or `reason` when the rule refuses the change
 *   (nothing is written); DbError notFound (`homeId`) for a missing home
 */
export function changeJobStatus(
  write: WriteAccess,
  homeId: number,
  change: JobStatusChange,
): JobStatusRecord {
  const history = jobHistory(write, homeId);
  const entry = nextStatus(ruleHistory(history), change);
  try {
    const result = write
      .statement(
        `INSERT INTO job_status_history (home_id, stage, changed_at, changed_by, reason, from_stage, created_at)
         VALUES (?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        homeId,
        entry.status,
        entry.at,
        entry.by,
        entry.reason ?? null,
        entry.fromStage ?? null,
        write.now,
      );
    write.statement('UPDATE homes SET job_stage = ? WHERE id = ?').run(entry.status, homeId);
    touchHome(write, homeId);
    return { ...entry, id: Number(result.lastInsertRowid), homeId, createdAt: write.now };
  } catch (error) {
    throw classifySqliteError(error, { check: 'to' }) ?? error;
  }
}
