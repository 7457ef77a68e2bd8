/**
 * A home's Measures section end to end: the stored measures listed, one added from the
 * library by keyboard, refusals shown beside their boxes, and a status change that moves a
 * measure out of the package. Each check is made against the project's store and the core's
 * evaluation (through the channels, beside the page), never against the screen's code.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard, 2.4.7 Focus Visible and 3.3.1
 * Error Identification for the keyboard and refusal checks (from memory); the W3C Content
 * Security Policy Level 3 `securitypolicyviolation` event for CSP breaches.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatUsd } from '../../core/format.ts';
import type { MeasureType } from '../../core/measure-library/types.ts';
import type { EvaluationReport } from '../../core/report.ts';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { listMeasures, type MeasureRecord } from '../../db/repositories/measures.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import { callChannel } from '../../electron/channels.ts';
import { startBrowserHost, type BrowserHost } from '../../electron/serve.ts';
import { axeViolations } from './_lib/axe.ts';
import { launchChromium } from './_lib/browser.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import { openWatchedPage, type WatchedPage } from './_lib/page-watch.ts';
import { openTempProject, type TempProject } from './_lib/temp-project.ts';
import { ensureUiBuilt, REPO_ROOT } from './_lib/ui-build.ts';

const SCREENSHOTS = join(REPO_ROOT, 'test-output', 'screenshots');
const SETUP_TIMEOUT_MS = 180_000;
const TEST_TIMEOUT_MS = 60_000;

let project: TempProject;
let host: BrowserHost;
let browser: Browser;
let home: HomeSummary;
let library: MeasureType[];

function evaluated(homeId: number): EvaluationReport {
  const reply = callChannel({ store: project.store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(`demo home ${homeId} was not evaluated: ${reply.error.message}`);
  return reply.value;
}

function stored(): MeasureRecord[] {
  return project.store.read((read) => listMeasures(read, home.id));
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Opens the home's workspace from the Homes list by keyboard, then its Measures section. */
async function openMeasuresByKeyboard(): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  const { page } = watched;
  await page.getByRole('table').waitFor();
  await tabTo(page, page.locator(`[data-home-id="${home.id}"]`), 80);
  await page.keyboard.press('Enter');
  await tabTo(page, page.getByRole('link', { name: /^Open / }), 3);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
  const link = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', {
    name: 'Measures',
  });
  await tabTo(page, link);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'Measures' }).waitFor();
  await page.locator('#add-type option').first().waitFor({ state: 'attached' });
  return watched;
}

/** Replaces a box's text by keyboard: focus it with Tab, select all, type. */
async function typeInto(page: Page, selector: string, text: string): Promise<void> {
  await tabTo(page, page.locator(selector), 80);
  await page.keyboard.press('ControlOrMeta+A');
  await page.keyboard.type(text);
}

beforeAll(async () => {
  const uiRoot = ensureUiBuilt();
  project = openTempProject('sealwork-e2e-measures-');
  const demoHomes = project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  // A home with a package of two or more, so declining one leaves a package to compare.
  const found = demoHomes.find(
    (row) => evaluated(row.id).measures.filter((measure) => measure.included).length >= 2,
  );
  if (found === undefined) throw new Error('no demo home of the kind these checks need');
  home = found;
  const reply = callChannel({ store: project.store }, 'library.list', {});
  if (!reply.ok) throw new Error(`the library was not listed: ${reply.error.message}`);
  library = reply.value.types;
  host = await startBrowserHost({ context: { store: project.store }, uiRoot });
  browser = await launchChromium();
  mkdirSync(SCREENSHOTS, { recursive: true });
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await browser?.close();
  await host?.close();
  project?.close();
}, SETUP_TIMEOUT_MS);

