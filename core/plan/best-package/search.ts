/**
 * The exact depth-first search over packages (see core/plan/best-package.ts for what a package
 * is and how it is ranked). A node is a package: its measures, its state after them and its
 * figures in whole cents (step-cents.ts), so scores and ties compare exactly. Its children
 * each add one later measure in the canonical order; they are valued first and visited best
 * first, so a good package is known early. A subtree is left out only when nothing in it can
 * win:
 * - a child over the budget, or (with the option) failing its own SIR ≥ 1, which later steps
 *   cannot change;
 * - a measure that removes nothing at a node removes nothing anywhere below it (what it can
 *   remove only falls along a path), so adding it leaves the state, and every later step's
 *   figures, exactly as they were: for 'npv' and 'savings' the package without it scores the
 *   same or more, costs no more, has fewer measures and meets every constraint it meets, so
 *   it is never added ('sir' only when it costs nothing, since a cost can raise a negative
 *   SIR or turn a null one into a number);
 * - with every measure SIR ≥ 1, a measure whose largest PV below the node is under its cost
 *   (energy-cells.ts's slope ceilings, or bounds-aim2.ts's box: the box of all the measures
 *   that can still remove anything holds every state below the node);
 * - a subtree whose bound (bounds.ts for the methods linear in CFM50, bounds-aim2.ts for aim2
 *   on degree-day seasons) cannot beat the best package found, or can at most tie it while
 *   costing more or having more measures.
 */
import { totalCfm50, type HomeModel } from '../../home-model.ts';
import type { PreparedMeasure } from '../../measures.ts';
import type { PriceBook } from '../prices.ts';
import { applyMeasure, stateAfter, type PlanState } from '../step.ts';
import {
  largestStepPvAim2Usd,
  stepSlopes,
  subtreeBox,
  subtreeMayWinAim2,
  type Aim2Bound,
} from './bounds-aim2.ts';
import { subtreeMayWin, type BoundNode, type BoundSettings, type CellOutlook } from './bounds.ts';
import { stepSlopeCeilings, type EnergyCells } from './energy-cells.ts';
import { packageRanking, type PackageCents, type Ranking } from './ranking.ts';
import { largestStepPvUsd, type LiveMeasure } from './remaining-measures.ts';
import { stepCents, type LifeFactors } from './step-cents.ts';

export type { PackageCents } from './ranking.ts';

export interface SearchSetup {
  model: HomeModel;
  prices: PriceBook;
  /** The energy measures in canonical order. */
  energy: readonly PreparedMeasure[];
  objective: 'npv' | 'savings' | 'sir';
  budgetCents: number;
  everyMeasureSirAtLeastOne: boolean;
  packageSirAtLeastOne: boolean;
  /** The state after the health-and-safety measures. */
  root: PlanState;
  /** The health-and-safety measures' figures, cents. */
  health: { pvCents: number; annualCents: number; costCents: number };
  fanCents: number;
  /** The bounds' energy table (methods linear in CFM50), or null. */
  cells: EnergyCells | null;
  /** The AIM-2 bound (aim2 on degree-day seasons), or null. */
  aim2: Aim2Bound | null;
  fanThresholdCfm50: number;
}

export interface SearchOutcome {
  best: PackageCents;
  nodesVisited: number;
}

interface SearchNode extends PackageCents {
  state: PlanState;
  cfm50: number;
  next: number;
}

interface MeasureFacts {
  measure: PreparedMeasure;
  costCents: number;
  costUsd: number;
  factors: LifeFactors;
  /** The most its PV can fall per CFM50 at or below each cell (every-SIR cut), or null. */
  slopeCeilings: Float64Array | null;
}

