/**
 * The job after the plan, and photos.
 *
 * - `homes.job_stage`: where the home's job stands, on the stages of core/job-status.ts
 *   (audited → scoped → approved → in progress → tested out → closed, plus declined and on
 *   hold). SQLite cannot change the CHECK of `homes.job_status` (0003), so the stages get a
 *   column of their own, filled from the old one: assessed → audited, scheduled → approved,
 *   inProgress → inProgress, done → testedOut, closed → closed. The old column keeps its
 *   values and is no longer read or written.
 * - `job_status_history`: every change of a job's status, oldest first (by id), with when,
 *   who, why and, for on hold and declined, the stage the job stood at. It goes with the home.
 * - `photos`: a home's photos (optionally of one of its measures, by the measure's id in the
 *   home file, `measures.key`), before, after or other, each one image of at most 15 MiB kept
 *   in the file as a BLOB with its SHA-256, so backups (VACUUM INTO) carry them.
 */
import type { Migration } from './index.ts';

const STAGES = "'audited', 'scoped', 'approved', 'inProgress', 'testedOut', 'closed'";
const STATUSES = `${STAGES}, 'declined', 'onHold'`;

export const migration0006: Migration = {
  version: 6,
  name: 'jobs-and-photos',
  sql: `
    ALTER TABLE homes ADD COLUMN job_stage TEXT NOT NULL DEFAULT 'audited'
      CHECK (job_stage IN (${STATUSES}));
    UPDATE homes SET job_stage = CASE job_status
      WHEN 'assessed' THEN 'audited'
      WHEN 'scheduled' THEN 'approved'
      WHEN 'inProgress' THEN 'inProgress'
      WHEN 'done' THEN 'testedOut'
      WHEN 'closed' THEN 'closed'
      ELSE 'audited' END;

    CREATE TABLE job_status_history (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      stage TEXT NOT NULL CHECK (stage IN (${STATUSES})),
      changed_at TEXT NOT NULL CHECK (length(changed_at) BETWEEN 10 AND 40),
      changed_by TEXT NOT NULL CHECK (length(changed_by) BETWEEN 1 AND 200),
      reason TEXT CHECK (reason IS NULL OR length(reason) BETWEEN 1 AND 2000),
      from_stage TEXT CHECK (from_stage IS NULL OR from_stage IN (${STAGES})),
      created_at TEXT NOT NULL
    ) STRICT;
    CREATE INDEX job_status_history_by_home ON job_status_history (home_id, id);

    CREATE TABLE photos (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      measure_key TEXT CHECK (measure_key IS NULL OR length(measure_key) BETWEEN 1 AND 64),
      kind TEXT NOT NULL CHECK (kind IN ('before', 'after', 'other')),
      caption TEXT CHECK (caption IS NULL OR length(caption) BETWEEN 1 AND 500),
      media_type TEXT NOT NULL CHECK (media_type IN ('image/jpeg', 'image/png', 'image/webp')),
      bytes BLOB NOT NULL CHECK (length(bytes) BETWEEN 1 AND 15728640),
      sha256 TEXT NOT NULL CHECK (length(sha256) = 64),
      created_at TEXT NOT NULL
    ) STRICT;
    CREATE INDEX photos_by_home ON photos (home_id, id);
  `,
};
