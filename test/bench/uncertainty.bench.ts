/**
 * How fast the uncertainty engine runs:
 * - 10,000 draws of a 20-measure home's package (a demo home with measures of the library's
 *   types added, one home per infiltration method); target under 100 ms;
 * - a 10,000-home portfolio with 1,000 draws each on 2 worker threads (planning each home
 *   too, and keeping the percentiles: no histograms); target under 5 s, and the engine's draws
 *   and summaries (`packageUncertainty`, compiling each home's kernel included) within 2× of a
 *   reference kernel, timed on one thread each. The same portfolio on 1 worker shows how the
 *   second one scales, and a second run on the same 2 workers how much of the first was their
 *   code being compiled; the process's CPU time and the workers' own thread CPU time beside
 *   the wall clock show how much of the machine the run had (other work shares its 2 cores).
 * Prints figures and their ratios; asserts nothing. Run with
 * `tsx test/bench/uncertainty.bench.ts` (`SEALWORK_BENCH_HOMES=2000` for a smaller portfolio).
 *
 * The reference kernel (_lib/reference-kernel.ts) is what a bare kernel must do for a home and
 * no more, with the engine's numbers: the same generator (xoshiro128** reseeded per draw from
 * seed, stream and draw, the seed-and-stream part once a home), the same PERT inverse-CDF
 * tables, the same step, 62.2 fan and present-value arithmetic, on typed arrays packed
 * beforehand (not timed), in one loop that makes no objects; its summary is P10 / P50 / P90
 * (Hyndman & Fan 7) of NPV, annual savings and CFM50 after by quickselect, and the mean NPV,
 * no sort. Its figures are compared with the engine's and the largest gap printed, so
 * neither's work can be dropped.
 *
 * The portfolio's homes are the demo homes that use a proportional infiltration method
 * (N-factor, LBL basic, 62.2), varied by a seeded generator in leakage, prices and climate;
 * the reference kernel covers those methods only, as AIM-2 needs the model's own airflow.
 */
import { availableParallelism, loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { evaluateHome } from '../../core/evaluate.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { packageUncertainty } from '../../core/uncertainty/monte-carlo.ts';
import { homePackageOf } from '../../core/uncertainty/portfolio-home.ts';
import { DEMO_HOMES } from '../../db/demo/alder-creek.ts';
import { openUncertaintyPool } from '../../electron/uncertainty-pool.ts';
import { median, withLibraryMeasures } from './_lib/bench-homes.ts';
import {
  packHome,
  referenceDraws,
  referenceSummary,
  REFERENCE_FIGURES,
  REFERENCE_SUMMARY_LENGTH,
} from './_lib/reference-kernel.ts';

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
  let referenceDrawS = 0;
  let referenceSummaryS = 0;
  let packagedMeasures = 0;
  let largestGap = 0;
  let largestGapFigure = '';
  const reference = new Float64Array(REFERENCE_SUMMARY_LENGTH);
  homes.forEach((home, index) => {
    let started = performance.now();
    const evaluation = evaluateHome(home);
    evaluateS += (performance.now() - started) / 1000;
    started = performance.now();
    homePackageOf(home);
    planS += (performance.now() - started) / 1000;
    packagedMeasures += evaluation.plan.entries.filter((entry) => entry.included).length;
    started = performance.now();
    const engine = packageUncertainty(evaluation, { ...PORTFOLIO_OPTIONS, stream: index });
    engineS += (performance.now() - started) / 1000;
    const packed = packHome(evaluation);
    started = performance.now();
    const meanNpv = referenceDraws(packed, { seed: SEED, stream: index, draws: PORTFOLIO_DRAWS });
    const drawn = performance.now();
    referenceSummary(PORTFOLIO_DRAWS, reference);
    referenceDrawS += (drawn - started) / 1000;
    referenceSummaryS += (performance.now() - drawn) / 1000;
    // Every figure of the reference beside the engine's, so neither's work can be left out.
    REFERENCE_FIGURES.forEach((figure, place) => {
      const spread = engine[figure];
      const gaps = [spread.p10, spread.p50, spread.p90].map((value, at) =>
        Math.abs(value - (reference[3 * place + at] ?? Number.NaN)),
      );
      gaps.forEach((gap, at) => {
        if (!(gap <= largestGap)) {
          largestGap = gap;
          largestGapFigure = `${figure} ${['P10', 'P50', 'P90'][at]}`;
        }
      });
    });
    const meanGap = Math.abs(engine.npvUsd.mean - meanNpv);
    if (!(meanGap <= largestGap)) {
      largestGap = meanGap;
      largestGapFigure = 'npvUsd mean';
    }
  });
  const referenceS = referenceDrawS + referenceSummaryS;

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
    `  reference kernel, one thread: ${referenceS.toFixed(2)} s (draws ${referenceDrawS.toFixed(2)} s, ` +
      `summary by selection ${referenceSummaryS.toFixed(2)} s); engine ÷ reference ` +
      `${(engineS / referenceS).toFixed(2)} (target ≤ 2); ` +
      `largest gap between their P10 / P50 / P90 (NPV, savings, CFM50 after) and mean NPV ` +
      `${largestGap.toExponential(2)} (${largestGapFigure})`,
  );

  const two = await poolRun(homes, PORTFOLIO_WORKERS, { again: true });
  const one = await poolRun(homes, 1);
  console.log(
    `  pool of ${PORTFOLIO_WORKERS} workers, planning and drawing every home: ${two.wallS.toFixed(2)} s ` +
      `(the pool's start and warm-up before it ${two.startS.toFixed(2)} s); ` +
      `target < ${PORTFOLIO_TARGET_S} s; ratio ${(two.wallS / PORTFOLIO_TARGET_S).toFixed(2)} of target; ` +
      `${two.failed} homes failed; the same portfolio again on the same pool (its code ` +
      `compiled by then) ` +
      `${two.againS?.toFixed(2)} s`,
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
async function poolRun(
  homes: readonly HomeFileInput[],
  workers: number,
  options: { again?: boolean } = {},
) {
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
  const timing = { ...pool.lastRunTiming };
  let againS: number | null = null;
  if (options.again) {
    started = performance.now();
    await pool.run({ homes, options: PORTFOLIO_OPTIONS });
    againS = (performance.now() - started) / 1000;
  }
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
    againS,
  };
}

const [load1] = loadavg();
console.log(
  `Load average at start ${load1?.toFixed(2)} on ${availableParallelism()} cores (other work shares the machine).`,
);
oneHomeBench();
await portfolioBench();
console.log(`Load average at the end ${loadavg()[0]?.toFixed(2)}.`);
