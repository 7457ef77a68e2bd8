/**
 * The AIM-2 bound's view of a home and of one step (bounds-aim2.ts, (a) and (e) of its top
 * comment): which homes it covers, the box of a node's subtree, and the signed bounds of what a
 * step can save per CFM50 it removes, with the 62.2 fan's part; also the fractional knapsack
 * the bound sums them with.
 */
import { HOURS_PER_YEAR } from '../../constants.ts';
import type { HomeModel } from '../../home-model.ts';
import { LEAK_LOCATIONS, type LeakLocation } from '../../schema.ts';
import type { PriceBook } from '../prices.ts';
import { aim2BoxBounds, type Aim2Box, type Aim2BoxBounds, type SeasonBox } from './aim2-box.ts';
import { BOUND_MARGIN, HALF_CENT_USD, type LiveMeasure } from './remaining-measures.ts';

/** Relative margin on the energy lower bounds for float rounding. */
export const ENERGY_MARGIN = 1e-9;

/** Watts in a kilowatt. */
const WATTS_PER_KILOWATT = 1000;

/** What the AIM-2 bound keeps of a home. */
export interface Aim2Bound {
  model: HomeModel;
  box: Aim2BoxBounds;
  /**
   * p_h·u_h, p_e·u_c and p_e·β: dollars a year per cfm; hour by hour the cooling one is the
   * sensible load's and p_e·u_l the latent load's (0 on degree days, where u_c holds both).
   */
  heatingUsdPerCfm: number;
  coolingUsdPerCfm: number;
  latentUsdPerCfm: number;
  fanUsdPerCfm: number;
  balanced: boolean;
}

/**
 * Whether a model's home is one the AIM-2 bound covers: aim2 on degree-day seasons, or hour
 * by hour with its seasons' pressures at hand (aim2-hourly-bins.ts).
 */
export function aim2Bounded(model: HomeModel): boolean {
  if (model.home.infiltrationMethod !== 'aim2') return false;
  return model.climateBasis.kind === 'degreeDays' || model.hourlyAim2Pressures !== null;
}

/** The AIM-2 bound of a home it covers. */
export function buildAim2Bound(model: HomeModel, prices: PriceBook): Aim2Bound {
  const electricityPrice = prices.electricity?.usdPerUnitFloat ?? 0;
  const fanWattsPerCfm = model.ventilatedAirflow(model.testIn).fanWattsPerCfm;
  const hourly = model.climateBasis.kind === 'hourly';
  return {
    model,
    box: aim2BoxBounds(model),
    heatingUsdPerCfm:
      model.energy({ heatingCfm: 1, coolingCfm: 0 }).heatingFuelUnits *
      prices.heating.usdPerUnitFloat,
    coolingUsdPerCfm:
      model.energy(
        hourly
          ? { heatingCfm: 0, coolingCfm: 1, coolingLatentCfm: 0 }
          : { heatingCfm: 0, coolingCfm: 1 },
      ).coolingKwh * electricityPrice,
    latentUsdPerCfm: hourly
      ? model.energy({ heatingCfm: 0, coolingCfm: 0, coolingLatentCfm: 1 }).coolingKwh *
        electricityPrice
      : 0,
    fanUsdPerCfm: ((fanWattsPerCfm * HOURS_PER_YEAR) / WATTS_PER_KILOWATT) * electricityPrice,
    balanced: model.home.ventilation?.fanType === 'balanced',
  };
}

/**
 * The box of (a): X's leakage down to what the live measures can remove at each location,
 * with the states' totals at least `leastTotalCfm50` (the floor, or more: (g) of
 * bounds-aim2.ts).
 */
export function subtreeBox(
  bound: Aim2Bound,
  leakage: Readonly<Record<LeakLocation, number>>,
  measures: readonly LiveMeasure[],
  leastTotalCfm50: number = bound.model.floorCfm50,
  budgetLeftUsd: number = Infinity,
): Aim2Box | null {
  const lower = { ...leakage };
  for (const location of LEAK_LOCATIONS) {
    const reach = removableWithin(measures, location, budgetLeftUsd);
    lower[location] = Math.max(0, lower[location] - reach);
  }
  const floorCfm50 = Math.max(bound.model.floorCfm50, leastTotalCfm50);
  return bound.box({ lower, upper: leakage, floorCfm50 });
}

