/**
 * What every end-to-end file starts with: a temporary project seeded with the demo homes,
 * the browser host serving the built screens on it, and Debian's chromium. One `startRig()`
 * in `beforeAll`, one `rig.close()` in `afterAll`.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { startBrowserHost, type BrowserHost } from '../../../electron/serve.ts';
import { launchChromium } from './browser.ts';
import { openWatchedPage, type WatchedPage } from './page-watch.ts';
import { openTempProject, type TempProject } from './temp-project.ts';
import { ensureUiBuilt, REPO_ROOT } from './ui-build.ts';

/** Where the tests save their screenshots (ignored by git), to be looked at by a person. */
export const SCREENSHOTS = join(REPO_ROOT, 'test-output', 'screenshots');
/** Long enough for a first build of the screens and a cold chromium on a slow machine. */
export const SETUP_TIMEOUT_MS = 180_000;
export const TEST_TIMEOUT_MS = 60_000;

export interface Rig {
  project: TempProject;
  host: BrowserHost;
  browser: Browser;
  /** Opens the screens in a fresh, watched browser context (the Homes list first). */
  open(): Promise<WatchedPage>;
  close(): Promise<void>;
}

/**
 * Starts a project, a browser host and chromium.
 *
 * @param prefix - the start of the temporary folder's name (`sealwork-e2e-homes-`)
 * @returns the running rig
 */
export async function startRig(prefix: string): Promise<Rig> {
  const uiRoot = ensureUiBuilt();
  const project = openTempProject(prefix);
  const host = await startBrowserHost({ context: { store: project.store }, uiRoot });
  const browser = await launchChromium();
  mkdirSync(SCREENSHOTS, { recursive: true });
  return {
    project,
    host,
    browser,
    open: () => openWatchedPage(browser, host.url),
    async close() {
      await browser.close();
      await host.close();
      project.close();
    },
  };
}
