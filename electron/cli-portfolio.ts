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
import { exportHomeFile } from '../db/home-file.ts';
import { weatherYearOfHome, type WeatherYearCache } from '../db/evaluation-inputs.ts';
import { evaluatePortfolio, type PortfolioEvaluation } from '../db/portfolio-plans.ts';
import { effectiveLibrary } from '../db/repositories/library.ts';
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
import { openUncertaintyPool, type ProgramRange } from './uncertainty-pool.ts';

/** Seed of the program's range when draws are asked without one. */
const DEFAULT_SEED = 1;

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

/**
 * The program's range: the planned homes' files run on the worker pool, added draw by draw.
 * Each home's stream is its place among the planned homes, in the order evaluated.
 */
async function programRange(
  context: ChannelContext,
  portfolio: PortfolioEvaluation,
  draws: number,
  seed: number,
  programBias: number | undefined,
): Promise<ProgramRange | null> {
  const { homes, weather, libraryTypes } = context.store.read((read) => {
    const cache: WeatherYearCache = new Map();
    const files = portfolio.homes.map((home) => exportHomeFile(read, home.homeId));
    return {
      homes: files,
      weather: files.map(
        (file, index) =>
          weatherYearOfHome(read, portfolio.homes[index]?.homeId ?? 0, file, cache) ?? null,
      ),
      libraryTypes: [...effectiveLibrary(read).all()],
    };
  });
  const pool = openUncertaintyPool();
  try {
    await pool.run({
      homes,
      weather,
      libraryTypes,
      options: { draws, seed, histogramBins: 0 },
      programTotals: true,
      ...(programBias === undefined ? {} : { programBias }),
    });
    return pool.lastProgramRange;
  } finally {
    await pool.close();
  }
}

function rangeText(range: ProgramRange): string {
  const usd = (value: number) => formatUsd(value);
  return [
    `Range       ${formatNumber(range.draws)} draws a home (PERT, seed ${range.seed}), ` +
      (range.programBias === null
        ? 'homes independent:'
        : `a shared bias of ± ${formatNumber(range.programBias * 100, 0)} % on the estimates:`),
    `            saves a year  P10 ${usd(range.annualSavingsUsd.p10)} · P50 ${usd(range.annualSavingsUsd.p50)} · P90 ${usd(range.annualSavingsUsd.p90)}`,
    `            NPV           P10 ${usd(range.npvUsd.p10)} · P50 ${usd(range.npvUsd.p50)} · P90 ${usd(range.npvUsd.p90)}`,
  ].join('\n');
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
  const { draws: askedDraws, seed: askedSeed } = parsed.choices;
  let programBias: number | undefined;
  if (parsed.bias !== undefined) {
    programBias = Number(parsed.bias);
    if (!/^\d*\.?\d+$/.test(parsed.bias) || !(programBias <= 0.9)) {
      throw new UsageError(
        `--bias expects a fraction from 0 to 0.9 (0.2 for ± 20 %), got "${parsed.bias}"`,
      );
    }
  }
  const run =
    askedDraws === undefined && askedSeed === undefined && programBias === undefined
      ? null
      : { draws: askedDraws ?? 1000, seed: askedSeed ?? DEFAULT_SEED };
  const plan = async (context: ChannelContext) => {
    const portfolio = evaluated(context, output);
    const range = run
      ? await programRange(context, portfolio, run.draws, run.seed, programBias)
      : null;
    return { portfolio, range };
  };
  let outcome: { portfolio: PortfolioEvaluation; range: ProgramRange | null };
  if (csvPath !== undefined) {
    const csv = await readTextFile(csvPath);
    const store = openStore(':memory:');
    try {
      const imported = ask({ store }, 'portfolio.importCsv', { csv });
      if (imported.problems.length > 0) throw new CsvRefusal(imported.problems);
      outcome = await plan({ store });
    } finally {
      store.close();
    }
  } else {
    outcome = await withProject(parsed, plan);
  }
  const { portfolio, range } = outcome;
  const written = parsed.out === undefined ? [] : await writeFiles(parsed.out, portfolio);
  output.out(
    parsed.json
      ? JSON.stringify({ ...totalsJson(portfolio), ...(range ? { range } : {}) }, null, 2)
      : [totalsText(portfolio), ...(range ? [rangeText(range)] : [])].join('\n'),
  );
  for (const path of written) output.err(`wrote ${path}`);
  return EXIT_OK;
}
