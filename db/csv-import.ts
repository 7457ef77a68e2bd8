/**
 * Portfolio CSV in: one home a row (house, climate, heating and cooling, prices, the test-in),
 * each row turned into a `sealwork-home/1` file and checked by the home-file schema. Every
 * problem is reported at its CSV line (the header is line 1) and column; the whole file goes in
 * within one transaction, or nothing does.
 *
 * `planCsvImport` checks and writes nothing; `commitCsvImport` writes a checked plan. The CSV
 * is read as RFC 4180 describes it (comma-separated, fields with commas, quotes or line breaks
 * quoted, a quote inside doubled), by papaparse.
 */
import Papa from 'papaparse';
import { InputError } from '../core/errors.ts';
import {
  checkHomeFile,
  FUELS,
  HOME_FILE_FORMAT,
  type Fuel,
  type HomeData,
  type HomeFile,
} from '../core/schema.ts';
import { DbError } from './errors.ts';
import { findOrCreateClient } from './repositories/clients.ts';
import { createHome } from './repositories/homes.ts';
import { addLeakageTest } from './repositories/leakage-tests.ts';
import { climates, priceSets } from './repositories/reusable-sets.ts';
import { getSettings, type Settings } from './repositories/settings.ts';
import type { ReadAccess, WriteAccess } from './store.ts';

/** How a cell is read: text as given, a decimal number, true/false, or `Pa:cfm` readings. */
export type CsvCellKind = 'text' | 'number' | 'boolean' | 'points' | 'link';

export interface CsvColumn {
  readonly name: string;
  /** Home-file path of the value; `{fuel}` stands for the row's heating fuel. */
  readonly path: string;
  readonly kind: CsvCellKind;
}

function column(name: string, path: string, kind: CsvCellKind = 'number'): CsvColumn {
  return { name, path, kind };
}

