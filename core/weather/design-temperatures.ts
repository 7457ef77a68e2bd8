/**
 * Design dry-bulb temperatures of one year of hourly weather, as percentiles of its hours.
 *
 * Notes: the heating design dry-bulb at p % is the temperature that the year's hours are at
 * or above p % of the time; the cooling design dry-bulb at q % is the temperature that the
 * hours exceed only q % of the time. With the n hourly dry-bulbs sorted from coldest,
 * heating(p) = T[⌊n·(100 − p)/100⌋] and cooling(q) = T[n − 1 − ⌊n·q/100⌋] (0-based), so at
 * most (100 − p) % of the hours are colder than heating(p) and at most q % warmer than
 * cooling(q). Here p = 99 and 99.6, q = 1 and 0.4.
 *
 * This is one year's figure. ASHRAE's published climatic design conditions use the same
 * annual percentages (99.6 % and 99 % heating, 0.4 %, 1 % and 2 % cooling) but over many
 * years of a station's record, so a typical year's values differ from them.
 *
 * References: ASHRAE Handbook—Fundamentals, chapter "Climatic Design Information" (the
 * annual percentages; from memory, not checked against the book).
 */
import { InputError } from '../errors.ts';
import { celsiusToFahrenheit } from './conversions.ts';
import type { HourlyWeather } from './hourly.ts';

/** One design temperature and what it means. */
export interface DesignTemperature {
  /** Percent of the year's hours at or above (heating) or above (cooling) the value. */
  percentOfHours: number;
  temperatureF: number;
  /** The definition in plain words. */
  definition: string;
}

/** The year's heating and cooling design dry-bulbs. */
export interface DesignTemperatures {
  heating99: DesignTemperature;
  heating996: DesignTemperature;
  cooling1: DesignTemperature;
  cooling04: DesignTemperature;
}

/**
 * The heating (99 %, 99.6 %) and cooling (1 %, 0.4 %) design dry-bulbs of the weather's hours.
 *
 * @param weather hourly weather (at least one hour)
 * @returns each temperature in °F with its definition
 * @throws InputError when there are no hours
 */
export function designTemperatures(weather: HourlyWeather): DesignTemperatures {
  if (weather.hours.length === 0) throw InputError.at('hours', 'expected at least one hour');
  const sortedF = weather.hours
    .map((hour) => celsiusToFahrenheit(hour.dryBulbC))
    .sort((a, b) => a - b);
  return {
    heating99: heatingDesign(sortedF, 99),
    heating996: heatingDesign(sortedF, 99.6),
    cooling1: coolingDesign(sortedF, 1),
    cooling04: coolingDesign(sortedF, 0.4),
  };
}

function heatingDesign(sortedF: readonly number[], percentOfHours: number): DesignTemperature {
  const index = Math.floor((sortedF.length * (100 - percentOfHours)) / 100);
  return {
    percentOfHours,
    temperatureF: valueAt(sortedF, index),
    definition: `heating ${percentOfHours} %: the dry-bulb the year's hours are at or above ${percentOfHours} % of the time (percentile ${round(100 - percentOfHours)} of the hourly dry-bulbs)`,
  };
}

function coolingDesign(sortedF: readonly number[], percentOfHours: number): DesignTemperature {
  const index = sortedF.length - 1 - Math.floor((sortedF.length * percentOfHours) / 100);
  return {
    percentOfHours,
    temperatureF: valueAt(sortedF, index),
    definition: `cooling ${percentOfHours} %: the dry-bulb the year's hours exceed only ${percentOfHours} % of the time (percentile ${round(100 - percentOfHours)} of the hourly dry-bulbs)`,
  };
}

function valueAt(sortedF: readonly number[], index: number): number {
  const value = sortedF[index];
  if (value === undefined)
    throw new Error(`unreachable: index ${index} of ${sortedF.length} hours`);
  return value;
}

function round(percent: number): number {
  return Math.round(percent * 1000) / 1000;
}
