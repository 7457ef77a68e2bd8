/**
 * A home's Proposal end to end: a demo home opened by keyboard, its proposal checked against
 * the evaluation the project's own channel returns for the stored home (computed here, beside
 * the page, and formatted by core/format.ts as the command line formats it), then printed to
 * a Letter PDF whose text (poppler's pdftotext) and pages (pdftoppm) are checked as well.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard and 2.4.7 Focus Visible for the
 * print button (from memory); the CSS Paged Media `@page size: letter` (8.5 × 11 in, so 612 ×
 * 792 PDF points) as the page size pdfinfo must report; poppler-utils' pdftotext and pdftoppm
 * as the independent readers of the PDF.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import Decimal from 'decimal.js';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber, formatRatio, formatUsd, formatYears } from '../../core/format.ts';
import type { EvaluationReport, MeasureReport } from '../../core/report.ts';
import type { HomeFile } from '../../core/schema.ts';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { callChannel } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { folded, holdsFigure, paintedPixels, requireTool } from './_lib/drawn.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { REPO_ROOT } from './_lib/ui-build.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

/** Where the PDF and its page images go, to be looked at by a person. */
const PDF_OUTPUT = join(REPO_ROOT, 'test-output', 'proposal');

let rig: Rig;
let home: HomeSummary;
let report: EvaluationReport;
let file: HomeFile;

function evaluated(homeId: number): EvaluationReport {
  const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(`demo home ${homeId} was not evaluated: ${reply.error.message}`);
  return reply.value;
}

