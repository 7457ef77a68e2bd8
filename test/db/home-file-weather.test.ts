/**
 * A home planned hour by hour as a home file: export writes its climate's weather year into
 * the file (`weatherYear`), and importing that file into a fresh project stores the same
 * hours again, so the home there evaluates to exactly the figures it had where it was made.
 * Into the project it came from, the import finds the identical stored climate and links to
 * it. A broken year is refused with the field named and nothing written; a degree-day home's
 * file is as it was.
 *
 * Checked against: the hours read here column by column from the generated TMY3 text, and the
 * hourly degree days summed from that text (Σ (65 − T)⁺ / 24, ASHRAE HoF "Energy Estimating
 * and Modeling Methods"); the rest compares one project's figures with another's.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import { reportOf } from '../../core/evaluate.ts';
import { homeFileSchema, parseHomeFile, type HomeFile } from '../../core/schema.ts';
import { detectAndParseWeather } from '../../core/weather.ts';
import { homeFileText } from '../../core/weather/home-file-text.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';
import { exportHomeFile, importHomeFile } from '../../db/home-file.ts';
import { getHome } from '../../db/repositories/homes.ts';
import { climates } from '../../db/repositories/reusable-sets.ts';
import {
  createWeatherYear,
  linkClimateWeatherYear,
  weatherYearOfClimate,
  weatherYearSummaryOfClimate,
} from '../../db/repositories/weather-years.ts';
import { deleteAt, setAt, type JsonObject, type JsonValue } from '../_lib/base-home.ts';
import {
  hourlyDegreeDaysF,
  hourlyHomeFile,
  hourlyYearText,
  hoursOfText,
  storeWeatherClimate,
} from '../_lib/hourly-home.ts';
import { rowCounts } from './_lib/sqlite-rows.ts';
import { openTempProject, storeHomeFile, type TempProject } from './_lib/store-home.ts';

const TEXT = hourlyYearText();
const YEAR_NAME = 'Generated swing year';

let origin: TempProject;
let fresh: TempProject;
let homeId: number;
let climateId: number;

beforeEach(() => {
  origin = openTempProject();
  fresh = openTempProject();
  ({ homeId, climateId } = origin.store.write((write) => {
    const stored = storeWeatherClimate(write, TEXT, YEAR_NAME);
    const id = storeHomeFile(write, hourlyHomeFile({ heatingBalancePointF: 60 }), {
      climateId: stored.climateId,
    });
    return { homeId: id, climateId: stored.climateId };
  }));
});
afterEach(() => {
  origin.dispose();
  fresh.dispose();
});

/** The home as written to disk and read back, as another machine gets it. */
function exportedFile(project: TempProject, id: number): JsonObject {
  const file = project.store.read((read) => exportHomeFile(read, id, { withWeatherYear: true }));
  return JSON.parse(homeFileText(file)) as JsonObject;
}

function importInto(project: TempProject, file: unknown): number {
  return project.store.write((write) => importHomeFile(write, file));
}

/** The stored home's report, as every screen and command shows it. */
function reportOfStored(project: TempProject, id: number) {
  return project.store.read((read) => reportOf(evaluateStoredHome(read, id).evaluation));
}

function problemsOf(work: () => unknown): { path: string; message: string }[] {
  try {
    work();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    return [...(error as InputError).problems];
  }
  throw new Error('expected an InputError, none was thrown');
}

describe('an hourly home through a home file into a fresh project', () => {
  it('evaluates there to exactly the same figures', () => {
    const imported = importInto(fresh, exportedFile(origin, homeId));
    const before = reportOfStored(origin, homeId);
    const after = reportOfStored(fresh, imported);
    expect(after).toEqual(before);
    expect(JSON.stringify(after)).toBe(JSON.stringify(before));
    // The hours really were used: degree days at the 60 °F balance point are the text's own.
    expect(after.climateSource).toMatchObject({ kind: 'hourly', hours: 8760 });
    expect(after.climateSource.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 60), 6);
  });

  it('carries the hours exactly as the weather file gives them, and the place', () => {
    const file = parseHomeFile(exportedFile(origin, homeId));
    expect(file.weatherYear?.hours).toEqual(hoursOfText(TEXT));
    // The reader keeps the text's "-0.0" as −0; the home file, which cannot say −0, has 0.
    const stored = origin.store.read((read) => weatherYearOfClimate(read, climateId));
    expect(Object.is(stored?.hours[0]?.dryBulbC, -0)).toBe(true);
    expect(Object.is(file.weatherYear?.hours.dryBulbC[0], 0)).toBe(true);
    // TMY3 line 1: station 999999, "TEST, GENERATED", ZZ, −7 h, 35.000°, −110.500°, 1200 m.
    expect(file.weatherYear).toMatchObject({
      name: YEAR_NAME,
      format: 'tmy3',
      location: {
        stationId: '999999',
        region: 'ZZ',
        latitude: 35,
        longitude: -110.5,
        timeZoneHours: -7,
        elevationM: 1200,
      },
    });
  });

  it('is the same file when exported again from the fresh project', () => {
    const first = exportedFile(origin, homeId);
    const second = exportedFile(fresh, importInto(fresh, first));
    expect(second).toEqual(first);
    expect(homeFileText(second)).toBe(homeFileText(first));
  });

  it('is stored as a climate of its own with its year, named as the climate', () => {
    const imported = importInto(fresh, exportedFile(origin, homeId));
    const linked = fresh.store.read((read) => getHome(read, imported).climateId);
    expect(linked).not.toBeNull();
    const summary = fresh.store.read((read) => weatherYearSummaryOfClimate(read, linked ?? 0));
    expect(summary).toMatchObject({ name: YEAR_NAME, format: 'tmy3', hourCount: 8760 });
    expect(fresh.store.read((read) => climates.get(read, linked ?? 0)).name).toBe(YEAR_NAME);
  });
});

