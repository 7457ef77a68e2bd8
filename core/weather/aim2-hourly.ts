/**
 * The enhanced model (AIM-2) hour by hour over a weather year: what depends only on the hour
 * (air density, stack pressure, eave-height wind pressure) is worked out once, and a leakage
 * state then costs one power for each distinct hour that has both stack and wind.
 *
 * Notes: with S = f_s^(1/n)·P_s and W = f_w^(1/n)·s²·P_w the combination of aim2.ts,
 * (Q_s^(1/n) + Q_w^(1/n) + B·(Q_s·Q_w)^(1/(2n)))ⁿ, is C·(S + W + B·√(S·W))ⁿ (as
 * plan/kernel-aim2.ts rearranges it), so per hour it is C·(a·P_s + b·P_w + B·√(a·b)·√(P_s·P_w))ⁿ
 * with a, b of the state and P_s, P_w, √(P_s·P_w) of the hour. Three things keep the work
 * down, none of them an approximation:
 * - hours of one season with the same outdoor temperature and wind have the same flow, so
 *   they are one group carrying the sum of their weights (a TMY3 year, read to 0.1 °C and
 *   0.1 m/s, has some 1,200 groups in 8,760 hours);
 * - in a calm hour the flow is the stack flow alone, C·f_s·P_sⁿ, and with no indoor–outdoor
 *   difference the wind flow alone, C·f_w·s^(2n)·P_wⁿ: their weighted sums of P_sⁿ and P_wⁿ
 *   are taken once;
 * - the one power left is exp(n·ln x), which V8 computes in about half the time of x ** n,
 *   to within a few units in the last place.
 *
 * References: Walker & Wilson 1998, HVAC&R Research 4(2), LBNL-42361; ASHRAE Handbook of
 * Fundamentals, enhanced model (see core/infiltration/aim2.ts).
 */
import { airDensityKgPerM3, standardPressurePa } from '../air.ts';
import { GRAVITY_M_PER_S2, METERS_PER_FOOT, METERS_PER_SECOND_PER_MPH } from '../constants.ts';
import type { LeakageByLocation } from '../home-model.ts';
import { terrainWindSpeedRatio } from '../infiltration/aim2.ts';
import { shelterFunction, stackFactorFunction, windFactorFunction } from '../plan/kernel-aim2.ts';
import type { HomeFile } from '../schema.ts';
import { totalCfm50Of, weightedMean, type HourlyAirflowCfm } from './hourly-flows.ts';
import type { SeasonHours } from './season-hours.ts';
import type { WeatherYear } from './weather-year.ts';

/** Stack–wind interaction B of Walker & Wilson 1998, as in aim2.ts. */
const STACK_WIND_INTERACTION_B = -1 / 3;
/** 0 °C in kelvin, as in aim2.ts. */
const KELVIN_MINUS_CELSIUS = 273.15;
/** Test pressure of CFM50, Pa: C = CFM50 / 50ⁿ. */
const TEST_PRESSURE_PA = 50;

/** A season's hours for AIM-2: the groups with both drivers, and the single-driver sums. */
export interface Aim2Season {
  /** Groups with both a stack and a wind pressure. */
  count: number;
  stackPa: Float64Array;
  windPa: Float64Array;
  /** √(P_s·P_w), Pa. */
  crossPa: Float64Array;
  /** Σ of the group's degree-hours, °F·h. */
  weight: Float64Array;
  /** Σ of the group's excess grain-hours, grain/lb·h. */
  latentWeight: Float64Array;
  /** Σ w·P_sⁿ and Σ l·P_sⁿ over calm hours. */
  stackOnly: { sensible: number; latent: number };
  /** Σ w·P_wⁿ and Σ l·P_wⁿ over hours at the indoor temperature. */
  windOnly: { sensible: number; latent: number };
  totalWeight: number;
  totalLatentWeight: number;
}

interface Site {
  heightFt: number;
  sitePressurePa: number;
  /** Eave-height wind per mph of station wind, m/s. */
  eaveWindPerMph: number;
  exponentN: number;
}

