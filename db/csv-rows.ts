/**
 * One CSV row turned into a home-file input: each cell put at its column's path, the stored
 * climate or price set it names linked, the project's defaults filled in. The home-file
 * schema's problems of that input are then said back at the CSV columns they came from.
 */
import { FUELS, HOME_FILE_FORMAT, type Fuel } from '../core/schema.ts';
import { COLUMNS_BY_NAME, CSV_COLUMNS, readCell, type CsvColumn } from './csv-columns.ts';
import type { CsvProblem, CsvRecord, Layout } from './csv-text.ts';
import type { Settings } from './repositories/settings.ts';

// ── Rows ─────────────────────────────────────────────────────────────────────────────────

export interface StoredSet {
  id: number;
  data: unknown;
}

/** What the rows are read against: the project's stored sets by name, and its settings. */
export interface Lookups {
  climates: Map<string, StoredSet>;
  priceSets: Map<string, StoredSet>;
  settings: Settings;
}

/** A row on its way to a home file: the input built so far and what was wrong. */
export interface RowState {
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

/**
 * The home-file input of one record, with the problems found in its own cells and links.
 *
 * @param record - the row's cells and the file line it starts on
 * @param layout - the header's columns, and the columns already blamed at line 1
 * @param lookups - the project's stored climates and price sets by name, and its settings
 */
export function rowHome(record: CsvRecord, layout: Layout, lookups: Lookups): RowState {
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

/** Whether `path` is `under` itself or inside it (a key or an item below it). */
export function covered(path: string, under: string): boolean {
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

/** A home-file problem at `path`, said at the CSV column (or the stored set) it came from. */
export function csvProblem(row: RowState, path: string, message: string): CsvProblem {
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
