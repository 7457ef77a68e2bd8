/**
 * The command line. Every command takes `--db PATH` (default: `SEALWORK_DB`, else the
 * project file in the user's data folder, which starts with the demo homes); a new file
 * named by `--db` starts empty unless `--demo` is given. The commands ask the same channel
 * table as the desktop window and the browser host (cli-commands.ts).
 *
 * Exit codes: 0 done; 2 bad input (usage, unreadable file, invalid JSON, an invalid home
 * file or CSV, a home that does not exist), with every problem listed on standard error and
 * nothing on standard output; 1 anything unexpected.
 */
import { parseArgs } from 'node:util';
import { runBills } from './cli-bills.ts';
import { runWeather } from './cli-weather.ts';
import { runWorkOrder } from './cli-workorder.ts';
import { InputError } from '../core/errors.ts';
import { DbError } from '../db/errors.ts';
import {
  ChannelFailure,
  CsvRefusal,
  EXIT_BAD_INPUT,
  EXIT_OK,
  EXIT_UNEXPECTED,
  listCsvProblems,
  runBackup,
  runDemo,
  runEvaluate,
  runExport,
  runExportCsv,
  runImport,
  runList,
  runPortfolio,
  runRestore,
  UsageError,
  type ChoicesFlags,
  type CliOutput,
  type Parsed,
} from './cli-commands.ts';

export { EXIT_BAD_INPUT, EXIT_OK, EXIT_UNEXPECTED, type CliOutput } from './cli-commands.ts';

