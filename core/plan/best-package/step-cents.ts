/**
 * The exact figures of a step in whole cents, worked out in float64 where that is certain and
 * in Decimal where it is not, so the search can add and compare packages as integers and still
 * agree to the cent with `packageFigures`.
 *
 * Why the float figure is certain away from half cents. The plan's figure is Decimal:
 * heating = price × units and electricity = price × kWh (20 significant digits), a year's
 * savings = round(heating + electricity), PV = round(heating × UPV*_h + electricity × UPV*_e),
 * to the cent, half away from zero (core/plan/prices.ts). Its inputs are the same float64
 * numbers the float figure uses (a Decimal made from a number is that number's shortest
 * decimal form, within half an ulp of it; the UPV* float is the Decimal factor rounded once).
 * So the two sums differ by a few ulps of their terms' magnitudes, about 1e-15 relative; with
 * a margin of 1e-12 relative, a float sum farther than the margin from a half cent rounds to
 * the same cent as the Decimal one. Closer than that, the Decimal figure is computed.
 */
import { Decimal } from '../../money.ts';
import type { PriceBook } from '../prices.ts';
import type { StepOutcome } from '../step.ts';

/** Relative allowance between a float sum and the Decimal sum of the same inputs. */
const FLOAT_ALLOWANCE = 1e-12;

/** A step's figures, cents. */
export interface StepCents {
  annualCents: number;
  pvCents: number;
}

/** The present-value factors of a measure's life, float64 (UPV* of heating, electricity). */
export interface LifeFactors {
  heating: number;
  electricity: number;
}

/**
 * Rounds dollars to cents when the float sum is certain to round as the Decimal one would.
 *
 * @param amountUsd - the float sum, USD
 * @param magnitudeUsd - the sum of its terms' magnitudes, USD
 * @returns whole cents, or null when the sum is too close to a half cent to say
 */
function certainCents(amountUsd: number, magnitudeUsd: number): number | null {
  const cents = amountUsd * 100;
  const margin = FLOAT_ALLOWANCE * magnitudeUsd * 100 + 1e-9;
  const toHalf = Math.abs(cents - Math.floor(cents) - 0.5);
  return toHalf > margin ? Math.round(cents) : null;
}

/** Cents of a Decimal amount already rounded to the cent. */
function centsOf(amountUsd: Decimal): number {
  return amountUsd.times(100).toNumber();
}

/**
 * A step's year of savings and its present value, cents, exactly as the plan values them.
 *
 * @param prices - the home's price book
 * @param outcome - the step
 * @param factors - the UPV* factors of the measure's life, float64
 * @throws InputError when the step moves electricity and the home has no electricity price
 */
export function stepCents(
  prices: PriceBook,
  outcome: StepOutcome,
  factors: LifeFactors,
): StepCents {
  const saved = outcome.saved;
  const heatingUsd = saved.heatingFuelUnits * prices.heating.usdPerUnitFloat;
  const kwh = saved.coolingKwh + saved.ventilationFanKwh;
  const electricityUsd =
    kwh === 0 ? 0 : kwh * prices.requireElectricity('cooling and ventilation fans').usdPerUnitFloat;
  const annualMagnitude = Math.abs(heatingUsd) + Math.abs(electricityUsd);
  const heatingPv = heatingUsd * factors.heating;
  const electricityPv = electricityUsd === 0 ? 0 : electricityUsd * factors.electricity;
  let annualCents = certainCents(heatingUsd + electricityUsd, annualMagnitude);
  let pvCents = certainCents(
    heatingPv + electricityPv,
    Math.abs(heatingPv) + Math.abs(electricityPv),
  );
  if (annualCents === null || pvCents === null) {
    const worth = prices.annualWorth(saved);
    annualCents ??= centsOf(worth.totalUsd);
    pvCents ??= centsOf(prices.presentValue(worth, outcome.measure.lifeYears));
  }
  return { annualCents, pvCents };
}

/**
 * Compares two ratios of whole cents as the plan's Decimal SIRs compare (each quotient to 20
 * significant digits): by float where they are clearly apart, in Decimal where they are close.
 *
 * @returns negative when a/b ranks above c/d (is larger), positive when below, 0 when equal
 */
export function compareCentRatios(
  numeratorA: number,
  denominatorA: number,
  numeratorB: number,
  denominatorB: number,
): number {
  const ratioA = numeratorA / denominatorA;
  const ratioB = numeratorB / denominatorB;
  const scale = Math.max(Math.abs(ratioA), Math.abs(ratioB));
  if (Math.abs(ratioA - ratioB) > 1e-9 * scale) return ratioA > ratioB ? -1 : 1;
  const exactA = new Decimal(numeratorA).div(denominatorA);
  const exactB = new Decimal(numeratorB).div(denominatorB);
  return exactA.eq(exactB) ? 0 : exactA.gt(exactB) ? -1 : 1;
}
