/**
 * Reading an EPW (EnergyPlus weather) file: the LOCATION line and the hourly rows.
 *
 * Notes: an EPW file has 8 header lines, each opened by its keyword (LOCATION, DESIGN
 * CONDITIONS, TYPICAL/EXTREME PERIODS, GROUND TEMPERATURES, HOLIDAYS/DAYLIGHT SAVING,
 * COMMENTS 1, COMMENTS 2, DATA PERIODS), then one row of 35 fields per hour. Used here,
 * 1-based: 2 month, 3 day, 4 hour (hour ending, 1–24), 7 dry-bulb °C, 8 dew point °C,
 * 9 relative humidity %, 10 station pressure Pa, 22 wind speed m/s.
 *
 * Missing values: EPW marks a missing value with 99.9 (dry-bulb, dew point), 999 (relative
 * humidity, wind speed) or 999999 (pressure). These are refused, not filled: a gap in the
 * temperatures would bias degree days and design temperatures without anyone seeing it,
 * and the file should be repaired by the tool that made it. The accepted ranges are the
 * ones the EPW data dictionary gives (from memory: dry-bulb and dew point −70 to 70 °C,
 * humidity 0–110 %, pressure 31,000–120,000 Pa, wind 0–40 m/s).
 *
 * One data period of one record per hour is read (DATA PERIODS,1,1,…); sub-hourly files
 * are refused. A year is 8,760 rows, or 8,784 for a leap year (a file with 29 February).
 *
 * References: U.S. DOE, EnergyPlus "Auxiliary Programs", the Weather Converter's EPW data
 * dictionary (field order, missing markers, ranges; from memory).
 */
import type { HourlyWeather, WeatherHour, WeatherLocation } from './hourly.ts';
import {
  checkHourCount,
  readHours,
  linesOf,
  ProblemList,
  readNumber,
  type NumberField,
} from './rows.ts';

/** The keyword opening each of the 8 header lines, in order. */
export const EPW_HEADER_KEYWORDS = [
  'LOCATION',
  'DESIGN CONDITIONS',
  'TYPICAL/EXTREME PERIODS',
  'GROUND TEMPERATURES',
  'HOLIDAYS/DAYLIGHT SAVING',
  'COMMENTS 1',
  'COMMENTS 2',
  'DATA PERIODS',
] as const;

/** Fields in an EPW data row. */
export const EPW_FIELDS_PER_ROW = 35;

/** The numeric fields read from a data row: 0-based index and rules. */
const DATA_FIELDS: readonly (NumberField & { index: number })[] = [
  { index: 6, key: 'dryBulbC', label: 'dry-bulb', min: -70, max: 70, missingMarker: 99.9 },
  { index: 7, key: 'dewPointC', label: 'dew point', min: -70, max: 70, missingMarker: 99.9 },
  {
    index: 8,
    key: 'relativeHumidityPct',
    label: 'relative humidity',
    min: 0,
    max: 110,
    missingMarker: 999,
  },
  {
    index: 9,
    key: 'pressurePa',
    label: 'station pressure',
    min: 31_000,
    max: 120_000,
    missingMarker: 999_999,
  },
  { index: 21, key: 'windSpeedMs', label: 'wind speed', min: 0, max: 40, missingMarker: 999 },
];

const DATE_FIELDS: readonly (NumberField & { index: number })[] = [
  { index: 1, key: 'month', label: 'month', min: 1, max: 12 },
  { index: 2, key: 'day', label: 'day', min: 1, max: 31 },
  { index: 3, key: 'hour', label: 'hour', min: 1, max: 24 },
];

const LOCATION_FIELDS: readonly (NumberField & { index: number })[] = [
  { index: 6, key: 'latitude', label: 'latitude', min: -90, max: 90 },
  { index: 7, key: 'longitude', label: 'longitude', min: -180, max: 180 },
  { index: 8, key: 'timeZoneHours', label: 'time zone', min: -12, max: 14 },
  { index: 9, key: 'elevationM', label: 'elevation', min: -1000, max: 9999.9 },
];

