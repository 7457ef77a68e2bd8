/**
 * What a year's energy costs as a function of the house's total CFM50, cut into cells, for
 * the search's bounds. Only for the methods whose natural infiltration is linear in the total
 * (nFactor, lblBasic, ashrae622: CFM50/N; ELA ∝ CFM50; 0.052·Q50·wsf·(H/8.2)^0.4), where every
 * energy figure of a state depends on its total c alone.
 *
 * Why the cells hold. With natural infiltration q_s = k_s·c by season, the fan flow
 * F(c) = max(existing, 62.2 need(c)) (need Q − κc balanced, Q − κ²c²/Q unbalanced, κc the
 * credited infiltration; it never rises with c), the air charged Φ_s = F + q_s (balanced) or
 * hypot(F, q_s) (Φ = q_s without fans), heating fuel and cooling kWh linear in Φ with
 * coefficients ≥ 0 (u_h, u_c per cfm), and the added fan's kWh β·(F − existing), a year's
 * heating dollars h(c) and electricity dollars e(c) are G(q(c), F(c)) with G non-decreasing
 * in both (prices ≥ 0). For c in a cell [lo, hi], q(c) ≥ q(lo) and F(c) ≥ F(hi), so
 *   (i) h(c) ≥ G_h(q(lo), F(hi)) and e(c) ≥ G_e(q(lo), F(hi)): the cell's lower bounds.
 *   (ii) For lo ≤ b < a ≤ hi: Φ(a) − Φ(b) = [Φ(q(a), F(a)) − Φ(q(a), F(b))] +
 *   [Φ(q(a), F(b)) − Φ(q(b), F(b))]. In the second, ∂Φ/∂q = q/hypot(F, q) ≤ share(hi) =
 *   q(hi)/hypot(F(hi), q(hi)) (it grows with q, falls with F; 1 when balanced or fanless), so
 *   it is ≤ share(hi)·k·(a − b). In the first, F(a) ≤ F(b) and ∂Φ/∂F = F/hypot(F, q) ≥
 *   φ(hi) = F(hi)/hypot(F(hi), q(hi)) (1 when balanced), so it is ≤ −φ(hi)·(F(b) − F(a)).
 *   Where the need binds over the whole cell (need(hi) > existing), F(b) − F(a) ≥ r·(a − b)
 *   with r = κ (balanced) or 2κ²·lo/Q (unbalanced: κ²(a + b)/Q ≥ 2κ²lo/Q); elsewhere r = 0.
 *   So h(a) − h(b) ≤ ĝ_h·(a − b) with ĝ_h = price·u_h·(k_h·share_h(hi) − φ_h(hi)·r), and
 *   e(a) − e(b) ≤ ĝ_e·(a − b) with ĝ_e = price·(u_c·(k_c·share_c(hi) − φ_c(hi)·r) − β·r):
 *   signed slope bounds. Below the useful floor (thresholds.ts) no step saves air, so ĝ ≤ 0.
 * Hour by hour (a home with `hourlyWeather`) the methods stay linear in c every hour, so each
 * season's load-weighted mean flow is k·c too; the cooling season then has two means, one for
 * the sensible load and one for the latent load (`coolingLatentCfm`), each combined with the
 * fan as above, and e(c) carries both (on degree days the latent flow is the cooling flow):
 * (i) and (ii) hold term by term, each term non-decreasing in its flow.
 * The natural infiltration is taken as k·c from the model's own flow at the top (linear up
 * to float rounding), and every entry carries a 1e-9 relative margin for float rounding.
 */
import { HOURS_PER_YEAR } from '../../constants.ts';
import type { HomeModel } from '../../home-model.ts';
import type { PriceBook } from '../prices.ts';
import { usefulFloorCfm50 } from './thresholds.ts';

/** How many cells the range from 0 to the search's top CFM50 is cut into. */
export const CELL_COUNT = 1024;

