/**
 * The drivers of a season's AIM-2 flow for the box bounds (aim2-box.ts): a season on degree
 * days has one stack and one wind pressure; a season worked hour by hour (aim2-hourly.ts) is a
 * weighted sum over its hours, which is gathered here into a few bins whose bounds hold every
 * hour in them.
 *
 * Why a bin holds its hours. An hour g with both drivers adds w_g·(a·P_s + b·P_w +
 * B·√(a·b)·√(P_s·P_w))ⁿ to the season's flow per C (a = f_s^(1/n), b = f_w^(1/n)·s², both
 * functions of the shares alone; weights w_g ≥ 0 over the season's total). With
 * t_g = P_w/P_s that is w_g·P_sⁿ·(a + b·t_g + B·√(a·b)·√t_g)ⁿ, so hours are sorted by t and
 * cut into bins of about equal count; a bin of t from t_lo to t_hi carries Σ w_g·P_sⁿ and the
 * stack pressure 1 and the wind pressure [t_lo, t_hi], which interval arithmetic (interval.ts)
 * carries through the same formula to a range holding each of its hours' terms and their
 * derivatives by the shares. Calm hours add w·P_sⁿ·f_s and hours with no temperature
 * difference w·P_wⁿ·f_w·s^(2n): two more weights, on f_s and on f_w·s^(2n). Summed with
 * these weights the ranges hold the season's flow per C and its derivatives.
 */
import type { Aim2Season } from '../../weather/aim2-hourly.ts';
import type { Interval } from './interval.ts';

/** How many bins of hours a season is cut into. */
export const HOURLY_BINS = 8;

/** Hours of a season whose stack and wind pressures lie in the bin's ranges. */
export interface DriverBin {
  /** Σ of the hours' weights (× P_sⁿ when the stack pressure is normalized to 1). */
  weight: number;
  stackPa: Interval;
  windPa: Interval;
}

/** A season's drivers: bins of hours with both, and the weights of those with one alone. */
export interface SeasonDrivers {
  bins: DriverBin[];
  /** Weight on f_s (calm hours: Σ w·P_sⁿ over the season's total). */
  stackOnly: number;
  /** Weight on f_w·s^(2n) (hours at the indoor temperature: Σ w·P_wⁿ over the total). */
  windOnly: number;
}

/** A degree-day season: its one stack and wind pressure, at weight 1. */
export function degreeDayDrivers(stackPa: number, windPa: number): SeasonDrivers {
  return {
    bins: [
      { weight: 1, stackPa: { lo: stackPa, hi: stackPa }, windPa: { lo: windPa, hi: windPa } },
    ],
    stackOnly: 0,
    windOnly: 0,
  };
}

/**
 * A season worked hour by hour, in bins (top comment), for its sensible or its latent
 * weights; null when the season carries no weight (its mean flow is 0).
 */
export function hourlyDrivers(
  season: Aim2Season,
  exponentN: number,
  which: 'sensible' | 'latent',
  binCount: number = HOURLY_BINS,
): SeasonDrivers | null {
  const total = which === 'sensible' ? season.totalWeight : season.totalLatentWeight;
  if (!(total > 0)) return null;
  const weights = which === 'sensible' ? season.weight : season.latentWeight;
  const order = Array.from({ length: season.count }, (_, group) => group).filter(
    (group) => (weights[group] ?? 0) > 0,
  );
  const ratioOf = (group: number) => (season.windPa[group] ?? 0) / (season.stackPa[group] ?? 1);
  order.sort((a, b) => ratioOf(a) - ratioOf(b));
  const bins: DriverBin[] = [];
  const size = Math.max(1, Math.ceil(order.length / binCount));
  for (let start = 0; start < order.length; start += size) {
    const members = order.slice(start, start + size);
    let weight = 0;
    for (const group of members) {
      weight += ((weights[group] ?? 0) * (season.stackPa[group] ?? 0) ** exponentN) / total;
    }
    const first = members[0];
    const last = members[members.length - 1];
    if (first === undefined || last === undefined) continue;
    bins.push({
      weight,
      stackPa: { lo: 1, hi: 1 },
      windPa: { lo: ratioOf(first), hi: ratioOf(last) },
    });
  }
  const single = (sums: { sensible: number; latent: number }) =>
    (which === 'sensible' ? sums.sensible : sums.latent) / total;
  return { bins, stackOnly: single(season.stackOnly), windOnly: single(season.windOnly) };
}
