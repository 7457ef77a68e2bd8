/**
 * Stored hourly weather and a home's bills.
 *
 * - `weather_years`: a year of hourly weather as read from an EPW or TMY3 file, kept so the
 *   hour-by-hour plan and the billing analysis can use the hours, not only the climate's
 *   degree days. Each quantity is one BLOB of little-endian float64s, one per hour (float64
 *   keeps every value exactly as parsed; float32 would not: −3.3 °C is not a float32), and
 *   `calendar` holds the month, day and hour of each hour as three bytes. A climate made from
 *   a weather file points at its year (`climates.weather_year_id`); a year outlives its
 *   climate only until the climate is deleted (the repository removes it then).
 * - `bills`: a home's utility bills (fuel, period start and exclusive end as ISO dates, use
 *   and the unit it was billed in); they go with the home (purged with it).
 * - `daily_temperatures`: a home's daily mean outdoor temperatures (°F) by date, for the
 *   billing fit; per home, since a home's bills are dated and its series is the local one
 *   for those dates, where a weather year is a typical year without dates.
 */
import type { Migration } from './index.ts';

const ISO_DATE = "GLOB '[0-9][0-9][0-9][0-9]-[0-9][0-9]-[0-9][0-9]'";

export const migration0005: Migration = {
  version: 5,
  name: 'weather-and-bills',
  sql: `
    CREATE TABLE weather_years (
      id INTEGER PRIMARY KEY,
      name TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      format TEXT NOT NULL CHECK (format IN ('epw', 'tmy3')),
      location TEXT NOT NULL CHECK (json_valid(location)),
      hour_count INTEGER NOT NULL CHECK (hour_count BETWEEN 1 AND 8784),
      calendar BLOB NOT NULL CHECK (length(calendar) = 3 * hour_count),
      dry_bulb_c BLOB NOT NULL CHECK (length(dry_bulb_c) = 8 * hour_count),
      dew_point_c BLOB NOT NULL CHECK (length(dew_point_c) = 8 * hour_count),
      relative_humidity_pct BLOB NOT NULL CHECK (length(relative_humidity_pct) = 8 * hour_count),
      pressure_pa BLOB NOT NULL CHECK (length(pressure_pa) = 8 * hour_count),
      wind_speed_ms BLOB NOT NULL CHECK (length(wind_speed_ms) = 8 * hour_count),
      created_at TEXT NOT NULL
    ) STRICT;

    ALTER TABLE climates ADD COLUMN weather_year_id INTEGER
      REFERENCES weather_years (id) ON DELETE SET NULL;

    CREATE TABLE bills (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      fuel TEXT NOT NULL CHECK (length(fuel) BETWEEN 1 AND 40),
      period_start TEXT NOT NULL CHECK (period_start ${ISO_DATE}),
      period_end TEXT NOT NULL CHECK (period_end ${ISO_DATE} AND period_end > period_start),
      use REAL NOT NULL CHECK (use >= 0),
      unit TEXT NOT NULL CHECK (length(unit) BETWEEN 1 AND 20),
      created_at TEXT NOT NULL
    ) STRICT;
    CREATE INDEX bills_by_home ON bills (home_id, fuel, period_start);

    CREATE TABLE daily_temperatures (
      id INTEGER PRIMARY KEY,
      home_id INTEGER NOT NULL REFERENCES homes (id) ON DELETE CASCADE,
      date TEXT NOT NULL CHECK (date ${ISO_DATE}),
      mean_temp_f REAL NOT NULL CHECK (mean_temp_f BETWEEN -130 AND 140),
      UNIQUE (home_id, date)
    ) STRICT;
  `,
};
