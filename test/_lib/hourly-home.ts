/**
 * A home planned hour by hour for the home-file tests: a generated TMY3 year (one reading of
 * −0.0 among its hours, as weather files write it), the year's columns read here straight
 * from the text (apart from the engine's readers), its hourly degree days, and a home file
 * on the LBL basic model with `hourlyWeather`.
 */
import type { HourlyWeather } from '../../core/weather.ts';
import { climateFromWeather, detectAndParseWeather } from '../../core/weather.ts';
import { climates } from '../../db/repositories/reusable-sets.ts';
import { createWeatherYear, linkClimateWeatherYear } from '../../db/repositories/weather-years.ts';
import type { WriteAccess } from '../../db/store.ts';
import { validBaseHome, type JsonObject } from './base-home.ts';
import { tmy3Year } from './weather-files.ts';

/** A daily mean swinging from −2 °C in mid-January to 26 °C in mid-July. */
const dailyMeanC = (day: number) => 12 - 14 * Math.cos((2 * Math.PI * (day - 15)) / 365);

/**
 * The generated year as TMY3 text; the first hour's dry-bulb is written "-0.0".
 *
 * @param windMs - the wind speed of every hour, m/s
 */
export function hourlyYearText(windMs = 4.5): string {
  const lines = tmy3Year(dailyMeanC, windMs).split('\n');
  const first = (lines[2] ?? '').split(',');
  first[2] = '-0.0';
  lines[2] = first.join(',');
  return lines.join('\n');
}

/** The hour columns of TMY3 text as its own numbers (`Number` of each field). */
export interface TextHours {
  month: number[];
  day: number[];
  hour: number[];
  dryBulbC: number[];
  dewPointC: number[];
  relativeHumidityPct: number[];
  /** Station pressure, Pa: the file's mbar × 100 (1 mbar = 100 Pa, by the definition of the bar). */
  pressurePa: number[];
  windSpeedMs: number[];
}

/**
 * The hours of TMY3 text read column by column, with −0 as 0 (JSON has no negative zero).
 *
 * @param text - TMY3 text laid out as tmy3Year writes it
 */
export function hoursOfText(text: string): TextHours {
  const columns: TextHours = {
    month: [],
    day: [],
    hour: [],
    dryBulbC: [],
    dewPointC: [],
    relativeHumidityPct: [],
    pressurePa: [],
    windSpeedMs: [],
  };
  const number = (field: string | undefined) => Number(field) + 0;
  for (const row of text.trim().split('\n').slice(2)) {
    const [date = '', time = '', dryBulb, dewPoint, humidity, pressure, wind] = row.split(',');
    const [month, day] = date.split('/');
    columns.month.push(number(month));
    columns.day.push(number(day));
    columns.hour.push(number(time.split(':')[0]));
    columns.dryBulbC.push(number(dryBulb));
    columns.dewPointC.push(number(dewPoint));
    columns.relativeHumidityPct.push(number(humidity));
    columns.pressurePa.push(number(pressure) * 100);
    columns.windSpeedMs.push(number(wind));
  }
  return columns;
}

/**
 * Σ (base − T)⁺ / 24 over the text's hourly dry-bulbs, °F·day: the hourly definition of
 * degree days (ASHRAE Handbook—Fundamentals, "Energy Estimating and Modeling Methods").
 */
export function hourlyDegreeDaysF(text: string, baseF: number): number {
  const degreeHours = hoursOfText(text).dryBulbC.reduce(
    (sum, celsius) => sum + Math.max(0, baseF - (celsius * 9) / 5 - 32),
    0,
  );
  return degreeHours / 24;
}

/**
 * Stores a climate made from weather text with its hours, as the climates.importWeather
 * channel does (the same core and repository steps).
 *
 * @returns the climate's id and the hours as read
 */
export function storeWeatherClimate(
  write: WriteAccess,
  text: string,
  name: string,
): { climateId: number; weather: HourlyWeather } {
  const weather = detectAndParseWeather(text);
  const climate = climateFromWeather(weather, name);
  const climateId = climates.create(write, climate.name, climate);
  linkClimateWeatherYear(
    write,
    climateId,
    createWeatherYear(write, { name: climate.name, format: 'tmy3', weather }),
  );
  return { climateId, weather };
}

/**
 * The base home planned hour by hour on the LBL basic model.
 *
 * @param hourlyWeather - the balance points (default both 65 °F)
 */
export function hourlyHomeFile(hourlyWeather: JsonObject = {}): JsonObject {
  return {
    ...validBaseHome(),
    name: 'Hour-by-hour house',
    infiltrationMethod: 'lblBasic',
    hourlyWeather,
  };
}
