/**
 * Opens a page of the browser host in a fresh browser context and records everything that
 * should never happen on a healthy page: console errors, uncaught exceptions, failed
 * requests and Content Security Policy violations (reported by the page's own
 * `securitypolicyviolation` events, not only by chromium's console).
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';

export interface WatchedPage {
  context: BrowserContext;
  page: Page;
  /** Console errors, page errors and failed requests, in plain text. */
  problems: string[];
  /** CSP violations the page reported: directive and blocked resource. */
  cspViolations: string[];
  close(): Promise<void>;
}

/** The screen size of the screenshots and of every page (a small laptop). */
export const VIEWPORT = { width: 1280, height: 800 } as const;

/**
 * Opens `url` in a new context of `browser` and starts watching before the page's first script.
 *
 * @param browser - a running chromium
 * @param url - the page address (the browser host's, with its token)
 * @returns the page, its recorded problems, and `close()`
 */
export async function openWatchedPage(browser: Browser, url: string): Promise<WatchedPage> {
  const context = await browser.newContext({ viewport: VIEWPORT, reducedMotion: 'reduce' });
  const page = await context.newPage();
  const problems: string[] = [];
  const cspViolations: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error') problems.push(`console: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('requestfailed', (request) =>
    problems.push(`request failed: ${request.url()} ${request.failure()?.errorText ?? ''}`),
  );
  await page.exposeBinding('reportCspViolation', (_source, text: string) => {
    cspViolations.push(text);
  });
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { reportCspViolation(text: string): void })
        .reportCspViolation;
      report(`${event.violatedDirective} blocked ${event.blockedURI || 'inline'}`);
    });
  });
  await page.goto(url);
  return { context, page, problems, cspViolations, close: () => context.close() };
}
