/**
 * A normal year made from the daily means at hand: each calendar day's mean over the years
 * the series covers (29 February folded into 28 February), so bills can be normalized to the
 * weather the file itself holds when no station normals are given. Common practice for a
 * first look; a station's 30-year normals are the better basis where they exist.
 */
import { InputError } from '../errors.ts';
import type { DailyTemperature } from './bills.ts';
import { DAYS_PER_NORMAL_YEAR, type NormalYear } from './degree-days.ts';

/** Days before each month in a year of 365 days. */
const DAYS_BEFORE_MONTH = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334];

/** The day of a 365-day year (0–364) of `YYYY-MM-DD`, 29 February as 28 February. */
function dayOfNormalYear(date: string): number {
  const month = Number(date.slice(5, 7));
  const day = Math.min(Number(date.slice(8, 10)), month === 2 ? 28 : 31);
  return (DAYS_BEFORE_MONTH[month - 1] ?? 0) + day - 1;
}

/**
 * The normal year of a daily series.
 *
 * @throws InputError naming `temperatures` when some calendar day has no mean in the series
 */
export function normalYearFromSeries(temperatures: readonly DailyTemperature[]): NormalYear {
  const sums = new Float64Array(DAYS_PER_NORMAL_YEAR);
  const counts = new Uint32Array(DAYS_PER_NORMAL_YEAR);
  for (const { date, meanTempF } of temperatures) {
    const day = dayOfNormalYear(date);
    sums[day] = (sums[day] ?? 0) + meanTempF;
    counts[day] = (counts[day] ?? 0) + 1;
  }
  const missing = counts.findIndex((count) => count === 0);
  if (missing >= 0) {
    throw InputError.at(
      'temperatures',
      `expected daily means for every day of the year to make a normal year; day ${missing + 1} of 365 has none`,
    );
  }
  return { dailyMeanTempsF: Array.from(sums, (sum, day) => sum / (counts[day] ?? 1)) };
}
