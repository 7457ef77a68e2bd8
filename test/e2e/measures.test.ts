/**
 * A home's Measures section end to end: the stored measures listed, measures added from the
 * library by keyboard with each of the three estimates, every kind of field of a stored
 * measure changed (quantity, direct and share ranges, cost line items, life, location, the
 * health-and-safety flag, notes), refusals kept in their boxes with the store's words beside
 * them, SI entry, a status change that moves a measure out of the package, and a deletion.
 * Each check is made against the project's store and the core's evaluation (through the
 * channels, beside the page), never against the screen's code.
 *
 * NIST SP 811 (2008), appendix B, for the unit factors: 1 ft = 0.3048 m exactly, so
 * 1 ft³/min = 0.3048³ × 1000 / 60 L/s ≈ 0.4719474 L/s.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; WCAG 2.2 success criteria 2.1.1 Keyboard, 2.4.7 Focus Visible and 3.3.1
 * Error Identification for the keyboard and refusal checks (from memory); the W3C Content
 * Security Policy Level 3 `securitypolicyviolation` event for CSP breaches.
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber, formatRatio, formatUsd } from '../../core/format.ts';
import type { MeasureType } from '../../core/measure-library/types.ts';
import { estimateReductionCfm50 } from '../../core/measures.ts';
import type { EvaluationReport, MeasureReport } from '../../core/report.ts';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { listMeasures, type MeasureRecord } from '../../db/repositories/measures.ts';
import { getSettings } from '../../db/repositories/settings.ts';
import { callChannel } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import type { WatchedPage } from './_lib/page-watch.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

/** NIST SP 811 (2008), appendix B: 1 ft = 0.3048 m exactly, so 1 ft³/min = 0.3048³ × 1000 / 60 L/s. */
const METERS_PER_FOOT = 0.3048;
const LITERS_PER_SECOND_PER_CFM = (METERS_PER_FOOT ** 3 * 1000) / 60;
/** Enough Tab presses to cross the workspace's navigation, the measures table and a form. */
const TABS = 260;

let rig: Rig;
let home: HomeSummary;
/** A second demo home, for the changes to stored measures (the first one's are declined and deleted). */
let editHome: HomeSummary;
let library: MeasureType[];

function evaluated(homeId: number): EvaluationReport {
  const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId });
  if (!reply.ok) throw new Error(`demo home ${homeId} was not evaluated: ${reply.error.message}`);
  return reply.value;
}

function stored(homeId = home.id): MeasureRecord[] {
  return rig.project.store.read((read) => listMeasures(read, homeId));
}

function storedRecord(homeId: number, id: number): MeasureRecord {
  const record = stored(homeId).find((entry) => entry.id === id);
  if (record === undefined) throw new Error(`measure ${id} is not stored`);
  return record;
}

function typeOf(typeId: string): MeasureType {
  const type = library.find((entry) => entry.id === typeId);
  if (type === undefined) throw new Error(`${typeId} is not in the library`);
  return type;
}