/** Every column the portfolio CSV knows, in the order the export writes them. */
export const CSV_COLUMNS: readonly CsvColumn[] = [
  column('name', 'name', 'text'),
  column('street', 'address.street', 'text'),
  column('town', 'address.town', 'text'),
  column('region', 'address.region', 'text'),
  column('postalCode', 'address.postalCode', 'text'),
  column('client', 'client.name', 'text'),
  column('clientPhone', 'client.phone', 'text'),
  column('clientEmail', 'client.email', 'text'),
  column('notes', 'notes', 'text'),
  column('demo', 'demo', 'boolean'),
  column('yearBuilt', 'house.yearBuilt'),
  column('floorAreaFt2', 'house.conditionedFloorAreaFt2'),
  column('volumeFt3', 'house.conditionedVolumeFt3'),
  column('stories', 'house.stories'),
  column('heightFt', 'house.heightFt'),
  column('bedrooms', 'house.bedrooms'),
  column('shelterClass', 'house.shelterClass'),
  column('foundation', 'house.foundation', 'text'),
  column('envelopeAreaFt2', 'house.envelopeAreaFt2'),
  column('flueHeightFt', 'house.flueHeightFt'),
  column('siteTerrain', 'house.siteTerrain', 'text'),
  column('knobAndTube', 'house.knobAndTubeWiring', 'boolean'),
  column('vermiculite', 'house.vermiculiteSuspected', 'boolean'),
  column('climate', 'climate', 'link'),
  column('climateName', 'climate.name', 'text'),
  column('hdd65F', 'climate.hdd65F'),
  column('cdd65F', 'climate.cdd65F'),
  column('elevationFt', 'climate.elevationFt'),
  column('nFactorZone', 'climate.nFactorZone'),
  column('wsf', 'climate.wsf'),
  column('heatingDeltaTF', 'climate.heatingSeason.meanDeltaTF'),
  column('heatingWindMph', 'climate.heatingSeason.meanWindSpeedMph'),
  column('heatingIndoorF', 'climate.heatingSeason.indoorTempF'),
  column('coolingDeltaTF', 'climate.coolingSeason.meanDeltaTF'),
  column('coolingWindMph', 'climate.coolingSeason.meanWindSpeedMph'),
  column('coolingIndoorF', 'climate.coolingSeason.indoorTempF'),
  column('coolingGrainHours', 'climate.coolingSeason.latentGrainHours'),
  column('heatingFuel', 'heating.fuel', 'text'),
  column('heatingEquipment', 'heating.equipment', 'text'),
  column('heatingEfficiency', 'heating.efficiency'),
  column('distributionEfficiency', 'heating.distributionEfficiency'),
  column('combustionVenting', 'heating.combustionVenting', 'text'),
  column('heatingInside', 'heating.insidePressureBoundary', 'boolean'),
  column('seer', 'cooling.seer'),
  column('coolingDistributionEfficiency', 'cooling.distributionEfficiency'),
  column('priceSet', 'prices', 'link'),
  column('fuelPriceUsdPerUnit', 'prices.{fuel}.usdPerUnit'),
  column('fuelEscalationReal', 'prices.{fuel}.escalationRateReal'),
  column('electricityUsdPerKwh', 'prices.electricity.usdPerUnit'),
  column('electricityEscalationReal', 'prices.electricity.escalationRateReal'),
  column('discountRateReal', 'economics.discountRateReal'),
  column('ranking', 'economics.ranking', 'text'),
  column('infiltrationMethod', 'infiltrationMethod', 'text'),
  column('nFactorOverride', 'nFactorOverride'),
  column('ceilingShare', 'leakShares.ceiling'),
  column('wallShare', 'leakShares.wall'),
  column('floorShare', 'leakShares.floor'),
  column('flueShare', 'leakShares.flue'),
  column('leakageFloorCfm50', 'leakageFloorCfm50'),
  column('cfm50', 'leakageTest.cfm50'),
  column('exponentN', 'leakageTest.exponentN'),
  column('testPoints', 'leakageTest.points', 'points'),
  column('testedOn', 'leakageTest.testedOn', 'text'),
  column('testNote', 'leakageTest.note', 'text'),
  column('existingFanCfm', 'ventilation.existingFanCfm'),
  column('fanType', 'ventilation.fanType', 'text'),
  column('fanCostUsd', 'ventilation.fanCostUsd'),
  column('fanWattsPerCfm', 'ventilation.fanWattsPerCfm'),
  column('fanLifeYears', 'ventilation.fanLifeYears'),
  column('gridKgCo2PerKwh', 'emissions.electricityKgCo2PerKwh'),
  column('loanApr', 'financing.aprNominal'),
  column('loanMonths', 'financing.months'),
];

/** Columns the header must have. */
const REQUIRED_COLUMNS = [
  'name',
  'yearBuilt',
  'floorAreaFt2',
  'volumeFt3',
  'stories',
  'heightFt',
  'bedrooms',
  'shelterClass',
  'foundation',
  'heatingFuel',
  'heatingEquipment',
  'heatingEfficiency',
];

/** Parts the header must give one way or another: all columns of at least one choice. */
const REQUIRED_CHOICES: readonly { choices: string[][]; words: string }[] = [
  {
    choices: [['climate'], ['hdd65F', 'cdd65F', 'elevationFt']],
    words: 'a climate column (a stored climate) or the columns hdd65F, cdd65F and elevationFt',
  },
  { choices: [['cfm50'], ['testPoints']], words: 'a cfm50 or a testPoints column' },
  {
    choices: [['priceSet'], ['fuelPriceUsdPerUnit']],
    words: 'a priceSet column (a stored price set) or a fuelPriceUsdPerUnit column',
  },
];

/** One problem of a CSV file; `column` is empty when it concerns the whole line. */
export interface CsvProblem {
  line: number;
  column: string;
  message: string;
}

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

// ── Reading the text ─────────────────────────────────────────────────────────────────────

interface CsvRecord {
  line: number;
  cells: string[];
}

