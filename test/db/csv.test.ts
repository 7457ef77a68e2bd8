/**
 * Portfolio CSV in and out of real project files in a temporary folder, and the portfolio
 * summary. Every expected value is written here: the CSV text and its values, hand
 * computations from published definitions (ACH50 = CFM50·60/V, ASTM E779 reporting; the
 * power-law fit of ASTM E779 by ordinary least squares, checked with simple-statistics;
 * percentiles as a spreadsheet's PERCENTILE.INC, from @formulajs/formulajs), or the core's
 * own evaluation of the exported home where the brief asks for the core's figures.
 *
 * The homes, towns, clients, climates and prices are invented for these tests.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as formula from '@formulajs/formulajs';
import Papa from 'papaparse';
import { linearRegression } from 'simple-statistics';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import type { HomeFile } from '../../core/schema.ts';
import { exportHomesCsv, homesCsv, resultsCsv, RESULT_COLUMNS } from '../../db/csv-export.ts';
import {
  commitCsvImport,
  CSV_COLUMNS,
  CsvImportError,
  planCsvImport,
  type CsvImportPlan,
} from '../../db/csv-import.ts';
import { DbError } from '../../db/errors.ts';
import { exportHomeFile, importHomeFile } from '../../db/home-file.ts';
import { portfolioSummary } from '../../db/portfolio.ts';
import { createHome, deleteHome, getHome } from '../../db/repositories/homes.ts';
import { addMeasure } from '../../db/repositories/measures.ts';
import { effectiveLibrary } from '../../db/repositories/library.ts';
import { climates, priceSets } from '../../db/repositories/reusable-sets.ts';
import { updateSettings } from '../../db/repositories/settings.ts';
import { openStore, type Store } from '../../db/store.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { makeTempFolder, runCli, type TempFolder } from '../_lib/cli-harness.ts';

let folder: TempFolder;
const stores: Store[] = [];

beforeEach(() => {
  folder = makeTempFolder('sealwork-csv-');
});
afterEach(() => {
  for (const store of stores.splice(0)) if (store.sqlite.open) store.close();
  folder.remove();
});

function project(name = 'project.db'): Store {
  const store = openStore(join(folder.path, name));
  stores.push(store);
  return store;
}

/** Rows in every table, to show a failed import left the file as it was. */
function rowCounts(store: Store): Record<string, number> {
  const tables = store.sqlite
    .prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%'")
    .all() as { name: string }[];
  return Object.fromEntries(
    tables.map(({ name }) => {
      const row = store.sqlite.prepare(`SELECT count(*) AS n FROM "${name}"`).get() as {
        n: number;
      };
      return [name, row.n];
    }),
  );
}

/** Writes the CSV to a real file and reads it back, as the command line does. */
function csvFile(name: string, text: string): string {
  return readFileSync(folder.write(name, text), 'utf8');
}

function plan(store: Store, text: string): CsvImportPlan {
  return store.read((read) => planCsvImport(read, text));
}

function importCsv(store: Store, text: string): number[] {
  return store.write((write) => commitCsvImport(write, planCsvImport(write, text)));
}

const STORED_CLIMATE = {
  name: 'Stored Valley',
  hdd65F: 5800,
  cdd65F: 800,
  elevationFt: 400,
  nFactorZone: 3,
} as const;
const STORED_PRICES = { propane: { usdPerUnit: 2.6 }, electricity: { usdPerUnit: 0.15 } };

function withStoredSets(store: Store): { climateId: number; priceSetId: number } {
  return store.write((write) => ({
    climateId: climates.create(write, 'Stored Valley', STORED_CLIMATE),
    priceSetId: priceSets.create(write, 'Stored Prices', STORED_PRICES),
  }));
}