function exported(homeId: number): HomeFile {
  const reply = callChannel({ store: rig.project.store }, 'homeFile.export', { id: homeId });
  if (!reply.ok) throw new Error(`demo home ${homeId} was not exported: ${reply.error.message}`);
  return reply.value;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

function sumUsd(measures: readonly MeasureReport[], pick: (m: MeasureReport) => number): Decimal {
  return measures.reduce((total, measure) => total.plus(pick(measure)), new Decimal(0));
}

/**
 * The options worked out here from the evaluation: the plan puts health-and-safety measures
 * first, and each option runs to one more energy measure; the last is the package itself.
 */
function expectedOptions(evaluation: EvaluationReport) {
  const included = evaluation.measures.filter((measure) => measure.included);
  const ends = included.flatMap((measure, index) => (measure.healthAndSafety ? [] : [index + 1]));
  return ends.map((end, index) => {
    const upTo = included.slice(0, end);
    if (index === ends.length - 1) {
      const pkg = evaluation.package;
      return {
        cost: formatUsd(pkg.costUsd, { cents: true }),
        savings: formatUsd(pkg.annualSavingsUsd),
        npv: formatUsd(pkg.npvUsd, { cents: true }),
        sir: formatRatio(pkg.sir),
        payback: formatYears(pkg.simplePaybackYears),
      };
    }
    const cost = sumUsd(upTo, (m) => m.costUsd);
    const savings = sumUsd(upTo, (m) => m.annualSavings.usd);
    const energy = upTo.filter((m) => !m.healthAndSafety);
    const energyCost = sumUsd(energy, (m) => m.costUsd);
    return {
      cost: formatUsd(cost.toNumber(), { cents: true }),
      savings: formatUsd(savings.toNumber()),
      npv: formatUsd(
        sumUsd(upTo, (m) => m.pvSavingsUsd)
          .minus(cost)
          .toNumber(),
        { cents: true },
      ),
      sir: formatRatio(
        energyCost.isZero()
          ? null
          : sumUsd(energy, (m) => m.pvSavingsUsd)
              .div(energyCost)
              .toNumber(),
      ),
      payback: formatYears(savings.isZero() ? null : cost.div(savings).toNumber()),
    };
  });
}

async function figureValue(page: Page, key: string): Promise<string> {
  return folded(await page.locator(`[data-figure="${key}"] .value`).textContent());
}

/** Opens the Homes list and, by keyboard only, the home's workspace, then its Proposal. */
async function openProposalByKeyboard(): Promise<WatchedPage> {
  const watched = await rig.open();
  const { page } = watched;
  await page.getByRole('table').waitFor();
  await tabTo(page, page.locator(`[data-home-id="${home.id}"]`), 80);
  await page.keyboard.press('Enter');
  await tabTo(page, page.getByRole('link', { name: /^Open / }), 3);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
  const link = page.getByRole('navigation', { name: 'Screens' }).getByRole('link', {
    name: 'Proposal',
  });
  await tabTo(page, link);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.getByRole('heading', { level: 2, name: 'Proposal' }).waitFor();
  expect(await link.getAttribute('aria-current')).toBe('page');
  await page.locator('.proposal-document').waitFor();
  return watched;
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-proposal-');
  const demoHomes = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  // A home whose proposal shows every part: three or more measures, one of them health and
  // safety, a ventilation fan the tighter house needs, and cautions to list.
  const found = demoHomes.find((row) => {
    const candidate = evaluated(row.id);
    const included = candidate.measures.filter((measure) => measure.included);
    return (
      included.length >= 3 &&
      included.some((measure) => measure.healthAndSafety) &&
      candidate.package.ventilation.fanAdded &&
      candidate.cautions.length > 0
    );
  });
  if (found === undefined) throw new Error('no demo home of the kind these checks need');
  home = found;
  report = evaluated(found.id);
  file = exported(found.id);
  mkdirSync(PDF_OUTPUT, { recursive: true });
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Proposal section in chromium', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the evaluation’s findings, package, options, cautions and assumptions', async () => {
    const watched = await openProposalByKeyboard();
    const { page } = watched;
    expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/proposal`);
    const pkg = report.package;

    // The home and its client, from the stored home file.
    const header = folded(await page.locator('.proposal-header').textContent());
    if (file.client) expect(header).toContain(file.client.name);
    if (file.address?.street) expect(header).toContain(file.address.street);

    // The leak test in words, with the trade's figures.
    const findings = folded(await page.locator('#proposal-findings-text').textContent());
    expect(findings).toContain(`${formatNumber(report.leakage.cfm50)} CFM50`);
    expect(findings).toContain(`${formatNumber(report.leakage.ach50, 1)} ACH50`);
    expect(findings).toContain(`${formatNumber(pkg.cfm50After)} CFM50`);

    // The package's figures as the command line prints them.
    expect(await figureValue(page, 'cost')).toBe(formatUsd(pkg.costUsd, { cents: true }));
    expect(await figureValue(page, 'savings')).toBe(formatUsd(pkg.annualSavingsUsd));
    expect(await figureValue(page, 'npv')).toBe(formatUsd(pkg.npvUsd, { cents: true }));
    expect(await figureValue(page, 'sir')).toBe(formatRatio(pkg.sir));
    expect(await figureValue(page, 'payback')).toBe(formatYears(pkg.simplePaybackYears));
    expect(await figureValue(page, 'co2')).toContain(formatNumber(pkg.annualSavings.co2Kg, 0));
    expect(await figureValue(page, 'fuel')).toContain(
      `${formatNumber(pkg.annualSavings.heatingFuelUnits, 1)} ${pkg.annualSavings.heatingFuelUnit}`,
    );

    // The work in the plan's order, by plain name.
    const included = report.measures.filter((measure) => measure.included);
    const rows = page.locator('#proposal-package-table tbody tr');
    expect(await rows.evaluateAll((all) => all.map((row) => row.dataset.measureId))).toEqual(
      included.map((measure) => measure.id),
    );
    for (const measure of included) {
      const text = folded(await page.locator(`tr[data-measure-id="${measure.id}"]`).textContent());
      expect(text).toContain(measure.name);
      expect(text).toContain(formatUsd(measure.costUsd, { cents: true }));
      expect(text.includes('Health and safety'), measure.id).toBe(measure.healthAndSafety);
    }

    // Health and safety apart from the energy work: its measures and the fan, its total, the rest.
    const split = page.locator('#proposal-cost-split');
    const healthTotal = new Decimal(pkg.healthAndSafetyCostUsd);
    expect(
      folded(await split.locator('[data-cost-part="health-and-safety"] td').textContent()),
    ).toBe(formatUsd(healthTotal.toNumber(), { cents: true }));
    expect(folded(await split.locator('[data-cost-part="energy"] td').textContent())).toBe(
      formatUsd(new Decimal(pkg.costUsd).minus(healthTotal).toNumber(), { cents: true }),
    );
    const healthMeasures = included.filter((measure) => measure.healthAndSafety);
    const itemTexts = await split.locator('[data-safety-item]').allTextContents();
    expect(itemTexts.length).toBe(healthMeasures.length + (pkg.ventilation.fanAdded ? 1 : 0));
    healthMeasures.forEach((measure, index) => {
      expect(folded(itemTexts[index] ?? '')).toContain(measure.name);
    });
    // The items add up to the health-and-safety total (the report's, computed by the core).
    const itemsSum = sumUsd(healthMeasures, (m) => m.costUsd).plus(pkg.ventilation.fanCostUsd);
    expect(itemsSum.equals(healthTotal)).toBe(true);
    expect(folded(await page.locator('#proposal-fresh-air').textContent())).toContain(
      formatUsd(pkg.ventilation.fanCostUsd),
    );

    // The options: the plan's real cumulative steps, each with its cost and savings.
    const expected = expectedOptions(report);
    const optionRows = page.locator('#proposal-options-table tbody tr');
    expect(await optionRows.count()).toBe(expected.length);
    for (const [index, option] of expected.entries()) {
      const cells = (await optionRows.nth(index).locator('td.number').allTextContents()).map(
        folded,
      );
      expect(cells, `option ${index + 1}`).toEqual([
        option.cost,
        option.savings,
        option.payback,
        option.npv,
        option.sir,
      ]);
    }
    expect(folded(await optionRows.last().textContent())).toContain('Recommended');
    await expect.poll(() => paintedPixels(page, '.proposal-chart canvas')).toBeGreaterThan(5000);

    // Every caution, in the evaluation's order, its severity in words.
    const cautionItems = page.locator('.proposal-document li[data-caution-code]');
    expect(
      await cautionItems.evaluateAll((all) => all.map((item) => item.dataset.cautionCode)),
    ).toEqual(report.cautions.map((caution) => caution.code));
    for (const caution of report.cautions) {
      const text = folded(
        await page
          .locator(`.proposal-document li[data-caution-code="${caution.code}"]`)
          .textContent(),
      );
      expect(text).toContain(folded(caution.message));
      expect(text.toLowerCase()).toContain(caution.severity);
    }
    expect(await page.getByText('licensed professionals, who have the final word').count()).toBe(1);

    // The assumptions, from the home file the evaluation was computed from.
    const assumptions = folded(
      await page
        .locator('#proposal-assumptions ~ *')
        .allTextContents()
        .then((t) => t.join(' ')),
    );
    expect(assumptions).toContain(`${formatNumber(file.economics.discountRateReal * 100, 1)} %`);
    expect(assumptions).toContain(file.climate.name);
    const heatingPrice = file.prices[file.heating.fuel];
    if (heatingPrice)
      expect(assumptions).toContain(formatUsd(heatingPrice.usdPerUnit, { cents: true }));
    expect(assumptions).toContain('is an estimate');
    const shortest = Math.min(...included.map((measure) => measure.lifeYears));
    const longest = Math.max(...included.map((measure) => measure.lifeYears));
    expect(assumptions).toContain(
      shortest === longest
        ? `expected life: ${formatNumber(shortest)} years`
        : `expected life: ${formatNumber(shortest)} to ${formatNumber(longest)} years`,
    );

    const overflowPx = await page.evaluate(
      () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
    );
    expect(overflowPx).toBeLessThanOrEqual(0);
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-proposal.png') });
    await page.screenshot({
      path: join(SCREENSHOTS, 'workspace-proposal-full.png'),
      fullPage: true,
    });
    for (const part of ['package', 'safety-work', 'options', 'cautions', 'assumptions']) {
      await page
        .locator(`section[aria-labelledby="proposal-${part}"]`)
        .screenshot({ path: join(SCREENSHOTS, `workspace-proposal-${part}.png`) });
    }

    // A small laptop and a large screen: the sheet fits without sideways scrolling.
    for (const size of [
      { width: 1024, height: 768 },
      { width: 1920, height: 1080 },
    ]) {
      await page.setViewportSize(size);
      await expect
        .poll(() =>
          page.evaluate(
            () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
          ),
        )
        .toBeLessThanOrEqual(0);
    }
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-proposal-1920.png') });
    await page.setViewportSize({ width: 1024, height: 768 });
    await page.screenshot({
      path: join(SCREENSHOTS, 'workspace-proposal-1024.png'),
      fullPage: true,
    });
    expectHealthy(watched);
    await watched.close();
  });

  it('reaches the print button by keyboard, which opens the browser’s print', async () => {
    const watched = await openProposalByKeyboard();
    const { page } = watched;
    // Counts the calls instead of opening the print window, which headless chromium lacks.
    await page.evaluate(() => {
      const counted = window as unknown as { printCalls: number };
      counted.printCalls = 0;
      window.print = () => {
        counted.printCalls += 1;
      };
    });
    const button = page.getByRole('button', { name: 'Print or save as PDF' });
    await tabTo(page, button);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
    expect(
      await page.evaluate(() => (window as unknown as { printCalls: number }).printCalls),
    ).toBe(1);
    expectHealthy(watched);
    await watched.close();
  });

  it('prints alone on Letter pages with the figures, the chart and whole tables', async () => {
    requireTool('pdftotext');
    requireTool('pdftoppm');
    requireTool('pdfinfo');
    const watched = await openProposalByKeyboard();
    const { page } = watched;
    await page.emulateMedia({ media: 'print' });
    // In print the app's navigation, the home's heading and the print button are gone.
    expect(await page.getByRole('navigation', { name: 'Screens' }).isVisible()).toBe(false);
    expect(await page.getByRole('heading', { level: 2, name: 'Proposal' }).isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Print or save as PDF' }).isVisible()).toBe(
      false,
    );
    expect(await page.locator('.proposal-document').isVisible()).toBe(true);
    expect(await paintedPixels(page, '.proposal-chart canvas')).toBeGreaterThan(5000);

    const pdfPath = join(PDF_OUTPUT, 'proposal.pdf');
    await page.pdf({
      path: pdfPath,
      format: 'Letter',
      printBackground: true,
      preferCSSPageSize: true,
    });

    const info = execFileSync('pdfinfo', [pdfPath], { encoding: 'utf8' });
    expect(info).toMatch(/Page size:\s+612 x 792 pts \(letter\)/);
    const pageCount = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
    expect(pageCount).toBeGreaterThanOrEqual(2);

    const text = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
    const pages = text.split('\f').map(folded);
    const whole = pages.join(' ');
    const pkg = report.package;
    for (const figure of [
      formatUsd(pkg.costUsd, { cents: true }),
      formatUsd(pkg.annualSavingsUsd),
      formatUsd(pkg.npvUsd, { cents: true }),
    ]) {
      expect(holdsFigure(whole, figure), figure).toBe(true);
    }
    expect(whole).toContain(`${formatNumber(report.leakage.cfm50)} CFM50`);
    for (const caution of report.cautions) {
      // The first words of each caution (a line break may fall anywhere later).
      expect(whole).toContain(folded(caution.message).split(' ').slice(0, 6).join(' '));
    }
    // The proposal alone: none of the app's chrome.
    for (const chrome of ['Skip to main content', 'Print or save as PDF', 'Units', 'Coming']) {
      expect(whole, chrome).not.toContain(chrome);
    }
    // Tables are not cut by a page break: each table's caption and every one of its figures
    // fall on one page.
    const tables: [string, string[]][] = [
      ['The options, smallest first', expectedOptions(report).map((option) => option.cost)],
      [
        'The package’s cost in two parts',
        [
          formatUsd(pkg.healthAndSafetyCostUsd, { cents: true }),
          formatUsd(pkg.costUsd, { cents: true }),
        ],
      ],
      [
        'The work, in the order it would be done',
        report.measures
          .filter((measure) => measure.included)
          .map((measure) => formatUsd(measure.costUsd, { cents: true })),
      ],
    ];
    for (const [caption, figures] of tables) {
      const onPage = pages.find((pageText) => pageText.includes(caption));
      expect(onPage, caption).toBeDefined();
      for (const figure of figures) {
        expect(holdsFigure(onPage ?? '', figure), `${caption}: ${figure}`).toBe(true);
      }
    }

    // The pages as pictures, to be looked at.
    for (const old of readdirSync(PDF_OUTPUT).filter((name) => name.endsWith('.png'))) {
      rmSync(join(PDF_OUTPUT, old));
    }
    execFileSync('pdftoppm', ['-png', '-r', '60', pdfPath, join(PDF_OUTPUT, 'page')]);
    const images = readdirSync(PDF_OUTPUT).filter((name) => name.endsWith('.png'));
    expect(images.length).toBe(pageCount);
    expectHealthy(watched);
    await watched.close();
  });
});

describe('a home whose plan holds no air-sealing work', { timeout: TEST_TIMEOUT_MS }, () => {
  it('says so, and still shows the health-and-safety work and the cautions', async () => {
    const demoHomes = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
    const withNone = demoHomes
      .map((row) => ({ row, evaluation: evaluated(row.id) }))
      .find(({ evaluation }) => evaluation.package.measureIds.length === 0);
    if (withNone === undefined) throw new Error('no demo home whose package is empty');
    const { evaluation } = withNone;
    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('table').waitFor();
    await page.evaluate((place) => (location.hash = place), `#/homes/${withNone.row.id}/proposal`);
    await page.locator('.proposal-document').waitFor();
    expect(await page.locator('#proposal-no-work').count()).toBe(1);
    expect(await page.locator('#proposal-options-table').count()).toBe(0);
    expect(await figureValue(page, 'cost')).toBe(
      formatUsd(evaluation.package.costUsd, { cents: true }),
    );
    expect(
      folded(await page.locator('[data-cost-part="health-and-safety"] td').textContent()),
    ).toBe(formatUsd(evaluation.package.healthAndSafetyCostUsd, { cents: true }));
    expect(await page.locator('.proposal-document li[data-caution-code]').count()).toBe(
      evaluation.cautions.length,
    );
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({
      path: join(SCREENSHOTS, 'workspace-proposal-no-work.png'),
      fullPage: true,
    });
    expectHealthy(watched);
    await watched.close();
  });
});

