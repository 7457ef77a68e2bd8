/**
 * Portfolio CSV out. The homes CSV has the import's columns, one row per live home, so
 * exporting and importing it again gives the same homes; the results CSV has one row per
 * home with its leakage and its plan's figures, evaluated by the core with the project's
 * measure library. Fields are quoted where RFC 4180 needs it (papaparse's unparse).
 */
import Papa from 'papaparse';
import { InputError } from '../core/errors.ts';
import { evaluateHomeReport } from '../core/evaluate.ts';
import type { MeasureLookup } from '../core/measure-library.ts';
import type { EvaluationReport } from '../core/report.ts';
import type { OtherLeakageTest } from '../core/schema.ts';
import { CSV_COLUMNS, FORMULA_START, type CsvColumn } from './csv-import.ts';
import { exportHomeFile, planTestOf } from './home-file.ts';
import { readJson } from './repositories/_rows.ts';
import { listLeakageTests } from './repositories/leakage-tests.ts';
import { effectiveLibrary } from './repositories/library.ts';
import type { ReadAccess } from './store.ts';
import { evaluateOptionsOf } from './evaluation-inputs.ts';

interface StoredHomeRow {
  id: number;
  name: string;
  street: string | null;
  town: string | null;
  region: string | null;
  postal_code: string | null;
  notes: string | null;
  is_demo: number;
  data: string;
  client_name: string | null;
  client_phone: string | null;
  client_email: string | null;
  climate_name: string | null;
  price_set_name: string | null;
  measure_count: number;
}

const LIVE_HOMES = `
  SELECT h.id, h.name, h.street, h.town, h.region, h.postal_code, h.notes, h.is_demo, h.data,
         c.name AS client_name, c.phone AS client_phone, c.email AS client_email,
         cl.name AS climate_name, ps.name AS price_set_name,
         (SELECT count(*) FROM measures m WHERE m.home_id = h.id) AS measure_count
  FROM homes h
  LEFT JOIN clients c ON c.id = h.client_id
  LEFT JOIN climates cl ON cl.id = h.climate_id
  LEFT JOIN price_sets ps ON ps.id = h.price_set_id
  WHERE h.deleted_at IS NULL
  ORDER BY h.id`;

/** A home whose stored data has parts no column holds; its row carries the rest. */
export interface LeftOut {
  homeId: number;
  name: string;
  /** Home-file paths of what was left out (`combustionAppliances`, `measures (3)`, …). */
  parts: string[];
}

export interface HomesCsvExport {
  csv: string;
  homes: number;
  leftOut: LeftOut[];
}

function valueAt(root: unknown, path: string): unknown {
  let node = root;
  for (const key of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[key];
  }
  return node;
}

/** Paths of the values inside `value`; a list counts as one value. */
function leafPaths(value: unknown, path: string, into: string[]): string[] {
  if (value === undefined || value === null) return into;
  if (Array.isArray(value) || typeof value !== 'object') into.push(path);
  else {
    for (const [key, inner] of Object.entries(value)) {
      leafPaths(inner, path === '' ? key : `${path}.${key}`, into);
    }
  }
  return into;
}

