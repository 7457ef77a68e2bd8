/**
 * The Library and Settings screens end to end: the stored settings shown and saved as edited,
 * a refused value shown beside its box; every measure type of the library listed with its
 * source marks, an edit stored and taken back. Each check is made against the project's
 * store (the repositories and the channels, beside the page), never against the screen's code.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard and 3.3.1 Error Identification for
 * the keyboard and refusal checks (from memory); the W3C Content Security Policy Level 3
 * `securitypolicyviolation` event for CSP breaches.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MeasureType } from '../../core/measure-library/types.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import { callChannel } from '../../electron/channels.ts';
import type { BrowserHost } from '../../electron/serve.ts';
import { axeViolations } from './_lib/axe.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import { openWatchedPage, type WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';
import type { TempProject } from './_lib/temp-project.ts';

let rig: Rig;
let project: TempProject;
let host: BrowserHost;
let browser: Browser;

function libraryList(): { types: MeasureType[]; editedIds: string[] } {
  const reply = callChannel({ store: project.store }, 'library.list', {});
  if (!reply.ok) throw new Error(`the library was not listed: ${reply.error.message}`);
  return reply.value;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Opens the app on the Homes list and follows a link of the top navigation by keyboard. */
async function openByKeyboard(name: 'Library' | 'Settings'): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  const { page } = watched;
  await page.getByRole('heading', { level: 1, name: 'Homes' }).waitFor();
  const link = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name });
  await tabTo(page, link);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 1, name }).waitFor();
  expect(new URL(page.url()).hash).toBe(`#/${name.toLowerCase()}`);
  return watched;
}

