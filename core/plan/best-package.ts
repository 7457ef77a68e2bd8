/**
 * The best package of a home's measures within a budget, found by exact search.
 *
 * What a package is. The canonical order is the order of the plan's entries with declined
 * measures dropped: the health-and-safety measures first (in the order given), then the
 * measures the plan takes (in the order it takes them), then those it leaves out (ranked on
 * what the package left). A package is every health-and-safety measure plus any subset of the
 * other measures (the energy measures), applied in the canonical order, each step on what the
 * earlier steps of the package left, exactly as the plan applies its steps (`applyMeasure`:
 * never more than is left at the location, never below the leakage floor; energy by
 * `model.energyOf`, with the 62.2 fan the state calls for). A fixed order makes every subset's
 * value one number, and lets the search reuse the state after each prefix; re-sequencing each
 * subset greedily would not. The plan's own package is a prefix of the order, so it is valued
 * here exactly as the plan values it.
 *
 * What a package is worth, as the plan reports it (core/plan.ts): each step's year of savings
 * priced to the cent, its present value over the measure's own life with the NIST Handbook 135
 * UPV* factors to the cent; savings = Σ a year's savings; cost = Σ measure costs + the
 * ventilation fan when the final leakage needs more 62.2 fan flow than the house runs;
 * NPV = Σ PV − cost; SIR = Σ PV of the energy measures ÷ Σ their cost (null when they cost
 * nothing). Objectives: 'npv' (default), 'savings' (a year, USD) or 'sir' (a null SIR ranks
 * below every number).
 *
 * The budget covers the energy measures. Health-and-safety work (its measures and the fan a
 * package calls for) is done whatever the budget, so it is in every package's cost and NPV
 * but not held against the budget, and is reported apart. Hence the package of health-and-
 * safety work alone (no energy measure) always fits: it is the answer when nothing else does.
 *
 * Constraints: energy cost ≤ budget (in whole cents); optionally every energy measure's SIR
 * ≥ 1 where the package puts it (a measure that costs nothing has no SIR and passes);
 * optionally the package SIR ≥ 1 (a null SIR passes).
 *
 * Search. Depth-first over subsets in the canonical order: a node is a subset whose state
 * (leakage and energy) is computed once, from its parent's by one step; its children add one
 * later measure each. Every node is a package and is scored. A subtree is cut when its upper
 * bound cannot reach the best score found, or when a child breaks the budget or (with the
 * option) its own SIR ≥ 1, which later steps cannot change.
 *
 * Why the bounds are sound. Let X be a node's state and Y any state its subtree reaches
 * (Y ≤ X at every location, total ≥ floor). A measure's applied CFM50 at Y is
 * min(wanted, Y[loc], Y − floor) ≤ the same at X. For the methods nFactor, lblBasic and
 * ashrae622 the natural infiltration is Q_inf = k·CFM50 (linear in the total: CFM50/N; ELA ∝
 * CFM50; 0.052·Q50·wsf·…). The air the energy is charged for is Q_bal + hypot(Q_unbal, Q_inf)
 * with the fan flow F = max(existing, 62.2 need) never smaller at a tighter state (less
 * credited infiltration needs more fan), and both forms grow with F and grow at most 1:1 with
 * Q_inf. So a step's saved air, Φ(Q_inf(Y), F(Y)) − Φ(Q_inf(Y − a), F(Y − a)), is at most
 * Q_inf(Y) − Q_inf(Y − a) = k·a, no more than k·a_X; the added fan's power only grows as the
 * house tightens, so its saving is ≤ 0. Loads, fuel and kWh are linear in air flow and prices
 * and PV factors are ≥ 0, so a step's PV and savings are at most the no-fan saving of a_X at
 * X. Three refinements, each proven where its function is (infiltrationShares,
 * usefulFloorCfm50, fanThresholdCfm50): with an unbalanced fan the air falls at most by the
 * natural share q/Φ at X per unit of q; no step saves air below the minimum of Φ(c) (the
 * useful floor), so all steps together save on at most X − max(floor, useful floor) CFM50;
 * and a package either stays above the fan threshold (removing no more than down to it) or
 * pays the fan. A subtree's bound is the smaller of a fractional knapsack over the budget
 * left and the LP over CFM50 room (each step's removal at most its removal at X, all of them
 * within each location's room and the useful room; nested limits, so greedy is optimal), the
 * larger of the two fan cases; for 'sir', the mediant inequality. None can underestimate.
 * The enhanced model (aim2) depends on where the leaks are and may even give more
 * infiltration after a step, so no such bound is proven for it: its homes are searched with
 * the budget and SIR cuts only — still exact, but time grows as 2^n.
 * test/core/best-package.test.ts checks each condition on generated homes.
 *
 * Money. The search scores in float64; each float score is within a stated error of the exact
 * figure (every step rounds its PV and savings to the cent: at most half a cent each, plus
 * float rounding), so the search keeps every package whose score interval reaches the best
 * lower end, and these few are revalued in Decimal as the plan values them. Among equal exact
 * scores the package with the lower cost wins, then the one with fewer measures, then the one
 * whose measures come earliest in the canonical order.
 */
