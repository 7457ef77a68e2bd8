/**
 * How long a portfolio takes: importing a 10,000-home CSV into a fresh project file (target
 * under 5 s, checking and writing together, as `sealwork import FILE.csv` does) and opening
 * the portfolio summary over those homes (target under 0.3 s, the median of several runs).
 * Then the portfolio evaluated whole (every home planned, the Portfolio screen's figures, as
 * the `portfolio.evaluate` channel gives them) and the size of that reply (no target yet).
 * Prints figures and their ratio to the targets; asserts nothing. Run with `npm run bench`.
 *
 * The homes come from a seeded generator, varied in size, age, fuel, climate and test, a
 * third of them linked to a stored climate and one in ten tested at several pressures.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import Papa from 'papaparse';
import { commitCsvImport, planCsvImport } from '../../db/csv-import.ts';
import { homesCsv } from '../../db/csv-export.ts';
import { portfolioSummary } from '../../db/portfolio.ts';
import { evaluatePortfolio } from '../../db/portfolio-plans.ts';
import { climates } from '../../db/repositories/reusable-sets.ts';
import { openStore } from '../../db/store.ts';
import { median } from './_lib/bench-homes.ts';

const HOMES = 10_000;
const IMPORT_TARGET_S = 5;
const SUMMARY_TARGET_S = 0.3;
const SUMMARY_RUNS = 9;

/** A small linear congruential generator: deterministic, good enough to vary inputs. */
function seeded(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

const TOWNS = ['Ashby', 'Birch Falls', 'Cold Spring', 'Dunmore', 'Eastwick', 'Fallowfield'];
const FOUNDATIONS = ['basement', 'crawlspace', 'slab'];
/** Fuel, equipment, efficiency range, venting, price range ($ per the fuel's unit). */
const HEATERS = [
  ['naturalGas', 'furnace', 0.78, 0.96, 'naturalDraft', 0.9, 1.8],
  ['naturalGas', 'boiler', 0.8, 0.9, 'inducedDraft', 0.9, 1.8],
  ['propane', 'furnace', 0.8, 0.95, 'sealed', 2, 3.5],
  ['heatingOil', 'boiler', 0.78, 0.86, 'naturalDraft', 3, 4.5],
  ['electricity', 'heatPump', 7.5, 10, '', 0.11, 0.25],
  ['electricity', 'electricResistance', 1, 1, '', 0.11, 0.25],
  ['wood', 'stove', 0.6, 0.75, 'naturalDraft', 180, 300],
] as const;

function benchCsv(random: () => number): string {
  const between = (low: number, high: number, decimals = 0) =>
    Number((low + random() * (high - low)).toFixed(decimals));
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)] as T;
  const rows = Array.from({ length: HOMES }, (_, index) => {
    const stories = pick([1, 1.5, 2]);
    const floorAreaFt2 = between(700, 3500);
    const [fuel, equipment, effLow, effHigh, venting, priceLow, priceHigh] = pick(HEATERS);
    const linked = index % 3 === 0;
    const multipoint = index % 10 === 5;
    const cfm50 = between(900, 6000);
    const points = [50, 40, 30, 20]
      .map((pa) => `${pa}:${Math.round(cfm50 * (pa / 50) ** between(0.6, 0.68, 3))}`)
      .join(';');
    const cooled = random() < 0.6;
    return {
      name: `Bench home ${index + 1}`,
      street: `${between(1, 999)} ${pick(['Oak', 'Mill', 'Quarry', 'Church'])} Street`,
      town: pick(TOWNS),
      client: `Client ${Math.floor(index / 2) + 1}`,
      yearBuilt: between(1900, 2015),
      floorAreaFt2,
      volumeFt3: Math.round(floorAreaFt2 * between(7.5, 9.5, 1)),
      stories,
      heightFt: stories * 9 + between(0, 3),
      bedrooms: between(1, 5),
      shelterClass: between(2, 5),
      foundation: pick(FOUNDATIONS),
      climate: linked ? pick(['Bench north', 'Bench south']) : '',
      hdd65F: linked ? '' : between(3000, 9000),
      cdd65F: linked ? '' : between(200, 1800),
      elevationFt: linked ? '' : between(0, 4000),
      nFactorZone: linked ? '' : between(1, 4),
      heatingFuel: fuel,
      heatingEquipment: equipment,
      heatingEfficiency: between(effLow, effHigh, 2),
      combustionVenting: venting,
      seer: cooled ? between(10, 18) : '',
      fuelPriceUsdPerUnit: between(priceLow, priceHigh, 2),
      electricityUsdPerKwh: fuel !== 'electricity' ? between(0.11, 0.25, 3) : '',
      discountRateReal: 0.03,
      cfm50: multipoint ? '' : cfm50,
      testPoints: multipoint ? points : '',
      testedOn: `2025-${String(between(1, 12)).padStart(2, '0')}-${String(between(1, 28)).padStart(2, '0')}`,
    };
  });
  return Papa.unparse(rows);
}

