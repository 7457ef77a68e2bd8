/**
 * A weather file made into a stored climate from the House section, in chromium. The file is
 * a year generated here whose degree days follow by hand (days alternating 5 °C and 30 °C:
 * 183 × 24 HDD65 and 182 × 21 CDD65); the home then uses the stored climate, as the store
 * says. Sources: axe-core's default rule set; the W3C CSP `securitypolicyviolation` event.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';
import { getHome, listHomes } from '../../db/repositories/homes.ts';
import { climates } from '../../db/repositories/reusable-sets.ts';
import { tmy3Year } from '../_lib/weather-files.ts';
import { axeViolations } from './_lib/axe.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-weather-');
}, SETUP_TIMEOUT_MS);

afterAll(() => rig.close());

describe('a climate from a weather file', { timeout: TEST_TIMEOUT_MS }, () => {
  it('is stored and used by the home, with the degree days the file holds', async () => {
    // The demo home whose plan does the most energy work, so every step has savings to set
    // beside degree days.
    const home = rig.project.store.read(
      (read) =>
        listHomes(read)
          .filter((row) => row.isDemo)
          .map((row) => ({
            row,
            steps: evaluateStoredHome(read, row.id).evaluation.plan.package.measureIds.length,
          }))
          .sort((a, b) => b.steps - a.steps)[0]?.row,
    );
    if (!home) throw new Error('no demo home');
    const path = join(SCREENSHOTS, '..', 'generated-weather.csv');
    writeFileSync(
      path,
      tmy3Year((day) => (day % 2 === 0 ? 5 : 30)),
    );
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/house`);
    await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
    await page.getByLabel('Or make one from a weather file (EPW or TMY3 CSV)').setInputFiles(path);
    await page
      .getByRole('status')
      .filter({
        hasText: `${(183 * 24).toLocaleString('en-US')} HDD and ${(182 * 21).toLocaleString('en-US')} CDD`,
      })
      .waitFor();
    const stored = rig.project.store.read((read) => climates.list(read));
    const made = stored.find((entry) => entry.name === 'TEST, GENERATED, ZZ');
    expect(made?.data.hdd65F).toBe(183 * 24);
    expect(rig.project.store.read((read) => getHome(read, home.id)).climateId).toBe(made?.id);
    expect(await axeViolations(page)).toEqual([]);

    // Worked hour by hour at a balance point of 60 °F: days at 5 °C (41 °F) give 19 degrees
    // each hour, days at 30 °C none, so 183 × 19 heating degree days (hand computation).
    await page.getByLabel('The plan works the year').selectOption('hourly');
    const balance = page.getByLabel('Heating balance point');
    await balance.fill('60');
    await balance.press('Enter');
    await expect
      .poll(() => rig.project.store.read((read) => getHome(read, home.id)).data.hourlyWeather)
      .toEqual({ heatingBalancePointF: 60 });
    await page.screenshot({ path: join(SCREENSHOTS, 'house-hourly.png'), fullPage: true });

    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/plan`);
    const panel = page.getByRole('region', { name: 'Weather the plan works on' });
    await panel.getByText(`${(8760).toLocaleString('en-US')} hours of`).waitFor();
    await panel.getByText(`${(183 * 19).toLocaleString('en-US')} and`).waitFor();
    await panel.getByRole('table').waitFor();
    await panel.getByRole('heading', { name: 'Why they differ' }).waitFor();
    await panel.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'plan-hourly.png') });
    expect(await panel.getByRole('row').count()).toBeGreaterThan(2);
    expect(await axeViolations(page)).toEqual([]);

    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/proposal`);
    await page.getByText('Worked hour by hour through 8,760 hours of weather').waitFor();
    expect(watched.problems).toEqual([]);
    expect(watched.cspViolations).toEqual([]);
    await watched.context.close();
  });
});
