/**
 * `sealwork bills`: the degree-day fits before and after the work and the savings between
 * them (Fels 1986, PRISM). Independent check: bills made here, noise-free, from a known base
 * temperature, base load and slope for each period, over daily means made here; the normal
 * year computed here as each calendar day's mean (29 February folded into 28 February); so
 * the savings must be 365·(α₁ − α₂) + β₁·HDD(τ₁) − β₂·HDD(τ₂) of that normal year.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';

const DAY_MS = 86_400_000;
const START = Date.UTC(2024, 0, 1);
const DAYS = 731; // 2024 (a leap year) and 2025
const PRE = { tauF: 62.4, alpha: 0.9, beta: 0.165 };
const POST = { tauF: 59.8, alpha: 0.85, beta: 0.128 };

let folder: TempFolder;
let billsPath: string;
let temperaturesPath: string;
const isoOf = (day: number) => new Date(START + day * DAY_MS).toISOString().slice(0, 10);

/** A year's sine with a seeded wobble, °F. */
function dailyMeans(): number[] {
  let state = 12345;
  return Array.from({ length: DAYS }, (_, day) => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return 50 - 24 * Math.cos((2 * Math.PI * (day - 15)) / 365) + 8 * (state / 2 ** 32 - 0.5);
  });
}

function useOf(means: number[], from: number, to: number, model: typeof PRE): number {
  let use = 0;
  for (let day = from; day < to; day += 1) {
    use += model.alpha + model.beta * Math.max(0, model.tauF - (means[day] ?? 0));
  }
  return use;
}

const means = dailyMeans();

beforeAll(() => {
  folder = makeTempFolder('sealwork-cli-bills-');
  temperaturesPath = folder.write(
    'temps.csv',
    ['date,meanTempF', ...means.map((mean, day) => `${isoOf(day)},${mean}`)].join('\n'),
  );
  const lines = ['periodStart,periodEnd,use,fuel'];
  // Bills of 30 days or so: 2024 before the work, 2025 after (work done 2025-01-01).
  for (let from = 0; from < DAYS - 20; from += 30) {
    let to = Math.min(DAYS, from + 30);
    if (from < 366 && to > 366) to = 366;
    const model = from < 366 ? PRE : POST;
    lines.push(`${isoOf(from)},${isoOf(to)},${useOf(means, from, to, model)},naturalGas`);
    from = to - 30;
  }
  billsPath = folder.write('bills.csv', lines.join('\n'));
});

afterAll(() => folder.remove());

/** Each calendar day's mean over the two years, 29 February with 28 February. */
function normalYear(): number[] {
  const sums = new Array<number>(365).fill(0);
  const counts = new Array<number>(365).fill(0);
  means.forEach((mean, day) => {
    const date = new Date(START + day * DAY_MS);
    const jan1 = Date.UTC(date.getUTCFullYear(), 0, 1);
    let index = Math.round((date.getTime() - jan1) / DAY_MS);
    const leap = date.getUTCFullYear() % 4 === 0;
    if (leap && index >= 59) index -= 1; // 29 February onto 28 February, later days back one
    sums[index] = (sums[index] ?? 0) + mean;
    counts[index] = (counts[index] ?? 0) + 1;
  });
  return sums.map((sum, index) => sum / (counts[index] ?? 1));
}

describe('sealwork bills', () => {
  it('fits before and after, and gives the savings of the normal year', async () => {
    const run = await runCli([
      'bills',
      billsPath,
      '--temperatures',
      temperaturesPath,
      '--work-done',
      '2025-01-01',
      '--estimate',
      '100',
      '--json',
    ]);
    expect(run.stderr).toBe('');
    expect(run.exitCode).toBe(0);
    const result = JSON.parse(run.stdout) as {
      before: { baseTempF: number; baseLoadPerDay: number; usePerDegreeDay: number };
      after: { baseTempF: number };
      savings: { savingsPerYear: number; realizationRate: number; unit: string };
    };
    expect(result.before.baseTempF).toBeCloseTo(PRE.tauF, 2);
    expect(result.before.baseLoadPerDay).toBeCloseTo(PRE.alpha, 5);
    expect(result.before.usePerDegreeDay).toBeCloseTo(PRE.beta, 6);
    expect(result.after.baseTempF).toBeCloseTo(POST.tauF, 2);
    const normal = normalYear();
    const nac = (model: typeof PRE) =>
      365 * model.alpha +
      model.beta * normal.reduce((sum, mean) => sum + Math.max(0, model.tauF - mean), 0);
    const expected = nac(PRE) - nac(POST);
    expect(result.savings.savingsPerYear).toBeCloseTo(expected, 3);
    expect(result.savings.realizationRate).toBeCloseTo(expected / 100, 5);
    expect(result.savings.unit).toBe('therm');
  });

  it('prints the fits in words, and refuses a missing flag or a bad file naming line and column', async () => {
    const text = await runCli([
      'bills',
      billsPath,
      '--temperatures',
      temperaturesPath,
      '--work-done',
      '2025-01-01',
    ]);
    expect(text.exitCode).toBe(0);
    expect(text.stdout).toMatch(/^Before\s+\d+ bills/m);
    expect(text.stdout).toMatch(/CV\(RMSE\)/);
    const missing = await runCli(['bills', billsPath, '--work-done', '2025-01-01']);
    expect(missing.exitCode).toBe(2);
    expect(missing.stderr).toContain('--temperatures');
    const bad = folder.write(
      'bad.csv',
      'periodStart,periodEnd,use,fuel\n2024-01-01,2024-01-31,lots,naturalGas\n',
    );
    const refused = await runCli([
      'bills',
      bad,
      '--temperatures',
      temperaturesPath,
      '--work-done',
      '2025-01-01',
    ]);
    expect(refused.exitCode).toBe(2);
    expect(refused.stderr).toMatch(/line 2, column use/);
  });
});
