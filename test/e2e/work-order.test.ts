/**
 * A home's Work order end to end in chromium: the package approved and the work started from
 * the section (by keyboard), a PNG photo attached to a measure, the work order printed alone to
 * a Letter PDF whose text holds every measure, the test-out target and the safety notes as the
 * store's own work order states them (core's buildWorkOrder on the stored home, computed here
 * beside the page), a test-out recorded and its result checked against arithmetic done here,
 * and the job at tested out on screen and in the project file.
 *
 * Sources: axe-core's default rule set (WCAG 2.x A and AA) as the outside judge of
 * accessibility; the CSS Paged Media `@page size: letter` (8.5 × 11 in = 612 × 792 PDF points)
 * as the size pdfinfo must report; poppler-utils' pdftotext, pdftoppm and pdfimages as the
 * independent readers of the PDF; ISO/IEC 15948 for the PNG (test/_lib/photo-bytes.ts) and
 * FIPS 180-4 SHA-256 (node:crypto) for its bytes in the store; RFC 4648 base64 for the image
 * the page shows; the realization rate as measured ÷ estimated CFM50 reduction (common
 * practice of test-out reviews).
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, readdirSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatNumber } from '../../core/format.ts';
import type { WorkOrder } from '../../core/work-order.ts';
import { listHomes, type HomeSummary } from '../../db/repositories/homes.ts';
import { jobHistory } from '../../db/repositories/jobs.ts';
import { listLeakageTests } from '../../db/repositories/leakage-tests.ts';
import { listPhotos } from '../../db/repositories/photos.ts';
import { callChannel } from '../../electron/channels.ts';
import { jobWords } from '../../ui/labels.ts';
import { pngImage } from '../_lib/photo-bytes.ts';
import { folded, pdfPages, requireTool } from './_lib/drawn.ts';
import { focusRingShown, tabTo } from './_lib/keyboard.ts';
import { SETUP_TIMEOUT_MS, startRig, type Rig } from './_lib/rig.ts';
import { REPO_ROOT } from './_lib/ui-build.ts';
import {
  expectAccessible,
  expectHealthy,
  pageToday,
  storedOrder as storedOrderOf,
} from './_lib/work-order-checks.ts';

/** Where the PDF and its first page as an image go, to be looked at by a person. */
const PDF_OUTPUT = join(REPO_ROOT, 'test-output', 'work-order');
/** The whole path runs in one page; it has many steps. */
const PATH_TIMEOUT_MS = 240_000;

let rig: Rig;
let home: HomeSummary;
let order: WorkOrder;

function storedOrder(homeId: number): WorkOrder {
  return storedOrderOf(rig.project.store, homeId);
}

