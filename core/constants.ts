/**
 * Physical and trade constants used across the core, each with where it comes from.
 *
 * Marks used in the comments:
 * - "published": the named source states the value;
 * - "derived": computed here from published values;
 * - "common practice": a fact of the trade with no single source;
 * - "from memory": recalled, not checked against the source.
 */

/** Standard atmospheric pressure at sea level, Pa. Published: ASHRAE HoF 2017 ch. 1. */
export const SEA_LEVEL_PRESSURE_PA = 101_325;

/** Standard atmospheric pressure at sea level, psia. Published: ASHRAE HoF 2017 ch. 1. */
export const SEA_LEVEL_PRESSURE_PSIA = 14.696;

/**
 * Density of standard air used by the trade's leakage-area formulas, kg/m³.
 * Published: ASHRAE HoF ventilation and infiltration chapter (ρ = 1.2 kg/m³).
 */
export const AIR_DENSITY_STANDARD_KG_PER_M3 = 1.2;

/** Density of sea-level standard air, lb/ft³. Common practice (ASHRAE load calculations). */
export const AIR_DENSITY_STANDARD_LB_PER_FT3 = 0.075;

/** Specific heat of moist air at constant pressure, Btu/(lb·°F). Common practice. */
export const AIR_SPECIFIC_HEAT_BTU_PER_LB_F = 0.24;

/**
 * Sensible heat capacity of sea-level standard air per volume, Btu/(ft³·°F):
 * 0.075 lb/ft³ × 0.24 Btu/(lb·°F). Derived; the 1.08 Btu/(h·cfm·°F) of load calculations is
 * this × 60 min/h.
 */
export const AIR_HEAT_CAPACITY_BTU_PER_FT3_F =
  AIR_DENSITY_STANDARD_LB_PER_FT3 * AIR_SPECIFIC_HEAT_BTU_PER_LB_F;

/**
 * Latent heat factor of infiltration air, Btu/(h·cfm·grain/lb): 0.68 at sea level.
 * Published: ASHRAE HoF load calculation chapter (q = 0.68·cfm·Δgr); constant from memory.
 */
export const AIR_LATENT_BTU_PER_HOUR_CFM_GRAIN = 0.68;

/** Minutes in an hour and hours in a day, named so unit conversions read as what they are. */
export const MINUTES_PER_HOUR = 60;
export const HOURS_PER_DAY = 24;
export const HOURS_PER_YEAR = 8760;

/** Length and area conversions. Exact by definition (NIST SP 811). */
export const METERS_PER_FOOT = 0.3048;
export const SQUARE_METERS_PER_SQUARE_FOOT = METERS_PER_FOOT * METERS_PER_FOOT;
export const SQUARE_CM_PER_SQUARE_INCH = 6.4516;
export const CUBIC_METERS_PER_CUBIC_FOOT = METERS_PER_FOOT ** 3;

/** 1 cfm in m³/s: 0.3048³ m³ / 60 s. Derived from the exact foot. */
export const CUBIC_METERS_PER_SECOND_PER_CFM = CUBIC_METERS_PER_CUBIC_FOOT / MINUTES_PER_HOUR;

/** 1 cfm in L/s. Derived. */
export const LITERS_PER_SECOND_PER_CFM = CUBIC_METERS_PER_SECOND_PER_CFM * 1000;

/** Miles per hour in metres per second: 1609.344 m / 3600 s. Exact by definition. */
export const METERS_PER_SECOND_PER_MPH = 1609.344 / 3600;

/** Btu per kWh. Published: U.S. EIA, "British thermal units (Btu)" (3,412 Btu/kWh). */
export const BTU_PER_KWH = 3412;

/** Btu per MMBtu. */
export const BTU_PER_MMBTU = 1_000_000;

/** Standard gravity, m/s². Exact by definition (CGPM 1901). */
export const GRAVITY_M_PER_S2 = 9.80665;

/** Reference pressure of the blower-door test, Pa. Common practice (CFM50). */
export const TEST_PRESSURE_PA = 50;

/**
 * Flow exponent assumed for a one-point test. From memory: ASTM E1827 and ANSI/RESNET 380
 * use 0.65 where a single point is measured.
 */
export const DEFAULT_FLOW_EXPONENT = 0.65;
