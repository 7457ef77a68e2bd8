/**
 * A weather year as plain JSON (lists of numbers), to pass where typed arrays do not go: a
 * channel's reply, a page's worker message. `weatherYearFromData` checks what comes back;
 * `weatherYearOfBlock` makes the year of a home file's `weatherYear` (the hours as read).
 */
import { InputError } from '../errors.ts';
import { hourlyWeatherOfBlock, type HomeWeatherYear } from './weather-year-file.ts';
import { checkWeatherYear, weatherYearOf, type WeatherYear } from './weather-year.ts';

export interface WeatherYearData {
  name: string;
  elevationFt: number;
  outdoorF: number[];
  windMph: number[];
  humidityRatio: number[];
}

export function weatherYearData(year: WeatherYear): WeatherYearData {
  return {
    name: year.name,
    elevationFt: year.elevationFt,
    outdoorF: Array.from(year.outdoorF),
    windMph: Array.from(year.windMph),
    humidityRatio: Array.from(year.humidityRatio),
  };
}

/**
 * The year of its JSON form.
 *
 * @throws InputError naming the field that is not a list of numbers or does not match the rest
 */
export function weatherYearFromData(data: WeatherYearData): WeatherYear {
  const series = (field: 'outdoorF' | 'windMph' | 'humidityRatio'): Float64Array => {
    const values: unknown = data[field];
    if (!Array.isArray(values)) throw InputError.at(field, 'expected a list of numbers');
    return Float64Array.from(values as number[]);
  };
  const year: WeatherYear = {
    name: data.name,
    elevationFt: data.elevationFt,
    outdoorF: series('outdoorF'),
    windMph: series('windMph'),
    humidityRatio: series('humidityRatio'),
  };
  checkWeatherYear(year);
  return year;
}

/**
 * weatherYearOf's name for a field (`hours[3].dewPointC`) as the home file names it
 * (`weatherYear.hours.dewPointC[3]`).
 */
function blockFieldOf(path: string): string {
  const hour = /^hours\[(\d+)\]\.(\w+)$/.exec(path);
  if (hour) return `weatherYear.hours.${hour[2]}[${hour[1]}]`;
  return path === '' ? 'weatherYear' : `weatherYear.${path}`;
}

/**
 * The weather year of a home file's block, made exactly as a stored year is (weatherYearOf
 * on the same hours and name), so the file plans as its stored home does.
 *
 * @param block - a block checked by homeWeatherYearSchema
 * @returns °F, mph and humidity ratio hour by hour
 * @throws InputError naming `weatherYear.hours.<quantity>[i]` or `weatherYear.location.elevationM`
 *   for an hour the year cannot be made of (a dew point whose vapour pressure is not below
 *   the station pressure, an elevation out of range)
 */
export function weatherYearOfBlock(block: HomeWeatherYear): WeatherYear {
  const { name, weather } = hourlyWeatherOfBlock(block);
  try {
    return weatherYearOf(weather, name);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(
      error.problems.map((problem) => ({
        path: blockFieldOf(problem.path),
        message: problem.message,
      })),
    );
  }
}