describe('importing where a climate is already stored', () => {
  it('back into its own project: links to the identical climate, stores no second year', () => {
    const before = rowCounts(origin.store.sqlite);
    const imported = importInto(origin, exportedFile(origin, homeId));
    const after = rowCounts(origin.store.sqlite);
    expect(origin.store.read((read) => getHome(read, imported).climateId)).toBe(climateId);
    expect(after.climates).toBe(before.climates);
    expect(after.weather_years).toBe(before.weather_years);
    expect(reportOfStored(origin, imported)).toEqual(reportOfStored(origin, homeId));
  });

  it('with the same name but other figures: a new climate named "… (2)"', () => {
    const taken = fresh.store.write((write) =>
      climates.create(write, YEAR_NAME, {
        name: YEAR_NAME,
        hdd65F: 100,
        cdd65F: 0,
        elevationFt: 0,
      }),
    );
    const imported = importInto(fresh, exportedFile(origin, homeId));
    const linked = fresh.store.read((read) => getHome(read, imported).climateId) ?? 0;
    expect(linked).not.toBe(taken);
    expect(fresh.store.read((read) => climates.get(read, linked)).name).toBe(`${YEAR_NAME} (2)`);
    expect(reportOfStored(fresh, imported)).toEqual(reportOfStored(origin, homeId));
  });

  it('with the same figures but other hours: a new climate and year', () => {
    // The file's own climate figures over a windier year of the same name and format.
    const file = exportedFile(origin, homeId);
    const climate = parseHomeFile(file).climate;
    const lookalike = fresh.store.write((write) => {
      const id = climates.create(write, 'Lookalike', climate);
      const weather = detectAndParseWeather(hourlyYearText(6));
      const yearId = createWeatherYear(write, { name: YEAR_NAME, format: 'tmy3', weather });
      linkClimateWeatherYear(write, id, yearId);
      return id;
    });
    const before = rowCounts(fresh.store.sqlite);
    const imported = importInto(fresh, file);
    const after = rowCounts(fresh.store.sqlite);
    expect(fresh.store.read((read) => getHome(read, imported).climateId)).not.toBe(lookalike);
    expect(after.climates).toBe((before.climates ?? 0) + 1);
    expect(after.weather_years).toBe((before.weather_years ?? 0) + 1);
    expect(reportOfStored(fresh, imported)).toEqual(reportOfStored(origin, homeId));
  });
});

