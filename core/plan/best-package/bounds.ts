/**
 * Whether any package below a node could still beat the best one found (methods linear in
 * CFM50 only; energy-cells.ts holds the facts about energy used here). A package below node
 * X adds steps T to X's measures; they take the total from c_X down to c_f = c_X − L.
 *
 * Why it holds.
 * (a, b) remaining-measures.ts: each added measure removes at most what it would at X,
 * within what is left at each location and above the floor, and T costs at least K(L), the
 * least cost of removing L at the measures' rates within those limits.
 * (c) A step's PV is hf_j·Δh_j + ef_j·Δe_j (h, e: a year's heating and electricity dollars of
 * the state; hf, ef: the UPV* factors of its life) before rounding. With hf_j = hf_min + δʰ_j
 * and ef_j = ef_min + δᵉ_j (minima over T's measures, so δ ≥ 0), the minima's part telescopes
 * to hf_min·(h(c_X) − h(c_f)) + ef_min·(e(c_X) − e(c_f)); the rest, δʰ_j·Δh_j + δᵉ_j·Δe_j,
 * is at most the integral over the step's CFM50 of w = max(0, the largest δʰ·ĝ_h + δᵉ·ĝ_e over
 * the lives present), ĝ the cells' signed slope bounds. A year's savings telescope exactly to
 * (h + e)(c_X) − (h + e)(c_f) before rounding.
 * (d) The fan is paid exactly when the final state needs it: below the fan threshold, or
 * anywhere when X already needs it (the need never falls as the house tightens).
 * (e) Rounding: a step's figure is round(x) to the cent, half away from zero, at most
 * x + min(0.005, |x|) (x ≥ 0.005: + 0.005 ≤ x; 0 ≤ x < 0.005: 0; x < 0: at most |x|). So T's
 * figures sum to at most min(Σx + 0.005·n, Σx + Σ|x|) = min(Σx + 0.005·n, 2·Σx⁺) over its n
 * steps (n ≤ the measures that can still remove anything: the others give exactly 0), and
 * Σx⁺ is at most the integral of the positive part of the slope bounds (PV: the largest
 * hf·ĝ_h + ef·ĝ_e over the lives present; savings: ĝ_h + ĝ_e). On the flat bottom of the
 * curve this is what keeps ties of a few cents from holding the search open.
 *
 * The walk goes down the cells from c_X. For the packages whose c_f is in a cell [lo, hi]
 * (L in [L0, L1]) it bounds the score from above with h(c_f), e(c_f) ≥ the cell's low values,
 * the integral of w up to L1, T's cost ≥ K(L0) and the fan when hi is below the threshold;
 * their cost from below with K(L0) and that fan; and, with package SIR ≥ 1 and X's energy
 * cost > 0, drops the cell when PV − cost < 0 for all of them (none passes). The caller judges
 * each cell against the best package (a higher score, or an equal one at a lower cost). The
 * walk stops at the first cell that may win; where K(L0) passes the budget left (every deeper
 * cell costs more); where the measures can remove no more; or where all deeper cells together
 * cannot win, judged on one bound for them (the least low values and steepest slopes at or
 * below the cell, K at its top). A block of cells is judged the same way on entering it and
 * skipped whole when it cannot win, its integrals then taken at its steepest slopes.
 */
import type { LeakLocation } from '../../schema.ts';
import { BLOCK_CELLS, cellIndexOf, cellLowCfm50, type EnergyCells } from './energy-cells.ts';
import {
  BOUND_MARGIN,
  HALF_CENT_USD,
  costCurve,
  factorSpreads,
  type LiveMeasure,
} from './remaining-measures.ts';

/** A node as the bound sees it; money from the exact cents of its measures. */
export interface BoundNode {
  cfm50: number;
  leakage: Readonly<Record<LeakLocation, number>>;
  /** A year's heating and electricity cost at the node's state, USD. */
  heatingUsd: number;
  electricityUsd: number;
  fanNeeded: boolean;
  /** PV and cost of the node's energy measures, USD. */
  energyPvUsd: number;
  energyCostUsd: number;
  /** The package's NPV without the fan it may call for, USD. */
  openNpvUsd: number;
  /** The package's year of savings, USD. */
  annualUsd: number;
}

