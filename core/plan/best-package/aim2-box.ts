/**
 * The enhanced model (AIM-2) over a box of leakage states, for the AIM-2 bound
 * (bounds-aim2.ts): bounds on the natural flow per CFM50 and on how fast the flow falls per
 * CFM50 removed at each location, for every state whose leakage at each location l lies in
 * [lower_l, upper_l].
 *
 * The flow. As `seasonalAirflowMethod` calls `aim2Infiltration` (core/infiltration/aim2.ts),
 * a season's flow of a state with total c and shares σ is q = c·G(σ), with
 * G = (S + W + B·√(S·W))ⁿ / 50ⁿ, S = f_s(σ)^(1/n)·P_s, W = f_w(σ)^(1/n)·ρ·(s(Y)·U)²/2,
 * B = −1/3 (Q_s^(1/n) = C^(1/n)·S and Q_w^(1/n) = C^(1/n)·W with C = c/50ⁿ, so the model's
 * combination is C·(S + W + B·√(S·W))ⁿ; core/plan/kernel-aim2.ts uses the same rearrangement).
 * f_s, f_w and the shelter s depend on the ceiling, floor and flue shares only (R = σ_c + σ_f,
 * X = σ_c − σ_f, Y = σ_y; the base of f_w's power, (X + R)/2, is σ_c).
 *
 * Its fall per CFM50. σ_k = L_k/c, so ∂σ_k/∂L_l = (δ_kl − σ_k)/c and
 *   ∂q/∂L_l = G + Σ_k ∂G/∂σ_k·(δ_kl − σ_k) = G + ∂G/∂σ_l − Σ_k σ_k·∂G/∂σ_k
 * (∂G/∂σ_wall = 0): a function of the shares alone. Its largest value over the box, D_l, is
 * taken by the interval rules of interval.ts from G and its derivatives over the box of
 * shares the leakage box allows: σ_l from l_lo/(l_lo + Σ_{k≠l} k_hi) to
 * l_hi/max(l_hi + Σ_{k≠l} k_lo, floor) (L/(L + rest) rises with L and falls with the rest;
 * the total is never below the floor), within [0, 1]; a location with no leakage anywhere in
 * the box has share 0; and, the shares summing to 1, each at most 1 less the others' lows and
 * at least 1 less their highs. R's range is cut to 1 − σ_y.lo likewise (`withinSumOfShares`).
 * A box with leakage at one location alone has G constant (`fallsAtOne`).
 * Hour by hour (a home with `hourlyWeather`) a season's flow is Σ over its hours of the same
 * formula with each hour's pressures, weighted: G is then a weighted sum over bins of hours,
 * each bin's pressures a range (aim2-hourly-bins.ts), plus the calm and windless hours'
 * single-driver terms; its derivatives are the same sums, so D_l bounds them too. The latent
 * load's mean flow, weighted by excess humidity, is a third season (`latent`).
 * Where a formula leaves its domain over the box (a negative f_s or f_w, 2 − R reaching 0),
 * no bound is given (null) and the caller cuts nothing.
 */
import { airDensityKgPerM3, standardPressurePa } from '../../air.ts';
import { GRAVITY_M_PER_S2, METERS_PER_FOOT, METERS_PER_SECOND_PER_MPH } from '../../constants.ts';
import type { HomeModel } from '../../home-model.ts';
import { aim2ShelterFactor, terrainWindSpeedRatio } from '../../infiltration/aim2.ts';
import { LEAK_LOCATIONS, type HomeFile, type LeakLocation } from '../../schema.ts';
import { DEFAULT_INDOOR_COOLING_F, DEFAULT_INDOOR_HEATING_F } from '../../seasonal-airflow.ts';
import {
  HOURLY_BINS,
  degreeDayDrivers,
  hourlyDrivers,
  type DriverBin,
  type SeasonDrivers,
} from './aim2-hourly-bins.ts';
import {
  abs,
  add,
  constant,
  div,
  iAdd,
  iMul,
  iSub,
  min,
  mul,
  mulByRange,
  plus,
  pow,
  powInUnit,
  scale,
  square,
  sub,
  variable,
  type Dual,
  type Interval,
} from './interval.ts';

