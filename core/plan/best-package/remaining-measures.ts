/**
 * What the measures a node may still add allow below it, for the bounds (bounds.ts):
 * (a) measure j removes at most a_j, what it would remove at the node, anywhere below it —
 * min(estimate, what is left at its location, what is above the floor) only falls along a
 * path — and all of them together no more than is left at each location and above the floor;
 * (b) j costs at least κ_j = cost_j / a_j per CFM50 it removes (costs ≥ 0), so the added
 * measures cost at least K(L), the least cost of removing L at these rates within the limits
 * of (a). Those limits are caps on a laminar family (a measure inside its location inside the
 * whole), a polymatroid, on which taking the cheapest rate first, each as far as its caps
 * leave room, gives the least linear cost for every total L; K only grows with L.
 */
import type { LeakLocation } from '../../schema.ts';
import { cellIndexOf, type EnergyCells } from './energy-cells.ts';
import type { LifeFactors } from './step-cents.ts';

/** Half a cent: the most a step's figure rounds up. */
export const HALF_CENT_USD = 0.005;

/** Relative float margin on a bound's magnitude. */
export const BOUND_MARGIN = 1e-9;

/** A measure that can still remove leakage below a node. */
export interface LiveMeasure {
  index: number;
  location: LeakLocation;
  /** What it would remove at the node, CFM50 (> 0). */
  sizeCfm50: number;
  costUsd: number;
  factors: LifeFactors;
}

/** K(L) of (b) as segments of removal, cheapest rate first. */
export interface CostCurve {
  lengthsCfm50: number[];
  ratesUsdPerCfm50: number[];
  /** The most the measures can remove below the node, CFM50. */
  totalCfm50: number;
}

/**
 * K(L) of (b): the cheapest removal of each total, greedily within the limits of (a).
 *
 * @param leakage - what is left at each location at the node, CFM50
 * @param aboveFloorCfm50 - what is left above the leakage floor at the node
 */
export function costCurve(
  leakage: Readonly<Record<LeakLocation, number>>,
  aboveFloorCfm50: number,
  measures: readonly LiveMeasure[],
): CostCurve {
  const sorted = [...measures].sort(
    (a, b) => a.costUsd / a.sizeCfm50 - b.costUsd / b.sizeCfm50 || a.index - b.index,
  );
  const room = { ...leakage };
  let aboveFloor = Math.max(0, aboveFloorCfm50);
  const curve: CostCurve = { lengthsCfm50: [], ratesUsdPerCfm50: [], totalCfm50: 0 };
  for (const measure of sorted) {
    const taken = Math.min(measure.sizeCfm50, room[measure.location], aboveFloor);
    if (taken <= 0) continue;
    room[measure.location] -= taken;
    aboveFloor -= taken;
    curve.lengthsCfm50.push(taken);
    curve.ratesUsdPerCfm50.push(measure.costUsd / measure.sizeCfm50);
    curve.totalCfm50 += taken;
  }
  return curve;
}

/** The least UPV* factors of the measures, and each life's excess over them. */
export interface FactorSpreads {
  heatingLeast: number;
  electricityLeast: number;
  excess: { heating: number; electricity: number }[];
  heatingMost: number;
  electricityMost: number;
}

/** The factor spreads of the measures (bounds.ts, (c)). */
export function factorSpreads(measures: readonly LiveMeasure[]): FactorSpreads {
  let heatingLeast = Infinity;
  let electricityLeast = Infinity;
  for (const { factors } of measures) {
    heatingLeast = Math.min(heatingLeast, factors.heating);
    electricityLeast = Math.min(electricityLeast, factors.electricity);
  }
  const excess: { heating: number; electricity: number }[] = [];
  for (const { factors } of measures) {
    const heating = factors.heating - heatingLeast;
    const electricity = factors.electricity - electricityLeast;
    if (!excess.some((seen) => seen.heating === heating && seen.electricity === electricity)) {
      excess.push({ heating, electricity });
    }
  }
  return {
    heatingLeast,
    electricityLeast,
    excess,
    heatingMost: heatingLeast + Math.max(...excess.map((spread) => spread.heating)),
    electricityMost: electricityLeast + Math.max(...excess.map((spread) => spread.electricity)),
  };
}

/**
 * The most a measure's own PV can be anywhere below a node: it removes at most `sizeCfm50`
 * there (a), each CFM50 worth at most the ceiling of its life's slopes at or below the node's
 * cell (energy-cells.ts, `stepSlopeCeilings`), to half a cent.
 *
 * @param cfm50 - the node's total CFM50
 */
export function largestStepPvUsd(
  cells: EnergyCells,
  ceilings: Float64Array,
  cfm50: number,
  measure: LiveMeasure,
): number {
  const index = cellIndexOf(cells, cfm50);
  const perCfm50 = index < 0 ? 0 : (ceilings[index] ?? 0);
  return measure.sizeCfm50 * perCfm50 * (1 + BOUND_MARGIN) + HALF_CENT_USD + 1e-9;
}