/**
 * The most the measures at a location can remove together within a budget, CFM50: each j
 * removes at most a_j (its size) for its whole cost, so a set within the budget removes at
 * most the fractional knapsack of sizes against costs, the most CFM50 per dollar first (those
 * that cost nothing whole). With no budget, Σ a_j.
 */
export function removableWithin(
  measures: readonly LiveMeasure[],
  location: LeakLocation,
  budgetUsd: number,
): number {
  const here = measures.filter((measure) => measure.location === location);
  const all = here.reduce((total, measure) => total + measure.sizeCfm50, 0);
  if (!(budgetUsd < Infinity)) return all;
  const sorted = [...here].sort((a, b) => b.sizeCfm50 * a.costUsd - a.sizeCfm50 * b.costUsd);
  let left = Math.max(0, budgetUsd) * (1 + BOUND_MARGIN) + 1e-9;
  let removed = 0;
  for (const measure of sorted) {
    if (measure.costUsd <= left) {
      removed += measure.sizeCfm50;
      left -= measure.costUsd;
    } else {
      removed += (measure.sizeCfm50 * left) / measure.costUsd;
      break;
    }
  }
  return Math.min(all, removed * (1 + BOUND_MARGIN));
}

/** The most a measure's own PV can be anywhere in the box, from its slopes (e), USD. */
export function largestStepPvAim2Usd(slopes: StepSlopes, measure: LiveMeasure): number {
  const perCfm50 =
    times(measure.factors.heating, slopes.heating[measure.location]) +
    times(measure.factors.electricity, slopes.electricity[measure.location]);
  if (Number.isNaN(perCfm50)) return Infinity;
  return measure.sizeCfm50 * Math.max(0, perCfm50) * (1 + BOUND_MARGIN) + HALF_CENT_USD + 1e-9;
}

/** The measures' sizes and rates in the order of the rates, largest first. */
interface RateEntries {
  sizes: Float64Array;
  rates: Float64Array;
}

/** Sizes and rates by rate, ties in the measures' order (a stable sort by insertion). */
function byRate(
  measures: readonly LiveMeasure[],
  rate: (measure: LiveMeasure) => number,
): RateEntries {
  const count = measures.length;
  const rates = new Float64Array(count);
  const sizes = new Float64Array(count);
  for (let i = 0; i < count; i += 1) {
    const measure = measures[i];
    if (measure === undefined) continue;
    const r = rate(measure);
    let j = i;
    while (j > 0 && (rates[j - 1] ?? 0) < r) {
      rates[j] = rates[j - 1] ?? 0;
      sizes[j] = sizes[j - 1] ?? 0;
      j -= 1;
    }
    rates[j] = r;
    sizes[j] = measure.sizeCfm50;
  }
  return { sizes, rates };
}

/**
 * The most Σ rate_j·x_j over 0 ≤ x_j ≤ a_j with Σ x_j in [least, most] (or, `positive`, the
 * most Σ rate_j⁺·x_j up to `most`): the largest rates first, the negative ones only as far as
 * `least` needs them.
 */
export function knapsackOf(
  measures: readonly LiveMeasure[],
  rate: (measure: LiveMeasure) => number,
): (least: number, most: number, positive?: boolean) => number {
  // Built on first use: a bound may not need every knapsack it is offered.
  let entries: RateEntries | null = null;
  return (least, most, positive = false) => {
    entries ??= byRate(measures, rate);
    const { sizes, rates } = entries;
    let taken = 0;
    let total = 0;
    for (let i = 0; i < rates.length; i += 1) {
      const entryRate = rates[i] ?? 0;
      const perCfm50 = positive ? Math.max(0, entryRate) : entryRate;
      const limit = perCfm50 > 0 ? most : least;
      const part = Math.min(sizes[i] ?? 0, Math.max(0, limit - taken));
      if (part <= 0) continue;
      taken += part;
      total += perCfm50 * part;
    }
    return total;
  };
}

/** a·b with 0·∞ taken as 0 (a factor that is 0 makes the term 0 whatever the other). */
export function times(a: number, b: number): number {
  return a === 0 || b === 0 ? 0 : a * b;
}

