/**
 * `sealwork portfolio --all|FILE.csv [--out DIR] [--json]`. Independent check: the totals
 * against each stored home's own plan (`sealwork evaluate ID --json`), summed here in whole
 * cents; the files written read back with papaparse (RFC 4180).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EvaluationReport } from '../../core/report.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';

let folder: TempFolder;
let db: string;

beforeAll(async () => {
  folder = makeTempFolder('sealwork-cli-portfolio-');
  db = join(folder.path, 'project.db');
  expect((await runCli(['list', '--db', db, '--demo'])).exitCode).toBe(0);
});

afterAll(() => folder.remove());

const cents = (usd: number) => Math.round(usd * 100);

describe('portfolio --all', () => {
  it('totals to the cent the sum of each home’s own plan, and writes the files', async () => {
    const out = join(folder.path, 'out');
    const run = await runCli(['portfolio', '--all', '--db', db, '--json', '--out', out]);
    expect(run.exitCode).toBe(0);
    const totals = JSON.parse(run.stdout) as Record<string, number>;
    const list = JSON.parse((await runCli(['list', '--db', db, '--json'])).stdout) as {
      id: number;
    }[];
    const packages: EvaluationReport['package'][] = [];
    for (const { id } of list) {
      const evaluated = await runCli(['evaluate', String(id), '--db', db, '--json']);
      packages.push((JSON.parse(evaluated.stdout) as EvaluationReport).package);
    }
    expect(totals.homes).toBe(list.length);
    for (const field of [
      'costUsd',
      'annualSavingsUsd',
      'npvUsd',
      'healthAndSafetyCostUsd',
    ] as const) {
      expect(cents(totals[field] ?? NaN), field).toBe(
        packages.reduce((sum, pkg) => sum + cents(pkg[field]), 0),
      );
    }
    expect(totals.mmbtu).toBeCloseTo(
      packages.reduce((sum, pkg) => sum + pkg.annualSavings.mmbtu, 0),
      2,
    );
    expect(totals.co2Kg).toBeCloseTo(
      packages.reduce((sum, pkg) => sum + pkg.annualSavings.co2Kg, 0),
      0,
    );
    const homes = Papa.parse<Record<string, string>>(
      readFileSync(join(out, 'portfolio-homes.csv'), 'utf8'),
      { header: true, skipEmptyLines: true },
    );
    expect(homes.errors).toEqual([]);
    expect(homes.data).toHaveLength(list.length);
    expect(run.stderr).toContain(`wrote ${join(out, 'portfolio.json')}`);
  });

  it('plans a portfolio CSV without storing it', async () => {
    const csv = join(folder.path, 'homes.csv');
    expect((await runCli(['export-csv', csv, '--db', db])).exitCode).toBe(0);
    const before = (await runCli(['list', '--db', db, '--json'])).stdout;
    const run = await runCli(['portfolio', csv, '--json']);
    expect(run.exitCode).toBe(0);
    expect((JSON.parse(run.stdout) as { homes: number }).homes).toBe(
      (JSON.parse(before) as unknown[]).length,
    );
    expect((await runCli(['list', '--db', db, '--json'])).stdout).toBe(before);
  });

  it('gives the program’s range with --draws, the same for the same seed', async () => {
    const args = ['portfolio', '--all', '--db', db, '--json', '--draws', '300', '--seed', '3'];
    const first = JSON.parse((await runCli(args)).stdout) as {
      annualSavingsUsd: number;
      range: {
        draws: number;
        seed: number;
        annualSavingsUsd: { p10: number; p50: number; p90: number };
      };
    };
    const again = JSON.parse((await runCli(args)).stdout) as typeof first;
    expect(again.range).toEqual(first.range);
    expect(first.range).toMatchObject({ draws: 300, seed: 3 });
    const spread = first.range.annualSavingsUsd;
    expect(spread.p10).toBeLessThan(spread.p50);
    expect(spread.p50).toBeLessThan(spread.p90);
    // Each home's draws stay within its estimates' ranges, so the program's median sits within
    // a tenth of the point total (common practice for the PERT's mean against its likely value:
    // the spread is the estimates', not the engine's).
    expect(Math.abs(spread.p50 - first.annualSavingsUsd) / first.annualSavingsUsd).toBeLessThan(
      0.1,
    );
    const refused = await runCli(['list', '--db', db, '--draws', '3']);
    expect(refused.exitCode).toBe(2);
  });

  it('refuses both --all and a file, and a CSV with problems', async () => {
    const both = await runCli(['portfolio', '--all', 'x.csv', '--db', db]);
    expect(both.exitCode).toBe(2);
    expect(both.stderr).toContain('portfolio takes --all or FILE.csv');
    const bad = folder.write('bad.csv', 'name,volumeFt3\nA house,-3\n');
    const refused = await runCli(['portfolio', bad]);
    expect(refused.exitCode).toBe(2);
    expect(refused.stdout).toBe('');
  });
});
