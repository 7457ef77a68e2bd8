/**
 * Portfolio CSV in: one home a row (house, climate, heating and cooling, prices, the test-in),
 * each row turned into a `sealwork-home/1` file and checked by the home-file schema. Every
 * problem is reported at its CSV line (the header is line 1) and column; the whole file goes in
 * within one transaction, or nothing does.
 *
 * `planCsvImport` checks and writes nothing; `commitCsvImport` writes a checked plan. The CSV
 * is read as RFC 4180 describes it (comma-separated, fields with commas, quotes or line breaks
 * quoted, a quote inside doubled), by papaparse.
 *
 * The parts, in the order a file goes through them: csv-columns.ts (the columns and how a cell
 * is read), csv-text.ts (the text as records, the header as a layout of columns), csv-rows.ts
 * (a row as a home-file input, and the schema's problems back at their columns).
 */
import { InputError } from '../core/errors.ts';
import { checkHomeFile, type HomeFile } from '../core/schema.ts';
import { covered, csvProblem, rowHome, type Lookups } from './csv-rows.ts';
import { readHeader, readRecords, type CsvProblem } from './csv-text.ts';
import { DbError } from './errors.ts';
import { dataOf } from './home-file.ts';
import { findOrCreateClient } from './repositories/clients.ts';
import { createHome } from './repositories/homes.ts';
import { addLeakageTest } from './repositories/leakage-tests.ts';
import { climates, priceSets } from './repositories/reusable-sets.ts';
import { getSettings } from './repositories/settings.ts';
import type { ReadAccess, WriteAccess } from './store.ts';

// Defined where the CSV is read, and named here too so that every user of the import (the
// export, the hosts, the tests) finds all of its names in this one file.
export { CSV_COLUMNS, FORMULA_START, type CsvCellKind, type CsvColumn } from './csv-columns.ts';
export type { CsvProblem } from './csv-text.ts';

/** A checked row, ready to store. */
export interface CsvHome {
  line: number;
  file: HomeFile;
  /** The stored climate or price set the row names, linked rather than copied. */
  climateId: number | null;
  priceSetId: number | null;
}

export interface CsvImportPlan {
  /** Data rows read (empty lines not counted). */
  rows: number;
  /** The rows that passed every check. */
  homes: CsvHome[];
  problems: CsvProblem[];
}

/** Raised by `commitCsvImport` for a plan that has problems. */
export class CsvImportError extends Error {
  override readonly name = 'CsvImportError';
  readonly problems: readonly CsvProblem[];

  constructor(problems: readonly CsvProblem[]) {
    super(problems.map(formatCsvProblem).join('\n'));
    this.problems = problems;
  }
}

/**
 * A problem as one line of text for people.
 *
 * @param problem - its file line (1-based, the header is line 1), column and message
 * @returns `line 4, column cfm50: expected …`, or `line 4: …` for a whole line
 *
 * Notes: the words of the message are the home file's, said at the CSV column.
 *
 * References: none (Sealwork's own format).
 */
export function formatCsvProblem(problem: CsvProblem): string {
  const where = problem.column === '' ? '' : `, column ${problem.column}`;
  return `line ${problem.line}${where}: ${problem.message}`;
}

// ── Plan and commit ──────────────────────────────────────────────────────────────────────

/**
 * Reads a portfolio CSV and checks every row as a home file, writing nothing.
 *
 * @param read - the project, for its stored climates, price sets and default settings
 * @param csvText - the file's text: a header row of column names, then one home a row
 * @returns the number of data rows, the rows that passed, and every problem by line and column
 *
 * Notes: a row's line is the file line it starts on (the header is line 1); a quoted field may
 * span lines. Empty lines, and rows whose cells are all empty, are skipped. Cells are trimmed.
 *
 * References: RFC 4180, "Common Format and MIME Type for Comma-Separated Values (CSV) Files".
 */