describe('the Measures section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('lists the stored measures in order, with type names and the core’s cost totals', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/measures`);
    const records = stored();
    expect(records.length).toBeGreaterThan(0);
    const rows = page.locator('#measures-list tr[data-measure-id]');
    await rows.first().waitFor();
    expect(await rows.evaluateAll((all) => all.map((row) => row.dataset.measureId))).toEqual(
      [...records].sort((a, b) => a.position - b.position).map((record) => record.measure.id),
    );
    const report = evaluated(home.id);
    for (const record of records) {
      const row = page.locator(`#measures-list tr[data-measure-id="${record.measure.id}"]`);
      const name = library.find((type) => type.id === record.measure.type)?.name;
      expect(name, `library type of ${record.measure.id}`).toBeDefined();
      expect(await row.locator('.name').textContent()).toBe(name);
      const reported = report.measures.find((measure) => measure.id === record.measure.id);
      expect(reported).toBeDefined();
      expect(await row.locator('dd.total').textContent()).toBe(
        formatUsd(reported?.costUsd ?? Number.NaN, { cents: true }),
      );
    }
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-measures.png'), fullPage: true });
    expectHealthy(watched);
    await watched.page.close();
  });

  it('refuses a negative labour figure and an empty id beside the box, storing nothing', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const before = stored().length;
    await typeInto(page, '#add-hours', '-1');
    await page.keyboard.press('Enter');
    const hoursError = page.locator('#add-hours-error');
    await hoursError.waitFor();
    // The store's own rule (core/schema.ts): labour hours are at least 0.
    expect(await hoursError.textContent()).toMatch(/at least 0/);
    expect(await page.locator('#add-hours').getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('#add-hours').inputValue()).toBe('-1');
    expect(stored().length).toBe(before);

    await typeInto(page, '#add-hours', '1');
    await typeInto(page, '#add-id', '');
    await page.keyboard.press('Backspace');
    await page.keyboard.press('Enter');
    await page.locator('#add-id-error').waitFor();
    expect(await page.locator('#add-id-error').textContent()).toMatch(/at least 1 character/);
    expect(await page.locator('#add-hours-error').count()).toBe(0);
    expect(stored().length).toBe(before);
    expect(await axeViolations(page)).toEqual([]);
    expectHealthy(watched);
    await watched.page.close();
  });

  it('adds a measure from the library by keyboard; the store and the Plan then hold it', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const before = stored();
    await tabTo(page, page.locator('#add-type'), 80);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('ArrowDown');
    const typeId = await page.locator('#add-type').inputValue();
    const type = library.find((entry) => entry.id === typeId);
    if (type === undefined) throw new Error(`the select offered ${typeId}, not in the library`);
    const newId = await page.locator('#add-id').inputValue();
    expect(before.map((record) => record.measure.id)).not.toContain(newId);
    await typeInto(page, '#add-units', '3');
    await page.keyboard.press('Enter');
    await page
      .getByRole('status')
      .filter({ hasText: `Added ${newId}` })
      .waitFor();

    const after = stored();
    expect(after.length).toBe(before.length + 1);
    const added = after.find((record) => record.measure.id === newId);
    if (added === undefined) throw new Error(`${newId} was not stored`);
    const settings = project.store.read((read) => getSettings(read));
    expect(added.measure.type).toBe(typeId);
    expect(added.measure.byUnits?.units).toBe(3);
    // The library's demo defaults × the quantity, to the cent (common practice for money).
    expect(added.measure.cost.materialsUsd).toBeCloseTo(
      type.defaultCost.materialsUsdPerUnit * 3,
      2,
    );
    expect(added.measure.cost.laborHours).toBeCloseTo(type.defaultCost.laborHoursPerUnit * 3, 2);
    expect(added.measure.cost.laborRateUsdPerHour).toBe(settings.laborRateUsdPerHour);
    expect(added.measure.cost.markupFraction).toBeCloseTo(settings.markupFraction, 6);
    await page.locator(`#measures-list tr[data-measure-id="${newId}"]`).waitFor();

    const plan = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', {
      name: 'Plan',
    });
    await tabTo(page, plan, 80);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 2, name: 'Plan' }).waitFor();
    await page.locator(`tr[data-measure-id="${newId}"]`).waitFor();
    expectHealthy(watched);
    await watched.page.close();
  });

  it('marks a packaged measure declined, and the report leaves it out', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const inPackage = evaluated(home.id).measures.find((measure) => measure.included);
    if (inPackage === undefined) throw new Error('the home has no package');
    const record = stored().find((entry) => entry.measure.id === inPackage.id);
    if (record === undefined) throw new Error(`${inPackage.id} is not stored`);
    const status = page.locator(`#measure-${record.id}-status`);
    await tabTo(page, status, 120);
    await page.keyboard.press('ArrowDown');
    await page.keyboard.press('ArrowDown');
    await page
      .getByRole('status')
      .filter({ hasText: `${inPackage.id} is now declined` })
      .waitFor();
    expect(stored().find((entry) => entry.id === record.id)?.measure.status).toBe('declined');
    const report = evaluated(home.id);
    const declined = report.measures.find((measure) => measure.id === inPackage.id);
    expect(declined?.included).toBe(false);
    expect(declined?.status).toBe('declined');

    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/plan`);
    await page.getByRole('heading', { level: 2, name: 'Plan' }).waitFor();
    const row = page.locator(`tr[data-measure-id="${inPackage.id}"]`);
    await row.waitFor();
    expect(await row.textContent()).toContain('Left out: declined');
    expectHealthy(watched);
    await watched.page.close();
  });

  it('deletes a measure only after the confirmation, by keyboard', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const records = stored();
    const last = records.at(-1);
    if (last === undefined) throw new Error('no measure to delete');
    await tabTo(page, page.locator(`#measure-${last.id}-delete`), 150);
    await page.keyboard.press('Enter');
    await page.locator(`#measure-${last.id}-keep`).waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.keyboard.press('Escape');
    await page.locator(`#measure-${last.id}-delete`).waitFor();
    expect(stored().length).toBe(records.length);
    await page.keyboard.press('Enter');
    await page.keyboard.press('Shift+Tab');
    await page.keyboard.press('Enter');
    await page
      .getByRole('status')
      .filter({ hasText: `Deleted ${last.measure.id}` })
      .waitFor();
    expect(stored().map((record) => record.id)).not.toContain(last.id);
    expect(await page.locator(`tr[data-measure-id="${last.measure.id}"]`).count()).toBe(0);
    expectHealthy(watched);
    await watched.page.close();
  });
});
