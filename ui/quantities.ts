/**
 * Quantities as the screens show them: the store keeps US customary units (the unit in every
 * field's name); the screens show them in the project's chosen system, IP or SI, through
 * core/units.ts, and turn what is typed back into the stored unit.
 */
import { formatNumber } from '../core/format.ts';
import {
  cfmToLitersPerSecond,
  cubicFeetToCubicMeters,
  fahrenheitDifferenceToKelvin,
  feetToMeters,
  mphToMetersPerSecond,
  squareFeetToSquareMeters,
  squareInchesToSquareCm,
} from '../core/units.ts';

export type UnitSystem = 'IP' | 'SI';

/** The kinds of quantity whose unit changes with the system; counts and ratios do not. */
export type Quantity =
  | 'areaFt2'
  | 'volumeFt3'
  | 'lengthFt'
  | 'flowCfm'
  | 'leakageAreaIn2'
  | 'speedMph'
  | 'temperatureDifferenceF'
  | 'degreeDaysF';

interface QuantityUnits {
  ip: string;
  si: string;
  /** The stored (IP) value in SI units. */
  toSi: (valueIp: number) => number;
}

const QUANTITIES: Readonly<Record<Quantity, QuantityUnits>> = {
  areaFt2: { ip: 'ft²', si: 'm²', toSi: squareFeetToSquareMeters },
  volumeFt3: { ip: 'ft³', si: 'm³', toSi: cubicFeetToCubicMeters },
  lengthFt: { ip: 'ft', si: 'm', toSi: feetToMeters },
  flowCfm: { ip: 'cfm', si: 'L/s', toSi: cfmToLitersPerSecond },
  leakageAreaIn2: { ip: 'in²', si: 'cm²', toSi: squareInchesToSquareCm },
  speedMph: { ip: 'mph', si: 'm/s', toSi: mphToMetersPerSecond },
  temperatureDifferenceF: { ip: '°F', si: 'K', toSi: fahrenheitDifferenceToKelvin },
  degreeDaysF: { ip: '°F·day', si: 'K·day', toSi: fahrenheitDifferenceToKelvin },
};

/** The unit a quantity is shown in: "ft²" or "m²". */
export function unitOf(quantity: Quantity, units: UnitSystem): string {
  const entry = QUANTITIES[quantity];
  return units === 'IP' ? entry.ip : entry.si;
}

/** A stored (IP) value in the shown system. */
export function shownValue(quantity: Quantity, valueIp: number, units: UnitSystem): number {
  return units === 'IP' ? valueIp : QUANTITIES[quantity].toSi(valueIp);
}

/**
 * A value typed in the shown system, back in the stored (IP) unit. Every conversion here is
 * a plain scale factor, so the inverse divides by the factor of one unit.
 */
export function storedValue(quantity: Quantity, valueShown: number, units: UnitSystem): number {
  return units === 'IP' ? valueShown : valueShown / QUANTITIES[quantity].toSi(1);
}

/** A stored value shown with its unit: "1,850 ft²", "171.9 m²". */
export function formatQuantity(
  quantity: Quantity,
  valueIp: number,
  units: UnitSystem,
  decimals = 0,
): string {
  const shown = shownValue(quantity, valueIp, units);
  // SI figures are smaller by an order or two; one more decimal keeps the same precision.
  const places =
    units === 'SI' && quantity !== 'flowCfm' && quantity !== 'degreeDaysF'
      ? decimals + 1
      : decimals;
  return `${formatNumber(shown, places)} ${unitOf(quantity, units)}`;
}

/** A value for an input box: no thousands separators, a few decimals at most. */
export function inputText(quantity: Quantity, valueIp: number, units: UnitSystem): string {
  const shown = shownValue(quantity, valueIp, units);
  return String(Math.round(shown * 100) / 100);
}

/**
 * The quantity a library type counts its work in, when the count has a dimension: a length
 * (sill plates in ft) or an area (ft²); counts of items and whole jobs have none.
 */
function workQuantity(workUnit: string): Quantity | null {
  if (workUnit === 'linearFt') return 'lengthFt';
  if (workUnit === 'ft2') return 'areaFt2';
  return null;
}

const COUNT_WORDS: Readonly<Record<string, string>> = { each: 'each', job: 'job' };

/**
 * The unit a type's amount of work is shown in.
 *
 * @param workUnit - the library type's unit (`each`, `linearFt`, `ft2`, `job`)
 * @returns "ft" or "m", "ft²" or "m²", "each", "job"
 */
export function workUnitOf(workUnit: string, units: UnitSystem): string {
  const quantity = workQuantity(workUnit);
  return quantity === null ? (COUNT_WORDS[workUnit] ?? workUnit) : unitOf(quantity, units);
}

/** "per ft" or "per m", "per ft²" or "per m²", "per unit", "per job". */
export function perWorkWords(workUnit: string, units: UnitSystem): string {
  if (workUnit === 'each') return 'per unit';
  return `per ${workUnitOf(workUnit, units)}`;
}

/** An amount of work stored in the type's IP unit (ft, ft², a count), in the shown unit. */
export function shownWork(countIp: number, workUnit: string, units: UnitSystem): number {
  const quantity = workQuantity(workUnit);
  return quantity === null ? countIp : shownValue(quantity, countIp, units);
}

/** An amount of work typed in the shown unit, back in the type's IP unit. */
export function storedWork(countShown: number, workUnit: string, units: UnitSystem): number {
  const quantity = workQuantity(workUnit);
  return quantity === null ? countShown : storedValue(quantity, countShown, units);
}

/**
 * A figure per unit of work (per ft, per ft²) as the same figure per shown unit (per m,
 * per m²): a figure per foot is 1 / 0.3048 times as large per metre.
 */
export function perShownWork(valuePerIpUnit: number, workUnit: string, units: UnitSystem): number {
  return valuePerIpUnit / shownWork(1, workUnit, units);
}

/** An amount of work in words, in the shown unit: "3 units", "1 job", "45.72 m". */
export function workAmountWords(countIp: number, workUnit: string, units: UnitSystem): string {
  const shown = Math.round(shownWork(countIp, workUnit, units) * 100) / 100;
  const figure = formatNumber(shown, Number.isInteger(shown) ? 0 : 2);
  if (workUnit === 'each') return `${figure} ${shown === 1 ? 'unit' : 'units'}`;
  if (workUnit === 'job') return `${figure} ${shown === 1 ? 'job' : 'jobs'}`;
  return `${figure} ${workUnitOf(workUnit, units)}`;
}
