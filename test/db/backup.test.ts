/**
 * Whole-project backups on real files. The rules checked come from SQLite's documentation:
 * VACUUM INTO writes "a consistent snapshot of the original database" while it stays open
 * (sqlite.org, VACUUM); in WAL mode "readers do not block writers and a writer does not block
 * readers", a reader seeing the last commit before it began (sqlite.org, Write-Ahead Logging);
 * `PRAGMA integrity_check` answers "ok" for an intact file; `user_version` is the
 * application's schema version.
 */
import {
  copyFileSync,
  existsSync,
  readdirSync,
  readFileSync,
  statSync,
  truncateSync,
  writeFileSync,
} from 'node:fs';
import Database from 'better-sqlite3';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { UtilityBill } from '../../core/billing.ts';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import { detectAndParseWeather } from '../../core/weather.ts';
import { ENGINE_VERSION } from '../../core/version.ts';
import { backupTo, checkBackup, restoreFrom } from '../../db/backup.ts';
import { DbError } from '../../db/errors.ts';
import { exportHomeFile, importHomeFile } from '../../db/home-file.ts';
import { LATEST_SCHEMA_VERSION } from '../../db/migrations/index.ts';
import { replaceBills, replaceDailyTemperatures } from '../../db/repositories/bills.ts';
import { createClient } from '../../db/repositories/clients.ts';
import { createHome, deleteHome, listHomes } from '../../db/repositories/homes.ts';
import { changeJobStatus } from '../../db/repositories/jobs.ts';
import { addPhoto } from '../../db/repositories/photos.ts';
import { saveLibraryEdit } from '../../db/repositories/library.ts';
import { savePlan } from '../../db/repositories/plans.ts';
import { climates, priceSets } from '../../db/repositories/reusable-sets.ts';
import { updateSettings } from '../../db/repositories/settings.ts';
import { createWeatherYear, linkClimateWeatherYear } from '../../db/repositories/weather-years.ts';
import { openStore, type Store } from '../../db/store.ts';
import { setAt, validBaseHome } from '../_lib/base-home.ts';
import { billingScenario } from '../_lib/billing-files.ts';
import { pngImage } from '../_lib/photo-bytes.ts';
import { tmy3Year } from '../_lib/weather-files.ts';
import { handHomes } from './_lib/hand-homes.ts';
import { allRows, rowCounts } from './_lib/sqlite-rows.ts';
import { openTempProject, type TempProject } from './_lib/store-home.ts';

let project: TempProject;
beforeEach(() => {
  project = openTempProject();
});
afterEach(() => project.dispose());

function fileIn(name: string): string {
  return `${project.folder.path}/${name}`;
}

/** Puts a row in every table: homes of every kind, a deleted one, a plan, edits, settings. */
function fillProject(store: Store): void {
  store.write((write) => {
    for (const { file } of handHomes()) importHomeFile(write, file);
    const climateId = climates.create(write, 'Shared climate', validBaseHome().climate);
    priceSets.create(write, 'Shared prices', validBaseHome().prices);
    const deleted = createHome(write, { name: 'Deleted draft', climateId, data: {} });
    deleteHome(write, deleted);
    createClient(write, { name: 'Client without a home' });
    const [first] = listHomes(write);
    if (!first) throw new Error('expected a home');
    const inputs = exportHomeFile(write, first.id);
    savePlan(write, {
      homeId: first.id,
      name: 'Proposal',
      engineVersion: ENGINE_VERSION,
      inputs,
      result: evaluateHomeReport(inputs),
    });
    // A stored weather year behind the shared climate, and bills with daily means for a home.
    const weather = detectAndParseWeather(tmy3Year((day) => (day % 3) - 2.7));
    const yearId = createWeatherYear(write, { name: 'Shared climate', format: 'tmy3', weather });
    linkClimateWeatherYear(write, climateId, yearId);
    const billing = billingScenario();
    replaceBills(write, first.id, billing.bills as UtilityBill[]);
    replaceDailyTemperatures(write, first.id, billing.temperatures);
    // A job status change and a photo (its bytes a BLOB the backup must copy as they are).
    changeJobStatus(write, first.id, { to: 'scoped', at: '2024-03-01', by: 'Backup test' });
    addPhoto(write, first.id, { kind: 'before', caption: 'attic hatch' }, pngImage(24, 16, 3));
    saveLibraryEdit(write, 'attic-hatch', { defaultLifeYears: 10 });
    updateSettings(write, { units: 'SI' });
  });
  for (const [table, count] of Object.entries(rowCounts(store.sqlite))) {
    expect(count, `${table} has rows`).toBeGreaterThan(0);
  }
}