/** Gathers a season's hours into groups and single-driver sums. */
function aim2Season(season: SeasonHours, site: Site): Aim2Season {
  const n = site.exponentN;
  const heightM = site.heightFt * METERS_PER_FOOT;
  const indoorK = (season.indoorF - 32) / 1.8 + KELVIN_MINUS_CELSIUS;
  const groupOf = new Map<number, Map<number, number>>();
  const stackPa: number[] = [];
  const windPa: number[] = [];
  const weight: number[] = [];
  const latentWeight: number[] = [];
  const stackOnly = { sensible: 0, latent: 0 };
  const windOnly = { sensible: 0, latent: 0 };
  for (let index = 0; index < season.count; index += 1) {
    const outdoorF = season.outdoorF[index]!;
    const windMph = season.windMph[index]!;
    // Outdoor air drives stack and wind; its density follows the hour's temperature.
    const densityKgPerM3 = airDensityKgPerM3(((outdoorF - 32) * 5) / 9, site.sitePressurePa);
    const deltaTK = Math.abs(season.deltaTF[index]!) / 1.8;
    const eaveWindMps = windMph * site.eaveWindPerMph;
    const stack = (densityKgPerM3 * GRAVITY_M_PER_S2 * heightM * deltaTK) / indoorK;
    const wind = (densityKgPerM3 * eaveWindMps * eaveWindMps) / 2;
    const sensible = season.weight[index]!;
    const latent = season.latentWeight[index]!;
    if (wind === 0 || stack === 0) {
      const single = wind === 0 ? stackOnly : windOnly;
      const pressureToN = (wind === 0 ? stack : wind) ** n;
      single.sensible += pressureToN * sensible;
      single.latent += pressureToN * latent;
      continue;
    }
    let byWind = groupOf.get(outdoorF);
    if (!byWind) groupOf.set(outdoorF, (byWind = new Map()));
    const group = byWind.get(windMph);
    if (group === undefined) {
      byWind.set(windMph, stackPa.length);
      stackPa.push(stack);
      windPa.push(wind);
      weight.push(sensible);
      latentWeight.push(latent);
    } else {
      weight[group]! += sensible;
      latentWeight[group]! += latent;
    }
  }
  return {
    count: stackPa.length,
    stackPa: Float64Array.from(stackPa),
    windPa: Float64Array.from(windPa),
    crossPa: Float64Array.from(stackPa, (stack, group) => Math.sqrt(stack * windPa[group]!)),
    weight: Float64Array.from(weight),
    latentWeight: Float64Array.from(latentWeight),
    stackOnly,
    windOnly,
    totalWeight: season.totalWeight,
    totalLatentWeight: season.totalLatentWeight,
  };
}

/** Both seasons' pressures (cooling null without cooling). */
export interface Aim2SeasonPressures {
  heating: Aim2Season;
  cooling: Aim2Season | null;
}

/** The state's roots and factors that every hour's flow shares. */
interface StateTerms {
  stackRoot: number;
  windRoot: number;
  cross: number;
  /** f_s, the stack-only flow per C·P_sⁿ. */
  stackFactor: number;
  /** f_w·s^(2n), the wind-only flow per C·P_wⁿ. */
  windFactor: number;
}

/**
 * Σ over a season of (flow ÷ C)·weight into sums[0] and, when asked, Σ (flow ÷ C)·latent
 * weight into sums[1] (written, not returned, so a state allocates nothing).
 */
function seasonSums(
  season: Aim2Season,
  terms: StateTerms,
  n: number,
  sums: Float64Array,
  withLatent: boolean,
): void {
  const { stackRoot, windRoot, cross } = terms;
  const { stackPa, windPa, crossPa, weight, latentWeight } = season;
  let sensible =
    terms.stackFactor * season.stackOnly.sensible + terms.windFactor * season.windOnly.sensible;
  let latent = 0;
  if (withLatent) {
    latent =
      terms.stackFactor * season.stackOnly.latent + terms.windFactor * season.windOnly.latent;
    for (let group = 0; group < season.count; group += 1) {
      const combined =
        stackRoot * stackPa[group]! + windRoot * windPa[group]! + cross * crossPa[group]!;
      const flowPerC = Math.exp(n * Math.log(combined));
      sensible += flowPerC * weight[group]!;
      latent += flowPerC * latentWeight[group]!;
    }
  } else {
    for (let group = 0; group < season.count; group += 1) {
      const combined =
        stackRoot * stackPa[group]! + windRoot * windPa[group]! + cross * crossPa[group]!;
      sensible += Math.exp(n * Math.log(combined)) * weight[group]!;
    }
  }
  sums[0] = sensible;
  sums[1] = latent;
}

