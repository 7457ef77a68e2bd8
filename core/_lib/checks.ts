/**
 * The number checks the calculation modules share. Each throws an `InputError` naming the
 * field and what was expected; the wording is part of the contract (callers and tests read
 * it), so a check here is shared only where every caller already said exactly the same.
 */
import { InputError } from '../errors.ts';

/** Inclusive limits of an accepted number, with the unit to show in the message, if any. */
export interface NumberBounds {
  min: number;
  max: number;
  /** Unit appended to the limits in the message (`from 3 to 30 psia`); none when omitted. */
  unit?: string;
}

/**
 * Refuses anything but a finite number above zero.
 *
 * @param path - dotted path of the field, for the error
 * @param value - the number given, in the field's own unit
 * @throws InputError "expected a number greater than 0, got …"
 */
export function requirePositive(path: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw InputError.at(path, `expected a number greater than 0, got ${value}`);
  }
}

/**
 * Refuses anything but a finite number no smaller than `min`.
 *
 * @param path - dotted path of the field, for the error
 * @param value - the number given, in the field's own unit
 * @param min - the smallest accepted value, in the same unit
 * @throws InputError "expected a number of at least {min}, got …"
 */
export function requireAtLeast(path: string, value: number, min: number): void {
  if (!Number.isFinite(value) || value < min) {
    throw InputError.at(path, `expected a number of at least ${min}, got ${value}`);
  }
}

/**
 * Refuses anything but a finite number of zero or more.
 *
 * @param path - dotted path of the field, for the error
 * @param value - the number given, in the field's own unit
 * @throws InputError "expected a number of at least 0, got …"
 */
export function requireNonNegative(path: string, value: number): void {
  requireAtLeast(path, value, 0);
}

/**
 * Refuses anything but a finite number within `bounds`, limits included.
 *
 * @param path - dotted path of the field, for the error
 * @param value - the number given, in the unit of `bounds`
 * @param bounds - the accepted limits and, optionally, their unit for the message
 * @throws InputError "expected a number from {min} to {max} [unit], got …"
 */
export function requireInRange(path: string, value: number, bounds: NumberBounds): void {
  const { min, max, unit } = bounds;
  if (!Number.isFinite(value) || value < min || value > max) {
    const limits = unit === undefined ? `${min} to ${max}` : `${min} to ${max} ${unit}`;
    throw InputError.at(path, `expected a number from ${limits}, got ${value}`);
  }
}
