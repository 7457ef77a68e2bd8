/**
 * Stored weather years and a home's bills (migration 0005) on a real project file.
 *
 * - A weather year read back equals, value for value, the year the core's readers parsed
 *   from a generated TMY3 and a generated leap-year EPW file (8,784 hours); the BLOBs are
 *   little-endian IEEE 754 binary64, checked by decoding them with a Float64Array view (the
 *   layout the migration documents; IEEE 754-2008 binary64). Float32 would not do: −3.3
 *   has no binary32 value (Math.fround(−3.3) ≠ −3.3).
 * - Bills replace a home's bills of the same fuel, all or none; they go with the home when
 *   it is purged (ON DELETE CASCADE, sqlite.org "SQLite Foreign Key Support").
 * Expected values are the inputs written here.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { UtilityBill } from '../../core/billing.ts';
import { InputError } from '../../core/errors.ts';
import { detectAndParseWeather, type HourlyWeather } from '../../core/weather.ts';
import { DbError } from '../../db/errors.ts';
import {
  clearBills,
  copyBills,
  listBills,
  listDailyTemperatures,
  replaceBills,
  replaceDailyTemperatures,
  temperatureSpan,
} from '../../db/repositories/bills.ts';
import { createHome, deleteHome, purgeHome } from '../../db/repositories/homes.ts';
import { climates } from '../../db/repositories/reusable-sets.ts';
import {
  createWeatherYear,
  getWeatherYear,
  linkClimateWeatherYear,
  weatherYearOfClimate,
  weatherYearSummaryOfClimate,
} from '../../db/repositories/weather-years.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { openTempProject, type TempProject } from './_lib/store-home.ts';

let project: TempProject;
beforeEach(() => {
  project = openTempProject({ clock: () => new Date('2025-03-01T09:00:00.000Z') });
});
afterEach(() => project.dispose());

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Month, day and hour of every hour of a year, in order. */
function yearHours(leap: boolean): [number, number, number][] {
  const hours: [number, number, number][] = [];
  DAYS_IN_MONTH.forEach((days, index) => {
    const inMonth = leap && index === 1 ? 29 : days;
    for (let day = 1; day <= inMonth; day += 1)
      for (let hour = 1; hour <= 24; hour += 1) hours.push([index + 1, day, hour]);
  });
  return hours;
}

/** A value that varies hour by hour, with one decimal (none of them exact in binary). */
function wave(index: number, span: number, low: number): number {
  return Math.round(((index * 37) % span) + low * 10) / 10;
}

/** A TMY3 file whose every quantity varies from hour to hour. */
function variedTmy3(): string {
  const pad = (value: number) => String(value).padStart(2, '0');
  return [
    '725317,"SOMEWHERE, GENERATED",ZZ,-6.0,41.250,-89.125,211.5',
    'Date (MM/DD/YYYY),Time (HH:MM),Dry-bulb (C),Dew-point (C),RHum (%),Pressure (mbar),Wspd (m/s)',
    ...yearHours(false).map(([month, day, hour], index) => {
      const dryBulbC = wave(index, 700, -30);
      const row = [
        dryBulbC,
        dryBulbC - 4.4,
        wave(index, 900, 5),
        wave(index, 600, 960),
        wave(index, 150, 0),
      ];
      return `${pad(month)}/${pad(day)}/1988,${pad(hour)}:00,${row.join(',')}`;
    }),
  ].join('\n');
}

