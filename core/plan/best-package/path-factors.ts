/**
 * A bound on a package's PV that needs no slope of the energy curve, only the range of a
 * year's energy dollars over the states the package can pass through (bounds-aim2.ts (i)).
 *
 * Why it holds. A package below node X takes steps j = 1…m (in the canonical order) through
 * states s_0 = X, s_1, …, s_m; h_j is a year's heating dollars at s_j and F_j ≥ 0 the heating
 * UPV* factor of step j's measure. Its heating PV is Σ_j F_j·(h_{j−1} − h_j), which summation
 * by parts turns into
 *   F_1·h_0 − F_m·h_m + Σ_{j<m} (F_{j+1} − F_j)·h_j.
 * With every h_j (j ≥ 1) in [ℓ, u], U the sum of the rises F_{j+1} − F_j > 0 and D that of the
 * falls (U − D = F_m − F_1, all ≥ 0), this is at most F_1·h_0 − F_m·ℓ + U·u − D·ℓ
 * = F_1·(h_0 − ℓ) + U·(u − ℓ). Electricity likewise with its own factors and dollars. Steps
 * that change nothing add F_j·0 and can be dropped from the sequence first, so the factors run
 * over a subsequence of the measures that can still remove anything, in canonical order; the
 * bound takes the largest value over all such subsequences, by dynamic programming over the
 * last measure taken (the value of a subsequence depends only on its first factor and its
 * rises, and extending one adds its last rise; the best chain ending at each distinct pair of
 * factors is all the extension needs). Its worth is where slopes are unbounded: the
 * range of dollars is finite wherever the flow is.
 */
import type { LiveMeasure } from './remaining-measures.ts';

/** The energy dollars a year of (i): at the node, and the range over the states below it. */
export interface DollarRange {
  /** At the node, USD a year. */
  atNode: number;
  /** At most / at least at any state below it, USD a year. */
  most: number;
  least: number;
}

/**
 * The most F_1·(h_0 − ℓ) + U·(u − ℓ), heating plus electricity, over the subsequences of the
 * measures (taken in the order given, the canonical order).
 */
export function pathFactorPvBoundUsd(
  measures: readonly LiveMeasure[],
  heating: DollarRange,
  electricity: DollarRange,
): number {
  const heatingFirst = heating.atNode - heating.least;
  const electricityFirst = electricity.atNode - electricity.least;
  const heatingRise = Math.max(0, heating.most - heating.least);
  const electricityRise = Math.max(0, electricity.most - electricity.least);
  // The value of a chain ending at a measure; extending it adds a rise that depends only on
  // the last measure's factors, so it is enough to keep, for each distinct pair of factors
  // (measures of one life share theirs), the best chain ending at one with that pair.
  const heatingOf: number[] = [];
  const electricityOf: number[] = [];
  const bestOf: number[] = [];
  let largest = 0;
  for (const { factors } of measures) {
    let value = factors.heating * heatingFirst + factors.electricity * electricityFirst;
    let own = -1;
    for (let k = 0; k < bestOf.length; k += 1) {
      const heating = heatingOf[k] ?? 0;
      const electricity = electricityOf[k] ?? 0;
      const extended =
        (bestOf[k] ?? 0) +
        Math.max(0, factors.heating - heating) * heatingRise +
        Math.max(0, factors.electricity - electricity) * electricityRise;
      value = Math.max(value, extended);
      if (heating === factors.heating && electricity === factors.electricity) own = k;
    }
    if (own < 0) {
      heatingOf.push(factors.heating);
      electricityOf.push(factors.electricity);
      bestOf.push(value);
    } else {
      bestOf[own] = Math.max(bestOf[own] ?? 0, value);
    }
    largest = Math.max(largest, value);
  }
  return largest;
}
