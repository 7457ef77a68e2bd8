/**
 * Conversions from the core's US customary units to SI for display. The core computes in
 * IP with the unit in every name; the screens offer SI everywhere through these.
 *
 * References: NIST Special Publication 811, Guide for the Use of the International System
 * of Units (exact definitions of the foot, the pound, the Btu(IT) and the mile).
 */
import {
  CUBIC_METERS_PER_CUBIC_FOOT,
  LITERS_PER_SECOND_PER_CFM,
  METERS_PER_FOOT,
  METERS_PER_SECOND_PER_MPH,
  SQUARE_CM_PER_SQUARE_INCH,
  SQUARE_METERS_PER_SQUARE_FOOT,
} from './constants.ts';

/** 1 Btu(IT) = 1055.05585262 J (NIST SP 811, exact). */
export const JOULES_PER_BTU = 1055.05585262;

export function cfmToLitersPerSecond(cfm: number): number {
  return cfm * LITERS_PER_SECOND_PER_CFM;
}

export function cubicFeetToCubicMeters(volumeFt3: number): number {
  return volumeFt3 * CUBIC_METERS_PER_CUBIC_FOOT;
}

export function squareFeetToSquareMeters(areaFt2: number): number {
  return areaFt2 * SQUARE_METERS_PER_SQUARE_FOOT;
}

export function squareInchesToSquareCm(areaIn2: number): number {
  return areaIn2 * SQUARE_CM_PER_SQUARE_INCH;
}

export function feetToMeters(lengthFt: number): number {
  return lengthFt * METERS_PER_FOOT;
}

export function mphToMetersPerSecond(speedMph: number): number {
  return speedMph * METERS_PER_SECOND_PER_MPH;
}

/** A temperature, °F → °C. */
export function fahrenheitToCelsius(temperatureF: number): number {
  return ((temperatureF - 32) * 5) / 9;
}

/** A temperature difference or degree days, °F → K (°C). */
export function fahrenheitDifferenceToKelvin(differenceF: number): number {
  return (differenceF * 5) / 9;
}

/** Btu → kWh (1 kWh = 3.6 MJ). */
export function btuToKwh(energyBtu: number): number {
  return (energyBtu * JOULES_PER_BTU) / 3.6e6;
}

/** MMBtu → GJ. */
export function mmbtuToGigajoules(energyMMBtu: number): number {
  return (energyMMBtu * 1e6 * JOULES_PER_BTU) / 1e9;
}