// Three invented homes: an inline climate and prices with a one-point test; a stored climate
// and price set with a four-reading test and the project's default discount rate; a heat pump
// (electricity priced once) on the 62.2 method, its street quoted for its comma.
const VALID_CSV = [
  'name,street,town,client,clientEmail,yearBuilt,floorAreaFt2,volumeFt3,stories,heightFt,bedrooms,shelterClass,foundation,knobAndTube,climate,hdd65F,cdd65F,elevationFt,nFactorZone,wsf,heatingFuel,heatingEquipment,heatingEfficiency,distributionEfficiency,combustionVenting,seer,priceSet,fuelPriceUsdPerUnit,fuelEscalationReal,electricityUsdPerKwh,discountRateReal,infiltrationMethod,cfm50,exponentN,testPoints,testedOn',
  'Aspen House,1 Birch Row,Millbrook,Dana Reyes,dana@example.org,1952,1400,11200,1,11,3,3,basement,yes,,6100,650,750,2,0.56,naturalGas,furnace,0.8,0.85,naturalDraft,13,,1.35,0.01,0.17,0.04,nFactor,3100,0.62,,2024-05-06',
  'Cedar Flat,22 Pine Road,Millbrook,Dana Reyes,dana@example.org,1978,1900,15200,2,19,4,4,crawlspace,,Stored Valley,,,,,,propane,furnace,0.92,,sealed,,Stored Prices,,,,,,,,50:2900;40:2500;30:2050;20:1550,2024-06-01',
  'Elm Unit,"5 Oak Court, rear",Riverton,,,2001,1000,8000,1,9,2,5,slab,,,4800,1200,150,,0.6,electricity,heatPump,8.2,,,15,,0.14,,,0.03,ashrae622,1700,,,',
].join('\n');

describe('importing a valid CSV', () => {
  it('stores every row, and each stored home exports to a home file with the CSV values', () => {
    const store = project();
    const { climateId, priceSetId } = withStoredSets(store);
    store.write((write) => updateSettings(write, { discountRateReal: 0.045 }));
    const checked = plan(store, csvFile('valid.csv', VALID_CSV));
    expect(checked.problems).toEqual([]);
    expect(checked.rows).toBe(3);
    const ids = store.write((write) => commitCsvImport(write, checked));
    expect(ids).toHaveLength(3);
    const [aspen, cedar, elm] = ids.map((id) => store.read((read) => exportHomeFile(read, id)));

    expect(aspen).toMatchObject({
      name: 'Aspen House',
      address: { street: '1 Birch Row', town: 'Millbrook' },
      client: { name: 'Dana Reyes', email: 'dana@example.org' },
      house: {
        yearBuilt: 1952,
        conditionedFloorAreaFt2: 1400,
        conditionedVolumeFt3: 11200,
        stories: 1,
        heightFt: 11,
        bedrooms: 3,
        shelterClass: 3,
        foundation: 'basement',
        knobAndTubeWiring: true,
      },
      // The climate is named after the town when no climateName is given.
      climate: {
        name: 'Millbrook',
        hdd65F: 6100,
        cdd65F: 650,
        elevationFt: 750,
        nFactorZone: 2,
        wsf: 0.56,
      },
      heating: {
        fuel: 'naturalGas',
        equipment: 'furnace',
        efficiency: 0.8,
        distributionEfficiency: 0.85,
        combustionVenting: 'naturalDraft',
      },
      cooling: { seer: 13 },
      prices: {
        naturalGas: { usdPerUnit: 1.35, escalationRateReal: 0.01 },
        electricity: { usdPerUnit: 0.17 },
      },
      economics: { discountRateReal: 0.04 },
      infiltrationMethod: 'nFactor',
      leakageTest: { cfm50: 3100, exponentN: 0.62, testedOn: '2024-05-06' },
      measures: [],
    });
    expect(aspen?.prices).toEqual({
      naturalGas: { usdPerUnit: 1.35, escalationRateReal: 0.01 },
      electricity: { usdPerUnit: 0.17 },
    });

    expect(cedar).toMatchObject({
      name: 'Cedar Flat',
      client: { name: 'Dana Reyes', email: 'dana@example.org' },
      climate: STORED_CLIMATE,
      prices: STORED_PRICES,
      heating: {
        fuel: 'propane',
        equipment: 'furnace',
        efficiency: 0.92,
        combustionVenting: 'sealed',
      },
      economics: { discountRateReal: 0.045 },
      infiltrationMethod: 'nFactor',
      leakageTest: {
        points: [
          { pa: 50, cfm: 2900 },
          { pa: 40, cfm: 2500 },
          { pa: 30, cfm: 2050 },
          { pa: 20, cfm: 1550 },
        ],
        testedOn: '2024-06-01',
      },
    });
    expect(cedar?.cooling).toBeUndefined();
    const cedarRow = store.read((read) => getHome(read, ids[1] ?? 0));
    expect([cedarRow.climateId, cedarRow.priceSetId]).toEqual([climateId, priceSetId]);
    // One client for the two rows that name the same client.
    expect(store.read((read) => getHome(read, ids[0] ?? 0)).clientId).toBe(cedarRow.clientId);

    expect(elm).toMatchObject({
      name: 'Elm Unit',
      address: { street: '5 Oak Court, rear', town: 'Riverton' },
      house: { shelterClass: 5, foundation: 'slab' },
      heating: { fuel: 'electricity', equipment: 'heatPump', efficiency: 8.2 },
      cooling: { seer: 15 },
      infiltrationMethod: 'ashrae622',
      leakageTest: { cfm50: 1700 },
    });
    expect(elm?.prices).toEqual({ electricity: { usdPerUnit: 0.14 } });
    expect(elm?.client).toBeUndefined();
  });

  it('reads CRLF line ends, a byte-order mark, padded cells and empty lines', () => {
    const store = project();
    withStoredSets(store);
    const lines = VALID_CSV.split('\n');
    const text = `\uFEFF${lines[0]}\r\n\r\n${(lines[3] ?? '').replace('Elm Unit', '  Elm Unit  ')}\r\n\r\n`;
    const checked = plan(store, text);
    expect(checked.problems).toEqual([]);
    expect(checked.homes.map((home) => [home.line, home.file.name])).toEqual([[3, 'Elm Unit']]);
  });
});

