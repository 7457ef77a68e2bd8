/**
 * The Plan's range of outcomes and best package within a budget, and the Proposal's three
 * options, end to end in chromium. The page works them out in its own Web Worker; each figure
 * shown is checked against the same request answered by the project's channel in Node
 * (`plan.evaluate` with draws, seed and budget; `plan.options`), computed here beside the
 * page — so the browser's worker and the Node host must agree.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; the W3C Content Security Policy Level 3 `securitypolicyviolation` event.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EvaluationWithChoices, OptionReport } from '../../core/choices.ts';
import { formatNumber, formatRatio, formatUsd } from '../../core/format.ts';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { callChannel, type ChannelRequest } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { folded, holdsFigure, paintedPixels, requireTool } from './_lib/drawn.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;
let home: HomeSummary;

function hostEvaluation(
  request: Omit<ChannelRequest<'plan.evaluate'>, 'homeId'>,
): EvaluationWithChoices {
  const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', {
    homeId: home.id,
    ...request,
  });
  if (!reply.ok) throw new Error(reply.error.message);
  return reply.value;
}

function hostOptions(): OptionReport[] {
  const reply = callChannel({ store: rig.project.store }, 'plan.options', {
    homeId: home.id,
    draws: 10_000,
    seed: 1,
  });
  if (!reply.ok) throw new Error(reply.error.message);
  return reply.value;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** The cells of the ranges table, row by row: [label, P10, P50, P90, mean]. */
async function rangeRows(page: Page): Promise<string[][]> {
  return page
    .locator('#ranges-table tbody tr')
    .evaluateAll((rows) =>
      rows.map((row) =>
        [...row.querySelectorAll('th, td')].map((cell) =>
          (cell.textContent ?? '').replace(/\s+/g, ' ').trim(),
        ),
      ),
    );
}

async function waitForRun(page: Page, draws: number, seed: number): Promise<void> {
  await page
    .locator('#ranges-heading ~ .status', {
      hasText: new RegExp(`^${formatNumber(draws)} draws, seed ${seed}\\b`),
    })
    .waitFor({ timeout: 30_000 });
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-choices-');
  const demo = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  // A home whose package has two or more measures, so the ranges and the search have work.
  const found = demo.find((row) => {
    const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId: row.id });
    return reply.ok && reply.value.measures.filter((measure) => measure.included).length >= 2;
  });
  if (!found) throw new Error('no demo home with a package of two measures');
  home = found;
}, SETUP_TIMEOUT_MS);

afterAll(() => rig.close());