import { savingsToInvestmentRatio, simplePaybackYears } from '../economics/index.ts';
import { InputError } from '../errors.ts';
import type { Evaluation } from '../evaluate.ts';
import { totalCfm50, type HomeModel } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import { Decimal, roundToCents, sumUsd } from '../money.ts';
import { buildPriceBook, type PriceBook } from './prices.ts';
import { applyMeasure, stateAfter, stateOf, type PlanState, type StepOutcome } from './step.ts';
import { DEFAULT_FAN_COST_USD, ventilationAfterPackage } from './ventilation-fan.ts';

export const PACKAGE_OBJECTIVES = ['npv', 'savings', 'sir'] as const;
export type PackageObjective = (typeof PACKAGE_OBJECTIVES)[number];

/** Infiltration methods whose infiltration is linear in total CFM50 (the bounds' condition). */
export const BOUNDED_METHODS: readonly string[] = ['nFactor', 'lblBasic', 'ashrae622'];

export interface BestPackageOptions {
  /** What the energy measures may cost, USD (Infinity for no limit). */
  budgetUsd: number;
  objective?: PackageObjective;
  everyMeasureSirAtLeastOne?: boolean;
  packageSirAtLeastOne?: boolean;
}

/** A package's figures, each exact as the plan reports it. */
export interface PackageFigures {
  /** Every measure of the package in the order applied, health and safety first. */
  measureIds: string[];
  healthAndSafetyMeasureIds: string[];
  /** What the budget covers: the energy measures' cost, USD. */
  budgetCostUsd: Decimal;
  /** Health-and-safety measures and the fan the package calls for, USD. */
  healthAndSafetyCostUsd: Decimal;
  /** Everything: budgetCostUsd + healthAndSafetyCostUsd, USD. */
  costUsd: Decimal;
  annualSavingsUsd: Decimal;
  pvSavingsUsd: Decimal;
  npvUsd: Decimal;
  sir: Decimal | null;
  simplePaybackYears: Decimal | null;
  fanAdded: boolean;
  cfm50After: number;
  /** Each energy measure's SIR where the package puts it (null when it costs nothing). */
  measureSirs: { id: string; sir: Decimal | null }[];
}

export interface BestPackage extends PackageFigures {
  objective: PackageObjective;
  budgetUsd: number;
  /** Packages whose state the search computed (at most 2^n for n energy measures). */
  nodesVisited: number;
  /** Whether the savings bound cut the search (false for methods without a proven bound). */
  boundsUsed: boolean;
  /** The result is the exact optimum (the search is exhaustive up to sound cuts). */
  proven: true;
}

/** The canonical order of an evaluation's measures (declined dropped), split by kind. */
export function canonicalMeasures(evaluation: Evaluation): {
  healthAndSafety: PreparedMeasure[];
  energy: PreparedMeasure[];
} {
  const measures = evaluation.plan.entries
    .map((entry) => entry.step.measure)
    .filter((measure) => measure.status !== 'declined');
  return {
    healthAndSafety: measures.filter((measure) => measure.cost.healthAndSafety),
    energy: measures.filter((measure) => !measure.cost.healthAndSafety),
  };
}

/**
 * The exact figures of a package.
 *
 * @param evaluation - the home's evaluation
 * @param energyMeasureIds - the energy measures chosen (any order; applied in canonical order)
 * @throws InputError when an id is not one of the home's energy measures that is not declined
 */
