/**
 * Editing a home's description and its blower-door tests in chromium: climate, equipment and
 * prices saved field by field (in SI too), a stored climate chosen and left again, a new
 * climate that waits for its required figures, a multipoint test entered and its fit shown
 * before it is saved, a test deleted and brought back, and the session's undo by button and
 * by Ctrl+Z. Every check reads the project's store, or the core's own fit of the readings.
 *
 * Sources: NIST SP 811 (2008), appendix B, for the unit factors (1 ft = 0.3048 m exactly; a
 * difference of 1 °F is 5/9 K); axe-core's default rules (WCAG 2.x A and AA); WCAG 2.2 SC 2.1.1
 * Keyboard and 3.3.1 Error Identification (from memory).
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fitMultipointTest } from '../../core/leakage.ts';
import { formatNumber } from '../../core/format.ts';
import type { HomeData } from '../../core/schema.ts';
import { getHome, listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { listLeakageTests } from '../../db/repositories/leakage-tests.ts';
import { callChannel } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;
let demoHomes: HomeSummary[];
let storedClimateId: number;

function storedData(homeId: number): HomeData {
  return rig.project.store.read((read) => getHome(read, homeId)).data;
}

function storedHome(homeId: number) {
  return rig.project.store.read((read) => getHome(read, homeId));
}

/** Opens a section of a home by its address and waits for its heading. */
async function openSection(homeId: number, slug: string, heading: string): Promise<WatchedPage> {
  const watched = await rig.open();
  await watched.page.getByRole('table').first().waitFor();
  await watched.page.evaluate((hash) => (location.hash = hash), `#/homes/${homeId}/${slug}`);
  await watched.page.getByRole('heading', { level: 2, name: heading }).waitFor();
  return watched;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Types into a box and leaves it, as a person would, then waits for the save to report. */
async function typeAndLeave(page: Page, id: string, text: string): Promise<void> {
  const box = page.locator(`#${id}`);
  await box.fill(text);
  await box.press('Tab');
}

async function waitForStored<T>(read: () => T, wanted: (value: T) => boolean): Promise<T> {
  for (let attempt = 0; attempt < 100; attempt++) {
    const value = read();
    if (wanted(value)) return value;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  return read();
}

async function expectNoAxeViolations(page: Page): Promise<void> {
  expect(await axeViolations(page)).toEqual([]);
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-house-tests-');
  demoHomes = rig.project.store.read((read) => listHomes(read)).filter((home) => home.isDemo);
  const saved = callChannel({ store: rig.project.store }, 'climates.save', {
    name: 'Shared test station',
    data: { name: 'Shared test station', hdd65F: 6100, cdd65F: 700, elevationFt: 800 },
  });
  if (!saved.ok) throw new Error(saved.error.message);
  storedClimateId = saved.value.id;
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the House section’s climate, equipment and prices', { timeout: TEST_TIMEOUT_MS }, () => {
  it('saves degree days typed in SI as °F·day, a price and an efficiency typed as a percentage', async () => {
    const home = demoHomes[0];
    if (home === undefined) throw new Error('no demo home');
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await page.getByLabel('SI (m, L/s)').check();
    await expect.poll(() => page.locator('#climate-hdd-unit').textContent()).toBe('K·day');
    await typeAndLeave(page, 'climate-hdd', '3000');
    const climate = await waitForStored(
      () => storedData(home.id).climate,
      (value) => value !== undefined && Math.abs(value.hdd65F - 5400) < 1e-6,
    );
    // 3000 K·day × 9/5 = 5400 °F·day (NIST SP 811: ΔT of 1 K = 1.8 °F).
    expect(climate?.hdd65F).toBeCloseTo(5400, 9);

    await typeAndLeave(page, 'price-naturalGas', '1.61');
    const prices = await waitForStored(
      () => storedData(home.id).prices,
      (value) => value?.naturalGas?.usdPerUnit === 1.61,
    );
    expect(prices?.naturalGas?.usdPerUnit).toBe(1.61);

    await typeAndLeave(page, 'heating-afue', '91');
    const heating = await waitForStored(
      () => storedData(home.id).heating,
      (value) => value !== undefined && Math.abs(value.efficiency - 0.91) < 1e-12,
    );
    expect(heating?.efficiency).toBeCloseTo(0.91, 12);
    await page.getByLabel('IP (ft, cfm)').check();
    await expect.poll(() => page.locator('#climate-hdd').inputValue()).toBe('5400');
    expectHealthy(watched);
    await watched.close();
  });

  it('shows a refusal beside the field, in the units typed, and stores nothing', async () => {
    const home = demoHomes[1];
    if (home === undefined) throw new Error('no second demo home');
    const before = storedData(home.id);
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await page.getByLabel('SI (m, L/s)').check();
    await expect.poll(() => page.locator('#climate-elevation-unit').textContent()).toBe('m');
    await typeAndLeave(page, 'climate-elevation', '6000');
    const error = page.locator('#climate-elevation-error');
    await error.waitFor();
    // The schema's limit is 15,000 ft = 4,572 m (× 0.3048); 6000 m is shown back as typed.
    expect(await error.textContent()).toContain('4,572 m');
    expect(await error.textContent()).toContain('6,000 m');
    expect(await page.locator('#climate-elevation').inputValue()).toBe('6000');
    expect(await page.locator('#climate-elevation').getAttribute('aria-invalid')).toBe('true');
    expect(storedData(home.id)).toEqual(before);
    await expectNoAxeViolations(page);
    await page.screenshot({ path: `${SCREENSHOTS}/house-refusal.png` });
    await page.getByLabel('IP (ft, cfm)').check();
    expectHealthy(watched);
    await watched.close();
  });

  it('uses a stored climate, and makes its figures the home’s own again', async () => {
    const home = demoHomes[2];
    if (home === undefined) throw new Error('no third demo home');
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await page.locator('#climate-source').selectOption(String(storedClimateId));
    await waitForStored(
      () => storedHome(home.id).climateId,
      (id) => id === storedClimateId,
    );
    expect(storedHome(home.id).climateId).toBe(storedClimateId);
    expect(storedHome(home.id).data.climate).toBeUndefined();
    await page.getByText('Shared with other homes').first().waitFor();
    expect(await page.locator('#climate-hdd').count()).toBe(0);

    await page.locator('#climate-source').selectOption('own');
    await waitForStored(
      () => storedHome(home.id).climateId,
      (id) => id === null,
    );
    expect(storedHome(home.id).data.climate).toEqual({
      name: 'Shared test station',
      hdd65F: 6100,
      cdd65F: 700,
      elevationFt: 800,
    });
    await page.locator('#climate-hdd').waitFor();
    expect(await page.locator('#climate-hdd').inputValue()).toBe('6100');
    expectHealthy(watched);
    await watched.close();
  });

  it('lets a new climate wait for its required figures, then saves it whole', async () => {
    const created = callChannel({ store: rig.project.store }, 'homes.create', {
      name: 'Climate-less home',
      data: {
        house: {
          conditionedFloorAreaFt2: 1200,
          conditionedVolumeFt3: 9600,
          stories: 1,
          heightFt: 9,
          bedrooms: 2,
          shelterClass: 3,
          foundation: 'slab',
          yearBuilt: 1987,
        },
      },
    });
    if (!created.ok) throw new Error(created.error.message);
    const homeId = created.value.id;
    const watched = await openSection(homeId, 'house', 'House');
    const { page } = watched;
    await typeAndLeave(page, 'climate-hdd', '4800');
    const status = page.getByRole('status').filter({ hasText: 'Not saved yet' });
    await status.waitFor();
    expect(await status.textContent()).toContain('Cooling degree days');
    expect(storedData(homeId).climate).toBeUndefined();
    await typeAndLeave(page, 'climate-name', 'Hillside gauge');
    await typeAndLeave(page, 'climate-cdd', '1100');
    await typeAndLeave(page, 'climate-elevation', '250');
    const climate = await waitForStored(
      () => storedData(homeId).climate,
      (value) => value !== undefined,
    );
    expect(climate).toEqual({
      name: 'Hillside gauge',
      hdd65F: 4800,
      cdd65F: 1100,
      elevationFt: 250,
    });
    await expectNoAxeViolations(page);
    expectHealthy(watched);
    await watched.close();
  });
});

describe('entering and deleting blower-door tests', { timeout: TEST_TIMEOUT_MS }, () => {
  const READINGS: [number, number][] = [
    [50, 2400],
    [40, 2100],
    [30, 1790],
    [20, 1400],
    [15, 1150],
  ];

  it('shows the fit of the readings before saving, then stores them, by keyboard alone', async () => {
    const home = demoHomes[3];
    if (home === undefined) throw new Error('no fourth demo home');
    const before = rig.project.store.read((read) => listLeakageTests(read, home.id)).length;
    const watched = await openSection(home.id, 'leak-test', 'Leak test');
    const { page } = watched;
    const start = page.getByRole('button', { name: 'Enter a new test' });
    await tabTo(page, start, 80);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
    await page.locator('#reading-0-pa').waitFor();
    await tabTo(page, page.locator('#reading-0-pa'), 20);
    for (const [pa, cfm] of READINGS) {
      await page.keyboard.type(String(pa));
      await page.keyboard.press('Tab');
      await page.keyboard.type(String(cfm));
      await page.keyboard.press('Tab'); // to the row's Remove button
      await page.keyboard.press('Tab'); // to the next row's pressure
    }
    // The core's fit of the same readings is what the preview must show.
    const fit = fitMultipointTest(
      READINGS.map(([pressurePa, flowCfm]) => ({ pressurePa, flowCfm })),
    );
    const preview = page.locator('section[aria-labelledby="test-preview"]');
    await preview.waitFor();
    const previewText = (await preview.textContent()) ?? '';
    expect(previewText).toContain(`${formatNumber(fit.cfm50)} cfm`);
    expect(previewText).toContain(formatNumber(fit.exponentN, 3));
    await expectNoAxeViolations(page);
    await page.screenshot({ path: `${SCREENSHOTS}/leak-test-entry.png`, fullPage: true });

    await tabTo(page, page.getByRole('button', { name: 'Save the test' }), 20);
    await page.keyboard.press('Enter');
    await page.getByRole('status').filter({ hasText: 'saved' }).waitFor();
    const tests = rig.project.store.read((read) => listLeakageTests(read, home.id));
    expect(tests).toHaveLength(before + 1);
    expect(tests.at(-1)?.test.points).toEqual(READINGS.map(([pa, cfm]) => ({ pa, cfm })));
    expect(await page.getByRole('button', { name: /^Undo: Added test-/ }).count()).toBe(1);
    expectHealthy(watched);
    await watched.close();
  });

  it('refuses half-filled readings beside their boxes and saves nothing', async () => {
    const home = demoHomes[4];
    if (home === undefined) throw new Error('no fifth demo home');
    const before = rig.project.store.read((read) => listLeakageTests(read, home.id));
    const watched = await openSection(home.id, 'leak-test', 'Leak test');
    const { page } = watched;
    await page.getByRole('button', { name: 'Enter a new test' }).click();
    await page.locator('#reading-0-pa').fill('50');
    await page.locator('#reading-1-pa').fill('4o');
    await page.locator('#reading-1-flow').fill('1200');
    await page.getByRole('button', { name: 'Save the test' }).click();
    await page.locator('#reading-0-flow-error').waitFor();
    expect(await page.locator('#reading-1-pa-error').textContent()).toContain('digits');
    expect(await page.locator('#reading-1-pa').inputValue()).toBe('4o');
    expect(rig.project.store.read((read) => listLeakageTests(read, home.id))).toEqual(before);
    await expectNoAxeViolations(page);
    expectHealthy(watched);
    await watched.close();
  });

  it('deletes a test after a confirmation, and Undo brings it back', async () => {
    const home = demoHomes[5];
    if (home === undefined) throw new Error('no sixth demo home');
    const before = rig.project.store.read((read) => listLeakageTests(read, home.id));
    const first = before[0];
    if (first === undefined) throw new Error('the demo home has no test');
    const watched = await openSection(home.id, 'leak-test', 'Leak test');
    const { page } = watched;
    await page
      .getByRole('button', { name: /^Delete the test-/ })
      .first()
      .click();
    await page.getByRole('button', { name: 'Delete it' }).click();
    await waitForStored(
      () => rig.project.store.read((read) => listLeakageTests(read, home.id)).length,
      (count) => count === before.length - 1,
    );
    const undo = page.getByRole('button', { name: /^Undo: Deleted test-/ });
    await undo.click();
    const after = await waitForStored(
      () => rig.project.store.read((read) => listLeakageTests(read, home.id)),
      (tests) => tests.length === before.length,
    );
    expect(
      after
        .map((record) => record.test)
        .sort((a, b) => JSON.stringify(a).localeCompare(JSON.stringify(b))),
    ).toEqual(
      before
        .map((record) => record.test)
        .sort((a, b) => JSON.stringify(a).localeCompare(JSON.stringify(b))),
    );
    await page.getByRole('status').filter({ hasText: 'Undone' }).waitFor();
    expectHealthy(watched);
    await watched.close();
  });
});

describe('undo and shortcuts', { timeout: TEST_TIMEOUT_MS }, () => {
  it('takes back the last saved edits with Ctrl+Z, newest first', async () => {
    const home = demoHomes[6];
    if (home === undefined) throw new Error('no seventh demo home');
    const original = storedData(home.id).house;
    if (original === undefined) throw new Error('the demo home has no house');
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await typeAndLeave(page, 'house-bedrooms', String(original.bedrooms + 1));
    await waitForStored(
      () => storedData(home.id).house?.bedrooms,
      (n) => n === original.bedrooms + 1,
    );
    await typeAndLeave(page, 'house-yearBuilt', '1931');
    await waitForStored(
      () => storedData(home.id).house?.yearBuilt,
      (year) => year === 1931,
    );
    await page.getByRole('button', { name: 'Undo: Year built' }).waitFor();

    // Ctrl+Z in a text box is the box's own; outside one it is the session's undo.
    await page.getByRole('heading', { level: 2, name: 'House' }).click();
    await page.keyboard.press('Control+z');
    await waitForStored(
      () => storedData(home.id).house?.yearBuilt,
      (year) => year === original.yearBuilt,
    );
    expect(storedData(home.id).house?.yearBuilt).toBe(original.yearBuilt);
    expect(storedData(home.id).house?.bedrooms).toBe(original.bedrooms + 1);
    await page.getByRole('button', { name: 'Undo: Bedrooms' }).waitFor();
    await page.keyboard.press('Control+z');
    await waitForStored(
      () => storedData(home.id).house?.bedrooms,
      (n) => n === original.bedrooms,
    );
    expect(storedData(home.id).house).toEqual(original);
    expectHealthy(watched);
    await watched.close();
  });

  it('keeps the House editor on what is stored after an undo made from another section', async () => {
    const home = demoHomes[7];
    if (home === undefined) throw new Error('no eighth demo home');
    const original = storedData(home.id).house;
    if (original === undefined) throw new Error('the demo home has no house');
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await typeAndLeave(page, 'house-bedrooms', String(original.bedrooms + 2));
    await waitForStored(
      () => storedData(home.id).house?.bedrooms,
      (n) => n === original.bedrooms + 2,
    );
    // Away to the Plan, the edit undone there, and back: the box shows the stored value, and
    // a later edit of another field does not bring the undone value back.
    await page.keyboard.press('Alt+4');
    await page.getByRole('heading', { level: 2, name: 'Plan' }).waitFor();
    await page.getByRole('button', { name: 'Undo: Bedrooms' }).click();
    await waitForStored(
      () => storedData(home.id).house?.bedrooms,
      (n) => n === original.bedrooms,
    );
    await page.keyboard.press('Alt+1');
    await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
    await expect
      .poll(() => page.locator('#house-bedrooms').inputValue())
      .toBe(String(original.bedrooms));
    await typeAndLeave(page, 'house-yearBuilt', '1949');
    const house = await waitForStored(
      () => storedData(home.id).house,
      (stored) => stored?.yearBuilt === 1949,
    );
    expect(house).toEqual({ ...original, yearBuilt: 1949 });
    expectHealthy(watched);
    await watched.close();
  });

  it('lists the shortcuts in a dialog opened with ? and closed with Esc, and Alt+digit moves', async () => {
    const home = demoHomes[0];
    if (home === undefined) throw new Error('no demo home');
    const watched = await openSection(home.id, 'house', 'House');
    const { page } = watched;
    await page.getByRole('heading', { level: 2, name: 'House' }).click();
    await page.keyboard.press('Shift+?');
    const dialog = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
    await dialog.waitFor();
    expect(await dialog.textContent()).toContain('Undo the open home’s last saved edit');
    await expectNoAxeViolations(page);
    await page.screenshot({ path: `${SCREENSHOTS}/shortcuts.png` });
    await page.keyboard.press('Escape');
    await dialog.waitFor({ state: 'hidden' });

    await page.keyboard.press('Alt+2');
    await page.getByRole('heading', { level: 2, name: 'Leak test' }).waitFor();
    expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/leak-test`);
    await page.keyboard.press('Alt+0');
    await page.getByRole('heading', { level: 1, name: 'Homes' }).waitFor();

    const button = page.getByRole('button', { name: 'Shortcuts' });
    await tabTo(page, button, 40);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
    await dialog.waitFor();
    await page.keyboard.press('Escape');
    expectHealthy(watched);
    await watched.close();
  });
});
