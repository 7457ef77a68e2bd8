/**
 * The AIM-2 bound by parts (core/plan/best-package/path-factors.ts, bounds-aim2.ts (i)),
 * checked against independent computations written here:
 * - its dynamic programme against every subsequence of the measures enumerated;
 * - the inequality itself on drawn sequences of factors and of a year's dollars, with Σ F_j·
 *   (h_{j−1} − h_j) summed step by step as the plan sums PV (summation by parts, Abel's
 *   identity: a standard result, e.g. Knuth, Graham & Patashnik, Concrete Mathematics, §2.6);
 * - the search against brute force (test/_lib/package-brute-force.ts) on tight AIM-2 homes
 *   that already call for a 62.2 fan, with measures of several lives: the homes where the
 *   fan's flow dwarfs what sealing can save, so that bound is what cuts the search.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { fanSplitPvBoundUsd } from '../../core/plan/best-package/fan-split.ts';
import { pathFactorPvBoundUsd } from '../../core/plan/best-package/path-factors.ts';
import type { LiveMeasure } from '../../core/plan/best-package/remaining-measures.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';
import {
  everyPackage,
  measuresInPlanOrder,
  type BruteForceQuery,
} from '../_lib/package-brute-force.ts';
import { expectBruteForceBest } from '../_lib/expect-brute-force.ts';
import { plannedEnergyMeasures } from '../_lib/package-cases.ts';

const SEED = 20261202;

/** Measures with the given factors (only the factors matter to the bound). */
function measuresWith(factors: readonly { heating: number; electricity: number }[]): LiveMeasure[] {
  return factors.map((factor, index) => ({
    index,
    location: 'ceiling',
    sizeCfm50: 1,
    costUsd: 1,
    factors: factor,
  }));
}

const factorArbitrary = fc.record({
  // A few lives' factors, so equal factors and rises both occur.
  heating: fc.constantFrom(0, 6.2, 8.99, 12.87, 16.38),
  electricity: fc.constantFrom(0, 7.1, 9.4, 13.3),
});

describe('the bound by parts', () => {
  it('is the largest F_1·(h_0 − ℓ) + U·(u − ℓ) over every subsequence (enumerated)', () => {
    fc.assert(
      fc.property(
        fc.array(factorArbitrary, { minLength: 0, maxLength: 9 }),
        fc.double({ min: -5, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 80, noNaN: true }),
        fc.double({ min: -5, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 30, noNaN: true }),
        (factors, heatingFirst, heatingRise, electricityFirst, electricityRise) => {
          const heating = { atNode: 100 + heatingFirst, least: 100, most: 100 + heatingRise };
          const electricity = {
            atNode: 40 + electricityFirst,
            least: 40,
            most: 40 + electricityRise,
          };
          let expected = 0;
          for (let subset = 1; subset < 2 ** factors.length; subset++) {
            const chosen = factors.filter((_, index) => (subset >> index) & 1);
            const first = chosen[0];
            if (first === undefined) continue;
            let value =
              first.heating * (heating.atNode - heating.least) +
              first.electricity * (electricity.atNode - electricity.least);
            for (let step = 1; step < chosen.length; step++) {
              const before = chosen[step - 1];
              const after = chosen[step];
              if (before === undefined || after === undefined) continue;
              value +=
                Math.max(0, after.heating - before.heating) * (heating.most - heating.least) +
                Math.max(0, after.electricity - before.electricity) *
                  (electricity.most - electricity.least);
            }
            expected = Math.max(expected, value);
          }
          const found = pathFactorPvBoundUsd(measuresWith(factors), heating, electricity);
          expect(found).toBeCloseTo(expected, 9);
        },
      ),
      { seed: SEED, numRuns: 300 },
    );
  });

  it('holds Σ F_j·(h_{j−1} − h_j) for every path whose dollars stay in [ℓ, u]', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            factors: factorArbitrary,
            heatingUsd: fc.double({ min: 0, max: 1, noNaN: true }),
            electricityUsd: fc.double({ min: 0, max: 1, noNaN: true }),
          }),
          { minLength: 1, maxLength: 12 },
        ),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (steps, heatingStart, electricityStart) => {
          // Dollars at each state: the node's, then each step's, all inside [ℓ, u].
          const heating = { least: 150, most: 260, atNode: 150 + 110 * heatingStart };
          const electricity = { least: 60, most: 75, atNode: 60 + 15 * electricityStart };
          let pv = 0;
          let heatingBefore = heating.atNode;
          let electricityBefore = electricity.atNode;
          for (const step of steps) {
            const heatingAfter = heating.least + (heating.most - heating.least) * step.heatingUsd;
            const electricityAfter =
              electricity.least + (electricity.most - electricity.least) * step.electricityUsd;
            pv +=
              step.factors.heating * (heatingBefore - heatingAfter) +
              step.factors.electricity * (electricityBefore - electricityAfter);
            heatingBefore = heatingAfter;
            electricityBefore = electricityAfter;
          }
          const bound = pathFactorPvBoundUsd(
            measuresWith(steps.map((step) => step.factors)),
            heating,
            electricity,
          );
          expect(pv).toBeLessThanOrEqual(bound * (1 + 1e-12) + 1e-9);
        },
      ),
      { seed: SEED + 1, numRuns: 500 },
    );
  });
});