/** What the search keeps of each energy measure. */
function measureFacts(setup: SearchSetup): MeasureFacts[] {
  const { prices, cells } = setup;
  const ceilingsByLife = new Map<number, Float64Array>();
  return setup.energy.map((measure) => {
    const factors = {
      heating: prices.presentValueFloat(1, 0, measure.lifeYears),
      electricity: prices.presentValueFloat(0, 1, measure.lifeYears),
    };
    let slopeCeilings: Float64Array | null = null;
    if (cells !== null && setup.everyMeasureSirAtLeastOne) {
      slopeCeilings = ceilingsByLife.get(measure.lifeYears) ?? stepSlopeCeilings(cells, factors);
      ceilingsByLife.set(measure.lifeYears, slopeCeilings);
    }
    return {
      measure,
      costCents: measure.cost.totalUsd.times(100).toNumber(),
      costUsd: measure.cost.totalUsdFloat,
      factors,
      slopeCeilings,
    };
  });
}

/** A node as the bound sees it. */
function boundNodeOf(setup: SearchSetup, node: SearchNode): BoundNode {
  const { prices, health } = setup;
  const energy = node.state.energy;
  const electricityPrice = prices.electricity?.usdPerUnitFloat ?? 0;
  return {
    cfm50: node.cfm50,
    leakage: node.state.leakage,
    heatingUsd: energy.heatingFuelUnits * prices.heating.usdPerUnitFloat,
    electricityUsd: (energy.coolingKwh + energy.ventilationFanKwh) * electricityPrice,
    fanNeeded: node.fanNeeded,
    energyPvUsd: node.pvCents / 100,
    energyCostUsd: node.costCents / 100,
    openNpvUsd: (health.pvCents + node.pvCents - health.costCents - node.costCents) / 100,
    annualUsd: (health.annualCents + node.annualCents) / 100,
  };
}

/** The measures a node may still add, and those of them that can remove anything. */
interface Candidates {
  indices: number[];
  live: LiveMeasure[];
  cheapestCents: number;
  cheapestPositiveUsd: number;
}

/** The cuts of the first three kinds in the top comment, at one node. */
function candidatesAt(
  setup: SearchSetup,
  facts: readonly MeasureFacts[],
  node: SearchNode,
): Candidates {
  const aboveFloor = Math.max(0, node.cfm50 - setup.model.floorCfm50);
  const found: Candidates = {
    indices: [],
    live: [],
    cheapestCents: Infinity,
    cheapestPositiveUsd: Infinity,
  };
  for (let index = node.next; index < facts.length; index += 1) {
    const fact = facts[index];
    if (fact === undefined || node.costCents + fact.costCents > setup.budgetCents) continue;
    const { measure } = fact;
    // What applyMeasure would remove here.
    const size = Math.min(
      Math.max(0, measure.estimateCfm50.likely),
      node.state.leakage[measure.location],
      aboveFloor,
    );
    if (size <= 0 && (setup.objective !== 'sir' || fact.costCents === 0)) continue;
    if (size > 0) {
      const live: LiveMeasure = {
        index,
        location: measure.location,
        sizeCfm50: size,
        costUsd: fact.costUsd,
        factors: fact.factors,
      };
      if (setup.cells !== null && fact.slopeCeilings !== null && fact.costCents > 0) {
        const largest = largestStepPvUsd(setup.cells, fact.slopeCeilings, node.cfm50, live);
        if (largest < fact.costUsd) continue;
      }
      found.live.push(live);
    }
    found.indices.push(index);
  }
  if (setup.aim2 !== null && setup.everyMeasureSirAtLeastOne && found.live.length > 0) {
    dropAim2Losers(setup.aim2, facts, node, found);
  }
  for (const index of found.indices) {
    const fact = facts[index];
    if (fact === undefined) continue;
    found.cheapestCents = Math.min(found.cheapestCents, fact.costCents);
    if (fact.costCents > 0) {
      found.cheapestPositiveUsd = Math.min(found.cheapestPositiveUsd, fact.costUsd);
    }
  }
  return found;
}

