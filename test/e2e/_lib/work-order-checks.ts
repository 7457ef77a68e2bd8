/**
 * What the Work order's end-to-end files share: the store's own work order of a stored home
 * (core's buildWorkOrder on db's evaluateStoredHome, computed beside the page), and the checks
 * every state of the section gets (axe-core, a screenshot, a healthy page).
 */
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { buildWorkOrder, type WorkOrder, type WorkOrderOptions } from '../../../core/work-order.ts';
import { evaluateStoredHome } from '../../../db/evaluation-inputs.ts';
import type { Store } from '../../../db/store.ts';
import { axeViolations } from './axe.ts';
import type { WatchedPage } from './page-watch.ts';
import { SCREENSHOTS } from './rig.ts';

/** The work order the store's home gives (the plan's package unless options say otherwise). */
export function storedOrder(
  store: Store,
  homeId: number,
  options: WorkOrderOptions = {},
): WorkOrder {
  return store.read((read) => buildWorkOrder(evaluateStoredHome(read, homeId).evaluation, options));
}

/** No console errors, page errors, failed requests or CSP violations. */
export function expectHealthy(watched: WatchedPage): void {
  expect(watched.problems, 'console errors, page errors or failed requests').toEqual([]);
  expect(watched.cspViolations, 'Content Security Policy violations').toEqual([]);
}

/** Zero axe-core violations in the page as it is, and its full-page screenshot saved. */
export async function expectAccessible(page: Page, state: string): Promise<void> {
  expect(await axeViolations(page), state).toEqual([]);
  await page.screenshot({ path: join(SCREENSHOTS, `work-order-${state}.png`), fullPage: true });
}

/** Today in the page's own time zone, as the section dates its changes. */
export function pageToday(page: Page): Promise<string> {
  return page.evaluate(() => {
    const now = new Date();
    const month = String(now.getMonth() + 1).padStart(2, '0');
    const day = String(now.getDate()).padStart(2, '0');
    return `${now.getFullYear()}-${month}-${day}`;
  });
}
