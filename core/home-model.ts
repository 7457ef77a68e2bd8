/**
 * A home ready to be planned: its test-in leakage split by location, and the functions that
 * turn any leakage state into seasonal infiltration, energy and the 62.2 ventilation need,
 * by the infiltration method the home file chose.
 */
import {
  annualEnergyOfAirflow,
  seasonTotalsOfClimate,
  type AnnualEnergy,
  type EnergyContext,
  type SeasonalAirflowCfm,
  type SeasonTotals,
} from './energy.ts';
import { HOURS_PER_YEAR } from './constants.ts';
import {
  combinedAirflowCfm,
  effectiveAnnualInfiltrationCfm,
  requiredVentilationCfm,
  ventilationFanNeedCfm,
} from './infiltration/ashrae-622.ts';
import type { LeakageFit } from './leakage.ts';
import type { Aim2SeasonPressures } from './weather/aim2-hourly.ts';
import { LEAK_LOCATIONS, type HomeFile, type LeakLocation, type LeakShares } from './schema.ts';
import { seasonalAirflowMethod } from './seasonal-airflow.ts';

/** CFM50 at each leak location; their sum is the house's CFM50. */
export type LeakageByLocation = Readonly<Record<LeakLocation, number>>;

/**
 * Leak shares assumed when the home file gives none: half the leakage in the walls, a quarter
 * each in ceiling and floor (R = 0.5, X = 0), no flue. This is the distribution behind ASHRAE's
 * tabulated enhanced-model coefficients (ASHRAE HoF ventilation and infiltration chapter).
 */
export const DEFAULT_LEAK_SHARES: LeakShares = { ceiling: 0.25, wall: 0.5, floor: 0.25, flue: 0 };

/** Fan power when none is given, W/cfm. From memory: efficient bath fans move about 3 cfm/W. */
export const DEFAULT_FAN_WATTS_PER_CFM = 0.33;

/** Watts in a kilowatt, to turn W·h into kWh. Exact by definition. */
const WATTS_PER_KILOWATT = 1000;

/**
 * Where the model's weather comes from: the climate's degree days and season means, or a
 * year of hourly weather worked hour by hour.
 */
export type ClimateBasis =
  | { kind: 'degreeDays'; climateName: string }
  | {
      kind: 'hourly';
      /** The weather year's name (its place, as the stored climate names it). */
      weatherName: string;
      hours: number;
      heatingBalancePointF: number;
      coolingBalancePointF: number;
    };

/** A home's hourly weather, made ready for the model (core/weather/hourly-climate.ts). */
export interface HourlyClimate {
  basis: Extract<ClimateBasis, { kind: 'hourly' }>;
  /** Degree days at the balance points and the latent hours, from the hours. */
  seasons: SeasonTotals;
  /** Natural infiltration of a leakage state: each season's mean weighted as its load. */
  airflowOf(leakage: LeakageByLocation): SeasonalAirflowCfm;
  /** AIM-2 only: the seasons' hourly pressures and weights, worked out when asked for. */
  aim2Pressures?: () => Aim2SeasonPressures;
}

/** The 62.2 check for one leakage level. */
export interface VentilationNeed {
  requiredCfm: number;
  /** 62.2 effective annual infiltration credited; 0 when no wsf is known. */
  infiltrationCfm: number;
  fanNeedCfm: number;
  infiltrationCreditTaken: boolean;
}

export interface HomeModel {
  readonly home: HomeFile;
  readonly exponentN: number;
  readonly testIn: LeakageByLocation;
  readonly testInCfm50: number;
  /** The leakage the plan may not go below, CFM50. */
  readonly floorCfm50: number;
  readonly energyContext: EnergyContext;
  /** Degree days (or hours) the year's loads are summed over. */
  readonly climateBasis: ClimateBasis;
  /** An AIM-2 home planned hour by hour: its seasons' hourly pressures (null otherwise). */
  readonly hourlyAim2Pressures: (() => Aim2SeasonPressures) | null;
  /** Fan flow the house already runs continuously, cfm. */
  readonly existingFanCfm: number;
  /** Natural infiltration of a leakage state, by season. */
  airflow(leakage: LeakageByLocation): SeasonalAirflowCfm;
  /** The energy of seasonal air flows, with fans using `ventilationFanKwh`. */
  energy(airflow: SeasonalAirflowCfm, ventilationFanKwh?: number): AnnualEnergy;
  /** The 62.2 check at a leakage level. */
  ventilation(cfm50: number): VentilationNeed;
  /**
   * The outdoor air of a leakage state with the ventilation 62.2 asks for at that level:
   * natural infiltration by the chosen method, the fan flow (the larger of the fans the house
   * runs and the 62.2 fan need), the two combined, and the power of the fan flow beyond the
   * existing fans. `energyOf` values exactly these flows.
   */
  ventilatedAirflow(leakage: LeakageByLocation): VentilatedAirflow;
  /**
   * The year's energy of a leakage state with the ventilation 62.2 asks for at that level:
   * the combined flows and added fan power of `ventilatedAirflow`. Valuing every step this way
   * charges each measure with the ventilation its tightening calls for.
   */
  energyOf(leakage: LeakageByLocation): AnnualEnergy;
}

