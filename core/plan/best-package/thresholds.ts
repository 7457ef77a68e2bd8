/**
 * Two leakage levels of a home the search's bounds rest on, both as functions of the total
 * CFM50 for the methods whose natural infiltration is linear in it: the useful floor (below
 * it no step saves heating or cooling air) and the fan threshold (below it the house needs
 * more 62.2 fan flow than it runs).
 */
import type { HomeModel } from '../../home-model.ts';

/** Infiltration methods whose infiltration is linear in total CFM50 (the bounds' condition). */
export const BOUNDED_METHODS: readonly string[] = ['nFactor', 'lblBasic', 'ashrae622'];

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
  // Hour by hour the latent load has a mean flow of its own (linear in c too).
  const slopes = [
    airflow.heatingCfm / total,
    airflow.coolingCfm / total,
    (airflow.coolingLatentCfm ?? airflow.coolingCfm) / total,
  ].filter((k) => k > 0);
  if (slopes.length === 0) return 0;
  const lowest = Math.min(...slopes.map(minimumOf));
  return Math.max(0, lowest * (1 - 1e-6) - 1e-6);
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
