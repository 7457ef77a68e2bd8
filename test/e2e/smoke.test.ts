/**
 * The Homes screen end to end: the built screens served by the browser host (in this
 * process, on a demo project in a temporary folder) and opened in Debian's chromium.
 * Expected homes come from the project's store, never from the screen's own code.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA rules: contrast, names, landmarks,
 * language) as the outside judge of accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard,
 * 2.4.1 Bypass Blocks and 2.4.7 Focus Visible for the keyboard checks (from memory); the
 * W3C Content Security Policy Level 3 `securitypolicyviolation` event for CSP breaches.
 */
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import type { BrowserHost } from '../../electron/serve.ts';
import { axeViolations } from './_lib/axe.ts';
import { openWatchedPage, type WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';
import type { TempProject } from './_lib/temp-project.ts';

/** Chromium takes a few seconds to start on a small machine; building adds more. */

let rig: Rig;
let project: TempProject;
let host: BrowserHost;
let browser: Browser;
let storedHomes: HomeSummary[];
let knownHome: HomeSummary;

function storedSearch(search: string): HomeSummary[] {
  return project.store.read((read) => listHomes(read, { search }));
}

/** The ids of the homes listed on the page, in screen order. */
async function listedIds(watched: WatchedPage): Promise<number[]> {
  const ids = await watched.page
    .getByRole('table')
    .getByRole('button')
    .evaluateAll((buttons) => buttons.map((button) => button.getAttribute('data-home-id')));
  return ids.map(Number);
}

async function openHomesPage(): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  await watched.page.getByRole('table').waitFor();
  return watched;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-');
  ({ project, host, browser } = rig);
  storedHomes = project.store.read((read) => listHomes(read));
  const demo = storedHomes.find((home) => home.isDemo);
  if (demo === undefined) throw new Error('the demo project holds no demo home');
  knownHome = demo;
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Homes screen in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('lists every stored home, with the demo homes marked', async () => {
    const watched = await openHomesPage();
    const { page } = watched;
    expect(storedHomes.length).toBeGreaterThan(1);

    expect(await page.title()).toBe('Homes · Sealwork');
    expect(await page.locator('html').getAttribute('lang')).toBe('en');
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).allTextContents())
      .toEqual(['Homes']);
    expect((await listedIds(watched)).sort((a, b) => a - b)).toEqual(
      storedHomes.map((home) => home.id).sort((a, b) => a - b),
    );
    expect(await page.getByRole('status').textContent()).toContain(`${storedHomes.length} homes`);

    const knownRow = page
      .getByRole('row')
      .filter({ has: page.locator(`[data-home-id="${knownHome.id}"]`) });
    const knownText = (await knownRow.textContent()) ?? '';
    // The whole name appears in the row's heading cell, though the screen sets its parts apart.
    const headerText = (await knownRow.getByRole('rowheader').textContent()) ?? '';
    expect(headerText.replace(/\s+/g, ' ').trim()).toBe(
      `${knownHome.name}${knownHome.isDemo ? 'demo' : ''}`,
    );
    if (knownHome.town !== null) expect(knownText).toContain(knownHome.town);
    if (knownHome.clientName !== null) expect(knownText).toContain(knownHome.clientName);
    if (knownHome.yearBuilt !== null) expect(knownText).toContain(String(knownHome.yearBuilt));
    expect(await knownRow.getByText('demo', { exact: true }).count()).toBe(1);
    expect(await page.getByRole('table').getByText('demo', { exact: true }).count()).toBe(
      storedHomes.filter((home) => home.isDemo).length,
    );

    await page.screenshot({ path: join(SCREENSHOTS, 'homes.png') });
    expectHealthy(watched);
    await watched.close();
  });

  it('narrows the list as a search is typed, and says when nothing matches', async () => {
    const watched = await openHomesPage();
    const { page } = watched;
    const term = knownHome.town ?? knownHome.name.split(' ')[1] ?? knownHome.name;
    const expected = storedSearch(term).map((home) => home.id);
    // The search must really narrow the list, or the check below could not fail.
    expect(expected.length).toBeGreaterThan(0);
    expect(expected.length).toBeLessThan(storedHomes.length);

    const searchBox = page.getByRole('searchbox', { name: 'Search homes' });
    await searchBox.pressSequentially(term, { delay: 15 });
    await expect.poll(() => listedIds(watched)).toEqual(expected);
    expect(await page.getByRole('status').textContent()).toContain(`${expected.length} homes`);

    const nothing = 'qqzx-no-such-home';
    expect(storedSearch(nothing)).toEqual([]);
    await searchBox.fill(nothing);
    await page.getByText(`No homes match “${nothing}”.`).waitFor();
    expect(await page.getByRole('table').count()).toBe(0);

    await page.getByRole('button', { name: 'Clear the search' }).click();
    await expect.poll(() => listedIds(watched).then((ids) => ids.length)).toBe(storedHomes.length);
    expect(await searchBox.inputValue()).toBe('');
    expect(await searchBox.evaluate((box) => box === document.activeElement)).toBe(true);
    expectHealthy(watched);
    await watched.close();
  });

  it('reaches the search box and a home by Tab, with the focus visible', async () => {
    const watched = await openHomesPage();
    const { page } = watched;

    await page.keyboard.press('Tab');
    const skip = page.getByRole('link', { name: 'Skip to main content' });
    expect(await skip.evaluate((link) => link === document.activeElement)).toBe(true);
    const skipBox = await skip.boundingBox();
    expect(skipBox !== null && skipBox.y >= 0 && skipBox.height > 0).toBe(true);

    const searchBox = page.getByRole('searchbox', { name: 'Search homes' });
    let presses = 0;
    while (!(await searchBox.evaluate((box) => box === document.activeElement)) && presses < 10) {
      await page.keyboard.press('Tab');
      presses += 1;
    }
    expect(await searchBox.evaluate((box) => box === document.activeElement)).toBe(true);

    await page.keyboard.press('Tab');
    const focused = await page.evaluate(() => {
      const element = document.activeElement;
      if (!(element instanceof HTMLElement)) return null;
      const style = getComputedStyle(element);
      return {
        homeId: element.getAttribute('data-home-id'),
        inTable: element.closest('table') !== null,
        focusVisible: element.matches(':focus-visible'),
        outlineStyle: style.outlineStyle,
        outlineWidthPx: Number.parseFloat(style.outlineWidth),
      };
    });
    expect(focused).not.toBeNull();
    expect(focused?.inTable).toBe(true);
    expect(Number(focused?.homeId)).toBe((await listedIds(watched))[0]);
    expect(focused?.focusVisible).toBe(true);
    expect(focused?.outlineStyle).not.toBe('none');
    expect(focused?.outlineWidthPx).toBeGreaterThanOrEqual(2);

    // Enter opens the home's details; the button says so.
    await page.keyboard.press('Enter');
    const firstButton = page.getByRole('table').getByRole('button').first();
    expect(await firstButton.getAttribute('aria-expanded')).toBe('true');
    const detailsId = await firstButton.getAttribute('aria-controls');
    expect(detailsId).not.toBeNull();
    expect(await page.locator(`[id="${detailsId}"]`).isVisible()).toBe(true);
    await page.screenshot({ path: join(SCREENSHOTS, 'homes-keyboard.png') });
    expectHealthy(watched);
    await watched.close();
  });

  it('passes axe-core with the list, a home opened, and nothing found', async () => {
    const watched = await openHomesPage();
    const { page } = watched;
    expect(await axeViolations(page)).toEqual([]);

    await page.getByRole('table').getByRole('button').first().click();
    expect(await axeViolations(page)).toEqual([]);

    await page.getByRole('searchbox', { name: 'Search homes' }).fill('qqzx-no-such-home');
    await page.getByRole('button', { name: 'Clear the search' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    expectHealthy(watched);
    await watched.close();
  });

  it('takes the token out of the address bar and keeps it for a reload', async () => {
    const watched = await openHomesPage();
    const { page } = watched;
    expect(new URL(page.url()).hash).toBe('');
    expect(await page.evaluate(() => sessionStorage.getItem('sealwork.token'))).toBe(host.token);

    await page.reload();
    await page.getByRole('table').waitFor();
    expect((await listedIds(watched)).length).toBe(storedHomes.length);
    expectHealthy(watched);
    await watched.close();
  });

  it('says in plain words when the host refuses the page', async () => {
    const watched = await openWatchedPage(browser, `http://127.0.0.1:${host.port}/#token=wrong`);
    const alert = watched.page.getByRole('alert');
    await alert.waitFor();
    const text = (await alert.textContent()) ?? '';
    expect(text).toContain('could not load the homes');
    expect(text).toContain('access key');
    expect(text).not.toMatch(/\b401\b|Unauthorized|undefined|null/);
    // The refused request is the only thing chromium complains of.
    expect(watched.problems.every((problem) => problem.includes('401'))).toBe(true);
    expect(watched.cspViolations).toEqual([]);
    await watched.close();
  });
});