/** Replaces a box's text by keyboard and leaves it with Tab, which saves it. */
async function typeAndLeave(page: Page, selector: string, text: string): Promise<void> {
  await tabTo(page, page.locator(selector), 80);
  await page.keyboard.press('ControlOrMeta+A');
  await page.keyboard.type(text);
  await page.keyboard.press('Tab');
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-library-settings-');
  ({ project, host, browser } = rig);
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Settings screen in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the stored settings and saves a changed discount rate', async () => {
    const watched = await openByKeyboard('Settings');
    const { page } = watched;
    const before = project.store.read((read) => getSettings(read));
    await page.locator('#setting-discountRateReal').waitFor();
    expect(await page.locator('#setting-units').inputValue()).toBe(before.units);
    expect(await page.locator('#setting-ranking').inputValue()).toBe(before.ranking);
    // The rate is stored as a fraction and shown as a percent: 0.03 is "3".
    expect(Number(await page.locator('#setting-discountRateReal').inputValue())).toBeCloseTo(
      before.discountRateReal * 100,
      9,
    );
    expect(Number(await page.locator('#setting-laborRateUsdPerHour').inputValue())).toBe(
      before.laborRateUsdPerHour,
    );
    expect(Number(await page.locator('#setting-markupFraction').inputValue())).toBeCloseTo(
      before.markupFraction * 100,
      9,
    );
    expect(await page.locator('#setting-electricityKgCo2PerKwh').inputValue()).toBe(
      before.electricityKgCo2PerKwh === null ? '' : String(before.electricityKgCo2PerKwh),
    );
    expect(await axeViolations(page)).toEqual([]);

    await typeAndLeave(page, '#setting-discountRateReal', '4.5');
    await page.getByRole('status').filter({ hasText: 'Saved: real discount rate' }).waitFor();
    expect(project.store.read((read) => getSettings(read)).discountRateReal).toBeCloseTo(0.045, 12);
    await page.screenshot({ path: join(SCREENSHOTS, 'settings.png'), fullPage: true });
    expectHealthy(watched);
    await watched.close();
  });

  it('refuses a 50 % discount rate beside the box and stores nothing', async () => {
    const watched = await openByKeyboard('Settings');
    const { page } = watched;
    await page.locator('#setting-discountRateReal').waitFor();
    const before = project.store.read((read) => getSettings(read));
    await typeAndLeave(page, '#setting-discountRateReal', '50');
    const error = page.locator('#setting-discountRateReal-error');
    await error.waitFor();
    // The store's own bound (db/repositories/settings.ts) is a real rate of at most 0.2.
    expect(await error.textContent()).toMatch(/at most 20 %/);
    expect(await page.locator('#setting-discountRateReal').getAttribute('aria-invalid')).toBe(
      'true',
    );
    expect(await page.locator('#setting-discountRateReal').inputValue()).toBe('50');
    expect(project.store.read((read) => getSettings(read))).toEqual(before);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'settings-refused.png'), fullPage: true });
    // Away to the Library and back: the refused figure is still in its box, with its reason.
    await page
      .getByRole('navigation', { name: 'Screens' })
      .getByRole('link', { name: 'Library' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Library' }).waitFor();
    await page
      .getByRole('navigation', { name: 'Screens' })
      .getByRole('link', { name: 'Settings' })
      .click();
    await page.locator('#setting-discountRateReal').waitFor();
    expect(await page.locator('#setting-discountRateReal').inputValue()).toBe('50');
    expect(await page.locator('#setting-discountRateReal').getAttribute('aria-invalid')).toBe(
      'true',
    );
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the Library screen in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('lists every type of the library with its name and source marks', async () => {
    const watched = await openByKeyboard('Library');
    const { page } = watched;
    const { types } = libraryList();
    expect(types.length).toBeGreaterThan(0);
    const cards = page.locator('article[data-type-id]');
    await cards.first().waitFor();
    expect(await cards.evaluateAll((all) => all.map((card) => card.dataset.typeId))).toEqual(
      types.map((type) => type.id),
    );
    for (const type of types) {
      const card = page.locator(`article[data-type-id="${type.id}"]`);
      expect(await card.locator('h3').textContent()).toBe(type.name);
      const marks = await card.locator('.mark').allTextContents();
      expect(marks).toEqual([
        type.sources.life.mark,
        type.sources.leakageArea.mark,
        type.sources.effectiveness.mark,
        type.sources.cost.mark,
      ]);
    }
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'library.png'), fullPage: false });
    expectHealthy(watched);
    await watched.close();
  });

  it('stores an edit of a type’s life and takes it back to the shipped value', async () => {
    const watched = await openByKeyboard('Library');
    const { page } = watched;
    const listed = libraryList();
    const first = listed.types.find((type) => !listed.editedIds.includes(type.id));
    if (first === undefined) throw new Error('the library has no unedited type');
    const shippedLife = first.defaultLifeYears;
    const newLife = shippedLife + 5;
    const card = page.locator(`article[data-type-id="${first.id}"]`);
    await tabTo(page, card.getByRole('button', { name: /^Edit figures/ }), 80);
    await page.keyboard.press('Enter');
    const lifeBox = page.locator(`#edit-${first.id}-life`);
    await lifeBox.waitFor();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type(String(newLife));
    await page.locator(`#edit-${first.id}-note`).fill('Field data of our own crews.');
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'library-edit-form.png') });
    await card.getByRole('button', { name: 'Save the edit' }).click();
    await card.locator('.edited').waitFor();

    const afterEdit = libraryList();
    expect(afterEdit.editedIds).toContain(first.id);
    const edited = afterEdit.types.find((type) => type.id === first.id);
    expect(edited?.defaultLifeYears).toBe(newLife);
    expect(edited?.sources.life.mark).toBe('user edit');
    // Figures left alone keep their sources.
    expect(edited?.sources.leakageArea).toEqual(first.sources.leakageArea);
    const lifeRow = card.locator('[data-figure="life"]');
    expect(await lifeRow.locator('.mark').textContent()).toBe('user edit');
    expect(await lifeRow.locator('.shipped').textContent()).toContain(`${shippedLife} years`);
    expect(await axeViolations(page)).toEqual([]);
    await card.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'library-edited.png') });

    await tabTo(page, card.getByRole('button', { name: /^Back to the shipped values/ }), 80);
    await page.keyboard.press('Enter');
    const keep = card.getByRole('button', { name: 'Keep the edit' });
    await keep.waitFor();
    // The confirmation step: nothing is reset until it is confirmed.
    expect(libraryList().editedIds).toContain(first.id);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'library-reset-confirm.png') });
    await card.getByRole('button', { name: 'Yes, go back' }).click();
    await card.locator('.edited').waitFor({ state: 'detached' });

    const afterReset = libraryList();
    expect(afterReset.editedIds).not.toContain(first.id);
    const restored = afterReset.types.find((type) => type.id === first.id);
    expect(restored?.defaultLifeYears).toBe(shippedLife);
    expect(restored?.sources.life).toEqual(first.sources.life);
    expect(await lifeRow.locator('.mark').textContent()).toBe(first.sources.life.mark);
    expectHealthy(watched);
    await watched.close();
  });
  it('refuses an effectiveness above 100 % beside its box and stores nothing', async () => {
    const watched = await openByKeyboard('Library');
    const { page } = watched;
    const listed = libraryList();
    const type = listed.types.find((candidate) => !listed.editedIds.includes(candidate.id));
    if (type === undefined) throw new Error('the library has no unedited type');
    const card = page.locator(`article[data-type-id="${type.id}"]`);
    await tabTo(page, card.getByRole('button', { name: /^Edit figures/ }), 80);
    await page.keyboard.press('Enter');
    const box = page.locator(`#edit-${type.id}-effHigh`);
    await box.fill('150');
    await page.locator(`#edit-${type.id}-note`).fill('A typing slip.');
    await card.getByRole('button', { name: 'Save the edit' }).click();
    const error = page.locator(`#edit-${type.id}-effHigh-error`);
    await error.waitFor();
    // The store's own bound (core/measure-library/edits.ts): effectiveness is a fraction of 0..1.
    expect(await error.textContent()).toMatch(/at most 100 %/);
    expect(await box.getAttribute('aria-invalid')).toBe('true');
    expect(libraryList()).toEqual(listed);
    expect(await axeViolations(page)).toEqual([]);
    expectHealthy(watched);
    await watched.close();
  });
});