// Each bad row breaks one thing; line 7 is valid with a two-line quoted name and an empty line
// follows it, so the last row starts on line 10 of the file.
const BAD_CSV = [
  'name,street,town,yearBuilt,floorAreaFt2,volumeFt3,stories,heightFt,shelterClass,foundation,climate,hdd65F,cdd65F,elevationFt,nFactorZone,heatingFuel,heatingEquipment,heatingEfficiency,fuelPriceUsdPerUnit,cfm50,colour',
  'Good One,1 A Street,Hilltop,1960,1200,9600,1,10,3,slab,,5000,700,500,2,naturalGas,furnace,0.8,1.2,2500,',
  'Wrong Type,2 A Street,Hilltop,nineteen-sixty,1200,9600,1,10,3,slab,,5000,700,500,2,naturalGas,furnace,0.8,1.2,2500,',
  'Out Of Range,3 A Street,Hilltop,1960,-5,9600,1,10,7,slab,,5000,700,500,2,naturalGas,furnace,0.8,1.2,2500,',
  'Coal Stove,4 A Street,Hilltop,1960,1200,9600,1,10,3,slab,,5000,700,500,2,coal,stove,0.6,1.2,2500,',
  'Lost Climate,5 A Street,Hilltop,1960,1200,9600,1,10,3,slab,Nowhere Valley,,,,,naturalGas,furnace,0.8,1.2,2500,',
  '"Two-line\nname",6 A Street,Hilltop,1960,1200,9600,1,10,3,slab,,5000,700,500,2,naturalGas,furnace,0.8,1.2,2500,',
  '',
  'Percent Furnace,7 A Street,Hilltop,1960,1200,9600,1,10,3,slab,,5000,700,500,2,naturalGas,furnace,80%,1.2,2500,blue',
].join('\n');