/** Signed bounds of a step's heating and electricity saving per CFM50 removed, USD/CFM50. */
export interface StepSlopes {
  heating: Record<LeakLocation, number>;
  electricity: Record<LeakLocation, number>;
}

/**
 * (e) with the fan: a step from s to s′ (c′ = c − a, both totals in [bottomCfm50, topCfm50])
 * changes Φ by [Φ(q, F′) − Φ(q′, F′)] + [Φ(q, F) − Φ(q, F′)]. The first is at most
 * share·a·D_l⁺ with share = q_max/hypot(F_min, q_max) ≥ ∂Φ/∂q (q_max = c_top·G_hi, F_min =
 * F(c_top); 1 when balanced or fanless); the second at most −φ·(F′ − F) with φ =
 * F_min/hypot(F_min, q_max) ≤ ∂Φ/∂F (1 when balanced), and F′ − F ≥ r·a where the 62.2 need
 * binds over the whole range: r = κ (need Q − κc, balanced) or 2α·c_bottom (need Q − αc²,
 * unbalanced: α(c + c′) ≥ 2α·c_bottom), κ and α read off the need at the top; else r = 0.
 * The added fan's own power rises by β·(F′ − F) ≥ β·r·a.
 */
export function stepSlopes(
  bound: Aim2Bound,
  box: Aim2Box,
  topCfm50: number,
  bottomCfm50: number,
): StepSlopes {
  const model = bound.model;
  const need = model.ventilation(topCfm50);
  const fanLeast = Math.max(model.existingFanCfm, need.fanNeedCfm);
  const binds = need.fanNeedCfm > model.existingFanCfm && topCfm50 > 0;
  const drop = need.requiredCfm - need.fanNeedCfm;
  const rise = !binds
    ? 0
    : (bound.balanced
        ? drop / topCfm50
        : (2 * drop * Math.max(0, bottomCfm50)) / (topCfm50 * topCfm50)) *
      (1 - ENERGY_MARGIN);
  const sharesOf = (season: SeasonBox | null) => {
    const most = topCfm50 * (season?.flowPerCfm50.hi ?? 0);
    const flow = Math.hypot(fanLeast, most);
    if (bound.balanced) return { air: 1, fan: 1 };
    // ∂Φ/∂q ≤ 1 and ∂Φ/∂F ≥ 0 always: the shares to fall back on.
    if (!Number.isFinite(most)) return { air: 1, fan: 0 };
    if (fanLeast === 0 || flow === 0) return { air: 1, fan: fanLeast === 0 ? 0 : 1 };
    return { air: most / flow, fan: fanLeast / flow };
  };
  const heatingShares = sharesOf(box.heating);
  const coolingShares = sharesOf(box.cooling);
  const latentShares = sharesOf(box.latent ?? null);
  const heating = {} as Record<LeakLocation, number>;
  const electricity = {} as Record<LeakLocation, number>;
  for (const location of LEAK_LOCATIONS) {
    const heatingFall = Math.max(0, box.heating.fallPerCfm50[location]);
    const coolingFall = Math.max(0, box.cooling?.fallPerCfm50[location] ?? 0);
    const latentFall = Math.max(0, box.latent?.fallPerCfm50[location] ?? 0);
    const heatingSlope =
      bound.heatingUsdPerCfm * (times(heatingShares.air, heatingFall) - heatingShares.fan * rise);
    const electricitySlope =
      times(
        bound.coolingUsdPerCfm,
        times(coolingShares.air, coolingFall) - coolingShares.fan * rise,
      ) +
      times(bound.latentUsdPerCfm, times(latentShares.air, latentFall) - latentShares.fan * rise) -
      bound.fanUsdPerCfm * rise;
    heating[location] =
      heatingSlope + ENERGY_MARGIN * bound.heatingUsdPerCfm * (heatingFall + rise);
    electricity[location] =
      electricitySlope +
      ENERGY_MARGIN *
        (times(bound.coolingUsdPerCfm, coolingFall + rise) +
          times(bound.latentUsdPerCfm, latentFall + rise) +
          bound.fanUsdPerCfm * rise);
  }
  return { heating, electricity };
}
