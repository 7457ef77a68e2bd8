/**
 * A year of hourly weather in the form the hour-by-hour infiltration wants it (outdoor
 * dry-bulb, wind and humidity ratio, one typed array each), the temperatures that split its
 * hours into heating and cooling hours, and the season totals of those hours: degree days
 * and latent grain-hours.
 *
 * Notes: heating hours are those colder than the heating balance point, cooling hours those
 * warmer than the cooling balance point. HDD = Σ_h (T_bal,h − T_h)⁺ / 24 and
 * CDD = Σ_h (T_h − T_bal,c)⁺ / 24, °F·day (the hourly definition, as in degree-days.ts);
 * latent grain-hours = Σ over cooling hours of 7000·(W_h − W_in)⁺ × 1 h, grain/lb·h.
 *
 * References: ASHRAE Handbook—Fundamentals, chapter "Energy Estimating and Modeling Methods"
 * (degree days and the balance point; from memory); ASHRAE HoF 2017 ch. 1 (humidity ratio).
 */
import { METERS_PER_FOOT, SEA_LEVEL_PRESSURE_PA } from '../constants.ts';
import { requireInRange } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import { COOLING_INDOOR_F, HEATING_INDOOR_F } from './climate.ts';
import { celsiusToFahrenheit, metersPerSecondToMph } from './conversions.ts';
import type { HourlyWeather } from './hourly.ts';
import {
  GRAINS_PER_POUND,
  humidityRatioFromRelativeHumidity,
  humidityRatioFromVaporPressure,
  saturationVaporPressurePa,
} from './psychrometrics.ts';

/** A year (or any run) of hours, one value an hour in each array, all of the same length. */
export interface WeatherYear {
  name: string;
  /** Site elevation, ft: sets the air's pressure, hence its density. */
  elevationFt: number;
  /** Outdoor dry-bulb, °F. */
  outdoorF: Float64Array;
  /** Wind speed at the weather station (10 m), mph. */
  windMph: Float64Array;
  /** Outdoor humidity ratio, lb water per lb dry air. */
  humidityRatio: Float64Array;
}

/** The temperatures and indoor moisture that split a year's hours into seasons. */
export interface HourlyBasis {
  /** Outdoor temperature below which the house needs heat, °F. */
  heatingBalancePointF: number;
  /** Outdoor temperature above which the house needs cooling, °F. */
  coolingBalancePointF: number;
  /** Indoor temperature while heating, °F. */
  indoorHeatingF: number;
  /** Indoor temperature while cooling, °F. */
  indoorCoolingF: number;
  /** Indoor humidity ratio while cooling, lb water per lb dry air. */
  indoorHumidityRatio: number;
}

/** Season totals of a year's hours. */
export interface HourlySeasons {
  /** Σ (heating balance point − T)⁺ / 24, °F·day. */
  hddF: number;
  /** Σ (T − cooling balance point)⁺ / 24, °F·day. */
  cddF: number;
  /** Σ over cooling hours of (W_out − W_in)⁺ in grain/lb, × 1 h. */
  latentGrainHours: number;
  /** Hours colder than the heating balance point. */
  heatingHours: number;
  /** Hours warmer than the cooling balance point. */
  coolingHours: number;
}

/** Relative humidity held indoors while cooling, %. Common practice (comfort design). */
export const INDOOR_COOLING_RELATIVE_HUMIDITY_PCT = 50;

/**
 * Indoor humidity ratio of air at a temperature and relative humidity at an elevation's
 * standard pressure.
 *
 * @param options.indoorF - indoor dry-bulb, °F
 * @param options.relativeHumidityPct - indoor relative humidity, % (0 to 100)
 * @param options.pressurePa - total pressure, Pa (default sea level, 101,325)
 * @returns humidity ratio, lb water per lb dry air (0.00924 at 75 °F, 50 %, sea level)
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5, 6, 20 and 24.
 */
export function indoorHumidityRatio(options: {
  indoorF: number;
  relativeHumidityPct: number;
  pressurePa?: number;
}): number {
  return humidityRatioFromRelativeHumidity({
    dryBulbC: (options.indoorF - 32) / 1.8,
    relativeHumidityPct: options.relativeHumidityPct,
    pressurePa: options.pressurePa ?? SEA_LEVEL_PRESSURE_PA,
  });
}

