/**
 * Calendar dates of bills and weather as whole day numbers, counted in UTC from 1970-01-01,
 * so that no local time zone or daylight-saving change can add or lose a day.
 */

const MS_PER_DAY = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/**
 * The day number of a `YYYY-MM-DD` date, or undefined when the text is not a real date.
 *
 * @param text - a date as `YYYY-MM-DD` (2023-02-28); 2023-02-30 is not a date
 * @returns days since 1970-01-01 (UTC), negative before it
 *
 * Notes: `Date.UTC` does the calendar arithmetic (proleptic Gregorian); the round trip of
 * year, month and day refuses dates it would roll over (February 30 → March 2).
 */
export function dayNumberOf(text: string): number | undefined {
  const match = ISO_DATE.exec(text);
  if (!match) return undefined;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  const date = new Date(Date.UTC(year, month - 1, day));
  // Date.UTC reads years 0–99 as 1900–1999; setting the full year undoes that.
  date.setUTCFullYear(year);
  const real =
    date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
  return real ? Math.round(date.getTime() / MS_PER_DAY) : undefined;
}

/**
 * The `YYYY-MM-DD` text of a day number.
 *
 * @param dayNumber - days since 1970-01-01 (UTC)
 * @returns the date, e.g. `2023-02-28`
 */
export function isoDateOf(dayNumber: number): string {
  return new Date(dayNumber * MS_PER_DAY).toISOString().slice(0, 10);
}

/** The message for a date field that is not a real `YYYY-MM-DD` date. */
export function dateMessage(value: unknown): string {
  const text = typeof value === 'string' ? `"${value}"` : String(value);
  return typeof value === 'string' && ISO_DATE.test(value)
    ? `expected a real calendar date, got ${text}`
    : `expected a date as YYYY-MM-DD, got ${text}`;
}
