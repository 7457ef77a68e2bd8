/**
 * Degree days and heating-season conditions from a year of hourly weather.
 *
 * Notes: a day's mean is the mean of its 24 hourly dry-bulbs. By the daily-mean definition,
 * HDD = Σ_days max(0, base − T_mean,day) and CDD = Σ_days max(0, T_mean,day − base); by the
 * hourly definition, HDD = Σ_hours max(0, base − T_hour) / 24 (and likewise CDD). Both are
 * in °F·day. The hourly sum is never less than the daily-mean one (a day with a mean above
 * the base can still have cold hours).
 *
 * References: ASHRAE Handbook—Fundamentals, chapter "Energy Estimating and Modeling
 * Methods" (degree-day definitions; from memory).
 */
import { InputError } from '../errors.ts';
import { celsiusToFahrenheit, metersPerSecondToMph } from './conversions.ts';
import type { HourlyWeather } from './hourly.ts';

/** Indoor temperature assumed for the heating-season ΔT when none is given, °F (common practice). */
export const DEFAULT_INDOOR_F = 68;

/** Accepted base and indoor temperatures, °F. */
const TEMPERATURE_LIMITS_F = { min: -100, max: 150 } as const;

/** One day's mean dry-bulb. */
export interface DailyMean {
  month: number;
  day: number;
  meanDryBulbF: number;
}

/** How degree days are summed: from daily means or from each hour. */
export type DegreeDayMethod = 'daily-mean' | 'hourly';

/** Degree days of one month. */
export interface MonthlyDegreeDays {
  month: number;
  heatingDegreeDaysF: number;
  coolingDegreeDaysF: number;
}

/** A year's degree days at one base. */
export interface DegreeDays {
  baseF: number;
  method: DegreeDayMethod;
  heatingDegreeDaysF: number;
  coolingDegreeDaysF: number;
  /** Twelve entries, January first; a month absent from the weather has zeros. */
  monthly: MonthlyDegreeDays[];
}

/**
 * The mean dry-bulb of each day, in the order of the weather.
 *
 * @param weather hours in whole days of 24, hours 1–24, one month and day per day
 * @returns one entry per day, °F
 * @throws InputError if the hours do not form whole days
 */
export function dailyMeanTemperatures(weather: HourlyWeather): DailyMean[] {
  const { hours } = weather;
  if (hours.length === 0 || hours.length % 24 !== 0) {
    throw InputError.at('hours', `expected whole days of 24 hours, got ${hours.length} hours`);
  }
  const days: DailyMean[] = [];
  for (let start = 0; start < hours.length; start += 24) {
    const first = hours[start];
    if (!first) break;
    let sumF = 0;
    for (let offset = 0; offset < 24; offset += 1) {
      const hour = hours[start + offset];
      if (
        !hour ||
        hour.month !== first.month ||
        hour.day !== first.day ||
        hour.hour !== offset + 1
      ) {
        throw InputError.at(
          `hours[${start + offset}]`,
          `expected hour ${offset + 1} of ${first.month}/${first.day} (whole days, hours 1–24 in order)`,
        );
      }
      sumF += celsiusToFahrenheit(hour.dryBulbC);
    }
    days.push({ month: first.month, day: first.day, meanDryBulbF: sumF / 24 });
  }
  return days;
}

/**
 * Heating and cooling degree days at a base temperature, for the year and by month.
 *
 * @param weather a year of hourly weather
 * @param options.baseF base temperature, °F (e.g. 65)
 * @param options.method 'daily-mean' (default) or 'hourly'
 * @returns degree days, °F·day
 * @throws InputError for a base out of range or hours not in whole days
 */
export function degreeDays(
  weather: HourlyWeather,
  options: { baseF: number; method?: DegreeDayMethod },
): DegreeDays {
  checkTemperatureF('baseF', options.baseF);
  const method = options.method ?? 'daily-mean';
  const monthly = Array.from({ length: 12 }, (_, index) => ({
    month: index + 1,
    heatingDegreeDaysF: 0,
    coolingDegreeDaysF: 0,
  }));
  const add = (month: number, temperatureF: number): void => {
    const entry = monthly[month - 1];
    if (!entry) throw InputError.at('hours', `expected months 1–12, got ${month}`);
    entry.heatingDegreeDaysF += Math.max(0, options.baseF - temperatureF);
    entry.coolingDegreeDaysF += Math.max(0, temperatureF - options.baseF);
  };
  if (method === 'daily-mean') {
    for (const day of dailyMeanTemperatures(weather)) add(day.month, day.meanDryBulbF);
  } else {
    dailyMeanTemperatures(weather); // checks the hours form whole days
    // Summed in °F·hour and divided once, so a constant year gives exact figures.
    for (const hour of weather.hours) add(hour.month, celsiusToFahrenheit(hour.dryBulbC));
    for (const entry of monthly) {
      entry.heatingDegreeDaysF /= 24;
      entry.coolingDegreeDaysF /= 24;
    }
  }
  return {
    baseF: options.baseF,
    method,
    heatingDegreeDaysF: sumOf(monthly.map((entry) => entry.heatingDegreeDaysF)),
    coolingDegreeDaysF: sumOf(monthly.map((entry) => entry.coolingDegreeDaysF)),
    monthly,
  };
}

/** The heating season's mean conditions: hours colder than the base. */
export interface HeatingSeasonConditions {
  baseF: number;
  indoorF: number;
  /** Hours with a dry-bulb below the base. */
  hoursBelowBase: number;
  /** Mean of (indoor − outdoor) over those hours, °F; null when there are none. */
  meanDeltaTF: number | null;
  /** Mean wind speed over those hours, mph; null when there are none. */
  meanWindSpeedMph: number | null;
}

/**
 * The mean indoor–outdoor difference and wind speed over the hours below a base, as a
 * seasonal infiltration estimate wants them.
 *
 * @param weather hourly weather
 * @param options.baseF hours with a dry-bulb strictly below this count, °F
 * @param options.indoorF indoor temperature, °F (68 unless given)
 */
export function heatingSeasonConditions(
  weather: HourlyWeather,
  options: { baseF: number; indoorF?: number },
): HeatingSeasonConditions {
  const indoorF = options.indoorF ?? DEFAULT_INDOOR_F;
  checkTemperatureF('baseF', options.baseF);
  checkTemperatureF('indoorF', indoorF);
  let count = 0;
  let deltaSumF = 0;
  let windSumMph = 0;
  for (const hour of weather.hours) {
    const outdoorF = celsiusToFahrenheit(hour.dryBulbC);
    if (outdoorF >= options.baseF) continue;
    count += 1;
    deltaSumF += indoorF - outdoorF;
    windSumMph += metersPerSecondToMph(hour.windSpeedMs);
  }
  return {
    baseF: options.baseF,
    indoorF,
    hoursBelowBase: count,
    meanDeltaTF: count > 0 ? deltaSumF / count : null,
    meanWindSpeedMph: count > 0 ? windSumMph / count : null,
  };
}

function checkTemperatureF(path: string, valueF: number): void {
  if (
    !Number.isFinite(valueF) ||
    valueF < TEMPERATURE_LIMITS_F.min ||
    valueF > TEMPERATURE_LIMITS_F.max
  ) {
    throw InputError.at(
      path,
      `expected a temperature from ${TEMPERATURE_LIMITS_F.min} to ${TEMPERATURE_LIMITS_F.max} °F, got ${valueF}`,
    );
  }
}

function sumOf(values: readonly number[]): number {
  return values.reduce((total, value) => total + value, 0);
}