/**
 * Reads an EPW file.
 *
 * @param text the whole file as text
 * @returns the location (city as name, state/province as region, country, source, WMO
 *   station) and every hour
 * @throws InputError with every problem found (up to a cap), each naming its line and field,
 *   e.g. path `line 12.dryBulbC`, "line 12, field 7 (dry-bulb): expected a number, got 'x'"
 */
export function parseEpw(text: string): HourlyWeather {
  const lines = linesOf(text);
  const problems = new ProblemList();
  checkHeaderLines(lines, problems);
  const location = readLocation(lines[0] ?? '', problems);
  const dataLines = lines.slice(EPW_HEADER_KEYWORDS.length);
  const hours = readHours(dataLines, EPW_HEADER_KEYWORDS.length + 1, readRow, problems);
  checkHourCount(dataLines.length, lines.length, problems);
  problems.throwIfAny();
  if (!location) throw new Error('unreachable: a bad LOCATION line is a problem above');
  return { location, hours };
}

function checkHeaderLines(lines: readonly string[], problems: ProblemList): void {
  EPW_HEADER_KEYWORDS.forEach((keyword, index) => {
    const first = (lines[index] ?? '').split(',')[0]?.trim().toUpperCase() ?? '';
    if (first !== keyword) {
      problems.add(
        `line ${index + 1}`,
        `line ${index + 1}: expected the EPW header line "${keyword},…", got '${(lines[index] ?? '').slice(0, 40)}'`,
      );
    }
  });
  checkDataPeriods(lines[EPW_HEADER_KEYWORDS.length - 1] ?? '', problems);
}

/** The reader takes one data period of one record per hour (DATA PERIODS fields 2 and 3). */
function checkDataPeriods(line: string, problems: ProblemList): void {
  const fields = line.split(',').map((field) => field.trim());
  if (fields[0]?.toUpperCase() !== 'DATA PERIODS') return;
  const line8 = `line ${EPW_HEADER_KEYWORDS.length}`;
  if (fields[1] !== '1') {
    problems.add(
      `${line8}.periods`,
      `${line8}, field 2 (data periods): expected 1, got '${fields[1] ?? ''}'`,
    );
  }
  if (fields[2] !== '1') {
    problems.add(
      `${line8}.recordsPerHour`,
      `${line8}, field 3 (records per hour): expected 1 (hourly data), got '${fields[2] ?? ''}'`,
    );
  }
}

function readLocation(line: string, problems: ProblemList): WeatherLocation | null {
  const fields = line.split(',');
  if (fields[0]?.trim().toUpperCase() !== 'LOCATION') return null;
  if (fields.length < 10) {
    problems.add('line 1', `line 1: expected 10 LOCATION fields, got ${fields.length}`);
    return null;
  }
  const numbers: Record<string, number> = {};
  for (const field of LOCATION_FIELDS) {
    const value = readNumber(fields[field.index], 1, `field ${field.index + 1}`, field, problems);
    if (value !== null) numbers[field.key] = value;
  }
  const text = (index: number): string => (fields[index] ?? '').trim();
  return {
    name: text(1),
    region: text(2),
    country: text(3),
    source: text(4),
    stationId: text(5),
    latitude: numbers['latitude'] ?? 0,
    longitude: numbers['longitude'] ?? 0,
    timeZoneHours: numbers['timeZoneHours'] ?? 0,
    elevationM: numbers['elevationM'] ?? 0,
  };
}

function readRow(line: string, lineNumber: number, problems: ProblemList): WeatherHour | null {
  const fields = line.split(',');
  if (fields.length !== EPW_FIELDS_PER_ROW) {
    problems.add(
      `line ${lineNumber}`,
      `line ${lineNumber}: expected ${EPW_FIELDS_PER_ROW} fields, got ${fields.length}`,
    );
    return null;
  }
  const values: Record<string, number> = {};
  let complete = true;
  for (const field of [...DATE_FIELDS, ...DATA_FIELDS]) {
    const value = readNumber(
      fields[field.index],
      lineNumber,
      `field ${field.index + 1}`,
      field,
      problems,
    );
    if (value === null) complete = false;
    else values[field.key] = value;
  }
  if (!complete) return null;
  return values as unknown as WeatherHour;
}