/** A leap-year EPW file whose every quantity varies from hour to hour. */
function variedLeapEpw(): string {
  const header = [
    'LOCATION,Elsewhere,XX,Nowhere,generated for a test,123456,-33.875,151.25,10.0,58.5',
    'DESIGN CONDITIONS,0',
    'TYPICAL/EXTREME PERIODS,0',
    'GROUND TEMPERATURES,0',
    'HOLIDAYS/DAYLIGHT SAVING,No,0,0,0',
    'COMMENTS 1,varied weather generated in the test',
    'COMMENTS 2,none',
    'DATA PERIODS,1,1,Data,Sunday, 1/ 1,12/31',
  ];
  const rows = yearHours(true).map(([month, day, hour], index) => {
    const fields = Array.from({ length: 35 }, () => '0');
    const dryBulbC = wave(index, 650, -20);
    fields[0] = '2004';
    fields[1] = String(month);
    fields[2] = String(day);
    fields[3] = String(hour);
    fields[4] = '60';
    fields[5] = 'A7A7';
    fields[6] = String(dryBulbC);
    fields[7] = String(Math.round((dryBulbC - 3.3) * 10) / 10);
    fields[8] = String(wave(index, 800, 10));
    fields[9] = String(90_000 + ((index * 53) % 12_000));
    fields[21] = String(wave(index, 180, 0));
    return fields.join(',');
  });
  return [...header, ...rows].join('\n');
}

function storeYear(
  weather: HourlyWeather,
  format: 'epw' | 'tmy3',
): { climateId: number; yearId: number } {
  return project.store.write((write) => {
    const climateId = climates.create(write, 'Stored place', validBaseHome().climate);
    const yearId = createWeatherYear(write, { name: 'Stored place', format, weather });
    linkClimateWeatherYear(write, climateId, yearId);
    return { climateId, yearId };
  });
}

function thrownBy(work: () => unknown): unknown {
  try {
    work();
  } catch (error) {
    return error;
  }
  throw new Error('expected an error, none was thrown');
}

function problemPaths(work: () => unknown): string[] {
  const error = thrownBy(work);
  expect(error).toBeInstanceOf(InputError);
  return (error as InputError).problems.map((problem) => problem.path);
}