describe('a CSV with bad rows', () => {
  it('lists every problem by line, column and what was expected, and writes nothing', () => {
    const store = project();
    withStoredSets(store);
    const before = rowCounts(store);
    const checked = plan(store, csvFile('bad.csv', BAD_CSV));
    const found = checked.problems.map(({ line, column }) => [line, column]);
    expect(found).toEqual([
      [1, 'colour'], // unknown column
      [1, 'bedrooms'], // required column missing (rows are not blamed for it again)
      [3, 'yearBuilt'],
      [4, 'floorAreaFt2'],
      [4, 'shelterClass'],
      [5, 'heatingFuel'],
      [6, 'climate'],
      [10, 'heatingEfficiency'],
    ]);
    const messages = checked.problems.map((problem) => problem.message);
    expect(messages[0]).toMatch(/not a column/);
    expect(messages[1]).toMatch(/required/);
    expect(messages[2]).toBe('expected a number, got "nineteen-sixty"');
    expect(messages[3]).toBe('expected a number greater than 0, got -5');
    expect(messages[4]).toMatch(/one of 1, 2, 3, 4, 5, got 7/);
    expect(messages[5]).toMatch(/one of "naturalGas".*got "coal"/);
    expect(messages[6]).toBe(
      'expected the name of a stored climate ("Stored Valley"), got "Nowhere Valley"',
    );
    expect(messages[7]).toMatch(/fraction: 0.8 for 80 %/);
    expect(checked.rows).toBe(7);
    // Without a bedrooms column no row is a whole home, though only the header is blamed.
    expect(checked.homes).toEqual([]);

    expect(() => store.write((write) => commitCsvImport(write, checked))).toThrow(CsvImportError);
    expect(rowCounts(store)).toEqual(before);
  });

  it('blames the header for a missing climate, test or price, once', () => {
    const store = project();
    const checked = plan(
      store,
      'name,yearBuilt,floorAreaFt2,volumeFt3,stories,heightFt,bedrooms,shelterClass,foundation,heatingFuel,heatingEquipment,heatingEfficiency\n' +
        'Bare,1960,1200,9600,1,10,3,3,slab,naturalGas,furnace,0.8\n',
    );
    expect(checked.problems.map(({ line, column }) => [line, column])).toEqual([
      [1, 'climate'],
      [1, 'cfm50'],
      [1, 'priceSet'],
    ]);
  });

  it('blames a stored climate that lacks what the row needs at the climate column', () => {
    const store = project();
    withStoredSets(store);
    store.write((write) =>
      climates.create(write, 'Bare Valley', {
        name: 'Bare Valley',
        hdd65F: 5000,
        cdd65F: 600,
        elevationFt: 300,
      }),
    );
    const lines = VALID_CSV.split('\n');
    // Cedar Flat on the default method (nFactor), which needs the climate's nFactorZone.
    const checked = plan(
      store,
      [lines[0], (lines[2] ?? '').replace('Stored Valley', 'Bare Valley')].join('\n'),
    );
    expect(checked.problems).toEqual([
      {
        line: 2,
        column: 'climate',
        message: expect.stringMatching(
          /^the stored climate "Bare Valley" lacks a good nFactorZone: is required/,
        ),
      },
    ]);
  });

  it('refuses an empty file', () => {
    expect(plan(project(), '').problems).toEqual([
      { line: 1, column: '', message: expect.stringMatching(/empty/) },
    ]);
  });
});

