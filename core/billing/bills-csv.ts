/**
 * The billing files as CSV: bills (`periodStart,periodEnd,use,fuel`) and daily mean
 * temperatures (`date,meanTempF`, or `date,meanTempC` in °C). Every problem of a file is
 * reported at once at its line (the header is line 1) and column; a file with any problem
 * gives no items, so a half-read file is never fitted.
 */
import { Decimal } from 'decimal.js';
import type { InputProblem } from '../errors.ts';
import {
  billProblems,
  DAILY_MEAN_MAX_F,
  DAILY_MEAN_MIN_F,
  isFuel,
  temperatureProblems,
  type BillInput,
  type DailyTemperature,
  type UtilityBill,
} from './bills.ts';
import { readCsvTable, type CsvProblem, type CsvRow, type CsvTableSpec } from './csv-reader.ts';

export type BillsCsvResult =
  { ok: true; bills: UtilityBill[] } | { ok: false; problems: CsvProblem[] };

export type TemperaturesCsvResult =
  { ok: true; temperatures: DailyTemperature[] } | { ok: false; problems: CsvProblem[] };

const BILLS_SPEC: CsvTableSpec = {
  fileKind: 'bills file',
  columns: ['periodStart', 'periodEnd', 'use', 'fuel'],
  required: ['periodStart', 'periodEnd', 'use', 'fuel'],
};

const TEMPERATURES_SPEC: CsvTableSpec = {
  fileKind: 'daily temperatures file',
  columns: ['date', 'meanTempF', 'meanTempC'],
  required: ['date'],
  exactlyOneOf: [['meanTempF', 'meanTempC']],
};

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Enough digits that °C → °F of any decimal a file holds is exact before the one rounding. */
const ExactDecimal = Decimal.clone({ precision: 60 });

/** A number cell: its value, or what is wrong with it in words. */
function readNumber(text: string, what: string): { value: number } | { problem: string } {
  if (text === '') return { problem: `is required: expected ${what}` };
  if (DECIMAL.test(text)) return { value: Number(text) };
  if (/^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/.test(text)) {
    return { problem: `expected a number without thousands separators, got "${text}"` };
  }
  return { problem: `expected a number (${what}), got "${text}"` };
}

/**
 * A Celsius text as °F: F = C·9/5 + 32 worked in decimal, so the result is the double
 * nearest the exact value (−39.5 °C → −39.1 °F, where −39.5 × 1.8 + 32 in binary gives −39.10000000000001).
 *
 * @param celsiusText - a decimal number as text, °C
 * @returns the temperature, °F
 */
export function celsiusTextToFahrenheit(celsiusText: string): number {
  return new ExactDecimal(celsiusText).times(9).div(5).plus(32).toNumber();
}

/** Problems of the item checks, moved from `list[k].field` to row k's line and column. */
function atCells(
  problems: readonly InputProblem[],
  rows: readonly CsvRow[],
  columnOf: (field: string) => string,
  blamed: ReadonlySet<string>,
): CsvProblem[] {
  const found: CsvProblem[] = [];
  for (const problem of problems) {
    const match = /^\w+\[(\d+)\]\.(\w+)$/.exec(problem.path);
    const line = rows[Number(match?.[1])]?.line ?? 1;
    const column = columnOf(match?.[2] ?? '');
    // A message naming another item (`overlaps bills[2]`) names its line instead.
    const message = problem.message.replace(
      /\b\w+\[(\d+)\]/g,
      (_, index: string) => `line ${rows[Number(index)]?.line ?? 1}`,
    );
    if (!blamed.has(`${line}:${column}`)) found.push({ line, column, message });
  }
  return found;
}

/** Problems by line, then in the order of the file kind's columns (a whole line's first). */
function sorted(problems: CsvProblem[], spec: CsvTableSpec): CsvProblem[] {
  const order = (column: string) => spec.columns.indexOf(column);
  return problems.sort((a, b) => a.line - b.line || order(a.column) - order(b.column));
}

function finish<T>(problems: CsvProblem[], items: T[], spec: CsvTableSpec) {
  return problems.length === 0
    ? { ok: true as const, items }
    : { ok: false as const, problems: sorted(problems, spec) };
}

