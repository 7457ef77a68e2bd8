/**
 * The dates of a job's status changes: an ISO calendar date (`YYYY-MM-DD`) or a UTC time
 * (`YYYY-MM-DDTHH:MM[:SS[.sss]]Z`), and how two of them compare.
 */
import { z } from 'zod';

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;
const DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?Z$/;

/**
 * The instant of a date or UTC time.
 *
 * @param text - `YYYY-MM-DD` (taken as 00:00 UTC) or `YYYY-MM-DDTHH:MM[:SS[.sss]]Z`
 * @returns milliseconds since 1970-01-01 UTC, or null when the text is not such a date or
 *   names a day the calendar does not have (2026-02-29)
 */
export function instantOf(text: string): number | null {
  if (!DATE_ONLY.test(text) && !DATE_TIME.test(text)) return null;
  const [year, month, day] = text.slice(0, 10).split('-').map(Number) as [number, number, number];
  const calendar = new Date(Date.UTC(year, month - 1, day));
  const real =
    calendar.getUTCFullYear() === year &&
    calendar.getUTCMonth() === month - 1 &&
    calendar.getUTCDate() === day;
  if (!real) return null;
  const instant = Date.parse(DATE_ONLY.test(text) ? `${text}T00:00:00Z` : text);
  return Number.isNaN(instant) ? null : instant;
}

/** A date or UTC time as {@link instantOf} reads it. */
export const whenSchema = z
  .string()
  .refine(
    (text) => instantOf(text) !== null,
    'expected a real date as YYYY-MM-DD or a UTC time as YYYY-MM-DDTHH:MM:SSZ',
  );

/**
 * Whether `later` comes before `earlier`, at the precision of the coarser of the two: a date
 * without a time is the whole day, so a change dated 5 March may follow one at 14:00 that day.
 *
 * @param later - the date of the new change
 * @param earlier - the date of the last change
 * @returns true when `later` is before `earlier`
 */
export function isBefore(later: string, earlier: string): boolean {
  const dayOnly = DATE_ONLY.test(later) || DATE_ONLY.test(earlier);
  if (dayOnly) return later.slice(0, 10) < earlier.slice(0, 10);
  return (instantOf(later) ?? 0) < (instantOf(earlier) ?? 0);
}
