/**
 * The moisture in outdoor air, as the latent part of an infiltration load needs it: the
 * saturation vapour pressure of water (over ice below 0 °C), the humidity ratio of air with a
 * given dew point at a station's pressure, and that ratio in grains per pound.
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1 (Psychrometrics): eq. 5 and 6 (the
 * Hyland–Wexler saturation pressure over ice and over liquid water), eq. 20 (humidity ratio
 * from the vapour's partial pressure, 0.621945 being the ratio of the molar masses of water
 * and dry air), and the statement that the partial pressure at the dew point is the
 * saturation pressure at the dew point.
 */
import { requireInRange } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';

/** Grains in a pound. Exact by definition (1 grain = 1/7000 lb, NIST Handbook 44). */
export const GRAINS_PER_POUND = 7000;

/** Ratio of the molar masses of water and dry air. Published: ASHRAE HoF 2017 ch. 1 eq. 20. */
export const WATER_TO_DRY_AIR_MOLAR_MASS_RATIO = 0.621945;

/** 0 °C in kelvin. Exact by definition. */
const KELVIN_MINUS_CELSIUS = 273.15;

/**
 * Hyland–Wexler coefficients over ice, −100 to 0 °C, T in K, p in Pa. Published: ASHRAE HoF
 * 2017 ch. 1 eq. 5: ln p_ws = C1/T + C2 + C3·T + C4·T² + C5·T³ + C6·T⁴ + C7·ln T.
 */
const OVER_ICE = {
  c1: -5.6745359e3,
  c2: 6.3925247,
  c3: -9.677843e-3,
  c4: 6.2215701e-7,
  c5: 2.0747825e-9,
  c6: -9.484024e-13,
  c7: 4.1635019,
} as const;

/**
 * Hyland–Wexler coefficients over liquid water, 0 to 200 °C, T in K, p in Pa. Published:
 * ASHRAE HoF 2017 ch. 1 eq. 6: ln p_ws = C8/T + C9 + C10·T + C11·T² + C12·T³ + C13·ln T.
 */
const OVER_WATER = {
  c8: -5.8002206e3,
  c9: 1.3914993,
  c10: -4.8640239e-2,
  c11: 4.1764768e-5,
  c12: -1.4452093e-8,
  c13: 6.5459673,
} as const;

/** The span of the two equations, °C (eq. 5 from −100, eq. 6 up to 200). */
const SATURATION_BOUNDS_C = { min: -100, max: 200, unit: '°C' };

/**
 * Station pressures accepted, Pa: the weather readers' span (310–1200 mbar), which holds
 * every inhabited altitude and catches kPa or mbar given as Pa.
 */
const STATION_PRESSURE_BOUNDS_PA = { min: 31_000, max: 120_000, unit: 'Pa' };

/**
 * Saturation pressure of water vapour, over ice below 0 °C and over liquid water from 0 °C.
 *
 * @param temperatureC - temperature, °C (−100 to 200)
 * @returns saturation pressure, Pa (611.2 at 0 °C, 3169.2 at 25 °C)
 *
 * Notes: ln p_ws = C1/T + C2 + C3·T + C4·T² + C5·T³ + C6·T⁴ + C7·ln T over ice and
 * ln p_ws = C8/T + C9 + C10·T + C11·T² + C12·T³ + C13·ln T over water, T in K. The handbook
 * gives ice for −100 to 0 °C and water for 0 to 200 °C; 0 °C itself is taken over water
 * (the two agree there within 0.01 %).
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5 and 6 (Hyland & Wexler 1983).
 */
