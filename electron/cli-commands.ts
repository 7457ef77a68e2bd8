/**
 * The commands of the command line. Each asks the channel table, exactly as the desktop
 * window and the browser host do, so the three cannot drift apart; only backup and restore,
 * which handle whole files on disk, are the host's own.
 */
import { existsSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import { InputError } from '../core/errors.ts';
import type { EvaluationReport } from '../core/report.ts';
import { homeFileText } from '../core/weather/home-file-text.ts';
import { backupTo, restoreFrom } from '../db/backup.ts';
import { formatCsvProblem, type CsvProblem } from '../db/csv-import.ts';
import { DEMO_HOMES, DEMO_PROGRAM_NAME } from '../db/demo/alder-creek.ts';
import { defaultProjectPath, openProject } from '../db/project.ts';
import { openStore, type Store } from '../db/store.ts';
import {
  callChannel,
  type ChannelContext,
  type ChannelError,
  type ChannelName,
  type ChannelRequest,
  type ChannelResponse,
} from './channels.ts';
import { dryRunText, homesText, portfolioText } from './cli-text.ts';
import { runPortfolioPlans } from './cli-portfolio.ts';
import { planText } from './plan-text.ts';

export const EXIT_OK = 0;
export const EXIT_UNEXPECTED = 1;
export const EXIT_BAD_INPUT = 2;

/** Where the command line writes; tests pass their own. */
export interface CliOutput {
  out(text: string): void;
  err(text: string): void;
  /** A line of progress that replaces the one before (a terminal's bar); optional. */
  progress?(text: string): void;
}

export class UsageError extends Error {}

/** A channel's refusal, carried to `main` to be printed and turned into an exit code. */
export class ChannelFailure extends Error {
  readonly failure: ChannelError;
  constructor(failure: ChannelError) {
    super(failure.message);
    this.failure = failure;
  }
}

/** A portfolio CSV that cannot go in, with every problem. */
export class CsvRefusal extends Error {
  readonly problems: readonly CsvProblem[];
  constructor(problems: readonly CsvProblem[]) {
    super(`${problems.length} problems`);
    this.problems = problems;
  }
}

export interface Parsed {
  command: string | undefined;
  positionals: string[];
  json: boolean;
  db: string | undefined;
  demo: boolean;
  dryRun: boolean;
  results: boolean;
  choices: ChoicesFlags;
  /** portfolio: every stored home. */
  all: boolean;
  /** portfolio: the folder to write the CSV and JSON files to. */
  out: string | undefined;
  /** workorder: the PDF file to write. */
  pdf: string | undefined;
  /** export: the home file with its photos (a bundle). */
  photos: boolean;
  /** portfolio: a program-wide bias's ± fraction, as typed. */
  bias: string | undefined;
  /** weather: the degree days' base, °F, as typed; evaluate: a weather file to plan hour by hour on. */
  weather: { baseF?: string; file?: string };
  /** bills: the temperature file, the day the work was done and the estimate. */
  bills: { temperatures?: string; workDone?: string; estimate?: string };
}

/** What `evaluate` was asked beyond the plan; the channel checks each value and names it. */
export interface ChoicesFlags {
  draws: number | undefined;
  seed: number | undefined;
  distribution: string | undefined;
  budget: { budgetUsd: number | null; objective?: string } | undefined;
}

/** The project a command works on, opened only when a channel first needs it. */
class ProjectContext implements ChannelContext {
  private opened: Store | undefined;
  constructor(private readonly open: () => Store) {}
  get store(): Store {
    this.opened ??= this.open();
    return this.opened;
  }
  close(): void {
    this.opened?.close();
  }
}

function projectPath(parsed: Parsed): string {
  return parsed.db ?? defaultProjectPath();
}

/** Runs `work` with the command's project, closing it afterwards whatever happens. */
export async function withProject<T>(
  parsed: Parsed,
  work: (context: ChannelContext) => Promise<T> | T,
): Promise<T> {
  const context = new ProjectContext(
    () =>
      openProject(projectPath(parsed), { demoWhenNew: parsed.db === undefined || parsed.demo })
        .store,
  );
  try {
    return await work(context);
  } finally {
    context.close();
  }
}

/** Calls a channel; its value, or a ChannelFailure. */
export function ask<Name extends ChannelName>(
  context: ChannelContext,
  name: Name,
  request: ChannelRequest<Name>,
): ChannelResponse<Name> {
  const reply = callChannel(context, name, request);
  if (!reply.ok) throw new ChannelFailure(reply.error);
  return reply.value;
}

export function expectPositionals(parsed: Parsed, names: string[]): string[] {
  if (parsed.positionals.length !== names.length) {
    throw new UsageError(
      `${parsed.command} takes ${names.length === 0 ? 'no arguments' : names.join(' ')}`,
    );
  }
  return parsed.positionals;
}

export async function readTextFile(path: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder' : 'cannot be read';
    throw InputError.at('', `${path}: ${reason}`);
  }
}

