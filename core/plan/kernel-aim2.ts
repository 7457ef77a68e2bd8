/**
 * The enhanced model (AIM-2) for the package kernel: the flow of `aim2Infiltration` as
 * `seasonalAirflowMethod` calls it (its combination rearranged to take fewer powers, equal to
 * floating-point accuracy), with what depends only on the house and the season (air density,
 * stack pressure, eave-height wind) worked out once. The stack, wind and shelter factors depend
 * on where the leakage is, so they are worked out for every state: by the operations of
 * `aim2StackFactor`, `aim2WindFactor` and `aim2ShelterFactor` in the same order (so to the
 * last bit the same numbers), with the powers of house constants (n, the flue height) taken
 * once, and without their checks of shares that a leakage state cannot break (each location's
 * leakage is at least 0 and at most the total) or allocations; a Monte Carlo run values a
 * state some hundred thousand times. test/core/uncertainty.test.ts holds them to the model's
 * functions and the flow to the model's airflow.
 *
 * References: Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361; ASHRAE Handbook of
 * Fundamentals, enhanced model (see core/infiltration/aim2.ts).
 */
import { airDensityKgPerM3, standardPressurePa } from '../air.ts';
import { GRAVITY_M_PER_S2, METERS_PER_FOOT, METERS_PER_SECOND_PER_MPH } from '../constants.ts';
import type { HomeModel } from '../home-model.ts';
import { requireInRange } from '../_lib/checks.ts';
import { aim2ShelterFactor, aim2WindFactor, terrainWindSpeedRatio } from '../infiltration/aim2.ts';
import type { HomeFile } from '../schema.ts';
import { DEFAULT_INDOOR_COOLING_F, DEFAULT_INDOOR_HEATING_F } from '../seasonal-airflow.ts';

/** Stack–wind interaction B of Walker & Wilson 1998, as in aim2.ts. */
const STACK_WIND_INTERACTION_B = -1 / 3;
/** 0 °C in kelvin, as in aim2.ts. */
const KELVIN_MINUS_CELSIUS = 273.15;
/** Test pressure of CFM50, Pa: C = CFM50 / 50ⁿ. */
const TEST_PRESSURE_PA = 50;
/** Exponent on M in the stack factor, as in aim2.ts. */
const STACK_M_EXPONENT = 1.2;

type Season = NonNullable<HomeFile['climate']['heatingSeason']>;

interface SeasonTerms {
  /** ρ·g·H·ΔT/T_in, Pa. */
  stackPressurePa: number;
  densityKgPerM3: number;
  eaveWindMps: number;
}

/**
 * The AIM-2 natural infiltration of a leakage state (ceiling, wall, floor, flue CFM50), by
 * season, into `out` [heating, cooling].
 */
export type Aim2Flows = (leakage: Float64Array, totalCfm50: number, out: Float64Array) => void;

/** Builds the AIM-2 flow function of a model whose home uses the enhanced model. */
export function aim2Flows(model: HomeModel): Aim2Flows {
  const { house, climate } = model.home;
  const n = model.exponentN;
  const heightFt = house.heightFt;
  const sitePressurePa = standardPressurePa(climate.elevationFt * METERS_PER_FOOT);
  const windRatio = terrainWindSpeedRatio({
    heightFt,
    ...(house.siteTerrain === undefined ? {} : { siteTerrain: house.siteTerrain }),
  });
  const termsOf = (season: Season, kind: 'heating' | 'cooling'): SeasonTerms => {
    const indoorTempF =
      season.indoorTempF ??
      (kind === 'heating' ? DEFAULT_INDOOR_HEATING_F : DEFAULT_INDOOR_COOLING_F);
    const outdoorTempF =
      kind === 'heating' ? indoorTempF - season.meanDeltaTF : indoorTempF + season.meanDeltaTF;
    const densityKgPerM3 = airDensityKgPerM3(((outdoorTempF - 32) * 5) / 9, sitePressurePa);
    const heightM = heightFt * METERS_PER_FOOT;
    const indoorK = (indoorTempF - 32) / 1.8 + KELVIN_MINUS_CELSIUS;
    const deltaTK = Math.abs(season.meanDeltaTF) / 1.8;
    const stackPressurePa = (densityKgPerM3 * GRAVITY_M_PER_S2 * heightM * deltaTK) / indoorK;
    return {
      stackPressurePa,
      densityKgPerM3,
      eaveWindMps: season.meanWindSpeedMph * METERS_PER_SECOND_PER_MPH * windRatio,
    };
  };
  const heating = climate.heatingSeason ? termsOf(climate.heatingSeason, 'heating') : null;
  const cooling =
    model.home.cooling && climate.coolingSeason ? termsOf(climate.coolingSeason, 'cooling') : null;
  const testPressureToN = TEST_PRESSURE_PA ** n;
  const stackFactorOf = stackFactorFunction(n, house.flueHeightFt, heightFt);
  const windFactorOf = windFactorFunction(n, house.foundation);
  const shelterOf = shelterFunction(house.shelterClass);

  // Q = (Q_s^(1/n) + Q_w^(1/n) + B·(Q_s·Q_w)^(1/(2n)))ⁿ with Q_s = C·f_s·P_sⁿ and
  // Q_w = C·f_w·P_wⁿ is C·(S + W + B·√(S·W))ⁿ with S = f_s^(1/n)·P_s and W = f_w^(1/n)·P_w:
  // the same flow, with one power a season instead of four.
  const inverseN = 1 / n;
  const flowOf = (
    terms: SeasonTerms,
    coefficient: number,
    stackRoot: number,
    windRoot: number,
    shelter: number,
  ): number => {
    const windPressurePa = (terms.densityKgPerM3 * (shelter * terms.eaveWindMps) ** 2) / 2;
    const stack = stackRoot * terms.stackPressurePa;
    const wind = windRoot * windPressurePa;
    return coefficient * (stack + wind + STACK_WIND_INTERACTION_B * Math.sqrt(stack * wind)) ** n;
  };

  return (leakage, total, out) => {
    if (!(total > 0)) {
      out[0] = 0;
      out[1] = 0;
      return;
    }
    const ceilingShare = (leakage[0] ?? 0) / total;
    const floorShare = (leakage[2] ?? 0) / total;
    const flueShare = (leakage[3] ?? 0) / total;
    // R, X and Y as aim2.ts forms them.
    const r = ceilingShare + floorShare;
    const x = ceilingShare - floorShare;
    const stackRoot = stackFactorOf(r, x, flueShare) ** inverseN;
    const windRoot = windFactorOf(r, x, flueShare) ** inverseN;
    const shelter = shelterOf(flueShare);
    const coefficient = total / testPressureToN;
    out[0] = heating ? flowOf(heating, coefficient, stackRoot, windRoot, shelter) : 0;
    out[1] = cooling ? flowOf(cooling, coefficient, stackRoot, windRoot, shelter) : 0;
  };
}