/**
 * Reads a bills CSV.
 *
 * @param csvText - a header row naming periodStart, periodEnd, use and fuel (any order),
 *   then one bill a row: dates as YYYY-MM-DD (periodEnd is the closing read's day, not
 *   billed), use in the fuel's unit, the fuel by its Sealwork name (naturalGas, …)
 * @returns the bills, or every problem with its line and column
 *
 * Notes: the rows are checked as `checkBills` checks them (periodEnd after periodStart,
 * use ≥ 0, no day on two bills of one fuel); a cell that is not a number is said once.
 *
 * References: RFC 4180 (the CSV format).
 */
export function parseBillsCsv(csvText: string): BillsCsvResult {
  const table = readCsvTable(csvText, BILLS_SPEC);
  const problems = [...table.problems];
  if (BILLS_SPEC.required.some((name) => !table.present.has(name))) {
    return { ok: false, problems: sorted(problems, BILLS_SPEC) };
  }
  const blamed = new Set<string>();
  const inputs = table.rows.map((row): BillInput => {
    const cell = (name: string) => row.cells.get(name) ?? '';
    const use = readNumber(cell('use'), "the period's use in the fuel's unit");
    if ('problem' in use) {
      problems.push({ line: row.line, column: 'use', message: use.problem });
      blamed.add(`${row.line}:use`);
    }
    const periodStart = cell('periodStart');
    const periodEnd = cell('periodEnd');
    return { periodStart, periodEnd, use: 'value' in use ? use.value : NaN, fuel: cell('fuel') };
  });
  problems.push(...atCells(billProblems(inputs), table.rows, (field) => field, blamed));
  const result = finish(problems, inputs, BILLS_SPEC);
  if (!result.ok) return result;
  // Every fuel was checked above; the filter only tells the type system so.
  const bills = result.items.flatMap((bill): UtilityBill[] =>
    isFuel(bill.fuel) ? [{ ...bill, fuel: bill.fuel }] : [],
  );
  return { ok: true, bills };
}

function readTemperature(
  row: CsvRow,
  column: 'meanTempF' | 'meanTempC',
): { value: number } | { problem: string } {
  const text = row.cells.get(column) ?? '';
  const unit = column === 'meanTempF' ? '°F' : '°C';
  const read = readNumber(text, `the day's mean temperature, ${unit}`);
  if (!('value' in read) || column === 'meanTempF') return read;
  const tempF = celsiusTextToFahrenheit(text);
  const minC = ((DAILY_MEAN_MIN_F - 32) * 5) / 9;
  const maxC = ((DAILY_MEAN_MAX_F - 32) * 5) / 9;
  if (tempF < DAILY_MEAN_MIN_F || tempF > DAILY_MEAN_MAX_F) {
    return { problem: `expected a daily mean temperature from ${minC} to ${maxC} °C, got ${text}` };
  }
  return { value: tempF };
}

/**
 * Reads a daily temperatures CSV.
 *
 * @param csvText - a header row naming date and one of meanTempF (°F) or meanTempC (°C),
 *   then one day a row: the date as YYYY-MM-DD and the day's mean temperature
 * @returns the days with their means in °F (°C converted exactly), or every problem with
 *   its line and column
 *
 * Notes: the rows are checked as `checkDailyTemperatures` checks them (real dates, each
 * day once, a mean from −130 to 140 °F, i.e. −90 to 60 °C).
 *
 * References: RFC 4180 (the CSV format); NIST SP 811 (t/°F = 1.8·t/°C + 32, exact).
 */
export function parseTemperaturesCsv(csvText: string): TemperaturesCsvResult {
  const table = readCsvTable(csvText, TEMPERATURES_SPEC);
  const problems = [...table.problems];
  const column = table.present.has('meanTempF') ? 'meanTempF' : 'meanTempC';
  const oneColumn = table.present.has('meanTempF') !== table.present.has('meanTempC');
  if (!table.present.has('date') || !oneColumn) {
    return { ok: false, problems: sorted(problems, TEMPERATURES_SPEC) };
  }
  const blamed = new Set<string>();
  const inputs = table.rows.map((row): DailyTemperature => {
    const read = readTemperature(row, column);
    if ('problem' in read) {
      problems.push({ line: row.line, column, message: read.problem });
      blamed.add(`${row.line}:${column}`);
    }
    return { date: row.cells.get('date') ?? '', meanTempF: 'value' in read ? read.value : NaN };
  });
  const columnOf = (field: string) => (field === 'meanTempF' ? column : field);
  problems.push(...atCells(temperatureProblems(inputs), table.rows, columnOf, blamed));
  const result = finish(problems, inputs, TEMPERATURES_SPEC);
  return result.ok ? { ok: true, temperatures: result.items } : result;
}
