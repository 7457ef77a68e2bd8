/**
 * The best package on the enhanced model (AIM-2) and on hour-by-hour homes, against brute
 * force (test/_lib/package-brute-force.ts: every subset valued by a plain replay with the
 * core's step, worth and ventilation functions), and each condition the AIM-2 bound rests on
 * (core/plan/best-package/bounds-aim2.ts, aim2-box.ts, interval.ts) checked against the
 * model's own airflow and energy (model.airflow, model.energyOf) at states drawn inside the
 * boxes, and against finite differences: an independent computation, not the bound's.
 */
import { describe, expect, it } from 'vitest';
import { evaluateHome, type Evaluation } from '../../core/evaluate.ts';
import type { LeakageByLocation } from '../../core/home-model.ts';
import { bestPackage } from '../../core/plan/best-package.ts';
import { aim2BoxBounds } from '../../core/plan/best-package/aim2-box.ts';
import { buildEnergyCells, cellLowCfm50 } from '../../core/plan/best-package/energy-cells.ts';
import { aim2Bounded } from '../../core/plan/best-package/bounds-aim2.ts';
import { buildPriceBook } from '../../core/plan/prices.ts';
import { LEAK_LOCATIONS, type HomeFileInput } from '../../core/schema.ts';
import {
  everyPackage,
  measuresInPlanOrder,
  type BruteForceQuery,
} from '../_lib/package-brute-force.ts';
import { expectBruteForceBest } from '../_lib/expect-brute-force.ts';
import { checkStateInBox, checkStepDollars } from '../_lib/aim2-box-checks.ts';
import { boxBelow, stateIn, swingingYear, uniformFrom } from '../_lib/aim2-states.ts';
import { generatedPackageHomes, packageQueriesFor } from '../_lib/package-cases.ts';

const SEED = 20261202;
const HOMES = 200;

/** Generated homes on the given methods (test/_lib/package-cases.ts). */
function generatedHomes(
  methods: readonly HomeFileInput['infiltrationMethod'][],
  count: number,
  seed: number,
  most = 14,
) {
  return generatedPackageHomes({ count, seed, most, methods });
}

/** bestPackage against brute force on one evaluation; returns how many queries were compared. */
function compareWithBruteForce(evaluation: Evaluation, queries: BruteForceQuery[], label: string) {
  const packages = everyPackage(evaluation);
  for (const query of queries) expectBruteForceBest(evaluation, packages, query, label);
  return { compared: queries.length, count: measuresInPlanOrder(evaluation).energy.length };
}

describe('best package on AIM-2 homes: equals brute force', () => {
  it(`on ${HOMES} generated AIM-2 homes of up to 14 measures, four queries each`, () => {
    let compared = 0;
    let cut = 0;
    const counts: number[] = [];
    for (const { home, budgetFraction, kind } of generatedHomes(['aim2'], HOMES, SEED)) {
      const evaluation = evaluateHome(home);
      expect(aim2Bounded(evaluation.model)).toBe(true);
      const queries = packageQueriesFor(evaluation, budgetFraction, kind);
      const result = compareWithBruteForce(evaluation, queries, home.name);
      compared += result.compared;
      counts.push(result.count);
      const found = bestPackage(evaluation, { budgetUsd: Infinity });
      expect(found.boundsUsed).toBe(true);
      if (found.nodesVisited < 2 ** result.count) cut += 1;
    }
    expect(compared).toBe(4 * HOMES);
    expect(Math.max(...counts)).toBe(14);
    expect(counts.filter((count) => count >= 12).length).toBeGreaterThanOrEqual(15);
    // The bound does cut: most homes are searched below 2^n.
    expect(cut).toBeGreaterThan(HOMES / 2);
  }, 300_000);
});

describe('the AIM-2 bound: the conditions it rests on', () => {
  const homes = generatedHomes(['aim2'], 120, SEED + 1, 8);

  it('the box bounds hold the model’s flow per CFM50 and its fall per CFM50 at each location', () => {
    // (c) of bounds-aim2.ts: for states s in the box and a step of length a at l with s − a·e_l
    // in the box, q(s)/c ∈ [G_lo, G_hi] and q(s) − q(s − a·e_l) ≤ a·D_l, by model.airflow.
    const next = uniformFrom(SEED + 2);
    let checked = 0;
    let finite = 0;
    for (const { home } of homes) {
      const { model } = evaluateHome(home);
      const bounds = aim2BoxBounds(model);
      for (let draw = 0; draw < 6; draw += 1) {
        const upper = model.testIn;
        const lower = boxBelow(upper, next, draw < 3 ? 0.1 : 0.6);
        const box = bounds({ lower, upper, floorCfm50: model.floorCfm50 });
        // Where the exact point is given, a bound must be given too.
        if (draw === 0) {
          expect(bounds({ lower: upper, upper, floorCfm50: 0 })).not.toBeNull();
        }
        if (box === null) continue;
        for (let sample = 0; sample < 5; sample += 1) {
          const state = stateIn(lower, upper, next);
          const result = checkStateInBox(model, box, lower, state, next);
          if (result === null) continue;
          checked += result.checked;
          finite += result.finite;
        }
      }
    }
    expect(checked).toBeGreaterThan(2000);
    expect(finite).toBeGreaterThan(checked);
  });

  it('a step saves no more heating or electricity dollars than its slope bound (the 62.2 fan in)', () => {
    // (e) of bounds-aim2.ts, with model.energyOf (natural flow, 62.2 fan, its power): for
    // states s in a node's box and s′ = s − a·e_l (a within the room), a year's heating and
    // electricity dollars fall by at most a·slope.
    const next = uniformFrom(SEED + 3);
    let checked = 0;
    let negative = 0;
    for (const { home } of homes) {
      const result = checkStepDollars(evaluateHome(home), next);
      checked += result.checked;
      negative += result.negative;
    }
    expect(checked).toBeGreaterThan(1000);
    // Some homes' fans make steps cost more than they save, and the slopes say so.
    expect(negative).toBeGreaterThan(0);
  });

  it('hour-by-hour AIM-2 homes are covered too, through their hours in bins', () => {
    const [first] = generatedHomes(['aim2'], 1, SEED + 4, 6);
    if (!first) throw new Error('no home');
    const evaluation = evaluateHome(
      { ...first.home, hourlyWeather: {} },
      { weather: swingingYear() },
    );
    expect(evaluation.model.climateBasis.kind).toBe('hourly');
    expect(aim2Bounded(evaluation.model)).toBe(true);
    expect(bestPackage(evaluation, { budgetUsd: Infinity }).boundsUsed).toBe(true);
  });
});