export function packageFigures(
  evaluation: Evaluation,
  energyMeasureIds: readonly string[],
  prices: PriceBook = buildPriceBook(evaluation.home),
): PackageFigures {
  const { healthAndSafety, energy } = canonicalMeasures(evaluation);
  const wanted = new Set(energyMeasureIds);
  for (const id of wanted) {
    if (!energy.some((measure) => measure.id === id)) {
      throw InputError.at(
        'measureIds',
        `"${id}" is not one of the home's energy measures (expected a measure that is neither health and safety nor declined)`,
      );
    }
  }
  const model = evaluation.model;
  const chosen = [...healthAndSafety, ...energy.filter((measure) => wanted.has(measure.id))];
  let state: PlanState = stateOf(model, model.testIn);
  const steps: StepOutcome[] = chosen.map((measure) => {
    const outcome = applyMeasure(model, state, measure);
    state = stateAfter(outcome);
    return outcome;
  });
  const worths = steps.map((step) => {
    const worth = prices.annualWorth(step.saved);
    return {
      step,
      annualUsd: worth.totalUsd,
      pvUsd: prices.presentValue(worth, step.measure.lifeYears),
    };
  });
  const ventilation = ventilationAfterPackage({ model, prices, leakageAfter: state.leakage });
  const fanCostUsd = ventilation.addedFan?.costUsd ?? new Decimal(0);
  const energyWorths = worths.filter(({ step }) => !step.measure.cost.healthAndSafety);
  const budgetCostUsd = sumUsd(energyWorths.map(({ step }) => step.measure.cost.totalUsd));
  const healthAndSafetyCostUsd = sumUsd(
    healthAndSafety.map((measure) => measure.cost.totalUsd),
  ).plus(fanCostUsd);
  const costUsd = budgetCostUsd.plus(healthAndSafetyCostUsd);
  const annualSavingsUsd = sumUsd(worths.map((worth) => worth.annualUsd));
  const pvSavingsUsd = sumUsd(worths.map((worth) => worth.pvUsd));
  const sirOf = (pvUsd: Decimal, investmentUsd: Decimal) =>
    investmentUsd.gt(0)
      ? savingsToInvestmentRatio({ presentValueSavingsUsd: pvUsd, investmentUsd })
      : null;
  return {
    measureIds: chosen.map((measure) => measure.id),
    healthAndSafetyMeasureIds: healthAndSafety.map((measure) => measure.id),
    budgetCostUsd,
    healthAndSafetyCostUsd,
    costUsd,
    annualSavingsUsd,
    pvSavingsUsd,
    npvUsd: pvSavingsUsd.minus(costUsd),
    sir: sirOf(sumUsd(energyWorths.map((worth) => worth.pvUsd)), budgetCostUsd),
    simplePaybackYears: simplePaybackYears({
      investmentUsd: costUsd,
      firstYearSavingsUsd: annualSavingsUsd,
    }),
    fanAdded: ventilation.addedFan !== null,
    cfm50After: totalCfm50(state.leakage),
    measureSirs: energyWorths.map(({ step, pvUsd }) => ({
      id: step.measure.id,
      sir: sirOf(pvUsd, step.measure.cost.totalUsd),
    })),
  };
}

/** The exact score of a package under an objective (null: a package with no SIR). */
export function objectiveValue(
  figures: PackageFigures,
  objective: PackageObjective,
): Decimal | null {
  switch (objective) {
    case 'npv':
      return figures.npvUsd;
    case 'savings':
      return figures.annualSavingsUsd;
    case 'sir':
      return figures.sir;
  }
}

/** Negative when package `a` is better than `b` (the tie rules of the top comment). */
export function comparePackages(
  a: { figures: PackageFigures; positions: readonly number[] },
  b: { figures: PackageFigures; positions: readonly number[] },
  objective: PackageObjective,
): number {
  const valueA = objectiveValue(a.figures, objective);
  const valueB = objectiveValue(b.figures, objective);
  if (valueA === null || valueB === null) {
    if (valueA !== valueB) return valueA === null ? 1 : -1;
  } else if (!valueA.eq(valueB)) {
    return valueA.gt(valueB) ? -1 : 1;
  }
  if (!a.figures.costUsd.eq(b.figures.costUsd))
    return a.figures.costUsd.lt(b.figures.costUsd) ? -1 : 1;
  if (a.positions.length !== b.positions.length) return a.positions.length - b.positions.length;
  for (let index = 0; index < a.positions.length; index += 1) {
    const difference = (a.positions[index] ?? 0) - (b.positions[index] ?? 0);
    if (difference !== 0) return difference;
  }
  return 0;
}

function readOptions(options: BestPackageOptions): Required<BestPackageOptions> {
  const { budgetUsd } = options;
  if (typeof budgetUsd !== 'number' || Number.isNaN(budgetUsd) || budgetUsd < 0) {
    throw InputError.at('budgetUsd', 'expected a number of dollars of at least 0 (or Infinity)');
  }
  const objective = options.objective ?? 'npv';
  if (!PACKAGE_OBJECTIVES.includes(objective)) {
    throw InputError.at('objective', `expected one of ${PACKAGE_OBJECTIVES.join(', ')}`);
  }
  return {
    budgetUsd,
    objective,
    everyMeasureSirAtLeastOne: options.everyMeasureSirAtLeastOne ?? false,
    packageSirAtLeastOne: options.packageSirAtLeastOne ?? false,
  };
}

/** Natural-infiltration energy per CFM50 removed (heating fuel units, cooling kWh). */
function naturalSlopes(model: HomeModel, start: PlanState): { heating: number; cooling: number } {
  const total = totalCfm50(start.leakage);
  if (total <= 0) return { heating: 0, cooling: 0 };
  const half = Object.fromEntries(
    Object.entries(start.leakage).map(([location, cfm50]) => [location, cfm50 / 2]),
  ) as PlanState['leakage'];
  const full = model.energy(model.airflow(start.leakage));
  const halfEnergy = model.energy(model.airflow(half));
  return {
    heating: Math.max(0, (full.heatingFuelUnits - halfEnergy.heatingFuelUnits) / (total / 2)),
    cooling: Math.max(0, (full.coolingKwh - halfEnergy.coolingKwh) / (total / 2)),
  };
}