/**
 * The basis that matches the plan's climate: balance points of 65 °F (so the degree days are
 * HDD65 and CDD65), 68 °F indoors heating and 75 °F cooling (as climate.ts), and the indoor
 * humidity ratio of 75 °F and 50 % at sea level.
 */
export const DEFAULT_HOURLY_BASIS: Readonly<HourlyBasis> = Object.freeze({
  heatingBalancePointF: 65,
  coolingBalancePointF: 65,
  indoorHeatingF: HEATING_INDOOR_F,
  indoorCoolingF: COOLING_INDOOR_F,
  indoorHumidityRatio: indoorHumidityRatio({
    indoorF: COOLING_INDOOR_F,
    relativeHumidityPct: INDOOR_COOLING_RELATIVE_HUMIDITY_PCT,
  }),
});

/** The readers' accepted spans (EPW data dictionary, as epw.ts and tmy3.ts check them). */
const READER_LIMITS = {
  dryBulbC: { min: -70, max: 70, unit: '°C' },
  dewPointC: { min: -70, max: 70, unit: '°C' },
  pressurePa: { min: 31_000, max: 120_000, unit: 'Pa' },
  windSpeedMs: { min: 0, max: 40, unit: 'm/s' },
} as const;

/** The same spans for a WeatherYear's own units. */
const YEAR_LIMITS = {
  elevationFt: { min: -1500, max: 15_000, unit: 'ft' },
  outdoorF: { min: celsiusToFahrenheit(-70), max: celsiusToFahrenheit(70), unit: '°F' },
  windMph: { min: 0, max: metersPerSecondToMph(40), unit: 'mph' },
  humidityRatio: { min: 0, max: 1, unit: 'lb/lb' },
} as const;

/** Balance points and indoor temperatures accepted, °F (indoor as the home file's seasons). */
const BALANCE_POINT_LIMITS_F = { min: -100, max: 150, unit: '°F' };
const INDOOR_LIMITS_F = { min: 40, max: 90, unit: '°F' };

/**
 * The weather year of an hourly weather file.
 *
 * @param weather - hours as read by the EPW or TMY3 reader (at least one)
 * @param name - the year's name (by default the file's place)
 * @returns °F, mph and the humidity ratio from each hour's dew point at its station pressure
 * @throws InputError naming `hours` when there is none, or `hours[i].<field>` for a value
 *   out of the readers' ranges
 */
export function weatherYearOf(weather: HourlyWeather, name?: string): WeatherYear {
  const { hours } = weather;
  if (hours.length === 0) throw InputError.at('hours', 'expected at least one hour, got none');
  requireInRange('location.elevationM', weather.location.elevationM, {
    min: YEAR_LIMITS.elevationFt.min * METERS_PER_FOOT,
    max: YEAR_LIMITS.elevationFt.max * METERS_PER_FOOT,
    unit: 'm',
  });
  const outdoorF = new Float64Array(hours.length);
  const windMph = new Float64Array(hours.length);
  const humidityRatio = new Float64Array(hours.length);
  hours.forEach((hour, index) => {
    for (const field of ['dryBulbC', 'dewPointC', 'pressurePa', 'windSpeedMs'] as const) {
      requireInRange(`hours[${index}].${field}`, hour[field], READER_LIMITS[field]);
    }
    const vaporPa = saturationVaporPressurePa(hour.dewPointC);
    if (!(vaporPa < hour.pressurePa)) {
      throw InputError.at(
        `hours[${index}].dewPointC`,
        `expected a dew point whose vapour pressure (${vaporPa} Pa) is below the station pressure ${hour.pressurePa} Pa`,
      );
    }
    outdoorF[index] = celsiusToFahrenheit(hour.dryBulbC);
    windMph[index] = metersPerSecondToMph(hour.windSpeedMs);
    humidityRatio[index] = humidityRatioFromVaporPressure(vaporPa, hour.pressurePa);
  });
  const place = [weather.location.name, weather.location.region].filter(Boolean).join(', ');
  return {
    name: (name ?? place) || 'Imported weather',
    elevationFt: weather.location.elevationM / METERS_PER_FOOT,
    outdoorF,
    windMph,
    humidityRatio,
  };
}

