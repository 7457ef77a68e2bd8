/**
 * The walk over ranges of final totals of the AIM-2 bound ((d)–(k) of bounds-aim2.ts's top
 * comment): for a node and a range [lo, hi] of the totals its packages can end at, the
 * bounds on their PV and savings, judged by the ranking's `mayWin`, the range halved while it
 * may still win. Written as plain functions of one `RangeWalk` per node, so a node's walk
 * builds no closures beyond the knapsacks' rate functions.
 */
import { LEAK_LOCATIONS, type LeakLocation } from '../../schema.ts';
import type { SeasonalAirflowCfm } from '../../energy.ts';
import type { Aim2Box, SeasonBox } from './aim2-box.ts';
import {
  ENERGY_MARGIN,
  knapsackOf,
  stepSlopes,
  subtreeBox,
  times,
  type Aim2Bound,
  type StepSlopes,
} from './aim2-steps.ts';
import type { BoundNode, BoundSettings, CellOutlook, CellTerms } from './bounds.ts';
import { fanSplitPvBoundUsd, type FlowRange } from './fan-split.ts';
import { pathFactorPvBoundUsd } from './path-factors.ts';
import {
  BOUND_MARGIN,
  type CostCurve,
  type FactorSpreads,
  type LiveMeasure,
} from './remaining-measures.ts';

/** How many times the walk may halve a range of final totals that may still win. */
export const AIM2_HALVINGS = 14;

/** For how many of those halvings a range gets a box of its own ((g)); deeper ones reuse it. */
export const RANGED_BOX_HALVINGS = 6;

/** What a node's walk over its ranges works from. */
export interface RangeWalk {
  bound: Aim2Bound;
  node: BoundNode;
  measures: readonly LiveMeasure[];
  settings: BoundSettings;
  mayWin: (outlook: CellOutlook) => boolean;
  outlookOf: (terms: CellTerms) => CellOutlook | null;
  /** The node's natural flows (the latent one 0 on degree days). */
  natural: SeasonalAirflowCfm;
  naturalLatentCfm: number;
  spreads: FactorSpreads;
  /** Half a cent a live step (bounds-aim2.ts (f)). */
  rounding: number;
  curve: CostCurve;
  /** The lowest total the measures can reach, CFM50. */
  bottom: number;
  /** The most that can be removed at each location below the node, CFM50. */
  rooms: Readonly<Record<LeakLocation, number>>;
  /** The budget left, widened by the margin, USD. */
  budgetLeft: number;
  /** F at the node, cfm. */
  fanAtX: number;
}

/** A range's box and the knapsacks of (f) and (h) on its slopes. */
export interface RangeSums {
  box: Aim2Box;
  excessUpTo: ReturnType<typeof knapsackOf>;
  pvUpTo: ReturnType<typeof knapsackOf>;
  netUpTo: ReturnType<typeof knapsackOf>;
  savingsUpTo: ReturnType<typeof knapsackOf>;
}

/** The rooms of (d): what the live measures can remove at each location below the node. */
export function roomsOf(
  node: BoundNode,
  measures: readonly LiveMeasure[],
): Record<LeakLocation, number> {
  const lower = { ...node.leakage };
  for (const measure of measures) lower[measure.location] -= measure.sizeCfm50;
  const rooms = {} as Record<LeakLocation, number>;
  for (const location of LEAK_LOCATIONS) {
    rooms[location] = node.leakage[location] - Math.max(0, lower[location]);
  }
  return rooms;
}

/** The largest Σ D_l·x_l of (d) for a total in [least, most]. */
function largestFall(
  season: SeasonBox,
  rooms: Readonly<Record<LeakLocation, number>>,
  least: number,
  most: number,
): number {
  let taken = 0;
  let fall = 0;
  for (const location of season.byFall) {
    const rate = season.fallPerCfm50[location];
    const limit = rate > 0 ? most : least;
    const part = Math.min(rooms[location], Math.max(0, limit - taken));
    if (part <= 0) continue;
    taken += part;
    fall += rate * part;
  }
  return fall;
}

