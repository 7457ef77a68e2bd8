/**
 * A home's Plan and Safety sections end to end: a demo home opened by keyboard, then each
 * section checked against the evaluation the project's own channel returns for the stored
 * home (computed here, beside the page), never against the screen's code.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 1.4.1 Use of Color, 2.1.1 Keyboard and 2.4.7
 * Focus Visible for the severity marks and the keyboard path (from memory); the W3C Content
 * Security Policy Level 3 `securitypolicyviolation` event for CSP breaches.
 */
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatUsd, formatYears } from '../../core/format.ts';
import type { EvaluationReport } from '../../core/report.ts';
import { getHome, listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { callChannel } from '../../electron/channels.ts';
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
let home: HomeSummary;
let report: EvaluationReport;

function evaluated(homeId: number): EvaluationReport {
  const reply = callChannel({ store: project.store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(`demo home ${homeId} was not evaluated: ${reply.error.message}`);
  return reply.value;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** The text of a figure of a list, by its term, spaces folded. */
async function figureText(page: Page, scope: string, term: string): Promise<string> {
  const value = page.locator(`${scope} dt`, { hasText: new RegExp(`^${term}$`) }).locator('+ dd');
  return ((await value.textContent()) ?? '').replace(/\s+/g, ' ').trim();
}

/** Opens the Homes list and, by keyboard only, the home's workspace, then a section of it. */
async function openSectionByKeyboard(name: 'Plan' | 'Safety'): Promise<WatchedPage> {
  const watched = await openWatchedPage(browser, host.url);
  const { page } = watched;
  await page.getByRole('table').waitFor();
  await tabTo(page, page.locator(`[data-home-id="${home.id}"]`), 80);
  await page.keyboard.press('Enter');
  await tabTo(page, page.getByRole('link', { name: /^Open / }), 3);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
  const link = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name });
  await tabTo(page, link);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name }).waitFor();
  expect(await link.getAttribute('aria-current')).toBe('page');
  return watched;
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-plan-safety-');
  ({ project, host, browser } = rig);
  const demoHomes = project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  // A home whose plan shows every kind of row: a package of two or more, a measure below
  // SIR 1, and cautions to list.
  const found = demoHomes.find((row) => {
    const candidate = evaluated(row.id);
    return (
      candidate.measures.filter((measure) => measure.included).length >= 2 &&
      candidate.measures.some((measure) => measure.sirBelowOne) &&
      candidate.cautions.length > 0
    );
  });
  if (found === undefined) throw new Error('no demo home of the kind these checks need');
  home = found;
  report = evaluated(found.id);
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Plan section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the evaluation’s ranked measures, package and chart', async () => {
    const watched = await openSectionByKeyboard('Plan');
    const { page } = watched;
    expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/plan`);
    const rows = page.locator('tr[data-measure-id]');
    await rows.first().waitFor();

    // The report lists the package in rank order, then the measures left out.
    expect(await rows.evaluateAll((all) => all.map((row) => row.dataset.measureId))).toEqual(
      report.measures.map((measure) => measure.id),
    );
    expect(await figureText(page, '#package-heading ~ dl', 'Cost')).toBe(
      formatUsd(report.package.costUsd, { cents: true }),
    );
    for (const measure of report.measures.filter((entry) => entry.sirBelowOne)) {
      const row = page.locator(`tr[data-measure-id="${measure.id}"]`);
      expect(await row.locator('td.sir').textContent()).toContain('below 1');
    }
    // Each row's payback and cost of saved energy, as the report gives them (core/format.ts).
    for (const measure of report.measures) {
      const text = (await page.locator(`tr[data-measure-id="${measure.id}"]`).textContent()) ?? '';
      expect(text).toContain(formatYears(measure.simplePaybackYears));
      expect(text).toContain(
        measure.cceUsdPerMMBtu === null ? '—' : formatUsd(measure.cceUsdPerMMBtu, { cents: true }),
      );
    }
    for (const measure of report.measures.filter((entry) => !entry.included)) {
      const row = page.locator(`tr[data-measure-id="${measure.id}"]`);
      expect(await row.textContent()).toContain('Left out');
    }
    expect(await page.locator('table caption').first().textContent()).toContain('Ranked by');

    // The chart's text twin: one row before any work, then one per measure of the package,
    // its last cost the sum of the package's measures' costs.
    const included = report.measures.filter((measure) => measure.included);
    const totals = page.locator('#savings-table tbody tr');
    expect(await totals.count()).toBe(included.length + 1);
    const sumCostUsd = included.reduce((sum, measure) => sum + measure.costUsd, 0);
    expect(await totals.last().locator('td').first().textContent()).toBe(formatUsd(sumCostUsd));
    await expect
      .poll(() => paintedPixels(page, 'section[aria-labelledby="savings-heading"] canvas'))
      .toBeGreaterThan(2000);

    const overflowPx = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflowPx).toBeLessThanOrEqual(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-plan.png'), fullPage: true });

    // A small laptop: the table and the chart still fit without sideways scrolling.
    await page.setViewportSize({ width: 1024, height: 768 });
    await expect
      .poll(() =>
        page.evaluate(
          () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
        ),
      )
      .toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-plan-1024.png'), fullPage: true });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the working behind a measure’s figures', { timeout: TEST_TIMEOUT_MS }, () => {
  it('opens by keyboard under the measure’s row, line by line as the plan.explain channel gives them', async () => {
    const first = report.measures.find((measure) => measure.included);
    if (first === undefined) throw new Error('the demo home has no measure in its package');
    const traced = callChannel({ store: project.store }, 'plan.explain', {
      homeId: home.id,
      measureId: first.id,
    });
    if (!traced.ok) throw new Error(traced.error.message);
    const watched = await openSectionByKeyboard('Plan');
    const { page } = watched;
    const how = page.getByRole('button', { name: `How the figures of ${first.id} are worked out` });
    await tabTo(page, how, 80);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
    const working = page.locator(`#working-${first.id}`);
    await working
      .getByRole('heading', { name: `How the figures of ${first.id} are worked out` })
      .waitFor();
    expect(await how.getAttribute('aria-expanded')).toBe('true');
    // Every line of the channel's trace, in its order, each with its formula.
    const shownLabels = await working.locator('ol.lines > li .label').allTextContents();
    expect(shownLabels.map((text) => text.trim())).toEqual(
      traced.value.lines.map((line) => line.label),
    );
    const text = (await working.textContent()) ?? '';
    for (const line of traced.value.lines) expect(text).toContain(line.formula);
    // The money lines end on the plan's own figures for the measure (core/report.ts).
    expect(text).toContain(formatUsd(first.npvUsd, { cents: true }));
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: `${SCREENSHOTS}/plan-working.png` });
    await page.keyboard.press('Enter');
    await working.waitFor({ state: 'detached' });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('a health-and-safety measure', { timeout: TEST_TIMEOUT_MS }, () => {
  it('is marked in words in the Plan table', async () => {
    const demoHomes = project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
    const withHealth = demoHomes
      .map((row) => ({ row, evaluation: evaluated(row.id) }))
      .find(({ evaluation }) => evaluation.measures.some((measure) => measure.healthAndSafety));
    if (withHealth === undefined) throw new Error('no demo home with a health-and-safety measure');
    const watched = await openWatchedPage(browser, host.url);
    const { page } = watched;
    await page.getByRole('table').waitFor();
    await page.evaluate((place) => (location.hash = place), `#/homes/${withHealth.row.id}/plan`);
    await page.locator('tr[data-measure-id]').first().waitFor();
    for (const measure of withHealth.evaluation.measures) {
      const text = (await page.locator(`tr[data-measure-id="${measure.id}"]`).textContent()) ?? '';
      expect(text.includes('Health and safety'), measure.id).toBe(measure.healthAndSafety);
    }
    expect(await axeViolations(page)).toEqual([]);
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the Safety section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('lists every caution of the evaluation, in its order, with its severity in words', async () => {
    const watched = await openSectionByKeyboard('Safety');
    const { page } = watched;
    expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/safety`);
    const items = page.locator('li[data-caution-code]');
    await items.first().waitFor();

    expect(await items.evaluateAll((all) => all.map((item) => item.dataset.cautionCode))).toEqual(
      report.cautions.map((caution) => caution.code),
    );
    for (const caution of report.cautions) {
      const text =
        (await page.locator(`li[data-caution-code="${caution.code}"]`).textContent()) ?? '';
      expect(text).toContain(caution.message);
      expect(text.toLowerCase()).toContain(caution.severity);
    }
    // A shape beside each word, so colour is not the only sign (WCAG 1.4.1).
    expect(await items.locator('svg polygon, svg circle').count()).toBe(report.cautions.length);
    expect(await page.getByText('licensed professionals decide').count()).toBe(1);

    const overflowPx = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflowPx).toBeLessThanOrEqual(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-safety.png'), fullPage: true });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('the Safety section’s appliances and site', { timeout: TEST_TIMEOUT_MS }, () => {
  /** A demo home whose package tightens it and whose burners are all sealed, by the store. */
  function sealedHome(): HomeSummary {
    const demoHomes = project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
    const found = demoHomes.find((row) => {
      const data = project.store.read((read) => getHome(read, row.id)).data;
      const reply = callChannel({ store: project.store }, 'plan.evaluate', { homeId: row.id });
      return (
        reply.ok &&
        reply.value.package.reductionCfm50 > 0 &&
        !reply.value.cautions.some((caution) => caution.code === 'natural-draft-appliance') &&
        (data.combustionAppliances ?? []).every((appliance) => appliance.venting === 'sealed')
      );
    });
    if (found === undefined) throw new Error('no tightened demo home with only sealed burners');
    return found;
  }

  function cautionCodes(homeId: number): string[] {
    const reply = callChannel({ store: project.store }, 'plan.evaluate', { homeId });
    if (!reply.ok) throw new Error(reply.error.message);
    return reply.value.cautions.map((caution) => caution.code);
  }

  async function shownCodes(page: Page): Promise<string[]> {
    return page
      .locator('li[data-caution-code]')
      .evaluateAll((items) => items.map((item) => item.getAttribute('data-caution-code') ?? ''));
  }

  it('adds a natural-draft water heater and the evaluation’s natural-draft caution appears', async () => {
    const target = sealedHome();
    const before =
      project.store.read((read) => getHome(read, target.id)).data.combustionAppliances ?? [];
    const watched = await openWatchedPage(browser, host.url);
    const { page } = watched;
    await page.getByRole('table').first().waitFor();
    await page.evaluate((hash) => (location.hash = hash), `#/homes/${target.id}/safety`);
    await page.getByRole('heading', { level: 2, name: 'Safety' }).waitFor();
    await page.locator('#appliance-kind').selectOption('waterHeater');
    await page.locator('#appliance-fuel').selectOption('naturalGas');
    await page.locator('#appliance-venting').selectOption('naturalDraft');
    await page.getByRole('button', { name: 'Add the appliance' }).click();
    await expect
      .poll(() => project.store.read((read) => getHome(read, target.id)).data.combustionAppliances)
      .toEqual([
        ...before,
        {
          kind: 'waterHeater',
          fuel: 'naturalGas',
          venting: 'naturalDraft',
          insidePressureBoundary: true,
        },
      ]);
    // The screen lists the evaluation's cautions for the home as it now is, in their order.
    const codes = cautionCodes(target.id);
    expect(codes).toContain('natural-draft-appliance');
    await expect.poll(() => shownCodes(page)).toEqual(codes);

    await page.locator('#house-knob-and-tube').selectOption('yes');
    await expect
      .poll(
        () => project.store.read((read) => getHome(read, target.id)).data.house?.knobAndTubeWiring,
      )
      .toBe(true);
    await expect.poll(() => shownCodes(page)).toEqual(cautionCodes(target.id));
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'safety-appliances.png'), fullPage: true });

    await page.getByRole('button', { name: /^Remove the water heater, natural gas/ }).click();
    await expect
      .poll(() => project.store.read((read) => getHome(read, target.id)).data.combustionAppliances)
      .toEqual(before);
    expectHealthy(watched);
    await watched.close();
  });
});

