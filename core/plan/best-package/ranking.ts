/**
 * How the search ranks packages, on their figures in whole cents: the rules of
 * `comparePackages` (core/plan/best-package.ts), and whether packages a bound describes could
 * still beat the best one found.
 */
import type { CellOutlook } from './bounds.ts';
import { compareCentRatios } from './step-cents.ts';

/** A package's exact figures, cents. */
export interface PackageCents {
  /** Positions of its energy measures in the canonical order, ascending. */
  positions: number[];
  /** Its energy measures' PV, a year's savings and cost. */
  pvCents: number;
  annualCents: number;
  costCents: number;
  fanNeeded: boolean;
}

export interface Ranking {
  /** Everything the package costs: energy and health-and-safety measures and the fan. */
  totalCostCents(entry: PackageCents): number;
  npvCents(entry: PackageCents): number;
  /** Negative when a ranks above b. */
  compare(a: PackageCents, b: PackageCents): number;
  /**
   * Whether packages below `node` with this outlook could beat `best`: a higher score (in
   * whole cents for 'npv' and 'savings', so an upper bound of x means at most floor(100x)
   * cents), or an equal one at a lower cost or with no more measures (a package below costs
   * at least the node, its cheapest added measure and the fan when it pays it). SIR ties are
   * left open.
   */
  mayWin(options: {
    best: PackageCents;
    node: PackageCents;
    cheapestAddedCents: number;
    outlook: CellOutlook;
  }): boolean;
}

/** The ranking of one query. */
export function packageRanking(options: {
  objective: 'npv' | 'savings' | 'sir';
  health: { pvCents: number; annualCents: number; costCents: number };
  fanCents: number;
}): Ranking {
  const { objective, health, fanCents } = options;
  const totalCostCents = (entry: PackageCents) =>
    health.costCents + entry.costCents + (entry.fanNeeded ? fanCents : 0);
  const npvCents = (entry: PackageCents) => health.pvCents + entry.pvCents - totalCostCents(entry);
  // 'npv' and 'savings' in cents; 'sir' with a null SIR below every number.
  const compareScores = (a: PackageCents, b: PackageCents): number => {
    if (objective === 'npv') return npvCents(b) - npvCents(a);
    if (objective === 'savings') return b.annualCents - a.annualCents;
    if (a.costCents === 0 || b.costCents === 0) {
      return (a.costCents === 0 ? 1 : 0) - (b.costCents === 0 ? 1 : 0);
    }
    return compareCentRatios(a.pvCents, a.costCents, b.pvCents, b.costCents);
  };
  return {
    totalCostCents,
    npvCents,
    compare(a, b) {
      const order = compareScores(a, b) || totalCostCents(a) - totalCostCents(b);
      if (order !== 0) return order;
      if (a.positions.length !== b.positions.length) return a.positions.length - b.positions.length;
      for (let index = 0; index < a.positions.length; index += 1) {
        const difference = (a.positions[index] ?? 0) - (b.positions[index] ?? 0);
        if (difference !== 0) return difference;
      }
      return 0;
    },
    mayWin({ best, node, cheapestAddedCents, outlook }) {
      if (objective === 'sir') {
        if (best.costCents === 0) return outlook.score > -Infinity;
        const bestRatio = best.pvCents / best.costCents;
        return outlook.score >= bestRatio - 1e-12 * Math.abs(bestRatio) - 1e-15;
      }
      const scoreCents = Math.floor(outlook.score * 100 + 1e-7);
      const bestCents =
        objective === 'npv' ? npvCents(best) : health.annualCents + best.annualCents;
      if (scoreCents !== bestCents) return scoreCents > bestCents;
      const addedCents = Math.max(
        cheapestAddedCents,
        Math.ceil(outlook.leastCostUsd * 100 * (1 - 1e-9) - 1e-6),
      );
      const fanPaidCents = outlook.fanPaid && !node.fanNeeded ? fanCents : 0;
      const leastCost = totalCostCents(node) + addedCents + fanPaidCents;
      const bestCost = totalCostCents(best);
      if (leastCost !== bestCost) return leastCost < bestCost;
      return node.positions.length + 1 <= best.positions.length;
    },
  };
}
