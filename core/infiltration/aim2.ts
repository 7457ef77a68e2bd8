/**
 * The enhanced infiltration model (AIM-2, the Alberta air infiltration model): natural air
 * flow from the blower-door power law, the stack effect and the wind, taking into account
 * where the leaks are.
 *
 * Location matters because stack pressure is largest at the top and bottom of a house and
 * nil at mid-height: a hole in the attic floor moves more air in winter than the same hole
 * halfway up a wall. That is why sealing attic bypasses pays differently from sealing walls,
 * and why a planner that ignores location cannot rank those measures.
 *
 * Leakage shares: R = ceiling + floor, X = ceiling − floor, Y = flue.
 *
 * How much of the station's wind reaches the house (terrain and shelter) is in
 * aim2-wind-exposure.ts; this file holds the stack and wind factors and their combination.
 */
import {
  AIR_DENSITY_STANDARD_KG_PER_M3,
  GRAVITY_M_PER_S2,
  METERS_PER_FOOT,
  METERS_PER_SECOND_PER_MPH,
  MINUTES_PER_HOUR,
} from '../constants.ts';
import { requireInRange } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import type { Foundation, LeakShares } from '../schema.ts';
import { aim2ShelterFactor, terrainWindSpeedRatio } from './aim2-wind-exposure.ts';
import type { SiteTerrain } from './aim2-wind-exposure.ts';
import type { NaturalInfiltration, ShelterClass } from './n-factor.ts';

export { aim2ShelterFactor, terrainWindSpeedRatio } from './aim2-wind-exposure.ts';
export type { SiteTerrain } from './aim2-wind-exposure.ts';

/** AIM-2 natural infiltration, with its stack and wind parts before they are combined. */
export interface Aim2Infiltration extends NaturalInfiltration {
  /** Stack-driven flow alone, cfm. */
  stackCfm: number;
  /** Wind-driven flow alone, cfm. */
  windCfm: number;
}

/**
 * Exponent on M in the stack factor. Walker & Wilson's equation is quoted with 1.2 in the
 * public implementations we could read (NREL's residential simulation code, which labels the
 * equations of Walker & Wilson 1998) and with 5/4 elsewhere; we could not read the paper
 * itself. The two give f_s within 2 % of each other while M < 0.15, as in most houses
 * (M = 0.06 for R 0.5, X 0.3, no flue; 0.14 with a 20 % flue share).
 */
const STACK_M_EXPONENT = 1.2;

/** Interaction of stack and wind flows. Published: Walker & Wilson 1998 (B = −1/3). */
const STACK_WIND_INTERACTION_B = -1 / 3;

const KELVIN_MINUS_CELSIUS = 273.15;
const SHARE_SUM_TOLERANCE = 1e-6;

interface Distribution {
  exponentN: number;
  ceilingShare: number;
  floorShare: number;
  flueShare: number;
}

/** R, X and Y from validated shares. */
function leakageDistribution(options: Distribution): { r: number; x: number; y: number } {
  const { exponentN, ceilingShare, floorShare, flueShare } = options;
  requireInRange('exponentN', exponentN, { min: 0.3, max: 1.2 });
  requireInRange('ceilingShare', ceilingShare, { min: 0, max: 1 });
  requireInRange('floorShare', floorShare, { min: 0, max: 1 });
  requireInRange('flueShare', flueShare, { min: 0, max: 1 });
  if (ceilingShare + floorShare + flueShare > 1 + SHARE_SUM_TOLERANCE) {
    throw InputError.at(
      '',
      `expected ceiling + floor + flue shares of at most 1, got ${ceilingShare + floorShare + flueShare}`,
    );
  }
  return { r: ceilingShare + floorShare, x: ceilingShare - floorShare, y: flueShare };
}

/**
 * The stack factor f_s of AIM-2: how much of the envelope's leakage the stack effect works
 * on, given where the leaks are.
 *
 * @param options.exponentN - flow exponent n
 * @param options.ceilingShare - share of leakage in the ceiling, 0–1
 * @param options.floorShare - share of leakage in the floor, 0–1
 * @param options.flueShare - share of leakage through a flue, 0–1
 * @param options.flueHeightRatio - flue top height ÷ ceiling height, Z_f (at least 1);
 *   without it the additive flue term F is left out (the flue still counts in M)
 * @returns f_s, dimensionless
 *
 * Notes: f_s = ((1 + n·R)/(n + 1))·(½ − ½·M^1.2)^(n+1) + F,
 * M = min(1, (X + (2n + 1)·Y)²/(2 − R)); with a flue,
 * F = n·Y·(Z_f − 1)^((3n−1)/3)·(1 − 3·(X_c − X)²·R^(1−n)/(2·(Z_f + 1))),
 * X_c = R + 2·(1 − R − Y)/(n + 1) − 2·Y·(Z_f − 1)ⁿ.
 *
 * References: Walker & Wilson 1998, "Field validation of algebraic equations for stack and
 * wind driven air infiltration calculations", HVAC&R Research 4(2), LBNL-42361; ASHRAE
 * Handbook of Fundamentals, enhanced model.
 */