function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Opens the home's workspace from the Homes list by keyboard, then its Measures section. */
async function openMeasuresByKeyboard(homeId = home.id): Promise<WatchedPage> {
  const watched = await rig.open();
  const { page } = watched;
  await page.getByRole('table').first().waitFor();
  await tabTo(page, page.locator(`[data-home-id="${homeId}"]`), 80);
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
  await tabTo(page, page.locator(selector), TABS);
  await page.keyboard.press('ControlOrMeta+A');
  if (text === '') await page.keyboard.press('Backspace');
  else await page.keyboard.type(text);
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-measures-');
  const demoHomes = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  const reply = callChannel({ store: rig.project.store }, 'library.list', {});
  if (!reply.ok) throw new Error(`the library was not listed: ${reply.error.message}`);
  library = reply.value.types;
  // A home with a package of two or more, so declining one leaves a package to compare.
  const found = demoHomes.find(
    (row) => evaluated(row.id).measures.filter((measure) => measure.included).length >= 2,
  );
  if (found === undefined) throw new Error('no demo home of the kind these checks need');
  home = found;
  // Another home with a packaged measure counted by the foot and estimated by quantity, and
  // at least two more packaged measures, for the changes to stored measures.
  const other = demoHomes.find((row) => {
    if (row.id === home.id) return false;
    const report = evaluated(row.id);
    const included = report.measures.filter((measure) => measure.included);
    return (
      included.length >= 3 &&
      stored(row.id).some(
        (record) =>
          record.measure.byUnits !== undefined &&
          typeOf(record.measure.type).unit === 'linearFt' &&
          included.some((measure) => measure.id === record.measure.id && !measure.healthAndSafety),
      )
    );
  });
  if (other === undefined) throw new Error('no second demo home of the kind these checks need');
  editHome = other;
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
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
    await watched.close();
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
    await watched.close();
  });

  it('adds a measure from the library by keyboard; the store and the Plan then hold it', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const before = stored();
    await tabTo(page, page.locator('#add-type'), TABS);
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
    const settings = rig.project.store.read((read) => getSettings(read));
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
    await tabTo(page, plan, TABS);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 2, name: 'Plan' }).waitFor();
    await page.locator(`tr[data-measure-id="${newId}"]`).waitFor();
    expectHealthy(watched);
    await watched.close();
  });

  it('marks a packaged measure declined, and the report leaves it out', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const inPackage = evaluated(home.id).measures.find((measure) => measure.included);
    if (inPackage === undefined) throw new Error('the home has no package');
    const record = stored().find((entry) => entry.measure.id === inPackage.id);
    if (record === undefined) throw new Error(`${inPackage.id} is not stored`);
    const status = page.locator(`#measure-${record.id}-status`);
    await tabTo(page, status, TABS);
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
    await watched.close();
  });

  it('deletes a measure only after the confirmation, by keyboard', async () => {
    const watched = await openMeasuresByKeyboard();
    const { page } = watched;
    const records = stored();
    const last = records.at(-1);
    if (last === undefined) throw new Error('no measure to delete');
    await tabTo(page, page.locator(`#measure-${last.id}-delete`), TABS);
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
    await watched.close();
  });
});

/**
 * What the measure's row says of the plan, restated from the core's report: the rank and the
 * CFM50 a packaged measure removes, and its SIR (health-and-safety work has none).
 */
function planWordsOf(measure: MeasureReport, units: 'IP' | 'SI' = 'IP'): string {
  const worth = measure.healthAndSafety ? 'health and safety' : `SIR ${formatRatio(measure.sir)}`;
  const removed =
    units === 'IP'
      ? `${formatNumber(measure.cfm50Reduction)} cfm`
      : `${formatNumber(measure.cfm50Reduction * LITERS_PER_SECOND_PER_CFM)} L/s`;
  if (measure.included)
    return `Plan: rank ${formatNumber(measure.rank)}, removes ${removed}, ${worth}`;
  if (measure.status === 'declined') return 'Plan: left out, declined';
  return `Plan: left out, ${worth}`;
}

function reportedMeasure(homeId: number, measureId: string): MeasureReport {
  const measure = evaluated(homeId).measures.find((entry) => entry.id === measureId);
  if (measure === undefined) throw new Error(`${measureId} is not in the core's report`);
  return measure;
}

/** Waits until the measure's row shows the plan the core evaluates for the stored home now. */
async function expectPlanShown(
  page: Page,
  homeId: number,
  measureId: string,
  units: 'IP' | 'SI' = 'IP',
): Promise<MeasureReport> {
  const measure = reportedMeasure(homeId, measureId);
  const line = page.locator(`#measures-list tr[data-measure-id="${measureId}"] [data-plan]`);
  await expect
    .poll(async () => (await line.textContent())?.trim())
    .toBe(planWordsOf(measure, units));
  return measure;
}

/** Opens a home's Measures section by its address (the keyboard path is checked above). */
async function openMeasuresAt(homeId: number): Promise<WatchedPage> {
  const watched = await rig.open();
  await watched.page.getByRole('table').first().waitFor();
  await watched.page.evaluate((hash) => (location.hash = hash), `#/homes/${homeId}/measures`);
  await watched.page.getByRole('heading', { level: 2, name: 'Measures' }).waitFor();
  await watched.page.locator('#add-type option').first().waitFor({ state: 'attached' });
  // The section has the home's evaluation once every row says what the plan made of it.
  const planLine = watched.page.locator('#measures-list tr[data-measure-id] [data-plan]').first();
  await expect.poll(async () => (await planLine.textContent()) ?? '').toMatch(/^Plan: (rank|left)/);
  return watched;
}