/** The outdoor air of one leakage state as the model values it. */
export interface VentilatedAirflow {
  /** Natural infiltration by the home's infiltration method, by season, cfm. */
  infiltration: SeasonalAirflowCfm;
  /** The 62.2 check at the state's CFM50. */
  need: VentilationNeed;
  /** Continuous fan flow: max(existing fans, 62.2 fan need), cfm. */
  fanCfm: number;
  /** Whether the fan flow is balanced (added whole) or not (added in quadrature). */
  balanced: boolean;
  /** Infiltration and fan flow combined, by season (cooling 0 when the home does not cool), cfm. */
  combined: SeasonalAirflowCfm;
  /** Fan power per flow used for the added fan, W/cfm. */
  fanWattsPerCfm: number;
  /** Electricity of the fan flow beyond the existing fans over a year, kWh. */
  addedFanKwh: number;
}

/** Total CFM50 of a leakage state. */
export function totalCfm50(leakage: LeakageByLocation): number {
  return LEAK_LOCATIONS.reduce((total, location) => total + leakage[location], 0);
}

/**
 * Leak shares to assume when the home file gives none: the default split, adjusted so each
 * location holds at least what the work scope expects to remove there. An auditor who writes
 * "fireplace damper: 200 CFM50" has seen a leak at the flue; the assumption must not deny it.
 *
 * @param options.cfm50 - test-in CFM50
 * @param options.expectedByLocation - Σ of the likely CFM50 reductions of the measures at
 *   each location (those estimated directly or by units)
 * @returns shares summing to 1
 */
export function assumedLeakShares(options: {
  cfm50: number;
  expectedByLocation: Readonly<Partial<Record<LeakLocation, number>>>;
}): LeakShares {
  const { cfm50, expectedByLocation } = options;
  if (cfm50 <= 0) return { ...DEFAULT_LEAK_SHARES };
  const expectedShare = (location: LeakLocation) =>
    Math.max(0, expectedByLocation[location] ?? 0) / cfm50;
  const totalExpected = LEAK_LOCATIONS.reduce((sum, location) => sum + expectedShare(location), 0);
  if (totalExpected >= 1) {
    // The scope expects to remove everything: split by what it expects at each location.
    return Object.fromEntries(
      LEAK_LOCATIONS.map((location) => [location, expectedShare(location) / totalExpected]),
    ) as LeakShares;
  }
  // Locations the scope needs more of are raised to what it expects; the others share what
  // is left in the default proportions.
  const raised = LEAK_LOCATIONS.filter(
    (location) => expectedShare(location) > DEFAULT_LEAK_SHARES[location],
  );
  const raisedTotal = raised.reduce((sum, location) => sum + expectedShare(location), 0);
  const others = LEAK_LOCATIONS.filter((location) => !raised.includes(location));
  const othersDefault = others.reduce((sum, location) => sum + DEFAULT_LEAK_SHARES[location], 0);
  if (othersDefault === 0) {
    return Object.fromEntries(
      LEAK_LOCATIONS.map((location) => [location, expectedShare(location) / totalExpected]),
    ) as LeakShares;
  }
  return Object.fromEntries(
    LEAK_LOCATIONS.map((location) => [
      location,
      raised.includes(location)
        ? expectedShare(location)
        : (DEFAULT_LEAK_SHARES[location] / othersDefault) * (1 - raisedTotal),
    ]),
  ) as LeakShares;
}

