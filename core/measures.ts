/**
 * One air-sealing measure as the plan sees it: where its leak is, how much CFM50 it is
 * expected to remove (a low / likely / high range, estimated one of three ways), what it
 * costs as line items, and how long it lasts.
 */
import { InputError } from './errors.ts';
import { cfm50FromElaIn2 } from './leakage.ts';
import { SHIPPED_LIBRARY, type MeasureLookup, type MeasureType } from './measure-library.ts';
import type { Decimal } from './money.ts';
import { roundToCents, usd } from './money.ts';
import type { LeakageByLocation } from './home-model.ts';
import type { Calibration, LeakLocation, Measure, MeasureStatus, Range } from './schema.ts';

/** How the CFM50 reduction was estimated. */
export type EstimateMethod = 'direct' | 'byUnits' | 'shareOfLocation';

/** A measure's cost as line items, each in whole cents; the total is their exact sum. */
export interface MeasureCost {
  materialsUsd: Decimal;
  laborUsd: Decimal;
  markupUsd: Decimal;
  totalUsd: Decimal;
  /** The total as float64, for ranking candidates quickly. */
  totalUsdFloat: number;
  healthAndSafety: boolean;
}

/** A measure resolved against the library and the house, ready to be sequenced. */
export interface PreparedMeasure {
  id: string;
  type: MeasureType;
  location: LeakLocation;
  status: MeasureStatus;
  estimateMethod: EstimateMethod;
  /** Expected CFM50 removed, before the plan limits it to what is left. */
  estimateCfm50: Range;
  /** The realization factor the estimate was scaled by (home.calibration), when one was. */
  calibrationFactor?: number;
  cost: MeasureCost;
  lifeYears: number;
}

/**
 * The CFM50 a measure is expected to remove.
 *
 * @param measure - the measure as written in the home file
 * @param context.exponentN - the house's flow exponent (turns a 4 Pa leakage area into CFM50)
 * @param context.testIn - test-in CFM50 at each location
 * @returns low / likely / high CFM50
 *
 * Notes: direct: as given. byUnits: units × leakage area per unit (ELA, in²) × sealing
 * effectiveness, converted to CFM50 with Q50 = Q4·(50/4)ⁿ. shareOfLocation: share × test-in
 * CFM50 at the measure's location.
 */
export function estimateReductionCfm50(
  measure: Measure,
  type: MeasureType,
  context: { exponentN: number; testIn: LeakageByLocation },
): { method: EstimateMethod; range: Range } {
  if (measure.reductionCfm50) return { method: 'direct', range: { ...measure.reductionCfm50 } };
  if (measure.byUnits) {
    const area = measure.byUnits.leakageAreaIn2PerUnit ?? type.leakageAreaIn2PerUnit;
    const effectiveness = measure.byUnits.sealingEffectiveness ?? type.sealingEffectiveness;
    const units = measure.byUnits.units;
    const cfm50Of = (areaIn2: number, fraction: number) =>
      cfm50FromElaIn2(units * areaIn2 * fraction, context.exponentN);
    return {
      method: 'byUnits',
      range: {
        low: cfm50Of(area.low, effectiveness.low),
        likely: cfm50Of(area.likely, effectiveness.likely),
        high: cfm50Of(area.high, effectiveness.high),
      },
    };
  }
  if (measure.shareOfLocation) {
    const location = measure.location ?? type.location;
    const atLocation = context.testIn[location];
    const { share } = measure.shareOfLocation;
    return {
      method: 'shareOfLocation',
      range: {
        low: share.low * atLocation,
        likely: share.likely * atLocation,
        high: share.high * atLocation,
      },
    };
  }
  throw InputError.at(`measures.${measure.id}`, 'expected an estimate of the CFM50 it removes');
}

/**
 * A measure's cost from its line items.
 *
 * @param cost - materials, labour hours × rate, markup fraction, health-and-safety flag
 * @returns line items in cents and their total
 *
 * Notes: materials and labour are each rounded to the cent; markup = (materials + labour) ×
 * markup fraction, rounded to the cent; total = materials + labour + markup exactly.
 */
export function measureCost(cost: Measure['cost']): MeasureCost {
  const materialsUsd = roundToCents(usd(cost.materialsUsd));
  const laborUsd = roundToCents(usd(cost.laborHours).times(cost.laborRateUsdPerHour));
  const markupUsd = roundToCents(materialsUsd.plus(laborUsd).times(cost.markupFraction ?? 0));
  const totalUsd = materialsUsd.plus(laborUsd).plus(markupUsd);
  return {
    materialsUsd,
    laborUsd,
    markupUsd,
    totalUsd,
    totalUsdFloat: totalUsd.toNumber(),
    healthAndSafety: cost.healthAndSafety ?? false,
  };
}

/** Resolves every measure of a home against the library. */
export function prepareMeasures(
  measures: readonly Measure[],
  context: {
    exponentN: number;
    testIn: LeakageByLocation;
    library?: MeasureLookup;
    /** Realization factors by type, applied to measures not done yet (home.calibration). */
    calibration?: Calibration;
  },
): PreparedMeasure[] {
  const library = context.library ?? SHIPPED_LIBRARY;
  const factors = new Map(
    (context.calibration?.factors ?? []).map((entry) => [entry.type, entry.factor]),
  );
  return measures.map((measure, index) => {
    const type = library.find(measure.type);
    if (!type) {
      throw InputError.at(
        `measures[${index}].type`,
        `expected a measure type from the library, got "${measure.type}"`,
      );
    }
    const { method, range: estimated } = estimateReductionCfm50(measure, type, context);
    const factor = (measure.status ?? 'planned') === 'done' ? undefined : factors.get(type.id);
    const range =
      factor === undefined
        ? estimated
        : {
            low: estimated.low * factor,
            likely: estimated.likely * factor,
            high: estimated.high * factor,
          };
    return {
      id: measure.id,
      type,
      location: measure.location ?? type.location,
      status: measure.status ?? 'planned',
      estimateMethod: method,
      estimateCfm50: range,
      ...(factor === undefined ? {} : { calibrationFactor: factor }),
      cost: measureCost(measure.cost),
      lifeYears: measure.lifeYears ?? type.defaultLifeYears,
    };
  });
}
