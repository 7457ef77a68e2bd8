/**
 * The Work order in SI units and for a home with no work, end to end in chromium: a count
 * typed in metres for a measure the home file leaves uncounted rebuilds the order as the store
 * builds it with that count in feet, a test-out reading typed in L/s is stored in cfm, a
 * reading not in digits is refused beside its box, and a plan with no measures says so.
 *
 * Sources: 1 ft = 0.3048 m exactly (the international foot of 1959); 1 cfm = 0.47194745 L/s
 * (NIST SP 811, appendix B: 1 ft³/min = 4.719474 × 10⁻⁴ m³/s); axe-core's default rule set
 * (WCAG 2.x A and AA).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber } from '../../core/format.ts';
import type { WorkOrderOptions } from '../../core/work-order.ts';
import { listHomes } from '../../db/repositories/homes.ts';
import { jobHistory } from '../../db/repositories/jobs.ts';
import { listLeakageTests } from '../../db/repositories/leakage-tests.ts';
import { callChannel } from '../../electron/channels.ts';
import { folded } from './_lib/drawn.ts';
import { SETUP_TIMEOUT_MS, startRig, type Rig } from './_lib/rig.ts';
import {
  expectAccessible,
  expectHealthy,
  storedOrder as storedOrderOf,
} from './_lib/work-order-checks.ts';

const PATH_TIMEOUT_MS = 120_000;

let rig: Rig;

function storedOrder(homeId: number, options: WorkOrderOptions = {}) {
  return storedOrderOf(rig.project.store, homeId, options);
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-work-order-units-');
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Work order section in SI units and without work', () => {
  it(
    'takes counts in metres and the reading in L/s in SI units, and refuses a reading not in digits',
    { timeout: PATH_TIMEOUT_MS },
    async () => {
      const context = { store: rig.project.store };
      const demoHomes = rig.project.store
        .read((read) => listHomes(read))
        .filter((row) => row.isDemo);
      const other = demoHomes.find((row) => {
        if (row.jobStatus !== 'audited') return false;
        try {
          // A measure still to do with no count in feet, to be counted on site in metres.
          return storedOrder(row.id).measures.some(
            (measure) =>
              measure.status !== 'done' && measure.quantity === null && measure.unit === 'linearFt',
          );
        } catch {
          return false;
        }
      });
      if (other === undefined) throw new Error('no second demo home with a work order');
      for (const to of ['approved', 'inProgress']) {
        const moved = callChannel(context, 'jobs.changeStatus', {
          homeId: other.id,
          to,
          at: '2026-01-05',
          by: 'Avery Auditor',
        });
        if (!moved.ok) throw new Error(moved.error.message);
      }
      const units = callChannel(context, 'settings.update', { units: 'SI' });
      if (!units.ok) throw new Error(units.error.message);
      try {
        const watched = await rig.open();
        const { page } = watched;
        await page.getByRole('navigation', { name: 'Screens' }).waitFor();
        await page.evaluate((place) => (location.hash = place), `#/homes/${other.id}/work-order`);
        await page.locator('.work-order-document').waitFor();

        // A count typed in metres for a measure the home file leaves uncounted: the work order
        // is built again with it in feet (1 ft = 0.3048 m exactly, the 1959 international foot).
        const uncounted = storedOrder(other.id).measures.find(
          (measure) =>
            measure.status !== 'done' && measure.quantity === null && measure.unit === 'linearFt',
        );
        if (uncounted === undefined) throw new Error('no uncounted measure');
        const metres = 30;
        const counted = storedOrder(other.id, { quantities: { [uncounted.id]: metres / 0.3048 } });
        await page.locator(`#count-${uncounted.id}`).fill(String(metres));
        await page.getByRole('button', { name: 'Use these counts' }).click();
        const countedSection = page.locator(`section[data-measure-id="${uncounted.id}"]`);
        await expect
          .poll(async () => folded(await countedSection.textContent()))
          .toContain(`Quantity ${metres} m`);
        for (const line of counted.billOfMaterials) {
          expect(
            folded(await page.locator(`tr[data-material-id="${line.materialId}"]`).textContent()),
            line.materialId,
          ).toContain(`${formatNumber(line.purchaseCount)} ${line.purchaseUnitWords}`);
        }
        expect(await page.locator('#work-order-bill tbody tr').count()).toBe(
          counted.billOfMaterials.length,
        );
        await expectAccessible(page, 'si-counted');

        const reading = page.getByLabel('Reading at 50 Pa');
        expect(folded(await page.locator('#test-out-cfm50-unit').textContent())).toBe('L/s');
        await page.locator('#test-out-by').fill('Rowan Tester');
        await page.locator('#test-out-testedOn').fill('2026-01-20');

        // Not digits: refused beside the box, nothing stored.
        const testsBefore = rig.project.store.read((read) => listLeakageTests(read, other.id));
        await reading.fill('about a thousand');
        await page.getByRole('button', { name: 'Record the test-out' }).click();
        await page.locator('#test-out-cfm50-error').waitFor();
        expect(await reading.getAttribute('aria-invalid')).toBe('true');
        expect(folded(await page.locator('#test-out-cfm50-error').textContent())).toContain('L/s');
        await expectAccessible(page, 'si-refused');

        // 1 cfm = 0.47194745 L/s (NIST SP 811, appendix B: 1 ft³/min = 4.719474 × 10⁻⁴ m³/s).
        const litersPerSecond = 900;
        await reading.fill(String(litersPerSecond));
        await page.getByRole('button', { name: 'Record the test-out' }).click();
        await page.locator('#test-out-result').waitFor();
        const tests = rig.project.store.read((read) => listLeakageTests(read, other.id));
        expect(tests.length).toBe(testsBefore.length + 1);
        const added = tests.find((record) => !testsBefore.some((old) => old.id === record.id));
        const cfm50 = added?.test.kind === 'testOut' ? added.test.cfm50 : undefined;
        expect(cfm50).toBeCloseTo(litersPerSecond / 0.47194745, 3);
        expect(rig.project.store.read((read) => jobHistory(read, other.id)).status).toBe(
          'testedOut',
        );
        await expectAccessible(page, 'si-tested-out');
        expectHealthy(watched);
        await watched.close();
      } finally {
        callChannel(context, 'settings.update', { units: 'IP' });
      }
    },
  );

  it('says so in plain words when the plan recommends no work', async () => {
    const demoHomes = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
    const none = demoHomes.find((row) => {
      const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId: row.id });
      return reply.ok && reply.value.package.measureIds.length === 0;
    });
    if (none === undefined) throw new Error('no demo home whose package is empty');
    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('navigation', { name: 'Screens' }).waitFor();
    await page.evaluate((place) => (location.hash = place), `#/homes/${none.id}/work-order`);
    await page.locator('#work-order-no-work').waitFor();
    expect(await page.locator('.work-order-document').count()).toBe(0);
    expect(await page.getByRole('alert').count()).toBe(0);
    await expectAccessible(page, 'no-work');
    expectHealthy(watched);
    await watched.close();
  });
});
