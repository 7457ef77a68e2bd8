/**
 * Weather files: hourly weather read from EPW and TMY3 files (the format chosen by the
 * content), and what the engine takes from it: daily means, heating and cooling degree days
 * at any base (daily-mean or hourly), the heating season's mean ΔT and wind, and the design
 * dry-bulbs. Pure: the text of a file in, figures out; bad files throw InputError with every
 * problem's line and field.
 */
export type {
  HourlyWeather,
  WeatherFormat,
  WeatherHour,
  WeatherLocation,
} from './weather/hourly.ts';
export { detectAndParseWeather, detectWeatherFormat } from './weather/hourly.ts';
export { EPW_FIELDS_PER_ROW, EPW_HEADER_KEYWORDS, parseEpw } from './weather/epw.ts';
export { PASCALS_PER_MILLIBAR, parseTmy3, TMY3_COLUMNS } from './weather/tmy3.ts';
export { HOURS_IN_COMMON_YEAR, HOURS_IN_LEAP_YEAR, MAX_WEATHER_PROBLEMS } from './weather/rows.ts';
export {
  celsiusToFahrenheit,
  FAHRENHEIT_AT_ZERO_CELSIUS,
  FAHRENHEIT_DEGREES_PER_CELSIUS_DEGREE,
  metersPerSecondToMph,
  MPH_PER_METER_PER_SECOND,
} from './weather/conversions.ts';
export type {
  DailyMean,
  DegreeDayMethod,
  DegreeDays,
  HeatingSeasonConditions,
  MonthlyDegreeDays,
} from './weather/degree-days.ts';
export {
  dailyMeanTemperatures,
  DEFAULT_INDOOR_F,
  degreeDays,
  heatingSeasonConditions,
} from './weather/degree-days.ts';
export type { DesignTemperature, DesignTemperatures } from './weather/design-temperatures.ts';
export { designTemperatures } from './weather/design-temperatures.ts';
export {
  CLIMATE_BASE_F,
  climateFromWeather,
  COOLING_INDOOR_F,
  HEATING_INDOOR_F,
} from './weather/climate.ts';
export {
  GRAINS_PER_POUND,
  grainsPerPound,
  humidityRatioFromDewPoint,
  humidityRatioFromRelativeHumidity,
  humidityRatioFromVaporPressure,
  saturationVaporPressurePa,
  WATER_TO_DRY_AIR_MOLAR_MASS_RATIO,
} from './weather/psychrometrics.ts';
export type {
  HourlyAirflowCfm,
  HourlyBasis,
  HourlySeasons,
  WeatherYear,
} from './weather/hourly-airflow.ts';
export {
  checkHourlyBasis,
  checkWeatherYear,
  DEFAULT_HOURLY_BASIS,
  hourlyAirflowMethod,
  hourlySeasons,
  indoorHumidityRatio,
  INDOOR_COOLING_RELATIVE_HUMIDITY_PCT,
  weatherYearOf,
} from './weather/hourly-airflow.ts';
export type { WeatherYearData } from './weather/weather-year-data.ts';
export { weatherYearData, weatherYearFromData } from './weather/weather-year-data.ts';
