/**
 * Every screen at three window sizes — a small laptop (1024×768), the screenshots' size
 * (1280×800) and a desktop monitor (1920×1080) — with no sideways scrolling, no text cut off
 * and no control drawn over another (test/e2e/_lib/layout.ts), and zero axe-core violations.
 * The 1280×800 screenshots are saved to be looked at.
 *
 * Sources: WCAG 2.2 SC 1.4.10 Reflow (from memory) for the no-sideways-scrolling check;
 * axe-core's default rules (WCAG 2.x A and AA).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listHomes } from '../../db/repositories/homes.ts';
import { callChannel } from '../../electron/channels.ts';
import { axeViolations } from './_lib/axe.ts';
import { layoutFaults } from './_lib/layout.ts';
import { SCREENSHOTS, SETUP_TIMEOUT_MS, startRig, type Rig } from './_lib/rig.ts';

const SIZES = [
  { width: 1024, height: 768 },
  { width: 1280, height: 800 },
  { width: 1920, height: 1080 },
] as const;

let rig: Rig;
let places: { hash: string; heading: string; name: string }[];

beforeAll(async () => {
  rig = await startRig('sealwork-e2e-layout-');
  const homes = rig.project.store.read((read) => listHomes(read)).filter((home) => home.isDemo);
  // A home whose package holds measures, so every chart and table of the plan is drawn.
  const home = homes.find((row) => {
    const reply = callChannel({ store: rig.project.store }, 'plan.evaluate', { homeId: row.id });
    return reply.ok && reply.value.package.measureIds.length >= 3;
  });
  if (home === undefined) throw new Error('no demo home with a package of three measures');
  const section = (slug: string, heading: string) => ({
    hash: `#/homes/${home.id}/${slug}`,
    heading,
    name: `home-${slug}`,
  });
  places = [
    { hash: '#/homes', heading: 'Homes', name: 'homes' },
    section('house', 'House'),
    section('leak-test', 'Leak test'),
    section('measures', 'Measures'),
    section('plan', 'Plan'),
    section('safety', 'Safety'),
    section('proposal', 'Proposal'),
    section('work-order', 'Work order'),
    { hash: '#/portfolio', heading: 'Portfolio', name: 'portfolio' },
    { hash: '#/library', heading: 'Library', name: 'library' },
    { hash: '#/settings', heading: 'Settings', name: 'settings' },
  ];
}, SETUP_TIMEOUT_MS);

afterAll(async () => {
  await rig?.close();
}, SETUP_TIMEOUT_MS);

describe('every screen’s layout', () => {
  for (const size of SIZES) {
    it(`holds at ${size.width}×${size.height}`, { timeout: 180_000 }, async () => {
      const watched = await rig.open();
      const { page } = watched;
      await page.setViewportSize(size);
      await page.getByRole('table').first().waitFor();
      const found: string[] = [];
      for (const place of places) {
        await page.evaluate((hash) => (location.hash = hash), place.hash);
        await page.getByRole('heading', { name: place.heading, exact: true }).first().waitFor();
        // Let charts and late replies settle before judging the drawing.
        await page.waitForLoadState('networkidle');
        await page.waitForTimeout(300);
        for (const fault of await layoutFaults(page)) {
          found.push(`${place.name}: ${fault.kind}: ${fault.where}`);
        }
        if (size.width === 1280) {
          await page.screenshot({
            path: `${SCREENSHOTS}/layout-${place.name}.png`,
            fullPage: true,
          });
          const violations = await axeViolations(page);
          expect(violations, `axe-core on ${place.name}`).toEqual([]);
        }
      }
      expect(found).toEqual([]);
      expect(watched.problems).toEqual([]);
      expect(watched.cspViolations).toEqual([]);
      await watched.close();
    });
  }
});
