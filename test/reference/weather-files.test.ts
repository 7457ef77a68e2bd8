/**
 * The weather readers and degree days on two real files kept outside the repository in
 * /work/shared/data/weather/ (see its README): NREL's TMY3 year for Greensboro, NC (station
 * 723170) and a PVGIS EPW year for 45.0 N, 8.0 E. Each check reads the raw line with a plain
 * split, independently of the readers; the degree days are checked against a plain loop over
 * the raw CSV lines that groups hours by their date text, and against the station's
 * published normals (from memory).
 */
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  degreeDays,
  detectAndParseWeather,
  parseEpw,
  parseTmy3,
  type HourlyWeather,
} from '../../core/weather.ts';

const WEATHER_FOLDER = fileURLToPath(new URL('../../../shared/data/weather/', import.meta.url));
const TMY3_PATH = `${WEATHER_FOLDER}723170TYA.CSV`;
const EPW_PATH = `${WEATHER_FOLDER}tmy_45.000_8.000_2005_2023.epw`;
const filesExist = existsSync(TMY3_PATH) && existsSync(EPW_PATH);
if (!filesExist) {
  console.warn(
    `weather-files tests skipped: the shared weather files are not in ${WEATHER_FOLDER}`,
  );
}

function rawLines(path: string): string[] {
  return readFileSync(path, 'utf8').split(/\r?\n/);
}

describe.skipIf(!filesExist)(
  'shared weather files (skipped when ../shared/data/weather is missing beside the project)',
  () => {
    it('finds the shared folder beside the project (shared/data/weather)', () => {
      expect(WEATHER_FOLDER.replace(/\/$/, '')).toMatch(/\/shared\/data\/weather$/);
    });

    describe('Greensboro TMY3 (NREL, station 723170)', () => {
      const lines = rawLines(TMY3_PATH);
      const weather: HourlyWeather = parseTmy3(lines.join('\n'));
      const columns = (lines[1] ?? '').split(',');
      const column = (name: string): number => columns.indexOf(name);

      it('has 8,760 hours and the location of its first line', () => {
        expect(weather.hours).toHaveLength(8760);
        // Line 1 of the file: 723170,"GREENSBORO PIEDMONT TRIAD INT",NC,-5.0,36.100,-79.950,273
        expect(weather.location).toMatchObject({
          name: 'GREENSBORO PIEDMONT TRIAD INT',
          region: 'NC',
          stationId: '723170',
          latitude: 36.1,
          longitude: -79.95,
          timeZoneHours: -5,
          elevationM: 273,
        });
      });

      it.each([3, 1000, 4321, 8762])('line %i reads as the raw fields say', (lineNumber) => {
        const fields = (lines[lineNumber - 1] ?? '').split(',');
        const hour = weather.hours[lineNumber - 3];
        const [month, day] = (fields[0] ?? '').split('/').map(Number);
        expect(hour).toEqual({
          month,
          day,
          hour: Number((fields[1] ?? '').split(':')[0]),
          dryBulbC: Number(fields[column('Dry-bulb (C)')]),
          dewPointC: Number(fields[column('Dew-point (C)')]),
          relativeHumidityPct: Number(fields[column('RHum (%)')]),
          pressurePa: Number(fields[column('Pressure (mbar)')]) * 100,
          windSpeedMs: Number(fields[column('Wspd (m/s)')]),
        });
      });

      /** HDD65/CDD65 by a plain loop: group hours by the date text, mean °F per date. */
      function independentDegreeDays(baseF: number): { hdd: number; cdd: number; days: number } {
        const sums = new Map<string, { sumF: number; count: number }>();
        const dryBulb = column('Dry-bulb (C)');
        for (const line of lines.slice(2)) {
          if (line.trim() === '') continue;
          const fields = line.split(',');
          const date = fields[0] ?? '';
          const entry = sums.get(date) ?? { sumF: 0, count: 0 };
          entry.sumF += (Number(fields[dryBulb]) * 9) / 5 + 32;
          entry.count += 1;
          sums.set(date, entry);
        }
        let hdd = 0;
        let cdd = 0;
        for (const { sumF, count } of sums.values()) {
          const meanF = sumF / count;
          hdd += Math.max(0, baseF - meanF);
          cdd += Math.max(0, meanF - baseF);
        }
        return { hdd, cdd, days: sums.size };
      }

      it.each([65, 60, 55])(
        'daily-mean HDD and CDD at base %i °F match a plain loop over the raw lines',
        (baseF) => {
          const expected = independentDegreeDays(baseF);
          expect(expected.days).toBe(365);
          const result = degreeDays(weather, { baseF });
          expect(result.heatingDegreeDaysF).toBeCloseTo(expected.hdd, 6);
          expect(result.coolingDegreeDaysF).toBeCloseTo(expected.cdd, 6);
        },
      );

      it('HDD65 and CDD65 are near the station normals (from memory; generous tolerance)', () => {
        // From memory, not checked: NOAA's 30-year normals for Greensboro (GSO) are about
        // 3,400–3,600 HDD65 and 1,400–1,600 CDD65. A typical year is built from months of
        // different years, so it is only expected near them: within 15 % of the band's ends
        // (this TMY3 year gives about 3,876 and 1,306). It still catches a °C/°F slip: °C·day
        // would be 5/9 of these.
        const result = degreeDays(weather, { baseF: 65 });
        expect(result.heatingDegreeDaysF).toBeGreaterThan(3400 * 0.85);
        expect(result.heatingDegreeDaysF).toBeLessThan(3600 * 1.15);
        expect(result.coolingDegreeDaysF).toBeGreaterThan(1400 * 0.85);
        expect(result.coolingDegreeDaysF).toBeLessThan(1600 * 1.15);
      });

      it('is recognised as TMY3 by its content', () => {
        expect(detectAndParseWeather(lines.join('\n'), 'greensboro.txt')).toEqual(weather);
      });
    });

    describe('PVGIS EPW (45.0 N, 8.0 E)', () => {
      const lines = rawLines(EPW_PATH);
      const weather = parseEpw(lines.join('\r\n'));

      it('has 8,760 hours and the location of its LOCATION line', () => {
        expect(weather.hours).toHaveLength(8760);
        // Line 1: LOCATION,unknown,-,unknown,ECMWF/ERA,unknown,45.000000,8.000000,1,250
        expect(weather.location).toMatchObject({
          name: 'unknown',
          region: '-',
          country: 'unknown',
          source: 'ECMWF/ERA',
          latitude: 45,
          longitude: 8,
          timeZoneHours: 1,
          elevationM: 250,
        });
      });

      it.each([9, 2000, 5555, 8768])('line %i reads as the raw fields say', (lineNumber) => {
        const fields = (lines[lineNumber - 1] ?? '').split(',').map(Number);
        expect(weather.hours[lineNumber - 9]).toEqual({
          month: fields[1],
          day: fields[2],
          hour: fields[3],
          dryBulbC: fields[6],
          dewPointC: fields[7],
          relativeHumidityPct: fields[8],
          pressurePa: fields[9],
          windSpeedMs: fields[21],
        });
      });

      it('is recognised as EPW by its content', () => {
        expect(detectAndParseWeather(lines.join('\n'))).toEqual(weather);
      });
    });
  },
);