/**
 * Checks a weather year: a name, an elevation in range, three arrays of one length (at least
 * one hour), every value finite and in range.
 *
 * @throws InputError naming the field (`outdoorF[12]`, `windMph`, …) and what was expected
 */
export function checkWeatherYear(year: WeatherYear): void {
  if (typeof year.name !== 'string') {
    throw InputError.at('name', `expected a text name, got ${typeof year.name}`);
  }
  requireInRange('elevationFt', year.elevationFt, YEAR_LIMITS.elevationFt);
  for (const field of ['outdoorF', 'windMph', 'humidityRatio'] as const) {
    if (!(year[field] instanceof Float64Array)) {
      throw InputError.at(field, 'expected a Float64Array of hourly values');
    }
  }
  const hourCount = year.outdoorF.length;
  if (hourCount === 0) throw InputError.at('outdoorF', 'expected at least one hour, got none');
  for (const field of ['outdoorF', 'windMph', 'humidityRatio'] as const) {
    const values = year[field];
    if (values.length !== hourCount) {
      throw InputError.at(
        field,
        `expected ${hourCount} hourly values (as many as outdoorF), got ${values.length}`,
      );
    }
    const { min, max } = YEAR_LIMITS[field];
    for (let hour = 0; hour < hourCount; hour += 1) {
      const value = values[hour]!;
      // Written out (not requireInRange) so a clean year costs no call per hour.
      if (!(value >= min && value <= max)) {
        requireInRange(`${field}[${hour}]`, value, YEAR_LIMITS[field]);
      }
    }
  }
}

/**
 * Checks an hourly basis: balance points from −100 to 150 °F, indoor temperatures from 40 to
 * 90 °F (as the home file's seasons), an indoor humidity ratio from 0 to 0.1.
 *
 * @throws InputError naming the field
 */
export function checkHourlyBasis(basis: HourlyBasis): void {
  requireInRange('heatingBalancePointF', basis.heatingBalancePointF, BALANCE_POINT_LIMITS_F);
  requireInRange('coolingBalancePointF', basis.coolingBalancePointF, BALANCE_POINT_LIMITS_F);
  requireInRange('indoorHeatingF', basis.indoorHeatingF, INDOOR_LIMITS_F);
  requireInRange('indoorCoolingF', basis.indoorCoolingF, INDOOR_LIMITS_F);
  requireInRange('indoorHumidityRatio', basis.indoorHumidityRatio, {
    min: 0,
    max: 0.1,
    unit: 'lb/lb',
  });
}

/**
 * Degree days, latent grain-hours and season hours of a weather year.
 *
 * @param year - the hourly weather
 * @param basis - balance points and indoor humidity (DEFAULT_HOURLY_BASIS for HDD65/CDD65)
 * @returns season totals (see HourlySeasons)
 * @throws InputError naming the field of a malformed year or basis
 *
 * Notes: degree-hours are summed and divided by 24 once, as degree-days.ts does, so a
 * constant year gives exact figures.
 */
export function hourlySeasons(year: WeatherYear, basis: HourlyBasis): HourlySeasons {
  checkWeatherYear(year);
  checkHourlyBasis(basis);
  let heatingDegreeHours = 0;
  let coolingDegreeHours = 0;
  let latentGrainHours = 0;
  let heatingHours = 0;
  let coolingHours = 0;
  for (let hour = 0; hour < year.outdoorF.length; hour += 1) {
    const outdoorF = year.outdoorF[hour]!;
    if (outdoorF < basis.heatingBalancePointF) {
      heatingHours += 1;
      heatingDegreeHours += basis.heatingBalancePointF - outdoorF;
    }
    if (outdoorF > basis.coolingBalancePointF) {
      coolingHours += 1;
      coolingDegreeHours += outdoorF - basis.coolingBalancePointF;
      const excess = year.humidityRatio[hour]! - basis.indoorHumidityRatio;
      if (excess > 0) latentGrainHours += excess * GRAINS_PER_POUND;
    }
  }
  return {
    hddF: heatingDegreeHours / 24,
    cddF: coolingDegreeHours / 24,
    latentGrainHours,
    heatingHours,
    coolingHours,
  };
}
