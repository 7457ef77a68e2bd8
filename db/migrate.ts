/**
 * The migration runner. It reads `PRAGMA user_version`, refuses a database written by a
 * newer Sealwork, and applies every pending step inside one transaction, so a file is
 * either fully at the new version or untouched.
 */
import type Database from 'better-sqlite3';
import { DbError } from './errors.ts';
import { LATEST_SCHEMA_VERSION, MIGRATIONS, type Migration } from './migrations/index.ts';

/** The schema version of an open database. */
export function schemaVersion(sqlite: Database.Database): number {
  return sqlite.pragma('user_version', { simple: true }) as number;
}

/** Checks that the steps are numbered 1, 2, 3, … with no gap or repeat. */
function checkOrder(migrations: readonly Migration[]): void {
  migrations.forEach((migration, index) => {
    if (migration.version !== index + 1) {
      throw new Error(
        `migration ${migration.name} has version ${migration.version}; expected ${index + 1}`,
      );
    }
  });
}

/**
 * Brings a database up to `targetVersion` (the latest by default).
 *
 * @returns the versions applied, in order
 * @throws DbError `newerVersion` when the file is from a newer Sealwork
 */
export function migrate(
  sqlite: Database.Database,
  options: { targetVersion?: number; migrations?: readonly Migration[] } = {},
): number[] {
  const migrations = options.migrations ?? MIGRATIONS;
  checkOrder(migrations);
  const target = options.targetVersion ?? migrations.length;
  const applied: number[] = [];
  const run = sqlite.transaction(() => {
    const current = schemaVersion(sqlite);
    if (current > migrations.length) {
      throw new DbError(
        'newerVersion',
        `This project file was written by a newer Sealwork (schema version ${current}; this version reads up to ${LATEST_SCHEMA_VERSION}). Update Sealwork to open it; the file was not changed.`,
      );
    }
    for (const migration of migrations) {
      if (migration.version <= current || migration.version > target) continue;
      sqlite.exec(migration.sql);
      applied.push(migration.version);
    }
    if (applied.length > 0) sqlite.pragma(`user_version = ${Math.max(current, ...applied)}`);
  });
  run.immediate();
  return applied;
}