export function aim2StackFactor(options: Distribution & { flueHeightRatio?: number }): number {
  const { r, x, y } = leakageDistribution(options);
  const n = options.exponentN;
  const m = Math.min(1, (x + (2 * n + 1) * y) ** 2 / (2 - r));
  let flueTerm = 0;
  if (y > 0 && options.flueHeightRatio !== undefined) {
    const zf = options.flueHeightRatio;
    requireInRange('flueHeightRatio', zf, { min: 1, max: 10 });
    const xCritical = r + (2 * (1 - r - y)) / (n + 1) - 2 * y * (zf - 1) ** n;
    flueTerm =
      n *
      y *
      (zf - 1) ** ((3 * n - 1) / 3) *
      (1 - (3 * (xCritical - x) ** 2 * r ** (1 - n)) / (2 * (zf + 1)));
  }
  return ((1 + n * r) / (n + 1)) * (0.5 - 0.5 * m ** STACK_M_EXPONENT) ** (n + 1) + flueTerm;
}

/**
 * The wind factor f_w of AIM-2: how much of the envelope's leakage the wind works on.
 *
 * @param options.exponentN - flow exponent n
 * @param options.ceilingShare - share of leakage in the ceiling, 0–1
 * @param options.floorShare - share of leakage in the floor, 0–1
 * @param options.flueShare - share of leakage through a flue, 0–1
 * @param options.foundation - 'basement' or 'slab' (floor leaks below the wind), or
 *   'crawlspace' (floor leaks open to the wind through the crawlspace vents)
 * @returns f_w, dimensionless
 *
 * Notes: basement or slab: f_w = 0.19·(2 − n)·(1 − ((X + R)/2)^(3/2 − Y)) − (Y/4)·(J − 2·Y·J⁴),
 * J = (X + R + 2Y)/2. Crawlspace: f_w = 0.19·(2 − n)·X_x·R_x·Y_x with X held at most 1 − 2Y,
 * R_x = 1 − R·(n/2 + 0.2), Y_x = 1 − Y/4, X_s = (1 − R)/5 − 1.5·Y,
 * X_x = 1 − |(X − X_s)/(2 − R)|^(3/2).
 *
 * References: Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361 (wind factor,
 * basement/slab and crawlspace forms); ASHRAE Handbook of Fundamentals, enhanced model.
 */
export function aim2WindFactor(options: Distribution & { foundation: Foundation }): number {
  const { r, x, y } = leakageDistribution(options);
  const n = options.exponentN;
  switch (options.foundation) {
    case 'basement':
    case 'slab': {
      const j = (x + r + 2 * y) / 2;
      return 0.19 * (2 - n) * (1 - ((x + r) / 2) ** (1.5 - y)) - (y / 4) * (j - 2 * y * j ** 4);
    }
    case 'crawlspace': {
      // Beyond this ceiling-floor difference the crawlspace wind factor no longer changes.
      const xHeld = Math.min(x, 1 - 2 * y);
      const rCrawl = 1 - r * (n / 2 + 0.2);
      const yCrawl = 1 - y / 4;
      const xShift = (1 - r) / 5 - 1.5 * y;
      const xCrawl = 1 - Math.abs((xHeld - xShift) / (2 - r)) ** 1.5;
      return 0.19 * (2 - n) * xCrawl * rCrawl * yCrawl;
    }
    default:
      throw InputError.at(
        'foundation',
        `expected "basement", "slab" or "crawlspace", got ${String(options.foundation)}`,
      );
  }
}

/**
 * Natural infiltration of a house by the enhanced model (AIM-2).
 *
 * @param options.coefficientCfmPerPaN - C of the envelope's power law, cfm/Paⁿ
 * @param options.exponentN - n of the power law
 * @param options.leakShares - shares of leakage in ceiling, walls, floor and flue (sum 1)
 * @param options.heightFt - stack height, lowest to highest leak, ft (also taken as the
 *   eave height above grade for the wind)
 * @param options.indoorTempF - indoor temperature, °F
 * @param options.deltaTF - indoor − outdoor temperature difference, °F (sign ignored)
 * @param options.windSpeedMph - wind speed at the weather station (10 m), mph
 * @param options.shelterClass - LBL shelter class, 1 to 5
 * @param options.foundation - 'basement', 'slab' or 'crawlspace'
 * @param options.volumeFt3 - conditioned volume, ft³
 * @param options.flueHeightFt - flue top above the same datum as heightFt, ft; without it
 *   the flue's extra stack draw (F) is left out, which errs low
 * @param options.siteTerrain - terrain around the house (default 'suburban')
 * @param options.airDensityKgPerM3 - outdoor air density, kg/m³ (default 1.2)
 * @returns combined natural flow (cfm), air changes (1/h), and the stack and wind flows
 *   alone (cfm)
 *
 * Notes: Q_s = C·f_s·(ρ·g·H·|ΔT|/T_in)ⁿ; Q_w = C·f_w·(ρ·(s·U_H)²/2)ⁿ with U_H the
 * eave-height wind; Q = (Q_s^(1/n) + Q_w^(1/n) + B·(Q_s·Q_w)^(1/(2n)))ⁿ, B = −1/3.
 *
 * References: Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361; ASHRAE Handbook of
 * Fundamentals, enhanced model and airflow around buildings chapter.
 */
