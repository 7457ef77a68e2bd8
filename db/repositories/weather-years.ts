/**
 * Stored years of hourly weather (see migration 0005): each quantity kept as one BLOB of
 * little-endian float64s, one an hour, so a year read back is exactly the year parsed.
 * A climate made from a weather file links to its year.
 */
import { z } from 'zod';
import { InputError, type InputProblem } from '../../core/errors.ts';
import type { HourlyWeather, WeatherFormat, WeatherHour } from '../../core/weather.ts';
import { HOURS_IN_LEAP_YEAR } from '../../core/weather.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { classifySqliteError } from '../errors.ts';
import { found, readJson, validated } from './_rows.ts';

/** The hourly quantities, each a float64 column: field of WeatherHour → column. */
const QUANTITY_COLUMNS = {
  dryBulbC: 'dry_bulb_c',
  dewPointC: 'dew_point_c',
  relativeHumidityPct: 'relative_humidity_pct',
  pressurePa: 'pressure_pa',
  windSpeedMs: 'wind_speed_ms',
} as const;
type Quantity = keyof typeof QUANTITY_COLUMNS;
const QUANTITIES = Object.keys(QUANTITY_COLUMNS) as Quantity[];

/** Bytes of one float64. */
const FLOAT64_BYTES = 8;
/** Bytes of one hour's calendar: month, day, hour. */
const CALENDAR_BYTES = 3;

/** A stored weather year without its hours. */
export interface WeatherYearSummary {
  id: number;
  name: string;
  format: WeatherFormat;
  hourCount: number;
  createdAt: string;
}

/** A stored weather year with its hours. */
export interface WeatherYearRecord extends WeatherYearSummary {
  weather: HourlyWeather;
}

/** What is stored: a name, the format it was read from and the weather as parsed. */
export interface WeatherYearInput {
  name: string;
  format: WeatherFormat;
  weather: HourlyWeather;
}

interface WeatherYearRow {
  id: number;
  name: string;
  format: WeatherFormat;
  location: string;
  hour_count: number;
  calendar: Buffer;
  dry_bulb_c: Buffer;
  dew_point_c: Buffer;
  relative_humidity_pct: Buffer;
  pressure_pa: Buffer;
  wind_speed_ms: Buffer;
  created_at: string;
}

const nameSchema = z.string().trim().min(1).max(200);
const formatSchema = z.enum(['epw', 'tmy3']);

/** Every problem of the hours: a count outside 1–8,784, a calendar field or value that is not whole or finite. */
function hourProblems(hours: readonly WeatherHour[]): InputProblem[] {
  if (hours.length < 1 || hours.length > HOURS_IN_LEAP_YEAR) {
    return [
      {
        path: 'weather.hours',
        message: `expected 1 to ${HOURS_IN_LEAP_YEAR} hours, got ${hours.length}`,
      },
    ];
  }
  const problems: InputProblem[] = [];
  hours.forEach((hour, index) => {
    for (const [field, max] of [
      ['month', 12],
      ['day', 31],
      ['hour', 24],
    ] as const) {
      const value = hour[field];
      if (!Number.isInteger(value) || value < 1 || value > max)
        problems.push({
          path: `weather.hours[${index}].${field}`,
          message: `expected a whole number from 1 to ${max}, got ${value}`,
        });
    }
    for (const field of QUANTITIES) {
      if (!Number.isFinite(hour[field]))
        problems.push({
          path: `weather.hours[${index}].${field}`,
          message: `expected a finite number, got ${hour[field]}`,
        });
    }
  });
  return problems;
}

/** One quantity of every hour as little-endian float64s. */
function float64Column(hours: readonly WeatherHour[], field: Quantity): Buffer {
  const bytes = Buffer.alloc(hours.length * FLOAT64_BYTES);
  hours.forEach((hour, index) => bytes.writeDoubleLE(hour[field], index * FLOAT64_BYTES));
  return bytes;
}

function calendarColumn(hours: readonly WeatherHour[]): Buffer {
  const bytes = Buffer.alloc(hours.length * CALENDAR_BYTES);
  hours.forEach((hour, index) => {
    bytes[index * CALENDAR_BYTES] = hour.month;
    bytes[index * CALENDAR_BYTES + 1] = hour.day;
    bytes[index * CALENDAR_BYTES + 2] = hour.hour;
  });
  return bytes;
}

