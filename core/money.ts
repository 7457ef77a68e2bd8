/**
 * Money helpers. Every amount of money in the core is a decimal.js `Decimal`; float64 is kept
 * for physics. Amounts are rounded to the cent only where they are reported or summed as
 * line items, so totals equal the sum of their parts exactly.
 */
import Decimal from 'decimal.js';

export { Decimal };

/** A Decimal from a number or string of dollars. */
export function usd(amount: Decimal.Value): Decimal {
  return new Decimal(amount);
}

/** Rounds dollars to whole cents, half away from zero (the usual commercial rule). */
export function roundToCents(amountUsd: Decimal): Decimal {
  return amountUsd.toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

/** Sum of amounts; zero for an empty list. */
export function sumUsd(amountsUsd: readonly Decimal[]): Decimal {
  return amountsUsd.reduce((total, amount) => total.plus(amount), new Decimal(0));
}

/** A Decimal rounded to cents as a JSON-friendly number (for reports, never for arithmetic). */
export function centsToNumber(amountUsd: Decimal): number {
  const cents = roundToCents(amountUsd).toNumber();
  return cents === 0 ? 0 : cents; // no "-0" in reports
}