describe('a broken weather year is refused, naming the field, writing nothing', () => {
  const cases: [string, (file: JsonObject) => void, string, RegExp][] = [
    [
      'a word among the hours',
      (file) => setAt(file, 'weatherYear.hours.dryBulbC[3]', 'warm'),
      'weatherYear.hours.dryBulbC[3]',
      /expected a number from -70 to 70 °C, got "warm"/,
    ],
    [
      'a month 13',
      (file) => setAt(file, 'weatherYear.hours.month[0]', 13),
      'weatherYear.hours.month[0]',
      /expected a whole number from 1 to 12/,
    ],
    [
      'one hour short of wind',
      (file) => {
        const wind = (file.weatherYear as { hours: { windSpeedMs: JsonValue[] } }).hours;
        wind.windSpeedMs.pop();
      },
      'weatherYear.hours.windSpeedMs',
      /expected 8760 hourly values \(as many as month\), got 8759/,
    ],
    [
      'a quantity Sealwork does not know',
      (file) => setAt(file, 'weatherYear.hours.solarWm2', [1]),
      'weatherYear.hours.solarWm2',
      /not a field/,
    ],
    [
      'no pressure list',
      (file) => deleteAt(file, 'weatherYear.hours.pressurePa'),
      'weatherYear.hours.pressurePa',
      /expected a list of numbers/,
    ],
    [
      'an unknown format',
      (file) => setAt(file, 'weatherYear.format', 'csv'),
      'weatherYear.format',
      /"epw", "tmy3"/,
    ],
    [
      'a latitude past the pole',
      (file) => setAt(file, 'weatherYear.location.latitude', 95),
      'weatherYear.location.latitude',
      /at most 90/,
    ],
    [
      'a year on a home planned on degree days',
      (file) => deleteAt(file, 'hourlyWeather'),
      'weatherYear',
      /hourlyWeather/,
    ],
  ];

  it.each(cases)('%s', (_what, breakIt, path, wording) => {
    const file = exportedFile(origin, homeId);
    breakIt(file);
    const before = rowCounts(fresh.store.sqlite);
    const problems = problemsOf(() => importInto(fresh, file));
    // The one problem is the one made, named where it is (each case breaks one thing).
    expect(problems.map((problem) => problem.path)).toEqual([path]);
    expect(problems[0]?.message).toMatch(wording);
    expect(rowCounts(fresh.store.sqlite)).toEqual(before);
  });

  it('names five wrong hours of a quantity and counts the rest', () => {
    const file = exportedFile(origin, homeId);
    const hours = (file.weatherYear as { hours: { windSpeedMs: JsonValue[] } }).hours;
    hours.windSpeedMs = hours.windSpeedMs.map(() => -1);
    const problems = problemsOf(() => importInto(fresh, file));
    expect(problems.map((problem) => problem.path)).toEqual([
      'weatherYear.hours.windSpeedMs[0]',
      'weatherYear.hours.windSpeedMs[1]',
      'weatherYear.hours.windSpeedMs[2]',
      'weatherYear.hours.windSpeedMs[3]',
      'weatherYear.hours.windSpeedMs[4]',
      'weatherYear.hours.windSpeedMs',
    ]);
    expect(problems[5]?.message).toBe('and 8755 more hours outside 0 to 40 m/s');
  });

  it('a file refused after its climate was stored leaves no climate or year behind', () => {
    // The measure type passes the file's schema but not the library, found only after the
    // climate and its year were written: the one transaction must undo them.
    const file = exportedFile(origin, homeId);
    setAt(file, 'measures[0].type', 'no-such-measure');
    const before = rowCounts(fresh.store.sqlite);
    expect(problemsOf(() => importInto(fresh, file)).map((problem) => problem.path)).toEqual([
      'measures[0].type',
    ]);
    expect(rowCounts(fresh.store.sqlite)).toEqual(before);
  });
});

describe('files without a weather year are as they were', () => {
  /** The home file's fields before `weatherYear` was added, in the schema's order. */
  const FIELDS_BEFORE = Object.keys(homeFileSchema.shape).filter((key) => key !== 'weatherYear');

  function plainExport(project: TempProject, id: number): HomeFile {
    return project.store.read((read) => exportHomeFile(read, id));
  }

  it('a degree-day home on a climate with hours: no weatherYear, the same bytes', () => {
    const degreeDayHome = origin.store.write((write) => {
      const { hourlyWeather: _hourly, ...file } = hourlyHomeFile();
      // The LBL basic model on the climate's season means (which the weather file gave).
      return storeHomeFile(write, file, { climateId });
    });
    const withAsked = exportedFile(origin, degreeDayHome);
    expect(Object.keys(withAsked)).not.toContain('weatherYear');
    expect(Object.keys(withAsked).every((key) => FIELDS_BEFORE.includes(key))).toBe(true);
    const plain = plainExport(origin, degreeDayHome);
    expect(homeFileText(withAsked)).toBe(`${JSON.stringify(plain, null, 2)}\n`);
  });

  it.each(DEMO_HOMES.map((home) => [home.name, home] as const))(
    'demo home %s (used only as input)',
    (_name, home) => {
      const id = importInto(fresh, home);
      const file = fresh.store.read((read) => exportHomeFile(read, id, { withWeatherYear: true }));
      expect(file).toEqual(plainExport(fresh, id));
      expect(homeFileText(file)).toBe(`${JSON.stringify(plainExport(fresh, id), null, 2)}\n`);
    },
  );

  it('an hourly home whose climate has no hours: no weatherYear, refused as before', () => {
    const figures = origin.store.write((write) =>
      climates.create(write, 'Typed-in climate', {
        name: 'Typed-in climate',
        hdd65F: 5500,
        cdd65F: 900,
        elevationFt: 600,
      }),
    );
    const id = origin.store.write((write) =>
      storeHomeFile(write, hourlyHomeFile(), { climateId: figures }),
    );
    expect(Object.keys(exportedFile(origin, id))).not.toContain('weatherYear');
    expect(problemsOf(() => reportOfStored(origin, id)).map((problem) => problem.path)).toEqual([
      'hourlyWeather',
    ]);
  });

  it('an export not asking for the year leaves it out, as the store’s own evaluations read it', () => {
    expect(Object.keys(plainExport(origin, homeId))).not.toContain('weatherYear');
  });
});