describe('a home that cannot be evaluated', { timeout: TEST_TIMEOUT_MS }, () => {
  it('shows the refusal in plain words with a way to try again', async () => {
    // A copy of the demo home with its blower-door tests removed has nothing to plan from.
    const context = { store: rig.project.store };
    const copy = callChannel(context, 'homes.duplicate', { id: home.id, name: 'Untested copy' });
    if (!copy.ok) throw new Error(copy.error.message);
    const stored = callChannel(context, 'homes.get', { id: copy.value.id });
    if (!stored.ok) throw new Error(stored.error.message);
    for (const record of stored.value.tests)
      callChannel(context, 'tests.delete', { id: record.id });
    const refusal = callChannel(context, 'plan.evaluate', { homeId: copy.value.id });
    expect(refusal.ok).toBe(false);
    if (refusal.ok) return;

    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('table').waitFor();
    await page.evaluate((place) => (location.hash = place), `#/homes/${copy.value.id}/proposal`);
    await page.getByRole('heading', { level: 2, name: 'Proposal' }).waitFor();
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain(refusal.error.message);
    expect(await alert.getByRole('button', { name: 'Try again' }).count()).toBe(1);
    expect(await page.locator('.proposal-document').count()).toBe(0);
    expect(await axeViolations(page)).toEqual([]);
    expectHealthy(watched);
    await watched.close();
  });
});
