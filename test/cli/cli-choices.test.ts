/**
 * `sealwork evaluate` with `--draws`, `--seed`, `--distribution` and `--budget`: the JSON's
 * `uncertainty` blocks and `bestPackage`, checked against computations outside the command
 * line — an exhaustive enumeration of every package (test/_lib/package-brute-force.ts) and
 * the exact Decimal plan for a home whose estimates have no spread — and its refusals.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EvaluationWithChoices } from '../../core/choices.ts';
import { evaluateHome } from '../../core/evaluate.ts';
import { bestByBruteForce, everyPackage } from '../_lib/package-brute-force.ts';
import { validBaseHome, type JsonObject } from '../_lib/base-home.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';

let folder: TempFolder;
let homePath: string;
let pointHomePath: string;

/** The base home with every estimate a single figure (low = likely = high). */
function homeWithoutSpread(): JsonObject {
  const home = validBaseHome();
  home.measures = [
    {
      id: 'p1',
      type: 'attic-top-plates',
      reductionCfm50: { low: 300, likely: 300, high: 300 },
      cost: { materialsUsd: 90, laborHours: 5, laborRateUsdPerHour: 50 },
    },
    {
      id: 'p2',
      type: 'rim-joist',
      reductionCfm50: { low: 180, likely: 180, high: 180 },
      cost: { materialsUsd: 70, laborHours: 4, laborRateUsdPerHour: 50 },
    },
  ];
  return home;
}

beforeAll(() => {
  folder = makeTempFolder('sealwork-cli-choices-');
  homePath = folder.write('home.json', validBaseHome());
  pointHomePath = folder.write('point.json', homeWithoutSpread());
});

afterAll(() => folder.remove());

async function evaluateJson(args: readonly string[]): Promise<EvaluationWithChoices> {
  const run = await runCli(['evaluate', ...args, '--json']);
  expect(run.stderr).toBe('');
  expect(run.exitCode).toBe(0);
  return JSON.parse(run.stdout) as EvaluationWithChoices;
}

describe('evaluate --draws --seed', () => {
  it('gives uncertainty blocks { draws, seed, p10, p50, p90 }, the same for the same seed', async () => {
    const first = await evaluateJson([homePath, '--draws', '3000', '--seed', '11']);
    const again = await evaluateJson([homePath, '--draws', '3000', '--seed', '11']);
    const other = await evaluateJson([homePath, '--draws', '3000', '--seed', '12']);
    const run = first.uncertainty;
    expect(run).toBeDefined();
    for (const block of [run?.cfm50After, run?.annualSavingsUsd, run?.npvUsd]) {
      expect(block).toMatchObject({ draws: 3000, seed: 11 });
      expect(block?.p10).toBeLessThanOrEqual(block?.p50 ?? NaN);
      expect(block?.p50).toBeLessThanOrEqual(block?.p90 ?? NaN);
    }
    expect(again.uncertainty).toEqual(run);
    expect(other.uncertainty?.npvUsd.p50).not.toBe(run?.npvUsd.p50);
    // The package's measures; no draw removes more than the estimates' highs together.
    const included = first.measures.filter((measure) => measure.included);
    expect(run?.measureIds).toEqual(included.map((measure) => measure.id));
    const removedHigh = included.reduce((sum, measure) => sum + measure.estimateCfm50.high, 0);
    expect(run?.cfm50After.p10).toBeGreaterThanOrEqual(first.leakage.cfm50 - removedHigh - 0.05);
    expect(run?.cfm50After.p90).toBeLessThan(first.leakage.cfm50);
  });

  it('collapses to the exact plan when no estimate has a spread', async () => {
    // Independent check: the plan's Decimal figures (core/plan.ts), not the float64 kernel.
    const report = await evaluateJson([pointHomePath, '--draws', '500', '--seed', '3']);
    const run = report.uncertainty;
    for (const percentile of ['p10', 'p50', 'p90'] as const) {
      expect(run?.npvUsd[percentile]).toBeCloseTo(report.package.npvUsd, 1);
      expect(run?.annualSavingsUsd[percentile]).toBeCloseTo(report.package.annualSavingsUsd, 1);
      expect(run?.cfm50After[percentile]).toBeCloseTo(report.package.cfm50After, 0);
    }
  });

  it('takes the triangular distribution and defaults the seed (reported) when only draws are given', async () => {
    const report = await evaluateJson([
      homePath,
      '--draws',
      '1000',
      '--distribution',
      'triangular',
    ]);
    expect(report.uncertainty?.distribution).toBe('triangular');
    expect(report.uncertainty?.npvUsd).toMatchObject({ draws: 1000, seed: 1 });
  });
});

describe('evaluate --budget', () => {
  it('finds the package brute force finds, within the budget', async () => {
    const evaluation = evaluateHome(validBaseHome());
    const packages = everyPackage(evaluation);
    for (const budgetUsd of [0, 400, 700, 1200]) {
      const report = await evaluateJson([homePath, '--budget', String(budgetUsd)]);
      const best = report.bestPackage;
      const expected = bestByBruteForce(packages, {
        budgetUsd,
        objective: 'npv',
        everyMeasureSirAtLeastOne: false,
        packageSirAtLeastOne: false,
      });
      expect(best?.energyCostUsd).toBeLessThanOrEqual(budgetUsd);
      expect(best?.npvUsd).toBe(expected.npvUsd.toDecimalPlaces(2).toNumber());
      expect(best?.measureIds.filter((id) => expected.measureIds.includes(id))).toEqual(
        expected.measureIds,
      );
    }
  });

  it('chooses nothing when nothing fits, and searches without a limit for "none"', async () => {
    const none = await evaluateJson([homePath, '--budget', '0']);
    expect(none.bestPackage?.energyCostUsd).toBe(0);
    expect(none.bestPackage?.measureIds).toEqual([]);
    const open = await evaluateJson([homePath, '--budget', 'none', '--objective', 'savings']);
    expect(open.bestPackage?.budgetUsd).toBeNull();
    expect(open.bestPackage?.objective).toBe('savings');
  });
});

describe('refusals', () => {
  it.each([
    [['--draws', 'ten'], '--draws expects a whole number'],
    [['--seed', '4.5'], '--seed expects a whole number'],
    [['--budget', 'lots'], '--budget expects dollars'],
    [['--objective', 'npv'], '--objective goes with --budget'],
  ])('refuses %j as a usage error', async (flags, message) => {
    const run = await runCli(['evaluate', homePath, ...flags]);
    expect(run.exitCode).toBe(2);
    expect(run.stderr).toContain(message);
    expect(run.stdout).toBe('');
  });

  it.each([
    [['--draws', '0'], 'draws:'],
    [['--draws', '5000000'], 'draws:'],
    [['--seed', '4294967296'], 'seed:'],
    [['--distribution', 'normal'], 'distribution:'],
    [['--budget', '100', '--objective', 'comfort'], 'budget.objective:'],
  ])('refuses %j naming the field', async (flags, field) => {
    const run = await runCli(['evaluate', homePath, ...flags]);
    expect(run.exitCode).toBe(2);
    expect(run.stderr).toContain(field);
    expect(run.stdout).toBe('');
  });

  it('refuses the flags on other commands', async () => {
    const run = await runCli(['list', '--draws', '10']);
    expect(run.exitCode).toBe(2);
    expect(run.stderr).toContain('--draws is for the evaluate command');
  });
});
