/**
 * The Portfolio screen end to end in chromium, on the demo project: the totals and figures by
 * type as the `portfolio.evaluate` channel gives them in Node (computed here, beside the
 * page), a filter, test-outs recorded — one through the Leak test screen, others through the
 * channel — showing up as realization rates and calibration factors, and the CSV files saved
 * holding the same rows (parsed with papaparse, RFC 4180).
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA); the W3C Content Security Policy
 * Level 3 `securitypolicyviolation` event.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber, formatRatio, formatUsd } from '../../core/format.ts';
import { lookupOf } from '../../core/measure-library.ts';
import { programRange } from '../../core/uncertainty/program-range.ts';
import { getHome, listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { callChannel, type ChannelRequest, type ChannelResponse } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { folded, paintedPixels } from './_lib/drawn.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;
let demo: HomeSummary[];

function hostPortfolio(
  request: ChannelRequest<'portfolio.evaluate'> = {},
): ChannelResponse<'portfolio.evaluate'> {
  const reply = callChannel({ store: rig.project.store }, 'portfolio.evaluate', request);
  if (!reply.ok) throw new Error(reply.error.message);
  return reply.value;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

async function figure(page: Page, term: string): Promise<string> {
  const value = page
    .locator('section[aria-labelledby="portfolio-totals"] dt', { hasText: new RegExp(`^${term}$`) })
    .locator('+ dd');
  return folded(await value.textContent());
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-portfolio-');
  demo = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
}, SETUP_TIMEOUT_MS);

afterAll(() => rig.close());

describe('the Portfolio screen in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('imports the demo portfolio CSV, shows the totals and figures by type the Node host gives, and follows a filter', async () => {
    // The demo program's homes as a portfolio CSV, imported through the Homes screen.
    const exported = callChannel({ store: rig.project.store }, 'portfolio.homesCsv', {});
    if (!exported.ok) throw new Error(exported.error.message);
    const csvPath = join(SCREENSHOTS, '..', 'demo-portfolio.csv');
    writeFileSync(csvPath, exported.value.csv);
    const before = hostPortfolio({ filter: {} }).figures.totals.homes;
    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('button', { name: 'Import homes' }).click();
    await page.getByLabel('Portfolio CSV (.csv)').setInputFiles(csvPath);
    const rowsIn = exported.value.csv.trimEnd().split('\n').length - 1;
    await page.getByRole('button', { name: `Import ${rowsIn} homes` }).click();
    await page.getByText(`Imported ${rowsIn} homes from demo-portfolio.csv.`).waitFor();
    await page.getByRole('link', { name: 'Portfolio' }).click();
    await page.locator('#portfolio-types-table').waitFor();
    expect(hostPortfolio({ filter: {} }).figures.totals.homes).toBe(before + rowsIn);
    const expected = hostPortfolio({ filter: {} });
    const totals = expected.figures.totals;
    expect(await figure(page, 'Homes')).toBe(formatNumber(totals.homes));
    expect(await figure(page, 'Cost')).toBe(formatUsd(totals.costUsd, { cents: true }));
    expect(await figure(page, 'Lifetime NPV')).toBe(formatUsd(totals.npvUsd, { cents: true }));
    expect(await figure(page, 'Saves in year one')).toBe(
      formatUsd(totals.annualSavingsUsd, { cents: true }),
    );
    for (const type of expected.figures.byType) {
      const row = folded(
        await page.locator(`#portfolio-types-table tr[data-type="${type.type}"]`).textContent(),
      );
      expect(row).toContain(formatUsd(type.costUsd, { cents: true }));
    }
    await expect
      .poll(() => paintedPixels(page, 'section[aria-labelledby="portfolio-supply"] canvas'))
      .toBeGreaterThan(500);
    // The chart saves as a PNG image (its file starts with the PNG signature, RFC 2083).
    const [chartDownload] = await Promise.all([
      page.waitForEvent('download'),
      page
        .locator('section[aria-labelledby="portfolio-supply"]')
        .getByRole('button', { name: 'Save chart as PNG' })
        .click(),
    ]);
    const chartPath = join(SCREENSHOTS, '..', chartDownload.suggestedFilename());
    await chartDownload.saveAs(chartPath);
    expect(chartDownload.suggestedFilename()).toBe('sealwork-supply-curve.png');
    expect([...readFileSync(chartPath).subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);

    // The program's range, drawn in the page's worker, as Node draws it from the same files.
    await page.getByRole('button', { name: 'Work out the range' }).click();
    await page.locator('#portfolio-range-table').waitFor({ timeout: 30_000 });
    const files = callChannel({ store: rig.project.store }, 'portfolio.homeFiles', { filter: {} });
    if (!files.ok) throw new Error(files.error.message);
    const range = programRange(
      files.value.files,
      { draws: 1000, seed: 1 },
      lookupOf(files.value.libraryTypes),
    );
    const rangeRows = await page.locator('#portfolio-range-table tbody tr').allTextContents();
    expect(folded(rangeRows[0] ?? '')).toBe(
      folded(
        `Saves a year${[range.annualSavingsUsd.p10, range.annualSavingsUsd.p50, range.annualSavingsUsd.p90].map((value) => formatUsd(value)).join('')}`,
      ),
    );
    expect(folded(rangeRows[1] ?? '')).toContain(formatUsd(range.npvUsd.p50));
    // With a shared bias of ± 20 %: the same as Node's again.
    await page.getByLabel('Shared bias on the estimates').selectOption('0.2');
    await page.getByRole('button', { name: 'Work out the range' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: 'a shared bias of ± 20 %' })
      .waitFor({ timeout: 30_000 });
    const biased = programRange(
      files.value.files,
      { draws: 1000, seed: 1, programBias: 0.2 },
      lookupOf(files.value.libraryTypes),
    );
    const biasedRows = await page.locator('#portfolio-range-table tbody tr').allTextContents();
    expect(folded(biasedRows[0] ?? '')).toContain(formatUsd(biased.annualSavingsUsd.p90));
    await page.getByLabel('Leakage as').selectOption('CFM50');
    await expect
      .poll(() => paintedPixels(page, 'section[aria-labelledby="portfolio-spread"] canvas'))
      .toBeGreaterThan(500);
    expect(
      await page
        .locator('section[aria-labelledby="portfolio-spread"] [role="img"]')
        .getAttribute('aria-label'),
    ).toContain('Homes by CFM50');
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'portfolio.png'), fullPage: true });

    const fuel = demo[0]?.heatingFuel;
    if (!fuel) throw new Error('a demo home without a fuel');
    await page.getByLabel('Heating fuel').selectOption(fuel);
    const filtered = hostPortfolio({ filter: { heatingFuel: fuel } });
    await expect
      .poll(() => figure(page, 'Homes'))
      .toBe(formatNumber(filtered.figures.totals.homes));
    expect(await figure(page, 'Cost')).toBe(
      formatUsd(filtered.figures.totals.costUsd, { cents: true }),
    );
    // The filters saved under a name, then chosen again after the filters changed.
    await page.getByLabel('Save these filters as').fill('One fuel');
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('status').filter({ hasText: 'Saved “One fuel”.' }).waitFor();
    await page.getByLabel('Heating fuel').selectOption('');
    await expect
      .poll(() => figure(page, 'Homes'))
      .not.toBe(formatNumber(filtered.figures.totals.homes));
    await page.getByLabel('Saved choice').selectOption('One fuel');
    await expect
      .poll(() => figure(page, 'Homes'))
      .toBe(formatNumber(filtered.figures.totals.homes));
    const settings = callChannel({ store: rig.project.store }, 'settings.get', {});
    expect(settings.ok && settings.value.portfolioSelections).toEqual([
      { name: 'One fuel', filter: { heatingFuel: fuel } },
    ]);
    expectHealthy(watched);
    await watched.context.close();
  });

  it('shows test-outs as realization rates and calibration, and saves the CSV files', async () => {
    // One test-out through the Leak test screen…
    const tested = new Set(hostPortfolio().testOut.results.map((result) => result.homeId));
    const fresh = demo.filter((home) => !tested.has(home.id));
    const [first, ...others] = fresh;
    if (!first || others.length < 2) throw new Error('too few demo homes without a test-out');
    const plan = (homeId: number) => {
      const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId });
      if (!reply.ok) throw new Error(reply.error.message);
      return reply.value.package;
    };
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${first.id}/leak-test`);
    await page.getByRole('button', { name: 'Enter a new test' }).click();
    await page.getByLabel('Test-out, after the work').check();
    await page.getByLabel('One point at 50 Pa').check();
    const firstPlan = plan(first.id);
    const testOut = Math.round(firstPlan.cfm50Before - 0.7 * firstPlan.reductionCfm50);
    await page.getByLabel('CFM50', { exact: true }).fill(String(testOut));
    await page.getByRole('button', { name: 'Save the test' }).click();
    await page.getByRole('status').filter({ hasText: 'saved' }).waitFor();
    // …and two through the channel, one of them leakier than its test-in.
    for (const [index, home] of others.slice(0, 2).entries()) {
      const own = plan(home.id);
      const cfm50 =
        index === 0 ? own.cfm50Before - 0.9 * own.reductionCfm50 : own.cfm50Before * 1.1;
      const reply = callChannel({ store: rig.project.store }, 'tests.add', {
        homeId: home.id,
        test: { kind: 'testOut', cfm50 },
      });
      expect(reply.ok).toBe(true);
    }

    await page.getByRole('link', { name: 'Portfolio' }).click();
    await page.locator('#portfolio-test-out-table').waitFor();
    const expected = hostPortfolio({ filter: {} });
    expect(expected.testOut.results.length).toBe(tested.size + 3);
    for (const result of expected.testOut.results) {
      const row = folded(
        await page
          .locator(`#portfolio-test-out-table tr[data-home-id="${result.homeId}"]`)
          .textContent(),
      );
      const rate = result.realizationRate;
      expect(row).toContain(rate === null ? '—' : `${formatNumber(rate * 100, 0)} %`);
    }
    const ours = expected.testOut.results.find((result) => result.homeId === first.id);
    expect(ours?.testOutCfm50).toBe(testOut);
    const leaky = others[1];
    expect(
      folded(
        await page
          .locator(`#portfolio-test-out-table tr[data-home-id="${leaky?.id}"]`)
          .textContent(),
      ),
    ).toContain('Review');
    for (const type of expected.calibration?.types ?? []) {
      const row = folded(
        await page
          .locator(`#portfolio-types-realization tr[data-type="${type.typeId}"]`)
          .textContent(),
      );
      expect(row).toContain(type.factor === null ? 'Not determined' : formatRatio(type.factor));
    }
    // Too few tested homes for any factor: applying says so and writes nothing.
    await page.getByRole('button', { name: 'Apply the fitted factors' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: 'No factor rests on enough tested homes yet' })
      .waitFor();
    const calibrated = rig.project.store.read((read) =>
      listHomes(read).filter((home) => getHome(read, home.id).data.calibration !== undefined),
    );
    expect(calibrated).toEqual([]);
    expect(await axeViolations(page)).toEqual([]);
    await page
      .locator('section[aria-labelledby="portfolio-test-out"]')
      .screenshot({ path: join(SCREENSHOTS, 'portfolio-test-out.png') });

    // The CSV files hold the same rows.
    const [homesDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Save the homes as CSV' }).click(),
    ]);
    const homesPath = join(SCREENSHOTS, '..', 'portfolio-homes.csv');
    await homesDownload.saveAs(homesPath);
    const parsed = Papa.parse<Record<string, string>>(readFileSync(homesPath, 'utf8'), {
      header: true,
      skipEmptyLines: true,
    });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data.length).toBe(expected.rows.length);
    const centsOf = (rows: { costUsd: string | number }[]) =>
      rows.reduce((sum, row) => sum + Math.round(Number(row.costUsd) * 100), 0);
    expect(centsOf(parsed.data as { costUsd: string }[])).toBe(
      Math.round(expected.figures.totals.costUsd * 100),
    );
    const [testOutDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Save the test-outs as CSV' }).click(),
    ]);
    const testOutPath = join(SCREENSHOTS, '..', 'portfolio-test-outs.csv');
    await testOutDownload.saveAs(testOutPath);
    const outs = Papa.parse<Record<string, string>>(readFileSync(testOutPath, 'utf8'), {
      header: true,
      skipEmptyLines: true,
    });
    expect(outs.data.map((row) => Number(row.homeId)).sort((a, b) => a - b)).toEqual(
      expected.testOut.results.map((result) => result.homeId).sort((a, b) => a - b),
    );
    expectHealthy(watched);
    await watched.context.close();
  });
});
