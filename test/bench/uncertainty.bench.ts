/**
 * How fast the uncertainty engine runs:
 * - 10,000 draws of a 20-measure home's package (a demo home with measures of the library's
 *   types added, one home per infiltration method); target under 100 ms;
 * - a 10,000-home portfolio with 1,000 draws each on 2 worker threads (planning each home
 *   too, and keeping the percentiles: no histograms); target under 5 s, and the engine's draws
 *   within 2× of a minimal reference kernel of the same arithmetic written below (bare
 *   Float64Arrays, PERT from the same inverse-CDF tables, the same generator), timed on one
 *   thread each. The same portfolio on 1 worker shows how the second one scales; the process's
 *   CPU time and the workers' own thread CPU time beside the wall clock show how much of the
 *   machine the run had (other work shares its 2 cores).
 * Prints figures and their ratios; asserts nothing. Run with
 * `tsx test/bench/uncertainty.bench.ts`.
 *
 * The portfolio's homes are the demo homes that use a proportional infiltration method
 * (N-factor, LBL basic, 62.2), varied by a seeded generator in leakage, prices and climate;
 * the reference kernel covers those methods only, as AIM-2 needs the model's own airflow.
 */
import { availableParallelism, loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { evaluateHome, type Evaluation } from '../../core/evaluate.ts';
import { effectiveAnnualInfiltrationCfm } from '../../core/infiltration/ashrae-622.ts';
import { HOURS_PER_YEAR } from '../../core/constants.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { DEFAULT_FAN_COST_USD } from '../../core/plan/ventilation-fan.ts';
import { LEAK_LOCATIONS, type HomeFileInput } from '../../core/schema.ts';
import { pertQuantileTable, PERT_TABLE_STEPS } from '../../core/uncertainty/distributions.ts';
import { packageUncertainty } from '../../core/uncertainty/monte-carlo.ts';
import { homePackageOf } from '../../core/uncertainty/portfolio-home.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { openUncertaintyPool } from '../../electron/uncertainty-pool.ts';
import { median, withLibraryMeasures } from './_lib/bench-homes.ts';

const DRAWS_ONE_HOME = 10_000;
const ONE_HOME_TARGET_MS = 100;
const ONE_HOME_RUNS = 7;
const MEASURES = 20;
const PORTFOLIO_HOMES = Number(process.env.SEALWORK_BENCH_HOMES ?? 10_000);
const PORTFOLIO_DRAWS = 1_000;
const PORTFOLIO_TARGET_S = 5;
const PORTFOLIO_WORKERS = 2;
const SEED = 20_261_201;
/** A portfolio's run: its percentiles, no histograms. */
const PORTFOLIO_OPTIONS = { draws: PORTFOLIO_DRAWS, seed: SEED, histogramBins: 0 };

/** A small linear congruential generator for varying the bench homes (not the engine's). */
function seeded(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

function twentyMeasureHome(home: HomeFileInput): HomeFileInput {
  const measures = withLibraryMeasures(home, MEASURES);
  return { ...home, name: `${home.name} (bench, ${MEASURES} measures)`, measures };
}

function oneHomeBench(): void {
  console.log(
    `10,000 draws of a ${MEASURES}-measure home's package (PERT), median of ${ONE_HOME_RUNS} runs:`,
  );
  const methods = ['nFactor', 'lblBasic', 'ashrae622', 'aim2'] as const;
  for (const method of methods) {
    const demo = DEMO_HOMES.find((home) => home.infiltrationMethod === method);
    if (!demo) continue;
    const evaluation = evaluateHome(twentyMeasureHome(demo));
    const packaged = evaluation.plan.entries.filter((entry) => entry.included).length;
    for (const vary of [{}, { escalation: true, efficiency: true, nFactor: true }]) {
      const samples: number[] = [];
      let first = 0;
      for (let run = 0; run < ONE_HOME_RUNS; run++) {
        const started = performance.now();
        packageUncertainty(evaluation, { draws: DRAWS_ONE_HOME, seed: SEED + run, vary });
        samples.push(performance.now() - started);
        if (run === 0) first = samples[0] ?? 0;
      }
      const value = median(samples);
      console.log(
        `  ${method.padEnd(9)} ${packaged} of ${MEASURES} measures in the package` +
          `${Object.keys(vary).length > 0 ? ', escalation, efficiency and N varied' : ''}: ` +
          `${value.toFixed(1)} ms (first run ${first.toFixed(1)} ms); target < ${ONE_HOME_TARGET_MS} ms; ` +
          `ratio ${(value / ONE_HOME_TARGET_MS).toFixed(2)} of target`,
      );
    }
  }
}

function variedHome(home: HomeFileInput, index: number, random: () => number): HomeFileInput {
  const copy = structuredClone(home) as HomeFileInput & { demo?: boolean };
  const leak = 0.7 + random() * 0.7;
  const test = copy.leakageTest;
  if (test.cfm50 !== undefined) test.cfm50 = Math.round(test.cfm50 * leak);
  if (test.points) for (const point of test.points) point.cfm = Math.round(point.cfm * leak);
  const price = 0.8 + random() * 0.45;
  for (const fuel of Object.values(copy.prices)) {
    if (fuel) fuel.usdPerUnit = Number((fuel.usdPerUnit * price).toFixed(3));
  }
  copy.climate = {
    ...copy.climate,
    hdd65F: Math.round(copy.climate.hdd65F * (0.8 + random() * 0.4)),
  };
  copy.name = `Bench portfolio home ${index + 1}`;
  copy.demo = false;
  return copy;
}

/** A home packed for the reference kernel: numbers only. */
interface PackedHome {
  testIn: Float64Array;
  scalars: Float64Array;
  location: Uint8Array;
  low: Float64Array;
  width: Float64Array;
  table: Float64Array[];
  heatingFactor: Float64Array;
  electricityFactor: Float64Array;
  cost: Float64Array;
  energy: Uint8Array;
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

function pack(evaluation: Evaluation): PackedHome {
  const { home, model, plan } = evaluation;
  const prices = buildPriceBook(home);
  const measures = plan.entries
    .filter((entry) => entry.included)
    .map((entry) => entry.step.measure);
  const flows = model.airflow(model.testIn);
  const wsf = home.climate.wsf;
  const scalars = new Float64Array(15);
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
    cost: Float64Array.from(measures, (m) => m.cost.totalUsdFloat),
    energy: Uint8Array.from(measures, (m) => (m.cost.healthAndSafety ? 0 : 1)),
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

const npvOut = new Float64Array(PORTFOLIO_DRAWS);
const annualOut = new Float64Array(PORTFOLIO_DRAWS);
const cfmOut = new Float64Array(PORTFOLIO_DRAWS);
const leak = new Float64Array(4);

/** The reference kernel: one home's draws and its P10/P50/P90 and means. Returns mean NPV. */
function referenceHome(home: PackedHome, stream: number, draws: number): number {
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
  const count = home.low.length;
  const value = (total: number, out: Float64Array) => {
    const q = credit * total;
    const need = Math.max(0, required - (balanced ? 1 : q / required) * q);
    const fan = Math.max(existing, need);
    const ih = kh * total;
    const ic = kc * total;
    const ch = fan === 0 ? ih : balanced ? fan + ih : hypot(fan, ih);
    const cc = cooling ? (fan === 0 ? ic : balanced ? fan + ic : hypot(fan, ic)) : 0;
    out[0] = eh * ch;
    out[1] = ec * cc;
    out[2] = (fan - existing) * fanKwhPerCfm;
    return need;
  };
  const state = new Float64Array(3);
  const testInTotal = home.testIn[0]! + home.testIn[1]! + home.testIn[2]! + home.testIn[3]!;
  value(testInTotal, state);
  const h0 = state[0]!;
  const c0 = state[1]!;
  const f0 = state[2]!;
  let npvSum = 0;
  for (let draw = 0; draw < draws; draw++) {
    const key = fmix(fmix(fmix(SEED) ^ stream) + Math.imul(0x9e3779b9, draw + 1));
    let s0 = fmix(key + 0x9e3779b9);
    let s1 = fmix(key + Math.imul(0x9e3779b9, 2));
    let s2 = fmix(key + Math.imul(0x9e3779b9, 3));
    let s3 = fmix(key + Math.imul(0x9e3779b9, 4));
    leak.set(home.testIn);
    let total = testInTotal;
    let h = h0;
    let c = c0;
    let f = f0;
    let annual = 0;
    let pv = 0;
    let cost = 0;
    for (let m = 0; m < count; m++) {
      const x = Math.imul(s1, 5);
      const out = Math.imul((x << 7) | (x >>> 25), 9) >>> 0;
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      const table = home.table[m]!;
      const position = (out / 4_294_967_296) * PERT_TABLE_STEPS;
      const i = Math.min(PERT_TABLE_STEPS - 1, Math.floor(position));
      const lower = table[i]!;
      const r = home.low[m]! + home.width[m]! * (lower + (position - i) * (table[i + 1]! - lower));
      const loc = home.location[m]!;
      const left = leak[loc]!;
      const applied = Math.min(Math.max(0, r), left, Math.max(0, total - floor));
      cost += home.cost[m]!;
      if (applied === 0) continue;
      leak[loc] = left - applied;
      total = leak[0]! + leak[1]! + leak[2]! + leak[3]!;
      value(total, state);
      const heatingUsd = (h - state[0]!) * ph;
      const electricityUsd = (c - state[1]! + (f - state[2]!)) * pe;
      h = state[0]!;
      c = state[1]!;
      f = state[2]!;
      annual += heatingUsd + electricityUsd;
      pv += heatingUsd * home.heatingFactor[m]! + electricityUsd * home.electricityFactor[m]!;
    }
    if (value(total, state) > existing) cost += s[S_FAN_COST]!;
    npvOut[draw] = pv - cost;
    annualOut[draw] = annual;
    cfmOut[draw] = count === 0 ? s[S_TEST_IN]! : total;
    npvSum += pv - cost;
  }
  // The same summary work as the engine: sorted copies for the quantiles.
  for (const values of [npvOut, annualOut, cfmOut]) {
    const sorted = Float64Array.from(values.subarray(0, draws)).sort();
    void sorted[Math.floor(0.5 * (draws - 1))];
  }
  return npvSum / draws;
}

async function portfolioBench(): Promise<void> {
  const random = seeded(SEED);
  const bases = DEMO_HOMES.filter((home) => home.infiltrationMethod !== 'aim2');
  const homes = Array.from({ length: PORTFOLIO_HOMES }, (_, index) =>
    variedHome(bases[index % bases.length] as HomeFileInput, index, random),
  );
  console.log(
    `\nPortfolio: ${PORTFOLIO_HOMES.toLocaleString('en-US')} homes × ${PORTFOLIO_DRAWS.toLocaleString('en-US')} draws (PERT)`,
  );

  // Home by home: evaluate (as a single home is), plan as the pool's workers do, then the
  // engine's draws, then the reference kernel's on the same package; each timed on its own,
  // nothing kept but the figures. A portfolio keeps only the percentiles, so the engine draws
  // no histograms here, as the reference draws none.
  let evaluateS = 0;
  let planS = 0;
  let engineS = 0;
  let referenceS = 0;
  let packagedMeasures = 0;
  let largestGap = 0;
  homes.forEach((home, index) => {
    let started = performance.now();
    const evaluation = evaluateHome(home);
    evaluateS += (performance.now() - started) / 1000;
    started = performance.now();
    homePackageOf(home);
    planS += (performance.now() - started) / 1000;
    packagedMeasures += evaluation.plan.entries.filter((entry) => entry.included).length;
    started = performance.now();
    const engineMean = packageUncertainty(evaluation, {
      ...PORTFOLIO_OPTIONS,
      stream: index,
    }).npvUsd.mean;
    engineS += (performance.now() - started) / 1000;
    const packed = pack(evaluation);
    started = performance.now();
    const referenceMean = referenceHome(packed, index, PORTFOLIO_DRAWS);
    referenceS += (performance.now() - started) / 1000;
    largestGap = Math.max(largestGap, Math.abs(engineMean - referenceMean));
  });

  console.log(
    `  ${(packagedMeasures / PORTFOLIO_HOMES).toFixed(1)} package measures a home on average`,
  );
  console.log(
    `  one thread: evaluating the homes (evaluateHome) ${evaluateS.toFixed(2)} s; planning them as ` +
      `the workers do (homePackageOf, the same packages) ${planS.toFixed(2)} s, ` +
      `${(evaluateS / planS).toFixed(1)} times as fast`,
  );
  console.log(`  engine draws and summaries, one thread: ${engineS.toFixed(2)} s`);
  console.log(
    `  reference kernel, one thread: ${referenceS.toFixed(2)} s; engine ÷ reference ${(engineS / referenceS).toFixed(2)} (target ≤ 2); ` +
      `largest gap between their mean NPVs $${largestGap.toExponential(2)}`,
  );

  const two = await poolRun(homes, PORTFOLIO_WORKERS);
  const one = await poolRun(homes, 1);
  console.log(
    `  pool of ${PORTFOLIO_WORKERS} workers, planning and drawing every home: ${two.wallS.toFixed(2)} s ` +
      `(the pool's start and warm-up before it ${two.startS.toFixed(2)} s); ` +
      `target < ${PORTFOLIO_TARGET_S} s; ratio ${(two.wallS / PORTFOLIO_TARGET_S).toFixed(2)} of target; ` +
      `${two.failed} homes failed`,
  );
  console.log(
    `  pool of 1 worker: ${one.wallS.toFixed(2)} s; ${PORTFOLIO_WORKERS} workers ran ` +
      `${(one.wallS / two.wallS).toFixed(2)} times as fast`,
  );
  for (const [label, run] of [
    [`${PORTFOLIO_WORKERS} workers`, two],
    ['1 worker', one],
  ] as const) {
    const threadCpu =
      run.workerCpuS === null
        ? 'their threads’ CPU time unknown here'
        : `their threads had ${run.workerCpuS.toFixed(2)} s of CPU in ${(run.wallS * run.workers).toFixed(2)} s ` +
          `(${((100 * run.workerCpuS) / (run.wallS * run.workers)).toFixed(0)} %: the rest they waited for a core)`;
    console.log(
      `  ${label}: this process used ${run.processCpuS.toFixed(2)} s of CPU, ` +
        `${(run.processCpuS / run.wallS).toFixed(2)} cores on average; its main thread (sending ` +
        `homes, taking results) was busy ${run.mainThreadS.toFixed(2)} s; ${threadCpu}; ` +
        `their own clocks: planning ${run.planS.toFixed(2)} s, drawing ${run.drawS.toFixed(2)} s summed`,
    );
  }
}

/** A portfolio's homes on a fresh pool of `workers`, timed after the pool's start and warm-up. */
async function poolRun(homes: readonly HomeFileInput[], workers: number) {
  // A pool is opened once and kept: its start (loading the TypeScript in each worker) is timed
  // apart, with a small warm-up run, from the portfolio's run.
  let started = performance.now();
  const pool = openUncertaintyPool({ workers });
  await pool.run({ homes: homes.slice(0, 4 * workers), options: { draws: 10, seed: SEED } });
  const startS = (performance.now() - started) / 1000;
  const cpuBefore = process.cpuUsage();
  const loopBefore = performance.eventLoopUtilization();
  started = performance.now();
  const results = await pool.run({ homes, options: PORTFOLIO_OPTIONS });
  const wallS = (performance.now() - started) / 1000;
  const cpu = process.cpuUsage(cpuBefore);
  const mainThreadS = performance.eventLoopUtilization(loopBefore).active / 1000;
  const timing = pool.lastRunTiming;
  await pool.close();
  return {
    workers,
    startS,
    wallS,
    processCpuS: (cpu.user + cpu.system) / 1e6,
    mainThreadS,
    workerCpuS: timing.cpuMs === null ? null : timing.cpuMs / 1000,
    planS: timing.evaluateMs / 1000,
    drawS: timing.drawMs / 1000,
    failed: results.filter((result) => !result.ok).length,
  };
}

const [load1] = loadavg();
console.log(
  `Load average at start ${load1?.toFixed(2)} on ${availableParallelism()} cores (other work shares the machine).`,
);
oneHomeBench();
await portfolioBench();
console.log(`Load average at the end ${loadavg()[0]?.toFixed(2)}.`);
