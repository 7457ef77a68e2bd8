/**
 * The migrations, in order. Each is one numbered file, add-only (new tables, new columns,
 * new indexes; nothing dropped or rewritten), so a database of any earlier version keeps
 * every row as it moves forward. A new step is a new file and a new line here.
 */
import { migration0001 } from './0001-homes.ts';
import { migration0002 } from './0002-library-and-plans.ts';
import { migration0003 } from './0003-settings-and-job-status.ts';
import { migration0004 } from './0004-plan-basis.ts';
import { migration0005 } from './0005-weather-and-bills.ts';
import { migration0006 } from './0006-jobs-and-photos.ts';

export interface Migration {
  /** The `PRAGMA user_version` the database has after this step. */
  version: number;
  name: string;
  sql: string;
}

export const MIGRATIONS: readonly Migration[] = [
  migration0001,
  migration0002,
  migration0003,
  migration0004,
  migration0005,
  migration0006,
];

/** The schema version this build of Sealwork writes. */
export const LATEST_SCHEMA_VERSION = MIGRATIONS.length;