/** The natural flow with the fan's (e): Φ = q + F, hypot(F, q) or q. */
function combine(bound: Aim2Bound, infiltrationCfm: number, fanCfm: number): number {
  return fanCfm === 0
    ? infiltrationCfm
    : bound.balanced
      ? fanCfm + infiltrationCfm
      : Math.hypot(fanCfm, infiltrationCfm);
}

/** (d): the least final flow of a season for a removal in [least, most] and a total ≥ lo. */
function flowLow(
  walk: RangeWalk,
  season: SeasonBox | null,
  atX: number,
  lo: number,
  least: number,
  most: number,
): number {
  return season === null
    ? 0
    : Math.max(0, lo * season.flowPerCfm50.lo, atX - largestFall(season, walk.rooms, least, most));
}

/** K(L): the least the measures can cost to remove `removed` CFM50 (b). */
function leastCostOf(curve: CostCurve, removed: number): number {
  let cost = 0;
  let start = 0;
  for (let segment = 0; segment < curve.lengthsCfm50.length; segment += 1) {
    const length = curve.lengthsCfm50[segment] ?? 0;
    cost += Math.min(length, Math.max(0, removed - start)) * (curve.ratesUsdPerCfm50[segment] ?? 0);
    start += length;
  }
  return cost;
}

/** (f)(2): a step's PV per CFM50 removed at most, p_j = hf_j·ĝ_h + ef_j·ĝ_e. */
function pvRateOf(slopes: StepSlopes, measure: LiveMeasure): number {
  return (
    times(measure.factors.heating, slopes.heating[measure.location]) +
    times(measure.factors.electricity, slopes.electricity[measure.location])
  );
}

/**
 * (e): each step's signed saving per CFM50 removed, by location, over the box of the states
 * whose total is at least `leastTotalCfm50` (g), with the knapsacks of (f) and (h) on them.
 */
export function rangeSums(walk: RangeWalk, rangeBox: Aim2Box, leastTotalCfm50: number): RangeSums {
  const { measures, spreads } = walk;
  const slopes = stepSlopes(walk.bound, rangeBox, walk.node.cfm50, leastTotalCfm50);
  return {
    box: rangeBox,
    // A measure at the least factors has no excess, whatever its slopes.
    excessUpTo: knapsackOf(
      measures,
      (measure) =>
        times(measure.factors.heating - spreads.heatingLeast, slopes.heating[measure.location]) +
        times(
          measure.factors.electricity - spreads.electricityLeast,
          slopes.electricity[measure.location],
        ),
    ),
    pvUpTo: knapsackOf(measures, (measure) => pvRateOf(slopes, measure)),
    // (h): PV less cost per CFM50, jointly for each measure.
    netUpTo: knapsackOf(
      measures,
      (measure) => pvRateOf(slopes, measure) - measure.costUsd / measure.sizeCfm50,
    ),
    savingsUpTo: knapsackOf(
      measures,
      (measure) => slopes.heating[measure.location] + slopes.electricity[measure.location],
    ),
  };
}

/**
 * A season's natural flow for a range: at the node; its least at the final state (d) and on
 * the way (d with nothing removed required); its most on the way, c_X·G_hi (every state on
 * the way has a total at most c_X), cfm.
 */
interface SeasonLows {
  atNode: number;
  finalLeast: number;
  wayLeast: number;
  most: number;
}

function seasonLows(
  walk: RangeWalk,
  season: SeasonBox | null,
  atNode: number,
  lo: number,
  least: number,
  most: number,
): SeasonLows {
  return {
    atNode,
    finalLeast: flowLow(walk, season, atNode, lo, least, most),
    wayLeast: flowLow(walk, season, atNode, lo, 0, most),
    most: season === null ? 0 : walk.node.cfm50 * season.flowPerCfm50.hi,
  };
}

/** (k): a season's natural flow at the node and its range on the way to a total ≥ lo. */
function flowsOnTheWay(lows: SeasonLows): FlowRange {
  return {
    atNode: lows.atNode,
    least: Math.min(lows.wayLeast, lows.finalLeast),
    most: lows.most,
  };
}

