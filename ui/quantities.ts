/**
 * Quantities as the screens show them: the store keeps US customary units (the unit in every
 * field's name); the screens show them in the project's chosen system, IP or SI, through
 * core/units.ts, and turn what is typed back into the stored unit.
 */
import { formatNumber } from '../core/format.ts';
import {
  cfmToLitersPerSecond,
  cubicFeetToCubicMeters,
  feetToMeters,
  squareFeetToSquareMeters,
  squareInchesToSquareCm,
} from '../core/units.ts';

export type UnitSystem = 'IP' | 'SI';

/** The kinds of quantity whose unit changes with the system; counts and ratios do not. */
export type Quantity = 'areaFt2' | 'volumeFt3' | 'lengthFt' | 'flowCfm' | 'leakageAreaIn2';

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
  const places = units === 'SI' && quantity !== 'flowCfm' ? decimals + 1 : decimals;
  return `${formatNumber(shown, places)} ${unitOf(quantity, units)}`;
}

/** A value for an input box: no thousands separators, a few decimals at most. */
export function inputText(quantity: Quantity, valueIp: number, units: UnitSystem): string {
  const shown = shownValue(quantity, valueIp, units);
  return String(Math.round(shown * 100) / 100);
}
