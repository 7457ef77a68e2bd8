/**
 * Same seed, same figures in Node and in a browser: the core's uncertainty engine bundled for
 * the page (esbuild, as a plain script) and run in Debian's chromium. The generator gives the
 * very same numbers (only 32-bit integer arithmetic). The figures agree to 1e-9 relative, not
 * to the last bit: Math.log, Math.exp and Math.pow are "implementation-approximated" in the
 * language standard (ECMA-262, Math object), and Node 20's V8 and this chromium's round some
 * results differently in the last place — in the PERT tables, the plan's own flow exponents and
 * the economics — so the last digits of a float may differ between engines.
 */
import { build } from 'esbuild';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { packageUncertainty } from '../../core/uncertainty/monte-carlo.ts';
import { Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { launchChromium } from './_lib/browser.ts';
import { SETUP_TIMEOUT_MS, TEST_TIMEOUT_MS } from './_lib/rig.ts';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const OPTIONS = {
  draws: 3000,
  seed: 987_654_321,
  vary: { escalation: true, efficiency: true, nFactor: true },
};

/** Deep equality with numbers equal to 1e-9 relative (1e-9 absolute near 0). */
function expectNearlyEqual(actual: unknown, expected: unknown, path: string): void {
  if (typeof expected === 'number' && typeof actual === 'number') {
    const scale = Math.max(1, Math.abs(expected));
    expect(Math.abs(actual - expected), path).toBeLessThanOrEqual(1e-9 * scale);
    return;
  }
  if (expected !== null && typeof expected === 'object') {
    expect(typeof actual, path).toBe('object');
    const keys = Object.keys(expected);
    expect(Object.keys(actual as object).sort(), path).toEqual([...keys].sort());
    for (const key of keys) {
      expectNearlyEqual(
        (actual as Record<string, unknown>)[key],
        (expected as Record<string, unknown>)[key],
        `${path}.${key}`,
      );
    }
    return;
  }
  expect(actual, path).toEqual(expected);
}

describe('uncertainty in the browser', () => {
  let browser: Browser;
  let page: Page;
  beforeAll(async () => {
    const bundle = await build({
      stdin: {
        contents: [
          "export { evaluateHome } from './core/evaluate.ts';",
          "export { packageUncertainty } from './core/uncertainty/monte-carlo.ts';",
          "export { Xoshiro128StarStar } from './core/uncertainty/random.ts';",
        ].join('\n'),
        resolveDir: ROOT,
        loader: 'ts',
      },
      bundle: true,
      format: 'iife',
      globalName: 'SealworkCore',
      platform: 'browser',
      write: false,
    });
    browser = await launchChromium();
    page = await browser.newPage();
    await page.setContent('<!doctype html><title>uncertainty</title>');
    await page.addScriptTag({ content: bundle.outputFiles[0]?.text ?? '' });
  }, SETUP_TIMEOUT_MS);
  afterAll(async () => {
    await browser?.close();
  });

  it('gives the generator’s numbers exactly', async () => {
    const inPage = (await page.evaluate(
      `(() => { const r = new SealworkCore.Xoshiro128StarStar(7, 3, 11); return Array.from({ length: 500 }, () => r.nextUint32()); })()`,
    )) as number[];
    const random = new Xoshiro128StarStar(7, 3, 11);
    expect(inPage).toEqual(Array.from({ length: 500 }, () => random.nextUint32()));
  });

  for (const method of ['nFactor', 'lblBasic', 'ashrae622', 'aim2'] as const) {
    it(
      `gives the same package figures as Node for a ${method} home`,
      async () => {
        const home = DEMO_HOMES.find((candidate) => candidate.infiltrationMethod === method);
        expect(home).toBeDefined();
        const args = JSON.stringify({ home, options: OPTIONS });
        const inPage = await page.evaluate(
          `(() => { const { home, options } = ${args}; return SealworkCore.packageUncertainty(SealworkCore.evaluateHome(home), options); })()`,
        );
        expectNearlyEqual(inPage, packageUncertainty(evaluateHome(home), OPTIONS), 'figures');
      },
      TEST_TIMEOUT_MS,
    );
  }
});