describe('a good file that fails while it is written', () => {
  it('rolls back every row', () => {
    const store = project();
    const { climateId } = withStoredSets(store);
    const lines = VALID_CSV.split('\n');
    // The stored climate is on the third data row (line 4), after two rows already written.
    const text = [lines[0], lines[1], lines[3], lines[2]].join('\n');
    const checked = plan(store, text);
    expect(checked.problems).toEqual([]);
    const before = rowCounts(store);
    // Another window removes the climate between the check and the write (no home uses it yet).
    store.write((write) => climates.remove(write, climateId));
    const afterRemoval = rowCounts(store);
    expect(afterRemoval.climates).toBe((before.climates ?? 0) - 1);
    let thrown: unknown;
    try {
      store.write((write) => commitCsvImport(write, checked));
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(DbError);
    expect((thrown as DbError).kind).toBe('foreignKey');
    expect((thrown as DbError).message).toMatch(/^line 4: /);
    expect(rowCounts(store)).toEqual(afterRemoval);
  });
});

describe('homes CSV export', () => {
  it('imports into a fresh project as the same homes', () => {
    const first = project('first.db');
    withStoredSets(first);
    const firstIds = importCsv(first, VALID_CSV);
    const exported = first.read((read) => exportHomesCsv(read));
    expect(exported.homes).toBe(3);
    expect(exported.leftOut).toEqual([]);

    const second = project('second.db');
    withStoredSets(second);
    const secondIds = importCsv(second, csvFile('export.csv', exported.csv));
    const files = (store: Store, ids: number[]) =>
      ids.map((id) => store.read((read) => exportHomeFile(read, id)));
    expect(files(second, secondIds)).toEqual(files(first, firstIds));
    expect(second.read((read) => homesCsv(read))).toBe(exported.csv);
  });

  it('says what of a home no column holds', () => {
    const store = project();
    const id = store.write((write) => importHomeFile(write, validBaseHome()));
    const { leftOut } = store.read((read) => exportHomesCsv(read));
    // The base home has three measures and a combustion appliance, which have no columns.
    expect(leftOut).toEqual([
      { homeId: id, name: 'Bad-input base house', parts: ['combustionAppliances', 'measures (3)'] },
    ]);
  });

  it('quotes commas, quotes and line breaks, and guards formula-like text', () => {
    const store = project();
    const lines = VALID_CSV.split('\n');
    const header = `${lines[0]},notes`;
    const name = 'Smith, "Jr." House';
    const notes = 'first line\nsecond line';
    const row = (lines[3] ?? '').replace('Elm Unit', '"Smith, ""Jr."" House"');
    const formulaRow = (lines[3] ?? '').replace('Elm Unit', '"=HYPERLINK(""x"")"');
    const text = `${header}\n${row},"${notes}"\n${formulaRow},@sum\n`;
    const ids = importCsv(store, text);
    const stored = ids.map((id) => store.read((read) => getHome(read, id)));
    expect(stored.map((home) => [home.name, home.notes])).toEqual([
      [name, notes],
      ['=HYPERLINK("x")', '@sum'],
    ]);

    const csv = store.read((read) => homesCsv(read));
    // RFC 4180: a field with a comma, quote or line break is quoted; quotes inside are doubled.
    expect(csv).toContain('"Smith, ""Jr."" House"');
    expect(csv).toContain('"first line\nsecond line"');
    // OWASP "CSV Injection": text that a spreadsheet would run starts with an apostrophe.
    expect(csv).toContain(`"'=HYPERLINK(""x"")"`);
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.data.map((record) => [record.name, record.notes])).toEqual([
      [name, notes],
      [`'=HYPERLINK("x")`, `'@sum`],
    ]);
    const again = project('again.db');
    const againIds = importCsv(again, csv);
    expect(againIds.map((id) => again.read((read) => getHome(read, id).name))).toEqual([
      name,
      '=HYPERLINK("x")',
    ]);
  });
});

describe('results CSV', () => {
  it('has a row per home with the figures of its evaluation, and a reason for a draft', () => {
    const store = project();
    withStoredSets(store);
    const ids = importCsv(store, VALID_CSV);
    const draftId = store.write((write) => createHome(write, { name: 'Draft home', data: {} }));
    const parsed = Papa.parse<Record<string, string>>(store.read(resultsCsv), {
      header: true,
      skipEmptyLines: true,
    });
    expect(parsed.meta.fields).toEqual([...RESULT_COLUMNS]);
    expect(parsed.data.map((record) => Number(record.id))).toEqual([...ids, draftId]);
    const library = store.read(effectiveLibrary);
    ids.forEach((id, index) => {
      const record = parsed.data[index] ?? {};
      const file: HomeFile = store.read((read) => exportHomeFile(read, id));
      const report = evaluateHomeReport(file, { library });
      const pkg = report.package;
      const fixed = (value: number | null, decimals: number) =>
        value === null ? '' : String(Number(value.toFixed(decimals)));
      expect(record).toEqual({
        id: String(id),
        name: file.name,
        town: file.address?.town ?? '',
        cfm50: fixed(report.leakage.cfm50, 1),
        ach50: fixed(report.leakage.ach50, 2),
        achNatural: fixed(report.infiltration.achNatural, 3),
        cfm50AfterPackage: fixed(pkg.cfm50After, 1),
        annualSavingsUsd: String(pkg.annualSavingsUsd),
        packageCostUsd: String(pkg.costUsd),
        npvUsd: String(pkg.npvUsd),
        sir: fixed(pkg.sir, 4),
        simplePaybackYears: fixed(pkg.simplePaybackYears, 4),
        cautions: String(report.cautions.length),
        fanAdded: String(pkg.ventilation.fanAdded),
        notEvaluated: '',
      });
    });
    // ACH50 = CFM50 × 60 / volume (ASTM E779 reporting): 3100 × 60 / 11200 and 1700 × 60 / 8000.
    expect(parsed.data[0]?.ach50).toBe('16.61');
    expect(parsed.data[2]?.ach50).toBe('12.75');
    const draft = parsed.data[3] ?? {};
    expect(draft.cfm50).toBe('');
    expect(draft.notEvaluated).toMatch(/leakageTest/);
  });
});

