/**
 * `sealwork weather FILE [--base-f 65] [--json]`: an hourly weather file (EPW or TMY3 CSV,
 * told apart by content) read and summed up: where it is, how many hours, heating and cooling
 * degree days at the base by the daily-mean definition, month by month, the heating season's
 * mean ΔT and wind below the base, and the design temperatures. Reads the file only.
 */
import { METERS_PER_FOOT } from '../core/constants.ts';
import { formatNumber } from '../core/format.ts';
import {
  degreeDays,
  designTemperatures,
  detectAndParseWeather,
  heatingSeasonConditions,
} from '../core/weather.ts';
import { EXIT_OK, readTextFile, UsageError, type CliOutput, type Parsed } from './cli-commands.ts';

const MONTHS = 'Jan Feb Mar Apr May Jun Jul Aug Sep Oct Nov Dec'.split(' ');

/** Runs `weather`. */
export async function runWeather(parsed: Parsed, output: CliOutput): Promise<number> {
  const [path, ...extra] = parsed.positionals;
  if (path === undefined || extra.length > 0) throw new UsageError('weather takes FILE');
  const baseText = parsed.weather.baseF ?? '65';
  const baseF = Number(baseText);
  if (!/^-?\d+(\.\d+)?$/.test(baseText) || baseF < -40 || baseF > 100) {
    throw new UsageError(`--base-f expects a temperature from -40 to 100 °F, got "${baseText}"`);
  }
  const weather = detectAndParseWeather(await readTextFile(path), path);
  const days = degreeDays(weather, { baseF });
  const season = heatingSeasonConditions(weather, { baseF });
  const design = designTemperatures(weather);
  const { location } = weather;
  const elevationFt = location.elevationM / METERS_PER_FOOT;
  const json = {
    location: {
      name: location.name,
      ...(location.region ? { region: location.region } : {}),
      ...(location.country ? { country: location.country } : {}),
      latitude: location.latitude,
      longitude: location.longitude,
      timeZoneHours: location.timeZoneHours,
    },
    elevationFt: Math.round(elevationFt * 10) / 10,
    hours: weather.hours.length,
    baseF,
    hddF: Math.round(days.heatingDegreeDaysF * 10) / 10,
    cddF: Math.round(days.coolingDegreeDaysF * 10) / 10,
    monthly: days.monthly.map((month) => ({
      month: month.month,
      hddF: Math.round(month.heatingDegreeDaysF * 10) / 10,
      cddF: Math.round(month.coolingDegreeDaysF * 10) / 10,
    })),
    heatingSeason: season,
    designTemperaturesF: {
      heating99: design.heating99.temperatureF,
      heating996: design.heating996.temperatureF,
      cooling1: design.cooling1.temperatureF,
      cooling04: design.cooling04.temperatureF,
    },
  };
  if (parsed.json) {
    output.out(JSON.stringify(json, null, 2));
    return EXIT_OK;
  }
  const place = [location.name, location.region, location.country].filter(Boolean).join(', ');
  output.out(
    [
      `${place}: ${formatNumber(location.latitude, 3)}°, ${formatNumber(location.longitude, 3)}°, ` +
        `${formatNumber(elevationFt)} ft; ${formatNumber(json.hours)} hours`,
      `Base ${formatNumber(baseF, 1)} °F (daily means): ${formatNumber(json.hddF)} HDD, ${formatNumber(json.cddF)} CDD`,
      `  ${json.monthly.map((month) => `${MONTHS[month.month - 1]} ${formatNumber(month.hddF)}/${formatNumber(month.cddF)}`).join('  ')}`,
      `Below the base: ${formatNumber(season.hoursBelowBase)} hours, mean ΔT ` +
        `${season.meanDeltaTF === null ? '—' : `${formatNumber(season.meanDeltaTF, 1)} °F`} to 68 °F indoors, mean wind ` +
        `${season.meanWindSpeedMph === null ? '—' : `${formatNumber(season.meanWindSpeedMph, 1)} mph`}`,
      `Design: heating 99 % ${formatNumber(design.heating99.temperatureF, 1)} °F, cooling 1 % ${formatNumber(design.cooling1.temperatureF, 1)} °F`,
    ].join('\n'),
  );
  return EXIT_OK;
}