describe('a home that cannot be evaluated', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the evaluation’s refusal in plain words on Plan and Safety', async () => {
    // A copy of the demo home with its blower-door tests removed has nothing to plan from.
    const context = { store: project.store };
    const copy = callChannel(context, 'homes.duplicate', { id: home.id, name: 'Untested copy' });
    if (!copy.ok) throw new Error(copy.error.message);
    const stored = callChannel(context, 'homes.get', { id: copy.value.id });
    if (!stored.ok) throw new Error(stored.error.message);
    for (const record of stored.value.tests)
      callChannel(context, 'tests.delete', { id: record.id });
    const refusal = callChannel(context, 'plan.evaluate', { homeId: copy.value.id });
    expect(refusal.ok).toBe(false);
    if (refusal.ok) return;

    const watched = await openWatchedPage(browser, host.url);
    const { page } = watched;
    await page.getByRole('table').waitFor();
    for (const [name, slug] of [
      ['Plan', 'plan'],
      ['Safety', 'safety'],
    ] as const) {
      await page.evaluate((place) => (location.hash = place), `#/homes/${copy.value.id}/${slug}`);
      await page.getByRole('heading', { level: 2, name }).waitFor();
      const alert = page.getByRole('alert');
      await alert.waitFor();
      expect(await alert.textContent()).toContain(refusal.error.message);
      expect(await alert.getByRole('button', { name: 'Try again' }).count()).toBe(1);
      expect(await axeViolations(page)).toEqual([]);
    }
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-plan-refused.png') });
    expectHealthy(watched);
    await watched.close();
  });
});
