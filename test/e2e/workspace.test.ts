/**
 * A home's workspace end to end: a demo home opened from the Homes list by keyboard, then
 * each finished section checked against what the project's store holds and what the core
 * computes from it, never against the screen's own code.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard, 2.4.7 Focus Visible and 3.3.1
 * Error Identification for the keyboard and refusal checks (from memory); the W3C Content
 * Security Policy Level 3 `securitypolicyviolation` event for CSP breaches.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ach50, fitMultipointTest, onePointTest, type LeakageFit } from '../../core/leakage.ts';
import type { OtherLeakageTest } from '../../core/schema.ts';
import { planTestOf } from '../../db/home-file.ts';
import { getHome, listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { listLeakageTests, type LeakageTestRecord } from '../../db/repositories/leakage-tests.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import type { BrowserHost } from '../../electron/serve.ts';
import { axeViolations } from './_lib/axe.ts';
import { paintedPixels } from './_lib/drawn.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import { openWatchedPage, type WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';
import type { TempProject } from './_lib/temp-project.ts';

let rig: Rig;
let project: TempProject;
let host: BrowserHost;
let browser: Browser;
let demoHome: HomeSummary;
let allHomes: HomeSummary[];

function storedTests(homeId: number): LeakageTestRecord[] {
  return project.store.read((read) => listLeakageTests(read, homeId));
}

/** The core's power law of a stored test (the readings fitted, or the one point). */
function coreFit(test: OtherLeakageTest): LeakageFit {
  if (test.points !== undefined) {
    return fitMultipointTest(test.points.map((p) => ({ pressurePa: p.pa, flowCfm: p.cfm })));
  }
  if (test.cfm50 === undefined) throw new Error('a stored test with neither readings nor CFM50');
  return onePointTest(test.cfm50, test.exponentN);
}

/** A demo home whose plan's test-in (by the store's rule) fits `wanted`. */
function homeWhere(wanted: (planTest: LeakageTestRecord, tests: LeakageTestRecord[]) => boolean) {
  const found = allHomes.find((home) => {
    const tests = storedTests(home.id);
    const planTest = planTestOf(tests);
    return planTest !== undefined && wanted(planTest, tests);
  });
  if (found === undefined) throw new Error('no demo home of the kind this check needs');
  return found;
}

/** Opens the page at a place of the screens (the token first, as the host prints it). */
async function openAt(hash: string, heading: string): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  await watched.page.getByRole('table').waitFor();
  await watched.page.evaluate((place) => (location.hash = place), hash);
  await watched.page.getByRole('heading', { level: 2, name: heading }).waitFor();
  return watched;
}

/** The number a figure of a list shows, by its term ("CFM50" → 4632 from "4,632 cfm"). */
async function figureValue(page: Page, scope: string, term: string): Promise<number> {
  const value = page.locator(`${scope} dt`, { hasText: new RegExp(`^${term}$`) }).locator('+ dd');
  const text = (await value.textContent()) ?? '';
  const match = /-?[\d,]+(\.\d+)?/.exec(text);
  if (match === null) throw new Error(`no number in "${text}" for ${term}`);
  return Number(match[0].replace(/,/g, ''));
}