/**
 * (i): a year's dollars at X and their range over the states on the way to a final total in
 * [lo, X's]: every such state has a total in [lo, c_X], so its flow is at most c_X·G_hi and
 * its fan at most F(lo) (`fanMostCfm`); at least the way's least flow with the fan at X's, or
 * the final state's least (`heatingLow`, `electricityLow`).
 */
function wayDollars(walk: RangeWalk, range: RangeLows, fanMostCfm: number) {
  const { bound, node, fanAtX } = walk;
  const { heating, cooling, latent } = range;
  const model = bound.model;
  const heatingLeast = Math.min(
    range.heatingLow,
    bound.heatingUsdPerCfm * combine(bound, heating.wayLeast, fanAtX) * (1 - ENERGY_MARGIN),
  );
  const electricityLeast = Math.min(
    range.electricityLow,
    (bound.coolingUsdPerCfm * combine(bound, cooling.wayLeast, fanAtX) +
      times(bound.latentUsdPerCfm, combine(bound, latent.wayLeast, fanAtX)) +
      bound.fanUsdPerCfm * (fanAtX - model.existingFanCfm)) *
      (1 - ENERGY_MARGIN),
  );
  return {
    heating: {
      atNode: node.heatingUsd,
      least: heatingLeast,
      most: bound.heatingUsdPerCfm * combine(bound, heating.most, fanMostCfm) * (1 + ENERGY_MARGIN),
    },
    electricity: {
      atNode: node.electricityUsd,
      least: electricityLeast,
      most:
        (bound.coolingUsdPerCfm * combine(bound, cooling.most, fanMostCfm) +
          times(bound.latentUsdPerCfm, combine(bound, latent.most, fanMostCfm)) +
          bound.fanUsdPerCfm * (fanMostCfm - model.existingFanCfm)) *
        (1 + ENERGY_MARGIN),
    },
  };
}

/** Whether packages whose final total is in [lo, hi] may win, halving up to `depth` times. */
export function mayWinIn(
  walk: RangeWalk,
  lo: number,
  hi: number,
  depth: number,
  outer: RangeSums,
): boolean {
  const { bound, node, measures, settings, natural, naturalLatentCfm, rounding } = walk;
  const model = bound.model;
  const least = node.cfm50 - hi;
  const most = node.cfm50 - lo;
  const leastCostUsd = leastCostOf(walk.curve, least);
  if (leastCostUsd > walk.budgetLeft) return false;
  // (g): the states on the way to a total of at least lo; the outer range's box where this
  // one's has no bound (it holds these states too).
  const ranged =
    lo > walk.bottom && depth >= AIM2_HALVINGS - RANGED_BOX_HALVINGS
      ? subtreeBox(bound, node.leakage, measures, lo, settings.budgetLeftUsd)
      : null;
  const sums = ranged === null ? outer : rangeSums(walk, ranged, lo);
  const heating = seasonLows(walk, sums.box.heating, natural.heatingCfm, lo, least, most);
  const cooling = seasonLows(walk, sums.box.cooling, natural.coolingCfm, lo, least, most);
  const latent = seasonLows(walk, sums.box.latent ?? null, naturalLatentCfm, lo, least, most);
  const fanCfm = Math.max(model.existingFanCfm, model.ventilation(hi).fanNeedCfm);
  const heatingCfm = combine(bound, heating.finalLeast, fanCfm);
  const coolingCfm = combine(bound, cooling.finalLeast, fanCfm);
  const latentCfm = combine(bound, latent.finalLeast, fanCfm);
  const heatingLow = bound.heatingUsdPerCfm * heatingCfm * (1 - ENERGY_MARGIN);
  const electricityLow =
    (bound.coolingUsdPerCfm * coolingCfm +
      times(bound.latentUsdPerCfm, latentCfm) +
      bound.fanUsdPerCfm * (fanCfm - model.existingFanCfm)) *
    (1 - ENERGY_MARGIN);
  const range: RangeLows = {
    lo,
    least,
    most,
    sums,
    heating,
    cooling,
    latent,
    fanCfm,
    heatingLow,
    electricityLow,
  };
  // An objective's outlook reads only its own terms (bounds.ts `outlookMaker`: the PV for
  // 'npv', 'sir' and the package SIR rule, the savings for 'savings'); the other is left at
  // +∞, a bound that says nothing.
  const terms = {
    pvUsd:
      settings.objective !== 'savings' || settings.packageSirAtLeastOne
        ? pvBoundUsd(walk, range, leastCostUsd)
        : Infinity,
    savingsUsd:
      settings.objective === 'savings'
        ? Math.min(
            node.heatingUsd + node.electricityUsd - heatingLow - electricityLow + rounding,
            sums.savingsUpTo(least, most) + rounding,
            2 * sums.savingsUpTo(0, most, true),
          )
        : Infinity,
    leastCostUsd,
    fanPaid: node.fanNeeded || hi < settings.fanThresholdCfm50,
  };
  // A bound that is not a number proves nothing.
  if (Number.isNaN(terms.pvUsd) || Number.isNaN(terms.savingsUsd)) return true;
  const outlook = walk.outlookOf(terms);
  if (outlook !== null && Number.isNaN(outlook.score)) return true;
  if (outlook === null || !walk.mayWin(outlook)) return false;
  if (depth === 0 || hi - lo <= 0) return true;
  const middle = (lo + hi) / 2;
  return mayWinIn(walk, middle, hi, depth - 1, sums) || mayWinIn(walk, lo, middle, depth - 1, sums);
}