const QUOTE_WORDS: Record<string, string> = {
  MissingQuotes: 'a quoted field has no closing quote',
  InvalidQuotes: 'a quote inside a field must be doubled ("") and the field quoted',
};

/** Records with the line each starts on; a quoted field may span lines. */
function readRecords(csvText: string): { records: CsvRecord[]; problems: CsvProblem[] } {
  const text = csvText.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  const records: CsvRecord[] = [];
  const problems: CsvProblem[] = [];
  let start = 0;
  let line = 1;
  let counted = 0;
  Papa.parse<string[]>(text, {
    delimiter: ',',
    newline: '\n',
    skipEmptyLines: false,
    step: (result) => {
      for (let at = text.indexOf('\n', counted); at !== -1 && at < start;) {
        line += 1;
        at = text.indexOf('\n', at + 1);
      }
      counted = start;
      const cells = result.data.map((cell) => cell.trim());
      if (cells.some((cell) => cell !== '')) records.push({ line, cells });
      for (const error of result.errors) {
        problems.push({ line, column: '', message: QUOTE_WORDS[error.code] ?? error.message });
      }
      start = result.meta.cursor;
    },
  });
  return { records, problems };
}

// ── The header ───────────────────────────────────────────────────────────────────────────

const COLUMNS_BY_NAME = new Map(CSV_COLUMNS.map((spec) => [spec.name, spec]));

interface Layout {
  /** The column of each field position, or undefined for one that is ignored. */
  columns: (CsvColumn | undefined)[];
  present: Set<string>;
  /** Columns the header lacks and has been blamed for, so rows are not blamed again. */
  blamed: Set<string>;
}

function readHeader(header: CsvRecord, records: readonly CsvRecord[], problems: CsvProblem[]) {
  const layout: Layout = { columns: [], present: new Set(), blamed: new Set() };
  const at = (column: string, message: string) => problems.push({ line: 1, column, message });
  header.cells.forEach((name, index) => {
    const spec = COLUMNS_BY_NAME.get(name);
    layout.columns.push(spec);
    if (name === '') {
      if (records.some((record) => (record.cells[index] ?? '') !== '')) {
        at('', `field ${index + 1} of the header has no column name but rows give it values`);
      }
    } else if (!spec) {
      const near = CSV_COLUMNS.find((known) => known.name.toLowerCase() === name.toLowerCase());
      const hint = near
        ? `did you mean "${near.name}"?`
        : name.includes(';')
          ? 'the fields seem to be separated by ";"; Sealwork reads comma-separated files'
          : 'check the spelling';
      at(name, `is not a column Sealwork knows (${hint})`);
    } else if (layout.present.has(name)) {
      at(name, 'appears twice in the header');
    }
    if (spec) layout.present.add(name);
  });
  for (const name of REQUIRED_COLUMNS) {
    if (layout.present.has(name)) continue;
    at(name, 'is required: the header has no such column');
    layout.blamed.add(name);
  }
  for (const { choices, words } of REQUIRED_CHOICES) {
    if (choices.some((names) => names.every((name) => layout.present.has(name)))) continue;
    const first = choices[0]?.[0] ?? '';
    at(first, `is required: the header needs ${words}`);
    for (const name of choices.flat()) layout.blamed.add(name);
  }
  return layout;
}

// ── Cells ────────────────────────────────────────────────────────────────────────────────

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const POINT = /^([^:]+):([^:]+)$/;
/** Cells a spreadsheet would run as a formula (OWASP, "CSV Injection"); export guards them. */
export const FORMULA_START = /^[=+\-@]/;

type Cell = { value: unknown } | { problem: string };

function numberCell(text: string): Cell {
  if (DECIMAL.test(text)) return { value: Number(text) };
  if (/^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/.test(text)) {
    return { problem: `expected a number without thousands separators, got "${text}"` };
  }
  if (text.endsWith('%')) {
    return { problem: `expected a number (a fraction: 0.8 for 80 %), got "${text}"` };
  }
  return { problem: `expected a number, got "${text}"` };
}

