/**
 * The enhanced model (AIM-2) for the package kernel: the flow of `aim2Infiltration` as
 * `seasonalAirflowMethod` calls it (its combination rearranged to take fewer powers, equal to
 * floating-point accuracy), with what depends only on the house
 * and the season (air density, stack pressure, eave-height wind) worked out once, and the
 * stack, wind and shelter factors, which depend on where the leakage is, from the model's own
 * functions for every state. test/core/uncertainty.test.ts holds it to the model's airflow.
 *
 * References: Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361; ASHRAE Handbook of
 * Fundamentals, enhanced model (see core/infiltration/aim2.ts).
 */
import { airDensityKgPerM3, standardPressurePa } from '../air.ts';
import { GRAVITY_M_PER_S2, METERS_PER_FOOT, METERS_PER_SECOND_PER_MPH } from '../constants.ts';
import type { HomeModel } from '../home-model.ts';
import {
  aim2ShelterFactor,
  aim2StackFactor,
  aim2WindFactor,
  terrainWindSpeedRatio,
} from '../infiltration/aim2.ts';
import type { HomeFile } from '../schema.ts';
import { DEFAULT_INDOOR_COOLING_F, DEFAULT_INDOOR_HEATING_F } from '../seasonal-airflow.ts';

/** Stack–wind interaction B of Walker & Wilson 1998, as in aim2.ts. */
const STACK_WIND_INTERACTION_B = -1 / 3;
/** 0 °C in kelvin, as in aim2.ts. */
const KELVIN_MINUS_CELSIUS = 273.15;
/** Test pressure of CFM50, Pa: C = CFM50 / 50ⁿ. */
const TEST_PRESSURE_PA = 50;

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
  const flueHeightRatio =
    house.flueHeightFt === undefined ? undefined : house.flueHeightFt / heightFt;
  // Reused option records: the factor functions read them and keep nothing.
  const stackOptions = {
    exponentN: n,
    ceilingShare: 0,
    floorShare: 0,
    flueShare: 0,
    flueHeightRatio,
  };
  const windOptions = {
    exponentN: n,
    ceilingShare: 0,
    floorShare: 0,
    flueShare: 0,
    foundation: house.foundation,
  };
  const shelterOptions = { shelterClass: house.shelterClass, flueShare: 0 };

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
    stackOptions.ceilingShare = windOptions.ceilingShare = ceilingShare;
    stackOptions.floorShare = windOptions.floorShare = floorShare;
    stackOptions.flueShare = windOptions.flueShare = shelterOptions.flueShare = flueShare;
    const stackRoot = aim2StackFactor(stackOptions) ** inverseN;
    const windRoot = aim2WindFactor(windOptions) ** inverseN;
    const shelter = aim2ShelterFactor(shelterOptions);
    const coefficient = total / testPressureToN;
    out[0] = heating ? flowOf(heating, coefficient, stackRoot, windRoot, shelter) : 0;
    out[1] = cooling ? flowOf(cooling, coefficient, stackRoot, windRoot, shelter) : 0;
  };
}