/** The every-SIR cut on AIM-2: drops the measures whose largest PV in the box is under cost. */
function dropAim2Losers(
  bound: Aim2Bound,
  facts: readonly MeasureFacts[],
  node: SearchNode,
  found: Candidates,
): void {
  const box = subtreeBox(bound, node.state.leakage, found.live);
  if (box === null) return;
  const removable = found.live.reduce((total, live) => total + live.sizeCfm50, 0);
  const bottom = Math.max(bound.model.floorCfm50, node.cfm50 - removable);
  const slopes = stepSlopes(bound, box, node.cfm50, bottom);
  const losers = new Set<number>();
  for (const live of found.live) {
    const fact = facts[live.index];
    if (fact === undefined || fact.costCents === 0) continue;
    if (largestStepPvAim2Usd(slopes, live) < fact.costUsd) losers.add(live.index);
  }
  if (losers.size === 0) return;
  found.live = found.live.filter((live) => !losers.has(live.index));
  found.indices = found.indices.filter((index) => !losers.has(index));
}

/** The exact search. */
export function searchPackages(setup: SearchSetup): SearchOutcome {
  const { model, prices, objective } = setup;
  const facts = measureFacts(setup);
  const ranking: Ranking = packageRanking(setup);
  const fanNeededAt = (cfm50: number) => model.ventilation(cfm50).fanNeedCfm > model.existingFanCfm;
  const meetsPackageSir = (entry: PackageCents) =>
    !setup.packageSirAtLeastOne || entry.costCents === 0 || entry.pvCents >= entry.costCents;
  const rootCfm50 = totalCfm50(setup.root.leakage);
  let best: PackageCents = {
    positions: [],
    pvCents: 0,
    annualCents: 0,
    costCents: 0,
    fanNeeded: fanNeededAt(rootCfm50),
  };
  let nodesVisited = 1;

  /** Whether the bound leaves a package below the node that could win (linear methods). */
  const boundAllows = (node: SearchNode, found: Candidates): boolean => {
    if (setup.cells === null && setup.aim2 === null) return true;
    const settings: BoundSettings = {
      objective,
      packageSirAtLeastOne: setup.packageSirAtLeastOne,
      floorCfm50: model.floorCfm50,
      fanThresholdCfm50: setup.fanThresholdCfm50,
      fanCostUsd: setup.fanCents / 100,
      budgetLeftUsd: (setup.budgetCents - node.costCents) / 100,
      leastPositiveCostUsd: found.cheapestPositiveUsd,
    };
    const mayWin = (outlook: CellOutlook) =>
      ranking.mayWin({ best, node, cheapestAddedCents: found.cheapestCents, outlook });
    const boundNode = boundNodeOf(setup, node);
    return setup.cells !== null
      ? subtreeMayWin(setup.cells, boundNode, found.live, settings, mayWin)
      : setup.aim2 !== null
        ? subtreeMayWinAim2(setup.aim2, boundNode, found.live, settings, mayWin)
        : true;
  };

  const childrenOf = (node: SearchNode): SearchNode[] => {
    const found = candidatesAt(setup, facts, node);
    if (found.indices.length === 0 || !boundAllows(node, found)) return [];
    const children: SearchNode[] = [];
    for (const index of found.indices) {
      const fact = facts[index];
      if (fact === undefined) continue;
      const outcome = applyMeasure(model, node.state, fact.measure);
      nodesVisited += 1;
      const cents = stepCents(prices, outcome, fact.factors);
      if (setup.everyMeasureSirAtLeastOne && fact.costCents > 0 && cents.pvCents < fact.costCents) {
        continue;
      }
      const state = stateAfter(outcome);
      const cfm50 = totalCfm50(state.leakage);
      children.push({
        state,
        cfm50,
        next: index + 1,
        positions: [...node.positions, index],
        pvCents: node.pvCents + cents.pvCents,
        annualCents: node.annualCents + cents.annualCents,
        costCents: node.costCents + fact.costCents,
        fanNeeded: fanNeededAt(cfm50),
      });
    }
    return children.sort(ranking.compare);
  };

  const visit = (node: SearchNode): void => {
    if (meetsPackageSir(node) && ranking.compare(node, best) < 0) best = node;
    for (const child of childrenOf(node)) visit(child);
  };
  visit({ ...best, state: setup.root, cfm50: rootCfm50, next: 0 });
  const { positions, pvCents, annualCents, costCents, fanNeeded } = best;
  return { best: { positions, pvCents, annualCents, costCents, fanNeeded }, nodesVisited };
}