/** Text a spreadsheet would run as a formula gets an apostrophe; the import takes it off. */
function guarded(text: string): string {
  return FORMULA_START.test(text) || /^'[=+\-@]/.test(text) ? `'${text}` : text;
}

function cellText(spec: CsvColumn, value: unknown): string {
  if (value === undefined || value === null) return '';
  if (spec.kind === 'points') {
    return (value as { pa: number; cfm: number }[]).map(({ pa, cfm }) => `${pa}:${cfm}`).join(';');
  }
  return typeof value === 'string' ? guarded(value) : String(value);
}

/** The home as the import would read it, with the column paths that hold its values. */
function homeRow(read: ReadAccess, row: StoredHomeRow): { cells: string[]; leftOut: string[] } {
  const data = readJson<Record<string, unknown>>(row.data);
  const tests = listLeakageTests(read, row.id);
  const planTest = planTestOf(tests);
  const address = {
    street: row.street,
    town: row.town,
    region: row.region,
    postalCode: row.postal_code,
  };
  const client = { name: row.client_name, phone: row.client_phone, email: row.client_email };
  const home: Record<string, unknown> = {
    name: row.name,
    address,
    client: row.client_name === null ? undefined : client,
    notes: row.notes,
    demo: row.is_demo === 1 ? true : undefined,
    ...data,
    leakageTest: planTest ? withoutKind(planTest.test) : undefined,
  };
  const fuel = valueAt(data, 'heating.fuel');
  const held = new Set<string>();
  const cells = CSV_COLUMNS.map((spec) => {
    if (spec.kind === 'link') {
      return (spec.path === 'climate' ? row.climate_name : row.price_set_name) ?? '';
    }
    let path = spec.path.replace('{fuel}', typeof fuel === 'string' ? fuel : '');
    // Electric heating's price is written once, in the heating fuel's columns.
    if (fuel === 'electricity' && spec.path.startsWith('prices.electricity.')) path = '';
    held.add(path);
    return cellText(spec, valueAt(home, path));
  });
  const leftOut = leafPaths(home, '', []).filter((path) => !held.has(path));
  if (tests.length > 1) leftOut.push(`otherLeakageTests (${tests.length - 1})`);
  if (row.measure_count > 0) leftOut.push(`measures (${row.measure_count})`);
  return { cells, leftOut };
}

function withoutKind(test: OtherLeakageTest): Omit<OtherLeakageTest, 'kind'> {
  const { kind: _kind, ...rest } = test;
  return rest;
}

/**
 * Every live home as a row of the portfolio CSV, with what no column could hold.
 *
 * @param read - the project
 * @returns the CSV text (header and a row per home, CRLF line ends), the number of homes and,
 *   per home that has them, the parts left out (measures, other tests, appliances, …)
 *
 * Notes: a home linked to a stored climate or price set names it in `climate` or `priceSet`; a
 * draft's row has its missing cells empty (it imports once they are filled). A text that starts
 * with =, +, - or @ is written with a leading apostrophe so a spreadsheet shows it as text.
 *
 * References: RFC 4180 (CSV); OWASP, "CSV Injection".
 */
export function exportHomesCsv(read: ReadAccess): HomesCsvExport {
  const rows = read.statement(LIVE_HOMES).all() as StoredHomeRow[];
  const leftOut: LeftOut[] = [];
  const data = rows.map((row) => {
    const result = homeRow(read, row);
    if (result.leftOut.length > 0)
      leftOut.push({ homeId: row.id, name: row.name, parts: result.leftOut });
    return result.cells;
  });
  const csv = Papa.unparse({ fields: CSV_COLUMNS.map((spec) => spec.name), data });
  return { csv: `${csv}\r\n`, homes: rows.length, leftOut };
}

/**
 * Every live home as a row of the portfolio CSV (see `exportHomesCsv`).
 *
 * @param read - the project
 * @returns the CSV text
 *
 * Notes: the columns and cell rules are the import's, so the file imports as it is.
 *
 * References: RFC 4180 (CSV).
 */
export function homesCsv(read: ReadAccess): string {
  return exportHomesCsv(read).csv;
}

/** The results CSV's columns, in order. */
export const RESULT_COLUMNS = [
  'id',
  'name',
  'town',
  'cfm50',
  'ach50',
  'achNatural',
  'cfm50AfterPackage',
  'annualSavingsUsd',
  'packageCostUsd',
  'npvUsd',
  'sir',
  'simplePaybackYears',
  'cautions',
  'fanAdded',
  'notEvaluated',
] as const;

function rounded(value: number | null, decimals: number): number | string {
  return value === null ? '' : Number(value.toFixed(decimals));
}

/** The home's evaluation, or why it cannot be evaluated (a draft lacks a part). */
function reportOrReason(
  read: ReadAccess,
  homeId: number,
  library: MeasureLookup,
): EvaluationReport | string {
  try {
    const file = exportHomeFile(read, homeId);
    return evaluateHomeReport(file, { ...evaluateOptionsOf(read, homeId, file), library });
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    return error.problems.map((problem) => `${problem.path}: ${problem.message}`).join('; ');
  }
}

/**
 * Every live home evaluated, one row each: its test-in leakage and its plan's package.
 *
 * @param read - the project, whose measure library edits the evaluation uses
 * @returns the CSV text: CFM50 and the package's CFM50 after to 0.1, ACH50 to 0.01 and ACHnat
 *   to 0.001 per hour; annual savings, package cost and NPV in dollars to the cent; SIR and
 *   simple payback (years) to 4 decimals, empty when there are no savings; the number of
 *   cautions; whether a ventilation fan was added. A home that cannot be evaluated (a draft)
 *   has its figures empty and the reason in `notEvaluated`.
 *
 * Notes: each home is exported as its home file and evaluated as `evaluateHomeReport` does.
 *
 * References: RFC 4180 (CSV).
 */
export function resultsCsv(read: ReadAccess): string {
  const library = effectiveLibrary(read);
  const homes = read
    .statement('SELECT id, name, town FROM homes WHERE deleted_at IS NULL ORDER BY id')
    .all() as { id: number; name: string; town: string | null }[];
  const data = homes.map((home) => {
    const who = [home.id, guarded(home.name), guarded(home.town ?? '')];
    const report = reportOrReason(read, home.id, library);
    if (typeof report === 'string') return [...who, ...Array<string>(11).fill(''), guarded(report)];
    const pkg = report.package;
    return [
      ...who,
      rounded(report.leakage.cfm50, 1),
      rounded(report.leakage.ach50, 2),
      rounded(report.infiltration.achNatural, 3),
      rounded(pkg.cfm50After, 1),
      pkg.annualSavingsUsd,
      pkg.costUsd,
      pkg.npvUsd,
      rounded(pkg.sir, 4),
      rounded(pkg.simplePaybackYears, 4),
      report.cautions.length,
      pkg.ventilation.fanAdded,
      '',
    ];
  });
  return `${Papa.unparse({ fields: [...RESULT_COLUMNS], data })}\r\n`;
}