function pointsCell(text: string): Cell {
  const points: { pa: number; cfm: number }[] = [];
  const pairs = text.split(';').map((part) => part.trim());
  // A trailing separator, as some spreadsheets leave, reads as nothing more.
  if (pairs.length > 1 && pairs[pairs.length - 1] === '') pairs.pop();
  for (const pair of pairs) {
    const match = POINT.exec(pair);
    const pa = match?.[1]?.trim() ?? '';
    const cfm = match?.[2]?.trim() ?? '';
    if (!DECIMAL.test(pa) || !DECIMAL.test(cfm)) {
      return {
        problem: `expected readings as Pa:cfm pairs separated by ";" (50:3200;40:2750), got "${text}"`,
      };
    }
    points.push({ pa: Number(pa), cfm: Number(cfm) });
  }
  return { value: points };
}

function readCell(kind: CsvCellKind, text: string): Cell {
  switch (kind) {
    case 'number':
      return numberCell(text);
    case 'boolean': {
      const word = text.toLowerCase();
      if (word === 'true' || word === 'yes') return { value: true };
      if (word === 'false' || word === 'no') return { value: false };
      return { problem: `expected true or false (or yes / no), got "${text}"` };
    }
    case 'points':
      return pointsCell(text);
    default:
      // A leading apostrophe is how the export keeps a formula-like text from running.
      return {
        value: text.startsWith("'") && FORMULA_START.test(text.slice(1)) ? text.slice(1) : text,
      };
  }
}

function setAt(root: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.');
  const last = keys.pop() ?? '';
  let node = root;
  for (const key of keys) {
    const next = node[key];
    if (next !== null && typeof next === 'object') node = next as Record<string, unknown>;
    else node = node[key] = {};
  }
  node[last] = value;
}

// ── Rows ─────────────────────────────────────────────────────────────────────────────────

interface StoredSet {
  id: number;
  data: unknown;
}

interface Lookups {
  climates: Map<string, StoredSet>;
  priceSets: Map<string, StoredSet>;
  settings: Settings;
}

interface RowState {
  line: number;
  input: Record<string, unknown>;
  problems: CsvProblem[];
  /** Paths blamed in the row's own words; the schema's problems at or under them are dropped. */
  refused: string[];
  fuel: Fuel | undefined;
  climateLink: string | undefined;
  priceSetLink: string | undefined;
  climateId: number | null;
  priceSetId: number | null;
}

const FUEL_NAMES = new Set<string>(FUELS);
const CLIMATE_COLUMNS = CSV_COLUMNS.filter((spec) => spec.path.startsWith('climate.'));
const PRICE_COLUMNS = CSV_COLUMNS.filter((spec) => spec.path.startsWith('prices.'));
const COLUMN_BY_PATH = new Map(CSV_COLUMNS.map((spec) => [spec.path, spec.name]));

function refuse(row: RowState, columnName: string, path: string, message: string, raw: string) {
  row.problems.push({ line: row.line, column: columnName, message });
  row.refused.push(path);
  setAt(row.input, path, raw);
}

function put(row: RowState, spec: CsvColumn, path: string, text: string): void {
  const cell = readCell(spec.kind, text);
  if ('value' in cell) setAt(row.input, path, cell.value);
  else refuse(row, spec.name, path, cell.problem, text);
}

function unknownSet(what: string, name: string, sets: Map<string, StoredSet>): string {
  if (sets.size === 0) return `expected the name of a stored ${what}, but the project has none`;
  const names = [...sets.keys()].slice(0, 5).map((known) => `"${known}"`);
  const more = sets.size > 5 ? ', …' : '';
  return `expected the name of a stored ${what} (${names.join(', ')}${more}), got "${name}"`;
}

