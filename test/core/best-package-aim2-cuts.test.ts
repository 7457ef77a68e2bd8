/**
 * The AIM-2 bound's refinements (core/plan/best-package/bounds-aim2.ts (g)–(h), aim2-box.ts's
 * share cuts and one-location falls, aim2-steps.ts's `removableWithin`), each condition checked
 * against an independent computation written here: shares computed from drawn states, the
 * model's own airflow (model.airflow) at states drawn inside the boxes, subsets of measures
 * enumerated; and the search against brute force (test/_lib/package-brute-force.ts) on homes
 * whose leakage is mostly in the ceiling, the homes these cuts are for, where the empty
 * package wins and where it does not.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHome, type Evaluation } from '../../core/evaluate.ts';
import { totalCfm50 } from '../../core/home-model.ts';
import {
  aim2BoxBounds,
  onlyLocation,
  shareBox,
  withinSumOfShares,
} from '../../core/plan/best-package/aim2-box.ts';
import { removableWithin } from '../../core/plan/best-package/aim2-steps.ts';
import { buildAim2Bound, subtreeBox } from '../../core/plan/best-package/bounds-aim2.ts';
import { add, variable } from '../../core/plan/best-package/interval.ts';
import type { LiveMeasure } from '../../core/plan/best-package/remaining-measures.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { LEAK_LOCATIONS, type HomeFileInput, type LeakLocation } from '../../core/schema.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';
import {
  everyPackage,
  measuresInPlanOrder,
  type BruteForceQuery,
} from '../_lib/package-brute-force.ts';
import { expectBruteForceBest } from '../_lib/expect-brute-force.ts';
import { plannedEnergyMeasures } from '../_lib/package-cases.ts';

const SEED = 20261203;

/** A seeded uniform [0, 1) generator (an LCG: the constants of Numerical Recipes). */
function uniformFrom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
}

/**
 * Generated AIM-2 homes with most of their leakage in the ceiling (70–90 %, the rest in walls
 * and floor, no flue), no leakage floor, every measure a planned energy measure, and their
 * costs scaled down or up so that in some homes measures pay and in others none does.
 */
function ceilingHomes(count: number, seed: number, most: number) {
  return fc
    .sample(
      fc.record({
        home: homeArbitrary({ measureCount: { min: 2, max: most }, methods: ['aim2'] }),
        ceiling: fc.constantFrom(0.7, 0.8, 0.83, 0.9),
        floorShare: fc.constantFrom(0, 0.3, 0.5),
        costScale: fc.constantFrom(0.1, 0.3, 1, 3),
        budgetFraction: fc.constantFrom(0.35, 0.5, 1),
      }),
      { seed, numRuns: count },
    )
    .map(({ home, ceiling, floorShare, costScale, budgetFraction }) => {
      const rest = 1 - ceiling;
      const floor = Math.round(rest * floorShare * 1000) / 1000;
      const shaped: HomeFileInput = {
        ...home,
        leakShares: {
          ceiling,
          wall: Number((1 - ceiling - floor).toFixed(3)),
          floor,
          flue: 0,
        },
        measures: plannedEnergyMeasures(home.measures, costScale),
      };
      delete shaped.leakageFloorCfm50;
      return { home: shaped, budgetFraction };
    });
}