export interface BoundSettings {
  objective: 'npv' | 'savings' | 'sir';
  packageSirAtLeastOne: boolean;
  floorCfm50: number;
  fanThresholdCfm50: number;
  fanCostUsd: number;
  /** What the energy measures below the node may still cost, USD (Infinity: no limit). */
  budgetLeftUsd: number;
  /** The cheapest measure with a cost that may still be added, USD ('sir'). */
  leastPositiveCostUsd: number;
}

/** What the packages ending in a cell (or in a run of cells) can do at best. */
export interface CellOutlook {
  /** Upper bound of their score: NPV with the fan when paid, or savings, USD; or the SIR. */
  score: number;
  /** Lower bound of what their added measures cost, USD (the fan apart). */
  leastCostUsd: number;
  /** Whether each of them pays the fan. */
  fanPaid: boolean;
}

/** The least low values and steepest slopes (≥ 0) over a run of cells, USD. */
interface RunExtremes {
  heatingUsd: number;
  electricityUsd: number;
  totalUsd: number;
  heatingSlopeUsd: number;
  electricitySlopeUsd: number;
}

/** The extremes over every cell at or below `index`. */
function runningExtremes(cells: EnergyCells, index: number, out: RunExtremes): RunExtremes {
  out.heatingUsd = cells.lowestHeatingUsd[index] ?? 0;
  out.electricityUsd = cells.lowestElectricityUsd[index] ?? 0;
  out.totalUsd = cells.lowestTotalUsd[index] ?? 0;
  out.heatingSlopeUsd = cells.steepestHeatingUsd[index] ?? 0;
  out.electricitySlopeUsd = cells.steepestElectricityUsd[index] ?? 0;
  return out;
}

/** The extremes over every cell of a block (a superset of any part of it). */
function blockExtremes(cells: EnergyCells, block: number, out: RunExtremes): RunExtremes {
  out.heatingUsd = cells.blockLowestHeatingUsd[block] ?? 0;
  out.electricityUsd = cells.blockLowestElectricityUsd[block] ?? 0;
  out.totalUsd = cells.blockLowestTotalUsd[block] ?? 0;
  out.heatingSlopeUsd = cells.blockSteepestHeatingUsd[block] ?? 0;
  out.electricitySlopeUsd = cells.blockSteepestElectricityUsd[block] ?? 0;
  return out;
}

/** Bounds on T over a cell or a run of cells, USD. */
export interface CellTerms {
  pvUsd: number;
  savingsUsd: number;
  leastCostUsd: number;
  fanPaid: boolean;
}

/** How an objective turns a cell's terms into an outlook, or null when none there passes. */
export function outlookMaker(node: BoundNode, settings: BoundSettings, slack: number) {
  const surplusMatters = settings.packageSirAtLeastOne && node.energyCostUsd > 0;
  const surplusUsd = node.energyPvUsd - node.energyCostUsd;
  const outlook: CellOutlook = { score: 0, leastCostUsd: 0, fanPaid: false };
  return (terms: CellTerms): CellOutlook | null => {
    if (surplusMatters && surplusUsd + terms.pvUsd - terms.leastCostUsd + slack < 0) return null;
    outlook.leastCostUsd = terms.leastCostUsd;
    outlook.fanPaid = terms.fanPaid;
    switch (settings.objective) {
      case 'npv':
        outlook.score =
          node.openNpvUsd +
          terms.pvUsd -
          terms.leastCostUsd -
          (terms.fanPaid ? settings.fanCostUsd : 0) +
          slack;
        return outlook;
      case 'savings':
        outlook.score = node.annualUsd + terms.savingsUsd + slack;
        return outlook;
      case 'sir': {
        // With no energy cost at X, a package below with a number for its SIR costs at least
        // the cheapest measure with a cost; a negative numerator gives a negative SIR.
        const numerator = node.energyPvUsd + terms.pvUsd + slack;
        const denominator =
          node.energyCostUsd > 0
            ? node.energyCostUsd + terms.leastCostUsd
            : Math.max(terms.leastCostUsd, settings.leastPositiveCostUsd);
        if (denominator === Infinity || denominator <= 0) return null;
        outlook.score = numerator > 0 ? (numerator / denominator) * (1 + BOUND_MARGIN) : 0;
        return outlook;
      }
    }
  };
}

