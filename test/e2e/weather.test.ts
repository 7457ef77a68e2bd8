/**
 * A weather file made into a stored climate from the House section, in chromium. The file is
 * a year generated here whose degree days follow by hand (days alternating 5 °C and 30 °C:
 * 183 × 24 HDD65 and 182 × 21 CDD65); the home then uses the stored climate, as the store
 * says. Sources: axe-core's default rule set; the W3C CSP `securitypolicyviolation` event.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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
    const home = rig.project.store.read((read) => listHomes(read)).find((row) => row.isDemo);
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
    expect(watched.problems).toEqual([]);
    expect(watched.cspViolations).toEqual([]);
    await watched.context.close();
  });
});