/** Stack–wind interaction B of Walker & Wilson 1998, as in aim2.ts. */
const STACK_WIND_INTERACTION_B = -1 / 3;
const KELVIN_MINUS_CELSIUS = 273.15;
const TEST_PRESSURE_PA = 50;
/** Exponent on M in the stack factor, as in aim2.ts. */
const STACK_M_EXPONENT = 1.2;
/** Relative margin for float rounding on every bound given. */
const BOX_MARGIN = 1e-9;

type Season = NonNullable<HomeFile['climate']['heatingSeason']>;

interface SeasonTerms {
  stackPressurePa: number;
  /** ρ·U²/2 of the eave-height wind before shelter, Pa. */
  windPressurePa: number;
}

/** A season's flow over a box: G's range and D_l by location, per CFM50. */
export interface SeasonBox {
  flowPerCfm50: Interval;
  /** The most the flow can fall per CFM50 removed at each location (may be < 0), cfm/CFM50. */
  fallPerCfm50: Record<LeakLocation, number>;
  /** The locations by their fall, the largest first (ties in LEAK_LOCATIONS order). */
  byFall: readonly LeakLocation[];
}

export interface Aim2Box {
  heating: SeasonBox;
  /** Null when the home has no cooling season flow (the model's cooling flow is 0). */
  cooling: SeasonBox | null;
  /**
   * Hour by hour, the latent load's own mean flow (null when it is 0); absent on degree days,
   * where the cooling flow carries the latent load too.
   */
  latent?: SeasonBox | null;
}

/** A leakage box: each location from lower to upper, CFM50. */
export interface LeakageBox {
  lower: Readonly<Record<LeakLocation, number>>;
  upper: Readonly<Record<LeakLocation, number>>;
  floorCfm50: number;
}

export type Aim2BoxBounds = (box: LeakageBox) => Aim2Box | null;

