/**
 * The command line's project commands through `main()` with a capturing output, on project
 * files in a temporary folder: import, evaluate by id, export, list, backup and restore, a new
 * file with and without the demo, the SEALWORK_DB default, and bad input (exit 2, problems on
 * stderr, nothing on stdout, nothing written). SEALWORK_DB points into the temporary folder
 * for every test, so no command can reach the user's real data folder.
 */
import { existsSync, readFileSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { checkHomeFile } from '../../core/schema.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import { getHome, listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { openStore } from '../../db/store.ts';
import { setAt, validBaseHome } from '../_lib/base-home.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';
import { multipointHome } from '../db/_lib/hand-homes.ts';
import { rowCounts } from '../db/_lib/sqlite-rows.ts';

const EXIT_OK = 0;
const EXIT_BAD_INPUT = 2;

let folder: TempFolder;
let savedSealworkDb: string | undefined;
let db: string;
beforeEach(() => {
  folder = makeTempFolder('sealwork-cli-project-');
  db = `${folder.path}/project.db`;
  savedSealworkDb = process.env.SEALWORK_DB;
  process.env.SEALWORK_DB = `${folder.path}/default-guard.db`;
});
afterEach(() => {
  if (savedSealworkDb === undefined) delete process.env.SEALWORK_DB;
  else process.env.SEALWORK_DB = savedSealworkDb;
  folder.remove();
});

/** Reads a project file the command line has closed. */
function inProject<T>(path: string, read: (store: ReturnType<typeof openStore>) => T): T {
  const store = openStore(path);
  try {
    return read(store);
  } finally {
    store.close();
  }
}

async function importOk(file: string, ...options: string[]): Promise<number> {
  const run = await runCli(['import', file, '--db', db, ...options]);
  expect(run.stderr).toBe('');
  expect(run.exitCode).toBe(EXIT_OK);
  return options.includes('--json')
    ? (JSON.parse(run.stdout) as { id: number }).id
    : Number(run.stdout.trim());
}

async function listJson(...args: string[]): Promise<HomeSummary[]> {
  const run = await runCli(['list', '--json', ...args]);
  expect(run.exitCode).toBe(EXIT_OK);
  return JSON.parse(run.stdout) as HomeSummary[];
}

describe('import, evaluate, export, list', () => {
  it('import FILE prints the new id; with --json it prints {"id": n}', async () => {
    const file = folder.write('home.json', validBaseHome());
    const plain = await runCli(['import', file, '--db', db]);
    expect(plain.exitCode).toBe(EXIT_OK);
    expect(plain.stdout).toMatch(/^\d+\n$/);
    const first = Number(plain.stdout.trim());
    const json = await runCli(['import', file, '--db', db, '--json']);
    expect(json.exitCode).toBe(EXIT_OK);
    const parsed = JSON.parse(json.stdout) as unknown;
    expect(parsed).toEqual({ id: expect.any(Number) });
    const second = (parsed as { id: number }).id;
    expect(second).not.toBe(first);
    expect(
      inProject(db, (store) =>
        store.read((read) => [getHome(read, first).name, getHome(read, second).name]),
      ),
    ).toEqual(['Bad-input base house', 'Bad-input base house']);
  });

  it.each([
    ['the base home', validBaseHome()],
    ['a multipoint home', multipointHome()],
  ])(
    'evaluate ID --db --json gives the same report as evaluate FILE --json (%s)',
    async (_what, home) => {
      const file = folder.write('home.json', home);
      const id = await importOk(file);
      const byId = await runCli(['evaluate', String(id), '--db', db, '--json']);
      const byFile = await runCli(['evaluate', file, '--json']);
      expect(byId.exitCode).toBe(EXIT_OK);
      expect(byFile.exitCode).toBe(EXIT_OK);
      expect(JSON.parse(byId.stdout)).toEqual(JSON.parse(byFile.stdout));
    },
  );

  it('export ID FILE writes the stored home as a valid home file', async () => {
    const id = await importOk(folder.write('home.json', multipointHome()));
    const out = `${folder.path}/exported.json`;
    const run = await runCli(['export', String(id), out, '--db', db]);
    expect(run.exitCode).toBe(EXIT_OK);
    expect(run.stdout).toContain(out);
    const written = JSON.parse(readFileSync(out, 'utf8')) as unknown;
    expect(written).toEqual(
      inProject(db, (store) => store.read((read) => exportHomeFile(read, id))),
    );
    expect(checkHomeFile(written).ok).toBe(true);
  });

  it('list --json gives the stored homes as the repository lists them', async () => {
    const named = validBaseHome();
    setAt(named, 'name', 'Aardvark house');
    const a = await importOk(folder.write('a.json', named));
    const b = await importOk(folder.write('b.json', multipointHome()));
    const listed = await listJson('--db', db);
    expect(listed.map((home) => home.id)).toEqual([a, b]);
    expect(listed).toEqual(inProject(db, (store) => store.read((read) => listHomes(read))));
    const table = await runCli(['list', '--db', db]);
    expect(table.stdout).toContain('Aardvark house');
    expect(table.stdout).toContain('Multipoint house');
  });
});

describe('backup and restore', () => {
  it('backup FILE then restore FILE brings the project back to the backup, keeping the old file', async () => {
    const kept = await importOk(folder.write('a.json', validBaseHome()));
    const backup = `${folder.path}/season.bak`;
    const backedUp = await runCli(['backup', backup, '--db', db]);
    expect(backedUp.exitCode).toBe(EXIT_OK);
    expect(existsSync(backup)).toBe(true);
    await importOk(folder.write('b.json', multipointHome()));
    expect((await listJson('--db', db)).length).toBe(2);
    const restored = await runCli(['restore', backup, '--db', db]);
    expect(restored.stderr).toBe('');
    expect(restored.exitCode).toBe(EXIT_OK);
    expect((await listJson('--db', db)).map((home) => home.id)).toEqual([kept]);
    expect(
      inProject(`${db}.before-restore`, (store) => store.read((read) => listHomes(read).length)),
    ).toBe(2);
  });

  it('restore of a file that is not a backup exits 2 and leaves the project alone', async () => {
    await importOk(folder.write('a.json', validBaseHome()));
    const notBackup = folder.write('notes.txt', 'not a backup\n'.repeat(500));
    const run = await runCli(['restore', notBackup, '--db', db]);
    expect(run.exitCode).toBe(EXIT_BAD_INPUT);
    expect(run.stdout).toBe('');
    expect(run.stderr).not.toBe('');
    expect((await listJson('--db', db)).length).toBe(1);
  });
});

describe('which project file', () => {
  it('a new file named by --db starts with no homes', async () => {
    expect(await listJson('--db', `${folder.path}/fresh.db`)).toEqual([]);
  });

  it('a new file named by --db with --demo starts with the demo homes, seeded once', async () => {
    // The demo is being completed (a dozen or more homes); at least 6 are there now.
    const path = `${folder.path}/demo.db`;
    const homes = await listJson('--db', path, '--demo');
    expect(homes.length).toBeGreaterThanOrEqual(6);
    expect(homes.length).toBe(DEMO_HOMES.length);
    expect(homes.every((home) => home.isDemo)).toBe(true);
    expect((await listJson('--db', path, '--demo')).length).toBe(homes.length);
  });

  it('SEALWORK_DB sets the default file, which starts with the demo homes', async () => {
    const path = `${folder.path}/from-env.db`;
    process.env.SEALWORK_DB = path;
    const homes = await listJson();
    expect(existsSync(path)).toBe(true);
    expect(homes.length).toBe(DEMO_HOMES.length);
    const run = await runCli(['import', folder.write('a.json', multipointHome()), '--json']);
    expect(run.exitCode).toBe(EXIT_OK);
    const { id } = JSON.parse(run.stdout) as { id: number };
    expect(inProject(path, (store) => store.read((read) => getHome(read, id).name))).toBe(
      'Multipoint house',
    );
    expect(existsSync(`${folder.path}/default-guard.db`)).toBe(false);
  });
});

describe('bad input exits 2', () => {
  it.each([
    ['evaluate', ['evaluate', '987654', '--json']],
    ['export', ['export', '987654', 'OUT']],
  ])('%s of a home id that does not exist names the id', async (_what, argv) => {
    await importOk(folder.write('a.json', validBaseHome()));
    const out = `${folder.path}/never-written.json`;
    const run = await runCli([...argv.map((arg) => (arg === 'OUT' ? out : arg)), '--db', db]);
    expect(run.exitCode).toBe(EXIT_BAD_INPUT);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain('987654');
    expect(existsSync(out)).toBe(false);
  });

  it('import of an invalid file lists the paths on stderr and writes nothing', async () => {
    await importOk(folder.write('a.json', validBaseHome()));
    const before = inProject(db, (store) => rowCounts(store.sqlite));
    const broken = validBaseHome();
    setAt(broken, 'house.stories', 9);
    setAt(broken, 'measures[0].cost.laborHours', -3);
    setAt(broken, 'client', { name: 'Never stored' });
    const run = await runCli(['import', folder.write('broken.json', broken), '--db', db]);
    expect(run.exitCode).toBe(EXIT_BAD_INPUT);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain('house.stories');
    expect(run.stderr).toContain('measures[0].cost.laborHours');
    expect(inProject(db, (store) => rowCounts(store.sqlite))).toEqual(before);
  });
});