/** Opens a stored measure's form by keyboard; the focus lands on its chosen estimate. */
async function openChangeForm(page: Page, record: MeasureRecord): Promise<void> {
  await tabTo(page, page.locator(`#measure-${record.id}-edit`), TABS);
  expect(await focusRingShown(page)).toBe(true);
  await page.keyboard.press('Enter');
  await page.locator(`#measure-${record.id}-form`).waitFor();
  expect(
    await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.checked),
  ).toBe(true);
}

/** Presses Enter in the focused box (the form's implicit submission) and waits for the save. */
async function submitAndWaitSaved(page: Page, record: MeasureRecord): Promise<void> {
  await page.keyboard.press('Enter');
  await page
    .getByRole('status')
    .filter({ hasText: `Saved ${record.measure.id}` })
    .waitFor();
  await page.locator(`#measure-${record.id}-form`).waitFor({ state: 'detached' });
  // The focus goes back to the measure's Change button.
  await expect
    .poll(() => page.evaluate(() => document.activeElement?.id))
    .toBe(`measure-${record.id}-edit`);
}

/**
 * Chooses a form's estimate by keyboard: Tab to its checked choice, then arrow keys (which
 * move round the group) until `method` is checked.
 */
async function chooseMethod(page: Page, prefix: string, method: string): Promise<void> {
  const group = page.locator(`input[name="${prefix}-estimate"]`);
  await tabTo(page, group.and(page.locator(':checked')), TABS);
  const target = page.locator(`#${prefix}-method-${method}`);
  for (let step = 0; step < 3 && !(await target.isChecked()); step++) {
    await page.keyboard.press('ArrowDown');
  }
  expect(await target.isChecked()).toBe(true);
}

/** Chooses an option of a select by keyboard: arrow keys until its value is `value`. */
async function chooseByKeyboard(page: Page, selector: string, value: string): Promise<void> {
  const select = page.locator(selector);
  await tabTo(page, select, TABS);
  const values = await select
    .locator('option')
    .evaluateAll((all) => all.map((option) => (option as HTMLOptionElement).value));
  const from = values.indexOf(await select.inputValue());
  const to = values.indexOf(value);
  if (to < 0) throw new Error(`${selector} offers no ${value}`);
  for (let step = 0; step < Math.abs(to - from); step++) {
    await page.keyboard.press(to > from ? 'ArrowDown' : 'ArrowUp');
  }
  expect(await select.inputValue()).toBe(value);
}

/** A packaged measure of the edit home estimated by quantity, counted by the foot. */
function footMeasure(): MeasureRecord {
  const report = evaluated(editHome.id);
  const record = stored(editHome.id).find(
    (entry) =>
      entry.measure.byUnits !== undefined &&
      typeOf(entry.measure.type).unit === 'linearFt' &&
      report.measures.some(
        (measure) =>
          measure.id === entry.measure.id && measure.included && !measure.healthAndSafety,
      ),
  );
  if (record === undefined) throw new Error('no packaged by-the-foot measure to change');
  return record;
}

/** Id of the first stored measure of the edit home whose type is counted by the foot. */
let footRecordId: number;

