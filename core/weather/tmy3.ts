/**
 * Reading a TMY3 file (the U.S. National Renewable Energy Laboratory's typical
 * meteorological year, CSV form).
 *
 * Notes: line 1 holds the station number, name, state, time zone (hours from UTC),
 * latitude, longitude and elevation (m); line 2 names the columns; then one row per hour,
 * `MM/DD/YYYY,HH:MM,…`, the time being the hour ending (01:00–24:00, local standard time).
 * Columns are found by name: "Dry-bulb (C)", "Dew-point (C)", "RHum (%)", "Pressure (mbar)",
 * "Wspd (m/s)". Pressure is converted to Pa (1 mbar = 100 Pa). The year in the date differs
 * from month to month (each month is taken from a different real year) and is not kept.
 * TMY3 has no missing-value markers in these columns (gaps were filled when the set was
 * made; from memory); values outside the same ranges as for EPW are refused.
 *
 * References: Wilcox S., Marion W., "Users Manual for TMY3 Data Sets", NREL/TP-581-43156,
 * 2008 (layout and column names; from memory, the names checked against the shared file).
 */
import type { HourlyWeather, WeatherHour, WeatherLocation } from './hourly.ts';
import {
  checkHourCount,
  linesOf,
  ProblemList,
  readHours,
  readNumber,
  type NumberField,
} from './rows.ts';

/** Pa in one millibar (hPa). */
export const PASCALS_PER_MILLIBAR = 100;

/** The columns read from each hourly row, by header name. */
export const TMY3_COLUMNS = {
  dryBulbC: 'Dry-bulb (C)',
  dewPointC: 'Dew-point (C)',
  relativeHumidityPct: 'RHum (%)',
  pressureMbar: 'Pressure (mbar)',
  windSpeedMs: 'Wspd (m/s)',
} as const;

const DATA_FIELDS: readonly NumberField[] = [
  { key: 'dryBulbC', label: 'dry-bulb', min: -70, max: 70 },
  { key: 'dewPointC', label: 'dew point', min: -70, max: 70 },
  { key: 'relativeHumidityPct', label: 'relative humidity', min: 0, max: 110 },
  { key: 'pressureMbar', label: 'station pressure', min: 310, max: 1200 },
  { key: 'windSpeedMs', label: 'wind speed', min: 0, max: 40 },
];

const LOCATION_FIELDS: readonly (NumberField & { index: number })[] = [
  { index: 3, key: 'timeZoneHours', label: 'time zone', min: -12, max: 14 },
  { index: 4, key: 'latitude', label: 'latitude', min: -90, max: 90 },
  { index: 5, key: 'longitude', label: 'longitude', min: -180, max: 180 },
  { index: 6, key: 'elevationM', label: 'elevation', min: -1000, max: 9999.9 },
];

const DATE_PATTERN = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/;
const TIME_PATTERN = /^(\d{1,2}):00$/;

/**
 * Reads a TMY3 file.
 *
 * @param text the whole file as text
 * @returns the location (station name, state as region, country left out) and every hour,
 *   pressure in Pa
 * @throws InputError with every problem found (up to a cap), each naming its line and field,
 *   e.g. path `line 12.dryBulbC`, "line 12, column 32 "Dry-bulb (C)" (dry-bulb): expected a
 *   number, got 'x'"
 */
export function parseTmy3(text: string): HourlyWeather {
  const lines = linesOf(text);
  const problems = new ProblemList();
  const location = readLocation(lines[0] ?? '', problems);
  const columns = findColumns(lines[1] ?? '', problems);
  if (!columns) problems.throwIfAny();
  const header = splitCsvLine(lines[1] ?? '');
  const dataLines = lines.slice(2);
  const readRow = (line: string, lineNumber: number, list: ProblemList): WeatherHour | null =>
    readTmy3Row(line, lineNumber, header.length, columns ?? {}, list);
  const hours = readHours(dataLines, 3, readRow, problems);
  checkHourCount(dataLines.length, lines.length, problems);
  problems.throwIfAny();
  if (!location) throw new Error('unreachable: a bad first line is a problem above');
  return { location, hours };
}