/** A range: its bottom lo, its removals [least, most], each season's flows, the final state's least. */
interface RangeLows {
  lo: number;
  least: number;
  most: number;
  sums: RangeSums;
  heating: SeasonLows;
  cooling: SeasonLows;
  latent: SeasonLows;
  /** The final state's least fan flow, F(hi), cfm. */
  fanCfm: number;
  /** The final state's least heating and electricity dollars a year. */
  heatingLow: number;
  electricityLow: number;
}

/** (f), (h), (i) and (k): the most the PV of a package ending in the range can be, USD. */
function pvBoundUsd(walk: RangeWalk, range: RangeLows, leastCostUsd: number): number {
  const { bound, node, measures, settings, spreads, rounding } = walk;
  const { lo, least, most, sums, fanCfm, heatingLow, electricityLow } = range;
  const model = bound.model;
  const fanMostCfm = Math.max(model.existingFanCfm, model.ventilation(Math.max(0, lo)).fanNeedCfm);
  // (i): the dollars of every state on the way, for the bound by parts; (k) with the fan
  // taken out first.
  const dollars = wayDollars(walk, range, fanMostCfm);
  const byParts =
    Math.min(
      pathFactorPvBoundUsd(measures, dollars.heating, dollars.electricity),
      fanSplitPvBoundUsd({
        measures,
        heatingFactorLeast: spreads.heatingLeast,
        electricityFactorLeast: spreads.electricityLeast,
        balanced: bound.balanced,
        fanAtNode: walk.fanAtX,
        fanFinalLeast: fanCfm,
        fanMost: fanMostCfm,
        heatingUsdPerCfm: bound.heatingUsdPerCfm,
        coolingUsdPerCfm: bound.coolingUsdPerCfm,
        latentUsdPerCfm: bound.latentUsdPerCfm,
        fanUsdPerCfm: bound.fanUsdPerCfm,
        heating: flowsOnTheWay(range.heating),
        cooling: flowsOnTheWay(range.cooling),
        latent: flowsOnTheWay(range.latent),
      }),
    ) *
      (1 + BOUND_MARGIN) +
    rounding;
  return Math.min(
    spreads.heatingLeast * (node.heatingUsd - heatingLow) +
      spreads.electricityLeast * (node.electricityUsd - electricityLow) +
      sums.excessUpTo(least, most) +
      rounding,
    sums.pvUpTo(least, most) + rounding,
    2 * sums.pvUpTo(0, most, true),
    // (h): PV − cost ≤ the net knapsack, so PV ≤ it + the least cost (not for 'sir').
    settings.objective === 'sir' ? Infinity : sums.netUpTo(least, most) + rounding + leastCostUsd,
    byParts,
  );
}
