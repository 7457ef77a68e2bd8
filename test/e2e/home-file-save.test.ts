/**
 * A home saved from the Homes screen as a home file, and bundled with its photos, in chromium:
 * the saved files are what the store exports (the repositories, read beside the page), the
 * photo comes back byte for byte (SHA-256 by node:crypto, FIPS 180-4), and the bundle imports
 * into another project as the same home with the same photo. Sources: axe-core's default rule
 * set; the W3C CSP `securitypolicyviolation` event.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exportHomeFile } from '../../db/home-file.ts';
import {
  exportHomeFileWithAttachments,
  importHomeFileWithAttachments,
} from '../../db/home-file-bundle.ts';
import { listHomes } from '../../db/repositories/homes.ts';
import { addPhoto, getPhoto, listPhotos } from '../../db/repositories/photos.ts';
import { openStore } from '../../db/store.ts';
import { pngImage } from '../_lib/photo-bytes.ts';
import { axeViolations } from './_lib/axe.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, TEST_TIMEOUT_MS, type Rig } from './_lib/rig.ts';

let rig: Rig;

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-home-save-');
}, SETUP_TIMEOUT_MS);

afterAll(() => rig.close());

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

describe('saving a home from the Homes screen', { timeout: TEST_TIMEOUT_MS }, () => {
  it('saves the home file, and the bundle with its photo byte for byte', async () => {
    const home = rig.project.store.read((read) => listHomes(read))[0];
    if (home === undefined) throw new Error('the demo project has no home');
    const photo = pngImage(12, 8, 5);
    rig.project.store.write((write) =>
      addPhoto(write, home.id, { kind: 'before', caption: 'front door' }, photo),
    );

    const watched = await rig.open();
    const { page } = watched;
    await page.getByRole('heading', { level: 1, name: 'Homes' }).waitFor();
    await page.locator(`button[data-home-id="${home.id}"]`).click();

    const [plain] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: /^Save as a home file/ }).click(),
    ]);
    const plainPath = join(SCREENSHOTS, '..', 'saved-home.json');
    await plain.saveAs(plainPath);
    expect(JSON.parse(readFileSync(plainPath, 'utf8'))).toEqual(
      rig.project.store.read((read) => exportHomeFile(read, home.id)),
    );

    const [bundled] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: /^Save with its photos/ }).click(),
    ]);
    expect(bundled.suggestedFilename()).toMatch(/-with-photos\.json$/);
    const bundlePath = join(SCREENSHOTS, '..', 'saved-home-with-photos.json');
    await bundled.saveAs(bundlePath);
    const bundle = JSON.parse(readFileSync(bundlePath, 'utf8')) as {
      photos: { base64: string; sha256: string }[];
    };
    expect(bundle).toEqual(
      rig.project.store.read((read) => exportHomeFileWithAttachments(read, home.id)),
    );
    expect(bundle.photos.map((entry) => entry.sha256)).toEqual([sha256(photo)]);
    await page.getByRole('status').filter({ hasText: 'with the home’s photos' }).waitFor();
    expect(await axeViolations(page)).toEqual([]);

    // The bundle stores as a new home elsewhere with the same photo.
    const other = openStore(':memory:');
    try {
      const id = other.write((write) => importHomeFileWithAttachments(write, bundle));
      const [stored] = other.read((read) => listPhotos(read, id));
      const bytes = other.read((read) => getPhoto(read, stored?.id ?? 0).bytes);
      expect(sha256(bytes)).toBe(sha256(photo));
    } finally {
      other.close();
    }
    expect(watched.problems).toEqual([]);
    expect(watched.cspViolations).toEqual([]);
    await watched.context.close();
  });
});
