/** SI conversions against the exact definitions of NIST SP 811. */
import { describe, expect, it } from 'vitest';
import {
  btuToKwh,
  cfmToLitersPerSecond,
  cubicFeetToCubicMeters,
  fahrenheitDifferenceToKelvin,
  fahrenheitToCelsius,
  feetToMeters,
  mmbtuToGigajoules,
  mphToMetersPerSecond,
  squareFeetToSquareMeters,
  squareInchesToSquareCm,
} from '../../core/units.ts';

describe('SI conversions (NIST SP 811)', () => {
  it('converts lengths, areas and volumes from the exact foot and inch', () => {
    expect(feetToMeters(1)).toBe(0.3048);
    expect(squareFeetToSquareMeters(1)).toBeCloseTo(0.09290304, 12);
    expect(squareInchesToSquareCm(1)).toBeCloseTo(6.4516, 12);
    expect(cubicFeetToCubicMeters(1)).toBeCloseTo(0.028316846592, 12);
  });

  it('converts air flow: 1 cfm = 0.471947 L/s', () => {
    expect(cfmToLitersPerSecond(1)).toBeCloseTo(0.4719474432, 9);
    expect(cfmToLitersPerSecond(2000)).toBeCloseTo(943.8949, 3);
  });

  it('converts wind speed: 1 mph = 0.44704 m/s exactly', () => {
    expect(mphToMetersPerSecond(1)).toBeCloseTo(0.44704, 12);
  });

  it('converts temperatures and differences', () => {
    expect(fahrenheitToCelsius(32)).toBe(0);
    expect(fahrenheitToCelsius(212)).toBeCloseTo(100, 12);
    expect(fahrenheitToCelsius(-40)).toBeCloseTo(-40, 12);
    expect(fahrenheitDifferenceToKelvin(9)).toBeCloseTo(5, 12);
  });

  it('converts energy: 3,412.14 Btu per kWh; 1.055 GJ per MMBtu', () => {
    expect(btuToKwh(3412.14163)).toBeCloseTo(1, 6);
    expect(mmbtuToGigajoules(1)).toBeCloseTo(1.05505585262, 10);
  });
});