/** Cells per block: the bound's walk judges a block at once before its cells. */
export const BLOCK_CELLS = 32;

/** Relative margin for float rounding on every entry of the table. */
const TABLE_MARGIN = 1e-9;

/** Watts in a kilowatt. */
const WATTS_PER_KILOWATT = 1000;

export interface EnergyCells {
  count: number;
  /** Cell i covers [i·width, (i + 1)·width] CFM50 (the last one ends at the top). */
  widthCfm50: number;
  topCfm50: number;
  /** Lower bounds over each cell of a year's heating and electricity cost, USD. */
  heatingLowUsd: Float64Array;
  electricityLowUsd: Float64Array;
  /** Upper bounds (signed) of how fast each falls per CFM50 removed in the cell, USD/CFM50. */
  heatingSlopeUsd: Float64Array;
  electricitySlopeUsd: Float64Array;
  /** Over the cells at or below each: the least low values and the largest slopes (≥ 0). */
  lowestHeatingUsd: Float64Array;
  lowestElectricityUsd: Float64Array;
  lowestTotalUsd: Float64Array;
  steepestHeatingUsd: Float64Array;
  steepestElectricityUsd: Float64Array;
  /** The same extremes over each block of BLOCK_CELLS cells (cell i is in block i / 32). */
  blockLowestHeatingUsd: Float64Array;
  blockLowestElectricityUsd: Float64Array;
  blockLowestTotalUsd: Float64Array;
  blockSteepestHeatingUsd: Float64Array;
  blockSteepestElectricityUsd: Float64Array;
}

/**
 * The cell table of a home whose method is linear in CFM50.
 *
 * @param model - the home's model
 * @param prices - its prices (float64 parts)
 * @param topCfm50 - the loosest state the search sees (after the health-and-safety work)
 */