describe('changing a stored measure', { timeout: TEST_TIMEOUT_MS * 2 }, () => {
  it('changes the quantity, then a direct range, then a share, by keyboard; the store holds each and the plan follows', async () => {
    const record = footMeasure();
    footRecordId = record.id;
    const key = record.measure.id;
    const before = reportedMeasure(editHome.id, key);
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;
    await expectPlanShown(page, editHome.id, key);

    await openChangeForm(page, record);
    expect(await page.locator(`#edit-${record.id}-units`).inputValue()).toBe(
      String(record.measure.byUnits?.units),
    );
    expect(await page.locator(`#edit-${record.id}-units-unit`).textContent()).toBe('ft');
    expect(await axeViolations(page)).toEqual([]);
    await page.locator(`#measure-${record.id}-form`).scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-measures-change.png') });
    // The layout holds on a small and a large screen: nothing wider than the window.
    for (const size of [
      { width: 1024, height: 768 },
      { width: 1920, height: 1080 },
    ]) {
      await page.setViewportSize(size);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
        size.width,
      );
      await page.screenshot({
        path: join(SCREENSHOTS, `workspace-measures-change-${size.width}.png`),
      });
    }
    await page.setViewportSize({ width: 1280, height: 800 });

    // Quantity: half the stored feet.
    const units = Math.max(1, Math.round((record.measure.byUnits?.units ?? 2) / 2));
    await typeInto(page, `#edit-${record.id}-units`, String(units));
    await submitAndWaitSaved(page, record);
    expect(storedRecord(editHome.id, record.id).measure.byUnits?.units).toBe(units);
    const afterUnits = await expectPlanShown(page, editHome.id, key);
    expect(afterUnits.estimateCfm50.likely).not.toBeCloseTo(before.estimateCfm50.likely, 3);

    // Direct range: the boxes start from the plan's reading of the stored estimate.
    await page.keyboard.press('Enter');
    await page.locator(`#measure-${record.id}-form`).waitFor();
    await chooseMethod(page, `edit-${record.id}`, 'direct');
    expect(await page.locator(`#edit-${record.id}-likely`).inputValue()).toBe(
      String(Math.round(afterUnits.estimateCfm50.likely)),
    );
    expect(await page.locator(`#edit-${record.id}-likely-unit`).textContent()).toBe('CFM50');
    await typeInto(page, `#edit-${record.id}-low`, '40');
    await typeInto(page, `#edit-${record.id}-likely`, '65');
    await typeInto(page, `#edit-${record.id}-high`, '95');
    await submitAndWaitSaved(page, record);
    const direct = storedRecord(editHome.id, record.id).measure;
    expect(direct.reductionCfm50).toEqual({ low: 40, likely: 65, high: 95 });
    expect(direct.byUnits).toBeUndefined();
    const afterDirect = await expectPlanShown(page, editHome.id, key);
    expect(afterDirect.estimateMethod).toBe('direct');
    expect(afterDirect.estimateCfm50).toEqual({ low: 40, likely: 65, high: 95 });

    // A share of the location's leakage, typed as percentages.
    await page.keyboard.press('Enter');
    await page.locator(`#measure-${record.id}-form`).waitFor();
    await chooseMethod(page, `edit-${record.id}`, 'share');
    expect(await page.locator(`#edit-${record.id}-share-low-unit`).textContent()).toBe('%');
    await typeInto(page, `#edit-${record.id}-share-low`, '10');
    await typeInto(page, `#edit-${record.id}-share-likely`, '20');
    await typeInto(page, `#edit-${record.id}-share-high`, '30');
    await submitAndWaitSaved(page, record);
    const share = storedRecord(editHome.id, record.id).measure;
    expect(share.reductionCfm50).toBeUndefined();
    expect(share.shareOfLocation?.share.low).toBeCloseTo(0.1, 12);
    expect(share.shareOfLocation?.share.likely).toBeCloseTo(0.2, 12);
    expect(share.shareOfLocation?.share.high).toBeCloseTo(0.3, 12);
    const afterShare = await expectPlanShown(page, editHome.id, key);
    expect(afterShare.estimateMethod).toBe('shareOfLocation');
    expectHealthy(watched);
    await watched.close();
  });

  it('changes the cost line items, then life, location, the health-and-safety flag and notes', async () => {
    const report = evaluated(editHome.id);
    const record = stored(editHome.id).find(
      (entry) =>
        entry.id !== footRecordId &&
        report.measures.some(
          (measure) =>
            measure.id === entry.measure.id && measure.included && !measure.healthAndSafety,
        ),
    );
    if (record === undefined) throw new Error('no second packaged measure to change');
    const key = record.measure.id;
    const before = reportedMeasure(editHome.id, key);
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;

    await openChangeForm(page, record);
    await typeInto(page, `#edit-${record.id}-materials`, '123.45');
    await typeInto(page, `#edit-${record.id}-hours`, '3.5');
    await typeInto(page, `#edit-${record.id}-rate`, '61');
    await typeInto(page, `#edit-${record.id}-markup`, '12');
    await submitAndWaitSaved(page, record);
    const cost = storedRecord(editHome.id, record.id).measure.cost;
    expect(cost.materialsUsd).toBe(123.45);
    expect(cost.laborHours).toBe(3.5);
    expect(cost.laborRateUsdPerHour).toBe(61);
    expect(cost.markupFraction).toBeCloseTo(0.12, 12);
    const afterCost = await expectPlanShown(page, editHome.id, key);
    // Materials 123.45 + labour 3.5 h × $61 = 213.50, markup 12 % of 336.95 = 40.43 (to the cent).
    expect(afterCost.costUsd).toBeCloseTo(123.45 + 213.5 + 40.43, 2);
    expect(afterCost.sir).not.toBe(before.sir);
    const row = page.locator(`#measures-list tr[data-measure-id="${key}"]`);
    expect(await row.locator('dd.total').textContent()).toBe(
      formatUsd(afterCost.costUsd, { cents: true }),
    );

    await page.keyboard.press('Enter');
    await page.locator(`#measure-${record.id}-form`).waitFor();
    const type = typeOf(record.measure.type);
    expect(await page.locator(`#edit-${record.id}-life`).inputValue()).toBe(
      String(record.measure.lifeYears ?? type.defaultLifeYears),
    );
    const location = type.location === 'floor' ? 'wall' : 'floor';
    await typeInto(page, `#edit-${record.id}-life`, '31');
    await chooseByKeyboard(page, `#edit-${record.id}-location`, location);
    await tabTo(page, page.locator(`#edit-${record.id}-hs`), TABS);
    await page.keyboard.press('Space');
    expect(await page.locator(`#edit-${record.id}-hs`).isChecked()).toBe(true);
    await typeInto(page, `#edit-${record.id}-note`, 'Seal behind the dryer vent first.');
    await tabTo(page, page.getByRole('button', { name: `Save ${key}` }), TABS);
    expect(await focusRingShown(page)).toBe(true);
    await page.keyboard.press('Enter');
    await page
      .getByRole('status')
      .filter({ hasText: `Saved ${key}` })
      .waitFor();
    const details = storedRecord(editHome.id, record.id).measure;
    expect(details.lifeYears).toBe(31);
    expect(details.location).toBe(location);
    expect(details.cost.healthAndSafety).toBe(true);
    expect(details.note).toBe('Seal behind the dryer vent first.');
    const afterDetails = await expectPlanShown(page, editHome.id, key);
    expect(afterDetails.lifeYears).toBe(31);
    expect(afterDetails.location).toBe(location);
    // Health-and-safety work goes first in the plan and has no SIR of its own.
    expect(afterDetails.healthAndSafety).toBe(true);
    expect(afterDetails.sir).toBeNull();
    expectHealthy(watched);
    await watched.close();
  });

  it('keeps a refused value in its box with the store’s words beside it, and stores nothing', async () => {
    const record = storedRecord(editHome.id, footRecordId);
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;
    await openChangeForm(page, record);
    await typeInto(page, `#edit-${record.id}-hours`, '-2');
    await page.keyboard.press('Enter');
    const error = page.locator(`#edit-${record.id}-hours-error`);
    await error.waitFor();
    // The store's rule (core/schema.ts costSchema): labour hours are at least 0.
    expect(await error.textContent()).toContain('at least 0 hours');
    expect(await page.locator(`#edit-${record.id}-hours`).inputValue()).toBe('-2');
    expect(await page.locator(`#edit-${record.id}-hours`).getAttribute('aria-invalid')).toBe(
      'true',
    );
    expect(await page.evaluate(() => document.activeElement?.id)).toBe(`edit-${record.id}-hours`);
    expect(storedRecord(editHome.id, record.id)).toEqual(record);

    // A share whose low is above its high: the store's order rule, beside the three boxes.
    await typeInto(page, `#edit-${record.id}-hours`, '2');
    await chooseMethod(page, `edit-${record.id}`, 'share');
    await typeInto(page, `#edit-${record.id}-share-low`, '40');
    await typeInto(page, `#edit-${record.id}-share-likely`, '20');
    await typeInto(page, `#edit-${record.id}-share-high`, '30');
    await page.keyboard.press('Enter');
    const order = page.locator(`#edit-${record.id}-share-range-error`);
    await order.waitFor();
    expect(await order.textContent()).toContain('low ≤ likely ≤ high');
    expect(await order.textContent()).toContain('40% / 20% / 30%');
    expect(await page.locator(`#edit-${record.id}-share-low`).inputValue()).toBe('40');
    expect(await page.locator(`#edit-${record.id}-hours-error`).count()).toBe(0);
    expect(storedRecord(editHome.id, record.id)).toEqual(record);
    expect(await axeViolations(page)).toEqual([]);
    await page.locator(`#measure-${record.id}-form`).scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-measures-refused.png') });

    // Escape drops the changes; the focus goes back to the Change button.
    await page.keyboard.press('Escape');
    await page.locator(`#measure-${record.id}-form`).waitFor({ state: 'detached' });
    expect(await page.evaluate(() => document.activeElement?.id)).toBe(`measure-${record.id}-edit`);
    expect(storedRecord(editHome.id, record.id)).toEqual(record);
    expectHealthy(watched);
    await watched.close();
  });

  it('in SI, stores typed metres and L/s as feet and cfm by NIST SP 811’s factors, and says a limit in L/s', async () => {
    const record = storedRecord(editHome.id, footRecordId);
    const key = record.measure.id;
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;
    try {
      await tabTo(page, page.getByRole('radio', { name: /^IP/ }), TABS);
      await page.keyboard.press('ArrowDown');
      await expect.poll(() => rig.project.store.read((read) => getSettings(read)).units).toBe('SI');

      // Back to a by-quantity estimate, typed in metres.
      await openChangeForm(page, record);
      await chooseMethod(page, `edit-${record.id}`, 'byUnits');
      expect(await page.locator(`#edit-${record.id}-units-unit`).textContent()).toBe('m');
      await typeInto(page, `#edit-${record.id}-units`, '20');
      await submitAndWaitSaved(page, record);
      expect(storedRecord(editHome.id, record.id).measure.byUnits?.units).toBeCloseTo(
        20 / METERS_PER_FOOT,
        9,
      );
      await expectPlanShown(page, editHome.id, key, 'SI');

      // A direct range typed in L/s at 50 Pa.
      await page.keyboard.press('Enter');
      await page.locator(`#measure-${record.id}-form`).waitFor();
      await chooseMethod(page, `edit-${record.id}`, 'direct');
      expect(await page.locator(`#edit-${record.id}-likely-unit`).textContent()).toBe(
        'L/s at 50 Pa',
      );
      await typeInto(page, `#edit-${record.id}-low`, '20');
      await typeInto(page, `#edit-${record.id}-likely`, '35');
      await typeInto(page, `#edit-${record.id}-high`, '50');
      await submitAndWaitSaved(page, record);
      const direct = storedRecord(editHome.id, record.id).measure.reductionCfm50;
      expect(direct?.low).toBeCloseTo(20 / LITERS_PER_SECOND_PER_CFM, 9);
      expect(direct?.likely).toBeCloseTo(35 / LITERS_PER_SECOND_PER_CFM, 9);
      expect(direct?.high).toBeCloseTo(50 / LITERS_PER_SECOND_PER_CFM, 9);
      await expectPlanShown(page, editHome.id, key, 'SI');

      // Over the store's limit: the store's own bound, asked of it in cfm, read back in L/s.
      const saved = storedRecord(editHome.id, record.id);
      const probe = callChannel({ store: rig.project.store }, 'measures.update', {
        id: record.id,
        measure: { ...saved.measure, reductionCfm50: { low: 1, likely: 2, high: 1e9 } },
      });
      if (probe.ok) throw new Error('the store took a billion CFM50');
      const limitCfm = Number(/at most (\d+)/.exec(probe.error.message)?.[1]);
      expect(limitCfm).toBeGreaterThan(0);
      const limitLps = limitCfm * LITERS_PER_SECOND_PER_CFM;
      const tooMuch = String(Math.ceil(limitLps) + 1000);
      await page.keyboard.press('Enter');
      await page.locator(`#measure-${record.id}-form`).waitFor();
      await typeInto(page, `#edit-${record.id}-high`, tooMuch);
      await page.keyboard.press('Enter');
      const error = page.locator(`#edit-${record.id}-high-error`);
      await error.waitFor();
      const words = (await error.textContent()) ?? '';
      expect(words).toContain(
        `at most ${limitLps.toLocaleString('en-US', { maximumFractionDigits: 2 })} L/s at 50 Pa`,
      );
      expect(words).not.toContain(String(limitCfm));
      expect(words).not.toContain(limitCfm.toLocaleString('en-US'));
      expect(await page.locator(`#edit-${record.id}-high`).inputValue()).toBe(tooMuch);
      expect(storedRecord(editHome.id, record.id)).toEqual(saved);
      expect(await axeViolations(page)).toEqual([]);
      await page.locator(`#measure-${record.id}-form`).scrollIntoViewIfNeeded();
      await page.screenshot({ path: join(SCREENSHOTS, 'workspace-measures-si-refused.png') });
      expectHealthy(watched);
    } finally {
      callChannel({ store: rig.project.store }, 'settings.update', { units: 'IP' });
      await watched.close();
    }
  });
});