/**
 * Each season's stack and wind pressures hour by hour, gathered as `aim2Hourly` works on them
 * (groups of hours with both drivers, the single-driver sums); the best package's AIM-2 bound
 * reads them too (core/plan/best-package/aim2-hourly-bins.ts).
 */
export function aim2SeasonPressures(
  home: HomeFile,
  exponentN: number,
  year: WeatherYear,
  seasons: { heating: SeasonHours; cooling: SeasonHours | null },
): Aim2SeasonPressures {
  const { house } = home;
  const site: Site = {
    heightFt: house.heightFt,
    sitePressurePa: standardPressurePa(year.elevationFt * METERS_PER_FOOT),
    eaveWindPerMph:
      METERS_PER_SECOND_PER_MPH *
      terrainWindSpeedRatio({
        heightFt: house.heightFt,
        ...(house.siteTerrain === undefined ? {} : { siteTerrain: house.siteTerrain }),
      }),
    exponentN,
  };
  return {
    heating: aim2Season(seasons.heating, site),
    cooling: seasons.cooling ? aim2Season(seasons.cooling, site) : null,
  };
}

/**
 * AIM-2 hour by hour as a function of the leakage state.
 *
 * @param home - the parsed home file (house: height, foundation, shelter, terrain, flue)
 * @param exponentN - the house's flow exponent
 * @param year - a checked weather year (its elevation sets the site pressure)
 * @param seasons - the year's heating hours and cooling hours (null without cooling)
 */
export function aim2Hourly(
  home: HomeFile,
  exponentN: number,
  year: WeatherYear,
  seasons: { heating: SeasonHours; cooling: SeasonHours | null },
): (leakage: LeakageByLocation) => HourlyAirflowCfm {
  const { house } = home;
  const n = exponentN;
  const stackFactorOf = stackFactorFunction(n, house.flueHeightFt, house.heightFt);
  const windFactorOf = windFactorFunction(n, house.foundation);
  const shelterOf = shelterFunction(house.shelterClass);
  const { heating, cooling } = aim2SeasonPressures(home, exponentN, year, seasons);
  const inverseN = 1 / n;
  const testPressureToN = TEST_PRESSURE_PA ** n;
  // Reused by every state: the returned flows are the only allocation of a call.
  const terms: StateTerms = { stackRoot: 0, windRoot: 0, cross: 0, stackFactor: 0, windFactor: 0 };
  const sums = new Float64Array(2);

  return (leakage) => {
    const total = totalCfm50Of(leakage);
    if (!(total > 0)) return { heatingCfm: 0, coolingCfm: 0, coolingLatentCfm: 0 };
    const ceilingShare = leakage.ceiling / total;
    const floorShare = leakage.floor / total;
    const flueShare = leakage.flue / total;
    // R, X and Y as aim2.ts forms them.
    const r = ceilingShare + floorShare;
    const x = ceilingShare - floorShare;
    const shelter = shelterOf(flueShare);
    const stackFactor = stackFactorOf(r, x, flueShare);
    const windFactor = windFactorOf(r, x, flueShare);
    const stackRoot = stackFactor ** inverseN;
    const windRoot = windFactor ** inverseN * shelter * shelter;
    terms.stackRoot = stackRoot;
    terms.windRoot = windRoot;
    terms.cross = STACK_WIND_INTERACTION_B * Math.sqrt(stackRoot * windRoot);
    terms.stackFactor = stackFactor;
    terms.windFactor = windFactor * shelter ** (2 * n);
    const coefficient = total / testPressureToN;
    seasonSums(heating, terms, n, sums, false);
    const heatingCfm = coefficient * weightedMean(sums[0]!, heating.totalWeight);
    if (!cooling) return { heatingCfm, coolingCfm: 0, coolingLatentCfm: 0 };
    seasonSums(cooling, terms, n, sums, true);
    return {
      heatingCfm,
      coolingCfm: coefficient * weightedMean(sums[0]!, cooling.totalWeight),
      coolingLatentCfm: coefficient * weightedMean(sums[1]!, cooling.totalLatentWeight),
    };
  };
}