export function buildEnergyCells(
  model: HomeModel,
  prices: PriceBook,
  topCfm50: number,
): EnergyCells {
  const count = topCfm50 > 0 ? CELL_COUNT : 0;
  const widthCfm50 = count > 0 ? topCfm50 / count : 0;
  const blocks = Math.ceil(count / BLOCK_CELLS);
  const cells: EnergyCells = {
    count,
    widthCfm50,
    topCfm50,
    heatingLowUsd: new Float64Array(count),
    electricityLowUsd: new Float64Array(count),
    heatingSlopeUsd: new Float64Array(count),
    electricitySlopeUsd: new Float64Array(count),
    lowestHeatingUsd: new Float64Array(count),
    lowestElectricityUsd: new Float64Array(count),
    lowestTotalUsd: new Float64Array(count),
    steepestHeatingUsd: new Float64Array(count),
    steepestElectricityUsd: new Float64Array(count),
    blockLowestHeatingUsd: new Float64Array(blocks).fill(Infinity),
    blockLowestElectricityUsd: new Float64Array(blocks).fill(Infinity),
    blockLowestTotalUsd: new Float64Array(blocks).fill(Infinity),
    blockSteepestHeatingUsd: new Float64Array(blocks),
    blockSteepestElectricityUsd: new Float64Array(blocks),
  };
  if (count === 0) return cells;

  const heatingPrice = prices.heating.usdPerUnitFloat;
  const electricityPrice = prices.electricity?.usdPerUnitFloat ?? 0;
  const top = model.ventilatedAirflow({ ceiling: topCfm50, wall: 0, floor: 0, flue: 0 });
  const balanced = top.balanced;
  const existingFanCfm = model.existingFanCfm;
  const fanKwhPerCfm = (top.fanWattsPerCfm * HOURS_PER_YEAR) / WATTS_PER_KILOWATT;
  const requiredCfm = top.need.requiredCfm;
  const creditPerCfm50 = top.need.infiltrationCfm / topCfm50;
  const heatingPerCfm50 = top.infiltration.heatingCfm / topCfm50;
  const coolingPerCfm50 = top.infiltration.coolingCfm / topCfm50;
  // Hour by hour the latent load has its own mean flow; on degree days it is the cooling flow.
  const latentPerCfm50 =
    (top.infiltration.coolingLatentCfm ?? top.infiltration.coolingCfm) / topCfm50;
  // Fuel and kWh per cfm of air: the energy of an air flow is proportional to it.
  const heatingUnitsPerCfm = model.energy({ heatingCfm: 1, coolingCfm: 0 }).heatingFuelUnits;
  const coolingKwhPerCfm = model.energy({
    heatingCfm: 0,
    coolingCfm: 1,
    coolingLatentCfm: 0,
  }).coolingKwh;
  const latentKwhPerCfm = model.energy({
    heatingCfm: 0,
    coolingCfm: 0,
    coolingLatentCfm: 1,
  }).coolingKwh;
  const usefulFloor = usefulFloorCfm50(model);

  const fanAt = (cfm50: number) => Math.max(existingFanCfm, model.ventilation(cfm50).fanNeedCfm);
  const combined = (infiltrationCfm: number, fanCfm: number) =>
    fanCfm === 0
      ? infiltrationCfm
      : balanced
        ? fanCfm + Math.hypot(0, infiltrationCfm)
        : Math.hypot(fanCfm, infiltrationCfm);
  // ∂Φ/∂q and ∂Φ/∂F at (q, F): the shares of (ii).
  const infiltrationShare = (infiltrationCfm: number, fanCfm: number) =>
    balanced || fanCfm === 0 || infiltrationCfm <= 0
      ? 1
      : infiltrationCfm / Math.hypot(fanCfm, infiltrationCfm);
  const fanShare = (infiltrationCfm: number, fanCfm: number) =>
    balanced ? 1 : fanCfm <= 0 ? 0 : fanCfm / Math.hypot(fanCfm, infiltrationCfm);
  // Φ(a) − Φ(b) per CFM50 at most, for a season with natural infiltration k per CFM50.
  const airSlope = (perCfm50: number, hi: number, fanHigh: number, rise: number) =>
    perCfm50 * infiltrationShare(perCfm50 * hi, fanHigh) - fanShare(perCfm50 * hi, fanHigh) * rise;

  for (let index = 0; index < count; index += 1) {
    const lo = index * widthCfm50;
    const hi = index === count - 1 ? topCfm50 : (index + 1) * widthCfm50;
    const fanHigh = fanAt(hi);
    const energy = model.energy(
      {
        heatingCfm: combined(heatingPerCfm50 * lo, fanHigh),
        coolingCfm: combined(coolingPerCfm50 * lo, fanHigh),
        coolingLatentCfm: combined(latentPerCfm50 * lo, fanHigh),
      },
      (fanHigh - existingFanCfm) * fanKwhPerCfm,
    );
    cells.heatingLowUsd[index] = energy.heatingFuelUnits * heatingPrice * (1 - TABLE_MARGIN);
    cells.electricityLowUsd[index] =
      (energy.coolingKwh + energy.ventilationFanKwh) * electricityPrice * (1 - TABLE_MARGIN);
    const binds = model.ventilation(hi).fanNeedCfm > existingFanCfm;
    const rise = !binds
      ? 0
      : balanced
        ? creditPerCfm50
        : (2 * creditPerCfm50 * creditPerCfm50 * lo) / requiredCfm;
    const heatingScale = heatingPrice * heatingUnitsPerCfm;
    const coolingScale = electricityPrice * coolingKwhPerCfm;
    const latentScale = electricityPrice * latentKwhPerCfm;
    const fanScale = electricityPrice * fanKwhPerCfm;
    const heatingSlope = heatingScale * airSlope(heatingPerCfm50, hi, fanHigh, rise);
    const electricitySlope =
      coolingScale * airSlope(coolingPerCfm50, hi, fanHigh, rise) +
      latentScale * airSlope(latentPerCfm50, hi, fanHigh, rise) -
      fanScale * rise;
    const heatingMargin = TABLE_MARGIN * heatingScale * (heatingPerCfm50 + rise);
    const electricityMargin =
      TABLE_MARGIN *
      (coolingScale * (coolingPerCfm50 + rise) +
        latentScale * (latentPerCfm50 + rise) +
        fanScale * rise);
    const saves = hi > usefulFloor;
    cells.heatingSlopeUsd[index] = saves
      ? heatingSlope + heatingMargin
      : Math.min(0, heatingSlope + heatingMargin);
    cells.electricitySlopeUsd[index] = saves
      ? electricitySlope + electricityMargin
      : Math.min(0, electricitySlope + electricityMargin);
  }
  fillRunningExtremes(cells);
  return cells;
}