/** Builds the box bounds of a home on the enhanced model (degree-day seasons). */
export function aim2BoxBounds(
  model: HomeModel,
  binsPerSeason: number = HOURLY_BINS,
): Aim2BoxBounds {
  const { house, climate } = model.home;
  const n = model.exponentN;
  const sitePressurePa = standardPressurePa(climate.elevationFt * METERS_PER_FOOT);
  const windRatio = terrainWindSpeedRatio({
    heightFt: house.heightFt,
    ...(house.siteTerrain === undefined ? {} : { siteTerrain: house.siteTerrain }),
  });
  // The same season terms as aim2Infiltration forms them (aim2.ts, seasonal-airflow.ts).
  const termsOf = (season: Season, kind: 'heating' | 'cooling'): SeasonTerms => {
    const indoorTempF =
      season.indoorTempF ??
      (kind === 'heating' ? DEFAULT_INDOOR_HEATING_F : DEFAULT_INDOOR_COOLING_F);
    const outdoorTempF =
      kind === 'heating' ? indoorTempF - season.meanDeltaTF : indoorTempF + season.meanDeltaTF;
    const density = airDensityKgPerM3(((outdoorTempF - 32) * 5) / 9, sitePressurePa);
    const indoorK = (indoorTempF - 32) / 1.8 + KELVIN_MINUS_CELSIUS;
    const deltaTK = Math.abs(season.meanDeltaTF) / 1.8;
    const eaveWindMps = season.meanWindSpeedMph * METERS_PER_SECOND_PER_MPH * windRatio;
    return {
      stackPressurePa:
        (density * GRAVITY_M_PER_S2 * house.heightFt * METERS_PER_FOOT * deltaTK) / indoorK,
      windPressurePa: (density * eaveWindMps * eaveWindMps) / 2,
    };
  };
  const driversOf = (terms: SeasonTerms | null) =>
    terms === null ? null : degreeDayDrivers(terms.stackPressurePa, terms.windPressurePa);
  const hourly = model.hourlyAim2Pressures?.() ?? null;
  const heating: SeasonDrivers | null = hourly
    ? hourlyDrivers(hourly.heating, n, 'sensible', binsPerSeason)
    : driversOf(climate.heatingSeason ? termsOf(climate.heatingSeason, 'heating') : null);
  const coolingHours = model.home.cooling ? (hourly?.cooling ?? null) : null;
  const cooling: SeasonDrivers | null = hourly
    ? coolingHours && hourlyDrivers(coolingHours, n, 'sensible', binsPerSeason)
    : driversOf(
        model.home.cooling && climate.coolingSeason
          ? termsOf(climate.coolingSeason, 'cooling')
          : null,
      );
  // Hour by hour the latent load has its own mean flow; on degree days it is the cooling one.
  const latent =
    hourly && coolingHours ? hourlyDrivers(coolingHours, n, 'latent', binsPerSeason) : null;
  const factors = factorFunctions(model);
  const perCfm50 = 1 / TEST_PRESSURE_PA ** n;

  return (box) => {
    const shares = shareBox(box);
    const ceiling = variable(0, shares.ceiling);
    const floor = variable(1, shares.floor);
    const flue = variable(2, shares.flue);
    const stackFactor = factors.stackFactor(ceiling, floor, flue);
    const windFactor = factors.windFactor(ceiling, floor, flue);
    if (stackFactor === null || windFactor === null) return null;
    const stackRoot = pow(stackFactor, 1 / n);
    const windRoot = pow(windFactor, 1 / n);
    // √(S·W) as √S·√W, each from its factor: where f_w (or f_s) tends to 0 the root's slope is
    // unbounded but of one sign, which a product of the two roots keeps.
    const stackHalf = pow(stackFactor, 1 / (2 * n));
    const windHalf = pow(windFactor, 1 / (2 * n));
    if (stackRoot === null || windRoot === null || stackHalf === null || windHalf === null) {
      return null;
    }
    const shelter = plus(
      scale(flue, factors.flueShelter - factors.wallShelter),
      factors.wallShelter,
    );
    const terms: ShareTerms = {
      stackRoot,
      windRoot: mul(windRoot, square(shelter)),
      crossRoot: mul(stackHalf, mul(windHalf, shelter)),
      stackFactor,
      windFactor,
      shelter,
      shares: [shares.ceiling, shares.floor, shares.flue],
      n,
      perCfm50,
    };
    if (heating === null) return null;
    const heatingBox = seasonFlow(terms, heating);
    const coolingBox = cooling === null ? null : seasonFlow(terms, cooling);
    const latentBox = latent === null ? null : seasonFlow(terms, latent);
    if (heatingBox === null || (cooling !== null && coolingBox === null)) return null;
    if (latent !== null && latentBox === null) return null;
    const only = onlyLocation(box);
    if (only !== null) {
      for (const season of [heatingBox, coolingBox, latentBox]) {
        if (season !== null) {
          season.fallPerCfm50 = fallsAtOne(only, season);
          season.byFall = byFall(season.fallPerCfm50);
        }
      }
    }
    return hourly
      ? { heating: heatingBox, cooling: coolingBox, latent: latentBox }
      : { heating: heatingBox, cooling: coolingBox };
  };
}

/**
 * What a box's seasons share: a = f_s^(1/n), b = f_w^(1/n)·s² and √(a·b) (`stackRoot`,
 * `windRoot`, `crossRoot`), f_s, f_w and the shelter s, each over the box, and the box's
 * ceiling, floor and flue shares.
 */