/**
 * The total CFM50 below which no step saves heating or cooling (bounded methods only): the
 * lowest minimum over the seasons of the outdoor air Φ(c) the energy is charged for, as a
 * function of the total CFM50 c. Notes: with natural infiltration k·c, credited infiltration
 * κ·c (62.2; κ = 0 without wsf), total need Q and existing fans E, the fan flow is
 * F = max(E, need(c)); need = Q − κc (balanced) or Q − κ²c²/Q (unbalanced); it binds below
 * c* (need(c*) = E). Above c*, Φ = E + kc or hypot(E, kc) grows. Below it, balanced:
 * Φ = Q + (k − κ)c, falling when k < κ (minimum at c*); unbalanced: Φ² = (Q − κ²c²/Q)² + k²c²,
 * whose slope 2c·(k² − 2κ²(1 − κ²c²/Q²)) changes sign once, at c₀ = (Q/κ)·√(1 − k²/2κ²)
 * when k² < 2κ². So Φ falls to a minimum at c_m = min(c₀, c*) (0 when it never falls) and
 * grows after it, never faster than k: a step saves air only on the part of its removal above
 * c_m, at most k per CFM50 of it. A small margin below c_m covers float rounding.
 */
export function usefulFloorCfm50(model: HomeModel): number {
  const total = model.testInCfm50;
  if (total <= 0) return 0;
  const airflow = model.airflow(model.testIn);
  const need = model.ventilation(total);
  const kappa = need.infiltrationCfm / total;
  const required = need.requiredCfm;
  const existing = model.existingFanCfm;
  const balanced = model.home.ventilation?.fanType === 'balanced';
  if (kappa <= 0 || existing >= required) return 0;
  const binding = balanced
    ? (required - existing) / kappa
    : (required * Math.sqrt(1 - existing / required)) / kappa;
  const minimumOf = (k: number) => {
    if (balanced) return k < kappa ? binding : 0;
    if (k * k >= 2 * kappa * kappa) return 0;
    const turning = (required / kappa) * Math.sqrt(1 - (k * k) / (2 * kappa * kappa));
    return Math.min(turning, binding);
  };
  const slopes = [airflow.heatingCfm / total, airflow.coolingCfm / total].filter((k) => k > 0);
  if (slopes.length === 0) return 0;
  const lowest = Math.min(...slopes.map(minimumOf));
  return Math.max(0, lowest * (1 - 1e-6) - 1e-6);
}

/**
 * How fast the air a state is charged for can fall per unit of natural infiltration removed,
 * at this state and any tighter one, by season. Notes: with an unbalanced fan,
 * Φ = hypot(F, q) (q = k·c natural infiltration, F the fan flow, which never falls as c
 * does), so dΦ/dc = (F·F' + q·k)/Φ ≤ k·q/Φ (F' ≤ 0), and q/Φ ≤ q_X/Φ_X at every c ≤ c_X since
 * q/hypot(F_X, q) grows with q and Φ(c) ≥ hypot(F_X, q(c)). A balanced fan adds F: the share
 * is 1. Without a fan flow it is 1 too.
 */
function infiltrationShares(
  model: HomeModel,
  state: PlanState,
): { heating: number; cooling: number } {
  const flows = model.ventilatedAirflow(state.leakage);
  if (flows.balanced || flows.fanCfm === 0) return { heating: 1, cooling: 1 };
  const shareOf = (natural: number, combined: number) =>
    combined > 0 ? Math.min(1, (natural / combined) * (1 + 1e-9)) : 1;
  return {
    heating: shareOf(flows.infiltration.heatingCfm, flows.combined.heatingCfm),
    cooling: shareOf(flows.infiltration.coolingCfm, flows.combined.coolingCfm),
  };
}

/**
 * The total CFM50 below which the house needs more 62.2 fan flow than it runs (Infinity when
 * it always does, 0 when it never does), lowered a little for float rounding. Notes: with
 * credited infiltration κ·c, the need Q − κc (balanced) or Q − κ²c²/Q (unbalanced) exceeds
 * the existing fans E below c* = (Q − E)/κ or (Q/κ)·√(1 − E/Q) (ANSI/ASHRAE 62.2, 4.1.2).
 */
export function fanThresholdCfm50(model: HomeModel): number {
  const total = model.testInCfm50;
  const need = model.ventilation(total);
  const required = need.requiredCfm;
  const existing = model.existingFanCfm;
  if (existing >= required) return 0;
  const kappa = total > 0 ? need.infiltrationCfm / total : 0;
  if (kappa <= 0) return Infinity;
  const balanced = model.home.ventilation?.fanType === 'balanced';
  const threshold = balanced
    ? (required - existing) / kappa
    : (required * Math.sqrt(1 - existing / required)) / kappa;
  return Math.max(0, threshold * (1 - 1e-9) - 1e-6);
}

