/**
 * A fast float64 evaluation of a home's package for any CFM50 reductions of its measures: the
 * arithmetic of `applyMeasure` (each measure removes at most what is left at its location and
 * above the leakage floor), `energyOf` (natural infiltration by the home's method, the 62.2
 * fan, the equipment), `annualWorth` and `presentValueFloat`, with no Decimal and no objects
 * made per draw. Monte Carlo runs it thousands of times a home; test/core/uncertainty.test.ts
 * holds it to the exact plan.
 *
 * The N-factor, LBL basic and 62.2 methods give natural infiltration proportional to the
 * house's total CFM50 (CFM50/N; ELA ∝ CFM50 times a weather term; 0.052·Q50·wsf·(H/8.2)^0.4),
 * so the kernel keeps one coefficient per season, taken from the model itself. The enhanced
 * model (AIM-2) depends on where the leakage is: core/plan/kernel-aim2.ts computes it for
 * every state from the model's own factor functions.
 */
import { HOURS_PER_YEAR } from '../constants.ts';
import { InputError } from '../errors.ts';
import type { Evaluation } from '../evaluate.ts';
import type { HomeModel } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import { effectiveAnnualInfiltrationCfm } from '../infiltration/ashrae-622.ts';
import { roundToCents, Decimal } from '../money.ts';
import { LEAK_LOCATIONS, type LeakLocation, type Range } from '../schema.ts';
import { aim2Flows } from './kernel-aim2.ts';
import { buildPriceBook } from './prices.ts';
import { DEFAULT_FAN_COST_USD } from './ventilation-fan.ts';

/** Watts in a kilowatt. */
const WATTS_PER_KILOWATT = 1000;

/** What one draw changes besides the measures' reductions; 0 / 1 leave the home as it is. */
export interface DrawConditions {
  /** Real escalation of the heating fuel price, fraction per year. */
  heatingEscalationRate: number;
  /** Real escalation of the electricity price, fraction per year. */
  electricityEscalationRate: number;
  /** In-service heating efficiency ÷ the home file's. */
  heatingEfficiencyFactor: number;
  /** In-service cooling efficiency ÷ the home file's. */
  coolingEfficiencyFactor: number;
  /** Natural infiltration divides by this (N × factor for the N-factor method). */
  infiltrationDivisor: number;
}

/** The package's figures for one set of reductions. Reused between draws. */
export interface KernelFigures {
  cfm50After: number;
  annualSavingsUsd: number;
  pvSavingsUsd: number;
  costUsd: number;
  npvUsd: number;
  /** NaN when the package has no energy measure with a cost. */
  sir: number;
  fanAdded: boolean;
}

export interface PackageKernel {
  /** The package's measures in the order applied. */
  readonly measureIds: readonly string[];
  /** Each package measure's estimate range, CFM50. */
  readonly ranges: readonly Range[];
  /** The home's own draw conditions (its escalation rates, factors of 1). */
  readonly baseConditions: Readonly<DrawConditions>;
  /**
   * Evaluates the package.
   *
   * @param reductionsCfm50 - what each measure would remove before the location and floor
   *   limits, CFM50, in package order
   * @param conditions - escalation, efficiency and infiltration of this draw
   * @param out - where the figures go
   */
  evaluate(
    reductionsCfm50: Float64Array,
    conditions: Readonly<DrawConditions>,
    out: KernelFigures,
  ): KernelFigures;
}

/** A blank figures record to pass to `evaluate`. */
export function emptyFigures(): KernelFigures {
  return {
    cfm50After: 0,
    annualSavingsUsd: 0,
    pvSavingsUsd: 0,
    costUsd: 0,
    npvUsd: 0,
    sir: Number.NaN,
    fanAdded: false,
  };
}

/**
 * UPV* of NIST Handbook 135 in float64: ((1+e)/(d−e))·(1 − ((1+e)/(1+d))^n), n when e = d.
 * The same formula as `escalatedUniformPresentValueFactor` (Decimal).
 */