async function readJsonFile(path: string): Promise<unknown> {
  const text = await readTextFile(path);
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw InputError.at('', `${path} is not valid JSON (${(error as Error).message})`);
  }
}

function homeIdOf(text: string): number | null {
  return /^\d+$/.test(text) ? Number(text) : null;
}

function printReports(
  output: CliOutput,
  reports: readonly EvaluationReport[],
  json: boolean,
  single: boolean,
): void {
  if (json) {
    output.out(JSON.stringify(single ? reports[0] : reports, null, 2));
    return;
  }
  output.out(reports.map(planText).join('\n\n' + '═'.repeat(72) + '\n\n'));
}

export async function runEvaluate(parsed: Parsed, output: CliOutput): Promise<number> {
  const [target = ''] = expectPositionals(parsed, ['FILE|HOME_ID']);
  const homeId = homeIdOf(target);
  const file = homeId === null ? await readJsonFile(target) : undefined;
  const weatherFile = parsed.weather.file;
  if (weatherFile !== undefined && homeId !== null) {
    throw new UsageError(
      '--weather is for a home file; a stored home is planned on its own climate (set it in House)',
    );
  }
  const weatherText = weatherFile === undefined ? undefined : await readTextFile(weatherFile);
  // The channel parses the flags' values (as it does any request) and names a bad one.
  const choices = parsed.choices as Omit<ChannelRequest<'plan.evaluate'>, 'homeId'>;
  const report = await withProject(parsed, (context) =>
    homeId === null
      ? ask(context, 'homeFile.evaluate', {
          file,
          ...(weatherText === undefined ? {} : { weatherText }),
          ...choices,
        })
      : ask(context, 'plan.evaluate', { homeId, ...choices }),
  );
  printReports(output, [report], parsed.json, true);
  return EXIT_OK;
}

export async function runList(parsed: Parsed, output: CliOutput): Promise<number> {
  expectPositionals(parsed, []);
  const homes = await withProject(parsed, (context) => ask(context, 'homes.list', {}));
  output.out(parsed.json ? JSON.stringify(homes, null, 2) : homesText(homes));
  return EXIT_OK;
}

export async function runImport(parsed: Parsed, output: CliOutput): Promise<number> {
  const [path = ''] = expectPositionals(parsed, ['FILE']);
  if (path.toLowerCase().endsWith('.csv')) return runCsvImport(parsed, path, output);
  if (parsed.dryRun) throw new UsageError('--dry-run is for a portfolio CSV (FILE.csv)');
  const file = await readJsonFile(path);
  const { id } = await withProject(parsed, (context) => ask(context, 'homeFile.import', { file }));
  output.out(parsed.json ? JSON.stringify({ id }) : String(id));
  return EXIT_OK;
}

async function runCsvImport(parsed: Parsed, path: string, output: CliOutput): Promise<number> {
  const csv = await readTextFile(path);
  if (parsed.dryRun) {
    // A dry run neither writes nor creates the project: a file not made yet reads as empty.
    const where = projectPath(parsed);
    const store = existsSync(where) ? openStore(where, { readonly: true }) : openStore(':memory:');
    try {
      const plan = ask({ store }, 'portfolio.checkCsv', { csv });
      if (plan.problems.length > 0) throw new CsvRefusal(plan.problems);
      output.out(
        parsed.json
          ? JSON.stringify({ dryRun: true, rows: plan.rows, homes: plan.homes }, null, 2)
          : dryRunText(plan),
      );
      return EXIT_OK;
    } finally {
      store.close();
    }
  }
  const result = await withProject(parsed, (context) =>
    ask(context, 'portfolio.importCsv', { csv }),
  );
  if (result.problems.length > 0) throw new CsvRefusal(result.problems);
  output.out(
    parsed.json ? JSON.stringify({ ids: result.ids }) : `imported ${result.ids.length} homes`,
  );
  return EXIT_OK;
}