describe('adding a measure with each estimate', { timeout: TEST_TIMEOUT_MS }, () => {
  it('adds a direct estimate that starts from the library’s figures, with life, location and the health-and-safety choice', async () => {
    const before = stored(editHome.id);
    const report = evaluated(editHome.id);
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;
    const type = typeOf(await page.locator('#add-type').inputValue());
    await typeInto(page, '#add-units', '4');
    await chooseMethod(page, 'add', 'direct');
    // The library's per-unit figures × 4 at the house's flow exponent, as the core counts them.
    const library4 = estimateReductionCfm50(
      {
        id: 'probe',
        type: type.id,
        byUnits: { units: 4 },
        cost: { materialsUsd: 0, laborHours: 0, laborRateUsdPerHour: 0 },
      },
      type,
      { exponentN: report.leakage.exponentN, testIn: { ceiling: 0, wall: 0, floor: 0, flue: 0 } },
    ).range;
    expect(await page.locator('#add-likely').inputValue()).toBe(
      String(Math.round(library4.likely)),
    );
    expect(await page.locator('#add-high').inputValue()).toBe(String(Math.round(library4.high)));
    await typeInto(page, '#add-low', '30');
    await typeInto(page, '#add-likely', '45');
    await typeInto(page, '#add-high', '70');
    expect(await page.locator('#add-life').inputValue()).toBe(String(type.defaultLifeYears));
    await typeInto(page, '#add-life', '18');
    const location = type.location === 'wall' ? 'floor' : 'wall';
    await chooseByKeyboard(page, '#add-location', location);
    await tabTo(page, page.locator('#add-hs'), TABS);
    await page.keyboard.press('Space');
    expect(await axeViolations(page)).toEqual([]);
    await page.locator('#add-location').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SCREENSHOTS, 'workspace-measures-add-direct.png') });
    const newId = await page.locator('#add-id').inputValue();
    await tabTo(page, page.getByRole('button', { name: 'Add the measure' }), TABS);
    await page.keyboard.press('Enter');
    await page
      .getByRole('status')
      .filter({ hasText: `Added ${newId}` })
      .waitFor();

    const added = stored(editHome.id).find((record) => record.measure.id === newId);
    if (added === undefined) throw new Error(`${newId} was not stored`);
    expect(stored(editHome.id).length).toBe(before.length + 1);
    expect(added.measure.reductionCfm50).toEqual({ low: 30, likely: 45, high: 70 });
    expect(added.measure.byUnits).toBeUndefined();
    expect(added.measure.lifeYears).toBe(18);
    expect(added.measure.location).toBe(location);
    expect(added.measure.cost.healthAndSafety).toBe(true);
    // The library's invented demo cost per unit × 4, to the cent (common practice for money).
    expect(added.measure.cost.materialsUsd).toBeCloseTo(
      type.defaultCost.materialsUsdPerUnit * 4,
      2,
    );
    const shown = await expectPlanShown(page, editHome.id, newId);
    expect(shown.included).toBe(true);
    expectHealthy(watched);
    await watched.close();
  });

  it('adds a share of the leakage at its location, typed as percentages', async () => {
    const watched = await openMeasuresAt(editHome.id);
    const { page } = watched;
    await chooseMethod(page, 'add', 'share');
    await typeInto(page, '#add-share-low', '5');
    await typeInto(page, '#add-share-likely', '10');
    await typeInto(page, '#add-share-high', '15');
    const newId = await page.locator('#add-id').inputValue();
    await page.keyboard.press('Enter');
    await page
      .getByRole('status')
      .filter({ hasText: `Added ${newId}` })
      .waitFor();
    const added = stored(editHome.id).find((record) => record.measure.id === newId);
    if (added === undefined) throw new Error(`${newId} was not stored`);
    expect(added.measure.shareOfLocation?.share.low).toBeCloseTo(0.05, 12);
    expect(added.measure.shareOfLocation?.share.likely).toBeCloseTo(0.1, 12);
    expect(added.measure.shareOfLocation?.share.high).toBeCloseTo(0.15, 12);
    expect(added.measure.location).toBeUndefined();
    const reported = await expectPlanShown(page, editHome.id, newId);
    expect(reported.estimateMethod).toBe('shareOfLocation');
    expectHealthy(watched);
    await watched.close();
  });
});