function withFile<T>(path: string, read: (sqlite: Database.Database) => T): T {
  const sqlite = new Database(path, { readonly: true, fileMustExist: true });
  try {
    return read(sqlite);
  } finally {
    sqlite.close();
  }
}

function dbErrorOf(work: () => unknown): DbError {
  try {
    work();
  } catch (error) {
    expect(error).toBeInstanceOf(DbError);
    return error as DbError;
  }
  throw new Error('expected a DbError, none was thrown');
}

describe('backup and restore', () => {
  it('backupTo then restoreFrom into a fresh path gives the same rows in every table', () => {
    fillProject(project.store);
    const expected = allRows(project.store.sqlite);
    const backup = fileIn('season.sealwork-backup');
    backupTo(project.store, backup);
    expect(checkBackup(backup)).toBe(LATEST_SCHEMA_VERSION);
    const fresh = fileIn('restored.db');
    restoreFrom(backup, fresh);
    expect(existsSync(`${fresh}.before-restore`)).toBe(false);
    const restored = openStore(fresh);
    expect(allRows(restored.sqlite)).toEqual(expected);
    expect(restored.sqlite.pragma('user_version', { simple: true })).toBe(LATEST_SCHEMA_VERSION);
    restored.close();
    // No half-made copies are left beside the files.
    expect(
      readdirSync(project.folder.path).filter((name) => /\.(partial|restoring)$/.test(name)),
    ).toEqual([]);
  });

  it('a backup replaces a file already at that path', () => {
    const backup = fileIn('again.bak');
    backupTo(project.store, backup);
    project.store.write((write) => createHome(write, { name: 'Added later', data: {} }));
    backupTo(project.store, backup);
    expect(withFile(backup, (sqlite) => rowCounts(sqlite).homes)).toBe(1);
  });

  it('a backup taken while another connection holds an open write transaction is the last commit', () => {
    fillProject(project.store);
    const committed = allRows(project.store.sqlite);
    const other = new Database(project.path);
    other.pragma('busy_timeout = 5000');
    other.exec('BEGIN IMMEDIATE');
    // Enough uncommitted data to overflow the writer's page cache (cache_size 100 pages), so
    // some of it reaches the WAL file before the commit; a reader must still not see it.
    other.pragma('cache_size = 100');
    const insert = other.prepare(
      "INSERT INTO homes (name, notes, data, created_at, updated_at) VALUES (?, ?, '{}', 'now', 'now')",
    );
    for (let index = 0; index < 2000; index += 1)
      insert.run(`Uncommitted ${index}`, 'n'.repeat(1000));
    other.prepare("UPDATE clients SET name = 'Renamed, not committed'").run();
    const backup = fileIn('during-write.bak');
    const startedMs = performance.now();
    backupTo(project.store, backup);
    // In WAL mode a writer does not block a reader, so the backup did not wait for the lock.
    expect(performance.now() - startedMs).toBeLessThan(2000);
    other.exec('COMMIT');
    other.close();
    expect(checkBackup(backup)).toBe(LATEST_SCHEMA_VERSION);
    expect(withFile(backup, allRows)).toEqual(committed);
    expect(rowCounts(project.store.sqlite).homes).toBe((committed.homes ?? []).length + 2000);
  });

  it('restore keeps the previous file as <name>.before-restore, replaced by the next restore', () => {
    const path = project.path;
    project.store.write((write) => importHomeFile(write, validBaseHome()));
    const backup = fileIn('one-home.bak');
    backupTo(project.store, backup);
    const second = validBaseHome();
    setAt(second, 'name', 'Imported after the backup');
    project.store.write((write) => importHomeFile(write, second));
    const beforeRestore = allRows(project.store.sqlite);
    project.store.close();

    restoreFrom(backup, path);
    const names = (file: string) =>
      withFile(file, (sqlite) =>
        (sqlite.prepare('SELECT name FROM homes ORDER BY id').all() as { name: string }[]).map(
          (row) => row.name,
        ),
      );
    expect(names(path)).toEqual(['Bad-input base house']);
    expect(withFile(`${path}.before-restore`, allRows)).toEqual(beforeRestore);
    expect(existsSync(`${path}-wal`)).toBe(false);

    restoreFrom(backup, path);
    expect(names(`${path}.before-restore`)).toEqual(['Bad-input base house']);
  });

  it('a backup from an earlier version restores and is migrated when opened', () => {
    const oldPath = fileIn('old.db');
    const old = openStore(oldPath, { targetVersion: 1 });
    // The repositories speak the latest schema, so the old file is filled in its own SQL.
    old.sqlite
      .prepare(
        "INSERT INTO homes (name, data, created_at, updated_at) VALUES ('Old home', '{}', 'now', 'now')",
      )
      .run();
    const backup = fileIn('old.bak');
    backupTo(old, backup);
    old.close();
    expect(checkBackup(backup)).toBe(1);
    const target = fileIn('from-old.db');
    restoreFrom(backup, target);
    const store = openStore(target);
    expect(store.sqlite.pragma('user_version', { simple: true })).toBe(LATEST_SCHEMA_VERSION);
    expect(
      store.read((read) => listHomes(read)).map((home) => [home.name, home.jobStatus]),
    ).toEqual([['Old home', 'audited']]);
    store.close();
  });
});

