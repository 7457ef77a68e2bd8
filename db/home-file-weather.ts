/**
 * The weather year of a home file (`weatherYear`, core/weather/weather-year-file.ts) and the
 * store: export writes the stored year of an hourly home's climate into its file; import
 * stores the file's climate with those hours, or links the home to a stored climate that
 * already has the same figures and the same hours.
 *
 * Notes: an identical climate is reused rather than copied on every import. A program's
 * homes on one weather station then share one stored climate, as homes planned here do, and
 * a file imported back into the project it left is linked to the climate it came from, not
 * to "Climate (2)". Identical means: the climate's figures deep-equal, and the year's name,
 * format, location and every hour equal as numbers (a stored −0.0 equals the file's 0, the
 * file cannot say −0). Anything else is stored as a new climate with its own year; its name,
 * which must be unique among stored climates, is the climate's own or, when that is taken,
 * the same followed by " (2)", " (3)", …
 */
import { isDeepStrictEqual } from 'node:util';
import { InputError } from '../core/errors.ts';
import type { Climate } from '../core/schema.ts';
import {
  homeWeatherYearOf,
  hourlyWeatherOfBlock,
  type HomeWeatherYear,
} from '../core/weather/weather-year-file.ts';
import { climates } from './repositories/reusable-sets.ts';
import {
  createWeatherYear,
  getWeatherYear,
  linkClimateWeatherYear,
  weatherYearSummaryOfClimate,
} from './repositories/weather-years.ts';
import type { ReadAccess, WriteAccess } from './store.ts';
import { readJson } from './repositories/_rows.ts';

/** The longest name a stored climate may have (reusable-sets.ts). */
const MAX_CLIMATE_NAME_CHARS = 200;

/**
 * The weather year a stored climate was made from, as a home file carries it.
 *
 * @returns the block, or undefined for a climate entered as figures
 * @throws DbError notFound naming `climateId` when there is no such climate
 */
export function homeWeatherYearOfClimate(
  read: ReadAccess,
  climateId: number,
): HomeWeatherYear | undefined {
  const summary = weatherYearSummaryOfClimate(read, climateId);
  if (summary === null) return undefined;
  const record = getWeatherYear(read, summary.id);
  return homeWeatherYearOf({ name: record.name, format: record.format, weather: record.weather });
}

interface CandidateRow {
  climate_id: number;
  data: string;
  weather_year_id: number;
}

/** A stored climate with these figures and exactly these hours, if there is one. */
function identicalClimate(
  read: ReadAccess,
  climate: Climate,
  block: HomeWeatherYear,
): number | undefined {
  const candidates = read
    .statement(
      `SELECT c.id AS climate_id, c.data AS data, w.id AS weather_year_id
         FROM climates c JOIN weather_years w ON w.id = c.weather_year_id
        WHERE w.name = ? AND w.format = ? AND w.hour_count = ?
        ORDER BY c.id`,
    )
    .all(block.name, block.format, block.hours.month.length) as CandidateRow[];
  // Both sides through the same writer, so −0 and key order cannot tell them apart.
  const wanted = homeWeatherYearOf(hourlyWeatherOfBlock(block));
  for (const candidate of candidates) {
    if (!isDeepStrictEqual(readJson<Climate>(candidate.data), climate)) continue;
    const stored = getWeatherYear(read, candidate.weather_year_id);
    const storedBlock = homeWeatherYearOf({
      name: stored.name,
      format: stored.format,
      weather: stored.weather,
    });
    if (isDeepStrictEqual(storedBlock, wanted)) return candidate.climate_id;
  }
  return undefined;
}

/** The climate's name, or the first of "name (2)", "name (3)", … no stored climate has. */
function freeClimateName(read: ReadAccess, wanted: string): string {
  for (let copy = 1; ; copy += 1) {
    const suffix = copy === 1 ? '' : ` (${copy})`;
    const name = `${wanted.slice(0, MAX_CLIMATE_NAME_CHARS - suffix.length).trimEnd()}${suffix}`;
    if (climates.findByName(read, name) === undefined) return name;
  }
}

/** The file's name for a stored year's field: `weather.hours[3].dryBulbC` → `hours.dryBulbC[3]`. */
function fileFieldOf(path: string): string {
  const hour = /^weather\.hours\[(\d+)\]\.(\w+)$/.exec(path);
  if (hour) return `hours.${hour[2]}[${hour[1]}]`;
  return path.replace(/^weather\./, '');
}

/** An InputError of the stored year moved under `weatherYear`, its fields named as the file's. */
function underWeatherYear(error: InputError): InputError {
  return new InputError(
    error.problems.map((problem) => ({
      path: problem.path === '' ? 'weatherYear' : `weatherYear.${fileFieldOf(problem.path)}`,
      message: problem.message,
    })),
  );
}

/**
 * The stored climate a home file's climate and weather year come to: an identical one
 * already stored, else a new climate linked to a new stored year (within the caller's write,
 * so a refused import leaves neither).
 *
 * @param climate - the file's climate (checked)
 * @param block - the file's weather year (checked by the home file's schema)
 * @returns the climate's id
 * @throws InputError under `weatherYear` should the store refuse the hours
 */
export function climateOfWeatherYear(
  write: WriteAccess,
  climate: Climate,
  block: HomeWeatherYear,
): number {
  const existing = identicalClimate(write, climate, block);
  if (existing !== undefined) return existing;
  const climateId = climates.create(write, freeClimateName(write, climate.name), climate);
  let weatherYearId: number;
  try {
    weatherYearId = createWeatherYear(write, hourlyWeatherOfBlock(block));
  } catch (error) {
    if (error instanceof InputError) throw underWeatherYear(error);
    throw error;
  }
  linkClimateWeatherYear(write, climateId, weatherYearId);
  return climateId;
}