function linkClimate(row: RowState, values: Map<string, string>, lookups: Lookups, layout: Layout) {
  const name = values.get('climate');
  const inline = CLIMATE_COLUMNS.filter((spec) => values.has(spec.name)).map((spec) => spec.name);
  if (name === undefined) {
    if (inline.length > 0 && !values.has('climateName')) {
      const town = (row.input.address as Record<string, unknown> | undefined)?.town;
      setAt(row.input, 'climate.name', town ?? row.input.name ?? '');
    }
    if (inline.length > 0 || layout.blamed.has('climate')) return;
    const words = "is required: give a stored climate's name, or hdd65F, cdd65F and elevationFt";
    refuse(row, layout.present.has('climate') ? 'climate' : 'hdd65F', 'climate', words, '');
    return;
  }
  const stored = lookups.climates.get(name);
  if (inline.length > 0) {
    const words = `names a stored climate: leave ${inline.join(', ')} empty, or leave climate empty`;
    refuse(row, 'climate', 'climate', words, name);
  } else if (!stored) {
    refuse(row, 'climate', 'climate', unknownSet('climate', name, lookups.climates), name);
  } else {
    row.input.climate = stored.data;
    row.climateId = stored.id;
    row.climateLink = name;
  }
}

function linkPrices(row: RowState, values: Map<string, string>, lookups: Lookups) {
  const name = values.get('priceSet');
  const inline = PRICE_COLUMNS.filter((spec) => values.has(spec.name));
  if (name !== undefined) {
    const stored = lookups.priceSets.get(name);
    const words = `names a stored price set: leave ${inline.map((spec) => spec.name).join(', ')} empty, or leave priceSet empty`;
    if (inline.length > 0) refuse(row, 'priceSet', 'prices', words, name);
    else if (!stored)
      refuse(row, 'priceSet', 'prices', unknownSet('price set', name, lookups.priceSets), name);
    else {
      row.input.prices = stored.data;
      row.priceSetId = stored.id;
      row.priceSetLink = name;
    }
    return;
  }
  row.input.prices = {};
  for (const spec of inline) {
    const text = values.get(spec.name) ?? '';
    const forFuel = spec.path.includes('{fuel}');
    // Without a known heating fuel there is nowhere to put its price; heatingFuel is blamed.
    if (forFuel && row.fuel === undefined) continue;
    if (!forFuel && row.fuel === 'electricity') {
      const twin =
        spec.name === 'electricityUsdPerKwh' ? 'fuelPriceUsdPerUnit' : 'fuelEscalationReal';
      const twinText = values.get(twin);
      if (twinText !== undefined && Number(twinText) !== Number(text)) {
        const words = `electric heating is priced in ${twin}: leave this empty or give the same value`;
        row.problems.push({ line: row.line, column: spec.name, message: words });
      }
      if (twinText !== undefined) continue;
    }
    put(row, spec, spec.path.replace('{fuel}', row.fuel ?? ''), text);
  }
}

function applyDefaults(row: RowState, values: Map<string, string>, settings: Settings): void {
  if (!values.has('discountRateReal')) {
    setAt(row.input, 'economics.discountRateReal', settings.discountRateReal);
  }
  if (!values.has('ranking')) setAt(row.input, 'economics.ranking', settings.ranking);
  if (!values.has('infiltrationMethod')) row.input.infiltrationMethod = 'nFactor';
  if (!values.has('gridKgCo2PerKwh') && settings.electricityKgCo2PerKwh !== null) {
    setAt(row.input, 'emissions.electricityKgCo2PerKwh', settings.electricityKgCo2PerKwh);
  }
}

