/**
 * A portfolio of stored homes evaluated together (db/portfolio-plans.ts) in a real SQLite
 * file. Independent check: the totals against each home's own plan as the `plan.evaluate`
 * channel gives it, summed here in whole cents; a home that cannot be planned is listed with
 * its reason and kept out of the totals.
 */
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importHomeFile } from '../../db/home-file.ts';
import { evaluatePortfolio } from '../../db/portfolio-plans.ts';
import { createHome } from '../../db/repositories/homes.ts';
import { openStore, type Store } from '../../db/store.ts';
import { callChannel } from '../../electron/channels.ts';
import { makeTempFolder, type TempFolder } from '../_lib/cli-harness.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';

let folder: TempFolder;
let store: Store;
let homeIds: number[];
let unfinishedId: number;

beforeAll(() => {
  folder = makeTempFolder('sealwork-portfolio-plans-');
  store = openStore(join(folder.path, 'project.db'));
  const files = fc.sample(homeArbitrary({ measureCount: { min: 0, max: 6 } }), {
    seed: 404,
    numRuns: 25,
  });
  homeIds = store.write((write) => files.map((file) => importHomeFile(write, file)));
  unfinishedId = store.write((write) => createHome(write, { name: 'No test yet', data: {} }));
});

afterAll(() => {
  store.close();
  folder.remove();
});

const cents = (usd: number) => Math.round(usd * 100);

describe('a portfolio of stored homes', () => {
  it('totals to the cent the sum of each home’s own plan, leaving out the one not ready', () => {
    const portfolio = store.read((read) => evaluatePortfolio(read, { filter: {} }));
    expect(portfolio.skipped.map((home) => home.homeId)).toEqual([unfinishedId]);
    expect(portfolio.skipped[0]?.reason).toMatch(/test-in/);
    const own = homeIds.map((homeId) => {
      const reply = callChannel({ store }, 'plan.evaluate', { homeId });
      if (!reply.ok) throw new Error(reply.error.message);
      return reply.value.package;
    });
    const sum = (pick: (pkg: (typeof own)[number]) => number) =>
      own.reduce((total, pkg) => total + cents(pick(pkg)), 0) / 100;
    const totals = portfolio.figures.totals;
    expect(totals.homes).toBe(homeIds.length);
    expect(totals.costUsd).toBe(sum((pkg) => pkg.costUsd));
    expect(totals.annualSavingsUsd).toBe(sum((pkg) => pkg.annualSavingsUsd));
    expect(totals.npvUsd).toBe(sum((pkg) => pkg.npvUsd));
    expect(totals.co2Kg).toBeCloseTo(
      own.reduce((total, pkg) => total + pkg.annualSavings.co2Kg, 0),
      6,
    );
    expect(portfolio.rows.map((row) => row.homeId).sort((a, b) => a - b)).toEqual(homeIds);
  });

  it('takes exactly the homes asked for by id, and refuses an id that is not a live home', () => {
    const two = homeIds.slice(0, 2);
    const portfolio = store.read((read) => evaluatePortfolio(read, { homeIds: two }));
    expect(portfolio.rows.map((row) => row.homeId).sort((a, b) => a - b)).toEqual(two);
    expect(() => store.read((read) => evaluatePortfolio(read, { homeIds: [999_999] }))).toThrow(
      /no live home has the id 999999/,
    );
  });

  it('answers through the portfolio.evaluate channel without the reports', () => {
    const reply = callChannel({ store }, 'portfolio.evaluate', { homeIds: homeIds.slice(0, 3) });
    expect(reply.ok).toBe(true);
    if (!reply.ok) return;
    expect(reply.value.figures.totals.homes).toBe(3);
    expect('homes' in reply.value).toBe(false);
  });
});
