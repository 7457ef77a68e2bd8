/**
 * A home's job end to end, in Debian's chromium against the browser host on a demo project in
 * a temporary folder: the user's name saved in Settings and filled in as "By", a home's job
 * moved audited → scoped → approved in its Job panel, a move back refused without a reason (the
 * store's words beside the reason box, nothing written), then taken with one; the history with
 * its dates, names and reason; the Homes list filtered by the stage; the Portfolio's homes by
 * job stage. Every expected value is read here from the store (db/repositories/jobs.ts
 * jobHistory, listHomes) or written here by hand (the dates typed, as a calendar names them).
 *
 * The rule the store applies (forward one stage at a time or skipping "scoped", back only with
 * a reason) is common practice of weatherization programs as core/job-status.ts states it.
 * Sources for the page checks: axe-core's default rule set (WCAG 2.x A and AA); WCAG 2.2
 * success criteria 2.1.1 Keyboard, 2.4.7 Focus Visible, 3.3.1 Error Identification and 1.4.10
 * Reflow (from memory); the W3C Content Security Policy Level 3 `securitypolicyviolation`
 * event. The name typed is invented for the test.
 */
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getHome, listHomes } from '../../db/repositories/homes.ts';
import { changeJobStatus, jobHistory } from '../../db/repositories/jobs.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import { axeViolations } from './_lib/axe.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import { VIEWPORT, type WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;

const NAME = 'Ines Varga-Holloway';

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-job-status-');
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Follows a link of the top navigation by keyboard. */
async function goTo(page: Page, name: 'Homes' | 'Settings' | 'Portfolio'): Promise<void> {
  const link = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name });
  await tabTo(page, link, 80);
  expect(await focusRingShown(page), `focus ring on ${name}`).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 1, name }).waitFor();
}

/** Presses a control reached by Tab, after checking its focus ring shows. */
async function press(page: Page, target: Locator): Promise<void> {
  await tabTo(page, target, 80);
  expect(await focusRingShown(page), 'focus ring').toBe(true);
  await page.keyboard.press('Enter');
}

/** Chooses an option of a select reached by Tab. */
async function choose(page: Page, select: Locator, value: string): Promise<void> {
  await tabTo(page, select, 80);
  expect(await focusRingShown(page), 'focus ring on the select').toBe(true);
  await select.selectOption(value);
}

/** Replaces a box's text by keyboard. */
async function typeInto(page: Page, box: Locator, text: string): Promise<void> {
  await tabTo(page, box, 80);
  await page.keyboard.press('ControlOrMeta+A');
  if (text === '') await page.keyboard.press('Backspace');
  else await page.keyboard.type(text);
}

/** The store's history of a home's job, in the fields the screen shows. */
function storedEntries(homeId: number) {
  return rig.project.store
    .read((read) => jobHistory(read, homeId))
    .entries.map(({ status, at, by, reason }) => ({ status, at, by, reason: reason ?? null }));
}

