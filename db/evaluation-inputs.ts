/**
 * What evaluating a stored home takes besides its file: the project's measure library and,
 * for a home planned hour by hour (`hourlyWeather`), the weather year its climate was made
 * from. Every place that evaluates a stored home takes its options from here, so a home is
 * planned the same way on every screen, in the command line and in a portfolio.
 */
import { evaluateHome, type EvaluateOptions, type Evaluation } from '../core/evaluate.ts';
import type { HomeFile } from '../core/schema.ts';
import { weatherYearOf, type WeatherYear } from '../core/weather.ts';
import { exportHomeFile } from './home-file.ts';
import type { ReadAccess } from './store.ts';
import { getHome } from './repositories/homes.ts';
import { effectiveLibrary } from './repositories/library.ts';
import { getWeatherYear, weatherYearSummaryOfClimate } from './repositories/weather-years.ts';

/**
 * Weather years already read, by stored id, for work over many homes (a portfolio): each
 * year is read and prepared once. Stored weather years are never changed, only added and
 * removed, so a cache lives as long as the work it serves (one call), no longer.
 */
export type WeatherYearCache = Map<number, WeatherYear>;

/**
 * The weather year of a stored home that asks for one.
 *
 * @returns the year, or undefined when the home is planned on degree days or its climate has
 *   no stored hours (evaluating it then says so, naming `hourlyWeather`)
 */
export function weatherYearOfHome(
  read: ReadAccess,
  homeId: number,
  file: Pick<HomeFile, 'hourlyWeather'>,
  cache?: WeatherYearCache,
): WeatherYear | undefined {
  if (file.hourlyWeather === undefined) return undefined;
  const { climateId } = getHome(read, homeId);
  if (climateId === null) return undefined;
  const summary = weatherYearSummaryOfClimate(read, climateId);
  if (summary === null) return undefined;
  const cached = cache?.get(summary.id);
  if (cached) return cached;
  const year = weatherYearOf(getWeatherYear(read, summary.id).weather, summary.name);
  cache?.set(summary.id, year);
  return year;
}

/** The options to evaluate a stored home with: the project's library, and its hours. */
export function evaluateOptionsOf(
  read: ReadAccess,
  homeId: number,
  file: Pick<HomeFile, 'hourlyWeather'>,
  cache?: WeatherYearCache,
): EvaluateOptions {
  const weather = weatherYearOfHome(read, homeId, file, cache);
  return { library: effectiveLibrary(read), ...(weather ? { weather } : {}) };
}

/** A stored home's file and its evaluation, as every screen and command shows it. */
export function evaluateStoredHome(
  read: ReadAccess,
  homeId: number,
): { file: HomeFile; options: EvaluateOptions; evaluation: Evaluation } {
  const file = exportHomeFile(read, homeId);
  const options = evaluateOptionsOf(read, homeId, file);
  return { file, options, evaluation: evaluateHome(file, options) };
}
