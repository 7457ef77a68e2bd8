/**
 * The fields of a home's description the House section edits, each named by its path inside
 * the stored home's `data` (`climate.hdd65F`, `prices.naturalGas.usdPerUnit`). A field says
 * how its text becomes the stored value (a number in the stored unit, a fraction typed as a
 * percentage, a choice); the store's own rules decide what is valid.
 *
 * Fields sharing all but the last step of their path form a group (`climate`,
 * `prices.naturalGas`): a group is saved whole, so a group the home does not have yet waits
 * until its required fields are all filled in.
 */
import type { Fuel, HomeData } from '../core/schema.ts';
import { HOUSE_FIELDS } from './house-fields.ts';
import type { Quantity } from './quantities.ts';

export interface Choice {
  value: string;
  words: string;
}

interface FieldBase {
  /** Unique among the fields: it is also the element id. */
  id: string;
  path: readonly string[];
  label: string;
  hint?: string;
  /** Blank text removes the value instead of being refused. */
  optional?: boolean;
  /** Blank text removes the field's whole group (a fuel's price with its price change). */
  removesGroupWhenBlank?: boolean;
  /** Whether the field is shown for the home's current (or typed) data. */
  shownWhen?: (data: HomeData) => boolean;
}

export interface NumberFieldSpec extends FieldBase {
  kind: 'number';
  /** A quantity whose unit follows the IP/SI choice. */
  quantity?: Quantity;
  /** A unit that does not change with the system ("%", "USD per therm"). */
  unit?: string;
  /** Typed as a percentage, stored as a fraction. */
  percent?: boolean;
}

export interface ChoiceFieldSpec extends FieldBase {
  kind: 'choice';
  choices: readonly Choice[];
  /**
   * How a choice's value is stored: as text or a number; `yesNo` a flag that is yes unless
   * stored as no; `flag` one that is no unless stored as yes; `presence` a part present or
   * null.
   */
  stores: 'text' | 'number' | 'yesNo' | 'flag' | 'presence';
}

export interface TextFieldSpec extends FieldBase {
  kind: 'text';
}

export type DataFieldSpec = NumberFieldSpec | ChoiceFieldSpec | TextFieldSpec;

/** The group a field belongs to: its path without the last step. */
export function groupOf(spec: DataFieldSpec): readonly string[] {
  return spec.path.slice(0, -1);
}

/**
 * The part of the home a field is saved with: its top-level part (`climate`, `heating`), or
 * for a price, the one fuel's price. Fields of one part typed before it could be saved are
 * saved together; a refused field of another part never holds them back.
 */
export function partOf(spec: DataFieldSpec): string {
  return (spec.path[0] === 'prices' ? spec.path.slice(0, 2) : spec.path.slice(0, 1)).join('.');
}

/** A field's path as the store names it in a homes.update refusal. */
export function requestPath(path: readonly string[]): string {
  return ['home', 'data', ...path].join('.');
}

/** The house's geometry, as the House section has always edited it. */
export const HOUSE_DATA_FIELDS: readonly DataFieldSpec[] = HOUSE_FIELDS.map((field) =>
  field.kind === 'number'
    ? {
        kind: 'number',
        id: `house-${field.key}`,
        path: ['house', field.key],
        label: field.label,
        ...(field.quantity === undefined ? {} : { quantity: field.quantity }),
        ...(field.countUnit === undefined ? {} : { unit: field.countUnit }),
        ...(field.hint === undefined ? {} : { hint: field.hint }),
      }
    : {
        kind: 'choice',
        id: `house-${field.key}`,
        path: ['house', field.key],
        label: field.label,
        choices: field.choices,
        stores: field.key === 'shelterClass' ? 'number' : 'text',
      },
);

/** N-factor zones of the LBL correlation map (Lawrence Berkeley Laboratory; from memory). */
const N_FACTOR_ZONES: readonly Choice[] = [
  { value: '', words: 'Not set (from the degree days)' },
  { value: '1', words: 'Zone 1' },
  { value: '2', words: 'Zone 2' },
  { value: '3', words: 'Zone 3' },
  { value: '4', words: 'Zone 4' },
];

