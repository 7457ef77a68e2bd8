/** Edits to the measure library, kept apart from the shipped defaults; saved plans. */
import type { Migration } from './index.ts';

export const migration0002: Migration = {
  version: 2,
  name: 'library-and-plans',
  sql: `
    CREATE TABLE measure_library_edits (
      type_id TEXT PRIMARY KEY,
      data TEXT NOT NULL CHECK (json_valid(data)),
      updated_at TEXT NOT NULL
    ) STRICT;

    CREATE TABLE plans (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      name TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      engine_version TEXT NOT NULL,
      inputs TEXT NOT NULL CHECK (json_valid(inputs)),
      inputs_sha256 TEXT NOT NULL CHECK (length(inputs_sha256) = 64),
      result TEXT NOT NULL CHECK (json_valid(result)),
      created_at TEXT NOT NULL
    ) STRICT;
    CREATE INDEX plans_by_home ON plans (home_id, created_at);
  `,
};
