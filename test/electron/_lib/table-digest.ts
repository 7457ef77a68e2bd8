/**
 * A digest of everything a project file holds: the schema (sqlite_master), the schema
 * version, and every row of every table in rowid order. Equal digests before and after a
 * run of requests mean the run wrote nothing.
 */
import { createHash } from 'node:crypto';
import type Database from 'better-sqlite3';

/**
 * Every row of every table named in sqlite_master, in rowid order.
 *
 * @param sqlite - an open connection
 * @returns table name → rows; `sqlite_master` itself and `user_version` included
 */
export function everyRow(sqlite: Database.Database): Record<string, unknown[]> {
  const tables = sqlite
    .prepare("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name")
    .all() as { name: string }[];
  const rows: Record<string, unknown[]> = {
    sqlite_master: sqlite.prepare('SELECT * FROM sqlite_master ORDER BY type, name').all(),
    user_version: [sqlite.pragma('user_version', { simple: true })],
  };
  for (const { name } of tables) {
    const quoted = `"${name.replaceAll('"', '""')}"`;
    rows[name] = sqlite.prepare(`SELECT * FROM ${quoted} ORDER BY rowid`).all();
  }
  return rows;
}

/**
 * SHA-256 of `everyRow`.
 *
 * @param sqlite - an open connection
 * @returns the digest, hex
 */
export function projectDigest(sqlite: Database.Database): string {
  return createHash('sha256')
    .update(JSON.stringify(everyRow(sqlite)))
    .digest('hex');
}

/**
 * Rows changed by this connection since it opened, rolled-back changes included (SQLite's
 * `total_changes()`); unchanged means no statement even tried to write.
 *
 * @param sqlite - an open connection
 * @returns the count
 */
export function changesSoFar(sqlite: Database.Database): number {
  const row = sqlite.prepare('SELECT total_changes() AS changes').get() as { changes: number };
  return row.changes;
}