export function escalatedFactorFloat(
  discountRateReal: number,
  escalationRateReal: number,
  years: number,
): number {
  if (discountRateReal === escalationRateReal) return years;
  const growth = 1 + escalationRateReal;
  return (
    (growth / (discountRateReal - escalationRateReal)) *
    (1 - (growth / (1 + discountRateReal)) ** years)
  );
}

/**
 * √(a² + b²), the combination of a fan's and natural infiltration's air (62.2), in plain
 * arithmetic: √(1 + q²)·M with M the larger magnitude and q = m/M the smaller's ratio to it.
 * That is what V8's Math.hypot works out for two finite numbers (both scaled by the larger and
 * summed with Kahan's compensation, which is exact for two terms), bit for bit, without the
 * cost of its variadic call: a draw combines the two for every season of every step. Zeros,
 * infinities and NaN go to Math.hypot itself.
 *
 * @returns the same number as `Math.hypot(a, b)` (test/core/uncertainty.test.ts)
 */
export function hypotOfTwo(a: number, b: number): number {
  const absA = Math.abs(a);
  const absB = Math.abs(b);
  const larger = absA > absB ? absA : absB;
  const smaller = absA > absB ? absB : absA;
  if (!(larger > 0 && larger < Infinity)) return Math.hypot(a, b);
  const ratio = smaller / larger;
  return Math.sqrt(1 + ratio * ratio) * larger;
}

/**
 * Natural infiltration by season per CFM50 for the proportional methods, from the model at
 * the test-in state; null for AIM-2, whose flows depend on where the leakage is.
 */
function proportionalInfiltration(
  model: HomeModel,
): { heatingPerCfm50: number; coolingPerCfm50: number; latentPerCfm50: number } | null {
  if (model.home.infiltrationMethod === 'aim2') return null;
  const testIn = model.testInCfm50;
  const flows = model.airflow(model.testIn);
  const perCfm50 = (cfm: number) => (testIn > 0 ? cfm / testIn : 0);
  return {
    heatingPerCfm50: perCfm50(flows.heatingCfm),
    coolingPerCfm50: perCfm50(flows.coolingCfm),
    latentPerCfm50: perCfm50(flows.coolingLatentCfm ?? flows.coolingCfm),
  };
}

/**
 * AIM-2 worked hour by hour: the model's own airflow for each state (exact, and slower: a
 * year of hours a state), written into `out` [heating, cooling, latent].
 */
function hourlyAim2Flows(model: HomeModel) {
  const state: Record<LeakLocation, number> = { ceiling: 0, wall: 0, floor: 0, flue: 0 };
  return (leakage: Float64Array, out: Float64Array): void => {
    LEAK_LOCATIONS.forEach((location, index) => (state[location] = leakage[index] ?? 0));
    const flows = model.airflow(state);
    out[0] = flows.heatingCfm;
    out[1] = flows.coolingCfm;
    out[2] = flows.coolingLatentCfm ?? flows.coolingCfm;
  };
}

/**
 * Compiles an evaluated home's package into a kernel.
 *
 * @param evaluation - the home's evaluation (its model and plan)
 */
export function compilePackageKernel(
  evaluation: Pick<Evaluation, 'home' | 'model' | 'plan'>,
): PackageKernel {
  const { home, model, plan } = evaluation;
  return compileMeasuresKernel({
    home,
    model,
    measures: plan.entries.filter((entry) => entry.included).map((entry) => entry.step.measure),
  });
}

/**
 * Compiles a package given as its measures in the order applied (the plan's included ones,
 * or those `sequenceMeasures` chose) into a kernel.
 *
 * @param options.home - the parsed home file
 * @param options.model - its model
 * @param options.measures - the package's measures in the order applied
 */