export const CLIMATE_FIELDS: readonly DataFieldSpec[] = [
  {
    kind: 'text',
    id: 'climate-name',
    path: ['climate', 'name'],
    label: 'Weather station or place',
  },
  {
    kind: 'number',
    id: 'climate-hdd',
    path: ['climate', 'hdd65F'],
    label: 'Heating degree days',
    quantity: 'degreeDaysF',
    hint: 'At a base of 65 °F (18.3 °C)',
  },
  {
    kind: 'number',
    id: 'climate-cdd',
    path: ['climate', 'cdd65F'],
    label: 'Cooling degree days',
    quantity: 'degreeDaysF',
    hint: 'At a base of 65 °F (18.3 °C)',
  },
  {
    kind: 'number',
    id: 'climate-elevation',
    path: ['climate', 'elevationFt'],
    label: 'Elevation',
    quantity: 'lengthFt',
  },
  {
    kind: 'choice',
    id: 'climate-zone',
    path: ['climate', 'nFactorZone'],
    label: 'N-factor zone',
    choices: N_FACTOR_ZONES,
    stores: 'number',
    optional: true,
  },
  {
    kind: 'number',
    id: 'climate-heating-delta',
    path: ['climate', 'heatingSeason', 'meanDeltaTF'],
    label: 'Heating season: mean indoor − outdoor',
    quantity: 'temperatureDifferenceF',
    hint: 'For the LBL and AIM-2 models; with the season’s mean wind',
  },
  {
    kind: 'number',
    id: 'climate-heating-wind',
    path: ['climate', 'heatingSeason', 'meanWindSpeedMph'],
    label: 'Heating season: mean wind',
    quantity: 'speedMph',
    hint: 'At the weather station, 10 m above ground',
  },
];

const EQUIPMENT_CHOICES: readonly Choice[] = [
  { value: 'furnace', words: 'Furnace' },
  { value: 'boiler', words: 'Boiler' },
  { value: 'heatPump', words: 'Heat pump' },
  { value: 'electricResistance', words: 'Electric resistance' },
  { value: 'stove', words: 'Stove' },
];

const FUEL_CHOICES: readonly { value: Fuel; words: string }[] = [
  { value: 'naturalGas', words: 'Natural gas' },
  { value: 'propane', words: 'Propane' },
  { value: 'heatingOil', words: 'Heating oil' },
  { value: 'kerosene', words: 'Kerosene' },
  { value: 'electricity', words: 'Electricity' },
  { value: 'wood', words: 'Wood' },
  { value: 'pellets', words: 'Pellets' },
];

const VENTING_CHOICES: readonly Choice[] = [
  { value: '', words: 'Not recorded' },
  { value: 'naturalDraft', words: 'Natural draft' },
  { value: 'inducedDraft', words: 'Induced draft' },
  { value: 'sealed', words: 'Sealed combustion' },
  { value: 'none', words: 'Not vented' },
];

const isHeatPump = (data: HomeData): boolean => data.heating?.equipment === 'heatPump';
const burnsFuel = (data: HomeData): boolean =>
  data.heating !== undefined && data.heating.fuel !== 'electricity';
const hasCooling = (data: HomeData): boolean => data.cooling !== undefined && data.cooling !== null;