describe('portfolio summary', () => {
  it('counts live homes and spreads their test-in ACH50 as the definitions give', () => {
    const store = project();
    withStoredSets(store);
    const ids = importCsv(store, VALID_CSV);
    const extraCsv = [
      'name,street,town,yearBuilt,floorAreaFt2,volumeFt3,stories,heightFt,bedrooms,shelterClass,foundation,hdd65F,cdd65F,elevationFt,nFactorZone,heatingFuel,heatingEquipment,heatingEfficiency,fuelPriceUsdPerUnit,cfm50',
      'Fir Cottage,8 Larch Lane,Riverton,1955,900,7200,1,9,2,3,slab,5000,700,500,2,naturalGas,boiler,0.82,1.3,2100',
      'Gone Home,9 Larch Lane,Riverton,1931,900,7200,1,9,2,3,slab,5000,700,500,2,heatingOil,boiler,0.82,3.9,4000',
    ].join('\n');
    const [firId, goneId] = importCsv(store, extraCsv);
    const draftId = store.write((write) => createHome(write, { name: 'Draft', data: {} }));
    // Costs chosen to land on half cents: 1.005 → $1.01; 2.5 h × $55.01 = $137.525 → $137.53;
    // markup 10 % of $138.54 = $13.854 → $13.85 (to the cent, half away from zero: common practice).
    store.write((write) => {
      addMeasure(write, firId ?? 0, {
        id: 'a',
        type: 'attic-top-plates',
        reductionCfm50: { low: 100, likely: 150, high: 200 },
        cost: {
          materialsUsd: 1.005,
          laborHours: 2.5,
          laborRateUsdPerHour: 55.01,
          markupFraction: 0.1,
        },
      });
      addMeasure(write, firId ?? 0, {
        id: 'b',
        type: 'rim-joist',
        reductionCfm50: { low: 50, likely: 80, high: 120 },
        cost: { materialsUsd: 40, laborHours: 2, laborRateUsdPerHour: 50 },
        status: 'done',
      });
      addMeasure(write, goneId ?? 0, {
        id: 'c',
        type: 'rim-joist',
        reductionCfm50: { low: 50, likely: 80, high: 120 },
        cost: { materialsUsd: 999, laborHours: 0, laborRateUsdPerHour: 0 },
      });
      // A deleted home, its test and its measure count nowhere.
      deleteHome(write, goneId ?? 0);
    });
    const summary = store.read(portfolioSummary);

    expect(summary.homes).toBe(5);
    expect(summary.incompleteHomes).toBe(1);
    expect(summary.byTown).toEqual([
      { town: 'Millbrook', homes: 2 },
      { town: 'Riverton', homes: 2 },
      { town: null, homes: 1 },
    ]);
    expect(summary.byFuel).toEqual([
      { fuel: 'naturalGas', homes: 2 },
      { fuel: 'electricity', homes: 1 },
      { fuel: 'propane', homes: 1 },
      { fuel: null, homes: 1 },
    ]);
    expect(summary.byDecade).toEqual([
      { decade: 1950, homes: 2 },
      { decade: 1970, homes: 1 },
      { decade: 2000, homes: 1 },
      { decade: null, homes: 1 },
    ]);

    // Cedar Flat's four readings fitted to Q = C·ΔPⁿ by least squares on ln Q against ln ΔP
    // (ASTM E779), here with simple-statistics; CFM50 = C·50ⁿ.
    const readings = [
      [50, 2900],
      [40, 2500],
      [30, 2050],
      [20, 1550],
    ];
    const fit = linearRegression(
      readings.map(([pa, cfm]) => [Math.log(pa ?? 1), Math.log(cfm ?? 1)]),
    );
    const cedarCfm50 = Math.exp(fit.b + fit.m * Math.log(50));
    // ACH50 = CFM50 × 60 / volume [ft³].
    const ach50s = [
      (3100 * 60) / 11200,
      (cedarCfm50 * 60) / 15200,
      (1700 * 60) / 8000,
      (2100 * 60) / 7200,
    ];
    const leakage = summary.leakage;
    expect(leakage.homesCounted).toBe(4);
    expect(leakage.fittedMultipoint).toBe(1);
    expect(leakage.leftOut).toEqual({ noTestIn: 1, noVolume: 0, readingsUnfit: 0 });
    expect(leakage.cfm50Total).toBeCloseTo(3100 + cedarCfm50 + 1700 + 2100, 6);
    const spread = leakage.ach50;
    expect(spread?.count).toBe(4);
    expect(spread?.min).toBeCloseTo(formula.MIN(ach50s) as number, 9);
    expect(spread?.max).toBeCloseTo(formula.MAX(ach50s) as number, 9);
    expect(spread?.mean).toBeCloseTo(formula.AVERAGE(ach50s) as number, 9);
    expect(spread?.median).toBeCloseTo(formula.MEDIAN(ach50s) as number, 9);
    expect(spread?.p10).toBeCloseTo(formula.PERCENTILE.INC(ach50s, 0.1) as number, 9);
    expect(spread?.p90).toBeCloseTo(formula.PERCENTILE.INC(ach50s, 0.9) as number, 9);

    const measures = summary.measures;
    expect(measures.count).toBe(2);
    // 1.01 + 137.53 + 13.85 = 152.39 planned; 40 + 2 × 50 = 140 done; the deleted home's left out.
    expect(measures.byStatus).toEqual([
      { status: 'planned', count: 1, costUsd: 152.39 },
      { status: 'done', count: 1, costUsd: 140 },
    ]);
    expect(measures.costUsd).toBeCloseTo(292.39, 9);
    expect(measures.byType).toEqual([
      { type: 'attic-top-plates', count: 1, plannedCount: 1, plannedCostUsd: 152.39 },
      { type: 'rim-joist', count: 1, plannedCount: 0, plannedCostUsd: 0 },
    ]);
    expect(ids).toHaveLength(3);
    expect(draftId).toBeGreaterThan(0);
  });

  it("takes each home's ACH50 from the test-in its plan is built on", () => {
    const store = project();
    const home = validBaseHome();
    home.leakageTest = { cfm50: 2000, testedOn: '2020-03-01' };
    home.otherLeakageTests = [
      { kind: 'testIn', cfm50: 3000, testedOn: '2024-03-01' },
      { kind: 'testOut', cfm50: 1500, testedOn: '2025-03-01' },
    ];
    // The home file's own test-in is the plan's, though a later test-in was taken.
    store.write((write) => importHomeFile(write, home));
    const { leakage } = store.read(portfolioSummary);
    expect(leakage.cfm50Total).toBe(2000);
    // ACH50 = CFM50 × 60 / volume; the base home's volume is 13,600 ft³.
    expect(leakage.ach50?.median).toBeCloseTo((2000 * 60) / 13_600, 12);
  });

  it('is empty for an empty project', () => {
    const summary = project().read(portfolioSummary);
    expect(summary.homes).toBe(0);
    expect(summary.leakage.ach50).toBeNull();
    expect(summary.measures).toEqual({ count: 0, costUsd: 0, byStatus: [], byType: [] });
  });
});

