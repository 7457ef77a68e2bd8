/**
 * Properties of air that the leakage and energy calculations lean on: the standard
 * atmosphere at a site's elevation, the density of dry air, and the heat a cubic foot of air
 * carries per degree.
 *
 * Thin air at altitude carries less heat per cubic foot, so the same infiltration costs less
 * in Denver than in Boston; this module is where that correction comes from.
 */
import {
  AIR_HEAT_CAPACITY_BTU_PER_FT3_F,
  METERS_PER_FOOT,
  SEA_LEVEL_PRESSURE_PA,
  SEA_LEVEL_PRESSURE_PSIA,
} from './constants.ts';
import { requireInRange } from './_lib/checks.ts';

/**
 * Coefficients of the standard-atmosphere pressure fit, ASHRAE HoF 2017 ch. 1 eq. 3:
 * p = p₀·(1 − a·Z)^5.2559, with a = 2.25577e-5 per metre, or 6.8754e-6 per foot.
 */
const ATMOSPHERE_LAPSE_PER_M = 2.25577e-5;
const ATMOSPHERE_LAPSE_PER_FT = 6.8754e-6;
const ATMOSPHERE_EXPONENT = 5.2559;

/**
 * Gas constant of dry air. Published: ASHRAE HoF 2017 ch. 1 (53.350 ft·lbf/(lb·°R) and
 * 287.042 J/(kg·K)).
 */
const DRY_AIR_GAS_CONSTANT_FT_LBF_PER_LB_R = 53.35;
const DRY_AIR_GAS_CONSTANT_J_PER_KG_K = 287.042;

/** Offsets of the absolute scales. Exact by definition. */
const RANKINE_MINUS_FAHRENHEIT = 459.67;
const KELVIN_MINUS_CELSIUS = 273.15;

/** Square inches per square foot, to turn psia (lbf/in²) into lbf/ft². Exact. */
const SQUARE_INCHES_PER_SQUARE_FOOT = 144;

/**
 * Elevations we accept, ft: from the shore of the Dead Sea (about −1400 ft) to the highest
 * towns people heat homes in. Outside this the fit is still defined, but the input is far
 * more likely to be metres typed as feet (or the reverse) than a real house.
 */
const ELEVATION_BOUNDS_FT = { min: -1500, max: 15_000, unit: 'ft' };
const ELEVATION_BOUNDS_M = {
  min: ELEVATION_BOUNDS_FT.min * METERS_PER_FOOT,
  max: ELEVATION_BOUNDS_FT.max * METERS_PER_FOOT,
  unit: 'm',
};

/** Dry-bulb temperatures we accept, °F and °C: wider than any weather a house meets. */
const DRY_BULB_BOUNDS_F = { min: -100, max: 200, unit: '°F' };
const DRY_BULB_BOUNDS_C = { min: -73, max: 93, unit: '°C' };

/**
 * Barometric pressures we accept, psia. Air at 15,000 ft is about 8.3 psia; the bounds are
 * loose on purpose and exist to catch Pa or kPa passed where psia was meant.
 */
const PRESSURE_BOUNDS_PSIA = { min: 3, max: 30, unit: 'psia' };
const PRESSURE_BOUNDS_PA = { min: 20_000, max: 210_000, unit: 'Pa' };

/**
 * Standard-atmosphere barometric pressure at an elevation, in psia.
 *
 * @param elevationFt - site elevation above sea level, ft (−1500 to 15,000)
 * @returns barometric pressure, psia
 *
 * Notes: p = 14.696·(1 − 6.8754e-6·Z)^5.2559, Z in ft.
 *
 * References: ASHRAE Handbook of Fundamentals 2017, ch. 1 (Psychrometrics), eq. 3.
 */
export function standardPressurePsia(elevationFt: number): number {
  requireInRange('elevationFt', elevationFt, ELEVATION_BOUNDS_FT);
  return (
    SEA_LEVEL_PRESSURE_PSIA * (1 - ATMOSPHERE_LAPSE_PER_FT * elevationFt) ** ATMOSPHERE_EXPONENT
  );
}

/**
 * Standard-atmosphere barometric pressure at an elevation, in Pa.
 *
 * @param elevationM - site elevation above sea level, m (−457.2 to 4572, the same span as
 *   the feet version)
 * @returns barometric pressure, Pa
 *
 * Notes: p = 101 325·(1 − 2.25577e-5·Z)^5.2559, Z in m.
 *
 * References: ASHRAE Handbook of Fundamentals 2017, ch. 1 (Psychrometrics), eq. 3.
 */
