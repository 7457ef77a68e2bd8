/**
 * The uncertainty bench's reference kernel: a home's package draws written as bare as they
 * can be, to tell how far the engine (core/uncertainty/monte-carlo.ts over core/plan/kernel.ts)
 * is from the arithmetic itself. It does what the engine must do for a portfolio's home and
 * nothing more, with the same numbers:
 * - the same generator (xoshiro128** reseeded from seed, stream and draw by MurmurHash3's
 *   finalizer, the seed and stream part worked out once a home) and the same PERT tables
 *   (`pertQuantileTable`), interpolated the same way;
 * - the same arithmetic for each step (the location and floor limits, natural infiltration
 *   proportional to CFM50, the 62.2 fan by superposition or added for a balanced fan, the
 *   equipment, the present-value factors), so its figures equal the engine's;
 * - its summary is P10 / P50 / P90 (Hyndman & Fan's definition 7) of NPV, annual savings and
 *   CFM50 after by selection (reference-select.ts: Hoare's FIND, then the smallest value above
 *   each place), no sort, and the mean NPV.
 * Everything that does not change from draw to draw is packed beforehand into typed arrays
 * (`packHome`, not timed by the bench): the test-in state, the package's cost, each measure's factors.
 * It covers the methods whose infiltration is proportional to CFM50 (N-factor, LBL basic,
 * 62.2), on degree days, with nothing varied but the measures' reductions.
 *
 * References: D. Blackman and S. Vigna, xoshiro128starstar.c (prng.di.unimi.it); A. Appleby,
 * MurmurHash3, fmix32.
 */
import { HOURS_PER_YEAR } from '../../../core/constants.ts';
import type { Evaluation } from '../../../core/evaluate.ts';
import { effectiveAnnualInfiltrationCfm } from '../../../core/infiltration/ashrae-622.ts';
import { buildPriceBook } from '../../../core/plan/prices.ts';
import { DEFAULT_FAN_COST_USD } from '../../../core/plan/ventilation-fan.ts';
import { LEAK_LOCATIONS } from '../../../core/schema.ts';
import { pertQuantileTable, PERT_TABLE_STEPS } from '../../../core/uncertainty/distributions.ts';
import { spreadBySelection } from './reference-select.ts';

/** A home packed for the reference kernel: numbers only. */
export interface PackedHome {
  testIn: Float64Array;
  scalars: Float64Array;
  location: Uint8Array;
  low: Float64Array;
  width: Float64Array;
  table: Float64Array[];
  heatingFactor: Float64Array;
  electricityFactor: Float64Array;
}

// Positions in PackedHome.scalars.
const S_FLOOR = 0;
const S_HEATING_PER_CFM50 = 1;
const S_COOLING_PER_CFM50 = 2;
const S_CREDIT_PER_CFM50 = 3;
const S_REQUIRED = 4;
const S_BALANCED = 5;
const S_EXISTING_FAN = 6;
const S_FAN_KWH_PER_CFM = 7;
const S_HEATING_UNITS_PER_CFM = 8;
const S_COOLING_KWH_PER_CFM = 9;
const S_HAS_COOLING = 10;
const S_HEATING_PRICE = 11;
const S_ELECTRICITY_PRICE = 12;
const S_FAN_COST = 13;
const S_TEST_IN = 14;
/** The package's measures' costs summed in package order (as the engine adds them). */
const S_PACKAGE_COST = 15;
const SCALARS = 16;

/** The figures `referenceSummary` writes: P10, P50, P90 of NPV, annual savings, CFM50 after. */
export const REFERENCE_FIGURES = [
  'npvUsd',
  'annualSavingsUsd',
  'cfm50After',
] as const satisfies readonly string[];
/** Places in a reference summary: each figure's P10, P50, P90. */
export const REFERENCE_SUMMARY_LENGTH = 3 * REFERENCE_FIGURES.length;