describe('checkBackup refuses a file that is not a good backup', () => {
  function goodBackup(): string {
    fillProject(project.store);
    const backup = fileIn('good.bak');
    backupTo(project.store, backup);
    return backup;
  }

  it('a text file: corrupt', () => {
    const path = fileIn('notes.txt');
    writeFileSync(path, 'These are my notes, not a project.\n'.repeat(200));
    expect(dbErrorOf(() => checkBackup(path)).kind).toBe('corrupt');
  });

  it('a truncated copy: corrupt', () => {
    const backup = goodBackup();
    const truncated = fileIn('truncated.bak');
    copyFileSync(backup, truncated);
    truncateSync(truncated, Math.floor(statSync(backup).size / 2));
    expect(dbErrorOf(() => checkBackup(truncated)).kind).toBe('corrupt');
  });

  it('a copy from a newer Sealwork (user_version above the latest): newerVersion', () => {
    const newer = fileIn('newer.bak');
    copyFileSync(goodBackup(), newer);
    const sqlite = new Database(newer);
    sqlite.pragma(`user_version = ${LATEST_SCHEMA_VERSION + 5}`);
    sqlite.close();
    const error = dbErrorOf(() => checkBackup(newer));
    expect(error.kind).toBe('newerVersion');
    expect(error.message).toMatch(/update Sealwork/i);
  });

  it('an empty file, or a SQLite file of another program: corrupt (not a Sealwork project)', () => {
    // SQLite treats an empty file as an empty database, so this is the version check's job.
    const empty = fileIn('empty.bak');
    writeFileSync(empty, '');
    expect(dbErrorOf(() => checkBackup(empty)).kind).toBe('corrupt');
    const foreign = fileIn('other-program.db');
    const sqlite = new Database(foreign);
    sqlite.exec('CREATE TABLE recipes (id INTEGER PRIMARY KEY, title TEXT)');
    sqlite.pragma('user_version = 2');
    sqlite.close();
    expect(dbErrorOf(() => checkBackup(foreign)).kind).toBe('corrupt');
  });

  it('a missing file: notFound', () => {
    expect(dbErrorOf(() => checkBackup(fileIn('nowhere.bak'))).kind).toBe('notFound');
  });

  it('restoreFrom a bad backup leaves the project file as it was', () => {
    project.store.write((write) => importHomeFile(write, validBaseHome()));
    project.store.close();
    const bytes = readFileSync(project.path);
    const path = fileIn('garbage.bak');
    writeFileSync(path, 'x'.repeat(8192));
    expect(dbErrorOf(() => restoreFrom(path, project.path)).kind).toBe('corrupt');
    expect(readFileSync(project.path).equals(bytes)).toBe(true);
    expect(existsSync(`${project.path}.before-restore`)).toBe(false);
  });
});
