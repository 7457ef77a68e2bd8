/**
 * What the hour-by-hour infiltration methods share: the shape of their result, the total of a
 * leakage state, and the weighted mean of a season.
 */
import type { SeasonalAirflowCfm } from '../energy.ts';
import { InputError } from '../errors.ts';
import type { LeakageByLocation } from '../home-model.ts';

/** Degree-hour-weighted mean flows of a weather year, cfm. */
export interface HourlyAirflowCfm extends SeasonalAirflowCfm {
  /** Mean flow of the cooling hours weighted by their excess humidity, for the latent load, cfm. */
  coolingLatentCfm: number;
}

/**
 * The total CFM50 of a leakage state.
 *
 * @throws InputError naming `leakage.<location>` for a CFM50 that is negative or not finite
 */
export function totalCfm50Of(leakage: LeakageByLocation): number {
  const total = leakage.ceiling + leakage.wall + leakage.floor + leakage.flue;
  const allValid =
    leakage.ceiling >= 0 &&
    leakage.wall >= 0 &&
    leakage.floor >= 0 &&
    leakage.flue >= 0 &&
    Number.isFinite(total);
  if (!allValid) {
    for (const location of ['ceiling', 'wall', 'floor', 'flue'] as const) {
      const cfm50 = leakage[location];
      if (!(cfm50 >= 0) || !Number.isFinite(cfm50)) {
        throw InputError.at(`leakage.${location}`, `expected a CFM50 of at least 0, got ${cfm50}`);
      }
    }
  }
  return total;
}

/** Σ w·q / Σ w: 0 for a season with no weight (its load is 0 whatever the flow). */
export function weightedMean(weightedSum: number, totalWeight: number): number {
  return totalWeight > 0 ? weightedSum / totalWeight : 0;
}
