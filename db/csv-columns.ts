/**
 * The columns of the portfolio CSV and how a cell of each is read. The import checks a file
 * against this table and the export writes it, so the two cannot disagree on a name, a
 * home-file path or the way a value is spelled.
 */

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
export const REQUIRED_COLUMNS = [
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
export const REQUIRED_CHOICES: readonly { choices: string[][]; words: string }[] = [
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

/** Each known column by its name in the header. */
export const COLUMNS_BY_NAME = new Map(CSV_COLUMNS.map((spec) => [spec.name, spec]));

// ── Cells ────────────────────────────────────────────────────────────────────────────────

const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const POINT = /^([^:]+):([^:]+)$/;
/** Cells a spreadsheet would run as a formula (OWASP, "CSV Injection"); export guards them. */
export const FORMULA_START = /^[=+\-@]/;

/** A cell as read: its value for the home file, or what is wrong with it in words. */
export type Cell = { value: unknown } | { problem: string };

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

/**
 * One cell's value as the home file wants it, or the problem in words for people.
 *
 * @param kind - how the column is read (text, number, true/false or `Pa:cfm` readings)
 * @param text - the cell as the file gives it, trimmed and not empty
 * @returns `{ value }`, or `{ problem }` saying what was expected and what was given
 */
export function readCell(kind: CsvCellKind, text: string): Cell {
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
