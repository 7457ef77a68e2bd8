/**
 * The hours of a weather year that carry weight in a season, gathered once into compact
 * arrays, so the infiltration of each leakage state loops only over them.
 *
 * Notes: a heating hour is one colder than the heating balance point, weighted by
 * (T_bal − T) °F·h and driven by ΔT = indoor heating − T; a cooling hour is one warmer than
 * the cooling balance point, weighted by (T − T_bal,c) °F·h and by its excess humidity
 * 7000·(W − W_in)⁺ grain/lb·h, and driven by ΔT = T − indoor cooling. The weights are formed
 * and summed in the order and by the operations of `hourlySeasons`, so the totals equal its
 * degree-hours and grain-hours to the last bit.
 */
import { GRAINS_PER_POUND } from './psychrometrics.ts';
import type { HourlyBasis, WeatherYear } from './weather-year.ts';

/** One season's weighted hours, each array `count` long. */
export interface SeasonHours {
  count: number;
  /** Indoor temperature of the season, °F. */
  indoorF: number;
  /** Outdoor dry-bulb, °F. */
  outdoorF: Float64Array;
  /** Indoor − outdoor (heating) or outdoor − indoor (cooling), °F; may be negative. */
  deltaTF: Float64Array;
  /** Station wind, mph. */
  windMph: Float64Array;
  /** Degree-hours beyond the balance point, °F·h. */
  weight: Float64Array;
  /** Excess humidity, grain/lb·h (all 0 in the heating season). */
  latentWeight: Float64Array;
  /** Σ weight, °F·h. */
  totalWeight: number;
  /** Σ latentWeight, grain/lb·h. */
  totalLatentWeight: number;
}

function emptySeason(count: number, indoorF: number): SeasonHours {
  return {
    count,
    indoorF,
    outdoorF: new Float64Array(count),
    deltaTF: new Float64Array(count),
    windMph: new Float64Array(count),
    weight: new Float64Array(count),
    latentWeight: new Float64Array(count),
    totalWeight: 0,
    totalLatentWeight: 0,
  };
}

/**
 * The heating hours and, when asked for, the cooling hours of a checked year.
 *
 * @param year - a weather year already checked by `checkWeatherYear`
 * @param basis - a basis already checked by `checkHourlyBasis`
 * @param withCooling - whether to gather the cooling hours (a house without cooling needs none)
 */
export function seasonHoursOf(
  year: WeatherYear,
  basis: HourlyBasis,
  withCooling: boolean,
): { heating: SeasonHours; cooling: SeasonHours | null } {
  const hourCount = year.outdoorF.length;
  let heatingCount = 0;
  let coolingCount = 0;
  for (let hour = 0; hour < hourCount; hour += 1) {
    const outdoorF = year.outdoorF[hour]!;
    if (outdoorF < basis.heatingBalancePointF) heatingCount += 1;
    if (outdoorF > basis.coolingBalancePointF) coolingCount += 1;
  }
  const heating = emptySeason(heatingCount, basis.indoorHeatingF);
  const cooling = withCooling ? emptySeason(coolingCount, basis.indoorCoolingF) : null;
  let heatingIndex = 0;
  let coolingIndex = 0;
  for (let hour = 0; hour < hourCount; hour += 1) {
    const outdoorF = year.outdoorF[hour]!;
    const windMph = year.windMph[hour]!;
    if (outdoorF < basis.heatingBalancePointF) {
      const weight = basis.heatingBalancePointF - outdoorF;
      heating.outdoorF[heatingIndex] = outdoorF;
      heating.deltaTF[heatingIndex] = basis.indoorHeatingF - outdoorF;
      heating.windMph[heatingIndex] = windMph;
      heating.weight[heatingIndex] = weight;
      heating.totalWeight += weight;
      heatingIndex += 1;
    }
    if (cooling && outdoorF > basis.coolingBalancePointF) {
      const weight = outdoorF - basis.coolingBalancePointF;
      const excess = year.humidityRatio[hour]! - basis.indoorHumidityRatio;
      const latentWeight = excess > 0 ? excess * GRAINS_PER_POUND : 0;
      cooling.outdoorF[coolingIndex] = outdoorF;
      cooling.deltaTF[coolingIndex] = outdoorF - basis.indoorCoolingF;
      cooling.windMph[coolingIndex] = windMph;
      cooling.weight[coolingIndex] = weight;
      cooling.latentWeight[coolingIndex] = latentWeight;
      cooling.totalWeight += weight;
      if (excess > 0) cooling.totalLatentWeight += latentWeight;
      coolingIndex += 1;
    }
  }
  return { heating, cooling };
}
