/**
 * The home file's weather year (core/weather/weather-year-file.ts) on its own: a year read
 * from a weather file becomes lists of numbers and back without a bit changed (−0 apart),
 * its weather year is the readers' (°F and mph by their definitions), an hour the year cannot
 * be made of is named as the file names it, and the file's text keeps each list on one line
 * while reading back as the same JSON.
 *
 * Checked against: °F = °C × 9/5 + 32 and 1 mph = 0.44704 m/s (NIST SP 811, appendix B,
 * exact); float64 round trips through JSON text (ECMA-262 Number::toString, shortest
 * round-tripping digits), checked on values with no short decimal form.
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import { detectAndParseWeather } from '../../core/weather.ts';
import { weatherYearOfBlock } from '../../core/weather/weather-year-data.ts';
import { homeFileText } from '../../core/weather/home-file-text.ts';
import {
  homeWeatherYearOf,
  homeWeatherYearSchema,
  hourlyWeatherOfBlock,
} from '../../core/weather/weather-year-file.ts';
import { hourlyYearText } from '../_lib/hourly-home.ts';

const WEATHER = detectAndParseWeather(hourlyYearText());
const NAMED = { name: 'Generated swing year', format: 'tmy3' as const, weather: WEATHER };

describe('a weather year as lists of numbers', () => {
  it('comes back through JSON text as the same hours, bit for bit (−0 as 0)', () => {
    const block = homeWeatherYearSchema.parse(JSON.parse(JSON.stringify(homeWeatherYearOf(NAMED))));
    const back = hourlyWeatherOfBlock(block);
    expect(back.weather.hours).toHaveLength(WEATHER.hours.length);
    back.weather.hours.forEach((hour, index) => {
      const read = WEATHER.hours[index]!;
      for (const field of Object.keys(read) as (keyof typeof read)[]) {
        // === counts −0 and 0 as one value; Object.is would not, and JSON cannot say −0.
        if (hour[field] !== read[field]) expect.fail(`hour ${index} ${field} changed`);
      }
    });
    expect(back.weather.location).toEqual(WEATHER.location);
  });

  it('keeps every bit of numbers with no short decimal form', () => {
    const hours = WEATHER.hours.slice(0, 3).map((hour, index) => ({
      ...hour,
      dryBulbC: Math.PI * (index + 1),
      pressurePa: 101_325 + Math.SQRT2 / 3,
      windSpeedMs: Number.EPSILON * (index + 1),
    }));
    const named = { ...NAMED, weather: { ...WEATHER, hours } };
    const text = JSON.stringify(homeWeatherYearOf(named));
    const back = hourlyWeatherOfBlock(homeWeatherYearSchema.parse(JSON.parse(text)));
    expect(back.weather.hours).toEqual(hours);
  });

  it('makes the same weather year as the readers’ hours: °F and mph by definition', () => {
    const year = weatherYearOfBlock(homeWeatherYearOf(NAMED));
    expect(year.name).toBe(NAMED.name);
    expect(year.outdoorF).toHaveLength(8760);
    WEATHER.hours.forEach((hour, index) => {
      expect(year.outdoorF[index]).toBeCloseTo((hour.dryBulbC * 9) / 5 + 32, 10);
      expect(year.windMph[index]).toBeCloseTo(hour.windSpeedMs / 0.44704, 10);
    });
  });

  it('names an hour the year cannot be made of as the file names it', () => {
    // At 70 °C the saturation vapour pressure (about 31.2 kPa, ASHRAE HoF 2017 ch. 1
    // table 3; from memory) is above a 31,000 Pa station pressure.
    const block = homeWeatherYearOf(NAMED);
    block.hours.dewPointC[7] = 70;
    block.hours.dryBulbC[7] = 70;
    block.hours.pressurePa[7] = 31_000;
    expect(() => weatherYearOfBlock(block)).toThrow(InputError);
    try {
      weatherYearOfBlock(block);
    } catch (error) {
      expect((error as InputError).field).toBe('weatherYear.hours.dewPointC[7]');
    }
  });
});

describe('the text of a home file with a weather year', () => {
  const file = {
    format: 'sealwork-home/1',
    name: 'Some house',
    weatherYear: homeWeatherYearOf(NAMED),
  };

  it('reads back as the same JSON, each hourly list on one line', () => {
    const text = homeFileText(file);
    expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(file)));
    for (const list of Object.values(file.weatherYear.hours)) {
      expect(text).toContain(`: ${JSON.stringify(list)}`);
    }
    expect(text.endsWith('\n')).toBe(true);
  });

  it('in a bundle, likewise', () => {
    const bundle = { format: 'sealwork-home-bundle/1', file, photos: [] };
    const text = homeFileText(bundle);
    expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify(bundle)));
    expect(text.split('\n').length).toBeLessThan(60);
  });

  it('without a year is JSON.stringify indented by two, as the hosts write it', () => {
    const plain = { format: 'sealwork-home/1', name: 'Some house', measures: [1, 2] };
    expect(homeFileText(plain)).toBe(`${JSON.stringify(plain, null, 2)}\n`);
  });

  it('falls back to the plain layout should a text hold the marker', () => {
    const odd = { ...file, notes: '\u0000hours 0\u0000' };
    expect(homeFileText(odd)).toBe(`${JSON.stringify(odd, null, 2)}\n`);
  });
});
