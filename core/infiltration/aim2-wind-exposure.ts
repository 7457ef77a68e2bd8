/**
 * How much of the weather station's wind reaches a house in the enhanced model (AIM-2): the
 * wind speed carried from the station's anemometer to the eaves over the site's terrain, and
 * the shelter that nearby obstacles (and a flue standing above the roof) give.
 *
 * Leakage shares as in aim2.ts: Y = flue.
 */
import { METERS_PER_FOOT } from '../constants.ts';
import { requireInRange } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import type { ShelterClass } from './n-factor.ts';

/** Terrain around the house, for carrying the weather station's wind to the eaves. */
export type SiteTerrain = 'open' | 'suburban';

/**
 * Wind shelter coefficient of the walls by shelter class 1–5. Published: ASHRAE Handbook of
 * Fundamentals (2001, 2005), enhanced model shelter factor, no flue.
 */
const WALL_SHELTER_BY_CLASS: Record<ShelterClass, number> = {
  1: 1,
  2: 0.9,
  3: 0.7,
  4: 0.5,
  5: 0.3,
};

/**
 * A flue top stands above the roof in the open wind. Walker & Wilson weight its shelter by
 * 1.5·Y; with s_flue = 1 this reproduces the handbook's "with flue" shelter factors.
 */
const FLUE_SHELTER = 1;
const FLUE_SHELTER_WEIGHT = 1.5;

/** Height of the weather station's anemometer, m. Common practice (WMO standard 10 m). */
const MET_STATION_HEIGHT_M = 10;

/**
 * Boundary-layer exponent a and thickness δ (m) by terrain. Published: ASHRAE Handbook of
 * Fundamentals, airflow around buildings chapter (open terrain a = 0.14, δ = 270 m;
 * suburban a = 0.22, δ = 370 m); values confirmed against NREL's implementation of the same
 * table, not the handbook page itself.
 */
const TERRAIN: Record<SiteTerrain | 'metStation', { exponent: number; thicknessM: number }> = {
  metStation: { exponent: 0.14, thicknessM: 270 },
  open: { exponent: 0.14, thicknessM: 270 },
  suburban: { exponent: 0.22, thicknessM: 370 },
};

/**
 * The wind shelter factor s of AIM-2, walls and flue together.
 *
 * @param options.shelterClass - LBL shelter class, 1 (open) to 5 (very sheltered)
 * @param options.flueShare - share of leakage through a flue, 0–1
 * @returns s, dimensionless (multiplies the eave-height wind speed)
 *
 * Notes: s = s_walls·(1 − Y) + s_flue·1.5·Y, s_walls 1.00 / 0.90 / 0.70 / 0.50 / 0.30 by
 * class, s_flue = 1 (the flue top is above the roof, in the open wind).
 *
 * References: ASHRAE Handbook of Fundamentals (2001, 2005), enhanced model shelter factors;
 * Walker & Wilson 1998, HVAC&R Research 4(2).
 */
export function aim2ShelterFactor(options: {
  shelterClass: ShelterClass;
  flueShare: number;
}): number {
  const wallShelter = WALL_SHELTER_BY_CLASS[options.shelterClass];
  if (wallShelter === undefined) {
    throw InputError.at(
      'shelterClass',
      `expected a shelter class 1 to 5, got ${String(options.shelterClass)}`,
    );
  }
  requireInRange('flueShare', options.flueShare, { min: 0, max: 1 });
  const y = options.flueShare;
  return wallShelter * (1 - y) + FLUE_SHELTER * FLUE_SHELTER_WEIGHT * y;
}

/**
 * Wind speed at a height over the site's terrain, per unit of weather-station wind.
 *
 * @param options.heightFt - height above grade, ft (the eaves, for AIM-2)
 * @param options.siteTerrain - 'open' or 'suburban' (default 'suburban')
 * @returns U_H / U_met, dimensionless
 *
 * Notes: U_H = U_met·(δ_met/H_met)^a_met·(H/δ)^a; weather station at 10 m in open terrain
 * (a 0.14, δ 270 m); site open (a 0.14, δ 270 m) or suburban (a 0.22, δ 370 m).
 *
 * References: ASHRAE Handbook of Fundamentals, airflow around buildings chapter (wind speed
 * profile and boundary-layer parameters).
 */
export function terrainWindSpeedRatio(options: {
  heightFt: number;
  siteTerrain?: SiteTerrain;
}): number {
  requireInRange('heightFt', options.heightFt, { min: Number.MIN_VALUE, max: 1000 });
  const site = TERRAIN[options.siteTerrain ?? 'suburban'];
  if (site === undefined) {
    throw InputError.at(
      'siteTerrain',
      `expected "open" or "suburban", got ${String(options.siteTerrain)}`,
    );
  }
  const met = TERRAIN.metStation;
  const heightM = options.heightFt * METERS_PER_FOOT;
  return (
    (met.thicknessM / MET_STATION_HEIGHT_M) ** met.exponent *
    (heightM / site.thicknessM) ** site.exponent
  );
}