function rowHome(record: CsvRecord, layout: Layout, lookups: Lookups): RowState {
  const row: RowState = {
    line: record.line,
    input: { format: HOME_FILE_FORMAT, house: {}, heating: {}, measures: [] },
    problems: [],
    refused: [],
    fuel: undefined,
    climateLink: undefined,
    priceSetLink: undefined,
    climateId: null,
    priceSetId: null,
  };
  const values = new Map<string, string>();
  record.cells.forEach((text, index) => {
    const spec = layout.columns[index];
    if (text !== '' && spec) values.set(spec.name, text);
  });
  const extra = record.cells.slice(layout.columns.length).filter((text) => text !== '');
  if (extra.length > 0) {
    const words = `has ${record.cells.length} fields; the header names ${layout.columns.length}`;
    row.problems.push({ line: record.line, column: '', message: words });
  }
  const fuel = values.get('heatingFuel');
  row.fuel = fuel !== undefined && FUEL_NAMES.has(fuel) ? (fuel as Fuel) : undefined;
  for (const [name, text] of values) {
    const spec = COLUMNS_BY_NAME.get(name);
    if (spec && spec.kind !== 'link' && !spec.path.startsWith('prices.')) {
      put(row, spec, spec.path, text);
    }
  }
  linkClimate(row, values, lookups, layout);
  linkPrices(row, values, lookups);
  applyDefaults(row, values, lookups.settings);
  return row;
}

// ── Problems of the home file, back at their columns ─────────────────────────────────────

const GROUP_WORDS: Record<string, string> = {
  leakageTest:
    'expected a cfm50 (a one-point test) or testPoints (several readings): one of the two',
};

function covered(path: string, under: string): boolean {
  return path === under || path.startsWith(`${under}.`) || path.startsWith(`${under}[`);
}

function priceProblem(row: RowState, path: string, message: string): CsvProblem | undefined {
  const match = /^prices\.(\w+)(?:\.(\w+))?/.exec(path);
  if (!match) return undefined;
  const [, fuel, field] = match;
  const escalation = field === 'escalationRateReal';
  let columnName: string;
  if (fuel === row.fuel) columnName = escalation ? 'fuelEscalationReal' : 'fuelPriceUsdPerUnit';
  else if (fuel === 'electricity') {
    columnName = escalation ? 'electricityEscalationReal' : 'electricityUsdPerKwh';
  } else return undefined;
  const words =
    field === undefined
      ? `is required: the price of ${fuel === row.fuel ? 'the heating fuel' : 'electricity for cooling'}, or a priceSet`
      : message;
  return { line: row.line, column: columnName, message: words };
}

function csvProblem(row: RowState, path: string, message: string): CsvProblem {
  const line = row.line;
  const links = [
    ['climate', 'climate', 'climate', row.climateLink],
    ['prices', 'priceSet', 'price set', row.priceSetLink],
  ] as const;
  for (const [root, columnName, what, name] of links) {
    if (name === undefined || !covered(path, root)) continue;
    const inner = path.slice(root.length + 1);
    const words = `the stored ${what} "${name}"${inner === '' ? '' : ` lacks a good ${inner}`}: ${message}`;
    return { line, column: columnName, message: words };
  }
  const price = priceProblem(row, path, message);
  if (price) return price;
  const exact = COLUMN_BY_PATH.get(path);
  if (exact !== undefined) return { line, column: exact, message };
  const group = CSV_COLUMNS.filter((spec) => spec.path.startsWith(`${path}.`));
  const first = group[0];
  if (first) {
    const words =
      GROUP_WORDS[path] ?? `${message} (columns ${group.map((spec) => spec.name).join(', ')})`;
    return { line, column: first.name, message: words };
  }
  const holder = CSV_COLUMNS.find((spec) => covered(path, spec.path));
  if (holder)
    return { line, column: holder.name, message: `${path.slice(holder.path.length)}: ${message}` };
  return { line, column: '', message: `${path}: ${message}` };
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

/** The parts of a home file a home row keeps as its data. */
function dataOf(file: HomeFile): HomeData {
  const {
    format: _format,
    name: _name,
    demo: _demo,
    address: _address,
    client: _client,
    notes: _notes,
    leakageTest: _leakageTest,
    otherLeakageTests: _others,
    measures: _measures,
    ...data
  } = file;
  return data;
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