/** A place in a range: often at an end, where a bound is tested hardest. */
const share = fc.oneof(fc.constant(0), fc.constant(1), fc.double({ min: 0, max: 1, noNaN: true }));

describe('the bound by parts with the fan taken out first', () => {
  it('holds the PV of every path whose fan only rises and whose flows stay in range', () => {
    // Each state's dollars as the model prices them: heating p_h·Φ(q, F), electricity
    // p_c·Φ(q_c, F) + p_l·Φ(q_l, F) + p_β·(F − E), Φ = F + q (balanced) or √(F² + q²).
    fc.assert(
      fc.property(
        fc.boolean(),
        fc.array(
          fc.record({
            factors: factorArbitrary,
            fanRise: share,
            heating: share,
            cooling: share,
            latent: share,
          }),
          { minLength: 1, maxLength: 10 },
        ),
        fc.double({ min: 0, max: 80, noNaN: true }),
        fc.double({ min: 0, max: 60, noNaN: true }),
        (balanced, steps, fanAtNode, fanRoom) => {
          const usd = { heating: 2.5, cooling: 0.3, latent: 0.1, fan: 0.5 };
          const flow = (q: number, fan: number) =>
            fan === 0 ? q : balanced ? fan + q : Math.hypot(fan, q);
          const range = { heating: [10, 60], cooling: [2, 20], latent: [0, 5] } as const;
          const at = (share: number, [least, most]: readonly [number, number]) =>
            least + (most - least) * share;
          const dollars = (
            q: { heating: number; cooling: number; latent: number },
            fan: number,
          ) => ({
            heating: usd.heating * flow(q.heating, fan),
            electricity:
              usd.cooling * flow(q.cooling, fan) + usd.latent * flow(q.latent, fan) + usd.fan * fan,
          });
          const fanMost = fanAtNode + fanRoom;
          // The fan rises step by step up to F(lo); the final one is at least F(hi) ≤ it.
          let fan = fanAtNode;
          let before = dollars({ heating: 40, cooling: 12, latent: 3 }, fanAtNode);
          let pv = 0;
          for (const step of steps) {
            fan = Math.min(fanMost, fan + step.fanRise * fanRoom);
            const after = dollars(
              {
                heating: at(step.heating, range.heating),
                cooling: at(step.cooling, range.cooling),
                latent: at(step.latent, range.latent),
              },
              fan,
            );
            pv +=
              step.factors.heating * (before.heating - after.heating) +
              step.factors.electricity * (before.electricity - after.electricity);
            before = after;
          }
          const bound = fanSplitPvBoundUsd({
            measures: measuresWith(steps.map((step) => step.factors)),
            heatingFactorLeast: Math.min(...steps.map((step) => step.factors.heating)),
            electricityFactorLeast: Math.min(...steps.map((step) => step.factors.electricity)),
            balanced,
            fanAtNode,
            fanFinalLeast: fan,
            fanMost,
            heatingUsdPerCfm: usd.heating,
            coolingUsdPerCfm: usd.cooling,
            latentUsdPerCfm: usd.latent,
            fanUsdPerCfm: usd.fan,
            heating: { atNode: 40, least: range.heating[0], most: range.heating[1] },
            cooling: { atNode: 12, least: range.cooling[0], most: range.cooling[1] },
            latent: { atNode: 3, least: range.latent[0], most: range.latent[1] },
          });
          expect(pv).toBeLessThanOrEqual(bound * (1 + 1e-9) + 1e-9);
        },
      ),
      { seed: SEED + 3, numRuns: 1000 },
    );
  });
});