/**
 * Builds the model of a parsed home from its test-in fit.
 *
 * @param leakShares - where the test-in leakage is; the home file's own when it gives them
 */
export function buildHomeModel(
  home: HomeFile,
  testIn: LeakageFit,
  leakShares: LeakShares,
  hourly?: HourlyClimate,
): HomeModel {
  const shares = leakShares;
  const testInByLocation = Object.fromEntries(
    LEAK_LOCATIONS.map((location) => [location, testIn.cfm50 * shares[location]]),
  ) as Record<LeakLocation, number>;
  const exponentN = testIn.exponentN;
  const airflowOf = hourly ? hourly.airflowOf : seasonalAirflowMethod(home, exponentN);
  const climateBasis: ClimateBasis = hourly
    ? hourly.basis
    : { kind: 'degreeDays', climateName: home.climate.name };
  const energyContext: EnergyContext = {
    seasons: hourly ? hourly.seasons : seasonTotalsOfClimate(home.climate),
    heating: home.heating,
    cooling: home.cooling ?? null,
    electricityKgCo2PerKwh: home.emissions?.electricityKgCo2PerKwh ?? 0,
  };
  const requiredCfm = requiredVentilationCfm({
    floorAreaFt2: home.house.conditionedFloorAreaFt2,
    bedrooms: home.house.bedrooms,
  });
  const balanced = home.ventilation?.fanType === 'balanced';
  const wsf = home.climate.wsf;
  const existingFanCfm = home.ventilation?.existingFanCfm ?? 0;
  const fanWattsPerCfm = home.ventilation?.fanWattsPerCfm ?? DEFAULT_FAN_WATTS_PER_CFM;
  const hasCooling = Boolean(home.cooling);

  const ventilation = (cfm50: number): VentilationNeed => {
    const infiltrationCfm =
      wsf === undefined
        ? 0
        : effectiveAnnualInfiltrationCfm({ cfm50, wsf, heightFt: home.house.heightFt });
    return {
      requiredCfm,
      infiltrationCfm,
      fanNeedCfm: ventilationFanNeedCfm({ requiredCfm, infiltrationCfm, balanced }),
      infiltrationCreditTaken: wsf !== undefined,
    };
  };
  const withFan = (infiltrationCfm: number, fanCfm: number) =>
    fanCfm === 0
      ? infiltrationCfm
      : combinedAirflowCfm({
          infiltrationCfm,
          balancedFanCfm: balanced ? fanCfm : 0,
          unbalancedFanCfm: balanced ? 0 : fanCfm,
        });

  const ventilatedAirflow = (leakage: LeakageByLocation): VentilatedAirflow => {
    const infiltration = airflowOf(leakage);
    const need = ventilation(totalCfm50(leakage));
    const fanCfm = Math.max(existingFanCfm, need.fanNeedCfm);
    return {
      infiltration,
      need,
      fanCfm,
      balanced,
      combined: {
        heatingCfm: withFan(infiltration.heatingCfm, fanCfm),
        coolingCfm: hasCooling ? withFan(infiltration.coolingCfm, fanCfm) : 0,
        ...(infiltration.coolingLatentCfm === undefined
          ? {}
          : {
              coolingLatentCfm: hasCooling ? withFan(infiltration.coolingLatentCfm, fanCfm) : 0,
            }),
      },
      fanWattsPerCfm,
      addedFanKwh:
        ((fanCfm - existingFanCfm) * fanWattsPerCfm * HOURS_PER_YEAR) / WATTS_PER_KILOWATT,
    };
  };

  return {
    home,
    exponentN,
    testIn: testInByLocation,
    // The sum of the parts, so every later figure is summed the same way.
    testInCfm50: totalCfm50(testInByLocation),
    floorCfm50: Math.min(home.leakageFloorCfm50 ?? 0, testIn.cfm50),
    energyContext,
    climateBasis,
    hourlyAim2Pressures: hourly?.aim2Pressures ?? null,
    existingFanCfm,
    airflow: airflowOf,
    energy: (airflow, ventilationFanKwh = 0) =>
      annualEnergyOfAirflow(energyContext, airflow, ventilationFanKwh),
    ventilation,
    ventilatedAirflow,
    energyOf(leakage) {
      const flows = ventilatedAirflow(leakage);
      return annualEnergyOfAirflow(energyContext, flows.combined, flows.addedFanKwh);
    },
  };
}