export function saturationVaporPressurePa(temperatureC: number): number {
  requireInRange('temperatureC', temperatureC, SATURATION_BOUNDS_C);
  const t = temperatureC + KELVIN_MINUS_CELSIUS;
  if (temperatureC < 0) {
    const { c1, c2, c3, c4, c5, c6, c7 } = OVER_ICE;
    return Math.exp(
      c1 / t + c2 + c3 * t + c4 * t ** 2 + c5 * t ** 3 + c6 * t ** 4 + c7 * Math.log(t),
    );
  }
  const { c8, c9, c10, c11, c12, c13 } = OVER_WATER;
  return Math.exp(c8 / t + c9 + c10 * t + c11 * t ** 2 + c12 * t ** 3 + c13 * Math.log(t));
}

/**
 * Humidity ratio of moist air from the partial pressure of its water vapour.
 *
 * @param vaporPressurePa - partial pressure of the vapour, Pa (at least 0, below the total)
 * @param pressurePa - total (station) pressure, Pa (31,000 to 120,000)
 * @returns humidity ratio W, lb water per lb dry air (equally kg/kg)
 *
 * Notes: W = 0.621945·p_w / (p − p_w).
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 20.
 */
export function humidityRatioFromVaporPressure(
  vaporPressurePa: number,
  pressurePa: number,
): number {
  requireInRange('pressurePa', pressurePa, STATION_PRESSURE_BOUNDS_PA);
  if (!Number.isFinite(vaporPressurePa) || vaporPressurePa < 0 || vaporPressurePa >= pressurePa) {
    throw InputError.at(
      'vaporPressurePa',
      `expected a vapour pressure from 0 Pa to below the total pressure ${pressurePa} Pa, got ${vaporPressurePa}`,
    );
  }
  return (WATER_TO_DRY_AIR_MOLAR_MASS_RATIO * vaporPressurePa) / (pressurePa - vaporPressurePa);
}

/**
 * Humidity ratio of air with a given dew point (frost point below 0 °C) at a given pressure.
 *
 * @param dewPointC - dew-point temperature, °C (−100 to 200, and its saturation pressure
 *   below the total pressure)
 * @param pressurePa - station pressure, Pa (31,000 to 120,000)
 * @returns humidity ratio W, lb water per lb dry air (equally kg/kg)
 *
 * Notes: p_w = p_ws(t_dp); W = 0.621945·p_w / (p − p_w).
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5, 6 and 20.
 */
export function humidityRatioFromDewPoint(dewPointC: number, pressurePa: number): number {
  requireInRange('dewPointC', dewPointC, SATURATION_BOUNDS_C);
  return humidityRatioFromVaporPressure(saturationVaporPressurePa(dewPointC), pressurePa);
}

/**
 * Humidity ratio of air at a dry-bulb and relative humidity, e.g. an indoor design condition.
 *
 * @param options.dryBulbC - dry-bulb temperature, °C (−100 to 200)
 * @param options.relativeHumidityPct - relative humidity, % (0 to 100)
 * @param options.pressurePa - total pressure, Pa (31,000 to 120,000)
 * @returns humidity ratio W, lb water per lb dry air
 *
 * Notes: p_w = φ·p_ws(t); W = 0.621945·p_w / (p − p_w).
 *
 * References: ASHRAE Handbook—Fundamentals 2017, ch. 1, eq. 5, 6, 20 and 24 (relative
 * humidity as p_w / p_ws).
 */
export function humidityRatioFromRelativeHumidity(options: {
  dryBulbC: number;
  relativeHumidityPct: number;
  pressurePa: number;
}): number {
  requireInRange('relativeHumidityPct', options.relativeHumidityPct, {
    min: 0,
    max: 100,
    unit: '%',
  });
  const saturationPa = saturationVaporPressurePa(options.dryBulbC);
  return humidityRatioFromVaporPressure(
    (options.relativeHumidityPct / 100) * saturationPa,
    options.pressurePa,
  );
}

/**
 * A humidity ratio in grains of water per pound of dry air.
 *
 * @param humidityRatio - lb water per lb dry air
 * @returns grains per lb (7000 grains to the pound)
 */
export function grainsPerPound(humidityRatio: number): number {
  return humidityRatio * GRAINS_PER_POUND;
}