/** A factor of AIM-2 from R, X and Y. */
type FactorOfShares = (r: number, x: number, y: number) => number;

/**
 * `aim2StackFactor` for one house: f_s = ((1 + n·R)/(n + 1))·(½ − ½·M^1.2)^(n+1) + F, with
 * (Z_f − 1)ⁿ and (Z_f − 1)^((3n−1)/3) taken once.
 */
export function stackFactorFunction(
  n: number,
  flueHeightFt: number | undefined,
  heightFt: number,
): FactorOfShares {
  requireInRange('exponentN', n, { min: 0.3, max: 1.2 });
  const twoNPlusOne = 2 * n + 1;
  const nPlusOne = n + 1;
  const oneMinusN = 1 - n;
  const zf = flueHeightFt === undefined ? undefined : flueHeightFt / heightFt;
  const zfMinusOneToN = zf === undefined ? 0 : (zf - 1) ** n;
  const zfMinusOneToFlueExponent = zf === undefined ? 0 : (zf - 1) ** ((3 * n - 1) / 3);
  const twiceZfPlusOne = zf === undefined ? 0 : 2 * (zf + 1);
  return (r, x, y) => {
    const m = Math.min(1, (x + twoNPlusOne * y) ** 2 / (2 - r));
    let flueTerm = 0;
    if (y > 0 && zf !== undefined) {
      if (!(zf >= 1 && zf <= 10)) requireInRange('flueHeightRatio', zf, { min: 1, max: 10 });
      const xCritical = r + (2 * (1 - r - y)) / nPlusOne - 2 * y * zfMinusOneToN;
      flueTerm =
        n *
        y *
        zfMinusOneToFlueExponent *
        (1 - (3 * (xCritical - x) ** 2 * r ** oneMinusN) / twiceZfPlusOne);
    }
    return ((1 + n * r) / nPlusOne) * (0.5 - 0.5 * m ** STACK_M_EXPONENT) ** nPlusOne + flueTerm;
  };
}

/** `aim2WindFactor` for one house and foundation; 0.19·(2 − n) taken once. */
export function windFactorFunction(n: number, foundation: HomeFile['house']['foundation']) {
  requireInRange('exponentN', n, { min: 0.3, max: 1.2 });
  const front = 0.19 * (2 - n);
  const floorWeight = n / 2 + 0.2;
  switch (foundation) {
    case 'basement':
    case 'slab':
      return (r: number, x: number, y: number): number => {
        const j = (x + r + 2 * y) / 2;
        return front * (1 - ((x + r) / 2) ** (1.5 - y)) - (y / 4) * (j - 2 * y * j ** 4);
      };
    case 'crawlspace':
      return (r: number, x: number, y: number): number => {
        // Beyond this ceiling-floor difference the crawlspace wind factor no longer changes.
        const xHeld = Math.min(x, 1 - 2 * y);
        const rCrawl = 1 - r * floorWeight;
        const yCrawl = 1 - y / 4;
        const xShift = (1 - r) / 5 - 1.5 * y;
        const xCrawl = 1 - Math.abs((xHeld - xShift) / (2 - r)) ** 1.5;
        return front * xCrawl * rCrawl * yCrawl;
      };
    default:
      // The model's own function names the field.
      return (r: number, x: number, y: number): number =>
        aim2WindFactor({
          exponentN: n,
          ceilingShare: (r + x) / 2,
          floorShare: (r - x) / 2,
          flueShare: y,
          foundation,
        });
  }
}

/**
 * `aim2ShelterFactor` for one shelter class: s = s_walls·(1 − Y) + (s_flue·1.5)·Y, its two
 * coefficients read from the model's function at Y = 0 and Y = 1 (each exact there).
 */
export function shelterFunction(shelterClass: HomeFile['house']['shelterClass']) {
  const walls = aim2ShelterFactor({ shelterClass, flueShare: 0 });
  const flue = aim2ShelterFactor({ shelterClass, flueShare: 1 });
  return (y: number): number => walls * (1 - y) + flue * y;
}