interface ShareTerms {
  stackRoot: Dual;
  windRoot: Dual;
  crossRoot: Dual;
  stackFactor: Dual;
  windFactor: Dual;
  shelter: Dual;
  shares: Interval[];
  n: number;
  perCfm50: number;
}

/** A quantity of the shares times a pressure range (a point range scales it). */
function timesPressure(quantity: Dual, pressure: Interval): Dual {
  return pressure.lo === pressure.hi
    ? scale(quantity, pressure.lo)
    : mulByRange(quantity, pressure);
}

/**
 * G over a bin of hours (or a degree-day season's one pair of pressures):
 * weight·(a·P_s + b·P_w + B·√(a·b)·√(P_s·P_w))ⁿ; null where it leaves its domain.
 */
function binFlow(parts: ShareTerms, bin: DriverBin): Dual | null {
  const s = timesPressure(parts.stackRoot, bin.stackPa);
  const w = timesPressure(parts.windRoot, bin.windPa);
  // Both pressures are at least 0, so √(P_s·P_w) runs from the product of the low roots to
  // that of the high ones.
  const crossPa: Interval = {
    lo: Math.sqrt(bin.stackPa.lo) * Math.sqrt(bin.windPa.lo),
    hi: Math.sqrt(bin.stackPa.hi) * Math.sqrt(bin.windPa.hi),
  };
  const cross = timesPressure(parts.crossRoot, crossPa);
  const inner = add(add(s, w), scale(cross, STACK_WIND_INTERACTION_B));
  // √(S·W) ≤ (S + W)/2, so the sum is at least 5/6 of S + W.
  inner.v = { lo: Math.max(inner.v.lo, (5 / 6) * (s.v.lo + w.v.lo)), hi: inner.v.hi };
  const g = pow(inner, parts.n);
  if (g === null || !(g.v.lo >= 0) || Number.isNaN(g.v.hi)) return null;
  return bin.weight === 1 ? g : scale(g, bin.weight);
}

/** A season's G over the box: its bins' and its single-driver hours' terms summed. */
function seasonFlow(terms: ShareTerms, drivers: SeasonDrivers): SeasonBox | null {
  let g: Dual | null = null;
  for (const bin of drivers.bins) {
    const part = binFlow(terms, bin);
    if (part === null) return null;
    g = g === null ? part : add(g, part);
  }
  if (drivers.stackOnly > 0) {
    const part = scale(terms.stackFactor, drivers.stackOnly);
    g = g === null ? part : add(g, part);
  }
  if (drivers.windOnly > 0) {
    const shelterPower = pow(terms.shelter, 2 * terms.n);
    if (shelterPower === null) return null;
    const part = scale(mul(terms.windFactor, shelterPower), drivers.windOnly);
    g = g === null ? part : add(g, part);
  }
  if (g === null || !(g.v.lo >= 0) || Number.isNaN(g.v.hi)) return null;
  return seasonBox(g, terms.shares, terms.perCfm50);
}

/** G's range and D_l (see the top comment), widened by the float margin. */
function seasonBox(g: Dual, shares: Interval[], perCfm50: number): SeasonBox {
  let weighted: Interval = { lo: 0, hi: 0 };
  g.d.forEach((part, at) => {
    weighted = iAdd(weighted, iMul(shares[at] ?? { lo: 0, hi: 1 }, part));
  });
  const own: Record<LeakLocation, Interval> = {
    ceiling: g.d[0],
    floor: g.d[1],
    flue: g.d[2],
    wall: { lo: 0, hi: 0 },
  };
  const magnitude =
    Math.abs(g.v.hi) + Math.abs(weighted.lo) + Math.abs(weighted.hi) + Math.abs(g.v.lo);
  const fallPerCfm50 = {} as Record<LeakLocation, number>;
  for (const location of LEAK_LOCATIONS) {
    const part = own[location];
    const fall = iSub(iAdd(g.v, part), weighted).hi;
    const margin = BOX_MARGIN * (magnitude + Math.abs(part.lo) + Math.abs(part.hi));
    fallPerCfm50[location] = Number.isNaN(fall) ? Infinity : (fall + margin) * perCfm50;
  }
  return {
    flowPerCfm50: {
      lo: Math.max(0, g.v.lo * (1 - BOX_MARGIN) * perCfm50),
      hi: g.v.hi * (1 + BOX_MARGIN) * perCfm50,
    },
    fallPerCfm50,
    byFall: byFall(fallPerCfm50),
  };
}

