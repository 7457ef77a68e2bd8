/**
 * The hourly weather of one year, as read from an EPW or TMY3 file, and the choice between
 * the two readers by the file's content.
 */
import { InputError } from '../errors.ts';
import { parseEpw } from './epw.ts';
import { parseTmy3 } from './tmy3.ts';

/** Where the weather was observed (or modelled). */
export interface WeatherLocation {
  /** City or station name as the file gives it. */
  name: string;
  /** State or province, when the file gives one. */
  region?: string;
  /** Country, when the file gives one. */
  country?: string;
  /** Station number (WMO or USAF), when the file gives one. */
  stationId?: string;
  /** Source of the data, when the file gives one (EPW's "data source" field). */
  source?: string;
  /** Degrees north (negative south). */
  latitude: number;
  /** Degrees east (negative west). */
  longitude: number;
  /** Standard time zone, hours from UTC (e.g. −5 for US Eastern). */
  timeZoneHours: number;
  /** Elevation above sea level, m. */
  elevationM: number;
}

/** One hour's weather. `hour` is the hour ending at the time shown, 1–24, local standard time. */
export interface WeatherHour {
  month: number;
  day: number;
  hour: number;
  dryBulbC: number;
  dewPointC: number;
  relativeHumidityPct: number;
  /** Station pressure, Pa. */
  pressurePa: number;
  windSpeedMs: number;
}

/** A year of hourly weather: 8,760 hours (8,784 for a leap year), whole days in order. */
export interface HourlyWeather {
  location: WeatherLocation;
  hours: WeatherHour[];
}

/** The formats the readers know. */
export type WeatherFormat = 'epw' | 'tmy3';

/**
 * Which format a weather file's text is in, by its content (not its name): an EPW file
 * opens with a `LOCATION,` line; a TMY3 file's second line names its columns, among them
 * "Dry-bulb (C)". Returns null for neither.
 */
export function detectWeatherFormat(text: string): WeatherFormat | null {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/, 2);
  const first = (lines[0] ?? '').trim();
  if (/^LOCATION,/i.test(first)) return 'epw';
  if ((lines[1] ?? '').includes('Dry-bulb (C)')) return 'tmy3';
  return null;
}

/**
 * Reads a weather file in either format, chosen by content.
 *
 * @param text the whole file as text
 * @param fileName the file's name, only to say which file could not be read
 * @returns the location and every hour
 * @throws InputError listing every problem found (line and field), or that the format is unknown
 */
export function detectAndParseWeather(text: string, fileName?: string): HourlyWeather {
  const format = detectWeatherFormat(text);
  if (format === 'epw') return parseEpw(text);
  if (format === 'tmy3') return parseTmy3(text);
  const what = fileName ? `'${fileName}'` : 'the file';
  throw InputError.at(
    'line 1',
    `${what} is neither EPW (first line starting "LOCATION,") nor TMY3 (a second line of column names with "Dry-bulb (C)")`,
  );
}
