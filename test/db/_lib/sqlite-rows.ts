/**
 * Reads a project file's tables as plain rows, so a test can say "every row of every table is
 * the same" after a migration, a backup or a failed write without naming each column.
 */
import type Database from 'better-sqlite3';

/** One row as better-sqlite3 returns it: column name → value. */
export type SqlRow = Record<string, unknown>;

/**
 * The names of the tables a program made (SQLite's own `sqlite_%` tables left out), sorted.
 *
 * @param sqlite - an open connection
 * @returns table names, alphabetical
 */
export function userTables(sqlite: Database.Database): string[] {
  const rows = sqlite
    .prepare(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' ESCAPE '\\' ORDER BY name",
    )
    .all() as { name: string }[];
  return rows.map((row) => row.name);
}

/**
 * Every row of one table in rowid order (every Sealwork table is a rowid table).
 *
 * @param sqlite - an open connection
 * @param table - a name from `userTables`
 * @returns the rows, generated columns included
 */
export function rowsOf(sqlite: Database.Database, table: string): SqlRow[] {
  return sqlite.prepare(`SELECT * FROM "${table}" ORDER BY rowid`).all() as SqlRow[];
}

/**
 * Every row of every table.
 *
 * @param sqlite - an open connection
 * @returns table name → its rows in rowid order
 */
export function allRows(sqlite: Database.Database): Record<string, SqlRow[]> {
  return Object.fromEntries(userTables(sqlite).map((table) => [table, rowsOf(sqlite, table)]));
}

/**
 * How many rows each table holds.
 *
 * @param sqlite - an open connection
 * @returns table name → row count
 */
export function rowCounts(sqlite: Database.Database): Record<string, number> {
  return Object.fromEntries(
    userTables(sqlite).map((table) => {
      const { count } = sqlite.prepare(`SELECT count(*) AS count FROM "${table}"`).get() as {
        count: number;
      };
      return [table, count];
    }),
  );
}