describe('the command line', () => {
  it('dry-runs a CSV: lists what would be stored, writes nothing, creates no file', async () => {
    const file = folder.write(
      'homes.csv',
      VALID_CSV.replace('Stored Valley', '').replace('Stored Prices', ''),
    );
    const dbPath = join(folder.path, 'cli.db');
    // Without the stored sets the second row has no climate or prices: use the first and third.
    const lines = VALID_CSV.split('\n');
    folder.write('two.csv', [lines[0], lines[1], lines[3]].join('\n'));
    const dry = await runCli(['import', join(folder.path, 'two.csv'), '--db', dbPath, '--dry-run']);
    expect(dry).toMatchObject({ exitCode: 0, stderr: '' });
    expect(dry.stdout).toMatch(/Aspen House/);
    expect(dry.stdout).toMatch(/Elm Unit/);
    expect(dry.stdout).toMatch(/2 homes would be imported \(dry run: nothing was written\)/);
    expect(existsSync(dbPath)).toBe(false);

    const stored = await runCli(['import', join(folder.path, 'two.csv'), '--db', dbPath]);
    expect(stored).toMatchObject({ exitCode: 0, stdout: 'imported 2 homes\n' });
    const store = openStore(dbPath);
    stores.push(store);
    const before = rowCounts(store);
    expect(before.homes).toBe(2);
    const again = await runCli([
      'import',
      join(folder.path, 'two.csv'),
      '--db',
      dbPath,
      '--dry-run',
      '--json',
    ]);
    expect(again.exitCode).toBe(0);
    expect(JSON.parse(again.stdout)).toMatchObject({ dryRun: true, rows: 2 });
    expect(rowCounts(store)).toEqual(before);

    const json = await runCli(['import', join(folder.path, 'two.csv'), '--db', dbPath, '--json']);
    expect(json.exitCode).toBe(0);
    const { ids } = JSON.parse(json.stdout) as { ids: number[] };
    expect(ids).toHaveLength(2);
    expect(rowCounts(store).homes).toBe(4);

    const bad = await runCli(['import', file, '--db', dbPath]);
    expect(bad.exitCode).toBe(2);
    expect(bad.stdout).toBe('');
    // The second row named the stored climate and price set, emptied above: it has neither.
    expect(bad.stderr).toMatch(/^ {2}line 3, column climate: is required/m);
    expect(bad.stderr).toMatch(/^ {2}line 3, column fuelPriceUsdPerUnit: is required/m);
    expect(rowCounts(store).homes).toBe(4);
  });

  it('refuses a bad file with exit 2 and "line N, column X" on standard error', async () => {
    const dbPath = join(folder.path, 'bad.db');
    const run = await runCli(['import', folder.write('bad.csv', BAD_CSV), '--db', dbPath]);
    expect(run.exitCode).toBe(2);
    expect(run.stdout).toBe('');
    const listed = run.stderr.split('\n').filter((line) => /^ {2}line \d+/.test(line));
    expect(listed).toHaveLength(8);
    expect(listed[2]).toBe('  line 3, column yearBuilt: expected a number, got "nineteen-sixty"');
    const store = openStore(dbPath);
    stores.push(store);
    expect(rowCounts(store).homes).toBe(0);
  });

  it('exports both CSVs and prints the portfolio', async () => {
    const dbPath = join(folder.path, 'export.db');
    const lines = VALID_CSV.split('\n');
    await runCli([
      'import',
      folder.write('two.csv', [lines[0], lines[1], lines[3]].join('\n')),
      '--db',
      dbPath,
    ]);
    const homesFile = join(folder.path, 'out.csv');
    expect((await runCli(['export-csv', homesFile, '--db', dbPath])).exitCode).toBe(0);
    const homes = Papa.parse<Record<string, string>>(readFileSync(homesFile, 'utf8'), {
      header: true,
      skipEmptyLines: true,
    });
    expect(homes.data.map((record) => record.name)).toEqual(['Aspen House', 'Elm Unit']);
    const resultsFile = join(folder.path, 'results.csv');
    expect((await runCli(['export-csv', resultsFile, '--results', '--db', dbPath])).exitCode).toBe(
      0,
    );
    expect(readFileSync(resultsFile, 'utf8').split('\r\n')[0]).toBe(RESULT_COLUMNS.join(','));
    const summary = await runCli(['portfolio', '--json', '--db', dbPath]);
    expect(JSON.parse(summary.stdout)).toMatchObject({ homes: 2, leakage: { homesCounted: 2 } });
    const text = await runCli(['portfolio', '--db', dbPath]);
    expect(text.stdout).toMatch(/^Portfolio: 2 homes/);
  });
});

describe('README', () => {
  const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
  const section = readme.slice(readme.indexOf('## Portfolio CSV'));

  it('documents every column, in the order of the file', () => {
    const documented = [...section.matchAll(/^\| `(\w+)` +\|/gm)].map((match) => match[1]);
    expect(documented).toEqual(CSV_COLUMNS.map((spec) => spec.name));
  });

  it('shows an example that imports without a problem', () => {
    const example = /```csv\n([\s\S]*?)```/.exec(section)?.[1] ?? '';
    const checked = plan(project(), example);
    expect(checked.problems).toEqual([]);
    expect(checked.homes).toHaveLength(3);
  });
});
