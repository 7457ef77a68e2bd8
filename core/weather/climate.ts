/**
 * A climate for the plan from a year of hourly weather: heating and cooling degree days at
 * 65 °F by the daily-mean definition, the elevation, and each season's mean indoor–outdoor
 * difference and wind — the heating season over the hours below 65 °F against 68 °F indoors,
 * the cooling season over the hours above 75 °F against 75 °F indoors (indoor set points are
 * common practice). The N-factor zone and wind shielding factor are the user's to add.
 */
import { METERS_PER_FOOT } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { Climate } from '../schema.ts';
import { celsiusToFahrenheit, metersPerSecondToMph } from './conversions.ts';
import { degreeDays, heatingSeasonConditions } from './degree-days.ts';
import type { HourlyWeather } from './hourly.ts';

/** The degree days' base of the plan's climate, °F. */
export const CLIMATE_BASE_F = 65;
/** Indoor temperature of the heating season, °F (common practice). */
export const HEATING_INDOOR_F = 68;
/** Indoor temperature of the cooling season, and the outdoor one above which it runs, °F. */
export const COOLING_INDOOR_F = 75;

/** The cooling season's mean outdoor − indoor difference and wind; null with no hot hour. */
function coolingSeason(weather: HourlyWeather): Climate['coolingSeason'] | null {
  let hours = 0;
  let deltaSumF = 0;
  let windSumMph = 0;
  for (const hour of weather.hours) {
    const outdoorF = celsiusToFahrenheit(hour.dryBulbC);
    if (outdoorF <= COOLING_INDOOR_F) continue;
    hours += 1;
    deltaSumF += outdoorF - COOLING_INDOOR_F;
    windSumMph += metersPerSecondToMph(hour.windSpeedMs);
  }
  if (hours === 0) return null;
  return {
    meanDeltaTF: deltaSumF / hours,
    meanWindSpeedMph: windSumMph / hours,
    indoorTempF: COOLING_INDOOR_F,
  };
}

/**
 * The climate of a weather file.
 *
 * @param name - the climate's name (by default the file's place)
 * @throws InputError naming `hours` when the weather holds no hour below 65 °F
 */
export function climateFromWeather(weather: HourlyWeather, name?: string): Climate {
  const days = degreeDays(weather, { baseF: CLIMATE_BASE_F, method: 'daily-mean' });
  const heating = heatingSeasonConditions(weather, {
    baseF: CLIMATE_BASE_F,
    indoorF: HEATING_INDOOR_F,
  });
  if (heating.meanDeltaTF === null || heating.meanWindSpeedMph === null) {
    throw InputError.at(
      'hours',
      `expected some hours below ${CLIMATE_BASE_F} °F for a heating season`,
    );
  }
  const cooling = coolingSeason(weather);
  const place = [weather.location.name, weather.location.region].filter(Boolean).join(', ');
  return {
    name: (name ?? place) || 'Imported weather',
    hdd65F: Math.round(days.heatingDegreeDaysF),
    cdd65F: Math.round(days.coolingDegreeDaysF),
    elevationFt: Math.round(weather.location.elevationM / METERS_PER_FOOT),
    heatingSeason: {
      meanDeltaTF: Math.max(0, heating.meanDeltaTF),
      meanWindSpeedMph: heating.meanWindSpeedMph,
      indoorTempF: HEATING_INDOOR_F,
    },
    ...(cooling ? { coolingSeason: cooling } : {}),
  };
}
