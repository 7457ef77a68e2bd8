/**
 * The auditor's main path in chromium, from nothing to a proposal: a new home, its climate,
 * heating and prices, a multipoint blower-door test and its fit, five measures from the
 * library, the ranked plan and its charts, a fuel price changed and the savings following it,
 * SI and back, the proposal printed to PDF with the plan's totals in its text, and a reload
 * that finds everything as it was, and the command line printing the same figures for the
 * same home. Then the same path by keyboard alone.
 *
 * Every expected figure comes from the project's store or from the core's evaluation of
 * what the store holds (the plan.evaluate channel), never from the screens' own code.
 *
 * Sources: the readings' power law is fitted by core/leakage.ts, itself held to ASTM E779's
 * log-log regression in test/reference; unit factors are NIST SP 811 (2008) appendix B;
 * axe-core's default rules (WCAG 2.x A and AA); WCAG 2.2 SC 2.1.1 Keyboard (from memory).
 */
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber, formatUsd } from '../../core/format.ts';
import { fitMultipointTest } from '../../core/leakage.ts';
import type { EvaluationReport } from '../../core/report.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import { getHome, listHomes } from '../../db/repositories/homes.ts';
import { listLeakageTests } from '../../db/repositories/leakage-tests.ts';
import { listMeasures } from '../../db/repositories/measures.ts';
import { callChannel } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { holdsFigure, paintedPixels, pdfPages } from './_lib/drawn.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, type Rig } from './_lib/rig.ts';
import { REPO_ROOT } from './_lib/ui-build.ts';

const PATH_TIMEOUT_MS = 240_000;

/** The invented house of this test (not a demo home: the path starts from nothing). */
const HOUSE = {
  conditionedFloorAreaFt2: '1640',
  conditionedVolumeFt3: '13120',
  stories: '1',
  heightFt: '10',
  bedrooms: '3',
  yearBuilt: '1958',
};
const READINGS: [number, number][] = [
  [50, 3180],
  [42, 2860],
  [34, 2490],
  [26, 2090],
  [18, 1610],
];
/** Five library types, each with a quantity in its own unit of work. */
const MEASURES: { type: string; units: string }[] = [
  { type: 'attic-top-plates', units: '120' },
  { type: 'attic-hatch', units: '1' },
  { type: 'rim-joist', units: '140' },
  { type: 'plumbing-penetrations', units: '8' },
  { type: 'door-weatherstrip', units: '2' },
];
const GAS_PRICE_USD_PER_THERM = 1.6;
const RAISED_GAS_PRICE_USD_PER_THERM = 2.4;

let rig: Rig;

function evaluated(homeId: number): EvaluationReport {
  const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(`the home was not evaluated: ${reply.error.message}`);
  return reply.value;
}

async function until<T>(read: () => T, wanted: (value: T) => boolean, what: string): Promise<T> {
  for (let attempt = 0; attempt < 200; attempt++) {
    const value = read();
    if (wanted(value)) return value;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`the store never held ${what}`);
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

async function expectAxeClean(page: Page, where: string): Promise<void> {
  expect(await axeViolations(page), `axe-core on ${where}`).toEqual([]);
}

async function goToSection(page: Page, name: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name }).click();
  await page.getByRole('heading', { level: 2, name }).waitFor();
}

/** Fills a box and leaves it (the House section saves on leaving). */
async function enter(page: Page, id: string, text: string): Promise<void> {
  const box = page.locator(`#${id}`);
  await box.fill(text);
  await box.press('Tab');
}