describe('the energy cells of hour-by-hour homes', () => {
  it('bound the model’s own energy from below and its fall per CFM50 from above', () => {
    // energy-cells.ts (i) and (ii) with the latent flow of its own, against model.energyOf at
    // states inside each cell split as the test-in leakage is.
    const weather = swingingYear();
    const next = uniformFrom(SEED + 6);
    let checked = 0;
    for (const method of ['nFactor', 'lblBasic', 'ashrae622'] as const) {
      for (const { home } of generatedHomes([method], 8, SEED + 7, 4)) {
        const evaluation = evaluateHome({ ...home, hourlyWeather: {} }, { weather });
        const { model } = evaluation;
        const prices = buildPriceBook(evaluation.home);
        const cells = buildEnergyCells(model, prices, model.testInCfm50);
        const dollars = (cfm50: number) => {
          const scale = cfm50 / model.testInCfm50;
          const leakage = Object.fromEntries(
            LEAK_LOCATIONS.map((location) => [location, model.testIn[location] * scale]),
          ) as LeakageByLocation;
          const energy = model.energyOf(leakage);
          return {
            heating: energy.heatingFuelUnits * prices.heating.usdPerUnitFloat,
            electricity:
              (energy.coolingKwh + energy.ventilationFanKwh) *
              (prices.electricity?.usdPerUnitFloat ?? 0),
          };
        };
        for (let draw = 0; draw < 20; draw += 1) {
          const index = Math.floor(next() * cells.count);
          const lo = cellLowCfm50(cells, index);
          const upper = lo + cells.widthCfm50 * (0.01 + 0.99 * next());
          const lower = lo + (upper - lo) * next() * 0.99;
          const atUpper = dollars(upper);
          const atLower = dollars(lower);
          const tolerance = 1e-9 * (1 + atUpper.heating + atUpper.electricity);
          expect(atLower.heating).toBeGreaterThanOrEqual(
            (cells.heatingLowUsd[index] ?? 0) - tolerance,
          );
          expect(atLower.electricity).toBeGreaterThanOrEqual(
            (cells.electricityLowUsd[index] ?? 0) - tolerance,
          );
          expect(atUpper.heating - atLower.heating).toBeLessThanOrEqual(
            (cells.heatingSlopeUsd[index] ?? 0) * (upper - lower) + tolerance,
          );
          expect(atUpper.electricity - atLower.electricity).toBeLessThanOrEqual(
            (cells.electricitySlopeUsd[index] ?? 0) * (upper - lower) + tolerance,
          );
          checked += 1;
        }
      }
    }
    expect(checked).toBe(3 * 8 * 20);
  });
});

describe('best package on hour-by-hour homes: equals brute force', () => {
  it('for the methods linear in CFM50 and for AIM-2, every one bounded', () => {
    // Hour by hour, nFactor, lblBasic and ashrae622 stay linear in CFM50 every hour, so the
    // energy table of energy-cells.ts still applies, and AIM-2's box bounds take the hours in
    // bins (aim2-hourly-bins.ts); brute force is the check.
    const weather = swingingYear();
    let compared = 0;
    const methods = new Set<string>();
    for (const method of ['nFactor', 'lblBasic', 'ashrae622', 'aim2'] as const) {
      for (const { home, budgetFraction, kind } of generatedHomes([method], 8, SEED + 5, 10)) {
        const evaluation = evaluateHome({ ...home, hourlyWeather: {} }, { weather });
        expect(evaluation.model.climateBasis.kind).toBe('hourly');
        const found = bestPackage(evaluation, { budgetUsd: Infinity });
        expect(found.boundsUsed).toBe(true);
        compared += compareWithBruteForce(
          evaluation,
          packageQueriesFor(evaluation, budgetFraction, kind),
          `${method} hourly`,
        ).compared;
        methods.add(method);
      }
    }
    expect(compared).toBe(4 * 8 * 4);
    expect(methods.size).toBe(4);
  }, 120_000);
});