/** An energy measure as the search sees it, in float64. */
interface SearchItem {
  index: number;
  measure: PreparedMeasure;
  costCents: number;
  costUsd: number;
  heatingFactor: number;
  electricityFactor: number;
  /** The no-fan saving of one CFM50 removed, heating and cooling: a year's, USD. */
  heatingUsdPerCfm50: number;
  coolingUsdPerCfm50: number;
}

/** A remaining measure's bound at a node: what it can add anywhere in the subtree. */
interface ItemBound {
  item: SearchItem;
  /** Upper bound of the objective's gain (PV − cost, a year's savings, or PV for 'sir'). */
  gain: number;
  pvUsd: number;
  /** What it removes at the node, CFM50: the most it can remove anywhere in the subtree. */
  removedCfm50: number;
  /** The part of that which can save energy (above the useful floor), CFM50. */
  appliedCfm50: number;
  /** Its gain bound per CFM50 removed, its cost spread over appliedCfm50 ('npv', 'savings'). */
  gainPerCfm50: number;
}

/** CFM50 the subtree may still remove: what is left at each location and above the floor. */
interface Room {
  byLocation: Record<string, number>;
  aboveFloor: number;
}

/** Float sums of a node's energy measures. */
interface NodeSums {
  costCents: number;
  costUsd: number;
  pvUsd: number;
  annualUsd: number;
}

/**
 * The float error of a package's score: each step's PV and a year's savings are rounded to
 * the cent in the exact figures (half a cent at most each), plus a float64 allowance.
 */
function dollarError(stepCount: number, magnitudeUsd: number): number {
  return 0.005 * (stepCount + 1) + 1e-9 * (Math.abs(magnitudeUsd) + 1);
}

/**
 * The most any package in a subtree can score: the node's sums, plus the best choice of the
 * remaining measures' bounds. 'npv' and 'savings': a fractional knapsack over the budget left
 * (its LP value is at least any whole choice's). 'sir': the mediant inequality,
 * (P + Σp)/(C + Σc) ≤ max(P/C, max p/c), with measures that cost nothing added to P.
 *
 * @param sortedBounds - the remaining measures, best gain per cent first
 */
function subtreeBound(options: {
  objective: PackageObjective;
  sums: NodeSums;
  fixedUsd: number;
  budgetCents: number;
  sortedBounds: readonly ItemBound[];
  after: number;
}): number {
  const { objective, sums, sortedBounds, after } = options;
  if (objective === 'sir') {
    let free = 0;
    let bestRatio = -Infinity;
    let cheapestUsd = Infinity;
    for (const bound of sortedBounds) {
      if (bound.item.index <= after) continue;
      if (bound.item.costCents === 0) free += Math.max(0, bound.pvUsd);
      else {
        bestRatio = Math.max(bestRatio, bound.pvUsd / bound.item.costUsd);
        cheapestUsd = Math.min(cheapestUsd, bound.item.costUsd);
      }
    }
    const fixed = sums.pvUsd + free;
    if (sums.costCents > 0) return Math.max(fixed / sums.costUsd, bestRatio);
    return cheapestUsd === Infinity ? -Infinity : Math.max(0, fixed) / cheapestUsd + bestRatio;
  }
  let value = options.fixedUsd + (objective === 'npv' ? sums.pvUsd - sums.costUsd : sums.annualUsd);
  let centsLeft = options.budgetCents - sums.costCents;
  for (const bound of sortedBounds) {
    if (bound.item.index <= after || bound.gain <= 0) continue;
    if (bound.item.costCents <= centsLeft) {
      value += bound.gain;
      centsLeft -= bound.item.costCents;
    } else {
      value += (bound.gain * Math.max(0, centsLeft)) / bound.item.costCents;
      break;
    }
  }
  return value;
}

/**
 * The most any package in a subtree can score by CFM50 ('npv', 'savings'): every step removes
 * at most what it would at the node, all steps together no more than is left at each location
 * and above the floor, and each is worth at most its gain per CFM50 (a step that removes the
 * share a of what it could pays at least that share of its cost, as costs are ≥ 0). The LP
 * over these limits (a location's room inside the room above the floor: nested limits, so
 * taking the best gain per CFM50 first is optimal) bounds every whole choice.
 *
 * @param byGainPerCfm50 - the remaining measures, best gain per CFM50 first
 */
function roomBound(options: {
  objective: PackageObjective;
  sums: NodeSums;
  fixedUsd: number;
  byGainPerCfm50: readonly ItemBound[];
  after: number;
  room: Room;
}): number {
  const { objective, sums, room } = options;
  let value = options.fixedUsd + (objective === 'npv' ? sums.pvUsd - sums.costUsd : sums.annualUsd);
  const left = { ...room.byLocation };
  let aboveFloor = room.aboveFloor;
  for (const bound of options.byGainPerCfm50) {
    if (aboveFloor <= 0 || bound.gainPerCfm50 <= 0) break;
    if (bound.item.index <= options.after) continue;
    const location = bound.item.measure.location;
    const taken = Math.min(bound.appliedCfm50, left[location] ?? 0, aboveFloor);
    if (taken <= 0) continue;
    value += taken * bound.gainPerCfm50;
    left[location] = (left[location] ?? 0) - taken;
    aboveFloor -= taken;
  }
  return value;
}