/** The running minima and maxima over the cells at or below each cell, and by block. */
function fillRunningExtremes(cells: EnergyCells): void {
  let heatingLow = Infinity;
  let electricityLow = Infinity;
  let totalLow = Infinity;
  let heatingSlope = 0;
  let electricitySlope = 0;
  for (let index = 0; index < cells.count; index += 1) {
    const heating = cells.heatingLowUsd[index] ?? 0;
    const electricity = cells.electricityLowUsd[index] ?? 0;
    heatingLow = Math.min(heatingLow, heating);
    electricityLow = Math.min(electricityLow, electricity);
    totalLow = Math.min(totalLow, heating + electricity);
    heatingSlope = Math.max(heatingSlope, cells.heatingSlopeUsd[index] ?? 0);
    electricitySlope = Math.max(electricitySlope, cells.electricitySlopeUsd[index] ?? 0);
    cells.lowestHeatingUsd[index] = heatingLow;
    cells.lowestElectricityUsd[index] = electricityLow;
    cells.lowestTotalUsd[index] = totalLow;
    cells.steepestHeatingUsd[index] = heatingSlope;
    cells.steepestElectricityUsd[index] = electricitySlope;
    const block = Math.floor(index / BLOCK_CELLS);
    const least = (table: Float64Array, value: number) => {
      table[block] = Math.min(table[block] ?? Infinity, value);
    };
    const most = (table: Float64Array, value: number) => {
      table[block] = Math.max(table[block] ?? 0, value);
    };
    least(cells.blockLowestHeatingUsd, heating);
    least(cells.blockLowestElectricityUsd, electricity);
    least(cells.blockLowestTotalUsd, heating + electricity);
    most(cells.blockSteepestHeatingUsd, cells.heatingSlopeUsd[index] ?? 0);
    most(cells.blockSteepestElectricityUsd, cells.electricitySlopeUsd[index] ?? 0);
  }
}

/**
 * For measures of one life: the most their PV can fall per CFM50 removed anywhere at or below
 * each cell, max(0, hf·ĝ_h + ef·ĝ_e) over the cells up to it, USD/CFM50.
 */
export function stepSlopeCeilings(
  cells: EnergyCells,
  factors: { heating: number; electricity: number },
): Float64Array {
  const ceilings = new Float64Array(cells.count);
  let highest = 0;
  for (let index = 0; index < cells.count; index += 1) {
    const slope =
      factors.heating * (cells.heatingSlopeUsd[index] ?? 0) +
      factors.electricity * (cells.electricitySlopeUsd[index] ?? 0);
    highest = Math.max(highest, slope);
    ceilings[index] = highest;
  }
  return ceilings;
}

/** The cell holding a total CFM50 (clamped to the table). */
export function cellIndexOf(cells: EnergyCells, cfm50: number): number {
  if (cells.count === 0) return -1;
  const index = Math.floor(cfm50 / cells.widthCfm50);
  return Math.max(0, Math.min(cells.count - 1, index));
}

/** The lower end of cell `index`, CFM50. */
export function cellLowCfm50(cells: EnergyCells, index: number): number {
  return index * cells.widthCfm50;
}
