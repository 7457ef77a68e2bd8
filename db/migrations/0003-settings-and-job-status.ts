/** The user's settings, and where each home's job stands. */
import type { Migration } from './index.ts';

export const migration0003: Migration = {
  version: 3,
  name: 'settings-and-job-status',
  sql: `
    CREATE TABLE settings (
      key TEXT PRIMARY KEY,
      value TEXT NOT NULL CHECK (json_valid(value)),
      updated_at TEXT NOT NULL
    ) STRICT;

    ALTER TABLE homes ADD COLUMN job_status TEXT NOT NULL DEFAULT 'assessed'
      CHECK (job_status IN ('assessed', 'scheduled', 'inProgress', 'done', 'closed'));
  `,
};
