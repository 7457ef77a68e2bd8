/**
 * Test-out against the estimate (core/test-out.ts). Independent checks: test-outs made here
 * from a chosen realization rate (test-out = test-in − rate × the plan's estimated reduction)
 * must give that rate back; a multipoint test-out made from Q = C·ΔP^n must read as C·50^n
 * (the power law of the blower-door test, ASTM E779); the per-type allocation against a hand
 * computation written out below.
 */
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import {
  realizationByType,
  testOutInputOf,
  testOutResults,
  type TestOutResult,
} from '../../core/test-out.ts';
import { validBaseHome, type JsonObject } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

function withTestOut(test: JsonObject, done: readonly string[] = []): JsonObject {
  const home = validBaseHome();
  home.otherLeakageTests = [{ kind: 'testIn', cfm50: 3400, testedOn: '2026-03-01' }, test];
  home.measures = (home.measures as JsonObject[]).map((measure) =>
    done.includes(String(measure.id)) ? { ...measure, status: 'done' } : measure,
  );
  return home;
}

describe('a home’s test-out', () => {
  it('gives back the realization rate it was made with', () => {
    const plain = evaluateHome(validBaseHome());
    const estimated = plain.plan.package.cfm50Before - plain.plan.package.cfm50After;
    for (const rate of [0.5, 0.8, 1.2]) {
      const testOut = plain.plan.package.cfm50Before - rate * estimated;
      const evaluation = evaluateHome(withTestOut({ kind: 'testOut', cfm50: testOut }));
      const input = testOutInputOf(7, evaluation);
      expect(input?.packageAssumed).toBe(true);
      const [result] = testOutResults(input ? [input] : []);
      expect(result?.realizationRate).toBeCloseTo(rate, 9);
      // The whole package was done: the target reached is the same share.
      expect(result?.targetReachedFraction).toBeCloseTo(rate, 9);
      expect(result?.review).toEqual([]);
    }
  });

  it('counts only the measures marked done when some are', () => {
    const evaluation = evaluateHome(withTestOut({ kind: 'testOut', cfm50: 3000 }, ['m1']));
    const input = testOutInputOf(1, evaluation);
    expect(input?.packageAssumed).toBe(false);
    expect(input?.done.map((measure) => measure.id)).toEqual(['m1']);
  });

  it('reads a multipoint test-out by its fitted power law', () => {
    const coefficient = 180;
    const exponent = 0.65;
    const points = [15, 25, 35, 50].map((pa) => ({ pa, cfm: coefficient * pa ** exponent }));
    const evaluation = evaluateHome(withTestOut({ kind: 'testOut', points }));
    expect(testOutInputOf(1, evaluation)?.testOutCfm50).toBeCloseTo(
      coefficient * 50 ** exponent,
      6,
    );
  });

  it('takes the latest test-out by date', () => {
    const home = withTestOut({ kind: 'testOut', cfm50: 2900, testedOn: '2026-06-01' });
    (home.otherLeakageTests as JsonObject[]).push({
      kind: 'testOut',
      cfm50: 2500,
      testedOn: '2026-05-01',
    });
    expect(testOutInputOf(1, evaluateHome(home))?.testOutCfm50).toBe(2900);
  });

  it('flags a house that tested leakier after the work, and has no test-out as null', () => {
    const evaluation = evaluateHome(withTestOut({ kind: 'testOut', cfm50: 3500 }));
    const input = testOutInputOf(1, evaluation);
    const [result] = testOutResults(input ? [input] : []);
    expect(result?.review.join(' ')).toMatch(/more leakage than the test-in/);
    expect(testOutInputOf(1, evaluateHome(validBaseHome()))).toBeNull();
  });

  it('refuses a test-out that is not a number of CFM50, naming the home', () => {
    const bad = {
      homeId: 1,
      name: 'x',
      testInCfm50: 3000,
      testOutCfm50: Number.NaN,
      targetCfm50: 2500,
      done: [],
      packageAssumed: true,
    };
    expectInputError(() => testOutResults([bad]), 'homes[0].testOutCfm50', /at least 0/);
  });
});

describe('realization by measure type', () => {
  it('shares each home’s measured reduction by estimate (hand computation)', () => {
    // Home 1: estimates A 300, B 100; measured 200 → A gets 150, B 50.
    // Home 2: estimate A 200; measured 180 → A gets 180.
    // A: (150 + 180) / (300 + 200) = 0.66; B: 50 / 100 = 0.5.
    const home = (homeId: number, measured: number, done: [string, number][]): TestOutResult => ({
      homeId,
      name: `home ${homeId}`,
      testInCfm50: 3000,
      testOutCfm50: 3000 - measured,
      targetCfm50: 2500,
      done: done.map(([type, estimatedReductionCfm50], index) => ({
        id: `${type}-${index}`,
        type,
        estimatedReductionCfm50,
      })),
      packageAssumed: false,
      measuredReductionCfm50: measured,
      estimatedReductionCfm50: done.reduce((sum, [, value]) => sum + value, 0),
      realizationRate: null,
      targetReachedFraction: null,
      review: [],
    });
    const types = realizationByType([
      home(1, 200, [
        ['a', 300],
        ['b', 100],
      ]),
      home(2, 180, [['a', 200]]),
    ]);
    expect(types.map((type) => [type.type, type.homes, type.measures])).toEqual([
      ['a', 2, 2],
      ['b', 1, 1],
    ]);
    expect(types[0]?.realizationRate).toBeCloseTo(0.66, 12);
    expect(types[1]?.realizationRate).toBeCloseTo(0.5, 12);
  });
});
