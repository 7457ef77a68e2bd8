/**
 * The weather year a home file carries when its home is planned hour by hour (the home
 * file's `weatherYear`): the stored year's name and source format, the place it was
 * observed, and every hour as the readers parsed it, one list of numbers per quantity. With
 * it a home file stands on its own: importing it stores the same hours again (or finds them
 * already stored), so the home evaluates to the same figures on any machine.
 *
 * Notes: each quantity is a list of numbers, not a list of hour objects, so the names are
 * written once rather than 8,760 times. JSON numbers round-trip float64 exactly
 * (JSON.stringify writes the shortest text that reads back as the same double, ECMA-262
 * Number::toString), with one exception: JSON has no negative zero, so a −0.0 reading is
 * written as 0, the same quantity; the weather year made from it (°F, mph, humidity ratio)
 * is the same. The spans accepted are the readers' own (epw.ts, tmy3.ts), so every year the
 * store can hold is written and read back.
 *
 * References: EnergyPlus Auxiliary Programs, "Weather Converter Program", EPW data
 * dictionary (fields, units and ranges; from memory), as epw.ts and tmy3.ts read them.
 */
import { z } from 'zod';
import type { HourlyWeather, WeatherFormat, WeatherHour, WeatherLocation } from './hourly.ts';
import { HOURS_IN_LEAP_YEAR } from './rows.ts';

/** Problems listed per quantity before the rest are counted, so a wrong list reads plainly. */
export const MAX_PROBLEMS_PER_QUANTITY = 5;

/** The hourly quantities in the order a home file lists them, with the readers' spans. */
export const WEATHER_YEAR_QUANTITIES = {
  month: { min: 1, max: 12, unit: '', whole: true },
  day: { min: 1, max: 31, unit: '', whole: true },
  hour: { min: 1, max: 24, unit: '', whole: true },
  dryBulbC: { min: -70, max: 70, unit: ' °C', whole: false },
  dewPointC: { min: -70, max: 70, unit: ' °C', whole: false },
  relativeHumidityPct: { min: 0, max: 110, unit: ' %', whole: false },
  pressurePa: { min: 31_000, max: 120_000, unit: ' Pa', whole: false },
  windSpeedMs: { min: 0, max: 40, unit: ' m/s', whole: false },
} as const;
export type WeatherYearQuantity = keyof typeof WEATHER_YEAR_QUANTITIES;
const QUANTITIES = Object.keys(WEATHER_YEAR_QUANTITIES) as WeatherYearQuantity[];

/** A short account of a value that is not what a list of hours may hold. */
function given(value: unknown): string {
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string')
    return `"${value.length > 20 ? `${value.slice(0, 17)}...` : value}"`;
  if (value === null) return 'null';
  return Array.isArray(value) ? 'a list' : typeof value;
}

/**
 * One quantity's list of hourly values: 1 to 8,784 numbers within the readers' span. At most
 * MAX_PROBLEMS_PER_QUANTITY values are named; the rest are counted.
 */
function hourlyListSchema(quantity: WeatherYearQuantity) {
  const { min, max, unit, whole } = WEATHER_YEAR_QUANTITIES[quantity];
  const wanted = `${whole ? 'a whole number' : 'a number'} from ${min} to ${max}${unit}`;
  return z
    .custom<number[]>((value) => Array.isArray(value), {
      message: `expected a list of numbers, one an hour (${wanted})`,
    })
    .check((ctx) => {
      // Not a list at all: already refused above, with its own message.
      if (!Array.isArray(ctx.value)) return;
      const values: readonly unknown[] = ctx.value;
      if (values.length < 1 || values.length > HOURS_IN_LEAP_YEAR) {
        ctx.issues.push({
          code: 'custom',
          input: ctx.value,
          message: `expected 1 to ${HOURS_IN_LEAP_YEAR} hourly values, got ${values.length}`,
        });
        return;
      }
      let wrong = 0;
      values.forEach((value, index) => {
        const fits =
          typeof value === 'number' &&
          value >= min &&
          value <= max &&
          (!whole || Number.isInteger(value));
        if (fits) return;
        wrong += 1;
        if (wrong > MAX_PROBLEMS_PER_QUANTITY) return;
        ctx.issues.push({
          code: 'custom',
          input: value,
          path: [index],
          message: `expected ${wanted}, got ${given(value)}`,
        });
      });
      if (wrong > MAX_PROBLEMS_PER_QUANTITY) {
        ctx.issues.push({
          code: 'custom',
          input: ctx.value,
          message: `and ${wrong - MAX_PROBLEMS_PER_QUANTITY} more hours outside ${min} to ${max}${unit}`,
        });
      }
    });
}