/** Packs an evaluated home's package (a proportional method, degree days) for the kernel. */
export function packHome(evaluation: Evaluation): PackedHome {
  const { home, model, plan } = evaluation;
  const prices = buildPriceBook(home);
  const measures = plan.entries
    .filter((entry) => entry.included)
    .map((entry) => entry.step.measure);
  const flows = model.airflow(model.testIn);
  const wsf = home.climate.wsf;
  const scalars = new Float64Array(SCALARS);
  scalars[S_FLOOR] = model.floorCfm50;
  scalars[S_HEATING_PER_CFM50] = flows.heatingCfm / model.testInCfm50;
  scalars[S_COOLING_PER_CFM50] = flows.coolingCfm / model.testInCfm50;
  scalars[S_CREDIT_PER_CFM50] =
    wsf === undefined
      ? 0
      : effectiveAnnualInfiltrationCfm({ cfm50: 1, wsf, heightFt: home.house.heightFt });
  scalars[S_REQUIRED] = model.ventilation(model.testInCfm50).requiredCfm;
  scalars[S_BALANCED] = home.ventilation?.fanType === 'balanced' ? 1 : 0;
  scalars[S_EXISTING_FAN] = model.existingFanCfm;
  scalars[S_FAN_KWH_PER_CFM] =
    (model.ventilatedAirflow(model.testIn).fanWattsPerCfm * HOURS_PER_YEAR) / 1000;
  scalars[S_HEATING_UNITS_PER_CFM] = model.energy({
    heatingCfm: 1,
    coolingCfm: 0,
  }).heatingFuelUnits;
  scalars[S_COOLING_KWH_PER_CFM] = model.energy({ heatingCfm: 0, coolingCfm: 1 }).coolingKwh;
  scalars[S_HAS_COOLING] = home.cooling ? 1 : 0;
  scalars[S_HEATING_PRICE] = prices.heating.usdPerUnitFloat;
  scalars[S_ELECTRICITY_PRICE] = prices.electricity?.usdPerUnitFloat ?? 0;
  scalars[S_FAN_COST] = home.ventilation?.fanCostUsd ?? DEFAULT_FAN_COST_USD;
  scalars[S_TEST_IN] = model.testInCfm50;
  let packageCostUsd = 0;
  for (const measure of measures) packageCostUsd += measure.cost.totalUsdFloat;
  scalars[S_PACKAGE_COST] = packageCostUsd;
  const table: Float64Array[] = [];
  const low = new Float64Array(measures.length);
  const width = new Float64Array(measures.length);
  measures.forEach((measure, index) => {
    const range = measure.estimateCfm50;
    low[index] = range.low;
    width[index] = range.high - range.low;
    table.push(
      range.high > range.low
        ? pertQuantileTable((range.likely - range.low) / (range.high - range.low))
        : new Float64Array(PERT_TABLE_STEPS + 1),
    );
  });
  return {
    testIn: Float64Array.from(LEAK_LOCATIONS, (location) => model.testIn[location]),
    scalars,
    location: Uint8Array.from(measures, (measure) => LEAK_LOCATIONS.indexOf(measure.location)),
    low,
    width,
    table,
    heatingFactor: Float64Array.from(measures, (m) => prices.presentValueFloat(1, 0, m.lifeYears)),
    electricityFactor: Float64Array.from(measures, (m) =>
      prices.presentValueFloat(0, 1, m.lifeYears),
    ),
  };
}

/** √(a² + b²) as V8's Math.hypot works it out for two finite numbers, without its variadic call. */
function hypot(a: number, b: number): number {
  const large = Math.max(Math.abs(a), Math.abs(b));
  if (large === 0) return 0;
  const small = Math.min(Math.abs(a), Math.abs(b)) / large;
  return Math.sqrt(1 + small * small) * large;
}

