/**
 * A home's bills in chromium: a bills file and a daily temperatures file made here from a
 * known house (test/_lib/billing-files.ts: base temperature τ, base load α, slope β before
 * and after the work; use = α·days + β·Σ max(0, τ − t̄), Fels 1986, "PRISM: an
 * introduction"), imported from the Leak test section, then fitted: the table shows τ back
 * and each fit's normalized annual use NAC = 365·α + β·DD_normal(τ) (DD_normal summed here),
 * and the measured savings sit beside the plan's estimate (the plan.evaluate channel's own
 * package figure). A bad file's problems and too few bills' warnings show in plain words.
 * Sources: axe-core's default rule set; the W3C CSP `securitypolicyviolation` event.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listHomes } from '../../db/repositories/homes.ts';
import { callChannel } from '../../electron/channels.ts';
import {
  billingScenario,
  billsCsv,
  normalDegreeDaysF,
  temperaturesCsv,
  type KnownHouse,
} from '../_lib/billing-files.ts';
import { axeViolations } from './_lib/axe.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-bills-');
}, SETUP_TIMEOUT_MS);

afterAll(() => rig.close());

/** A figure with one decimal as en-US writes it (thousands separated). */
function oneDecimal(value: number): string {
  return value.toLocaleString('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
}

function writeFile(name: string, text: string): string {
  const path = join(SCREENSHOTS, '..', name);
  writeFileSync(path, text);
  return path;
}

async function cellsOf(page: Page, row: string): Promise<string[]> {
  return page.locator(`#bills-fits tr[data-row="${row}"] td`).allTextContents();
}

describe('a home’s bills', { timeout: TEST_TIMEOUT_MS }, () => {
  it('imports bills and temperatures, fits them, and shows the savings beside the estimate', async () => {
    // A demo home heated by gas whose plan saves some gas, so there is an estimate to compare.
    const estimateOf = (homeId: number) => {
      const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId });
      return reply.ok ? reply.value.package.annualSavings.heatingFuelUnits : 0;
    };
    const home = rig.project.store
      .read((read) => listHomes(read))
      .find((row) => row.isDemo && row.heatingFuel === 'naturalGas' && estimateOf(row.id) > 0);
    if (!home) throw new Error('no demo home heated by natural gas with a plan that saves some');
    const estimated = estimateOf(home.id);
    const scenario = billingScenario();
    const billsPath = writeFile('generated-bills.csv', billsCsv(scenario.bills));
    const temperaturesPath = writeFile(
      'generated-temperatures.csv',
      temperaturesCsv(scenario.temperatures),
    );
    const watched = await rig.open();
    const { page } = watched;
    await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/leak-test`);
    await page.getByRole('heading', { level: 3, name: 'Bills' }).waitFor();

    await page
      .getByLabel('Bills file (CSV: periodStart, periodEnd, use, fuel)')
      .setInputFiles(billsPath);
    await page
      .getByRole('status')
      .filter({ hasText: 'Stored 24 bills from generated-bills.csv.' })
      .waitFor();
    await page
      .getByLabel('Daily temperatures file (CSV: date, meanTempF or meanTempC)')
      .setInputFiles(temperaturesPath);
    await page.getByRole('status').filter({ hasText: 'Stored 760 days of temperatures' }).waitFor();

    // By keyboard: the date, then Enter submits the fit.
    const workDone = page.getByLabel('Work done on');
    await workDone.fill(scenario.workDone);
    await workDone.press('Enter');
    await page.locator('#bills-fits').waitFor();

    const nac = (house: KnownHouse) =>
      365 * house.baseLoadPerDay +
      house.usePerDegreeDay * normalDegreeDaysF(scenario.temperatures, house.baseTempF);
    expect(await cellsOf(page, 'base')).toEqual([
      `${oneDecimal(scenario.before.baseTempF)} °F`,
      `${oneDecimal(scenario.after.baseTempF)} °F`,
    ]);
    expect(await cellsOf(page, 'nac')).toEqual([
      `${oneDecimal(nac(scenario.before))} therm a year`,
      `${oneDecimal(nac(scenario.after))} therm a year`,
    ]);
    expect(await cellsOf(page, 'r2')).toEqual(['1.000', '1.000']);
    const savings = page.locator('#bills-savings');
    await expect
      .poll(() => savings.locator('tr[data-row="measured"] td').textContent())
      .toContain(`${oneDecimal(nac(scenario.before) - nac(scenario.after))} therm a year`);
    expect(await savings.locator('tr[data-row="estimated"] td').textContent()).toBe(
      `${oneDecimal(estimated)} therm a year`,
    );
    const share = (nac(scenario.before) - nac(scenario.after)) / estimated;
    expect(await savings.locator('tr[data-row="realization"] td').textContent()).toBe(
      `${(share * 100).toLocaleString('en-US', { maximumFractionDigits: 0 })} %`,
    );
    await page.screenshot({ path: join(SCREENSHOTS, 'bills.png'), fullPage: true });
    expect(await page.getByText('No warnings: both fits meet').count()).toBe(1);
    expect(await axeViolations(page)).toEqual([]);

    // Too few bills after the work: the fit is still shown, with the warning in plain words.
    const few = billingScenario(6);
    await page
      .getByLabel('Bills file (CSV: periodStart, periodEnd, use, fuel)')
      .setInputFiles(writeFile('generated-few-bills.csv', billsCsv(few.bills)));
    await page.getByRole('status').filter({ hasText: 'Stored 18 bills' }).waitFor();
    await page.getByRole('button', { name: 'Fit the bills' }).click();
    await page.getByText('Bills after the work: only 6 bills').waitFor();
    expect(await axeViolations(page)).toEqual([]);

    // A bad file: nothing stored, its problems by line and column.
    const bad = 'periodStart,periodEnd,use,fuel\n2024-01-05,2024-02-04,lots,naturalGas\n';
    await page
      .getByLabel('Bills file (CSV: periodStart, periodEnd, use, fuel)')
      .setInputFiles(writeFile('generated-bad-bills.csv', bad));
    await page.locator('#bills-problems tr[data-line="2"][data-column="use"]').waitFor();
    expect(await axeViolations(page)).toEqual([]);
    await page.screenshot({ path: join(SCREENSHOTS, 'bills-problems.png'), fullPage: true });

    expect(watched.problems).toEqual([]);
    expect(watched.cspViolations).toEqual([]);
    await watched.context.close();
  });
});
