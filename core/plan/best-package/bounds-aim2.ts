/**
 * Whether any package below a node could still beat the best one found, for homes on the
 * enhanced model (AIM-2) with degree-day seasons. bounds.ts does this for the methods linear
 * in CFM50, where a state's energy is a function of its total; under AIM-2 it depends on where
 * the leaks are, so the bound here works on the box of states the node's subtree can reach.
 *
 * Why it holds. A package below node X adds steps T; c_X is X's total, c_f the final one,
 * L = c_X − c_f = Σ_T applied_j.
 * (a, b) As in bounds.ts (remaining-measures.ts): measure j removes at most a_j (its removal
 * at X) anywhere below X, all of them no more than is left at each location and above the
 * floor, and T costs at least K(L). So every state below X has, at each location l, leakage in
 * [lower_l, upper_l] with upper_l = X's leakage and lower_l = max(0, upper_l − r_l): the box.
 * r_l is Σ_{j at l} a_j, or less with a budget (aim2-steps.ts `removableWithin`): T's energy
 * cost is within the budget left, and a set of the measures at l within a budget removes at
 * most the fractional knapsack of their sizes against their costs.
 * (c) aim2-box.ts gives, for each season and over the whole box, G_lo ≤ q/c (the natural flow
 * per CFM50) and D_l ≥ ∂q/∂L_l (the flow's fall per CFM50 removed at l, wherever it has a
 * derivative). q is Lipschitz on the box (away from c = 0, where it tends to 0) and the
 * branches of its min and |·| switch finitely often along a line, so along any segment inside
 * the box in the direction of one location, q(start) − q(end) ≤ D_l·(its length).
 * (d) The final flow: walking from X to f one location at a time stays in the box, so
 * q(f) ≥ q(X) − Σ_l D_l·x_l with x_l ∈ [0, upper_l − lower_l], Σ x_l = L; the largest
 * Σ D_l·x_l for L in [L0, L1] takes the largest D first (up to L1, and down to L0 if the
 * positive D do not reach it). Also q(f) ≥ c_f·G_lo. The larger of the two, at least 0.
 * (e) Energy. A year's heating dollars h = p_h·u_h·Φ_h and electricity e = p_e·(u_c·Φ_c +
 * β·(F − E)), Φ = q + F (balanced), hypot(F, q) (unbalanced) or q (no fan), F(c) = max(E,
 * 62.2 need(c)) non-increasing in c (energy-cells.ts). Φ rises with q and with F, so for c_f in
 * [lo, hi]: h(f) ≥ p_h·u_h·Φ(q_lo, F(hi)) and e(f) ≥ p_e·(u_c·Φ(q_lo, F(hi)) + β·(F(hi) − E)).
 * One step from s to s′ (c′ = c − a, both in the box and at or above the floor) saves at most
 * a·ĝ_h,l and a·ĝ_e,l, the signed slopes of `stepSlopes` (aim2-steps.ts; the fan's part as in energy-cells.ts
 * (ii), with the box's largest flow and least fan flow in the shares). Every state on these
 * walks and steps has a total between c_f and c_X, so at or above the floor.
 * (f) PV of T, before rounding, is at most each of: (1) as in bounds.ts (c), with hf_j =
 * hf_min + δʰ_j and ef_j = ef_min + δᵉ_j over the live measures, hf_min·(h_X − h_f) +
 * ef_min·(e_X − e_f) + Σ_T (δʰ_j·Δh_j + δᵉ_j·Δe_j), each δ·Δ ≤ applied_j·(δʰ_j·ĝ_h +
 * δᵉ_j·ĝ_e) (δ ≥ 0); (2) Σ_T applied_j·(hf_j·ĝ_h + ef_j·ĝ_e). With applied_j ≤ a_j and Σ
 * applied = L in [L0, L1], a sum Σ applied_j·rate_j is at most the fractional knapsack of the
 * rates, largest first, up to L1 (the negative ones only as far as L0 needs them). A year's
 * savings: (h + e)(X) − (h + e)(f), or Σ_T applied_j·(ĝ_h + ĝ_e). Rounding: a step's figure
 * rounds to at most x + 0.005, and to at most 2·x⁺ (bounds.ts (e)), so add half a cent a live
 * step to (1) and (2), or take twice the knapsack of the positive parts of the rates.
 * (g) The fan (bounds.ts (d)), K at the top of a range of c_f and the budget, the package
 * SIR ≥ 1 drop and the objectives' outlooks are those of bounds.ts. The walk judges the whole
 * range of c_f from c_X down to the lowest total the measures can reach, and halves a range
 * that may win (its upper half first) up to AIM2_HALVINGS times before it says so: a range is
 * lost only when its own bounds lose, so every package is judged by a range that holds it.
 * A range [lo, hi] gets a box of its own: every state on the way from X to a final state
 * with total ≥ lo has total ≥ lo (totals only fall along a path), so (a)'s box with its floor
 * raised to lo holds them all, and (c)–(f) hold on it with the bottom lo; its shares are
 * narrower (aim2-box.ts bounds σ_l by l_hi/max(…, floor)), often away from a share of 1 in
 * the ceiling, where the interval derivatives are infinite. Ranges of the first
 * RANGED_BOX_HALVINGS halvings get their own box; deeper ones use their outer range's box,
 * which holds their states too (its floor is lower), as does a range whose own box has no
 * bound.
 * (h) PV less cost, jointly ('npv' and 'savings' with package SIR ≥ 1). Step j's PV is at most
 * applied_j·p_j before rounding (p_j = hf_j·ĝ_h + ef_j·ĝ_e, as in (f)(2)), and its cost is
 * cost_j = κ_j·a_j ≥ κ_j·applied_j (applied_j ≤ a_j, κ_j = cost_j/a_j as in (b)). So PV(T) −
 * cost(T) ≤ Σ_T applied_j·(p_j − κ_j) + half a cent a live step, at most the knapsack N of
 * the rates p_j − κ_j over Σ applied = L in [L0, L1]. The outlooks use PV(T) only as PV(T) −
 * cost(T) (NPV, and the package SIR drop) with cost(T) ≥ K(L0), so PV ≤ N + K(L0) serves
 * them as a bound on PV (it is no bound on PV itself: not for 'sir'). It is what cuts a
 * subtree whose measures each lose money at every state it can reach, where the separate
 * bounds pair the largest saving rate with the cheapest cost rate of different measures.
 * (i) PV by parts, with no slope (path-factors.ts). Summation by parts bounds the PV of T by
 * F_1·(h_X − ℓ) + U·(u − ℓ) (and the same for electricity), F_1 the first step's factor, U the
 * sum of the rises of the factors along T, and [ℓ, u] the range of a year's dollars over the
 * states T passes through: every one has a total in [lo, c_X], so its flow is at most c_X·G_hi
 * and its fan at most F(lo), and it is at least the flow of (d) with L in [0, c_X − lo] and
 * the fan at X's (or the final state's least of (e)). Only the flow's range enters, never its
 * slope, so this stays finite where (f) and (h) are not: where the box reaches a share of 1 in
 * the ceiling. It is what proves a tight house with a 62.2 fan loses on every package, where
 * the fan's flow dwarfs what sealing saves.
 * (k) The same with the 62.2 fan taken out first (fan-split.ts): the fan only rises along a
 * path, so its share of the dollars counts at the least factor, F(c_X) − F(hi) against every
 * package, and the rest (what the natural flow adds to the fan's) gets the bound by parts.
 * Where sealing calls for more fan, this is what keeps the rises of the lives' factors from
 * multiplying the fan's whole range.
 * Where the box's bounds are not numbers (a formula out of its domain) or are infinite (the
 * wind or stack factor reaching 0 within the box, where the interval rules give the flow's
 * derivative no bound, e.g. a box in which every leak but the ceiling's may be sealed), the
 * terms built on slopes cut nothing and (i) is left; deeper nodes and narrower ranges have
 * smaller boxes.
 * Hour by hour an AIM-2 home's flow is a load-weighted mean over the hours; aim2-box.ts bounds
 * it over the box from the hours gathered in bins (aim2-hourly-bins.ts), and the latent load,
 * which then has its own mean flow, enters the electricity bounds like the cooling one
 * (aim2-steps.ts, `latentUsdPerCfm`); everything above holds as it stands.
 */
