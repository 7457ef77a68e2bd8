/**
 * The bound by parts of path-factors.ts with the 62.2 fan taken out first (bounds-aim2.ts (k)).
 *
 * Why it holds. A state's flow with the fan is Φ = F + g(F, q): g = q with no fan or with a
 * balanced one, g = hypot(F, q) − F = q²/(hypot(F, q) + F) with an unbalanced one, which rises
 * with q and falls with F. Along a package's path the total only falls, so the fan F(c) only
 * rises: F_0 = F(c_X) ≤ F_j ≤ F(lo), and the final F_m ≥ F(hi). A year's heating dollars are
 * p_h·(F_j + g_j) and electricity p_c·(F_j + g_c,j) + p_l·(F_j + g_l,j) + p_β·(F_j − E), so
 * the PV Σ φ_j·(d_{j−1} − d_j) splits in two:
 * - the fan's part, Σ φ_j·k·(F_{j−1} − F_j) with every term ≤ 0, is at most the least factor
 *   times k·(F_0 − F_m) ≤ k·(F_0 − F(hi)) (k = p_h, or p_c + p_l + p_β for electricity);
 * - the rest, Σ φ_j·(e_{j−1} − e_j) with e = p_h·g (or p_c·g_c + p_l·g_l), is the bound by
 *   parts on e's range over the states on the way: g at least g(F(lo), q_least) and at most
 *   g(F_0, q_most).
 * So the fan's rise, which a tight house's sealing brings, counts against every package at
 * the least factor, instead of widening the range that the rises of the factors multiply.
 */
import { pathFactorPvBoundUsd } from './path-factors.ts';
import type { LiveMeasure } from './remaining-measures.ts';

/** Relative margin on the ranges for float rounding. */
const SPLIT_MARGIN = 1e-9;

/** A season's natural flow: at the node, and its least and most on the way, cfm. */
export interface FlowRange {
  atNode: number;
  least: number;
  most: number;
}

export interface FanSplitInput {
  measures: readonly LiveMeasure[];
  /** The least heating and electricity factors of the measures. */
  heatingFactorLeast: number;
  electricityFactorLeast: number;
  balanced: boolean;
  /** F at the node, F(hi) (the final state's least) and F(lo) (the most on the way), cfm. */
  fanAtNode: number;
  fanFinalLeast: number;
  fanMost: number;
  heatingUsdPerCfm: number;
  coolingUsdPerCfm: number;
  latentUsdPerCfm: number;
  fanUsdPerCfm: number;
  heating: FlowRange;
  cooling: FlowRange;
  latent: FlowRange;
}

/** g(F, q): what the natural flow adds to the fan's (top comment). */
function overFan(fanCfm: number, flowCfm: number, balanced: boolean): number {
  if (fanCfm === 0 || balanced) return flowCfm;
  return (flowCfm * flowCfm) / (Math.hypot(fanCfm, flowCfm) + fanCfm);
}

/** The range of g over the way's states, and its value at the node. */
function excessRange(input: FanSplitInput, flow: FlowRange) {
  return {
    atNode: overFan(input.fanAtNode, flow.atNode, input.balanced),
    least: overFan(input.fanMost, Math.max(0, flow.least), input.balanced) * (1 - SPLIT_MARGIN),
    most: overFan(input.fanAtNode, flow.most, input.balanced) * (1 + SPLIT_MARGIN),
  };
}

/** The bound of the top comment on the PV of any package below the node, USD (no rounding). */
export function fanSplitPvBoundUsd(input: FanSplitInput): number {
  const heating = excessRange(input, input.heating);
  const cooling = excessRange(input, input.cooling);
  const latent = excessRange(input, input.latent);
  const scaled = (range: typeof heating, usdPerCfm: number) => ({
    atNode: range.atNode * usdPerCfm,
    least: range.least * usdPerCfm,
    most: range.most * usdPerCfm,
  });
  const heatingUsd = scaled(heating, input.heatingUsdPerCfm);
  const coolingUsd = scaled(cooling, input.coolingUsdPerCfm);
  const latentUsd = scaled(latent, input.latentUsdPerCfm);
  const electricityUsd = {
    atNode: coolingUsd.atNode + latentUsd.atNode,
    least: coolingUsd.least + latentUsd.least,
    most: coolingUsd.most + latentUsd.most,
  };
  const fanRiseCfm = input.fanAtNode - input.fanFinalLeast;
  const fanPart =
    input.heatingFactorLeast * input.heatingUsdPerCfm * fanRiseCfm +
    input.electricityFactorLeast *
      (input.coolingUsdPerCfm + input.latentUsdPerCfm + input.fanUsdPerCfm) *
      fanRiseCfm;
  return fanPart + pathFactorPvBoundUsd(input.measures, heatingUsd, electricityUsd);
}