const USAGE = `Sealwork: plans air-sealing retrofits from a blower-door test.

Usage:
  sealwork evaluate FILE|HOME_ID [--json]   evaluate a home file or a stored home
      [--draws N] [--seed S] [--distribution pert|triangular]
                                            and the package's range of outcomes (Monte Carlo)
      [--budget USD|none] [--objective npv|savings|sir]
                                            and the best package within a budget
      [--weather FILE]                      a home file planned hour by hour on an EPW or
                                            TMY3 year (a stored home uses its climate's)
  sealwork list [--json]                    the stored homes
  sealwork import FILE [--json]             store a home file (or one bundled with its photos)
                                            as a new home; prints its id
  sealwork import FILE.csv [--json] [--dry-run]
                                            store a portfolio CSV, a home a row, all or none;
                                            prints how many (--json: their ids)
  sealwork export HOME_ID FILE [--photos]   write a stored home as a home file (--photos:
                                            bundled with its photos); an hourly home's file
                                            carries its weather year
  sealwork export-csv FILE [--results]      write every home as a portfolio CSV, or (--results)
                                            a row of each home's leakage and plan figures
  sealwork portfolio [--json]               the summary: homes by fuel, town and decade built,
                                            test-in leakage, measures by status and type
  sealwork portfolio --all|FILE.csv [--out DIR] [--json] [--draws N] [--seed S] [--bias F]
                                            every stored home (or a CSV's, not stored) planned
                                            together: totals, by type, test-outs; DIR gets CSVs;
                                            --draws: the program's P10/P50/P90 (worker threads);
                                            --bias 0.2: a shared ± 20 % on every home's estimates
  sealwork bills BILLS.csv --temperatures TEMPS.csv --work-done YYYY-MM-DD [--estimate N] [--json]
                                            what the bills say the work saved: degree-day fits
                                            before and after (Guideline 14 statistics)
  sealwork weather FILE [--base-f 65] [--json]
                                            an EPW or TMY3 weather file: place, hours, HDD and
                                            CDD at the base, by month, design temperatures
  sealwork workorder HOME_ID [--json] [--pdf FILE]
                                            the crew's work order of a stored home: measures,
                                            materials, hours, cautions, test-out target
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

const processOutput: CliOutput = {
  out: (text) => process.stdout.write(text.endsWith('\n') ? text : `${text}\n`),
  err: (text) => process.stderr.write(text.endsWith('\n') ? text : `${text}\n`),
  // Only a terminal gets the bar: redrawn in place, cleared at the end.
  progress: (text) => {
    if (process.stderr.isTTY) process.stderr.write(`\r\x1b[2K${text}`);
  },
};

function parse(argv: readonly string[]): Parsed {
  const { values, positionals } = parseArgs({
    args: [...argv],
    options: {
      json: { type: 'boolean' },
      db: { type: 'string' },
      demo: { type: 'boolean' },
      'dry-run': { type: 'boolean' },
      results: { type: 'boolean' },
      all: { type: 'boolean' },
      temperatures: { type: 'string' },
      'work-done': { type: 'string' },
      estimate: { type: 'string' },
      bias: { type: 'string' },
      'base-f': { type: 'string' },
      weather: { type: 'string' },
      pdf: { type: 'string' },
      photos: { type: 'boolean' },
      out: { type: 'string' },
      draws: { type: 'string' },
      seed: { type: 'string' },
      distribution: { type: 'string' },
      budget: { type: 'string' },
      objective: { type: 'string' },
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
    choices: choicesOfFlags(values),
    all: values.all === true,
    bias: values.bias,
    weather: {
      ...(values['base-f'] === undefined ? {} : { baseF: values['base-f'] }),
      ...(values.weather === undefined ? {} : { file: values.weather }),
    },
    bills: {
      ...(values.temperatures === undefined ? {} : { temperatures: values.temperatures }),
      ...(values['work-done'] === undefined ? {} : { workDone: values['work-done'] }),
      ...(values.estimate === undefined ? {} : { estimate: values.estimate }),
    },
    out: values.out,
    pdf: values.pdf,
    photos: values.photos === true,
  };
}

/** A flag's whole number, or a usage error naming the flag. */
function wholeFlag(flag: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  if (!/^\d+$/.test(text)) throw new UsageError(`--${flag} expects a whole number, got "${text}"`);
  return Number(text);
}

/** The evaluate command's choices from its flags (each checked again by the channel). */
function choicesOfFlags(values: {
  draws?: string;
  seed?: string;
  distribution?: string;
  budget?: string;
  objective?: string;
}): ChoicesFlags {
  const { budget, objective, distribution } = values;
  let budgetUsd: number | null | undefined;
  if (budget !== undefined) {
    if (budget === 'none') budgetUsd = null;
    else if (/^\d+(\.\d{1,2})?$/.test(budget)) budgetUsd = Number(budget);
    else
      throw new UsageError(
        `--budget expects dollars (e.g. 2500 or 2500.50) or "none", got "${budget}"`,
      );
  }
  if (objective !== undefined && budgetUsd === undefined) {
    throw new UsageError('--objective goes with --budget');
  }
  return {
    draws: wholeFlag('draws', values.draws),
    seed: wholeFlag('seed', values.seed),
    distribution,
    budget:
      budgetUsd === undefined ? undefined : { budgetUsd, ...(objective ? { objective } : {}) },
  };
}

/** Problems in the form `path: message`, one a line, under a heading. */
function listProblems(output: CliOutput, heading: string, lines: readonly string[]): void {
  output.err(heading);
  for (const line of lines) output.err(`  ${line}`);
}

async function dispatch(parsed: Parsed, output: CliOutput): Promise<number> {
  const choiceFlag = Object.entries(parsed.choices).find(([, value]) => value !== undefined);
  const portfolioFlag = choiceFlag?.[0] === 'draws' || choiceFlag?.[0] === 'seed';
  if (
    choiceFlag &&
    parsed.command !== 'evaluate' &&
    !(portfolioFlag && parsed.command === 'portfolio')
  ) {
    throw new UsageError(
      `--${choiceFlag[0]} is for the evaluate command${portfolioFlag ? ' and portfolio --all|FILE.csv' : ''}`,
    );
  }
  switch (parsed.command) {
    case 'evaluate':
      return runEvaluate(parsed, output);
    case 'list':
      return runList(parsed, output);
    case 'import':
      return runImport(parsed, output);
    case 'export':
      return runExport(parsed, output);
    case 'export-csv':
      return runExportCsv(parsed, output);
    case 'portfolio':
      return runPortfolio(parsed, output);
    case 'bills':
      return runBills(parsed, output);
    case 'weather':
      return runWeather(parsed, output);
    case 'workorder':
      return runWorkOrder(parsed, output);
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
    return await dispatch(parse(argv), output);
  } catch (error) {
    if (error instanceof CsvRefusal) return listCsvProblems(output, error.problems);
    if (error instanceof ChannelFailure) {
      const { kind, message, field } = error.failure;
      if (kind === 'unexpected') {
        output.err(`sealwork: ${message}`);
        return EXIT_UNEXPECTED;
      }
      if (kind === 'invalid') {
        const lines = error.failure.problems?.map(
          (problem) => `${problem.path === '' ? '(file)' : problem.path}: ${problem.message}`,
        );
        listProblems(output, 'The input cannot be used:', lines ?? message.split('\n'));
      } else {
        output.err(`sealwork: ${message}${field ? ` (${field})` : ''}`);
      }
      return EXIT_BAD_INPUT;
    }
    if (error instanceof InputError) {
      listProblems(
        output,
        'The input cannot be used:',
        error.problems.map(
          (problem) => `${problem.path === '' ? '(file)' : problem.path}: ${problem.message}`,
        ),
      );
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