/**
 * Generated tight AIM-2 homes (2 to 4 air changes at 50 Pa) with no continuous ventilation or
 * a small fan, so the 62.2 fan is called for before any sealing; most leakage in the ceiling
 * in half of them; every measure a planned energy measure of its generated life, its cost
 * scaled down in some homes so that some measures pay and the search must weigh them.
 */
function tightFanHomes(count: number, seed: number, most: number) {
  return fc
    .sample(
      fc.record({
        home: homeArbitrary({ measureCount: { min: 2, max: most }, methods: ['aim2'] }),
        airChangesAt50Pa: fc.constantFrom(2, 3, 4),
        ceilingHeavy: fc.boolean(),
        fan: fc.constantFrom(
          { existingFanCfm: 0, fanType: 'exhaust' as const, fanCostUsd: 520 },
          { existingFanCfm: 20, fanType: 'exhaust' as const, fanCostUsd: 400 },
          { existingFanCfm: 0, fanType: 'balanced' as const, fanCostUsd: 1400 },
        ),
        budgetFraction: fc.constantFrom(0.35, 0.5, 1),
        costScale: fc.constantFrom(0.03, 0.1, 0.3, 1),
      }),
      { seed, numRuns: count },
    )
    .map(({ home, airChangesAt50Pa, ceilingHeavy, fan, budgetFraction, costScale }) => {
      const cfm50 = Math.round((airChangesAt50Pa * home.house.conditionedVolumeFt3) / 60);
      const shaped: HomeFileInput = {
        ...home,
        leakageTest: { cfm50 },
        ventilation: fan,
        ...(ceilingHeavy
          ? { leakShares: { ceiling: 0.84, wall: 0.12, floor: 0.04, flue: 0 } }
          : {}),
        measures: plannedEnergyMeasures(home.measures, costScale),
      };
      delete shaped.leakageFloorCfm50;
      return { home: shaped, budgetFraction };
    });
}

describe('best package on tight AIM-2 homes that call for a fan: equals brute force', () => {
  it('for best NPV, best savings with package SIR ≥ 1 and best SIR', () => {
    let fanHomes = 0;
    for (const { home, budgetFraction } of tightFanHomes(60, SEED + 2, 12)) {
      const evaluation = evaluateHome(home);
      const energyCost = measuresInPlanOrder(evaluation).energy.reduce(
        (total, measure) => total + measure.cost.totalUsdFloat,
        0,
      );
      if (evaluation.model.ventilation(evaluation.model.testInCfm50).fanNeedCfm > 0) fanHomes += 1;
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
      for (const query of queries) expectBruteForceBest(evaluation, packages, query, home.name);
    }
    // Most of the generated homes do call for the fan before any sealing.
    expect(fanHomes).toBeGreaterThan(30);
  }, 300_000);
});