export function aim2Infiltration(options: {
  coefficientCfmPerPaN: number;
  exponentN: number;
  leakShares: LeakShares;
  heightFt: number;
  indoorTempF: number;
  deltaTF: number;
  windSpeedMph: number;
  shelterClass: ShelterClass;
  foundation: Foundation;
  volumeFt3: number;
  flueHeightFt?: number;
  siteTerrain?: SiteTerrain;
  airDensityKgPerM3?: number;
}): Aim2Infiltration {
  const { exponentN: n, leakShares, heightFt, volumeFt3 } = options;
  requireInRange('coefficientCfmPerPaN', options.coefficientCfmPerPaN, { min: 0, max: 1e6 });
  requireInRange('heightFt', heightFt, { min: Number.MIN_VALUE, max: 1000 });
  requireInRange('indoorTempF', options.indoorTempF, { min: 32, max: 110 });
  requireInRange('deltaTF', options.deltaTF, { min: -150, max: 150 });
  requireInRange('windSpeedMph', options.windSpeedMph, { min: 0, max: 200 });
  requireInRange('volumeFt3', volumeFt3, { min: Number.MIN_VALUE, max: Infinity });
  const densityKgPerM3 = options.airDensityKgPerM3 ?? AIR_DENSITY_STANDARD_KG_PER_M3;
  requireInRange('airDensityKgPerM3', densityKgPerM3, { min: 0.5, max: 1.6 });
  for (const location of ['ceiling', 'wall', 'floor', 'flue'] as const) {
    requireInRange(`leakShares.${location}`, leakShares[location], { min: 0, max: 1 });
  }
  const shareSum = leakShares.ceiling + leakShares.wall + leakShares.floor + leakShares.flue;
  if (Math.abs(shareSum - 1) > SHARE_SUM_TOLERANCE) {
    throw InputError.at(
      'leakShares',
      `expected ceiling + wall + floor + flue = 1, got ${shareSum}`,
    );
  }

  const distribution = {
    exponentN: n,
    ceilingShare: leakShares.ceiling,
    floorShare: leakShares.floor,
    flueShare: leakShares.flue,
  };
  let flueHeightRatio: number | undefined;
  if (options.flueHeightFt !== undefined) {
    requireInRange('flueHeightFt', options.flueHeightFt, { min: heightFt, max: 10 * heightFt });
    flueHeightRatio = options.flueHeightFt / heightFt;
  }
  const stackFactor = aim2StackFactor({ ...distribution, flueHeightRatio });
  const windFactor = aim2WindFactor({ ...distribution, foundation: options.foundation });
  const shelter = aim2ShelterFactor({
    shelterClass: options.shelterClass,
    flueShare: leakShares.flue,
  });

  const heightM = heightFt * METERS_PER_FOOT;
  const indoorK = (options.indoorTempF - 32) / 1.8 + KELVIN_MINUS_CELSIUS;
  const deltaTK = Math.abs(options.deltaTF) / 1.8;
  const stackPressurePa = (densityKgPerM3 * GRAVITY_M_PER_S2 * heightM * deltaTK) / indoorK;
  const eaveWindMps =
    options.windSpeedMph *
    METERS_PER_SECOND_PER_MPH *
    terrainWindSpeedRatio({ heightFt, siteTerrain: options.siteTerrain });
  const windPressurePa = (densityKgPerM3 * (shelter * eaveWindMps) ** 2) / 2;

  const c = options.coefficientCfmPerPaN;
  const stackCfm = c * stackFactor * stackPressurePa ** n;
  const windCfm = c * windFactor * windPressurePa ** n;
  const cfmNatural =
    (stackCfm ** (1 / n) +
      windCfm ** (1 / n) +
      STACK_WIND_INTERACTION_B * (stackCfm * windCfm) ** (1 / (2 * n))) **
    n;
  return {
    cfmNatural,
    achNatural: (cfmNatural * MINUTES_PER_HOUR) / volumeFt3,
    stackCfm,
    windCfm,
  };
}
