/**
 * `sealwork export HOME_ID FILE [--photos]` and `sealwork import FILE` with a home planned
 * hour by hour, between two project files in a temporary folder: the written file carries
 * the climate's weather year, each hourly list on one line; imported into the other project
 * it evaluates (`evaluate ID --json`) to the same figures, and `evaluate FILE` plans the
 * file on the year it carries. A degree-day home's file is written byte for byte as before;
 * a broken year is refused (exit 2) naming the field, with nothing stored.
 *
 * Checked against: the degree days summed from the generated TMY3 text (Σ (65 − T)⁺ / 24 over
 * its hours, ASHRAE HoF "Energy Estimating and Modeling Methods"); otherwise one project's
 * figures beside the other's.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { exportHomeFile } from '../../db/home-file.ts';
import { openStore } from '../../db/store.ts';
import { setAt, type JsonObject } from '../_lib/base-home.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';
import {
  hourlyDegreeDaysF,
  hourlyHomeFile,
  hourlyYearText,
  storeWeatherClimate,
} from '../_lib/hourly-home.ts';
import { rowCounts } from '../db/_lib/sqlite-rows.ts';
import { storeHomeFile } from '../db/_lib/store-home.ts';

const EXIT_OK = 0;
const EXIT_BAD_INPUT = 2;
const TEXT = hourlyYearText();

let folder: TempFolder;
let savedSealworkDb: string | undefined;
let origin: string;
let elsewhere: string;
let hourlyId: number;
let degreeDayId: number;

/** Works on a project file the command line is not using. */
function inProject<T>(path: string, work: (store: ReturnType<typeof openStore>) => T): T {
  const store = openStore(path);
  try {
    return work(store);
  } finally {
    store.close();
  }
}

beforeEach(() => {
  folder = makeTempFolder('sealwork-cli-hourly-');
  origin = `${folder.path}/origin.db`;
  elsewhere = `${folder.path}/elsewhere.db`;
  savedSealworkDb = process.env.SEALWORK_DB;
  process.env.SEALWORK_DB = `${folder.path}/default-guard.db`;
  ({ hourlyId, degreeDayId } = inProject(origin, (store) =>
    store.write((write) => {
      const { climateId } = storeWeatherClimate(write, TEXT, 'Generated swing year');
      const { hourlyWeather: _hourly, ...onSeasons } = hourlyHomeFile();
      return {
        hourlyId: storeHomeFile(write, hourlyHomeFile(), { climateId }),
        degreeDayId: storeHomeFile(write, onSeasons, { climateId }),
      };
    }),
  ));
});
afterEach(() => {
  if (savedSealworkDb === undefined) delete process.env.SEALWORK_DB;
  else process.env.SEALWORK_DB = savedSealworkDb;
  folder.remove();
});

async function ok(argv: string[]): Promise<string> {
  const run = await runCli(argv);
  expect(run.stderr).toBe('');
  expect(run.exitCode).toBe(EXIT_OK);
  return run.stdout;
}

async function exportTo(id: number, name: string, ...options: string[]): Promise<string> {
  const path = `${folder.path}/${name}`;
  await ok(['export', String(id), path, '--db', origin, ...options]);
  return path;
}

async function evaluateJson(target: string, db: string): Promise<unknown> {
  return JSON.parse(await ok(['evaluate', target, '--db', db, '--json']));
}

describe('an hourly home exported and imported on the command line', () => {
  it('evaluates in the other project to the same figures', async () => {
    const path = await exportTo(hourlyId, 'hourly.json');
    const { id } = JSON.parse(await ok(['import', path, '--db', elsewhere, '--json'])) as {
      id: number;
    };
    const before = await evaluateJson(String(hourlyId), origin);
    const after = (await evaluateJson(String(id), elsewhere)) as {
      climateSource: { kind: string; heatingDegreeDaysF: number };
    };
    expect(after).toEqual(before);
    expect(after.climateSource.kind).toBe('hourly');
    expect(after.climateSource.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 65), 6);
    // `evaluate FILE` plans the file on the year it carries.
    expect(await evaluateJson(path, elsewhere)).toEqual(before);
  });

  it('writes the year with each hourly list on one line', async () => {
    const text = readFileSync(await exportTo(hourlyId, 'hourly.json'), 'utf8');
    const file = JSON.parse(text) as { weatherYear: { hours: Record<string, number[]> } };
    const lists = Object.values(file.weatherYear.hours);
    expect(lists).toHaveLength(8);
    for (const list of lists) {
      expect(list).toHaveLength(8760);
      expect(text).toContain(JSON.stringify(list));
    }
    // The home itself stays indented as before; the year adds its few lines, not 70,080.
    expect(text.split('\n').length).toBeLessThan(400);
  });

  it('with --photos: the bundle carries the year and imports the same way', async () => {
    const path = await exportTo(hourlyId, 'bundle.json', '--photos');
    const bundle = JSON.parse(readFileSync(path, 'utf8')) as { file: JsonObject };
    expect(bundle.file.weatherYear).toBeDefined();
    const { id } = JSON.parse(await ok(['import', path, '--db', elsewhere, '--json'])) as {
      id: number;
    };
    expect(await evaluateJson(String(id), elsewhere)).toEqual(
      await evaluateJson(String(hourlyId), origin),
    );
  });

  it('a broken year: exit 2, the field on stderr, nothing stored', async () => {
    const path = await exportTo(hourlyId, 'hourly.json');
    const file = JSON.parse(readFileSync(path, 'utf8')) as JsonObject;
    setAt(file, 'weatherYear.hours.dryBulbC[0]', 99.9);
    writeFileSync(path, JSON.stringify(file));
    await ok(['list', '--db', elsewhere]);
    const before = inProject(elsewhere, (store) => rowCounts(store.sqlite));
    const run = await runCli(['import', path, '--db', elsewhere]);
    expect(run.exitCode).toBe(EXIT_BAD_INPUT);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(
      /weatherYear\.hours\.dryBulbC\[0\]: expected a number from -70 to 70/,
    );
    expect(inProject(elsewhere, (store) => rowCounts(store.sqlite))).toEqual(before);
  });
});

describe('a degree-day home on the command line', () => {
  it('is written byte for byte as before: indented JSON, no weatherYear', async () => {
    const text = readFileSync(await exportTo(degreeDayId, 'degree-days.json'), 'utf8');
    const stored = inProject(origin, (store) =>
      store.read((read) => exportHomeFile(read, degreeDayId)),
    );
    expect(text).toBe(`${JSON.stringify(stored, null, 2)}\n`);
    expect(Object.keys(JSON.parse(text) as JsonObject)).not.toContain('weatherYear');
  });
});
