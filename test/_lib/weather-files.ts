/**
 * Small weather files made for tests (TMY3 CSV layout: a header line, the column names, one
 * row an hour of a non-leap year), so a test needs no file from outside the repository.
 */

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * A TMY3 year whose every hour of a day has that day's dry-bulb.
 *
 * @param dryBulbCOfDay - the dry-bulb (°C) of day d of the year (0-based)
 * @param windMs - the wind speed of every hour, m/s
 */
export function tmy3Year(dryBulbCOfDay: (day: number) => number, windMs = 4.5): string {
  const pad = (value: number) => String(value).padStart(2, '0');
  const lines = [
    '999999,"TEST, GENERATED",ZZ,-7.0,35.000,-110.500,1200',
    'Date (MM/DD/YYYY),Time (HH:MM),Dry-bulb (C),Dew-point (C),RHum (%),Pressure (mbar),Wspd (m/s)',
  ];
  let day = 0;
  DAYS_IN_MONTH.forEach((days, month) => {
    for (let date = 1; date <= days; date += 1, day += 1) {
      for (let hour = 1; hour <= 24; hour += 1) {
        lines.push(
          `${pad(month + 1)}/${pad(date)}/1999,${pad(hour)}:00,${dryBulbCOfDay(day)},-3.0,40,880,${windMs}`,
        );
      }
    }
  });
  return lines.join('\n');
}