function storedHouse(homeId: number) {
  const house = project.store.read((read) => getHome(read, homeId)).data.house;
  if (house === undefined) throw new Error(`demo home ${homeId} has no house`);
  return house;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** The text of the page's first heading, spaces folded. */
async function h1Text(page: Page): Promise<string> {
  return ((await page.getByRole('heading', { level: 1 }).textContent()) ?? '')
    .replace(/\s+/g, ' ')
    .trim();
}

/** Opens the Homes list and, by keyboard only, the workspace of `home` (its House section). */
async function openByKeyboard(home: HomeSummary): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  const { page } = watched;
  await page.getByRole('table').waitFor();
  await tabTo(page, page.locator(`[data-home-id="${home.id}"]`));
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  const open = page.getByRole('link', { name: /^Open / });
  await tabTo(page, open, 3);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
  return watched;
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-workspace-');
  ({ project, host, browser } = rig);
  allHomes = project.store.read((read) => listHomes(read)).filter((home) => home.isDemo);
  const demo = allHomes[0];
  if (demo === undefined) throw new Error('the demo project holds no demo home');
  demoHome = demo;
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the House section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('opens a demo home by keyboard and shows the stored house', async () => {
    const watched = await openByKeyboard(demoHome);
    const { page } = watched;
    const house = storedHouse(demoHome.id);

    expect(new URL(page.url()).hash).toBe(`#/homes/${demoHome.id}/house`);
    expect(demoHome.name.startsWith(await h1Text(page))).toBe(true);
    expect(await page.getByLabel('Floor area').inputValue()).toBe(
      String(house.conditionedFloorAreaFt2),
    );
    expect(await page.getByLabel('Volume').inputValue()).toBe(String(house.conditionedVolumeFt3));
    expect(await page.getByLabel('Year built').inputValue()).toBe(String(house.yearBuilt));
    // The unit beside the box is part of the box's description.
    const floorDescribedBy = await page.getByLabel('Floor area').getAttribute('aria-describedby');
    expect(await page.locator(`[id="${floorDescribedBy}"]`).textContent()).toBe('ft²');
    const nav = page.getByRole('navigation', { name: 'Screens' });
    expect(await nav.getByRole('link', { name: 'House' }).getAttribute('aria-current')).toBe(
      'page',
    );

    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-house.png'), fullPage: true });

    // A reload keeps the place.
    await page.reload();
    await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
    expect(await page.getByLabel('Floor area').inputValue()).toBe(
      String(house.conditionedFloorAreaFt2),
    );
    expectHealthy(watched);
    await watched.close();
  });

  it('saves an edit of bedrooms, and refuses -1 in plain words without saving or losing it', async () => {
    const watched = await openByKeyboard(demoHome);
    const { page } = watched;
    const before = storedHouse(demoHome.id);
    const bedrooms = page.getByLabel('Bedrooms');
    const status = page.getByRole('status').filter({ hasText: /saved|Saving/i });

    const wanted = before.bedrooms + 1;
    await bedrooms.fill(String(wanted));
    await page.keyboard.press('Tab');
    await expect.poll(() => page.getByText('Saved: bedrooms.').count()).toBe(1);
    expect(storedHouse(demoHome.id)).toEqual({ ...before, bedrooms: wanted });

    // Back one box, to bedrooms again, by keyboard.
    await page.keyboard.press('Shift+Tab');
    expect(await bedrooms.evaluate((element) => element === document.activeElement)).toBe(true);
    await bedrooms.fill('-1');
    await page.keyboard.press('Enter');
    const error = page.locator('#house-bedrooms-error');
    await error.waitFor();
    const errorText = (await error.textContent()) ?? '';
    // Bedrooms are 0 or more (the house schema): the message says so and names the value.
    expect(errorText).toContain('Not saved');
    expect(errorText).toContain('at least 0');
    expect(errorText).toContain('-1');
    expect(errorText).not.toMatch(/home\.data|undefined|null|invalid_/);
    expect(await status.textContent()).toContain('Not saved: bedrooms');
    expect(await bedrooms.getAttribute('aria-invalid')).toBe('true');
    expect(await bedrooms.inputValue()).toBe('-1');
    expect(storedHouse(demoHome.id).bedrooms).toBe(wanted);

    // Words are refused before they reach the store, in words too.
    await bedrooms.fill('three');
    await page.keyboard.press('Tab');
    await expect.poll(() => error.textContent()).toMatch(/enter a number/i);
    expect(storedHouse(demoHome.id).bedrooms).toBe(wanted);

    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({
      path: join(SCREENSHOTS, 'workspace-house-refused.png'),
      fullPage: true,
    });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the Leak test section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the plan test-in of a one-point home as the core computes it', async () => {
    const home = homeWhere((planTest) => planTest.test.points === undefined);
    const planTest = planTestOf(storedTests(home.id));
    const house = storedHouse(home.id);
    if (planTest === undefined) throw new Error('unreachable');
    const fit = coreFit(planTest.test);

    const watched = await openAt(`#/homes/${home.id}/leak-test`, 'Leak test');
    const { page } = watched;
    // Rounded for display: CFM50 to the cfm, ACH50 to a tenth (the command line's precision).
    expect(
      Math.abs((await figureValue(page, '#test-in + dl', 'CFM50')) - fit.cfm50),
    ).toBeLessThanOrEqual(0.5);
    expect(
      Math.abs(
        (await figureValue(page, '#test-in + dl', 'ACH50')) -
          ach50(fit.cfm50, house.conditionedVolumeFt3),
      ),
    ).toBeLessThanOrEqual(0.05);
    expect(await page.locator('section[aria-labelledby="test-in"] canvas').count()).toBe(0);
    expect(await page.getByRole('table').first().getByRole('row').count()).toBe(
      storedTests(home.id).length + 1,
    );
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({
      path: join(SCREENSHOTS, 'workspace-leak-test-one-point.png'),
      fullPage: true,
    });
    expectHealthy(watched);
    await watched.close();
  });

  it('draws a multipoint test-in on log-log axes, with its readings as a table', async () => {
    const home = homeWhere(
      (planTest, tests) =>
        planTest.test.points !== undefined &&
        tests.some((record) => record.test.kind === 'testOut'),
    );
    const planTest = planTestOf(storedTests(home.id));
    if (planTest?.test.points === undefined) throw new Error('unreachable');
    const points = planTest.test.points;
    const fit = coreFit(planTest.test);
    const house = storedHouse(home.id);

    const watched = await openAt(`#/homes/${home.id}/leak-test`, 'Leak test');
    const { page } = watched;
    const testIn = page.locator('section[aria-labelledby="test-in"]');
    expect(
      Math.abs((await figureValue(page, '#test-in + dl', 'CFM50')) - fit.cfm50),
    ).toBeLessThanOrEqual(0.5);
    expect(
      Math.abs(
        (await figureValue(page, '#test-in + dl', 'ACH50')) -
          ach50(fit.cfm50, house.conditionedVolumeFt3),
      ),
    ).toBeLessThanOrEqual(0.05);
    expect(
      Math.abs((await figureValue(page, '#test-in + dl', 'n, flow exponent')) - fit.exponentN),
    ).toBeLessThanOrEqual(0.0005);

    await expect
      .poll(() => paintedPixels(page, 'section[aria-labelledby="test-in"] canvas'))
      .toBeGreaterThan(2000);
    const readings = testIn.getByRole('table');
    expect(await readings.locator('tbody tr').count()).toBe(points.length);
    expect(await readings.locator('tbody tr').first().locator('td').first().textContent()).toBe(
      `${points[0]?.pa.toFixed(1)} Pa`,
    );
    expect(await testIn.getByRole('img').getAttribute('aria-describedby')).toBe(
      await readings.getAttribute('id'),
    );

    // The test-out stands beside the test-in, not under it.
    const inBox = await testIn.boundingBox();
    const outBox = await page.locator('section[aria-labelledby="test-out"]').boundingBox();
    expect(inBox !== null && outBox !== null && outBox.x > inBox.x + inBox.width - 1).toBe(true);
    expect(Math.abs((inBox?.y ?? 0) - (outBox?.y ?? 1000))).toBeLessThan(2);

    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-leak-test.png'), fullPage: true });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the workspace at laptop sizes', { timeout: TEST_TIMEOUT_MS }, () => {
  it('moves between sections by keyboard and fits 1024×768 and 1280×800 without sideways scrolling', async () => {
    const home = homeWhere(
      (planTest, tests) =>
        planTest.test.points !== undefined &&
        tests.some((record) => record.test.kind === 'testOut'),
    );
    const watched = await openAt(`#/homes/${home.id}/house`, 'House');
    const { page } = watched;
    const nav = page.getByRole('navigation', { name: 'Screens' });
    for (const [name, slug] of [
      ['Leak test', 'leak-test'],
      ['House', 'house'],
    ] as const) {
      const link = nav.getByRole('link', { name });
      await tabTo(page, link);
      expect(await focusRingShown(page)).toBe(true);
      await page.keyboard.press('Enter');
      await page.getByRole('heading', { level: 2, name }).waitFor();
      expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/${slug}`);
      expect(await link.getAttribute('aria-current')).toBe('page');
    }

    for (const viewport of [
      { width: 1024, height: 768 },
      { width: 1280, height: 800 },
    ]) {
      await page.setViewportSize(viewport);
      for (const [name, slug] of [
        ['House', 'house'],
        ['Leak test', 'leak-test'],
      ] as const) {
        await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/${slug}`);
        await page.getByRole('heading', { level: 2, name }).waitFor();
        const overflowPx = await page.evaluate(
          () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
        );
        expect(overflowPx, `${name} at ${viewport.width}×${viewport.height}`).toBeLessThanOrEqual(
          0,
        );
        if (viewport.width === 1024) {
          await page.screenshot({
            path: join(SCREENSHOTS, `workspace-${slug}-1024.png`),
            fullPage: true,
          });
        }
      }
    }
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the IP/SI switch', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the house in SI units from the project settings, and back in IP', async () => {
    const watched = await openAt(`#/homes/${demoHome.id}/house`, 'House');
    const { page } = watched;
    const house = storedHouse(demoHome.id);
    await page.getByRole('radio', { name: /^SI/ }).check();
    const floorArea = page.getByLabel('Floor area');
    // 1 ft = 0.3048 m exactly, so 1 ft² = 0.09290304 m² (NIST SP 811, appendix B).
    const expectedM2 = Math.round(house.conditionedFloorAreaFt2 * 0.09290304 * 100) / 100;
    await expect.poll(() => floorArea.inputValue()).toBe(String(expectedM2));
    expect(await page.locator('#house-conditionedFloorAreaFt2-unit').textContent()).toBe('m²');
    expect(project.store.read((read) => getSettings(read)).units).toBe('SI');
    expect(await axeViolations(page)).toEqual([]);

    await page.getByRole('radio', { name: /^IP/ }).check();
    await expect.poll(() => floorArea.inputValue()).toBe(String(house.conditionedFloorAreaFt2));
    expect(project.store.read((read) => getSettings(read)).units).toBe('IP');
    expectHealthy(watched);
    await watched.close();
  });
});
