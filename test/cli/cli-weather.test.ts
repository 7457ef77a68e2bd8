/**
 * `sealwork weather FILE [--base-f F] [--json]` on the shared TMY3 file (NREL TMY3, station
 * 723170 Greensboro; ../shared/data/weather/README.md). Independent check: HDD and CDD by the
 * daily-mean definition from a plain loop over the file's raw lines here (each date's 24
 * dry-bulbs averaged, °F = °C·9/5 + 32), and the elevation as the header's 273 m in feet
 * (0.3048 m/ft, NIST SP 811). Skipped, saying why, where the shared folder is absent.
 */
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../_lib/cli-harness.ts';

const TMY3 = fileURLToPath(new URL('../../../shared/data/weather/723170TYA.CSV', import.meta.url));
const present = existsSync(TMY3);

function degreeDaysByHand(baseF: number): { hdd: number; cdd: number } {
  const [, header = '', ...rows] = readFileSync(TMY3, 'utf8').trimEnd().split(/\r?\n/);
  const column = header.split(',').indexOf('Dry-bulb (C)');
  const byDate = new Map<string, number[]>();
  for (const row of rows) {
    const cells = row.split(',');
    const date = cells[0] ?? '';
    byDate.set(date, [...(byDate.get(date) ?? []), Number(cells[column])]);
  }
  let hdd = 0;
  let cdd = 0;
  for (const values of byDate.values()) {
    const meanF = (values.reduce((sum, c) => sum + c, 0) / values.length) * 1.8 + 32;
    hdd += Math.max(0, baseF - meanF);
    cdd += Math.max(0, meanF - baseF);
  }
  return { hdd, cdd };
}

describe.skipIf(!present)(
  `sealwork weather on ${present ? 'the shared TMY3 file' : 'the shared TMY3 file (absent here: ../shared/data/weather is missing)'}`,
  () => {
    it('gives the place, hours and degree days the file holds, at 65 °F and at 60 °F', async () => {
      for (const baseF of [65, 60]) {
        const run = await runCli(['weather', TMY3, '--base-f', String(baseF), '--json']);
        expect(run.exitCode).toBe(0);
        const json = JSON.parse(run.stdout) as {
          hours: number;
          elevationFt: number;
          hddF: number;
          cddF: number;
          monthly: { hddF: number; cddF: number }[];
          location: { latitude: number; longitude: number };
        };
        const hand = degreeDaysByHand(baseF);
        expect(json.hours).toBe(8760);
        expect(json.elevationFt).toBeCloseTo(273 / 0.3048, 1);
        expect(json.location).toMatchObject({ latitude: 36.1, longitude: -79.95 });
        expect(json.hddF).toBeCloseTo(hand.hdd, 0);
        expect(json.cddF).toBeCloseTo(hand.cdd, 0);
        expect(json.monthly).toHaveLength(12);
        expect(json.monthly.reduce((sum, month) => sum + month.hddF, 0)).toBeCloseTo(json.hddF, 0);
      }
    });

    it('refuses a file that is no weather file, and a base out of range', async () => {
      const notWeather = await runCli([
        'weather',
        fileURLToPath(new URL('../../README.md', import.meta.url)),
      ]);
      expect(notWeather.exitCode).toBe(2);
      expect(notWeather.stderr).toContain('neither EPW');
      const badBase = await runCli(['weather', TMY3, '--base-f', 'warm']);
      expect(badBase.exitCode).toBe(2);
      expect(badBase.stderr).toContain('--base-f expects a temperature');
    });
  },
);