/** The Plan table's row of a measure. */
function planRow(page: Page, measureId: string): Locator {
  return page.locator(`tr[data-measure-id="${measureId}"]`);
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-main-path-');
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the main path, from an empty home to a printed proposal', () => {
  it(
    'creates, measures, plans, reprices, prints and reloads',
    { timeout: PATH_TIMEOUT_MS },
    async () => {
      const watched = await rig.open();
      const { page } = watched;
      const homesBefore = rig.project.store.read((read) => listHomes(read)).length;

      // ---- A new home from nothing.
      await page.getByRole('table').first().waitFor();
      await page.locator('#homes-new').click();
      await page.locator('#new-home-name').fill('27 Fern Row: 1958 ranch, gas furnace');
      for (const [key, value] of Object.entries(HOUSE)) {
        await page.locator(`#new-home-${key}`).fill(value);
      }
      await page.locator('#new-home-shelterClass').selectOption('3');
      await page.locator('#new-home-foundation').selectOption('crawlspace');
      await expectAxeClean(page, 'the new-home form');
      await page.getByRole('button', { name: 'Make the home' }).click();
      await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
      const homeId = Number(/#\/homes\/(\d+)\//.exec(new URL(page.url()).hash)?.[1]);
      expect(rig.project.store.read((read) => listHomes(read)).length).toBe(homesBefore + 1);
      const created = rig.project.store.read((read) => getHome(read, homeId));
      expect(created.data.house?.conditionedVolumeFt3).toBe(13120);
      expect(created.data.house?.foundation).toBe('crawlspace');

      // ---- Climate, heating and prices in the House section.
      await enter(page, 'climate-name', 'Fern Row gauge');
      await enter(page, 'climate-hdd', '7200');
      await enter(page, 'climate-cdd', '750');
      await enter(page, 'climate-elevation', '900');
      // The N-factor model (a new home's first choice) reads the climate's zone of the LBL map.
      await page.locator('#climate-zone').selectOption('2');
      await page.locator('#heating-equipment').selectOption('furnace');
      await page.locator('#heating-fuel').selectOption('naturalGas');
      await enter(page, 'heating-afue', '80');
      await enter(page, 'price-naturalGas', String(GAS_PRICE_USD_PER_THERM));
      await enter(page, 'price-electricity', '0.15');
      const data = await until(
        () => rig.project.store.read((read) => getHome(read, homeId)).data,
        (stored) =>
          stored.climate?.elevationFt === 900 &&
          stored.heating?.efficiency === 0.8 &&
          stored.prices?.electricity?.usdPerUnit === 0.15,
        'the climate, heating and prices',
      );
      expect(data.climate).toEqual({
        name: 'Fern Row gauge',
        hdd65F: 7200,
        cdd65F: 750,
        elevationFt: 900,
        nFactorZone: 2,
      });
      expect(data.heating).toEqual({ fuel: 'naturalGas', equipment: 'furnace', efficiency: 0.8 });
      expect(data.prices?.naturalGas?.usdPerUnit).toBe(GAS_PRICE_USD_PER_THERM);

      // ---- A multipoint test, its fit shown before it is saved.
      await goToSection(page, 'Leak test');
      await page.getByRole('button', { name: 'Enter a new test' }).click();
      for (const [index, [pa, cfm]] of READINGS.entries()) {
        await page.locator(`#reading-${index}-pa`).fill(String(pa));
        await page.locator(`#reading-${index}-flow`).fill(String(cfm));
      }
      const fit = fitMultipointTest(
        READINGS.map(([pressurePa, flowCfm]) => ({ pressurePa, flowCfm })),
      );
      const preview = page.locator('section[aria-labelledby="test-preview"]');
      await preview.waitFor();
      expect(await preview.textContent()).toContain(`${formatNumber(fit.cfm50)} cfm`);
      expect(
        await paintedPixels(page, 'section[aria-labelledby="test-preview"] canvas'),
      ).toBeGreaterThan(2000);
      await page.getByRole('button', { name: 'Save the test' }).click();
      await until(
        () => rig.project.store.read((read) => listLeakageTests(read, homeId)),
        (tests) => tests.length === 1,
        'the test',
      );

      // ---- Five measures from the library.
      await goToSection(page, 'Measures');
      for (const { type, units } of MEASURES) {
        await page.locator('#add-type').selectOption(type);
        await page.locator('#add-units').fill(units);
        await page.getByRole('button', { name: 'Add the measure' }).click();
        await until(
          () => rig.project.store.read((read) => listMeasures(read, homeId)),
          (measures) => measures.some((record) => record.measure.type === type),
          `a ${type} measure`,
        );
      }
      const stored = rig.project.store.read((read) => listMeasures(read, homeId));
      expect(stored.map((record) => record.measure.type)).toEqual(MEASURES.map((m) => m.type));
      expect(stored.map((record) => record.measure.byUnits?.units)).toEqual(
        MEASURES.map((m) => Number(m.units)),
      );
      await expectAxeClean(page, 'the Measures section with five measures');

      // ---- The ranked plan and its charts, as the core ranks them.
      const before = evaluated(homeId);
      await goToSection(page, 'Plan');
      const rows = page.locator('table.measures-table tbody tr[data-measure-id]');
      await expect.poll(() => rows.count()).toBe(5);
      const shownOrder = await rows.evaluateAll((elements) =>
        elements.map((element) => element.getAttribute('data-measure-id')),
      );
      const included = before.measures.filter((measure) => measure.included);
      expect(shownOrder).toEqual([
        ...included.map((measure) => measure.id),
        ...before.measures.filter((measure) => !measure.included).map((measure) => measure.id),
      ]);
      expect(
        included.length,
        JSON.stringify(before.measures.map((m) => [m.id, m.sir, m.annualSavings.usd, m.costUsd])),
      ).toBeGreaterThan(0);
      for (const measure of before.measures) {
        expect(await planRow(page, measure.id).textContent()).toContain(
          formatUsd(measure.annualSavings.usd),
        );
      }
      expect(
        await paintedPixels(page, 'section[aria-labelledby="savings-heading"] canvas'),
      ).toBeGreaterThan(2000);
      expect(
        await paintedPixels(page, 'section[aria-labelledby="path-heading"] canvas'),
      ).toBeGreaterThan(2000);
      await page.screenshot({ path: join(SCREENSHOTS, 'main-path-plan.png'), fullPage: true });

      // ---- A higher gas price: the energy stays, the gas dollars follow the price.
      await goToSection(page, 'House');
      await enter(page, 'price-naturalGas', String(RAISED_GAS_PRICE_USD_PER_THERM));
      await until(
        () => rig.project.store.read((read) => getHome(read, homeId)).data.prices?.naturalGas,
        (price) => price?.usdPerUnit === RAISED_GAS_PRICE_USD_PER_THERM,
        'the raised gas price',
      );
      const after = evaluated(homeId);
      const ratio = RAISED_GAS_PRICE_USD_PER_THERM / GAS_PRICE_USD_PER_THERM;
      // A measure valued on the same leakage both times (the plan ranks it at the same step)
      // saves the same energy; its gas dollars are its therms × the gas price, so they grow by
      // the price's ratio, and its electricity (the ventilation fan's) is priced as before.
      // A higher price may let more measures into the package and so move those ranked after.
      let sameSteps = 0;
      for (const measure of before.measures) {
        const repriced = after.measures.find((candidate) => candidate.id === measure.id);
        if (repriced === undefined) throw new Error(`${measure.id} left the plan`);
        if (repriced.cfm50Before !== measure.cfm50Before) continue;
        sameSteps += 1;
        expect(repriced.annualSavings.heatingFuelUnits).toBeCloseTo(
          measure.annualSavings.heatingFuelUnits,
          9,
        );
        const gasBefore = measure.annualSavings.heatingFuelUnits * GAS_PRICE_USD_PER_THERM;
        const electricity = measure.annualSavings.usd - gasBefore;
        // Each figure is rounded to the cent: within a cent and a half of the exact ratio.
        expect(
          Math.abs(repriced.annualSavings.usd - (gasBefore * ratio + electricity)),
        ).toBeLessThan(0.015);
      }
      expect(sameSteps).toBeGreaterThanOrEqual(2);
      await goToSection(page, 'Plan');
      for (const measure of after.measures) {
        await expect
          .poll(() => planRow(page, measure.id).textContent())
          .toContain(formatUsd(measure.annualSavings.usd));
      }

      // ---- SI and back.
      const first = after.measures[0];
      if (first === undefined) throw new Error('no measure in the plan');
      await page.getByLabel('SI (m, L/s)').check();
      // 1 cfm = 0.3048³ × 1000 / 60 L/s (NIST SP 811: 1 ft = 0.3048 m).
      const litersPerSecond = (first.cfm50Reduction * 0.3048 ** 3 * 1000) / 60;
      await expect
        .poll(() => planRow(page, first.id).textContent())
        .toContain(`${formatNumber(litersPerSecond)} L/s`);
      await page.getByLabel('IP (ft, cfm)').check();
      await expect
        .poll(() => planRow(page, first.id).textContent())
        .toContain(`${formatNumber(first.cfm50Reduction)} cfm`);

      // ---- The proposal, printed to PDF, with the plan's totals in its text.
      await goToSection(page, 'Proposal');
      await page.locator('.proposal-document').waitFor();
      await expectAxeClean(page, 'the Proposal');
      await page.emulateMedia({ media: 'print' });
      const pdfPath = join(SCREENSHOTS, 'main-path-proposal.pdf');
      await page.pdf({
        path: pdfPath,
        format: 'Letter',
        printBackground: true,
        preferCSSPageSize: true,
      });
      await page.emulateMedia({ media: 'screen' });
      const text = pdfPages(pdfPath).join(' ');
      for (const figure of [
        formatUsd(after.package.costUsd, { cents: true }),
        formatUsd(after.package.annualSavingsUsd),
        formatUsd(after.package.npvUsd, { cents: true }),
      ]) {
        expect(holdsFigure(text, figure), `${figure} in the proposal's text`).toBe(true);
      }
      expect(text).toContain('27 Fern Row');

      // ---- A reload finds everything as it was.
      await page.reload();
      await page.locator('.proposal-document').waitFor();
      expect(new URL(page.url()).hash).toBe(`#/homes/${homeId}/proposal`);
      await goToSection(page, 'House');
      expect(await page.locator('#price-naturalGas').inputValue()).toBe(
        String(RAISED_GAS_PRICE_USD_PER_THERM),
      );
      expect(await page.locator('#climate-hdd').inputValue()).toBe('7200');
      expect(await page.locator('#house-conditionedVolumeFt3').inputValue()).toBe('13120');
      await goToSection(page, 'Leak test');
      expect(await page.getByRole('table').first().textContent()).toContain(
        `${formatNumber(fit.cfm50)} cfm`,
      );
      await goToSection(page, 'Plan');
      await expect.poll(() => rows.count()).toBe(5);
      for (const measure of after.measures) {
        expect(await planRow(page, measure.id).textContent()).toContain(
          formatUsd(measure.annualSavings.usd),
        );
      }
      expect(evaluated(homeId)).toEqual(after);

      // ---- The command line prints the same figures for the same home.
      const homeFile = rig.project.store.read((read) => exportHomeFile(read, homeId));
      const filePath = join(SCREENSHOTS, 'main-path-home.json');
      writeFileSync(filePath, JSON.stringify(homeFile));
      const cli = execFileSync(process.execPath, ['electron/sealwork.js', 'evaluate', filePath], {
        cwd: REPO_ROOT,
        encoding: 'utf8',
      });
      for (const figure of [
        formatUsd(after.package.costUsd, { cents: true }),
        formatUsd(after.package.npvUsd, { cents: true }),
        formatUsd(after.package.annualSavingsUsd),
        ...after.measures.map((measure) => formatUsd(measure.annualSavings.usd)),
      ]) {
        expect(cli, `${figure} in the command line's text`).toContain(figure);
      }
      const planText = (await page.locator('#package-heading ~ dl').textContent()) ?? '';
      expect(planText).toContain(formatUsd(after.package.costUsd, { cents: true }));
      expect(planText).toContain(formatUsd(after.package.npvUsd, { cents: true }));

      // ---- A loan: its rate and term in the Analysis panel, the payment against the savings.
      await goToSection(page, 'House');
      await enter(page, 'analysis-loan-apr', '6.9');
      await enter(page, 'analysis-loan-months', '60');
      await until(
        () => rig.project.store.read((read) => getHome(read, homeId)).data.financing,
        (terms) => terms?.months === 60,
        'the loan terms',
      );
      expect(rig.project.store.read((read) => getHome(read, homeId)).data.financing).toEqual({
        aprNominal: 0.069,
        months: 60,
      });
      const financed = evaluated(homeId).package.financing;
      if (financed === null) throw new Error('the financed home has no loan figures');
      await goToSection(page, 'Plan');
      const loanPanel = page.locator('section[aria-labelledby="loan-heading"]');
      for (const amount of [
        financed.monthlyPaymentUsd,
        financed.monthlySavingsUsd,
        financed.firstYearNetUsd,
        financed.totalPaidUsd,
        financed.lifetimeNetUsd,
      ]) {
        await expect
          .poll(() => loanPanel.textContent())
          .toContain(formatUsd(amount, { cents: true }));
      }
      // The proposal says the same to the family.
      await goToSection(page, 'Proposal');
      const loanPart = page.locator('section[aria-labelledby="proposal-loan"]');
      await expect
        .poll(() => loanPart.textContent())
        .toContain(formatUsd(financed.monthlyPaymentUsd, { cents: true }));
      expect(await loanPart.textContent()).toContain(
        formatUsd(financed.lifetimeNetUsd, { cents: true }),
      );
      await expectAxeClean(page, 'the Proposal with a loan');
      expectHealthy(watched);
      await watched.close();
    },
  );
});

