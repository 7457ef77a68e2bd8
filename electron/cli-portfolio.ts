/**
 * `sealwork portfolio --all|FILE.csv [--out DIR] [--json]`: the homes planned together. A CSV
 * is read into a project of its own in memory (through the `portfolio.importCsv` channel, so
 * its problems are the import's, by line and column) and never stored. The evaluation itself
 * is `evaluatePortfolio`, the function behind the `portfolio.evaluate` channel, called here
 * directly for one reason: it tells of its progress after each home, which a channel's single
 * reply cannot carry, and the terminal shows that as a bar on standard error.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { formatNumber, formatUsd } from '../core/format.ts';
import { homesCsv, testOutCsv, typesCsv } from '../core/portfolio-csv.ts';
import { evaluatePortfolio, type PortfolioEvaluation } from '../db/portfolio-plans.ts';
import { openStore } from '../db/store.ts';
import {
  ask,
  CsvRefusal,
  EXIT_OK,
  readTextFile,
  UsageError,
  withProject,
  type CliOutput,
  type Parsed,
} from './cli-commands.ts';
import type { ChannelContext } from './channels.ts';

/** Width of the progress bar, characters. */
const BAR_WIDTH = 30;

function progressBar(done: number, of: number): string {
  const filled = of === 0 ? BAR_WIDTH : Math.round((done / of) * BAR_WIDTH);
  return `[${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${done} of ${of} homes`;
}

function evaluated(context: ChannelContext, output: CliOutput): PortfolioEvaluation {
  let shown = -1;
  const result = context.store.read((read) =>
    evaluatePortfolio(read, { filter: {} }, (done, of) => {
      // Redraw at most a hundred times, whatever the number of homes.
      const step = Math.floor((done / Math.max(1, of)) * 100);
      if (step === shown && done !== of) return;
      shown = step;
      output.progress?.(progressBar(done, of));
    }),
  );
  output.progress?.('');
  return result;
}

/** The totals `--json` prints: each a sum of the homes' own packages. */
function totalsJson(portfolio: PortfolioEvaluation) {
  const totals = portfolio.figures.totals;
  return {
    homes: totals.homes,
    measures: totals.measures,
    costUsd: totals.costUsd,
    healthAndSafetyCostUsd: totals.healthAndSafetyCostUsd,
    costWithoutHealthAndSafetyUsd: totals.costWithoutHealthAndSafetyUsd,
    annualSavingsUsd: totals.annualSavingsUsd,
    npvUsd: totals.npvUsd,
    mmbtu: Math.round(totals.mmbtu * 1000) / 1000,
    co2Kg: Math.round(totals.co2Kg * 10) / 10,
    heatingByFuel: totals.heatingByFuel,
    shareHomesSirAtLeastOne: portfolio.figures.shareHomesSirAtLeastOne,
    testOuts: portfolio.testOut.results.length,
    skipped: portfolio.skipped,
  };
}

function totalsText(portfolio: PortfolioEvaluation): string {
  const totals = portfolio.figures.totals;
  const lines = [
    `Homes       ${formatNumber(totals.homes)} planned, ${formatNumber(totals.measures)} measures in their packages`,
    `Cost        ${formatUsd(totals.costUsd, { cents: true })} (${formatUsd(totals.costWithoutHealthAndSafetyUsd, { cents: true })} without health and safety)`,
    `Saves       ${formatUsd(totals.annualSavingsUsd, { cents: true })} a year; ${formatNumber(totals.mmbtu, 1)} MMBtu; ${formatNumber(totals.co2Kg, 0)} kg CO2`,
    `NPV         ${formatUsd(totals.npvUsd, { cents: true })} over the measures' lives`,
    ...totals.heatingByFuel.map(
      (fuel) =>
        `            ${fuel.fuel}: ${formatNumber(fuel.units, 1)} ${fuel.unit} a year (${fuel.homes} homes)`,
    ),
  ];
  const outs = portfolio.testOut.results;
  if (outs.length > 0) {
    const review = outs.filter((result) => result.review.length > 0).length;
    lines.push(
      `Test-outs   ${formatNumber(outs.length)} homes` +
        (review > 0 ? `; ${review} flagged for review` : ''),
    );
  }
  for (const home of portfolio.skipped) {
    lines.push(`  left out: ${home.name}: ${home.reason}`);
  }
  return lines.join('\n');
}

async function writeFiles(folder: string, portfolio: PortfolioEvaluation): Promise<string[]> {
  await mkdir(folder, { recursive: true });
  const { homes: _reports, ...json } = portfolio;
  const files: [string, string][] = [
    ['portfolio-homes.csv', homesCsv(portfolio)],
    ['portfolio-types.csv', typesCsv(portfolio)],
    ['portfolio-test-outs.csv', testOutCsv(portfolio)],
    ['portfolio.json', `${JSON.stringify(json, null, 2)}\n`],
  ];
  for (const [name, text] of files) await writeFile(join(folder, name), text);
  return files.map(([name]) => join(folder, name));
}

/** Runs `portfolio --all` or `portfolio FILE.csv`. */
export async function runPortfolioPlans(parsed: Parsed, output: CliOutput): Promise<number> {
  const [csvPath, ...extra] = parsed.positionals;
  if (extra.length > 0 || (csvPath === undefined) === !parsed.all) {
    throw new UsageError('portfolio takes --all or FILE.csv (one of them)');
  }
  let portfolio: PortfolioEvaluation;
  if (csvPath !== undefined) {
    const csv = await readTextFile(csvPath);
    const store = openStore(':memory:');
    try {
      const imported = ask({ store }, 'portfolio.importCsv', { csv });
      if (imported.problems.length > 0) throw new CsvRefusal(imported.problems);
      portfolio = evaluated({ store }, output);
    } finally {
      store.close();
    }
  } else {
    portfolio = await withProject(parsed, (context) => evaluated(context, output));
  }
  const written = parsed.out === undefined ? [] : await writeFiles(parsed.out, portfolio);
  output.out(parsed.json ? JSON.stringify(totalsJson(portfolio), null, 2) : totalsText(portfolio));
  for (const path of written) output.err(`wrote ${path}`);
  return EXIT_OK;
}
