/**
 * Whole-project backups. A backup is a compact, consistent copy of the file made with
 * `VACUUM INTO` while the project stays open; restoring checks the copy first (a Sealwork
 * file, intact, not from a newer version) and then replaces the project file in one rename.
 */
import { existsSync, mkdirSync, renameSync, rmSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'better-sqlite3';
import { classifySqliteError, DbError } from './errors.ts';
import { LATEST_SCHEMA_VERSION } from './migrations/index.ts';
import type { Store } from './store.ts';

/** Where better-sqlite3's addon is, when not the one built for Node (the desktop app's). */
export interface NativeOptions {
  nativeBinding?: string;
}

function native(options: NativeOptions): { nativeBinding?: string } {
  return options.nativeBinding === undefined ? {} : { nativeBinding: options.nativeBinding };
}

/** Writes a backup of the open project to `backupPath` (replacing a file already there). */
export function backupTo(store: Store, backupPath: string): void {
  const partial = `${backupPath}.partial`;
  rmSync(partial, { force: true });
  try {
    store.sqlite.prepare('VACUUM INTO ?').run(partial);
    renameSync(partial, backupPath);
  } catch (error) {
    rmSync(partial, { force: true });
    throw (
      classifySqliteError(error) ??
      new DbError('io', `cannot write the backup ${backupPath}`, { cause: error })
    );
  }
}

/**
 * Checks that a file is an intact Sealwork project this version can open.
 *
 * @returns its schema version
 */
export function checkBackup(backupPath: string, options: NativeOptions = {}): number {
  if (!existsSync(backupPath))
    throw new DbError('notFound', `${backupPath}: no such file`, { field: 'file' });
  let sqlite: Database.Database | undefined;
  try {
    sqlite = new Database(backupPath, { readonly: true, fileMustExist: true, ...native(options) });
    const integrity = sqlite.pragma('integrity_check', { simple: true });
    if (integrity !== 'ok')
      throw new DbError('corrupt', `${backupPath} is damaged (${String(integrity)})`);
    const version = sqlite.pragma('user_version', { simple: true }) as number;
    const hasHomes = sqlite
      .prepare("SELECT 1 FROM sqlite_master WHERE type = 'table' AND name = 'homes'")
      .get();
    if (version < 1 || !hasHomes)
      throw new DbError('corrupt', `${backupPath} is not a Sealwork project`);
    if (version > LATEST_SCHEMA_VERSION) {
      throw new DbError(
        'newerVersion',
        `${backupPath} was written by a newer Sealwork (schema version ${version}); update Sealwork to restore it`,
      );
    }
    return version;
  } catch (error) {
    if (error instanceof DbError) throw error;
    throw (
      classifySqliteError(error) ??
      new DbError('corrupt', `${backupPath} is not a Sealwork project`, { cause: error })
    );
  } finally {
    sqlite?.close();
  }
}

/**
 * Replaces the project file at `projectPath` with a checked copy of `backupPath`. The project
 * must be closed; the old file is kept beside it as `<name>.before-restore` until the next
 * restore.
 */
export function restoreFrom(
  backupPath: string,
  projectPath: string,
  options: NativeOptions = {},
): void {
  checkBackup(backupPath, options);
  mkdirSync(dirname(projectPath), { recursive: true });
  const incoming = `${projectPath}.restoring`;
  rmSync(incoming, { force: true });
  const source = new Database(backupPath, {
    readonly: true,
    fileMustExist: true,
    ...native(options),
  });
  try {
    source.prepare('VACUUM INTO ?').run(incoming);
  } finally {
    source.close();
  }
  if (existsSync(projectPath)) {
    // Fold the old file's WAL in first so the kept copy is whole.
    const old = new Database(projectPath, native(options));
    try {
      old.pragma('wal_checkpoint(TRUNCATE)');
    } finally {
      old.close();
    }
    renameSync(projectPath, `${projectPath}.before-restore`);
  }
  for (const suffix of ['-wal', '-shm']) rmSync(`${projectPath}${suffix}`, { force: true });
  renameSync(incoming, projectPath);
}
