/**
 * A home's weather year made ready for its model: the degree days at the house's balance
 * points and the cooling hours' moisture, summed from the hours, and the infiltration of any
 * leakage state worked hour by hour (core/weather/hourly-airflow.ts).
 */
import { InputError } from '../errors.ts';
import type { HourlyClimate } from '../home-model.ts';
import type { HomeFile } from '../schema.ts';
import {
  DEFAULT_HOURLY_BASIS,
  hourlyAim2Pressures,
  hourlyAirflowMethod,
  hourlySeasons,
  indoorHumidityRatio,
  INDOOR_COOLING_RELATIVE_HUMIDITY_PCT,
  type HourlyBasis,
  type WeatherYear,
} from './hourly-airflow.ts';

/**
 * The basis of a home's hourly plan: its balance points (65 °F each by default, so a year
 * of constant weather gives the degree-day figures) and the indoor temperatures its climate
 * gives for each season (68 °F and 75 °F by default), the indoor humidity ratio at 50 % RH.
 */
export function hourlyBasisOf(home: HomeFile): HourlyBasis {
  const indoorHeatingF =
    home.climate.heatingSeason?.indoorTempF ?? DEFAULT_HOURLY_BASIS.indoorHeatingF;
  const indoorCoolingF =
    home.climate.coolingSeason?.indoorTempF ?? DEFAULT_HOURLY_BASIS.indoorCoolingF;
  return {
    heatingBalancePointF:
      home.hourlyWeather?.heatingBalancePointF ?? DEFAULT_HOURLY_BASIS.heatingBalancePointF,
    coolingBalancePointF:
      home.hourlyWeather?.coolingBalancePointF ?? DEFAULT_HOURLY_BASIS.coolingBalancePointF,
    indoorHeatingF,
    indoorCoolingF,
    indoorHumidityRatio: indoorHumidityRatio({
      indoorF: indoorCoolingF,
      relativeHumidityPct: INDOOR_COOLING_RELATIVE_HUMIDITY_PCT,
    }),
  };
}

/**
 * The hourly climate of a home that asks for one (`hourlyWeather`), or undefined for a home
 * planned on degree days.
 *
 * @param year - the weather year of the home's climate; required when the home asks for it
 * @throws InputError naming `hourlyWeather` when the home asks for hours and none are given
 */
export function hourlyClimateOf(
  home: HomeFile,
  exponentN: number,
  year: WeatherYear | undefined,
): HourlyClimate | undefined {
  if (home.hourlyWeather === undefined) return undefined;
  if (year === undefined) {
    throw InputError.at(
      'hourlyWeather',
      `asks for the plan hour by hour, but climate “${home.climate.name}” has no weather year: ` +
        'make the climate from a weather file, or plan on degree days',
    );
  }
  // The site's elevation is the home's: its climate's, which the weather file set.
  const siteYear: WeatherYear = { ...year, elevationFt: home.climate.elevationFt };
  const basis = hourlyBasisOf(home);
  const seasons = hourlySeasons(siteYear, basis);
  return {
    basis: {
      kind: 'hourly',
      weatherName: year.name,
      hours: year.outdoorF.length,
      heatingBalancePointF: basis.heatingBalancePointF,
      coolingBalancePointF: basis.coolingBalancePointF,
    },
    seasons: {
      heatingDegreeDaysF: seasons.hddF,
      coolingDegreeDaysF: seasons.cddF,
      latentGrainHours: seasons.latentGrainHours,
      elevationFt: siteYear.elevationFt,
    },
    airflowOf: hourlyAirflowMethod(home, exponentN, siteYear, basis),
    ...(home.infiltrationMethod === 'aim2'
      ? { aim2Pressures: () => hourlyAim2Pressures(home, exponentN, siteYear, basis) }
      : {}),
  };
}