describe('the Plan’s choices in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the range of outcomes the Node host gives for the same draws and seed', async () => {
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/plan`);
    await page.getByRole('heading', { level: 3, name: 'Range of outcomes' }).waitFor();
    await waitForRun(page, 10_000, 1);

    const expected = hostEvaluation({ draws: 10_000, seed: 1 }).uncertainty;
    if (!expected) throw new Error('the host gave no uncertainty');
    const rows = await rangeRows(page);
    const usd = (value: number) => formatUsd(value);
    expect(rows.find((row) => row[0] === 'Saves per year')?.slice(1)).toEqual(
      [
        expected.annualSavingsUsd.p10,
        expected.annualSavingsUsd.p50,
        expected.annualSavingsUsd.p90,
        expected.annualSavingsUsd.mean,
      ].map(usd),
    );
    expect(rows.find((row) => row[0] === 'Net present value (NPV)')?.slice(1)).toEqual(
      [expected.npvUsd.p10, expected.npvUsd.p50, expected.npvUsd.p90, expected.npvUsd.mean].map(
        usd,
      ),
    );
    if (expected.sir) {
      expect(rows.find((row) => row[0] === 'SIR')?.slice(1, 4)).toEqual(
        [expected.sir.p10, expected.sir.p50, expected.sir.p90].map((value) => formatRatio(value)),
      );
    }
    // The histogram is drawn.
    await expect
      .poll(() => paintedPixels(page, '#ranges-heading ~ .results .chart canvas'))
      .toBeGreaterThan(500);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'plan-ranges.png'), fullPage: true });

    // Another seed, then triangular with N varied: the host's figures again.
    await page.getByLabel('Seed', { exact: true }).fill('77');
    await page.getByLabel('Seed', { exact: true }).press('Enter');
    await waitForRun(page, 10_000, 77);
    await page.getByLabel('Shape of each range').selectOption('triangular');
    await page.getByLabel('The climate factor N').check();
    await page.getByLabel('Draws', { exact: true }).selectOption('1000');
    await waitForRun(page, 1000, 77);
    const varied = hostEvaluation({
      draws: 1000,
      seed: 77,
      distribution: 'triangular',
      vary: { escalation: false, efficiency: false, nFactor: true },
    }).uncertainty;
    const variedRows = await rangeRows(page);
    expect(variedRows.find((row) => row[0] === 'Net present value (NPV)')?.slice(1, 4)).toEqual(
      [varied?.npvUsd.p10, varied?.npvUsd.p50, varied?.npvUsd.p90].map((value) =>
        usd(value ?? NaN),
      ),
    );
    // A seed that is not a whole number is refused beside the box, and the run stays.
    await page.getByLabel('Seed', { exact: true }).fill('1.5');
    await page.getByLabel('Seed', { exact: true }).press('Enter');
    await expect
      .poll(() => page.locator('#ranges-seed-error').textContent())
      .toContain('expected a whole number');
    expect(await page.getByLabel('Seed', { exact: true }).getAttribute('aria-invalid')).toBe(
      'true',
    );
    expectHealthy(watched);
    await watched.context.close();
  });

  it('finds the best package within a budget as the Node host does, and refuses a bad budget', async () => {
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/plan`);
    await page.getByRole('heading', { level: 3, name: 'Best package within a budget' }).waitFor();
    const full = hostEvaluation({});
    const energyCost = full.measures
      .filter((measure) => measure.included && !measure.healthAndSafety)
      .reduce((sum, measure) => sum + measure.costUsd, 0);
    const budgetUsd = Math.floor(energyCost / 2);
    await page.getByLabel('Budget for energy work').fill(String(budgetUsd));
    await page.getByRole('button', { name: 'Find the best package' }).click();
    await page.locator('#best-heading ~ .status', { hasText: /^Exact:/ }).waitFor();

    const expected = hostEvaluation({ budget: { budgetUsd } }).bestPackage;
    if (!expected) throw new Error('the host gave no best package');
    const listed = await page
      .getByRole('list', { name: 'Measures of the best package, in the order done' })
      .locator('li')
      .allTextContents();
    expect(listed.map((text) => /\(([^)]+)\)$/.exec(text.trim())?.[1])).toEqual(
      expected.measureIds,
    );
    const npv = page.locator('#best-heading ~ .found dt', { hasText: /^NPV$/ }).locator('+ dd');
    expect((await npv.textContent())?.trim()).toBe(formatUsd(expected.npvUsd, { cents: true }));
    expect(expected.energyCostUsd).toBeLessThanOrEqual(budgetUsd);

    // By savings with the package SIR at least 1: again as the host.
    await page.getByLabel('Best by').selectOption('savings');
    await page.getByLabel('the package has SIR of at least 1').check();
    await page.getByRole('button', { name: 'Find the best package' }).click();
    const bySavings = hostEvaluation({
      budget: { budgetUsd, objective: 'savings', packageSirAtLeastOne: true },
    }).bestPackage;
    await expect
      .poll(async () =>
        (
          await page
            .getByRole('list', { name: 'Measures of the best package, in the order done' })
            .locator('li')
            .allTextContents()
        ).map((text) => /\(([^)]+)\)$/.exec(text.trim())?.[1]),
      )
      .toEqual(bySavings?.measureIds);

    await page.getByLabel('Budget for energy work').fill('a lot');
    await page.getByRole('button', { name: 'Find the best package' }).click();
    await expect
      .poll(() => page.locator('#best-budget-error').textContent())
      .toContain('Type the budget in dollars');
    expect(await axeViolations(page)).toEqual([]);
    await page
      .locator('section[aria-labelledby="best-heading"]')
      .screenshot({ path: join(SCREENSHOTS, 'plan-best-package.png') });
    expectHealthy(watched);
    await watched.context.close();
  });

  it('shows the proposal’s three packages with the ranges the Node host gives, and prints them', async () => {
    requireTool('pdftotext');
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/proposal`);
    await page.locator('#proposal-tiers-table').waitFor({ timeout: 30_000 });
    const expected = hostOptions();
    expect(expected.map((option) => option.id)).toEqual(['first-step', 'recommended', 'thorough']);
    for (const option of expected) {
      const row = page.locator(`#proposal-tiers-table tr[data-tier="${option.id}"]`);
      const text = folded(await row.textContent());
      expect(text).toContain(option.name);
      expect(text).toContain(formatUsd(option.costUsd, { cents: true }));
      expect(text).toContain(formatUsd(option.npvUsd, { cents: true }));
      if (option.range && option.measureIds.length > 0) {
        const { p10, p90 } = option.range.npvUsd;
        expect(text).toContain(`${formatUsd(p10)} to ${formatUsd(p90)}`);
      }
    }
    // The recommended package is the plan's own.
    const plan = hostEvaluation({});
    expect(expected[1]?.npvUsd).toBe(plan.package.npvUsd);
    expect(await axeViolations(page)).toEqual([]);
    await page
      .locator('section[aria-labelledby="proposal-tiers"]')
      .screenshot({ path: join(SCREENSHOTS, 'proposal-tiers.png') });

    await page.emulateMedia({ media: 'print' });
    const folder = join(SCREENSHOTS, '..', 'pdf');
    mkdirSync(folder, { recursive: true });
    const pdfPath = join(folder, 'proposal-tiers.pdf');
    await page.pdf({
      path: pdfPath,
      format: 'Letter',
      printBackground: true,
      preferCSSPageSize: true,
    });
    const whole = folded(
      execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' }),
    );
    expect(whole).toContain('Three packages to choose from');
    for (const option of expected) {
      expect(holdsFigure(whole, formatUsd(option.npvUsd, { cents: true })), option.id).toBe(true);
    }
    expectHealthy(watched);
    await watched.context.close();
  });
});