export const EQUIPMENT_FIELDS: readonly DataFieldSpec[] = [
  {
    kind: 'choice',
    id: 'heating-equipment',
    path: ['heating', 'equipment'],
    label: 'Heating equipment',
    choices: EQUIPMENT_CHOICES,
    stores: 'text',
  },
  {
    kind: 'choice',
    id: 'heating-fuel',
    path: ['heating', 'fuel'],
    label: 'Heating fuel',
    choices: FUEL_CHOICES,
    stores: 'text',
  },
  {
    kind: 'number',
    id: 'heating-afue',
    path: ['heating', 'efficiency'],
    label: 'Efficiency (AFUE or steady state)',
    unit: '%',
    percent: true,
    hint: 'From the nameplate or a combustion test',
    shownWhen: (data) => !isHeatPump(data),
  },
  {
    kind: 'number',
    id: 'heating-hspf',
    path: ['heating', 'efficiency'],
    label: 'HSPF',
    unit: 'Btu/Wh',
    hint: 'The heat pump’s seasonal rating',
    shownWhen: isHeatPump,
  },
  {
    kind: 'number',
    id: 'heating-distribution',
    path: ['heating', 'distributionEfficiency'],
    label: 'Distribution efficiency',
    unit: '%',
    percent: true,
    optional: true,
    hint: 'Ducts or pipes; leave blank for 100 %',
  },
  {
    kind: 'choice',
    id: 'heating-venting',
    path: ['heating', 'combustionVenting'],
    label: 'Venting',
    choices: VENTING_CHOICES,
    stores: 'text',
    optional: true,
    shownWhen: burnsFuel,
  },
  {
    kind: 'choice',
    id: 'heating-inside',
    path: ['heating', 'insidePressureBoundary'],
    label: 'Inside the pressure boundary',
    choices: [
      { value: 'yes', words: 'Yes' },
      { value: 'no', words: 'No, outside it' },
    ],
    stores: 'yesNo',
    optional: true,
    shownWhen: burnsFuel,
  },
  {
    kind: 'choice',
    id: 'cooling-presence',
    path: ['cooling'],
    label: 'Cooling',
    choices: [
      { value: 'none', words: 'None' },
      { value: 'present', words: 'Air conditioner' },
    ],
    stores: 'presence',
    optional: true,
  },
  {
    kind: 'number',
    id: 'cooling-seer',
    path: ['cooling', 'seer'],
    label: 'SEER',
    unit: 'Btu/Wh',
    shownWhen: hasCooling,
  },
];

export interface PriceRow {
  fuel: Fuel;
  price: DataFieldSpec;
  change: DataFieldSpec;
}

const RANKING_CHOICES: readonly Choice[] = [
  { value: 'sir', words: 'Savings-to-investment ratio (SIR)' },
  { value: 'npv', words: 'Net present value (NPV)' },
  { value: 'payback', words: 'Simple payback' },
  { value: 'cce', words: 'Cost of saved energy' },
];

const INFILTRATION_CHOICES: readonly Choice[] = [
  { value: 'nFactor', words: 'N-factor: CFM50 ÷ N (LBL correlation)' },
  { value: 'lblBasic', words: 'LBL basic model: stack and wind' },
  { value: 'aim2', words: 'AIM-2 enhanced model: stack, wind and leak placement' },
  { value: 'ashrae622', words: 'ASHRAE 62.2 effective annual infiltration' },
];

/** How the home's plan is worked out: the infiltration model, the money, the floor. */
export const ANALYSIS_FIELDS: readonly DataFieldSpec[] = [
  {
    kind: 'choice',
    id: 'analysis-infiltration',
    path: ['infiltrationMethod'],
    label: 'Natural infiltration from',
    choices: INFILTRATION_CHOICES,
    stores: 'text',
    hint: 'The stack and wind models need the heating season’s mean temperature difference and wind',
  },
  {
    kind: 'number',
    id: 'analysis-n-factor',
    path: ['nFactorOverride'],
    label: 'N-factor',
    unit: 'no unit',
    optional: true,
    hint: 'Leave blank to take N from the climate zone, stories and shelter',
    shownWhen: (data) => data.infiltrationMethod === 'nFactor',
  },
  {
    kind: 'number',
    id: 'analysis-discount',
    path: ['economics', 'discountRateReal'],
    label: 'Discount rate, real',
    unit: '% a year',
    percent: true,
    hint: 'Above inflation; a new home starts from the project’s settings',
  },
  {
    kind: 'choice',
    id: 'analysis-ranking',
    path: ['economics', 'ranking'],
    label: 'Rank measures by',
    choices: RANKING_CHOICES,
    stores: 'text',
    optional: true,
  },
  {
    kind: 'number',
    id: 'analysis-loan-apr',
    path: ['financing', 'aprNominal'],
    label: 'Loan rate (APR)',
    unit: '% a year',
    percent: true,
    removesGroupWhenBlank: true,
    hint: 'For a package paid with a loan; blank for none',
  },
  {
    kind: 'number',
    id: 'analysis-loan-months',
    path: ['financing', 'months'],
    label: 'Loan term',
    unit: 'months',
  },
  {
    kind: 'number',
    id: 'analysis-floor',
    path: ['leakageFloorCfm50'],
    label: 'Leakage floor',
    quantity: 'flowCfm',
    optional: true,
    hint: 'The plan never seals below this; leave blank for none',
  },
];