/**
 * Whether some package strictly below a node might beat the best one found: false only when
 * every cell its final state could be in is judged lost by `mayWin`.
 *
 * @param mayWin - whether packages with this outlook could beat the best package
 */
export function subtreeMayWin(
  cells: EnergyCells,
  node: BoundNode,
  measures: readonly LiveMeasure[],
  settings: BoundSettings,
  mayWin: (outlook: CellOutlook) => boolean,
): boolean {
  if (measures.length === 0) return deadEndMayWin(node, settings, mayWin);
  const spreads = factorSpreads(measures);
  const rounding = HALF_CENT_USD * measures.length;
  const slack =
    BOUND_MARGIN *
    ((spreads.heatingMost + spreads.electricityMost + 1) *
      (Math.abs(node.heatingUsd) + Math.abs(node.electricityUsd)) +
      Math.abs(node.openNpvUsd) +
      Math.abs(node.annualUsd) +
      node.energyPvUsd +
      node.energyCostUsd +
      settings.fanCostUsd +
      measures.reduce((total, measure) => total + measure.costUsd, 0) +
      1);
  const outlookOf = outlookMaker(node, settings, slack);
  const judge = (terms: CellTerms) => {
    const outlook = outlookOf(terms);
    return outlook !== null && mayWin(outlook);
  };

  const curve = costCurve(node.leakage, node.cfm50 - settings.floorCfm50, measures);
  const bottom = node.cfm50 - curve.totalCfm50;
  const budgetLeft = settings.budgetLeftUsd * (1 + BOUND_MARGIN) + 1e-9;
  let segment = 0;
  let segmentStart = 0;
  let costBefore = 0;
  // Integrals down to the current cell's top: w (the lives' excess), PV and savings rises.
  let reach = 0;
  let pvRise = 0;
  let savingsRise = 0;
  let top = node.cfm50;
  const terms: CellTerms = { pvUsd: 0, savingsUsd: 0, leastCostUsd: 0, fanPaid: false };
  // Bounds over a run of cells of `length` CFM50 from `top` down, from their extremes.
  const excessOf = (heating: number, electricity: number) =>
    (spreads.heatingMost - spreads.heatingLeast) * heating +
    (spreads.electricityMost - spreads.electricityLeast) * electricity;
  const riseOf = (heating: number, electricity: number) =>
    spreads.heatingMost * heating + spreads.electricityMost * electricity;
  const fillRun = (lowest: RunExtremes, length: number) => {
    terms.pvUsd = Math.min(
      spreads.heatingLeast * (node.heatingUsd - lowest.heatingUsd) +
        spreads.electricityLeast * (node.electricityUsd - lowest.electricityUsd) +
        reach +
        excessOf(lowest.heatingSlopeUsd, lowest.electricitySlopeUsd) * length +
        rounding,
      2 * (pvRise + riseOf(lowest.heatingSlopeUsd, lowest.electricitySlopeUsd) * length),
    );
    terms.savingsUsd = Math.min(
      node.heatingUsd + node.electricityUsd - lowest.totalUsd + rounding,
      2 * (savingsRise + (lowest.heatingSlopeUsd + lowest.electricitySlopeUsd) * length),
    );
  };
  const run: RunExtremes = {
    heatingUsd: 0,
    electricityUsd: 0,
    totalUsd: 0,
    heatingSlopeUsd: 0,
    electricitySlopeUsd: 0,
  };
  // Adds a cell's part of `length` CFM50 to the integrals of w and of the PV and savings rises.
  const integrate = (index: number, length: number) => {
    const heatingSlope = cells.heatingSlopeUsd[index] ?? 0;
    const electricitySlope = cells.electricitySlopeUsd[index] ?? 0;
    let weight = 0;
    let rise = 0;
    for (const spread of spreads.excess) {
      const excess = spread.heating * heatingSlope + spread.electricity * electricitySlope;
      weight = Math.max(weight, excess);
      rise = Math.max(
        rise,
        excess + spreads.heatingLeast * heatingSlope + spreads.electricityLeast * electricitySlope,
      );
    }
    reach += weight * length;
    pvRise += rise * length;
    savingsRise += Math.max(0, heatingSlope + electricitySlope) * length;
  };
  const first = cellIndexOf(cells, node.cfm50);
  for (let index = first; index >= 0; index -= 1) {
    const removed = node.cfm50 - top;
    while (
      segment < curve.lengthsCfm50.length &&
      segmentStart + (curve.lengthsCfm50[segment] ?? 0) <= removed
    ) {
      costBefore += (curve.lengthsCfm50[segment] ?? 0) * (curve.ratesUsdPerCfm50[segment] ?? 0);
      segmentStart += curve.lengthsCfm50[segment] ?? 0;
      segment += 1;
    }
    terms.leastCostUsd =
      costBefore + (removed - segmentStart) * (curve.ratesUsdPerCfm50[segment] ?? 0);
    if (terms.leastCostUsd > budgetLeft) return false;
    terms.fanPaid = node.fanNeeded || top < settings.fanThresholdCfm50;

    // All cells from here down at once.
    fillRun(runningExtremes(cells, index, run), top - bottom);
    if (!judge(terms)) return false;

    // The rest of this cell's block at once, on entering it.
    const block = Math.floor(index / BLOCK_CELLS);
    if (index === first || index % BLOCK_CELLS === BLOCK_CELLS - 1) {
      const blockLow = Math.max(cellLowCfm50(cells, block * BLOCK_CELLS), bottom);
      blockExtremes(cells, block, run);
      fillRun(run, top - blockLow);
      if (!judge(terms)) {
        // Its integrals at its steepest slopes: more than they are, so still bounds.
        const length = top - blockLow;
        reach += excessOf(run.heatingSlopeUsd, run.electricitySlopeUsd) * length;
        pvRise += riseOf(run.heatingSlopeUsd, run.electricitySlopeUsd) * length;
        savingsRise += (run.heatingSlopeUsd + run.electricitySlopeUsd) * length;
        if (blockLow <= bottom) return false;
        top = blockLow;
        index = block * BLOCK_CELLS;
        continue;
      }
    }

    // This cell.
    const lo = Math.max(cellLowCfm50(cells, index), bottom);
    integrate(index, top - lo);
    const heatingDrop = node.heatingUsd - (cells.heatingLowUsd[index] ?? 0);
    const electricityDrop = node.electricityUsd - (cells.electricityLowUsd[index] ?? 0);
    terms.pvUsd = Math.min(
      spreads.heatingLeast * heatingDrop +
        spreads.electricityLeast * electricityDrop +
        reach +
        rounding,
      2 * pvRise,
    );
    terms.savingsUsd = Math.min(heatingDrop + electricityDrop + rounding, 2 * savingsRise);
    if (judge(terms)) return true;
    if (lo <= bottom) return false;
    top = lo;
  }
  return false;
}

/**
 * When no measure can remove anything below the node, every step adds nothing to PV or
 * savings, so only 'sir' can still change (a cost lowers a positive SIR and can turn a null
 * one into a number).
 */
export function deadEndMayWin(
  node: BoundNode,
  settings: BoundSettings,
  mayWin: (outlook: CellOutlook) => boolean,
): boolean {
  if (settings.objective !== 'sir') return false;
  const denominator = node.energyCostUsd > 0 ? node.energyCostUsd : settings.leastPositiveCostUsd;
  if (denominator === Infinity) return false;
  const score = node.energyPvUsd > 0 ? (node.energyPvUsd / denominator) * (1 + BOUND_MARGIN) : 0;
  return mayWin({ score, leastCostUsd: 0, fanPaid: node.fanNeeded });
}
