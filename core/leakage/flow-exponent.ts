/**
 * The flow exponent n as an input: the one range both the fit and the leakage areas accept.
 */
import { InputError } from '../errors.ts';

/**
 * Exponents we accept as input: a wide margin around 0.5–1.0 so that a fit flagged as out of
 * range can still be carried through, while a typo such as 65 for 0.65 is refused.
 */
const EXPONENT_BOUNDS = { min: 0.3, max: 1.2 };

/**
 * Refuses a flow exponent outside the accepted bounds (0.3 to 1.2).
 *
 * @param path - dotted path of the field, for the error
 * @param exponentN - the flow exponent given, dimensionless
 * @throws InputError "expected a flow exponent from 0.3 to 1.2, got …"
 */
export function requireExponent(path: string, exponentN: number): void {
  const { min, max } = EXPONENT_BOUNDS;
  if (!Number.isFinite(exponentN) || exponentN < min || exponentN > max) {
    throw InputError.at(path, `expected a flow exponent from ${min} to ${max}, got ${exponentN}`);
  }
}