/** Each fuel's price and its yearly change; `unitOf` names the unit it is bought in ("therm"). */
export function priceRows(unitOf: (fuel: Fuel) => string): PriceRow[] {
  return FUEL_CHOICES.map(({ value: fuel, words }) => ({
    fuel,
    price: {
      kind: 'number',
      id: `price-${fuel}`,
      path: ['prices', fuel, 'usdPerUnit'],
      label: words,
      unit: `USD per ${unitOf(fuel)}`,
      removesGroupWhenBlank: true,
    },
    change: {
      kind: 'number',
      id: `price-${fuel}-escalation`,
      path: ['prices', fuel, 'escalationRateReal'],
      label: `${words}: price change`,
      unit: '% a year',
      percent: true,
      optional: true,
      shownWhen: (data) => data.prices?.[fuel] !== undefined,
    },
  }));
}

/** The price fields, one list. */
export function priceFields(unitOf: (fuel: Fuel) => string): DataFieldSpec[] {
  return priceRows(unitOf).flatMap((row) => [row.price, row.change]);
}

const YES_NO: readonly Choice[] = [
  { value: 'no', words: 'No' },
  { value: 'yes', words: 'Yes' },
];

/**
 * What the Safety section records about the house and its air: the fans that already run,
 * the fan a tighter house would get, and what was seen that calls for care before sealing.
 */
export const SITE_SAFETY_FIELDS: readonly DataFieldSpec[] = [
  {
    kind: 'number',
    id: 'ventilation-existing',
    path: ['ventilation', 'existingFanCfm'],
    label: 'Fans already running continuously',
    quantity: 'flowCfm',
    optional: true,
    hint: 'Measured flow of exhaust or supply fans that run all the time; blank for none',
  },
  {
    kind: 'choice',
    id: 'ventilation-type',
    path: ['ventilation', 'fanType'],
    label: 'Kind of fan added when one is needed',
    choices: [
      { value: '', words: 'Not chosen (exhaust)' },
      { value: 'exhaust', words: 'Exhaust' },
      { value: 'supply', words: 'Supply' },
      { value: 'balanced', words: 'Balanced' },
    ],
    stores: 'text',
    optional: true,
  },
  {
    kind: 'number',
    id: 'ventilation-cost',
    path: ['ventilation', 'fanCostUsd'],
    label: 'Installed cost of that fan',
    unit: 'USD',
    optional: true,
    hint: 'This job’s price; blank uses a default',
  },
  {
    kind: 'choice',
    id: 'house-knob-and-tube',
    path: ['house', 'knobAndTubeWiring'],
    label: 'Knob-and-tube wiring seen',
    choices: YES_NO,
    stores: 'flag',
    optional: true,
  },
  {
    kind: 'choice',
    id: 'house-vermiculite',
    path: ['house', 'vermiculiteSuspected'],
    label: 'Vermiculite insulation suspected',
    choices: YES_NO,
    stores: 'flag',
    optional: true,
  },
];
