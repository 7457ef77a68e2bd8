/**
 * A weather year as plain JSON (lists of numbers), to pass where typed arrays do not go: a
 * channel's reply, a page's worker message. `weatherYearFromData` checks what comes back.
 */
import { InputError } from '../errors.ts';
import { checkWeatherYear, type WeatherYear } from './weather-year.ts';

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
