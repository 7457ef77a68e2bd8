/**
 * Runs axe-core in a page. The page's CSP (`script-src 'self'`) rightly refuses an inline
 * <script>, so `page.addScriptTag` cannot add axe; the script's text is evaluated through the
 * browser's debugging protocol instead, which a page's CSP does not govern.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { AxeResults } from 'axe-core';
import type { Page } from 'playwright-core';

const AXE_SOURCE = readFileSync(
  createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
  'utf8',
);

/** One rule broken, with the elements that break it. */
export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/**
 * Checks the page as it is now with every axe-core rule that runs by default.
 *
 * @param page - a loaded page
 * @returns the violations (an empty list when the page passes)
 */
export async function axeViolations(page: Page): Promise<AxeViolation[]> {
  await page.evaluate(AXE_SOURCE);
  return page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(): Promise<AxeResults> } }).axe;
    const results = await axe.run();
    return results.violations.map((violation) => ({
      id: violation.id,
      impact: violation.impact ?? null,
      help: violation.help,
      targets: violation.nodes.map((node) => node.target.join(' ')),
    }));
  });
}