export function planCsvImport(read: ReadAccess, csvText: string): CsvImportPlan {
  const { records, problems } = readRecords(csvText);
  const [header, ...rows] = records;
  if (!header) {
    const message = 'the file is empty: expected a header row of column names, then a row per home';
    return { rows: 0, homes: [], problems: [{ line: 1, column: '', message }] };
  }
  const layout = readHeader(header, rows, problems);
  const lookups: Lookups = {
    climates: new Map(climates.list(read).map((set) => [set.name, set])),
    priceSets: new Map(priceSets.list(read).map((set) => [set.name, set])),
    settings: getSettings(read),
  };
  const homes: CsvHome[] = [];
  for (const record of rows) {
    const row = rowHome(record, layout, lookups);
    const result = checkHomeFile(row.input);
    if (result.ok) {
      if (row.problems.length === 0) {
        homes.push({
          line: row.line,
          file: result.home,
          climateId: row.climateId,
          priceSetId: row.priceSetId,
        });
      }
    } else {
      for (const problem of result.problems) {
        if (row.refused.some((path) => covered(problem.path, path))) continue;
        const found = csvProblem(row, problem.path, problem.message);
        if (!layout.blamed.has(found.column)) row.problems.push(found);
      }
    }
    problems.push(...row.problems);
  }
  problems.sort((first, second) => first.line - second.line);
  return { rows: rows.length, homes, problems };
}

function storeHome(write: WriteAccess, home: CsvHome, clientIds: Map<string, number>): number {
  const { file } = home;
  let clientId: number | null = null;
  if (file.client) {
    const key = `${file.client.name}\u0000${file.client.email ?? ''}`;
    clientId = clientIds.get(key) ?? findOrCreateClient(write, file.client);
    clientIds.set(key, clientId);
  }
  const homeId = createHome(write, {
    name: file.name,
    clientId,
    climateId: home.climateId,
    priceSetId: home.priceSetId,
    isDemo: file.demo ?? false,
    ...(file.address ? { address: file.address } : {}),
    ...(file.notes === undefined ? {} : { notes: file.notes }),
    data: dataOf(file),
  });
  // Marked as the plan's test-in, as a home file's own test is on import.
  addLeakageTest(write, homeId, { kind: 'testIn', ...file.leakageTest }, { planBasis: true });
  return homeId;
}

/** The error of a row's write, said at its CSV line. */
function atLine(error: unknown, line: number): unknown {
  if (error instanceof DbError) {
    const field = error.field === undefined ? {} : { field: error.field };
    return new DbError(error.kind, `line ${line}: ${error.message}`, { ...field, cause: error });
  }
  if (error instanceof InputError) {
    return new CsvImportError(
      error.problems.map((problem) => ({
        line,
        column: '',
        message: `${problem.path}: ${problem.message}`,
      })),
    );
  }
  return error;
}

/**
 * Stores every home of a checked plan, each with its client (matched by name and email, or
 * new) and its test-in, linked to the stored climate or price set its row named.
 *
 * @param write - the caller's write transaction: all homes commit together or none does
 * @param plan - from `planCsvImport`, with no problems
 * @returns the new homes' ids, in the file's order
 * @throws CsvImportError for a plan with problems (nothing is written); DbError naming the
 *   line whose write failed (the caller's transaction then rolls back every row)
 *
 * Notes: the checks were made when the plan was; plan inside the same transaction to be sure
 * the stored climates and price sets named are still there.
 *
 * References: SQLite, "Transaction" (BEGIN IMMEDIATE … COMMIT; an error rolls back the whole).
 */
export function commitCsvImport(write: WriteAccess, plan: CsvImportPlan): number[] {
  if (plan.problems.length > 0) throw new CsvImportError(plan.problems);
  const clientIds = new Map<string, number>();
  return plan.homes.map((home) => {
    try {
      return storeHome(write, home, clientIds);
    } catch (error) {
      throw atLine(error, home.line);
    }
  });
}
