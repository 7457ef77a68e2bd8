/**
 * Unit conversions of the weather readers, each constant with where it comes from.
 *
 * References: NIST Special Publication 811 (2008), Guide for the Use of the International
 * System of Units: t/°F = 1.8·t/°C + 32 (exact); 1 mile per hour = 0.44704 m/s (exact,
 * from 1 mile = 1609.344 m).
 */
import { METERS_PER_SECOND_PER_MPH } from '../constants.ts';

/** Fahrenheit degrees per Celsius degree: 9/5, exact. */
export const FAHRENHEIT_DEGREES_PER_CELSIUS_DEGREE = 9 / 5;

/** 0 °C in °F: 32, exact. */
export const FAHRENHEIT_AT_ZERO_CELSIUS = 32;

/** Miles per hour in 1 m/s: 1 / 0.44704 = 2.236936… (exact as a ratio). */
export const MPH_PER_METER_PER_SECOND = 1 / METERS_PER_SECOND_PER_MPH;

/** A temperature, °C → °F. */
export function celsiusToFahrenheit(temperatureC: number): number {
  return temperatureC * FAHRENHEIT_DEGREES_PER_CELSIUS_DEGREE + FAHRENHEIT_AT_ZERO_CELSIUS;
}

/** A speed, m/s → mph. */
export function metersPerSecondToMph(speedMs: number): number {
  return speedMs * MPH_PER_METER_PER_SECOND;
}