/** Dollars of a step in float64: a year's savings and their present value. */
function stepDollars(prices: PriceBook, item: SearchItem, outcome: StepOutcome) {
  const heatingUsd = outcome.saved.heatingFuelUnits * prices.heating.usdPerUnitFloat;
  const kwh = outcome.saved.coolingKwh + outcome.saved.ventilationFanKwh;
  const electricityUsd =
    kwh === 0 ? 0 : kwh * prices.requireElectricity('cooling and ventilation fans').usdPerUnitFloat;
  return {
    annualUsd: heatingUsd + electricityUsd,
    pvUsd: heatingUsd * item.heatingFactor + electricityUsd * item.electricityFactor,
  };
}

/** A step's SIR ≥ 1: by its float PV where that is clear, in Decimal where it is close. */
function stepSirPasses(prices: PriceBook, outcome: StepOutcome, pvFloatUsd: number): boolean {
  const cost = outcome.measure.cost;
  const margin = dollarError(0, pvFloatUsd + cost.totalUsdFloat);
  if (pvFloatUsd - margin >= cost.totalUsdFloat) return true;
  if (pvFloatUsd + margin < cost.totalUsdFloat) return false;
  const pv = prices.presentValue(prices.annualWorth(outcome.saved), outcome.measure.lifeYears);
  return pv.gte(cost.totalUsd);
}

/** How many kept packages prompt dropping those the best score has passed. */
const CANDIDATE_COMPACTION = 4096;

interface SearchNode extends NodeSums {
  state: PlanState;
  next: number;
  positions: number[];
}

/**
 * The best package within a budget.
 *
 * @param evaluation - the home's evaluation (evaluateHome)
 * @param options.budgetUsd - what the energy measures may cost, USD (Infinity: no limit)
 * @param options.objective - 'npv' (default), 'savings' (a year, USD) or 'sir'
 * @param options.everyMeasureSirAtLeastOne - each energy measure SIR ≥ 1 where it stands
 * @param options.packageSirAtLeastOne - the package SIR ≥ 1
 * @returns the optimal package's exact figures and how many packages the search valued
 * @throws InputError naming the option that is out of range
 */