/** The locations by their fall, the largest first; a stable sort keeps ties in order. */
function byFall(fallPerCfm50: Record<LeakLocation, number>): LeakLocation[] {
  return [...LEAK_LOCATIONS].sort((a, b) => fallPerCfm50[b] - fallPerCfm50[a]);
}

/** The one location with leakage anywhere in the box, or null when there are more (or none). */
export function onlyLocation(box: LeakageBox): LeakLocation | null {
  const leaky = LEAK_LOCATIONS.filter((location) => box.upper[location] > 0);
  return leaky.length === 1 ? (leaky[0] ?? null) : null;
}

/**
 * D_l where every state of the box has leakage at one location l alone: its share is 1 in
 * every state, so G is one constant G* and q = c·G*, whose derivative by L_l is G* (at most
 * G's high end over the point box of shares). The interval rules cannot see this (where f_s
 * and f_w are 0, as at a share of 1 in the ceiling, the roots' slopes are infinite and their
 * products with the zero ranges of the other shares are not). No measure can remove anything
 * at the other locations (a live measure removes more than 0, so its location has leakage),
 * so their D stays unbounded.
 */
function fallsAtOne(only: LeakLocation, season: SeasonBox): Record<LeakLocation, number> {
  const falls = {} as Record<LeakLocation, number>;
  for (const location of LEAK_LOCATIONS) {
    falls[location] = location === only ? season.flowPerCfm50.hi : Infinity;
  }
  return falls;
}

/** The shares a leakage box allows (top comment). */
export function shareBox(box: LeakageBox): Record<LeakLocation, Interval> {
  const { lower, upper, floorCfm50 } = box;
  const lowSum = LEAK_LOCATIONS.reduce((total, location) => total + lower[location], 0);
  const highSum = LEAK_LOCATIONS.reduce((total, location) => total + upper[location], 0);
  const own = {} as Record<LeakLocation, Interval>;
  for (const location of LEAK_LOCATIONS) {
    const lo = lower[location];
    const hi = upper[location];
    const leastTotal = lo + (highSum - hi);
    const mostTotal = Math.max(hi + (lowSum - lo), floorCfm50);
    own[location] = {
      lo: leastTotal > 0 ? Math.max(0, (lo / leastTotal) * (1 - BOX_MARGIN)) : 0,
      hi: hi <= 0 ? 0 : mostTotal > 0 ? Math.min(1, (hi / mostTotal) * (1 + BOX_MARGIN)) : 1,
    };
  }
  // The shares sum to 1: each is at most 1 less the others' least and at least 1 less their most.
  const out = {} as Record<LeakLocation, Interval>;
  for (const location of LEAK_LOCATIONS) {
    let othersLo = 0;
    let othersHi = 0;
    for (const other of LEAK_LOCATIONS) {
      if (other === location) continue;
      othersLo += own[other].lo;
      othersHi += own[other].hi;
    }
    const { lo, hi } = own[location];
    const cutHi = Math.min(hi, (1 - othersLo) * (1 + BOX_MARGIN));
    const cutLo = Math.max(lo, (1 - othersHi) * (1 - BOX_MARGIN));
    out[location] = cutLo <= cutHi ? { lo: cutLo, hi: cutHi } : { lo, hi };
  }
  return out;
}