export function compileMeasuresKernel(options: {
  home: Evaluation['home'];
  model: HomeModel;
  measures: readonly PreparedMeasure[];
}): PackageKernel {
  const { home, model } = options;
  const prices = buildPriceBook(home);
  const included = options.measures;
  const count = included.length;

  const locationIndex = new Uint8Array(count);
  const costUsd = new Float64Array(count);
  const energyMeasure = new Uint8Array(count);
  const lives = [...new Set(included.map((measure) => measure.lifeYears))];
  const lifeIndex = new Uint16Array(count);
  included.forEach((measure, index) => {
    locationIndex[index] = LEAK_LOCATIONS.indexOf(measure.location);
    costUsd[index] = measure.cost.totalUsdFloat;
    energyMeasure[index] = measure.cost.healthAndSafety ? 0 : 1;
    lifeIndex[index] = lives.indexOf(measure.lifeYears);
  });
  const lifeYears = Float64Array.from(lives);

  const discountRateReal = prices.discountRateReal;
  const heatingPrice = prices.heating.usdPerUnitFloat;
  const electricityPrice = prices.electricity?.usdPerUnitFloat ?? null;
  const baseConditions: DrawConditions = {
    heatingEscalationRate: prices.heating.escalationRateReal,
    electricityEscalationRate: prices.electricity?.escalationRateReal ?? 0,
    heatingEfficiencyFactor: 1,
    coolingEfficiencyFactor: 1,
    infiltrationDivisor: 1,
  };
  // The factors of the home's own rates, exactly as the price book gives them.
  const baseHeatingFactors = Float64Array.from(lives, (life) =>
    prices.presentValueFloat(1, 0, life),
  );
  const baseElectricityFactors = Float64Array.from(lives, (life) =>
    prices.presentValueFloat(0, 1, life),
  );
  const drawHeatingFactors = new Float64Array(lives.length);
  const drawElectricityFactors = new Float64Array(lives.length);

  // Energy per cfm of seasonal air flow: annualEnergyOfAirflow is proportional in each flow.
  // Hour by hour the latent load has its own mean flow, so cooling is valued in two parts.
  const hourly = model.climateBasis.kind === 'hourly';
  const heatingUnitsPerCfm = model.energy({ heatingCfm: 1, coolingCfm: 0 }).heatingFuelUnits;
  const coolingKwhPerCfm = hourly
    ? model.energy({ heatingCfm: 0, coolingCfm: 1, coolingLatentCfm: 0 }).coolingKwh
    : model.energy({ heatingCfm: 0, coolingCfm: 1 }).coolingKwh;
  const latentKwhPerCfm = hourly
    ? model.energy({ heatingCfm: 0, coolingCfm: 0, coolingLatentCfm: 1 }).coolingKwh
    : 0;
  const hasCooling = Boolean(home.cooling);

  // The 62.2 check, as model.ventilation computes it.
  const requiredCfm = model.ventilation(model.testInCfm50).requiredCfm;
  const wsf = home.climate.wsf;
  const creditPerCfm50 =
    wsf === undefined
      ? 0
      : effectiveAnnualInfiltrationCfm({ cfm50: 1, wsf, heightFt: home.house.heightFt });
  const balanced = home.ventilation?.fanType === 'balanced';
  const existingFanCfm = model.existingFanCfm;
  const fanWattsPerCfm = model.ventilatedAirflow(model.testIn).fanWattsPerCfm;
  const fanCostUsd = roundToCents(
    new Decimal(home.ventilation?.fanCostUsd ?? DEFAULT_FAN_COST_USD),
  ).toNumber();
  const floorCfm50 = model.floorCfm50;
  const testIn = Float64Array.from(LEAK_LOCATIONS, (location) => model.testIn[location]);

  // A local copy: under a CommonJS transform every read of an imported binding is a call.
  const hoursPerYear = HOURS_PER_YEAR;
  const proportional = proportionalInfiltration(model);
  const heatingPerCfm50 = proportional?.heatingPerCfm50 ?? 0;
  const coolingPerCfm50 = proportional?.coolingPerCfm50 ?? 0;
  const latentPerCfm50 = proportional?.latentPerCfm50 ?? 0;
  const aim2 = proportional || hourly ? null : aim2Flows(model);
  const aim2Hourly = !proportional && hourly ? hourlyAim2Flows(model) : null;
  const leakage = new Float64Array(LEAK_LOCATIONS.length);
  // Heating, cooling and (hour by hour) latent natural infiltration of the state, cfm.
  const flows = new Float64Array(3);
  // The state of the leakage last valued: heating units, cooling kWh, added-fan kWh.
  const state = new Float64Array(3);

  const fanNeedOf = (total: number): number => {
    const credit = creditPerCfm50 * total;
    const superposition = balanced ? 1 : credit / requiredCfm;
    return Math.max(0, requiredCfm - superposition * credit);
  };
  const withFan = (infiltrationCfm: number, fanCfm: number): number =>
    fanCfm === 0
      ? infiltrationCfm
      : balanced
        ? fanCfm + hypotOfTwo(0, infiltrationCfm)
        : hypotOfTwo(fanCfm, infiltrationCfm);

  /** The natural infiltration of the leakage in `leakage` into `flows`. */
  const infiltrationOf = (total: number): void => {
    if (aim2 !== null) {
      aim2(leakage, total, flows);
    } else if (aim2Hourly !== null) {
      aim2Hourly(leakage, flows);
    } else {
      flows[0] = heatingPerCfm50 * total;
      flows[1] = coolingPerCfm50 * total;
      flows[2] = latentPerCfm50 * total;
    }
  };
  /** Values the leakage in `leakage` into `state`, as model.energyOf does. */
  const valueState = (total: number, conditions: Readonly<DrawConditions>): void => {
    infiltrationOf(total);
    valueFlows(total, conditions);
  };
  // Dividing by 1 and multiplying 0 give the same numbers as leaving the operation out, and
  // most draws of a portfolio vary neither efficiency nor N: those operations are skipped.
  const divided = (value: number, divisor: number): number =>
    divisor === 1 ? value : value / divisor;
  const valueFlows = (total: number, conditions: Readonly<DrawConditions>): void => {
    const divisor = conditions.infiltrationDivisor;
    const heatingInfiltration = divided(flows[0] ?? 0, divisor);
    const coolingInfiltration = divided(flows[1] ?? 0, divisor);
    const fanCfm = Math.max(existingFanCfm, fanNeedOf(total));
    const heatingCfm = withFan(heatingInfiltration, fanCfm);
    const coolingCfm = hasCooling ? withFan(coolingInfiltration, fanCfm) : 0;
    state[0] = divided(heatingUnitsPerCfm * heatingCfm, conditions.heatingEfficiencyFactor);
    const coolingKwh = hourly
      ? coolingKwhPerCfm * coolingCfm +
        (hasCooling ? latentKwhPerCfm * withFan(divided(flows[2] ?? 0, divisor), fanCfm) : 0)
      : coolingKwhPerCfm * coolingCfm;
    state[1] = divided(coolingKwh, conditions.coolingEfficiencyFactor);
    state[2] =
      fanCfm === existingFanCfm
        ? 0
        : ((fanCfm - existingFanCfm) * fanWattsPerCfm * hoursPerYear) / WATTS_PER_KILOWATT;
  };

  const sumLeakage = (): number =>
    (leakage[0] ?? 0) + (leakage[1] ?? 0) + (leakage[2] ?? 0) + (leakage[3] ?? 0);

  leakage.set(testIn);
  const testInTotal = sumLeakage();
  infiltrationOf(testInTotal);
  const testInFlows = Float64Array.from(flows);
  valueFlows(testInTotal, baseConditions);
  const testInState = Float64Array.from(state);

  return {
    measureIds: included.map((measure) => measure.id),
    ranges: included.map((measure) => ({ ...measure.estimateCfm50 })),
    baseConditions,
    evaluate(reductionsCfm50, conditions, out) {
      let heatingFactors = baseHeatingFactors;
      let electricityFactors = baseElectricityFactors;
      if (
        conditions.heatingEscalationRate !== baseConditions.heatingEscalationRate ||
        conditions.electricityEscalationRate !== baseConditions.electricityEscalationRate
      ) {
        heatingFactors = drawHeatingFactors;
        electricityFactors = drawElectricityFactors;
        for (let index = 0; index < lifeYears.length; index += 1) {
          const life = lifeYears[index] ?? 0;
          heatingFactors[index] = escalatedFactorFloat(
            discountRateReal,
            conditions.heatingEscalationRate,
            life,
          );
          electricityFactors[index] = escalatedFactorFloat(
            discountRateReal,
            conditions.electricityEscalationRate,
            life,
          );
        }
      }
      // The test-in state's natural infiltration is the same in every draw, and so is its
      // energy unless the draw changes efficiency or infiltration.
      leakage[0] = testIn[0] ?? 0;
      leakage[1] = testIn[1] ?? 0;
      leakage[2] = testIn[2] ?? 0;
      leakage[3] = testIn[3] ?? 0;
      let total = testInTotal;
      let heatingUnits = testInState[0] ?? 0;
      let coolingKwh = testInState[1] ?? 0;
      let fanKwh = testInState[2] ?? 0;
      if (
        conditions.infiltrationDivisor !== 1 ||
        conditions.heatingEfficiencyFactor !== 1 ||
        conditions.coolingEfficiencyFactor !== 1
      ) {
        flows[0] = testInFlows[0] ?? 0;
        flows[1] = testInFlows[1] ?? 0;
        flows[2] = testInFlows[2] ?? 0;
        valueFlows(total, conditions);
        heatingUnits = state[0] ?? 0;
        coolingKwh = state[1] ?? 0;
        fanKwh = state[2] ?? 0;
      }
      let cfm50After = total;
      let annualUsd = 0;
      let pvUsd = 0;
      let packageCostUsd = 0;
      let sirSavingsUsd = 0;
      let sirInvestmentUsd = 0;
      for (let index = 0; index < count; index += 1) {
        const location = locationIndex[index] ?? 0;
        const wanted = Math.max(0, reductionsCfm50[index] ?? 0);
        const left = leakage[location] ?? 0;
        const aboveFloor = Math.max(0, total - floorCfm50);
        const applied = Math.min(wanted, left, aboveFloor);
        cfm50After = total - applied;
        const measureCost = costUsd[index] ?? 0;
        packageCostUsd += measureCost;
        if (energyMeasure[index] === 1) sirInvestmentUsd += measureCost;
        if (applied === 0) continue;
        leakage[location] = left - applied;
        total = sumLeakage();
        valueState(total, conditions);
        const savedHeatingUnits = heatingUnits - (state[0] ?? 0);
        const savedElectricKwh = coolingKwh - (state[1] ?? 0) + (fanKwh - (state[2] ?? 0));
        heatingUnits = state[0] ?? 0;
        coolingKwh = state[1] ?? 0;
        fanKwh = state[2] ?? 0;
        const heatingUsd = savedHeatingUnits * heatingPrice;
        let electricityUsd = 0;
        if (savedElectricKwh !== 0) {
          if (electricityPrice === null) {
            throw InputError.at(
              'prices.electricity',
              'is required for cooling and ventilation fans: expected { usdPerUnit } per kWh',
            );
          }
          electricityUsd = savedElectricKwh * electricityPrice;
        }
        const life = lifeIndex[index] ?? 0;
        const stepPvUsd =
          heatingUsd * (heatingFactors[life] ?? 0) +
          (electricityUsd === 0 ? 0 : electricityUsd * (electricityFactors[life] ?? 0));
        annualUsd += heatingUsd + electricityUsd;
        pvUsd += stepPvUsd;
        if (energyMeasure[index] === 1) sirSavingsUsd += stepPvUsd;
      }
      const fanAdded = fanNeedOf(total) > existingFanCfm;
      if (fanAdded) packageCostUsd += fanCostUsd;
      out.cfm50After = count === 0 ? model.testInCfm50 : cfm50After;
      out.annualSavingsUsd = annualUsd;
      out.pvSavingsUsd = pvUsd;
      out.costUsd = packageCostUsd;
      out.npvUsd = pvUsd - packageCostUsd;
      out.sir = sirInvestmentUsd > 0 ? sirSavingsUsd / sirInvestmentUsd : Number.NaN;
      out.fanAdded = fanAdded;
      return out;
    },
  };
}