function hoursOf(row: WeatherYearRow): WeatherHour[] {
  const hours: WeatherHour[] = [];
  for (let index = 0; index < row.hour_count; index += 1) {
    const at = index * FLOAT64_BYTES;
    hours.push({
      month: row.calendar[index * CALENDAR_BYTES] ?? 0,
      day: row.calendar[index * CALENDAR_BYTES + 1] ?? 0,
      hour: row.calendar[index * CALENDAR_BYTES + 2] ?? 0,
      dryBulbC: row.dry_bulb_c.readDoubleLE(at),
      dewPointC: row.dew_point_c.readDoubleLE(at),
      relativeHumidityPct: row.relative_humidity_pct.readDoubleLE(at),
      pressurePa: row.pressure_pa.readDoubleLE(at),
      windSpeedMs: row.wind_speed_ms.readDoubleLE(at),
    });
  }
  return hours;
}

function summaryOf(
  row: Pick<WeatherYearRow, 'id' | 'name' | 'format' | 'hour_count' | 'created_at'>,
): WeatherYearSummary {
  return {
    id: row.id,
    name: row.name,
    format: row.format,
    hourCount: row.hour_count,
    createdAt: row.created_at,
  };
}

/**
 * Stores a year of hourly weather.
 *
 * @returns the year's id
 * @throws InputError naming `name`, `format` or `weather.hours[i].field`
 */
export function createWeatherYear(write: WriteAccess, input: WeatherYearInput): number {
  const name = validated(nameSchema, input.name, 'name');
  const format = validated(formatSchema, input.format, 'format');
  const problems = hourProblems(input.weather.hours);
  if (problems.length > 0) throw new InputError(problems);
  const { hours, location } = input.weather;
  try {
    const result = write
      .statement(
        `INSERT INTO weather_years (name, format, location, hour_count, calendar, dry_bulb_c, dew_point_c,
           relative_humidity_pct, pressure_pa, wind_speed_ms, created_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      )
      .run(
        name,
        format,
        JSON.stringify(location),
        hours.length,
        calendarColumn(hours),
        ...QUANTITIES.map((field) => float64Column(hours, field)),
        write.now,
      );
    return Number(result.lastInsertRowid);
  } catch (error) {
    throw classifySqliteError(error) ?? error;
  }
}

/** A stored weather year with its hours; notFound naming `weatherYearId`. */
export function getWeatherYear(read: ReadAccess, id: number): WeatherYearRecord {
  const row = found(
    read.statement('SELECT * FROM weather_years WHERE id = ?').get(id) as
      WeatherYearRow | undefined,
    `weather year ${id}`,
    'weatherYearId',
  );
  return {
    ...summaryOf(row),
    weather: { location: readJson(row.location), hours: hoursOf(row) },
  };
}

/** Links a climate to a stored weather year (or unlinks it with null). */
export function linkClimateWeatherYear(
  write: WriteAccess,
  climateId: number,
  weatherYearId: number | null,
): void {
  try {
    const result = write
      .statement('UPDATE climates SET weather_year_id = ?, updated_at = ? WHERE id = ?')
      .run(weatherYearId, write.now, climateId);
    found(result.changes > 0 ? true : undefined, `climate ${climateId}`, 'climateId');
  } catch (error) {
    throw classifySqliteError(error, { foreignKey: 'weatherYearId' }) ?? error;
  }
}

/** The summary of the weather year a climate was made from, or null; notFound naming `climateId`. */
export function weatherYearSummaryOfClimate(
  read: ReadAccess,
  climateId: number,
): WeatherYearSummary | null {
  const climate = found(
    read.statement('SELECT weather_year_id FROM climates WHERE id = ?').get(climateId) as
      { weather_year_id: number | null } | undefined,
    `climate ${climateId}`,
    'climateId',
  );
  if (climate.weather_year_id === null) return null;
  const row = read
    .statement('SELECT id, name, format, hour_count, created_at FROM weather_years WHERE id = ?')
    .get(climate.weather_year_id) as WeatherYearRow | undefined;
  return row ? summaryOf(row) : null;
}

/**
 * The hourly weather a climate was made from, exactly as parsed, for hour-by-hour plans.
 *
 * @returns the weather, or null for a climate entered as figures
 * @throws DbError notFound naming `climateId` when there is no such climate
 */
export function weatherYearOfClimate(read: ReadAccess, climateId: number): HourlyWeather | null {
  const summary = weatherYearSummaryOfClimate(read, climateId);
  return summary === null ? null : getWeatherYear(read, summary.id).weather;
}

/** Removes a weather year once no climate links to it (after its climate is deleted). */
export function removeWeatherYearIfUnlinked(write: WriteAccess, weatherYearId: number): void {
  write
    .statement(
      'DELETE FROM weather_years WHERE id = ? AND NOT EXISTS (SELECT 1 FROM climates WHERE weather_year_id = ?)',
    )
    .run(weatherYearId, weatherYearId);
}