function fmix(word: number): number {
  let h = word >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

const GOLDEN = 0x9e3779b9;
const GOLDEN_2 = Math.imul(GOLDEN, 2);
const GOLDEN_3 = Math.imul(GOLDEN, 3);
const GOLDEN_4 = Math.imul(GOLDEN, 4);

let npvOut = new Float64Array(0);
let annualOut = new Float64Array(0);
let cfmOut = new Float64Array(0);
const leak = new Float64Array(4);
const state = new Float64Array(3);

/**
 * The reference kernel's draws of one home: its NPV, annual savings and CFM50 after in each
 * draw, kept for `referenceSummary`.
 *
 * @returns the mean NPV
 */
export function referenceDraws(
  home: PackedHome,
  options: { seed: number; stream: number; draws: number },
): number {
  const { draws } = options;
  if (npvOut.length < draws) {
    npvOut = new Float64Array(draws);
    annualOut = new Float64Array(draws);
    cfmOut = new Float64Array(draws);
  }
  const s = home.scalars;
  const floor = s[S_FLOOR]!;
  const kh = s[S_HEATING_PER_CFM50]!;
  const kc = s[S_COOLING_PER_CFM50]!;
  const credit = s[S_CREDIT_PER_CFM50]!;
  const required = s[S_REQUIRED]!;
  const balanced = s[S_BALANCED] === 1;
  const existing = s[S_EXISTING_FAN]!;
  const fanKwhPerCfm = s[S_FAN_KWH_PER_CFM]!;
  const eh = s[S_HEATING_UNITS_PER_CFM]!;
  const ec = s[S_COOLING_KWH_PER_CFM]!;
  const cooling = s[S_HAS_COOLING] === 1;
  const ph = s[S_HEATING_PRICE]!;
  const pe = s[S_ELECTRICITY_PRICE]!;
  const packageCost = s[S_PACKAGE_COST]!;
  const fanCost = s[S_FAN_COST]!;
  const count = home.low.length;
  /** Values a total leakage into `state` (heating units, cooling kWh, added-fan kWh); its fan need. */
  const value = (total: number) => {
    const q = credit * total;
    const need = Math.max(0, required - (balanced ? 1 : q / required) * q);
    const fan = Math.max(existing, need);
    const ih = kh * total;
    const ic = kc * total;
    const ch = fan === 0 ? ih : balanced ? fan + ih : hypot(fan, ih);
    const cc = cooling ? (fan === 0 ? ic : balanced ? fan + ic : hypot(fan, ic)) : 0;
    state[0] = eh * ch;
    state[1] = ec * cc;
    state[2] = (fan - existing) * fanKwhPerCfm;
    return need;
  };
  const testInTotal = home.testIn[0]! + home.testIn[1]! + home.testIn[2]! + home.testIn[3]!;
  const testInNeed = value(testInTotal);
  const h0 = state[0]!;
  const c0 = state[1]!;
  const f0 = state[2]!;
  const streamKey = fmix(fmix(options.seed) ^ options.stream);
  let npvSum = 0;
  for (let draw = 0; draw < draws; draw++) {
    const key = fmix(streamKey + Math.imul(GOLDEN, draw + 1));
    let s0 = fmix(key + GOLDEN);
    let s1 = fmix(key + GOLDEN_2);
    let s2 = fmix(key + GOLDEN_3);
    let s3 = fmix(key + GOLDEN_4);
    leak[0] = home.testIn[0]!;
    leak[1] = home.testIn[1]!;
    leak[2] = home.testIn[2]!;
    leak[3] = home.testIn[3]!;
    let total = testInTotal;
    let cfmAfter = testInTotal;
    let need = testInNeed;
    let h = h0;
    let c = c0;
    let f = f0;
    let annual = 0;
    let pv = 0;
    for (let m = 0; m < count; m++) {
      const x = Math.imul(s1, 5);
      const random = Math.imul((x << 7) | (x >>> 25), 9) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      const table = home.table[m]!;
      const position = (random / 4_294_967_296) * PERT_TABLE_STEPS;
      const i = Math.min(PERT_TABLE_STEPS - 1, Math.floor(position));
      const lower = table[i]!;
      const r = home.low[m]! + home.width[m]! * (lower + (position - i) * (table[i + 1]! - lower));
      const loc = home.location[m]!;
      const left = leak[loc]!;
      const applied = Math.min(Math.max(0, r), left, Math.max(0, total - floor));
      cfmAfter = total - applied;
      if (applied === 0) continue;
      leak[loc] = left - applied;
      total = leak[0]! + leak[1]! + leak[2]! + leak[3]!;
      need = value(total);
      const heatingUsd = (h - state[0]!) * ph;
      const electricityUsd = (c - state[1]! + (f - state[2]!)) * pe;
      h = state[0]!;
      c = state[1]!;
      f = state[2]!;
      annual += heatingUsd + electricityUsd;
      pv += heatingUsd * home.heatingFactor[m]! + electricityUsd * home.electricityFactor[m]!;
    }
    const npv = pv - (need > existing ? packageCost + fanCost : packageCost);
    npvOut[draw] = npv;
    annualOut[draw] = annual;
    cfmOut[draw] = count === 0 ? s[S_TEST_IN]! : cfmAfter;
    npvSum += npv;
  }
  return npvSum / draws;
}

/**
 * The summary of the last `referenceDraws`: P10 / P50 / P90 of each of REFERENCE_FIGURES into
 * out[0..8]. Reorders the kept draws.
 */
export function referenceSummary(draws: number, out: Float64Array): void {
  spreadBySelection(npvOut, draws, out, 0);
  spreadBySelection(annualOut, draws, out, 3);
  spreadBySelection(cfmOut, draws, out, 6);
}