describe('the share box: the cuts from the shares summing to 1', () => {
  it('holds the shares of states drawn in boxes that reach 0 at every location', () => {
    // aim2-box.ts `shareBox`: each state's share L_l / c lies in its interval, computed here
    // directly from the state; boxes from 0 to a random top (flue often 0), floor 0.
    const next = uniformFrom(SEED);
    let checked = 0;
    let cut = 0;
    for (let draw = 0; draw < 300; draw += 1) {
      const upper = {} as Record<LeakLocation, number>;
      for (const location of LEAK_LOCATIONS) {
        upper[location] = next() < 0.3 ? 0 : 1000 * next();
      }
      const lower = {} as Record<LeakLocation, number>;
      for (const location of LEAK_LOCATIONS) {
        lower[location] = next() < 0.5 ? 0 : upper[location] * next();
      }
      const floorCfm50 = next() < 0.5 ? 0 : totalCfm50(lower) + next() * 100;
      const shares = shareBox({ lower, upper, floorCfm50 });
      const highs = LEAK_LOCATIONS.reduce((total, location) => total + shares[location].hi, 0);
      if (highs < 1.5) cut += 1;
      for (let sample = 0; sample < 10; sample += 1) {
        const state = {} as Record<LeakLocation, number>;
        for (const location of LEAK_LOCATIONS) {
          state[location] = lower[location] + (upper[location] - lower[location]) * next();
        }
        const total = totalCfm50(state);
        if (total <= 0 || total < floorCfm50) continue;
        for (const location of LEAK_LOCATIONS) {
          const share = state[location] / total;
          expect(share).toBeGreaterThanOrEqual(shares[location].lo - 1e-12);
          expect(share).toBeLessThanOrEqual(shares[location].hi + 1e-12);
        }
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThan(1500);
    expect(cut).toBeGreaterThan(0);
  });

  it('an empty location has share 0, and R = σ_c + σ_f is cut to 1 − σ_y.lo', () => {
    const upper = { ceiling: 900, wall: 120, floor: 40, flue: 0 };
    const lower = { ceiling: 0, wall: 0, floor: 0, flue: 0 };
    const shares = shareBox({ lower, upper, floorCfm50: 0 });
    expect(shares.flue).toEqual({ lo: 0, hi: 0 });
    // Without the cut the ceiling and floor shares each reach 1, so R would reach 2.
    const r = withinSumOfShares(
      add(variable(0, shares.ceiling), variable(1, shares.floor)),
      variable(2, shares.flue),
    );
    expect(shares.ceiling.hi + shares.floor.hi).toBeGreaterThan(1.5);
    expect(r.v.hi).toBeCloseTo(1, 8);
    expect(r.v.hi).toBeLessThan(1.5);
    // Drawn shares summing to 1 (an independent draw): R never passes 1 − y.
    const next = uniformFrom(SEED + 1);
    for (let draw = 0; draw < 200; draw += 1) {
      const parts = LEAK_LOCATIONS.map(() => next());
      const sum = parts.reduce((total, part) => total + part, 0);
      const [c, , f, y] = parts.map((part) => part / sum);
      expect((c ?? 0) + (f ?? 0)).toBeLessThanOrEqual(1 - (y ?? 0) + 1e-12);
    }
  });
});

describe('the box bounds on homes with most leakage in the ceiling', () => {
  const homes = ceilingHomes(60, SEED + 2, 8);

  it('hold the model’s flow and its fall per CFM50, with the floor raised to a range’s low end', () => {
    // (g) of bounds-aim2.ts and the one-location falls of aim2-box.ts: for states s in the
    // box with total ≥ the raised floor and steps that stay there, q(s)/c ∈ [G_lo, G_hi] and
    // q(s) − q(s − a·e_l) ≤ a·D_l, by model.airflow.
    const next = uniformFrom(SEED + 3);
    let checked = 0;
    let finite = 0;
    let single = 0;
    for (const { home } of homes) {
      const { model } = evaluateHome(home);
      const bounds = aim2BoxBounds(model);
      for (let draw = 0; draw < 8; draw += 1) {
        const upper = { ...model.testIn };
        // Some boxes hold leakage at one location alone (the others all sealed).
        const alone = draw === 7 ? 'ceiling' : draw === 6 ? 'wall' : draw === 5 ? 'floor' : null;
        if (alone !== null) {
          upper[alone] = Math.max(upper[alone], 50);
          for (const location of LEAK_LOCATIONS) if (location !== alone) upper[location] = 0;
        }
        const lower = {} as Record<LeakLocation, number>;
        for (const location of LEAK_LOCATIONS) {
          lower[location] = next() < 0.5 ? 0 : upper[location] * next();
        }
        const floorCfm50 = totalCfm50(lower) + (totalCfm50(upper) - totalCfm50(lower)) * next();
        const box = bounds({ lower, upper, floorCfm50 });
        if (onlyLocation({ lower, upper, floorCfm50 }) !== null) single += 1;
        if (box === null) continue;
        for (let sample = 0; sample < 6; sample += 1) {
          const state = {} as Record<LeakLocation, number>;
          for (const location of LEAK_LOCATIONS) {
            state[location] = lower[location] + (upper[location] - lower[location]) * next();
          }
          const total = totalCfm50(state);
          if (total < floorCfm50 || total <= 0) continue;
          const flow = model.airflow(state);
          for (const { cfm, season } of [
            { cfm: flow.heatingCfm, season: box.heating },
            { cfm: flow.coolingCfm, season: box.cooling },
          ]) {
            if (season === null) continue;
            const tolerance = 1e-9 * (1 + cfm);
            expect(cfm).toBeGreaterThanOrEqual(total * season.flowPerCfm50.lo - tolerance);
            expect(cfm).toBeLessThanOrEqual(total * season.flowPerCfm50.hi + tolerance);
          }
          for (const location of LEAK_LOCATIONS) {
            const room = Math.min(state[location] - lower[location], total - floorCfm50);
            if (room <= 0) continue;
            const step = room * next();
            const after = model.airflow({ ...state, [location]: state[location] - step });
            for (const { fall, season } of [
              { fall: flow.heatingCfm - after.heatingCfm, season: box.heating },
              { fall: flow.coolingCfm - after.coolingCfm, season: box.cooling },
            ]) {
              if (season === null) continue;
              const bound = season.fallPerCfm50[location];
              if (Number.isFinite(bound)) finite += 1;
              expect(fall).toBeLessThanOrEqual(step * bound + 1e-9 * (1 + Math.abs(fall)));
            }
            checked += 1;
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(500);
    expect(finite).toBeGreaterThan(checked / 2);
    expect(single).toBeGreaterThan(0);
  });

  it('a box with leakage at the ceiling alone has flow 0 and a finite fall there', () => {
    // All-ceiling AIM-2 flow: f_s and f_w are both 0 at a ceiling share of 1 (aim2.ts), so the
    // model gives 0; the one-location rule must give a finite, non-negative D there.
    const { model } = evaluateHome(homes[0]?.home ?? fail());
    const upper = { ceiling: 800, wall: 0, floor: 0, flue: 0 };
    expect(model.airflow(upper).heatingCfm).toBeCloseTo(0, 9);
    const box = aim2BoxBounds(model)({ lower: { ...upper, ceiling: 100 }, upper, floorCfm50: 0 });
    expect(box).not.toBeNull();
    const fall = box?.heating.fallPerCfm50.ceiling ?? NaN;
    expect(Number.isFinite(fall)).toBe(true);
    expect(fall).toBeGreaterThanOrEqual(0);
  });

  it('the raised floor keeps every state of the wider box whose total is at least it', () => {
    // subtreeBox with leastTotalCfm50: its states are the states of the plain box with total
    // ≥ the given least; both bound each such state's flow (checked above), and the raised
    // box's high flow per CFM50 is no more than the plain one's.
    let compared = 0;
    for (const { home } of homes.slice(0, 20)) {
      const evaluation = evaluateHome(home);
      const bound = buildAim2Bound(evaluation.model, buildPriceBook(evaluation.home));
      const live = liveAtTestIn(evaluation);
      const plain = subtreeBox(bound, evaluation.model.testIn, live);
      const raised = subtreeBox(
        bound,
        evaluation.model.testIn,
        live,
        evaluation.model.testInCfm50 * 0.9,
      );
      if (plain === null || raised === null) continue;
      expect(raised.heating.flowPerCfm50.hi).toBeLessThanOrEqual(
        plain.heating.flowPerCfm50.hi * (1 + 1e-9),
      );
      compared += 1;
    }
    expect(compared).toBeGreaterThan(10);
  });
});

function fail(): never {
  throw new Error('no home drawn');
}

/** The live measures at the test-in state, each at most what is left at its location. */
function liveAtTestIn(evaluation: Evaluation): LiveMeasure[] {
  const upper = evaluation.model.testIn;
  return measuresInPlanOrder(evaluation)
    .energy.map((measure, index) => ({
      index,
      location: measure.location,
      sizeCfm50: Math.min(Math.max(0, measure.estimateCfm50.likely), upper[measure.location]),
      costUsd: measure.cost.totalUsdFloat,
      factors: { heating: 1, electricity: 1 },
    }))
    .filter((measure) => measure.sizeCfm50 > 0);
}

describe('removableWithin: the most a location can lose within a budget', () => {
  it('is at least what any subset of its measures within the budget removes', () => {
    // Every subset enumerated: Σ sizes of a subset whose Σ costs ≤ budget never passes it.
    const next = uniformFrom(SEED + 4);
    let checked = 0;
    for (let draw = 0; draw < 200; draw += 1) {
      const count = 1 + Math.floor(next() * 7);
      const measures: LiveMeasure[] = Array.from({ length: count }, (_, index) => ({
        index,
        location: next() < 0.7 ? 'wall' : 'floor',
        sizeCfm50: 1 + 100 * next(),
        costUsd: next() < 0.1 ? 0 : Math.round(1000 * next() * 100) / 100,
        factors: { heating: 1, electricity: 1 },
      }));
      const budgetUsd = next() < 0.1 ? Infinity : 1500 * next();
      const reach = removableWithin(measures, 'wall', budgetUsd);
      for (let mask = 0; mask < 2 ** count; mask += 1) {
        let size = 0;
        let cost = 0;
        measures.forEach((measure, index) => {
          if ((mask & (1 << index)) === 0 || measure.location !== 'wall') return;
          size += measure.sizeCfm50;
          cost += measure.costUsd;
        });
        if (cost <= budgetUsd) {
          expect(size).toBeLessThanOrEqual(reach * (1 + 1e-12) + 1e-9);
          checked += 1;
        }
      }
    }
    expect(checked).toBeGreaterThan(1000);
  });
});

describe('best package on homes with most leakage in the ceiling: equals brute force', () => {
  it('where the empty package wins and where it does not', () => {
    let emptyWins = 0;
    let measuresWin = 0;
    for (const { home, budgetFraction } of ceilingHomes(80, SEED + 5, 12)) {
      const evaluation = evaluateHome(home);
      const energyCost = measuresInPlanOrder(evaluation).energy.reduce(
        (total, measure) => total + measure.cost.totalUsdFloat,
        0,
      );
      const budgetUsd = Math.round(energyCost * budgetFraction * 100) / 100;
      const packages = everyPackage(evaluation);
      const queries: BruteForceQuery[] = [
        {
          budgetUsd,
          objective: 'npv',
          everyMeasureSirAtLeastOne: false,
          packageSirAtLeastOne: false,
        },
        {
          budgetUsd,
          objective: 'savings',
          everyMeasureSirAtLeastOne: false,
          packageSirAtLeastOne: true,
        },
        {
          budgetUsd,
          objective: 'sir',
          everyMeasureSirAtLeastOne: false,
          packageSirAtLeastOne: true,
        },
      ];
      for (const query of queries) {
        const found = expectBruteForceBest(evaluation, packages, query, home.name);
        if (query.objective === 'npv') {
          if (found.budgetCostUsd.isZero()) emptyWins += 1;
          else measuresWin += 1;
        }
      }
    }
    expect(emptyWins).toBeGreaterThan(3);
    expect(measuresWin).toBeGreaterThan(3);
  }, 300_000);
});
