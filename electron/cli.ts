/**
 * The command line: `sealwork evaluate FILE [--json]` and `sealwork demo [--json]`.
 *
 * Exit codes: 0 done; 2 bad input (usage, unreadable file, invalid JSON, an invalid home
 * file), with every problem listed on standard error and nothing on standard output;
 * 1 anything unexpected.
 */
import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { InputError, type InputProblem } from '../core/errors.ts';
import { evaluateHomeReport } from '../core/evaluate.ts';
import type { EvaluationReport } from '../core/report.ts';
import { DEMO_HOMES, DEMO_PROGRAM_NAME } from '../db/demo/alder-creek.ts';
import { planText } from './plan-text.ts';

export const EXIT_OK = 0;
export const EXIT_UNEXPECTED = 1;
export const EXIT_BAD_INPUT = 2;

const USAGE = `Sealwork: plans air-sealing retrofits from a blower-door test.

Usage:
  sealwork evaluate FILE [--json]   evaluate one home file (sealwork-home/1)
  sealwork demo [--json]            evaluate the invented demo homes
  sealwork help                     show this help

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

function listProblems(output: CliOutput, heading: string, problems: readonly InputProblem[]): void {
  output.err(heading);
  for (const problem of problems) {
    output.err(`  ${problem.path === '' ? '(file)' : problem.path}: ${problem.message}`);
  }
}

async function readHomeFile(path: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const reason =
      code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a folder' : 'cannot be read';
    throw InputError.at('', `${path}: ${reason}`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw InputError.at('', `${path} is not valid JSON (${(error as Error).message})`);
  }
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

async function runEvaluate(args: string[], output: CliOutput): Promise<number> {
  const { values, positionals } = parseArgs({
    args,
    options: { json: { type: 'boolean' } },
    allowPositionals: true,
  });
  if (positionals.length !== 1) throw new UsageError('evaluate takes exactly one FILE');
  const path = positionals[0] ?? '';
  const report = evaluateHomeReport(await readHomeFile(path));
  printReports(output, [report], values.json === true, true);
  return EXIT_OK;
}

function runDemo(args: string[], output: CliOutput): number {
  const { values, positionals } = parseArgs({
    args,
    options: { json: { type: 'boolean' } },
    allowPositionals: true,
  });
  if (positionals.length > 0) throw new UsageError('demo takes no FILE');
  const reports = DEMO_HOMES.map((home) => evaluateHomeReport(home));
  if (values.json !== true) {
    output.out(
      `${DEMO_PROGRAM_NAME} (an invented demo scenario: every home, price and climate is made up)\n`,
    );
  }
  printReports(output, reports, values.json === true, false);
  return EXIT_OK;
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
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case 'evaluate':
        return await runEvaluate(rest, output);
      case 'demo':
        return runDemo(rest, output);
      case undefined:
      case 'help':
      case '--help':
      case '-h':
        output.out(USAGE);
        return EXIT_OK;
      default:
        throw new UsageError(`unknown command "${command}"`);
    }
  } catch (error) {
    if (error instanceof InputError) {
      listProblems(output, 'The home file cannot be evaluated:', error.problems);
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
