/**
 * How long planning takes: one 20-measure home after warm-up (target ≤ 5 ms), and 10,000
 * such homes one after another. Prints figures and their ratio to the target; asserts
 * nothing (timings belong here, never in unit tests). Run with `npm run bench`.
 *
 * The homes are generated from a seeded generator, varied so no two are alike.
 */
import { performance } from 'node:perf_hooks';
import { evaluateHome } from '../../core/evaluate.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { median } from './_lib/bench-homes.ts';

const TARGET_MS_PER_HOME = 5;
const MEASURE_TYPES = [
  ['attic-top-plates', 'ceiling'],
  ['attic-chases', 'ceiling'],
  ['recessed-lights', 'ceiling'],
  ['attic-hatch', 'ceiling'],
  ['flue-chase', 'flue'],
  ['kneewalls', 'ceiling'],
  ['rim-joist', 'floor'],
  ['sill-plate', 'floor'],
  ['band-joist', 'wall'],
  ['plumbing-penetrations', 'wall'],
  ['wiring-penetrations', 'wall'],
  ['duct-boots', 'ceiling'],
  ['door-weatherstrip', 'wall'],
  ['window-sealing', 'wall'],
  ['garage-house-wall', 'wall'],
  ['dryer-vent', 'wall'],
  ['exhaust-fan-vents', 'ceiling'],
  ['plumbing-chase', 'ceiling'],
  ['dropped-soffit', 'ceiling'],
  ['fireplace-damper', 'flue'],
] as const;

/** A small linear congruential generator: deterministic, good enough to vary inputs. */
function seeded(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

function benchHome(random: () => number): HomeFileInput {
  const cfm50 = 1500 + random() * 4000;
  return {
    format: 'sealwork-home/1',
    name: 'bench house',
    house: {
      conditionedFloorAreaFt2: 1800,
      conditionedVolumeFt3: 15_000,
      stories: 2,
      heightFt: 18,
      bedrooms: 3,
      shelterClass: 3,
      foundation: 'basement',
      yearBuilt: 1950,
    },
    climate: {
      name: 'bench climate',
      hdd65F: 5000 + random() * 3000,
      cdd65F: 800,
      elevationFt: 500,
      wsf: 0.55,
      heatingSeason: { meanDeltaTF: 35, meanWindSpeedMph: 9 },
      coolingSeason: { meanDeltaTF: 10, meanWindSpeedMph: 7, latentGrainHours: 8000 },
    },
    heating: {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.8,
      combustionVenting: 'naturalDraft',
    },
    cooling: { seer: 13 },
    prices: {
      naturalGas: { usdPerUnit: 1.2, escalationRateReal: 0.01 },
      electricity: { usdPerUnit: 0.15, escalationRateReal: 0.005 },
    },
    economics: { discountRateReal: 0.03, ranking: 'sir' },
    infiltrationMethod: 'aim2',
    leakShares: { ceiling: 0.35, wall: 0.35, floor: 0.25, flue: 0.05 },
    leakageTest: { cfm50 },
    measures: MEASURE_TYPES.map(([type, location], index) => ({
      id: `m${index + 1}`,
      type,
      location,
      reductionCfm50: {
        low: 20 + random() * 40,
        likely: 70 + random() * 60,
        high: 140 + random() * 80,
      },
      cost: {
        materialsUsd: Math.round(20 + random() * 200),
        laborHours: Math.round(1 + random() * 8),
        laborRateUsdPerHour: 55,
        markupFraction: 0.1,
      },
      lifeYears: 10 + Math.floor(random() * 15),
    })),
  };
}

const random = seeded(20261201);
const one = benchHome(random);
for (let warm = 0; warm < 200; warm += 1) evaluateHome(one);
const samples: number[] = [];
for (let run = 0; run < 200; run += 1) {
  const start = performance.now();
  evaluateHome(one);
  samples.push(performance.now() - start);
}
const perHomeMs = median(samples);
console.log(
  `plan one 20-measure home (aim2, after warm-up): median ${perHomeMs.toFixed(3)} ms over 200 runs; ` +
    `target ≤ ${TARGET_MS_PER_HOME} ms; ratio ${(perHomeMs / TARGET_MS_PER_HOME).toFixed(2)} of target`,
);

const homes = Array.from({ length: 10_000 }, () => benchHome(random));
const heapBeforeMb = process.memoryUsage().heapUsed / 2 ** 20;
const start = performance.now();
let totalSavingsUsd = 0;
for (const home of homes)
  totalSavingsUsd += evaluateHome(home).plan.package.annualSavingsUsd.toNumber();
const elapsedS = (performance.now() - start) / 1000;
const heapAfterMb = process.memoryUsage().heapUsed / 2 ** 20;
console.log(
  `plan 10,000 such homes one after another: ${elapsedS.toFixed(2)} s (${((elapsedS * 1000) / 10_000).toFixed(3)} ms a home; ` +
    `ratio ${((elapsedS * 1000) / 10_000 / TARGET_MS_PER_HOME).toFixed(2)} of the per-home target); ` +
    `heap ${heapBeforeMb.toFixed(0)} → ${heapAfterMb.toFixed(0)} MB; total package savings $${totalSavingsUsd.toFixed(0)}/yr`,
);
