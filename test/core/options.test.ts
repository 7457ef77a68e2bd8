/**
 * A proposal's options (core/plan/options.ts) on generated homes (test/_lib/home-arbitrary.ts,
 * fixed seed): the recommended tier is the plan's package figure for figure; the first step
 * and the thorough tier are the best packages by brute force (every subset replayed with the
 * core's step and worth, test/_lib/package-brute-force.ts) under their stated rules.
 */
import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { FIRST_STEP_SHARE_DEFAULT, proposalOptions } from '../../core/plan/options.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { bestByBruteForce, everyPackage } from '../_lib/package-brute-force.ts';

const SEED = 6;
const HOMES = 40;

const homes = fc.sample(homeArbitrary({ measureCount: { min: 1, max: 10 } }), {
  seed: SEED,
  numRuns: HOMES,
});

describe('proposal options', () => {
  it('gives first step, recommended and thorough, each as brute force finds it', () => {
    let deeper = 0;
    for (const home of homes) {
      const evaluation = evaluateHome(home);
      const tiers = proposalOptions(evaluation);
      expect(tiers.map((tier) => tier.id)).toEqual(['first-step', 'recommended', 'thorough']);
      const [first, recommended, thorough] = tiers;
      if (!first || !recommended || !thorough) throw new Error('three tiers');

      // Recommended: the plan's package, figure for figure.
      const planned = evaluation.plan.package;
      expect(recommended.measureIds).toEqual(planned.measureIds);
      expect(recommended.costUsd.eq(planned.costUsd)).toBe(true);
      expect(recommended.npvUsd.eq(planned.npvUsd)).toBe(true);
      expect(recommended.annualSavingsUsd.eq(planned.annualSavingsUsd)).toBe(true);
      expect(recommended.sir?.toString() ?? null).toBe(planned.sir?.toString() ?? null);

      const packages = everyPackage(evaluation);
      const recommendedEnergyCost = evaluation.plan.entries
        .filter((entry) => entry.included && !entry.step.measure.cost.healthAndSafety)
        .reduce((total, entry) => total.plus(entry.step.measure.cost.totalUsd), new Decimal(0));
      const firstExpected = bestByBruteForce(packages, {
        budgetUsd: recommendedEnergyCost.times(FIRST_STEP_SHARE_DEFAULT).toNumber(),
        objective: 'npv',
        everyMeasureSirAtLeastOne: true,
        packageSirAtLeastOne: false,
      });
      expect(first.measureIds).toEqual(firstExpected.measureIds);
      expect(first.npvUsd.eq(firstExpected.npvUsd)).toBe(true);

      const thoroughExpected = bestByBruteForce(packages, {
        budgetUsd: Infinity,
        objective: 'savings',
        everyMeasureSirAtLeastOne: false,
        packageSirAtLeastOne: true,
      });
      expect(thorough.measureIds).toEqual(thoroughExpected.measureIds);
      expect(thorough.annualSavingsUsd.eq(thoroughExpected.annualSavingsUsd)).toBe(true);
      if (thorough.sir !== null) expect(thorough.sir.gte(1)).toBe(true);
      // The plan's package passes the thorough rule, so the thorough tier saves at least as much.
      expect(thorough.annualSavingsUsd.gte(recommended.annualSavingsUsd)).toBe(true);
      if (thorough.annualSavingsUsd.gt(recommended.annualSavingsUsd)) deeper += 1;

      // Payback is cost over a year's savings (NIST Handbook 135 simple payback).
      for (const tier of tiers) {
        if (tier.annualSavingsUsd.gt(0)) {
          expect(tier.simplePaybackYears?.eq(tier.costUsd.div(tier.annualSavingsUsd))).toBe(true);
        } else {
          expect(tier.simplePaybackYears).toBeNull();
        }
        expect(tier.range).toBeUndefined();
      }
    }
    // The tiers do differ on some homes: the thorough tier goes further than the plan.
    expect(deeper).toBeGreaterThan(0);
  }, 60_000);

  it('keeps the first step within a stated budget', () => {
    const evaluation = evaluateHome(validBaseHome());
    const [first] = proposalOptions(evaluation, { firstStepBudgetUsd: 400 });
    const packages = everyPackage(evaluation);
    const expected = bestByBruteForce(packages, {
      budgetUsd: 400,
      objective: 'npv',
      everyMeasureSirAtLeastOne: true,
      packageSirAtLeastOne: false,
    });
    expect(first?.measureIds).toEqual(expected.measureIds);
    expect(first?.costUsd.eq(expected.costUsd)).toBe(true);
  });

  it('refuses a share outside 0–1 or a negative budget, naming the setting', () => {
    const evaluation = evaluateHome(validBaseHome());
    expectInputError(
      () => proposalOptions(evaluation, { firstStepShare: 1.5 }),
      'firstStepShare',
      /from 0 to 1/,
    );
    expectInputError(
      () => proposalOptions(evaluation, { thoroughBudgetUsd: -5 }),
      'thoroughBudgetUsd',
      /at least 0/,
    );
  });
});
