/**
 * The command line. Every command takes `--db PATH` (default: `SEALWORK_DB`, else the
 * project file in the user's data folder, which starts with the demo homes); a new file
 * named by `--db` starts empty unless `--demo` is given.
 *
 * Exit codes: 0 done; 2 bad input (usage, unreadable file, invalid JSON, an invalid home
 * file, a home that does not exist), with every problem listed on standard error and nothing
 * on standard output; 1 anything unexpected.
 */
import { existsSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { InputError, type InputProblem } from '../core/errors.ts';
import { evaluateHomeReport } from '../core/evaluate.ts';
import type { EvaluationReport } from '../core/report.ts';
import { backupTo, restoreFrom } from '../db/backup.ts';
import { DEMO_HOMES, DEMO_PROGRAM_NAME } from '../db/demo/alder-creek.ts';
import { exportHomesCsv, resultsCsv } from '../db/csv-export.ts';
import {
  commitCsvImport,
  CsvImportError,
  formatCsvProblem,
  planCsvImport,
  type CsvImportPlan,
  type CsvProblem,
} from '../db/csv-import.ts';
import { DbError } from '../db/errors.ts';
import { exportHomeFile, importHomeFile } from '../db/home-file.ts';
import { defaultProjectPath, openProject } from '../db/project.ts';
import { effectiveLibrary } from '../db/repositories/library.ts';
import { listHomes } from '../db/repositories/homes.ts';
import { portfolioSummary, type PortfolioSummary } from '../db/portfolio.ts';
import { openStore, type ReadAccess, type Store } from '../db/store.ts';
import { formatNumber, formatUsd } from '../core/format.ts';
import { planText, textTable } from './plan-text.ts';

export const EXIT_OK = 0;
export const EXIT_UNEXPECTED = 1;
export const EXIT_BAD_INPUT = 2;

const USAGE = `Sealwork: plans air-sealing retrofits from a blower-door test.

Usage:
  sealwork evaluate FILE|HOME_ID [--json]   evaluate a home file or a stored home
  sealwork list [--json]                    the stored homes
  sealwork import FILE [--json]             store a home file as a new home; prints its id
  sealwork import FILE.csv [--json] [--dry-run]
                                            store a portfolio CSV, a home a row, all or none;
                                            prints how many (--json: their ids)
  sealwork export HOME_ID FILE              write a stored home as a home file
  sealwork export-csv FILE [--results]      write every home as a portfolio CSV, or (--results)
                                            a row of each home's leakage and plan figures
  sealwork portfolio [--json]               the summary: homes by fuel, town and decade built,
                                            test-in leakage, measures by status and type
  sealwork backup FILE                      copy the whole project to FILE
  sealwork restore FILE                     replace the project with a backup
  sealwork demo [--json]                    evaluate the invented demo homes
  sealwork help                             show this help

Options:
  --db PATH   the project file (default: $SEALWORK_DB, else sealwork.db in your data folder)
  --demo      fill a new project file with the demo homes
  --dry-run   check a portfolio CSV and show what would be stored; writes nothing
  --results   export-csv: the plans' figures instead of the homes

Exit codes: 0 done, 2 bad input (problems listed on stderr), 1 unexpected error.`;

/** Where the command line writes; tests pass their own. */
export interface CliOutput {
  out(text: string): void;
  err(text: string): void;
}

const processOutput: CliOutput = {
  out: (text) => process.stdout.write(text.endsWith('\n') ? text : `${text}\n`),
  err: (text) => process.stderr.write(text.endsWith('\n') ? text : `${text}\n`),
};

class UsageError extends Error {}

interface Parsed {
  command: string | undefined;
  positionals: string[];
  json: boolean;
  db: string | undefined;
  demo: boolean;
  dryRun: boolean;
  results: boolean;
}

function parse(argv: readonly string[]): Parsed {
  const { values, positionals } = parseArgs({
    args: [...argv],
    options: {
      json: { type: 'boolean' },
      db: { type: 'string' },
      demo: { type: 'boolean' },
      'dry-run': { type: 'boolean' },
      results: { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
    allowPositionals: true,
  });
  const [first, ...rest] = positionals;
  const command = values.help ? 'help' : first;
  return {
    command,
    positionals: rest,
    json: values.json === true,
    db: values.db,
    demo: values.demo === true,
    dryRun: values['dry-run'] === true,
    results: values.results === true,
  };
}

function expectPositionals(parsed: Parsed, names: string[]): string[] {
  if (parsed.positionals.length !== names.length) {
    throw new UsageError(
      `${parsed.command} takes ${names.length === 0 ? 'no arguments' : names.join(' ')}`,
    );
  }
  return parsed.positionals;
}

/** Opens the project for a command, closing it afterwards whatever happens. */
function withProject<T>(parsed: Parsed, work: (store: Store) => T): T {
  const path = parsed.db ?? defaultProjectPath();
  const { store } = openProject(path, { demoWhenNew: parsed.db === undefined || parsed.demo });
  try {
    return work(store);
  } finally {
    store.close();
  }
}

async function readTextFile(path: string): Promise<string> {
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

async function runEvaluate(parsed: Parsed, output: CliOutput): Promise<number> {
  const [target = ''] = expectPositionals(parsed, ['FILE|HOME_ID']);
  const homeId = homeIdOf(target);
  const report =
    homeId === null
      ? evaluateHomeReport(await readJsonFile(target))
      : withProject(parsed, (store) =>
          store.read((read) =>
            evaluateHomeReport(exportHomeFile(read, homeId), { library: effectiveLibrary(read) }),
          ),
        );
  printReports(output, [report], parsed.json, true);
  return EXIT_OK;
}

function runList(parsed: Parsed, output: CliOutput): number {
  expectPositionals(parsed, []);
  const homes = withProject(parsed, (store) => store.read((read) => listHomes(read)));
  if (parsed.json) {
    output.out(JSON.stringify(homes, null, 2));
    return EXIT_OK;
  }
  const rows = homes.map((home) => [
    String(home.id),
    home.name,
    home.town ?? '',
    home.clientName ?? '',
    home.heatingFuel ?? '',
    String(home.measureCount),
    home.isDemo ? 'demo' : '',
  ]);
  output.out(
    textTable(
      [
        { title: 'Id', align: 'right' },
        { title: 'Home', align: 'left' },
        { title: 'Town', align: 'left' },
        { title: 'Client', align: 'left' },
        { title: 'Fuel', align: 'left' },
        { title: 'Measures', align: 'right' },
        { title: '', align: 'left' },
      ],
      rows,
    ),
  );
  return EXIT_OK;
}

async function runImport(parsed: Parsed, output: CliOutput): Promise<number> {
  const [file = ''] = expectPositionals(parsed, ['FILE']);
  if (file.toLowerCase().endsWith('.csv')) return runCsvImport(parsed, file, output);
  if (parsed.dryRun) throw new UsageError('--dry-run is for a portfolio CSV (FILE.csv)');
  const input = await readJsonFile(file);
  const id = withProject(parsed, (store) => store.write((write) => importHomeFile(write, input)));
  output.out(parsed.json ? JSON.stringify({ id }) : String(id));
  return EXIT_OK;
}

async function runExport(parsed: Parsed, output: CliOutput): Promise<number> {
  const [idText = '', file = ''] = expectPositionals(parsed, ['HOME_ID', 'FILE']);
  const homeId = homeIdOf(idText);
  if (homeId === null) throw new UsageError(`HOME_ID must be a number, got "${idText}"`);
  const homeFile = withProject(parsed, (store) =>
    store.read((read) => exportHomeFile(read, homeId)),
  );
  await writeFile(file, `${JSON.stringify(homeFile, null, 2)}\n`, 'utf8');
  output.out(`wrote ${file}`);
  return EXIT_OK;
}

/** How many problems of a CSV are listed before the rest are counted. */
const PROBLEMS_LISTED = 200;

function listCsvProblems(output: CliOutput, problems: readonly CsvProblem[]): number {
  output.err(`The CSV file cannot be imported; nothing was written (${problems.length} problems):`);
  for (const problem of problems.slice(0, PROBLEMS_LISTED)) {
    output.err(`  ${formatCsvProblem(problem)}`);
  }
  if (problems.length > PROBLEMS_LISTED) {
    output.err(`  … and ${problems.length - PROBLEMS_LISTED} more`);
  }
  return EXIT_BAD_INPUT;
}

/** Reads the project for a dry run without writing to it (nor creating it). */
function withProjectRead<T>(parsed: Parsed, work: (read: ReadAccess) => T): T {
  const path = parsed.db ?? defaultProjectPath();
  // A project not made yet has no stored climates or price sets: an empty one answers the same.
  const store = existsSync(path) ? openStore(path, { readonly: true }) : openStore(':memory:');
  try {
    return store.read(work);
  } finally {
    store.close();
  }
}

function printDryRun(output: CliOutput, plan: CsvImportPlan, json: boolean): void {
  if (json) {
    output.out(JSON.stringify({ dryRun: true, rows: plan.rows, homes: plan.homes }, null, 2));
    return;
  }
  const rows = plan.homes.map(({ line, file, climateId, priceSetId }) => [
    String(line),
    file.name,
    file.address?.town ?? '',
    file.heating.fuel,
    file.leakageTest.points
      ? `${file.leakageTest.points.length} readings`
      : formatNumber(file.leakageTest.cfm50 ?? 0),
    climateId === null ? file.climate.name : `${file.climate.name} (stored)`,
    priceSetId === null ? 'own' : 'stored set',
  ]);
  const titles = ['Line', 'Home', 'Town', 'Fuel', 'CFM50', 'Climate', 'Prices'];
  const columns = titles.map((title, index) => ({
    title,
    align: index === 0 || index === 4 ? ('right' as const) : ('left' as const),
  }));
  output.out(textTable(columns, rows));
  output.out(`${plan.homes.length} homes would be imported (dry run: nothing was written).`);
}

async function runCsvImport(parsed: Parsed, file: string, output: CliOutput): Promise<number> {
  const text = await readTextFile(file);
  if (parsed.dryRun) {
    const plan = withProjectRead(parsed, (read) => planCsvImport(read, text));
    if (plan.problems.length > 0) return listCsvProblems(output, plan.problems);
    printDryRun(output, plan, parsed.json);
    return EXIT_OK;
  }
  // Checked and written in one transaction, so the stored sets it names cannot vanish between.
  const result = withProject(parsed, (store) =>
    store.write((write) => {
      const plan = planCsvImport(write, text);
      return plan.problems.length > 0 ? plan.problems : { ids: commitCsvImport(write, plan) };
    }),
  );
  if (Array.isArray(result)) return listCsvProblems(output, result);
  output.out(parsed.json ? JSON.stringify(result) : `imported ${result.ids.length} homes`);
  return EXIT_OK;
}

async function runExportCsv(parsed: Parsed, output: CliOutput): Promise<number> {
  const [file = ''] = expectPositionals(parsed, ['FILE']);
  const exported = withProject(parsed, (store) =>
    store.read((read) =>
      parsed.results ? { csv: resultsCsv(read), leftOut: [] } : exportHomesCsv(read),
    ),
  );
  await writeFile(file, exported.csv, 'utf8');
  output.out(`wrote ${file}`);
  for (const { homeId, name, parts } of exported.leftOut) {
    output.err(`note: home ${homeId} (${name}): not in the CSV: ${parts.join(', ')}`);
  }
  return EXIT_OK;
}

function countTable(title: string, rows: { label: string; homes: number }[]): string {
  return textTable(
    [
      { title, align: 'left' },
      { title: 'Homes', align: 'right' },
    ],
    rows.map(({ label, homes }) => [label, formatNumber(homes)]),
  );
}

function portfolioText(summary: PortfolioSummary): string {
  const { leakage, measures } = summary;
  const parts = [
    `Portfolio: ${formatNumber(summary.homes)} homes (${formatNumber(summary.demoHomes)} demo, ` +
      `${formatNumber(summary.incompleteHomes)} not ready to plan)`,
  ];
  const left = leakage.leftOut;
  const spread = leakage.ach50;
  parts.push(
    [
      `Test-in leakage of ${formatNumber(leakage.homesCounted)} homes ` +
        `(${formatNumber(leakage.fittedMultipoint)} fitted from several readings): ` +
        `CFM50 total ${formatNumber(leakage.cfm50Total)}`,
      spread
        ? `  ACH50  min ${formatNumber(spread.min, 1)}  P10 ${formatNumber(spread.p10, 1)}  ` +
          `median ${formatNumber(spread.median, 1)}  P90 ${formatNumber(spread.p90, 1)}  ` +
          `max ${formatNumber(spread.max, 1)}  mean ${formatNumber(spread.mean, 1)}`
        : '  ACH50  no tested homes',
      `  Left out: ${left.noTestIn} without a test-in, ${left.noVolume} without a volume, ` +
        `${left.readingsUnfit} whose readings could not be fitted`,
    ].join('\n'),
  );
  const label = (value: string | number | null) => (value === null ? '(none)' : String(value));
  parts.push(
    countTable(
      'Heating fuel',
      summary.byFuel.map((row) => ({ ...row, label: label(row.fuel) })),
    ),
  );
  parts.push(
    countTable(
      'Town',
      summary.byTown.map((row) => ({ ...row, label: label(row.town) })),
    ),
  );
  parts.push(
    countTable(
      'Built',
      summary.byDecade.map((row) => ({
        ...row,
        label: row.decade === null ? '(none)' : `${row.decade}s`,
      })),
    ),
  );
  parts.push(
    countTable(
      'Job',
      summary.byJobStatus.map((row) => ({ ...row, label: row.status })),
    ),
  );
  const statuses = measures.byStatus
    .map((row) => `${row.status} ${formatNumber(row.count)} (${formatUsd(row.costUsd)})`)
    .join(', ');
  parts.push(
    `Measures: ${formatNumber(measures.count)} (${formatUsd(measures.costUsd)})${statuses ? `: ${statuses}` : ''}`,
  );
  if (measures.byType.length > 0) {
    parts.push(
      textTable(
        [
          { title: 'Measure type', align: 'left' },
          { title: 'Count', align: 'right' },
          { title: 'Planned', align: 'right' },
          { title: 'Planned cost', align: 'right' },
        ],
        measures.byType.map((row) => [
          row.type,
          formatNumber(row.count),
          formatNumber(row.plannedCount),
          formatUsd(row.plannedCostUsd, { cents: true }),
        ]),
      ),
    );
  }
  return parts.join('\n\n');
}

function runPortfolio(parsed: Parsed, output: CliOutput): number {
  expectPositionals(parsed, []);
  const summary = withProject(parsed, (store) => store.read(portfolioSummary));
  output.out(parsed.json ? JSON.stringify(summary, null, 2) : portfolioText(summary));
  return EXIT_OK;
}

function runBackup(parsed: Parsed, output: CliOutput): number {
  const [file = ''] = expectPositionals(parsed, ['FILE']);
  withProject(parsed, (store) => backupTo(store, file));
  output.out(`wrote ${file}`);
  return EXIT_OK;
}

function runRestore(parsed: Parsed, output: CliOutput): number {
  const [file = ''] = expectPositionals(parsed, ['FILE']);
  const path = parsed.db ?? defaultProjectPath();
  restoreFrom(file, path);
  // Opening once applies any migration the restored copy needs.
  withProject(parsed, () => undefined);
  output.out(`restored ${path} from ${file}`);
  return EXIT_OK;
}

function runDemo(parsed: Parsed, output: CliOutput): number {
  expectPositionals(parsed, []);
  const reports = DEMO_HOMES.map((home) => evaluateHomeReport(home));
  if (!parsed.json) {
    output.out(
      `${DEMO_PROGRAM_NAME} (an invented demo scenario: every home, price and climate is made up)\n`,
    );
  }
  printReports(output, reports, parsed.json, false);
  return EXIT_OK;
}

function listProblems(output: CliOutput, heading: string, problems: readonly InputProblem[]): void {
  output.err(heading);
  for (const problem of problems) {
    output.err(`  ${problem.path === '' ? '(file)' : problem.path}: ${problem.message}`);
  }
}

/**
 * Runs the command line.
 *
 * @param argv - the arguments after the program name
 * @returns the exit code
 */
export async function main(
  argv: readonly string[],
  output: CliOutput = processOutput,
): Promise<number> {
  try {
    const parsed = parse(argv);
    switch (parsed.command) {
      case 'evaluate':
        return await runEvaluate(parsed, output);
      case 'list':
        return runList(parsed, output);
      case 'import':
        return await runImport(parsed, output);
      case 'export':
        return await runExport(parsed, output);
      case 'export-csv':
        return await runExportCsv(parsed, output);
      case 'portfolio':
        return runPortfolio(parsed, output);
      case 'backup':
        return runBackup(parsed, output);
      case 'restore':
        return runRestore(parsed, output);
      case 'demo':
        return runDemo(parsed, output);
      case undefined:
      case 'help':
        output.out(USAGE);
        return EXIT_OK;
      default:
        throw new UsageError(`unknown command "${parsed.command}"`);
    }
  } catch (error) {
    if (error instanceof CsvImportError) return listCsvProblems(output, error.problems);
    if (error instanceof InputError) {
      listProblems(output, 'The home file cannot be used:', error.problems);
      return EXIT_BAD_INPUT;
    }
    if (error instanceof DbError) {
      output.err(`sealwork: ${error.message}${error.field ? ` (${error.field})` : ''}`);
      return EXIT_BAD_INPUT;
    }
    if (
      error instanceof UsageError ||
      (error as { code?: string }).code?.startsWith('ERR_PARSE_ARGS')
    ) {
      output.err(`sealwork: ${(error as Error).message}\n\n${USAGE}`);
      return EXIT_BAD_INPUT;
    }
    output.err(`sealwork: unexpected error: ${(error as Error).stack ?? String(error)}`);
    return EXIT_UNEXPECTED;
  }
}