/**
 * R = σ_c + σ_f with its value range cut to what the shares allow: the four shares sum to 1
 * and none is below 0, so R = 1 − σ_wall − σ_y ≤ 1 − σ_y.lo (widened by the float margin).
 * Cutting a value range to a range every true value lies in keeps it a bound (interval.ts);
 * R's derivatives (1 by σ_c and by σ_f) are unchanged. Without the cut a box whose shares each reach 1 (a subtree that may seal
 * every location but one, whichever it is) lets R reach 2, where 2 − R, a divisor in f_s,
 * reaches 0 and nothing is bounded.
 */
export function withinSumOfShares(r: Dual, flue: Dual): Dual {
  const most = (1 - flue.v.lo) * (1 + BOX_MARGIN);
  return { v: { lo: r.v.lo, hi: Math.min(r.v.hi, Math.max(r.v.lo, most)) }, d: r.d };
}

/** f_s and f_w over a share box (aim2.ts's formulas), and the shelter terms. */
function factorFunctions(model: HomeModel) {
  const { house } = model.home;
  const n = model.exponentN;
  const zf = house.flueHeightFt === undefined ? undefined : house.flueHeightFt / house.heightFt;
  const front = 0.19 * (2 - n);
  const stackFactor = (c: Dual, f: Dual, y: Dual): Dual | null => {
    const r = withinSumOfShares(add(c, f), y);
    const x = sub(c, f);
    const ratio = div(square(add(x, scale(y, 2 * n + 1))), plus(scale(r, -1), 2));
    if (ratio === null) return null;
    const m = min(constant(1), ratio);
    const mPower = pow(m, STACK_M_EXPONENT);
    if (mPower === null) return null;
    const base = pow(plus(scale(mPower, -0.5), 0.5), n + 1);
    if (base === null) return null;
    let fs = mul(scale(plus(scale(r, n), 1), 1 / (n + 1)), base);
    if (zf !== undefined) {
      const xCritical = plus(
        add(scale(r, 1 - 2 / (n + 1)), scale(y, -2 / (n + 1) - 2 * (zf - 1) ** n)),
        2 / (n + 1),
      );
      const rPower = pow(r, 1 - n);
      if (rPower === null) return null;
      const inner = plus(scale(mul(square(sub(xCritical, x)), rPower), -3 / (2 * (zf + 1))), 1);
      fs = add(fs, mul(scale(y, n * (zf - 1) ** ((3 * n - 1) / 3)), inner));
    }
    return fs;
  };
  const windFactor = (c: Dual, f: Dual, y: Dual): Dual | null => {
    let fw: Dual | null;
    if (house.foundation === 'crawlspace') {
      const r = withinSumOfShares(add(c, f), y);
      const xHeld = min(sub(c, f), plus(scale(y, -2), 1));
      const rCrawl = plus(scale(r, -(n / 2 + 0.2)), 1);
      const yCrawl = plus(scale(y, -0.25), 1);
      const xShift = plus(add(scale(r, -0.2), scale(y, -1.5)), 0.2);
      const ratio = div(sub(xHeld, xShift), plus(scale(r, -1), 2));
      const held = ratio === null ? null : pow(abs(ratio), 1.5);
      fw = held === null ? null : mul(scale(mul(plus(scale(held, -1), 1), rCrawl), front), yCrawl);
    } else {
      const power = powInUnit(c, plus(scale(y, -1), 1.5));
      const j = add(c, y);
      const flueSide = mul(scale(y, 0.25), sub(j, mul(scale(y, 2), square(square(j)))));
      fw = power === null ? null : sub(scale(plus(scale(power, -1), 1), front), flueSide);
    }
    return fw;
  };
  return {
    stackFactor,
    windFactor,
    wallShelter: aim2ShelterFactor({ shelterClass: house.shelterClass, flueShare: 0 }),
    flueShelter: aim2ShelterFactor({ shelterClass: house.shelterClass, flueShare: 1 }),
  };
}
