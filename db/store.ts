/**
 * The project file: one SQLite database opened with WAL, foreign keys, a busy timeout and
 * `synchronous = NORMAL` (durable across application crashes in WAL mode; a power cut may
 * lose the last commits but never corrupts the file), then migrated.
 *
 * Access comes in two kinds, so a signature shows whether it writes: `ReadAccess` for
 * reading, and `WriteAccess`, which exists only inside `store.write(…)`: every write is in
 * a transaction (`BEGIN IMMEDIATE`, retried while another process holds the lock).
 */
import Database from 'better-sqlite3';
import { classifySqliteError, DbError, sqliteCode } from './errors.ts';
import { migrate, schemaVersion } from './migrate.ts';
import { LATEST_SCHEMA_VERSION } from './migrations/index.ts';

/** How long a connection waits for another writer before SQLite reports busy, ms. */
const BUSY_TIMEOUT_MS = 5000;
/** How many more times a write is tried when busy persists past the timeout. */
const BUSY_RETRIES = 4;

declare const writeBrand: unique symbol;

export interface ReadAccess {
  /** A prepared statement for `sql`, prepared once per connection. */
  statement(sql: string): Database.Statement;
}

export interface WriteAccess extends ReadAccess {
  readonly [writeBrand]: true;
  /** The time of this write, ISO 8601 UTC; one value for the whole transaction. */
  readonly now: string;
}

export interface StoreOptions {
  /** Opens read-only (no migration; fails if the file is not at the latest version). */
  readonly?: boolean;
  /** The clock; tests pass a fixed one. */
  clock?: () => Date;
  /** Path of a better-sqlite3 addon built for another runtime (the Electron main process). */
  nativeBinding?: string;
  /** Migrate to this version instead of the latest (tests of old versions). */
  targetVersion?: number;
}

export interface Store {
  readonly path: string;
  /** Runs `work` with read access, in a transaction so it sees one consistent state. */
  read<T>(work: (read: ReadAccess) => T): T;
  /** Runs `work` in a write transaction; everything it does commits together or not at all. */
  write<T>(work: (write: WriteAccess) => T): T;
  /** The underlying connection, for backup and maintenance in db/ only. */
  readonly sqlite: Database.Database;
  close(): void;
}

function wait(milliseconds: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, milliseconds);
}

/**
 * Opens (creating if needed) and migrates a project file.
 *
 * @throws DbError `newerVersion`, `corrupt` or `io` when the file cannot be used
 */
export function openStore(path: string, options: StoreOptions = {}): Store {
  let sqlite: Database.Database;
  try {
    sqlite = new Database(path, {
      readonly: options.readonly ?? false,
      fileMustExist: options.readonly ?? false,
      ...(options.nativeBinding ? { nativeBinding: options.nativeBinding } : {}),
    });
  } catch (error) {
    throw classifySqliteError(error) ?? new DbError('io', `cannot open ${path}`, { cause: error });
  }
  try {
    sqlite.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
    // Another process may be opening or writing the same file: every step may meet a lock.
    withBusyRetry(() => {
      // Look before changing anything: a file Sealwork cannot use is left exactly as it was.
      // One read transaction, so a migration another process commits meanwhile is seen whole.
      const version = sqlite.transaction(() => checkUsable(sqlite, path, options)).deferred();
      if (!options.readonly) {
        sqlite.pragma('journal_mode = WAL');
        sqlite.pragma('synchronous = NORMAL');
      }
      sqlite.pragma('foreign_keys = ON');
      const target = options.targetVersion ?? LATEST_SCHEMA_VERSION;
      // The write lock is taken only when there is something to migrate.
      if (!options.readonly && version < target) migrate(sqlite, { targetVersion: target });
    });
  } catch (error) {
    sqlite.close();
    if (error instanceof DbError) throw error;
    throw classifySqliteError(error) ?? error;
  }

  const statements = new Map<string, Database.Statement>();
  const statement = (sql: string) => {
    let prepared = statements.get(sql);
    if (!prepared) {
      prepared = sqlite.prepare(sql);
      statements.set(sql, prepared);
    }
    return prepared;
  };
  const clock = options.clock ?? (() => new Date());

  return {
    path,
    sqlite,
    read(work) {
      return sqlite.transaction(() => work({ statement })).deferred();
    },
    write(work) {
      return withBusyRetry(() =>
        sqlite
          .transaction(() => work({ statement, now: clock().toISOString() } as WriteAccess))
          .immediate(),
      );
    },
    close() {
      statements.clear();
      sqlite.close();
    },
  };
}

/**
 * Refuses a file from a newer Sealwork, another program's database, and (read-only) a file
 * not at this version, before any pragma or migration writes to it.
 */
function checkUsable(sqlite: Database.Database, path: string, options: StoreOptions): number {
  const version = schemaVersion(sqlite);
  if (version > LATEST_SCHEMA_VERSION) {
    throw new DbError(
      'newerVersion',
      `This project file was written by a newer Sealwork (schema version ${version}; this version reads up to ${LATEST_SCHEMA_VERSION}). Update Sealwork to open it; the file was not changed.`,
    );
  }
  if (version === 0) {
    const { tables } = sqlite
      .prepare(
        "SELECT count(*) AS tables FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'",
      )
      .get() as { tables: number };
    if (tables > 0)
      throw new DbError('corrupt', `${path} is another program's database, not a Sealwork project`);
  }
  if (options.readonly && version !== LATEST_SCHEMA_VERSION) {
    throw new DbError(
      'invalid',
      `${path} is at schema version ${version}; open it once for writing to bring it to version ${LATEST_SCHEMA_VERSION}`,
    );
  }
  return version;
}

/** Runs `attempt`, trying again a few times when another process keeps the file busy. */
function withBusyRetry<T>(attempt: () => T): T {
  for (let tries = 0; ; tries += 1) {
    try {
      return attempt();
    } catch (error) {
      const code = sqliteCode(error);
      const busy =
        code !== undefined && (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED'));
      if (!busy) throw error instanceof DbError ? error : (classifySqliteError(error) ?? error);
      if (tries >= BUSY_RETRIES) throw classifySqliteError(error) ?? error;
      wait(50 * (tries + 1));
    }
  }
}