export async function runExport(parsed: Parsed, output: CliOutput): Promise<number> {
  const [idText = '', path = ''] = expectPositionals(parsed, ['HOME_ID', 'FILE']);
  const homeId = homeIdOf(idText);
  if (homeId === null) throw new UsageError(`HOME_ID must be a number, got "${idText}"`);
  const homeFile = await withProject(parsed, (context) =>
    parsed.photos
      ? ask(context, 'homeFile.exportBundle', { id: homeId })
      : ask(context, 'homeFile.export', { id: homeId }),
  );
  // An hourly home's weather year keeps each hour list on one line (a fraction of the size).
  await writeFile(path, homeFileText(homeFile), 'utf8');
  output.out(`wrote ${path}`);
  return EXIT_OK;
}

export async function runExportCsv(parsed: Parsed, output: CliOutput): Promise<number> {
  const [path = ''] = expectPositionals(parsed, ['FILE']);
  const exported = await withProject(parsed, (context) =>
    parsed.results
      ? { ...ask(context, 'portfolio.resultsCsv', {}), leftOut: [] }
      : ask(context, 'portfolio.homesCsv', {}),
  );
  await writeFile(path, exported.csv, 'utf8');
  output.out(`wrote ${path}`);
  for (const { homeId, name, parts } of exported.leftOut) {
    output.err(`note: home ${homeId} (${name}): not in the CSV: ${parts.join(', ')}`);
  }
  return EXIT_OK;
}

export async function runPortfolio(parsed: Parsed, output: CliOutput): Promise<number> {
  if (parsed.all || parsed.positionals.length > 0 || parsed.out !== undefined) {
    return runPortfolioPlans(parsed, output);
  }
  expectPositionals(parsed, []);
  const summary = await withProject(parsed, (context) => ask(context, 'portfolio.summary', {}));
  output.out(parsed.json ? JSON.stringify(summary, null, 2) : portfolioText(summary));
  return EXIT_OK;
}

export async function runBackup(parsed: Parsed, output: CliOutput): Promise<number> {
  const [path = ''] = expectPositionals(parsed, ['FILE']);
  await withProject(parsed, (context) => backupTo(context.store, path));
  output.out(`wrote ${path}`);
  return EXIT_OK;
}

export async function runRestore(parsed: Parsed, output: CliOutput): Promise<number> {
  const [path = ''] = expectPositionals(parsed, ['FILE']);
  const where = projectPath(parsed);
  restoreFrom(path, where);
  // Opening once applies any migration the restored copy needs.
  await withProject(parsed, (context) => context.store);
  output.out(`restored ${where} from ${path}`);
  return EXIT_OK;
}

export function runDemo(parsed: Parsed, output: CliOutput): number {
  expectPositionals(parsed, []);
  const noProject: ChannelContext = {
    get store(): Store {
      throw new Error('the demo command uses no project');
    },
  };
  const reports = DEMO_HOMES.map((file) => ask(noProject, 'homeFile.evaluate', { file }));
  if (!parsed.json) {
    output.out(
      `${DEMO_PROGRAM_NAME} (an invented demo scenario: every home, price and climate is made up)\n`,
    );
  }
  printReports(output, reports, parsed.json, false);
  return EXIT_OK;
}

/** How many problems of a CSV are listed before the rest are counted. */
const PROBLEMS_LISTED = 200;

export function listCsvProblems(output: CliOutput, problems: readonly CsvProblem[]): number {
  output.err(`The CSV file cannot be imported; nothing was written (${problems.length} problems):`);
  for (const problem of problems.slice(0, PROBLEMS_LISTED))
    output.err(`  ${formatCsvProblem(problem)}`);
  if (problems.length > PROBLEMS_LISTED)
    output.err(`  … and ${problems.length - PROBLEMS_LISTED} more`);
  return EXIT_BAD_INPUT;
}