describe('weather years', () => {
  it('reads back a parsed TMY3 year exactly as parsed (deep-equal, every hour)', () => {
    const parsed = detectAndParseWeather(variedTmy3());
    expect(parsed.hours).toHaveLength(8760);
    const { climateId, yearId } = storeYear(parsed, 'tmy3');
    const back = project.store.read((read) => weatherYearOfClimate(read, climateId));
    expect(back).toStrictEqual(parsed);
    const record = project.store.read((read) => getWeatherYear(read, yearId));
    expect(record).toMatchObject({ name: 'Stored place', format: 'tmy3', hourCount: 8760 });
  });

  it('reads back a parsed leap-year EPW year exactly as parsed (8,784 hours)', () => {
    const parsed = detectAndParseWeather(variedLeapEpw());
    expect(parsed.hours).toHaveLength(8784);
    const { climateId } = storeYear(parsed, 'epw');
    expect(project.store.read((read) => weatherYearOfClimate(read, climateId))).toStrictEqual(
      parsed,
    );
    expect(
      project.store.read((read) => weatherYearSummaryOfClimate(read, climateId)),
    ).toMatchObject({
      format: 'epw',
      hourCount: 8784,
    });
  });

  it('keeps each quantity as little-endian binary64, one an hour (decoded here with a Float64Array)', () => {
    const parsed = detectAndParseWeather(variedTmy3());
    const { yearId } = storeYear(parsed, 'tmy3');
    const row = project.store.sqlite
      .prepare('SELECT calendar, dry_bulb_c, pressure_pa FROM weather_years WHERE id = ?')
      .get(yearId) as { calendar: Buffer; dry_bulb_c: Buffer; pressure_pa: Buffer };
    // The test machine is little-endian (every platform Sealwork ships on), so a plain view decodes it.
    const view = (bytes: Buffer) =>
      new Float64Array(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
    expect(Array.from(view(row.dry_bulb_c))).toEqual(parsed.hours.map((hour) => hour.dryBulbC));
    expect(Array.from(view(row.pressure_pa))).toEqual(parsed.hours.map((hour) => hour.pressurePa));
    expect(Array.from(row.calendar.subarray(24 * 3, 24 * 3 + 3))).toEqual([1, 2, 1]);
    // Why not float32: a tenth of a degree is not a binary32 value.
    expect(Math.fround(-3.3)).not.toBe(-3.3);
  });

  it('answers null for a climate entered as figures, notFound naming climateId for none', () => {
    const climateId = project.store.write((write) =>
      climates.create(write, 'Figures only', validBaseHome().climate),
    );
    expect(project.store.read((read) => weatherYearOfClimate(read, climateId))).toBeNull();
    const error = thrownBy(() => project.store.read((read) => weatherYearOfClimate(read, 9999)));
    expect(error).toBeInstanceOf(DbError);
    expect({ kind: (error as DbError).kind, field: (error as DbError).field }).toEqual({
      kind: 'notFound',
      field: 'climateId',
    });
  });

  it('goes with its climate when the climate is deleted', () => {
    const { climateId, yearId } = storeYear(detectAndParseWeather(variedTmy3()), 'tmy3');
    project.store.write((write) => climates.remove(write, climateId));
    const count = project.store.sqlite
      .prepare('SELECT count(*) AS n FROM weather_years WHERE id = ?')
      .get(yearId);
    expect(count).toEqual({ n: 0 });
  });

  it('refuses bad input naming the field, and stores nothing', () => {
    const parsed = detectAndParseWeather(variedTmy3());
    const hours = parsed.hours.map((hour) => ({ ...hour }));
    const third = hours[3];
    if (!third) throw new Error('expected hours');
    third.dryBulbC = Number.NaN;
    third.hour = 25;
    const write = (weather: HourlyWeather, name = 'Place') =>
      project.store.write((access) => createWeatherYear(access, { name, format: 'tmy3', weather }));
    expect(problemPaths(() => write({ ...parsed, hours }))).toEqual([
      'weather.hours[3].hour',
      'weather.hours[3].dryBulbC',
    ]);
    expect(problemPaths(() => write({ ...parsed, hours: [] }))).toEqual(['weather.hours']);
    expect(problemPaths(() => write(parsed, '  '))).toEqual(['name']);
    expect(project.store.sqlite.prepare('SELECT count(*) AS n FROM weather_years').get()).toEqual({
      n: 0,
    });
  });
});

const GAS: UtilityBill[] = [
  { periodStart: '2024-01-05', periodEnd: '2024-02-04', use: 120.5, fuel: 'naturalGas' },
  { periodStart: '2024-02-04', periodEnd: '2024-03-05', use: 98, fuel: 'naturalGas' },
];
const POWER: UtilityBill[] = [
  { periodStart: '2024-01-10', periodEnd: '2024-02-09', use: 640, fuel: 'electricity' },
];

function newHome(name: string): number {
  return project.store.write((write) => createHome(write, { name, data: {} }));
}

describe('bills', () => {
  it('stores a file of bills with the unit of its fuel, and a later file replaces only its own fuel', () => {
    const homeId = newHome('Billed house');
    project.store.write((write) => replaceBills(write, homeId, [...GAS, ...POWER]));
    const units = project.store
      .read((read) => listBills(read, homeId))
      .map((bill) => [bill.fuel, bill.unit]);
    // Fuel units as Sealwork bills them (core/fuels.ts, after EIA's units): therm, kWh.
    expect(units).toEqual([
      ['electricity', 'kWh'],
      ['naturalGas', 'therm'],
      ['naturalGas', 'therm'],
    ]);
    const fresh: UtilityBill[] = [
      { periodStart: '2024-03-05', periodEnd: '2024-04-04', use: 60, fuel: 'naturalGas' },
    ];
    expect(project.store.write((write) => replaceBills(write, homeId, fresh))).toEqual([
      'naturalGas',
    ]);
    const kept = project.store.read((read) => listBills(read, homeId));
    expect(
      kept.map(({ fuel, periodStart, periodEnd, use }) => ({ fuel, periodStart, periodEnd, use })),
    ).toEqual([POWER[0], fresh[0]]);
  });

  it('refuses a file with any bad bill, naming it, and keeps the bills there were', () => {
    const homeId = newHome('Careful house');
    project.store.write((write) => replaceBills(write, homeId, GAS));
    const overlapping: UtilityBill[] = [
      GAS[0] as UtilityBill,
      { periodStart: '2024-02-01', periodEnd: '2024-03-01', use: 80, fuel: 'naturalGas' },
      { periodStart: '2024-03-01', periodEnd: '2024-02-01', use: -1, fuel: 'naturalGas' },
    ];
    expect(
      problemPaths(() => project.store.write((write) => replaceBills(write, homeId, overlapping))),
    ).toEqual(['bills[2].periodEnd', 'bills[2].use', 'bills[1].periodStart']);
    expect(project.store.read((read) => listBills(read, homeId))).toHaveLength(2);
    const missing = thrownBy(() => project.store.write((write) => replaceBills(write, 9999, GAS)));
    expect({ kind: (missing as DbError).kind, field: (missing as DbError).field }).toEqual({
      kind: 'notFound',
      field: 'homeId',
    });
  });

  it('keeps daily means by date, refuses a day given twice, and clears them with the bills', () => {
    const homeId = newHome('Measured house');
    const days = [
      { date: '2024-01-06', meanTempF: 21.5 },
      { date: '2024-01-05', meanTempF: 19 },
    ];
    project.store.write((write) => replaceDailyTemperatures(write, homeId, days));
    expect(project.store.read((read) => listDailyTemperatures(read, homeId))).toEqual([
      days[1],
      days[0],
    ]);
    expect(project.store.read((read) => temperatureSpan(read, homeId))).toEqual({
      days: 2,
      first: '2024-01-05',
      last: '2024-01-06',
    });
    const twice = [...days, { date: '2024-01-05', meanTempF: 20 }];
    expect(
      problemPaths(() =>
        project.store.write((write) => replaceDailyTemperatures(write, homeId, twice)),
      ),
    ).toEqual(['temperatures[2].date']);
    project.store.write((write) => replaceBills(write, homeId, GAS));
    expect(
      project.store.write((write) => clearBills(write, homeId, { temperatures: true })),
    ).toEqual({
      bills: 2,
      days: 2,
    });
  });

  it('go with the home: copied to a duplicate, purged with the home, other homes untouched', () => {
    const first = newHome('First');
    const second = newHome('Second');
    project.store.write((write) => {
      replaceBills(write, first, GAS);
      replaceDailyTemperatures(write, first, [{ date: '2024-01-05', meanTempF: 19 }]);
      replaceBills(write, second, POWER);
      copyBills(write, first, second);
    });
    const strip = (homeId: number) =>
      project.store
        .read((read) => listBills(read, homeId))
        .map(({ fuel, periodStart, use }) => ({ fuel, periodStart, use }));
    expect(strip(second)).toEqual(
      [...strip(first), { fuel: 'electricity', periodStart: '2024-01-10', use: 640 }].sort(
        (a, b) => a.fuel.localeCompare(b.fuel) || a.periodStart.localeCompare(b.periodStart),
      ),
    );
    project.store.write((write) => {
      deleteHome(write, first);
      purgeHome(write, first);
    });
    const counts = project.store.sqlite
      .prepare(
        `SELECT (SELECT count(*) FROM bills WHERE home_id = @first) AS firstBills,
                (SELECT count(*) FROM daily_temperatures WHERE home_id = @first) AS firstDays,
                (SELECT count(*) FROM bills WHERE home_id = @second) AS secondBills,
                (SELECT count(*) FROM daily_temperatures WHERE home_id = @second) AS secondDays`,
      )
      .get({ first, second });
    expect(counts).toEqual({ firstBills: 0, firstDays: 0, secondBills: 3, secondDays: 1 });
  });
});