export function bestPackage(evaluation: Evaluation, options: BestPackageOptions): BestPackage {
  const settings = readOptions(options);
  const { objective } = settings;
  const model = evaluation.model;
  const prices = buildPriceBook(evaluation.home);
  const { healthAndSafety, energy } = canonicalMeasures(evaluation);
  const budgetCents = Number.isFinite(settings.budgetUsd)
    ? new Decimal(settings.budgetUsd).times(100).floor().toNumber()
    : Infinity;
  const stepCount = healthAndSafety.length + energy.length;

  let root = stateOf(model, model.testIn);
  let healthPvUsd = 0;
  let healthAnnualUsd = 0;
  for (const measure of healthAndSafety) {
    const outcome = applyMeasure(model, root, measure);
    const worth = prices.annualWorth(outcome.saved);
    healthPvUsd += prices.presentValue(worth, measure.lifeYears).toNumber();
    healthAnnualUsd += worth.totalUsd.toNumber();
    root = stateAfter(outcome);
  }
  const healthCostUsd = sumUsd(healthAndSafety.map((measure) => measure.cost.totalUsd)).toNumber();
  const fanCostUsd = roundToCents(
    new Decimal(model.home.ventilation?.fanCostUsd ?? DEFAULT_FAN_COST_USD),
  ).toNumber();
  const fanNeeded = (state: PlanState) =>
    model.ventilation(totalCfm50(state.leakage)).fanNeedCfm > model.existingFanCfm;

  const boundsUsed = BOUNDED_METHODS.includes(model.home.infiltrationMethod);
  const slopes = naturalSlopes(model, root);
  const usefulFloor = boundsUsed ? usefulFloorCfm50(model) : 0;
  const fanThreshold = fanThresholdCfm50(model);
  const heatingUsdPerCfm50 = slopes.heating * prices.heating.usdPerUnitFloat;
  const coolingUsdPerCfm50 = slopes.cooling * (prices.electricity?.usdPerUnitFloat ?? 0);
  const items: SearchItem[] = energy.map((measure, index) => {
    const heatingFactor = prices.presentValueFloat(1, 0, measure.lifeYears);
    const electricityFactor = prices.presentValueFloat(0, 1, measure.lifeYears);
    return {
      index,
      measure,
      costCents: Math.round(measure.cost.totalUsdFloat * 100),
      costUsd: measure.cost.totalUsdFloat,
      heatingFactor,
      electricityFactor,
      heatingUsdPerCfm50: heatingUsdPerCfm50 * (1 + 1e-9),
      coolingUsdPerCfm50: coolingUsdPerCfm50 * (1 + 1e-9),
    };
  });

  // A package's score and its error; null for a package with no SIR under 'sir'.
  const scoreOf = (node: SearchNode): { value: number; error: number } | null => {
    const fixed = healthPvUsd - healthCostUsd - (fanNeeded(node.state) ? fanCostUsd : 0);
    switch (objective) {
      case 'npv': {
        const value = fixed + node.pvUsd - node.costUsd;
        return { value, error: dollarError(stepCount, Math.abs(value) + node.costUsd) };
      }
      case 'savings': {
        const value = healthAnnualUsd + node.annualUsd;
        return { value, error: dollarError(stepCount, value) };
      }
      case 'sir':
        if (node.costCents === 0) return null;
        return {
          value: node.pvUsd / node.costUsd,
          error: dollarError(stepCount, node.pvUsd) / node.costUsd,
        };
    }
  };
  const cheapestCostUsd = Math.min(
    ...items.filter((item) => item.costCents > 0).map((item) => item.costUsd),
  );
  // The float error of a bound on the scores in a subtree (for 'sir', over the least cost
  // a package there can have).
  const boundError = (sums: NodeSums, bound: number) => {
    if (!Number.isFinite(bound)) return 0;
    if (objective !== 'sir') return dollarError(stepCount, Math.abs(bound) + sums.costUsd);
    const leastCostUsd = sums.costCents > 0 ? sums.costUsd : cheapestCostUsd;
    return dollarError(stepCount, Math.abs(bound) * leastCostUsd) / leastCostUsd;
  };

  let nodesVisited = 0;
  let bestLow = -Infinity;
  const candidates: { positions: number[]; high: number }[] = [];
  let compactAt = CANDIDATE_COMPACTION;

  const consider = (node: SearchNode): void => {
    const own = scoreOf(node);
    let certain = true;
    if (settings.packageSirAtLeastOne && node.costCents > 0) {
      const sir = node.pvUsd / node.costUsd;
      const error = dollarError(stepCount, node.pvUsd) / node.costUsd;
      if (sir + error < 1) return;
      certain = sir - error >= 1;
    }
    const high = own === null ? -Infinity : own.value + own.error;
    if (own !== null && certain) bestLow = Math.max(bestLow, own.value - own.error);
    if (high >= bestLow) candidates.push({ positions: node.positions, high });
    if (candidates.length > compactAt) {
      let kept = 0;
      for (const candidate of candidates) {
        if (candidate.high >= bestLow) candidates[kept++] = candidate;
      }
      candidates.length = kept;
      compactAt = Math.max(compactAt, 2 * kept);
    }
  };

  const visit = (node: SearchNode): void => {
    nodesVisited += 1;
    consider(node);
    if (node.next >= items.length) return;
    const remaining = items.slice(node.next);
    const fixedUsd =
      objective === 'npv'
        ? healthPvUsd - healthCostUsd - (fanNeeded(node.state) ? fanCostUsd : 0)
        : healthAnnualUsd;
    let sortedBounds: ItemBound[] | null = null;
    if (boundsUsed) {
      const leftCfm50 = totalCfm50(node.state.leakage);
      const aboveFloor = Math.max(0, leftCfm50 - model.floorCfm50);
      const useful = Math.max(0, leftCfm50 - Math.max(model.floorCfm50, usefulFloor));
      const share = infiltrationShares(model, node.state);
      sortedBounds = remaining
        .map((item) => {
          const applied = Math.min(
            Math.max(0, item.measure.estimateCfm50.likely),
            node.state.leakage[item.measure.location],
            aboveFloor,
          );
          const usefulCfm50 = Math.min(applied, useful);
          const heatingUsd = usefulCfm50 * item.heatingUsdPerCfm50 * share.heating;
          const coolingUsd = usefulCfm50 * item.coolingUsdPerCfm50 * share.cooling;
          const pvUsd = heatingUsd * item.heatingFactor + coolingUsd * item.electricityFactor;
          const gain =
            objective === 'npv'
              ? pvUsd - item.costUsd
              : objective === 'savings'
                ? heatingUsd + coolingUsd
                : pvUsd;
          const perCfm50Gain =
            usefulCfm50 > 0
              ? (objective === 'savings' ? gain : pvUsd - item.costUsd) / usefulCfm50
              : -Infinity;
          return {
            item,
            gain,
            pvUsd,
            removedCfm50: applied,
            appliedCfm50: usefulCfm50,
            gainPerCfm50: perCfm50Gain,
          };
        })
        .filter(
          // A measure that cannot reach SIR ≥ 1 anywhere below this node is never added.
          (bound) =>
            !settings.everyMeasureSirAtLeastOne ||
            bound.item.costCents === 0 ||
            bound.pvUsd + dollarError(0, bound.pvUsd + bound.item.costUsd) >= bound.item.costUsd,
        )
        .sort((a, b) => {
          const ratioA = a.item.costCents === 0 ? Infinity : a.gain / a.item.costCents;
          const ratioB = b.item.costCents === 0 ? Infinity : b.gain / b.item.costCents;
          return ratioB - ratioA || a.item.index - b.item.index;
        });
    }
    const byGainPerCfm50 =
      sortedBounds === null || objective === 'sir'
        ? null
        : [...sortedBounds].sort(
            (a, b) => b.gainPerCfm50 - a.gainPerCfm50 || a.item.index - b.item.index,
          );
    const room: Room = {
      byLocation: { ...node.state.leakage },
      aboveFloor: Math.max(
        0,
        totalCfm50(node.state.leakage) - Math.max(model.floorCfm50, usefulFloor),
      ),
    };
    // Packages below that still need no fan remove at most down to the fan threshold; those
    // that go further pay for the fan. The bound is the larger of the two cases.
    const fanStillOpen = objective === 'npv' && fanCostUsd > 0 && !fanNeeded(node.state);
    const boundFrom = (sums: NodeSums, after: number, roomLeft: Room, cfm50: number) => {
      if (sortedBounds === null) return Infinity;
      const knapsack = subtreeBound({
        objective,
        sums,
        fixedUsd,
        budgetCents,
        sortedBounds,
        after,
      });
      if (byGainPerCfm50 === null) return knapsack + boundError(sums, knapsack);
      const byRoom = (roomNow: Room) =>
        Math.min(
          knapsack,
          roomBound({ objective, sums, fixedUsd, byGainPerCfm50, after, room: roomNow }),
        );
      let bound = byRoom(roomLeft);
      if (fanStillOpen) {
        const noFanRoom = Math.max(0, cfm50 - fanThreshold);
        const withoutFan = byRoom({
          byLocation: roomLeft.byLocation,
          aboveFloor: Math.min(roomLeft.aboveFloor, noFanRoom),
        });
        bound = Math.max(withoutFan, bound - fanCostUsd);
      }
      return bound + boundError(sums, bound);
    };
    const nodeCfm50 = totalCfm50(node.state.leakage);
    if (boundFrom(node, node.next - 1, room, nodeCfm50) < bestLow) return;

    for (const item of remaining) {
      const costCents = node.costCents + item.costCents;
      if (costCents > budgetCents) continue;
      if (sortedBounds !== null) {
        const own = sortedBounds.find((bound) => bound.item === item);
        if (own === undefined) continue; // cannot pass SIR ≥ 1 here or below
        const optimistic: NodeSums = {
          costCents,
          costUsd: node.costUsd + item.costUsd,
          pvUsd: node.pvUsd + own.pvUsd,
          annualUsd: node.annualUsd + (objective === 'savings' ? own.gain : 0),
        };
        const location = item.measure.location;
        const roomLeft: Room = {
          byLocation: {
            ...room.byLocation,
            [location]: (room.byLocation[location] ?? 0) - own.removedCfm50,
          },
          aboveFloor: Math.max(0, room.aboveFloor - own.removedCfm50),
        };
        const cfm50After = nodeCfm50 - own.removedCfm50;
        if (boundFrom(optimistic, item.index, roomLeft, cfm50After) < bestLow) continue;
      }
      const outcome = applyMeasure(model, node.state, item.measure);
      const dollars = stepDollars(prices, item, outcome);
      if (
        settings.everyMeasureSirAtLeastOne &&
        item.costCents > 0 &&
        !stepSirPasses(prices, outcome, dollars.pvUsd)
      ) {
        continue;
      }
      visit({
        state: stateAfter(outcome),
        next: item.index + 1,
        positions: [...node.positions, item.index],
        costCents,
        costUsd: node.costUsd + item.costUsd,
        pvUsd: node.pvUsd + dollars.pvUsd,
        annualUsd: node.annualUsd + dollars.annualUsd,
      });
    }
  };
  visit({ state: root, next: 0, positions: [], costCents: 0, costUsd: 0, pvUsd: 0, annualUsd: 0 });

  let best: { figures: PackageFigures; positions: number[] } | null = null;
  for (const candidate of candidates) {
    if (candidate.high < bestLow) continue;
    const figures = packageFigures(
      evaluation,
      candidate.positions.map((position) => energy[position]?.id ?? ''),
      prices,
    );
    if (settings.packageSirAtLeastOne && figures.sir !== null && figures.sir.lt(1)) continue;
    const entry = { figures, positions: candidate.positions };
    if (best === null || comparePackages(entry, best, objective) < 0) best = entry;
  }
  if (best === null) {
    // Cannot happen: the package of health-and-safety work alone always qualifies.
    throw new Error('best package: no package qualified');
  }
  return {
    ...best.figures,
    objective,
    budgetUsd: settings.budgetUsd,
    nodesVisited,
    boundsUsed,
    proven: true,
  };
}