/** The first words of a message: a line break in the PDF may fall anywhere later. */
function opening(message: string, words = 6): string {
  return folded(message).split(' ').slice(0, words).join(' ');
}

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-work-order-');
  const demoHomes = rig.project.store.read((read) => listHomes(read)).filter((row) => row.isDemo);
  // A home whose work order shows every part: three or more measures to do, a bill of
  // materials, safety notes for a measure and for the house, and a stop level to state.
  const found = demoHomes.find((row) => {
    try {
      const candidate = storedOrder(row.id);
      return (
        candidate.measures.filter((measure) => measure.status !== 'done').length >= 3 &&
        candidate.billOfMaterials.length > 0 &&
        candidate.houseCautions.length > 0 &&
        candidate.measures.some((measure) => measure.cautions.length > 0) &&
        candidate.target.kind === 'stopAt' &&
        row.jobStatus === 'audited'
      );
    } catch {
      return false;
    }
  });
  if (found === undefined) throw new Error('no demo home of the kind these checks need');
  home = found;
  order = storedOrder(found.id);
  rmSync(PDF_OUTPUT, { recursive: true, force: true });
  mkdirSync(PDF_OUTPUT, { recursive: true });
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('the Work order section in chromium', () => {
  it(
    'approves, starts, takes a photo, prints, and records the test-out',
    { timeout: PATH_TIMEOUT_MS },
    async () => {
      // The settings' user name signs the job's changes unless the box is changed.
      const named = callChannel({ store: rig.project.store }, 'settings.update', {
        userName: 'Avery Auditor',
      });
      if (!named.ok) throw new Error(named.error.message);
      const watched = await rig.open();
      const { page } = watched;
      await page.getByRole('navigation', { name: 'Screens' }).waitFor();
      await page.evaluate((place) => (location.hash = place), `#/homes/${home.id}/house`);
      await page.getByRole('heading', { level: 2, name: 'House' }).waitFor();
      // Alt+7 is the seventh section, the Work order (ui/shortcuts.ts).
      await page.keyboard.press('Alt+7');
      await page.getByRole('heading', { level: 2, name: 'Work order' }).waitFor();
      expect(new URL(page.url()).hash).toBe(`#/homes/${home.id}/work-order`);
      const sheet = page.locator('.work-order-document');
      await sheet.waitFor();

      // The crew document holds the store's work order: each measure in order, its place,
      // its hours and its own safety notes; the target in the core's words; the house's notes.
      const shownIds = await sheet
        .locator('section[data-measure-id]')
        .evaluateAll((all) => all.map((section) => (section as HTMLElement).dataset.measureId));
      expect(shownIds).toEqual(order.measures.map((measure) => measure.id));
      for (const measure of order.measures) {
        const text = folded(
          await sheet.locator(`section[data-measure-id="${measure.id}"]`).textContent(),
        );
        expect(text).toContain(measure.name);
        expect(text).toContain(measure.locationWords);
        expect(text).toContain(`${formatNumber(measure.laborHours, 2)} hours`);
        for (const caution of measure.cautions) expect(text).toContain(folded(caution.message));
      }
      const targetText = folded(await page.locator('#work-order-target').textContent());
      for (const sentence of order.target.sentences) expect(targetText).toContain(folded(sentence));
      expect(targetText).toContain(`${formatNumber(order.target.targetCfm50)} CFM50`);
      const billRows = page.locator('#work-order-bill tbody tr');
      expect(await billRows.count()).toBe(order.billOfMaterials.length);
      for (const line of order.billOfMaterials) {
        expect(
          folded(await page.locator(`tr[data-material-id="${line.materialId}"]`).textContent()),
        ).toContain(`${formatNumber(line.purchaseCount)} ${line.purchaseUnitWords}`);
      }
      for (const caution of order.houseCautions) {
        expect(folded(await sheet.textContent())).toContain(folded(caution.message));
      }
      await expectAccessible(page, 'audited');

      // A test-out before the work has started is refused, and nothing is stored.
      const testsBefore = rig.project.store.read((read) => listLeakageTests(read, home.id)).length;
      await page.getByLabel('Reading, CFM50').fill('1000');
      await page.locator('#test-out-by').fill('Rowan Tester');
      await page.getByRole('button', { name: 'Record the test-out' }).click();
      const refusal = page.locator('#test-out-refusal');
      await refusal.waitFor();
      // The status rule's refusal (core/job-status.ts): no test-out without the work.
      expect(folded(await refusal.textContent())).toMatch(/tested out/i);
      expect(rig.project.store.read((read) => listLeakageTests(read, home.id)).length).toBe(
        testsBefore,
      );
      await expectAccessible(page, 'test-out-refused');

      // Approve the package by keyboard: the By box, then the button.
      const today = await pageToday(page);
      const jobBy = page.locator('#job-by');
      await expect.poll(() => jobBy.inputValue()).toBe('Avery Auditor');
      // Unsigned, the approval is refused beside the By box and the job stays where it was.
      await jobBy.fill('  ');
      const approve = page.getByRole('button', { name: 'Approve this package' });
      await approve.click();
      await page.locator('#job-by-error').waitFor();
      expect(await jobBy.getAttribute('aria-invalid')).toBe('true');
      expect(rig.project.store.read((read) => jobHistory(read, home.id)).status).toBe('audited');
      await expectAccessible(page, 'approval-refused');
      await jobBy.fill('Avery Auditor');
      await tabTo(page, approve, 10);
      expect(await focusRingShown(page)).toBe(true);
      await page.keyboard.press('Enter');
      const stage = page.locator('[data-job-status]');
      await expect.poll(() => stage.getAttribute('data-job-status')).toBe('approved');
      expect(folded(await stage.textContent())).toContain(jobWords('approved'));
      const approved = rig.project.store.read((read) => jobHistory(read, home.id));
      expect(approved.status).toBe('approved');
      expect(approved.entries.at(-1)).toMatchObject({
        status: 'approved',
        by: 'Avery Auditor',
        at: today,
      });
      await expectAccessible(page, 'approved');

      const start = page.getByRole('button', { name: 'Start the work' });
      await tabTo(page, start, 10);
      await page.keyboard.press('Enter');
      await expect.poll(() => stage.getAttribute('data-job-status')).toBe('inProgress');
      expect(rig.project.store.read((read) => jobHistory(read, home.id)).status).toBe('inProgress');
      await expectAccessible(page, 'in-progress');

      // A file that is not an image is refused beside the file box, in plain words.
      await page.locator('#photo-file').setInputFiles({
        name: 'notes.txt',
        mimeType: 'text/plain',
        buffer: Buffer.from('not a photo at all'),
      });
      await page.getByRole('button', { name: 'Attach the photo' }).click();
      await page.locator('#photo-file-error').waitFor();
      expect(folded(await page.locator('#photo-file-error').textContent())).toContain(
        'JPEG, PNG or WebP',
      );
      expect(rig.project.store.read((read) => listPhotos(read, home.id))).toEqual([]);

      // A real PNG of the first measure with a cautions list, before the work, with a caption.
      const measure = order.measures.find((candidate) => candidate.cautions.length > 0);
      if (measure === undefined) throw new Error('no measure with a safety note');
      const png = pngImage(96, 72, 11);
      await page.locator('#photo-file').setInputFiles({
        name: 'before.png',
        mimeType: 'image/png',
        buffer: png,
      });
      await page.getByLabel('Of', { exact: true }).selectOption(measure.id);
      await page.getByLabel('Before the work').check();
      await page.getByLabel('Caption').fill('Before sealing, seen from the access');
      await page.getByRole('button', { name: 'Attach the photo' }).click();
      const thumbnail = sheet.locator(`section[data-measure-id="${measure.id}"] img`);
      await thumbnail.waitFor();
      expect(await thumbnail.getAttribute('src')).toBe(
        `data:image/png;base64,${png.toString('base64')}`,
      );
      expect(await thumbnail.evaluate((image) => (image as HTMLImageElement).naturalWidth)).toBe(
        96,
      );
      const stored = rig.project.store.read((read) => listPhotos(read, home.id));
      expect(stored).toHaveLength(1);
      expect(stored[0]).toMatchObject({
        measureId: measure.id,
        kind: 'before',
        caption: 'Before sealing, seen from the access',
        mediaType: 'image/png',
        byteCount: png.length,
        sha256: createHash('sha256').update(png).digest('hex'),
      });
      await expectAccessible(page, 'photo');

      // Printed: the work order alone on Letter pages.
      requireTool('pdfinfo');
      requireTool('pdftoppm');
      await page.emulateMedia({ media: 'print' });
      expect(await page.getByRole('navigation', { name: 'Screens' }).isVisible()).toBe(false);
      expect(await page.getByRole('heading', { level: 2, name: 'Work order' }).isVisible()).toBe(
        false,
      );
      for (const control of ['Print or save as PDF', 'Attach the photo', 'Record the test-out']) {
        expect(await page.getByRole('button', { name: control }).isVisible(), control).toBe(false);
      }
      expect(await sheet.isVisible()).toBe(true);
      const pdfPath = join(PDF_OUTPUT, 'work-order.pdf');
      await page.pdf({
        path: pdfPath,
        format: 'Letter',
        printBackground: true,
        preferCSSPageSize: true,
      });
      await page.emulateMedia({ media: 'screen' });

      const info = execFileSync('pdfinfo', [pdfPath], { encoding: 'utf8' });
      expect(info).toMatch(/Page size:\s+612 x 792 pts \(letter\)/);
      const whole = pdfPages(pdfPath).join(' ');
      for (const each of order.measures) expect(whole, each.name).toContain(folded(each.name));
      expect(whole).toContain(`${formatNumber(order.target.targetCfm50)} CFM50`);
      const stopLevel = order.target.thresholdCfm50;
      if (stopLevel === null) throw new Error('the chosen home has no stop level');
      expect(whole).toContain(`Stop level: ${formatNumber(Math.ceil(stopLevel))} CFM50`);
      const notes = [...order.houseCautions, ...order.measures.flatMap((each) => each.cautions)];
      for (const caution of notes) expect(whole, caution.code).toContain(opening(caution.message));
      for (const chrome of [
        'Skip to main content',
        'Print or save as PDF',
        'Attach the photo',
        'Approve this package',
        'Start the work',
      ]) {
        expect(whole, chrome).not.toContain(chrome);
      }
      // The photo is printed with the measure it shows.
      const images = execFileSync('pdfimages', ['-list', pdfPath], { encoding: 'utf8' })
        .split('\n')
        .slice(2)
        .filter((line) => line.trim() !== '');
      expect(images.some((line) => /\b96\s+72\b/.test(line))).toBe(true);
      // The first page as a picture, to be looked at.
      execFileSync('pdftoppm', [
        '-png',
        '-r',
        '70',
        '-f',
        '1',
        '-l',
        '1',
        pdfPath,
        join(PDF_OUTPUT, 'page'),
      ]);
      const pictures = readdirSync(PDF_OUTPUT).filter((name) => name.endsWith('.png'));
      expect(pictures).toHaveLength(1);
      expect(statSync(join(PDF_OUTPUT, pictures[0] ?? '')).size).toBeGreaterThan(10_000);

      // The test-out: a reading under the target, recorded by keyboard from the reading box.
      const readingCfm50 = Math.floor(order.target.targetCfm50) - 40;
      const reading = page.getByLabel('Reading, CFM50');
      await reading.fill(String(readingCfm50));
      await page.locator('#test-out-by').fill('Rowan Tester');
      await reading.focus();
      await page.keyboard.press('Enter');
      const result = page.locator('#test-out-result');
      await result.waitFor();
      const resultText = folded(await result.textContent());
      // Worked here: the reading against the target and the estimate of the package.
      const measured = order.target.testInCfm50 - readingCfm50;
      const estimated = order.measures.reduce((sum, each) => sum + each.expectedReductionCfm50, 0);
      expect(resultText).toContain(
        `Test-out ${formatNumber(readingCfm50)} CFM50: at or under the target of ${formatNumber(order.target.targetCfm50)} CFM50.`,
      );
      expect(resultText).toContain(
        `${formatNumber(measured)} cfm of ${formatNumber(estimated)} cfm estimated`,
      );
      expect(resultText).toContain(`(${formatNumber((measured / estimated) * 100)} %)`);
      expect(folded(await result.locator('[data-figure="met"] dd').textContent())).toBe('Yes');
      await expect.poll(() => stage.getAttribute('data-job-status')).toBe('testedOut');
      expect(folded(await stage.textContent())).toContain(jobWords('testedOut'));
      expect(folded(await result.locator('[data-figure="job"] dd').textContent())).toBe(
        jobWords('testedOut'),
      );
      const job = rig.project.store.read((read) => jobHistory(read, home.id));
      expect(job.status).toBe('testedOut');
      expect(job.entries.at(-1)).toMatchObject({
        status: 'testedOut',
        by: 'Rowan Tester',
        at: today,
      });
      const tests = rig.project.store.read((read) => listLeakageTests(read, home.id));
      expect(tests.length).toBe(testsBefore + 1);
      await expectAccessible(page, 'tested-out');

      // Removing the photo asks first; kept, then removed.
      const remove = page.getByRole('button', { name: `Remove the photo of ${measure.name}` });
      await remove.click();
      await page.getByRole('button', { name: 'Keep it' }).click();
      expect(rig.project.store.read((read) => listPhotos(read, home.id))).toHaveLength(1);
      await remove.click();
      await expectAccessible(page, 'photo-remove-asked');
      await page.getByRole('button', { name: 'Remove it' }).click();
      await expect.poll(() => thumbnail.count()).toBe(0);
      expect(rig.project.store.read((read) => listPhotos(read, home.id))).toEqual([]);
      expectHealthy(watched);
      await watched.close();
    },
  );
});