import { AIM2_HALVINGS, mayWinIn, rangeSums, roomsOf, type RangeWalk } from './aim2-ranges.ts';
import { subtreeBox, type Aim2Bound } from './aim2-steps.ts';
import {
  deadEndMayWin,
  outlookMaker,
  type BoundNode,
  type BoundSettings,
  type CellOutlook,
} from './bounds.ts';
import {
  BOUND_MARGIN,
  HALF_CENT_USD,
  costCurve,
  factorSpreads,
  type LiveMeasure,
} from './remaining-measures.ts';

export { AIM2_HALVINGS, RANGED_BOX_HALVINGS } from './aim2-ranges.ts';
export {
  aim2Bounded,
  buildAim2Bound,
  largestStepPvAim2Usd,
  stepSlopes,
  subtreeBox,
  type Aim2Bound,
  type StepSlopes,
} from './aim2-steps.ts';

/**
 * Whether some package strictly below an AIM-2 node might beat the best one found: false only
 * when every range its final total could be in is judged lost by `mayWin` (aim2-ranges.ts).
 */
export function subtreeMayWinAim2(
  bound: Aim2Bound,
  node: BoundNode,
  measures: readonly LiveMeasure[],
  settings: BoundSettings,
  mayWin: (outlook: CellOutlook) => boolean,
): boolean {
  if (measures.length === 0) return deadEndMayWin(node, settings, mayWin);
  const box = subtreeBox(
    bound,
    node.leakage,
    measures,
    settings.floorCfm50,
    settings.budgetLeftUsd,
  );
  if (box === null) return true;
  const natural = bound.model.airflow(node.leakage);
  const spreads = factorSpreads(measures);
  const slack =
    BOUND_MARGIN *
    ((spreads.heatingMost + spreads.electricityMost + 1) *
      (Math.abs(node.heatingUsd) + Math.abs(node.electricityUsd) + 1) +
      Math.abs(node.openNpvUsd) +
      Math.abs(node.annualUsd) +
      node.energyPvUsd +
      node.energyCostUsd +
      settings.fanCostUsd +
      measures.reduce((total, measure) => total + measure.costUsd, 0) +
      1);
  const curve = costCurve(node.leakage, node.cfm50 - settings.floorCfm50, measures);
  const model = bound.model;
  const walk: RangeWalk = {
    bound,
    node,
    measures,
    settings,
    mayWin,
    outlookOf: outlookMaker(node, settings, slack),
    natural,
    // Hour by hour the latent load's own mean flow (aim2-box.ts `latent`; 0 on degree days,
    // where bound.latentUsdPerCfm is 0).
    naturalLatentCfm: natural.coolingLatentCfm ?? 0,
    spreads,
    rounding: HALF_CENT_USD * measures.length,
    curve,
    bottom: node.cfm50 - curve.totalCfm50,
    rooms: roomsOf(node, measures),
    budgetLeft: settings.budgetLeftUsd * (1 + BOUND_MARGIN) + 1e-9,
    fanAtX: Math.max(model.existingFanCfm, model.ventilation(node.cfm50).fanNeedCfm),
  };
  return mayWinIn(walk, walk.bottom, node.cfm50, AIM2_HALVINGS, rangeSums(walk, box, walk.bottom));
}