describe('the main path by keyboard alone', () => {
  /** Tabs to a box, types into it (replacing what was there) and leaves it with Tab. */
  async function typeInto(page: Page, selector: string, text: string): Promise<void> {
    await tabTo(page, page.locator(selector), 150);
    await page.keyboard.press('Control+A');
    await page.keyboard.type(text);
    await page.keyboard.press('Tab');
  }

  /** Tabs to a button or link and presses Enter, the focus ring shown. */
  async function press(page: Page, target: Locator): Promise<void> {
    await tabTo(page, target, 150);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
  }

  /** Chooses an option of a select by keyboard: focus it, then arrow to the option. */
  async function choose(page: Page, selector: string, value: string): Promise<void> {
    const select = page.locator(selector);
    await tabTo(page, select, 150);
    const values = await select.evaluate((element) =>
      [...(element as HTMLSelectElement).options].map((option) => option.value),
    );
    const target = values.indexOf(value);
    const current = values.indexOf(await select.inputValue());
    if (target < 0) throw new Error(`${selector} has no option ${value}`);
    const key = target > current ? 'ArrowDown' : 'ArrowUp';
    for (let step = 0; step < Math.abs(target - current); step++) await page.keyboard.press(key);
    await expect.poll(() => select.inputValue()).toBe(value);
  }

  it(
    'makes a home, enters a test, adds a measure and reaches its plan and proposal',
    { timeout: PATH_TIMEOUT_MS },
    async () => {
      const watched = await rig.open();
      const { page } = watched;
      await page.getByRole('table').first().waitFor();

      await press(page, page.locator('#homes-new'));
      await page.locator('#new-home-name').waitFor();
      await typeInto(page, '#new-home-name', '9 Quarry Bend: keyboard-only home');
      for (const [key, value] of Object.entries(HOUSE))
        await typeInto(page, `#new-home-${key}`, value);
      await choose(page, '#new-home-shelterClass', '2');
      await choose(page, '#new-home-foundation', 'slab');
      await press(page, page.getByRole('button', { name: 'Make the home' }));
      await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
      const homeId = Number(/#\/homes\/(\d+)\//.exec(new URL(page.url()).hash)?.[1]);

      await typeInto(page, '#climate-name', 'Quarry gauge');
      await typeInto(page, '#climate-hdd', '6100');
      await typeInto(page, '#climate-cdd', '500');
      await typeInto(page, '#climate-elevation', '1200');
      await choose(page, '#climate-zone', '3');
      await choose(page, '#heating-equipment', 'boiler');
      await choose(page, '#heating-fuel', 'heatingOil');
      await typeInto(page, '#heating-afue', '84');
      await typeInto(page, '#price-heatingOil', '3.9');
      await typeInto(page, '#price-electricity', '0.16');
      await until(
        () => rig.project.store.read((read) => getHome(read, homeId)).data,
        (stored) =>
          stored.prices?.electricity?.usdPerUnit === 0.16 && stored.heating?.fuel === 'heatingOil',
        'the keyboard-typed description',
      );

      await page.keyboard.press('Alt+2');
      await page.getByRole('heading', { level: 2, name: 'Leak test' }).waitFor();
      await press(page, page.getByRole('button', { name: 'Enter a new test' }));
      // Tab reaches a radio group at its chosen radio; the arrows move the choice.
      await tabTo(page, page.getByLabel('Several pressures'), 40);
      await page.keyboard.press('ArrowDown');
      await expect.poll(() => page.getByLabel('One point at 50 Pa').isChecked()).toBe(true);
      await typeInto(page, '#test-cfm50', '2650');
      await press(page, page.getByRole('button', { name: 'Save the test' }));
      await until(
        () => rig.project.store.read((read) => listLeakageTests(read, homeId)),
        (tests) => tests[0]?.test.cfm50 === 2650,
        'the one-point test',
      );

      await page.keyboard.press('Alt+3');
      await page.getByRole('heading', { level: 2, name: 'Measures' }).waitFor();
      await choose(page, '#add-type', 'attic-top-plates');
      await typeInto(page, '#add-units', '90');
      await press(page, page.getByRole('button', { name: 'Add the measure' }));
      await until(
        () => rig.project.store.read((read) => listMeasures(read, homeId)),
        (measures) => measures.length === 1,
        'the measure',
      );

      await page.keyboard.press('Alt+4');
      await page.getByRole('heading', { level: 2, name: 'Plan' }).waitFor();
      const report = evaluated(homeId);
      const measure = report.measures[0];
      if (measure === undefined) throw new Error('the plan holds no measure');
      await expect
        .poll(() => planRow(page, measure.id).textContent())
        .toContain(formatUsd(measure.annualSavings.usd));

      await page.keyboard.press('Alt+6');
      await page.getByRole('heading', { level: 2, name: 'Proposal' }).waitFor();
      await page.locator('.proposal-document').waitFor();
      await tabTo(page, page.getByRole('button', { name: 'Print or save as PDF' }), 150);
      expect(await focusRingShown(page)).toBe(true);
      expectHealthy(watched);
      await watched.close();
    },
  );
});
