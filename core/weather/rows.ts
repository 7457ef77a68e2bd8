/**
 * Shared reading rules of the weather files: problems collected up to a cap, numbers read
 * from fields with the line and field named, and the order of hours checked.
 */
import type { InputProblem } from '../errors.ts';
import { InputError } from '../errors.ts';
import type { WeatherHour } from './hourly.ts';

/** Problems reported at most, so a wholly wrong file gives a readable list. */
export const MAX_WEATHER_PROBLEMS = 50;

/** Hours in a common year and in a leap year. */
export const HOURS_IN_COMMON_YEAR = 8760;
export const HOURS_IN_LEAP_YEAR = 8784;

/** Collects problems; past the cap it counts them only. */
export class ProblemList {
  readonly problems: InputProblem[] = [];
  private dropped = 0;

  add(path: string, message: string): void {
    if (this.problems.length < MAX_WEATHER_PROBLEMS) this.problems.push({ path, message });
    else this.dropped += 1;
  }

  /** Throws an InputError with every problem kept (and how many more there were), if any. */
  throwIfAny(): void {
    if (this.problems.length === 0) return;
    const all = [...this.problems];
    if (this.dropped > 0) all.push({ path: '', message: `and ${this.dropped} more problems` });
    throw new InputError(all);
  }
}

/** What a numeric field is and the values it may take. */
export interface NumberField {
  /** Key in the record, used in the problem's path (e.g. `dryBulbC`). */
  key: string;
  /** Plain name for the message (e.g. `dry-bulb`). */
  label: string;
  min: number;
  max: number;
  /** A value the format uses to mean "missing", refused with its own message. */
  missingMarker?: number;
}

/**
 * The number in a field, or null after adding a problem naming the line (1-based) and the
 * field (1-based, or the column name).
 */
export function readNumber(
  raw: string | undefined,
  lineNumber: number,
  fieldName: string,
  field: NumberField,
  problems: ProblemList,
): number | null {
  const path = `line ${lineNumber}.${field.key}`;
  const where = `line ${lineNumber}, ${fieldName} (${field.label})`;
  const text = (raw ?? '').trim();
  const value = Number(text);
  if (text === '' || !Number.isFinite(value)) {
    problems.add(path, `${where}: expected a number, got '${raw ?? ''}'`);
    return null;
  }
  if (field.missingMarker !== undefined && value === field.missingMarker) {
    problems.add(
      path,
      `${where}: ${text} is the format's missing-value marker; the value is needed`,
    );
    return null;
  }
  if (value < field.min || value > field.max) {
    problems.add(path, `${where}: expected ${field.min} to ${field.max}, got ${text}`);
    return null;
  }
  return value;
}

const DAYS_IN_MONTH_LEAP = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * Problems with an hour's place in the year: the hours of a day run 1–24 in order and share
 * one month and day, which is a real date (29 February allowed).
 *
 * @param index the hour's position in the file, from 0
 * @param dayStart the month and day of this day's first hour (null for the first hour itself)
 */
export function checkHourPlace(
  when: { month: number; day: number; hour: number },
  index: number,
  dayStart: { month: number; day: number } | null,
  lineNumber: number,
  problems: ProblemList,
): void {
  const expectedHour = (index % 24) + 1;
  const path = `line ${lineNumber}`;
  const maxDay = DAYS_IN_MONTH_LEAP[when.month - 1];
  if (maxDay === undefined || !Number.isInteger(when.month)) {
    problems.add(`${path}.month`, `line ${lineNumber}: expected a month 1–12, got ${when.month}`);
  } else if (!Number.isInteger(when.day) || when.day < 1 || when.day > maxDay) {
    problems.add(`${path}.day`, `line ${lineNumber}: expected a day 1–${maxDay}, got ${when.day}`);
  }
  if (when.hour !== expectedHour) {
    problems.add(
      `${path}.hour`,
      `line ${lineNumber}: expected hour ${expectedHour} (each day's hours run 1–24 in order), got ${when.hour}`,
    );
  } else if (dayStart && (dayStart.month !== when.month || dayStart.day !== when.day)) {
    problems.add(
      `${path}.day`,
      `line ${lineNumber}: hour ${when.hour} is dated ${when.month}/${when.day}, but its day began ${dayStart.month}/${dayStart.day}`,
    );
  }
}

/** A problem if the count of hours is not a whole common or leap year. */
export function checkHourCount(count: number, lastLine: number, problems: ProblemList): void {
  if (count === HOURS_IN_COMMON_YEAR || count === HOURS_IN_LEAP_YEAR) return;
  problems.add(
    'hours',
    `expected ${HOURS_IN_COMMON_YEAR} hourly rows (${HOURS_IN_LEAP_YEAR} in a leap year), got ${count} (the file ends at line ${lastLine})`,
  );
}

/** The file's lines without a byte-order mark and without trailing empty lines. */
export function linesOf(text: string): string[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  while (lines.length > 0 && lines[lines.length - 1]?.trim() === '') lines.pop();
  return lines;
}

/**
 * Reads every data row and checks each hour's place in the year.
 *
 * @param dataLines the hourly rows
 * @param firstLineNumber the 1-based line number of the first row in the file
 * @param readRow reads one row, or returns null after adding its problems
 * @returns the hours that could be read (all of them when no problem was added)
 */
export function readHours(
  dataLines: readonly string[],
  firstLineNumber: number,
  readRow: (line: string, lineNumber: number, problems: ProblemList) => WeatherHour | null,
  problems: ProblemList,
): WeatherHour[] {
  const hours: WeatherHour[] = [];
  let dayStart: { month: number; day: number } | null = null;
  dataLines.forEach((line, index) => {
    const lineNumber = firstLineNumber + index;
    const hour = readRow(line, lineNumber, problems);
    const startsDay = index % 24 === 0;
    if (startsDay) dayStart = hour ? { month: hour.month, day: hour.day } : null;
    if (!hour) return;
    checkHourPlace(hour, index, startsDay ? null : dayStart, lineNumber, problems);
    hours.push(hour);
  });
  return hours;
}