describe('a home’s job in chromium', { timeout: TEST_TIMEOUT_MS * 2 }, () => {
  it('moves the job on, refuses going back without a reason, and keeps the history', async () => {
    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('heading', { level: 1, name: 'Homes' }).waitFor();

    // The user's name, saved in Settings, is who "By" starts as.
    await goTo(page, 'Settings');
    await typeInto(page, page.getByLabel('Your name (for job changes)'), NAME);
    await page.keyboard.press('Tab');
    await expect
      .poll(() => rig.project.store.read((read) => getSettings(read)).userName)
      .toBe(NAME);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'settings-your-name.png') });

    await goTo(page, 'Homes');
    const home = rig.project.store.read((read) => listHomes(read))[0];
    if (home === undefined) throw new Error('the demo project has no home');
    expect(home.jobStatus).toBe('audited');
    await press(page, page.locator(`button[data-home-id="${home.id}"]`));
    const title = home.name.split(': ')[0] ?? home.name;
    const panel = page.getByRole('region', { name: `Job of ${title}` });
    await panel.getByText('no change recorded yet').waitFor();

    const moveTo = panel.getByLabel('Move to');
    const date = panel.getByLabel('Date');
    const reason = panel.getByLabel(/^Reason/);
    const submit = panel.getByRole('button', { name: 'Move the job' });
    const outcome = panel.getByRole('status');
    expect(await panel.getByLabel('By').inputValue()).toBe(NAME);
    // From audited the next stage is offered first; "in progress" is not offered (no approval).
    expect(await moveTo.inputValue()).toBe('scoped');
    const offered = await moveTo
      .locator('option')
      .evaluateAll((options) => options.map((option) => (option as HTMLOptionElement).value));
    expect(offered).not.toContain('inProgress');
    expect(offered).toContain('approved');

    // audited → scoped → approved, each dated as typed (the date box by its ISO value).
    await date.fill('2026-03-02');
    await press(page, submit);
    await expect.poll(() => outcome.textContent()).toContain('The job is now scoped.');
    await choose(page, moveTo, 'approved');
    await date.fill('2026-03-05');
    await press(page, submit);
    await expect.poll(() => outcome.textContent()).toContain('The job is now approved.');
    expect(storedEntries(home.id).map((entry) => entry.status)).toEqual(['scoped', 'approved']);

    // Back to scoped without a reason: the store refuses, its words beside the reason box.
    await choose(page, moveTo, 'scoped');
    await date.fill('2026-03-06');
    await press(page, submit);
    const reasonError = panel.locator('[id$="-job-reason-error"]');
    await reasonError.waitFor();
    expect(await reasonError.textContent()).toMatch(/reason.*going back from “?"?Approved/i);
    expect(await reason.getAttribute('aria-invalid')).toBe('true');
    expect(await reason.evaluate((box) => box === document.activeElement)).toBe(true);
    expect(storedEntries(home.id)).toHaveLength(2);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'job-back-refused.png'), fullPage: true });

    // With a reason it goes through.
    await page.keyboard.type('Client asked to re-scope the attic work');
    await press(page, submit);
    await expect.poll(() => outcome.textContent()).toContain('The job is now scoped.');
    expect(await reasonError.count()).toBe(0);

    // The store holds the three changes as typed, and the table shows them newest first.
    const entries = storedEntries(home.id);
    expect(entries).toEqual([
      { status: 'scoped', at: '2026-03-02', by: NAME, reason: null },
      { status: 'approved', at: '2026-03-05', by: NAME, reason: null },
      {
        status: 'scoped',
        at: '2026-03-06',
        by: NAME,
        reason: 'Client asked to re-scope the attic work',
      },
    ]);
    const table = panel.getByRole('table', { name: /^Changes to the job of/ });
    const rows = await table
      .locator('tbody tr')
      .evaluateAll((trs) =>
        trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? '')),
      );
    // The dates as a calendar names them (en-US, medium), written out by hand.
    expect(rows).toEqual([
      ['Mar 6, 2026', 'Scoped', NAME, 'Client asked to re-scope the attic work'],
      ['Mar 5, 2026', 'Approved', NAME, '—'],
      ['Mar 2, 2026', 'Scoped', NAME, '—'],
    ]);
    expect(await panel.locator('[id$="-job-standing"]').textContent()).toMatch(
      new RegExp(`Scoped, since Mar 6, 2026,\\s+by ${NAME}`),
    );
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'job-history.png'), fullPage: true });
    // A half-typed move outlasts the row being closed and opened again.
    await choose(page, moveTo, 'onHold');
    await typeInto(page, reason, 'Waiting on the roofer');
    const row = page.locator(`button[data-home-id="${home.id}"]`);
    await press(page, row);
    await panel.waitFor({ state: 'detached' });
    await press(page, row);
    await panel.getByText(/since Mar 6, 2026/).waitFor();
    expect(await moveTo.inputValue()).toBe('onHold');
    expect(await reason.inputValue()).toBe('Waiting on the roofer');
    expect(storedEntries(home.id)).toHaveLength(3);
    await typeInto(page, reason, '');
    await choose(page, moveTo, 'approved');

    // At 1024 × 768 nothing of the panel runs past the window (WCAG 1.4.10 Reflow, from memory).
    await page.setViewportSize({ width: 1024, height: 768 });
    const widths = await page.evaluate(() => ({
      page: document.documentElement.scrollWidth,
      window: window.innerWidth,
    }));
    expect(widths.page).toBeLessThanOrEqual(widths.window);
    await page.screenshot({ path: join(SCREENSHOTS, 'job-history-1024.png'), fullPage: true });
    await page.setViewportSize(VIEWPORT);

    // The Homes list by stage: the store's own filter says which homes are scoped.
    const scoped = rig.project.store
      .read((read) => listHomes(read, { jobStatus: 'scoped' }))
      .map((entry) => entry.id);
    expect(scoped).toEqual([home.id]);
    await press(page, page.getByRole('button', { name: 'Filter and sort' }));
    await choose(page, page.getByLabel('Job', { exact: true }), 'scoped');
    const listed = () =>
      page
        .locator('button[data-home-id]')
        .evaluateAll((buttons) =>
          buttons.map((button) => Number(button.getAttribute('data-home-id'))),
        );
    await expect.poll(listed).toEqual(scoped);
    expect(await page.locator('#homes-filter-summary').textContent()).toContain(
      'whose job is scoped',
    );
    const offeredFilters = await page
      .getByLabel('Job', { exact: true })
      .locator('option')
      .evaluateAll((options) => options.map((option) => (option as HTMLOptionElement).value));
    expect(offeredFilters).toEqual([
      '',
      'audited',
      'scoped',
      'approved',
      'inProgress',
      'testedOut',
      'closed',
      'onHold',
      'declined',
    ]);

    // The Portfolio counts the project's homes by stage as the store holds them.
    await goTo(page, 'Portfolio');
    const jobTable = page.locator('#portfolio-jobs-table');
    await jobTable.waitFor();
    const all = rig.project.store.read((read) => listHomes(read));
    for (const status of ['audited', 'scoped', 'approved', 'onHold']) {
      const count = all.filter((entry) => entry.jobStatus === status).length;
      expect(await jobTable.locator(`tr[data-status="${status}"] td`).textContent(), status).toBe(
        String(count),
      );
    }
    expect(await jobTable.locator('tfoot td').textContent()).toBe(String(all.length));
    expect(await axeViolations(page)).toEqual([]);
    const jobPanel = page.locator('section[aria-labelledby="portfolio-jobs"]');
    await jobPanel.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'portfolio-job-stages.png') });
    expectHealthy(watched);
    await watched.close();
  });

  it('undoes an edit made before the job moved on, leaving the job where it stands', async () => {
    const home = rig.project.store.read((read) => listHomes(read))[1];
    if (home === undefined) throw new Error('the demo project has too few homes');
    const bedrooms = () =>
      rig.project.store.read((read) => getHome(read, home.id)).data.house?.bedrooms;
    const original = bedrooms();
    if (original === undefined) throw new Error('the demo home has no bedrooms');
    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('heading', { level: 1, name: 'Homes' }).waitFor();
    await page.evaluate((hash) => (location.hash = hash), `#/homes/${home.id}/house`);
    await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
    const box = page.locator('#house-bedrooms');
    await box.fill(String(original + 1));
    await box.press('Tab');
    await expect.poll(bedrooms).toBe(original + 1);

    // The job moves on elsewhere (another window, the work order) after the edit was saved.
    rig.project.store.write((write) =>
      changeJobStatus(write, home.id, { to: 'scoped', at: '2026-03-02', by: NAME }),
    );
    await press(page, page.getByRole('button', { name: 'Undo: Bedrooms' }));
    await expect.poll(bedrooms).toBe(original);
    expect(await page.getByText('could not be undone').count()).toBe(0);
    expect(rig.project.store.read((read) => getHome(read, home.id)).jobStatus).toBe('scoped');
    expectHealthy(watched);
    await watched.close();
  });
});