/** Splits one CSV line, honouring double quotes (the station name is quoted). */
export function splitCsvLine(line: string): string[] {
  const fields: string[] = [];
  let current = '';
  let quoted = false;
  for (let i = 0; i < line.length; i += 1) {
    const char = line[i];
    if (char === '"') {
      if (quoted && line[i + 1] === '"') {
        current += '"';
        i += 1;
      } else quoted = !quoted;
    } else if (char === ',' && !quoted) {
      fields.push(current);
      current = '';
    } else current += char;
  }
  fields.push(current);
  return fields;
}

function readLocation(line: string, problems: ProblemList): WeatherLocation | null {
  const fields = splitCsvLine(line);
  if (fields.length !== 7) {
    problems.add(
      'line 1',
      `line 1: expected 7 fields (station, name, state, time zone, latitude, longitude, elevation), got ${fields.length}`,
    );
    return null;
  }
  const numbers: Record<string, number> = {};
  for (const field of LOCATION_FIELDS) {
    const value = readNumber(fields[field.index], 1, `field ${field.index + 1}`, field, problems);
    if (value !== null) numbers[field.key] = value;
  }
  return {
    name: (fields[1] ?? '').trim(),
    region: (fields[2] ?? '').trim(),
    stationId: (fields[0] ?? '').trim(),
    latitude: numbers['latitude'] ?? 0,
    longitude: numbers['longitude'] ?? 0,
    timeZoneHours: numbers['timeZoneHours'] ?? 0,
    elevationM: numbers['elevationM'] ?? 0,
  };
}

/** Column index of each field read, or null after adding a problem for each one missing. */
function findColumns(line: string, problems: ProblemList): Record<string, number> | null {
  const names = splitCsvLine(line).map((name) => name.trim());
  const columns: Record<string, number> = {};
  for (const [key, name] of Object.entries(TMY3_COLUMNS)) {
    const index = names.indexOf(name);
    if (index < 0) problems.add(`line 2.${key}`, `line 2: no column named "${name}"`);
    else columns[key] = index;
  }
  if (names[0]?.startsWith('Date') !== true || names[1]?.startsWith('Time') !== true) {
    problems.add('line 2', 'line 2: expected the first two columns to be the date and the time');
  }
  return Object.keys(columns).length === DATA_FIELDS.length ? columns : null;
}

function readTmy3Row(
  line: string,
  lineNumber: number,
  columnCount: number,
  columns: Record<string, number>,
  problems: ProblemList,
): WeatherHour | null {
  const fields = line.split(',');
  if (fields.length !== columnCount) {
    problems.add(
      `line ${lineNumber}`,
      `line ${lineNumber}: expected ${columnCount} fields (one per column of line 2), got ${fields.length}`,
    );
    return null;
  }
  const date = DATE_PATTERN.exec(fields[0] ?? '');
  const time = TIME_PATTERN.exec(fields[1] ?? '');
  if (!date) {
    problems.add(
      `line ${lineNumber}.date`,
      `line ${lineNumber}, field 1 (date): expected MM/DD/YYYY, got '${fields[0] ?? ''}'`,
    );
  }
  if (!time) {
    problems.add(
      `line ${lineNumber}.hour`,
      `line ${lineNumber}, field 2 (time): expected HH:00, got '${fields[1] ?? ''}'`,
    );
  }
  const values: Record<string, number> = {};
  let complete = date !== null && time !== null;
  for (const field of DATA_FIELDS) {
    const index = columns[field.key] ?? -1;
    const name = `column ${index + 1} "${TMY3_COLUMNS[field.key as keyof typeof TMY3_COLUMNS]}"`;
    const value = readNumber(fields[index], lineNumber, name, field, problems);
    if (value === null) complete = false;
    else values[field.key] = value;
  }
  if (!complete || !date || !time) return null;
  return {
    month: Number(date[1]),
    day: Number(date[2]),
    hour: Number(time[1]),
    dryBulbC: values['dryBulbC'] ?? 0,
    dewPointC: values['dewPointC'] ?? 0,
    relativeHumidityPct: values['relativeHumidityPct'] ?? 0,
    pressurePa: (values['pressureMbar'] ?? 0) * PASCALS_PER_MILLIBAR,
    windSpeedMs: values['windSpeedMs'] ?? 0,
  };
}