export function standardPressurePa(elevationM: number): number {
  requireInRange('elevationM', elevationM, ELEVATION_BOUNDS_M);
  return SEA_LEVEL_PRESSURE_PA * (1 - ATMOSPHERE_LAPSE_PER_M * elevationM) ** ATMOSPHERE_EXPONENT;
}

/**
 * The standard-atmosphere pressure at an elevation as a fraction of sea-level pressure.
 *
 * @param elevationFt - site elevation above sea level, ft (−1500 to 15,000)
 * @returns p/p₀, dimensionless (1 at sea level, about 0.83 at 5000 ft)
 *
 * Notes: p/p₀ = (1 − 6.8754e-6·Z)^5.2559. At equal temperature, air density scales with it.
 *
 * References: ASHRAE Handbook of Fundamentals 2017, ch. 1, eq. 3.
 */
export function pressureRatioAtElevation(elevationFt: number): number {
  return standardPressurePsia(elevationFt) / SEA_LEVEL_PRESSURE_PSIA;
}

/**
 * Sensible heat capacity of air per volume at a site's elevation, Btu/(ft³·°F).
 *
 * @param elevationFt - site elevation above sea level, ft (−1500 to 15,000)
 * @returns ρ·cp, Btu/(ft³·°F): 0.018 at sea level
 *
 * Notes: ρ·cp = 0.018·p/p₀. The sea-level 0.018 is 0.075 lb/ft³ × 0.24 Btu/(lb·°F); the
 * pressure ratio carries it to altitude at the same air temperature.
 *
 * References: ASHRAE Handbook of Fundamentals, load calculation chapters (0.018 and 1.08);
 * ASHRAE HoF 2017 ch. 1 eq. 3 (pressure ratio).
 */
export function airHeatCapacityBtuPerFt3F(elevationFt: number): number {
  return AIR_HEAT_CAPACITY_BTU_PER_FT3_F * pressureRatioAtElevation(elevationFt);
}

/**
 * Density of dry air from the ideal-gas law, IP units.
 *
 * @param dryBulbF - air temperature, °F (−100 to 200)
 * @param pressurePsia - barometric pressure, psia (3 to 30)
 * @returns density, lb of dry air per ft³
 *
 * Notes: ρ = 144·p / (R_da·(t + 459.67)), R_da = 53.350 ft·lbf/(lb·°R); the 144 turns psia
 * into lbf/ft².
 *
 * References: ASHRAE Handbook of Fundamentals 2017, ch. 1 (perfect-gas relation, R_da).
 */
export function dryAirDensityLbPerFt3(dryBulbF: number, pressurePsia: number): number {
  requireInRange('dryBulbF', dryBulbF, DRY_BULB_BOUNDS_F);
  requireInRange('pressurePsia', pressurePsia, PRESSURE_BOUNDS_PSIA);
  return (
    (SQUARE_INCHES_PER_SQUARE_FOOT * pressurePsia) /
    (DRY_AIR_GAS_CONSTANT_FT_LBF_PER_LB_R * (dryBulbF + RANKINE_MINUS_FAHRENHEIT))
  );
}

/**
 * Density of dry air from the ideal-gas law, SI units.
 *
 * @param dryBulbC - air temperature, °C (−73 to 93)
 * @param pressurePa - barometric pressure, Pa (20,000 to 210,000)
 * @returns density, kg of dry air per m³ (about 1.2 at 20 °C and sea level)
 *
 * Notes: ρ = p / (R_da·(t + 273.15)), R_da = 287.042 J/(kg·K).
 *
 * References: ASHRAE Handbook of Fundamentals 2017, ch. 1 (perfect-gas relation, R_da).
 */
export function airDensityKgPerM3(dryBulbC: number, pressurePa: number): number {
  requireInRange('dryBulbC', dryBulbC, DRY_BULB_BOUNDS_C);
  requireInRange('pressurePa', pressurePa, PRESSURE_BOUNDS_PA);
  return pressurePa / (DRY_AIR_GAS_CONSTANT_J_PER_KG_K * (dryBulbC + KELVIN_MINUS_CELSIUS));
}