const placeText = z.string().max(500);

/** Where the weather was observed, as the reader found it in the file's header. */
export const weatherLocationSchema = z.strictObject({
  name: placeText,
  region: placeText.optional(),
  country: placeText.optional(),
  stationId: placeText.optional(),
  source: placeText.optional(),
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(180),
  timeZoneHours: z.number().min(-12).max(14),
  elevationM: z.number().min(-1000).max(9999.9),
});

const hourListsSchema = z
  .strictObject(
    Object.fromEntries(QUANTITIES.map((quantity) => [quantity, hourlyListSchema(quantity)])) as {
      [Quantity in WeatherYearQuantity]: ReturnType<typeof hourlyListSchema>;
    },
  )
  .check((ctx) => {
    const hourCount = ctx.value.month.length;
    for (const quantity of QUANTITIES) {
      const count = ctx.value[quantity].length;
      if (count === hourCount) continue;
      ctx.issues.push({
        code: 'custom',
        input: ctx.value[quantity],
        path: [quantity],
        message: `expected ${hourCount} hourly values (as many as month), got ${count}`,
      });
    }
  });

/** The home file's `weatherYear`: the year an hourly home is planned on. */
export const homeWeatherYearSchema = z.strictObject({
  /** The stored year's name; the report names the weather by it. */
  name: z.string().trim().min(1).max(200),
  /** The kind of file the hours were read from. */
  format: z.enum(['epw', 'tmy3']),
  location: weatherLocationSchema,
  /** Each quantity hour by hour, all lists of one length, in the file's order. */
  hours: hourListsSchema,
});
export type HomeWeatherYear = z.output<typeof homeWeatherYearSchema>;

/** A stored year as the readers gave it: its name, format and hours. */
export interface NamedHourlyWeather {
  name: string;
  format: WeatherFormat;
  weather: HourlyWeather;
}

/** JSON has no −0: written as 0 here, so the block equals what its JSON reads back as. */
function jsonNumber(value: number): number {
  return value === 0 ? 0 : value;
}

/** The location with only the facts the file gives (no keys that hold nothing). */
function locationOf(location: WeatherLocation): WeatherLocation {
  const { name, region, country, stationId, source } = location;
  return {
    name,
    ...(region === undefined ? {} : { region }),
    ...(country === undefined ? {} : { country }),
    ...(stationId === undefined ? {} : { stationId }),
    ...(source === undefined ? {} : { source }),
    latitude: jsonNumber(location.latitude),
    longitude: jsonNumber(location.longitude),
    timeZoneHours: jsonNumber(location.timeZoneHours),
    elevationM: jsonNumber(location.elevationM),
  };
}

/**
 * A stored year as the home file's `weatherYear`.
 *
 * @param year - the year's name, format and hours as read
 * @returns the block: the same hours as lists of numbers (−0 written as 0)
 */
export function homeWeatherYearOf(year: NamedHourlyWeather): HomeWeatherYear {
  const { hours } = year.weather;
  const lists = Object.fromEntries(
    QUANTITIES.map((quantity) => [quantity, hours.map((hour) => jsonNumber(hour[quantity]))]),
  ) as HomeWeatherYear['hours'];
  return {
    name: year.name,
    format: year.format,
    location: locationOf(year.weather.location),
    hours: lists,
  };
}

/**
 * The hours of a home file's `weatherYear`, as a reader would have given them.
 *
 * @param block - a block checked by homeWeatherYearSchema (lists of one length)
 * @returns the name, format and hourly weather to store
 */
export function hourlyWeatherOfBlock(block: HomeWeatherYear): NamedHourlyWeather {
  const { hours } = block;
  const weatherHours = hours.month.map((month, index): WeatherHour => ({
    month,
    day: hours.day[index]!,
    hour: hours.hour[index]!,
    dryBulbC: hours.dryBulbC[index]!,
    dewPointC: hours.dewPointC[index]!,
    relativeHumidityPct: hours.relativeHumidityPct[index]!,
    pressurePa: hours.pressurePa[index]!,
    windSpeedMs: hours.windSpeedMs[index]!,
  }));
  return {
    name: block.name,
    format: block.format,
    weather: { location: locationOf(block.location), hours: weatherHours },
  };
}