const folder = mkdtempSync(join(tmpdir(), 'sealwork-bench-'));
try {
  const csv = benchCsv(seeded(20260115));
  const store = openStore(join(folder, 'portfolio.db'));
  store.write((write) => {
    const shared = { cdd65F: 900, elevationFt: 700, nFactorZone: 2 };
    climates.create(write, 'Bench north', { name: 'Bench north', hdd65F: 7600, ...shared });
    climates.create(write, 'Bench south', { name: 'Bench south', hdd65F: 4200, ...shared });
  });

  let planS = 0;
  const start = performance.now();
  const ids = store.write((write) => {
    const plan = planCsvImport(write, csv);
    planS = (performance.now() - start) / 1000;
    if (plan.problems.length > 0)
      throw new Error(`bench CSV has problems: ${plan.problems[0]?.message}`);
    return commitCsvImport(write, plan);
  });
  const importS = (performance.now() - start) / 1000;
  console.log(
    `import ${ids.length.toLocaleString('en-US')} homes from a ${(csv.length / 2 ** 20).toFixed(1)} MB CSV: ` +
      `${importS.toFixed(2)} s (${Math.round(ids.length / importS).toLocaleString('en-US')} rows/s; ` +
      `checking ${planS.toFixed(2)} s, writing ${(importS - planS).toFixed(2)} s); ` +
      `target < ${IMPORT_TARGET_S} s; ratio ${(importS / IMPORT_TARGET_S).toFixed(2)} of target`,
  );

  const samples: number[] = [];
  let homes = 0;
  for (let run = 0; run < SUMMARY_RUNS; run += 1) {
    const begin = performance.now();
    homes = store.read((read) => portfolioSummary(read)).homes;
    samples.push((performance.now() - begin) / 1000);
  }
  const summaryS = median(samples);
  console.log(
    `portfolio summary of ${homes.toLocaleString('en-US')} homes: median ${summaryS.toFixed(3)} s over ${SUMMARY_RUNS} runs ` +
      `(first ${samples[0]?.toFixed(3)} s); target < ${SUMMARY_TARGET_S} s; ratio ${(summaryS / SUMMARY_TARGET_S).toFixed(2)} of target`,
  );

  const evaluateStart = performance.now();
  const evaluated = store.read((read) => evaluatePortfolio(read, { filter: {} }));
  const evaluateS = (performance.now() - evaluateStart) / 1000;
  const { homes: _reports, ...reply } = evaluated;
  console.log(
    `portfolio evaluated whole (${evaluated.figures.totals.homes.toLocaleString('en-US')} homes planned, ` +
      `${evaluated.skipped.length} not ready): ${evaluateS.toFixed(2)} s ` +
      `(${((evaluateS * 1000) / Math.max(1, evaluated.figures.totals.homes)).toFixed(2)} ms a home); ` +
      `the screen's reply ${(JSON.stringify(reply).length / 2 ** 20).toFixed(1)} MB; no target ` +
      `(a CSV home carries no measures, so this is the floor: see the uncertainty bench for homes with measures)`,
  );
  const reasons = new Map<string, number>();
  for (const home of evaluated.skipped) {
    const reason = home.field ?? home.reason;
    reasons.set(reason, (reasons.get(reason) ?? 0) + 1);
  }
  if (reasons.size > 0) {
    console.log(
      `  not ready, by field: ${[...reasons].map(([field, count]) => `${field} ${count}`).join('; ')}`,
    );
  }

  const exportStart = performance.now();
  const exported = store.read((read) => homesCsv(read));
  console.log(
    `homes CSV export of the same homes: ${((performance.now() - exportStart) / 1000).toFixed(2)} s ` +
      `(${(exported.length / 2 ** 20).toFixed(1)} MB; no target)`,
  );
  store.close();
} finally {
  rmSync(folder, { recursive: true, force: true });
}
