/**
 * The test-out target of a work order (core/work-order/test-out-target.ts): the CFM50 to aim
 * for and the stop level, checked against an independent ASHRAE 62.2 computation written
 * here from the standard's equations.
 *
 * ANSI/ASHRAE Standard 62.2-2016 (and -2019), §4.1 and §4.1.2, for a detached dwelling:
 *   Q_tot = 0.03·A_floor + 7.5·(N_br + 1)                       total ventilation, cfm
 *   Q_inf = 0.052·Q50·wsf·(H / 8.2 ft)^0.4                       effective infiltration, cfm
 *   Q_fan = Q_tot − Φ·Q_inf, Φ = 1 balanced, Q_inf / Q_tot unbalanced
 * The stop level is the Q50 at which Q_fan equals the fan flow E the house already runs:
 *   balanced:   Q_tot − Q_inf = E            → Q50 = (Q_tot − E) / k
 *   unbalanced: Q_tot − Q_inf² / Q_tot = E   → Q50 = √(Q_tot·(Q_tot − E)) / k
 * with k = 0.052·wsf·(H/8.2)^0.4; with E = 0 both give Q_inf = Q_tot.
 */
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { fanThresholdCfm50 } from '../../core/plan/best-package.ts';
import type { HomeFileInput } from '../../core/schema.ts';
import {
  buildWorkOrder,
  STOP_LEVEL_TOLERANCE_CFM50,
  ventilationThresholdCfm50,
} from '../../core/work-order.ts';
import { validBaseHome } from '../_lib/base-home.ts';

type Measure = HomeFileInput['measures'][number];

/** One small measure, health and safety so the package always holds it. */
const SMALL: Measure = {
  id: 'plates',
  type: 'attic-top-plates',
  reductionCfm50: { low: 100, likely: 150, high: 200 },
  cost: { materialsUsd: 40, laborHours: 2, laborRateUsdPerHour: 50, healthAndSafety: true },
};

function home(change: (home: HomeFileInput) => void): HomeFileInput {
  const made = validBaseHome() as unknown as HomeFileInput;
  made.measures = [SMALL];
  change(made);
  return made;
}

/** The stop level from the standard's equations (see the header). */
function standardStopLevel(options: {
  floorAreaFt2: number;
  bedrooms: number;
  wsf: number;
  heightFt: number;
  existingFanCfm: number;
  balanced: boolean;
}): number {
  const totalCfm = 0.03 * options.floorAreaFt2 + 7.5 * (options.bedrooms + 1);
  const perCfm50 = 0.052 * options.wsf * (options.heightFt / 8.2) ** 0.4;
  const fan = options.existingFanCfm;
  return options.balanced
    ? (totalCfm - fan) / perCfm50
    : Math.sqrt(totalCfm * (totalCfm - fan)) / perCfm50;
}

// The base house: 1600 ft², 3 bedrooms, H 14 ft, wsf 0.55 (test/_lib/base-home.ts).
const BASE = { floorAreaFt2: 1600, bedrooms: 3, wsf: 0.55, heightFt: 14 };

describe('stop level against ASHRAE 62.2', () => {
  const cases = [
    { label: 'exhaust fan of 20 cfm', existingFanCfm: 20, fanType: 'exhaust', balanced: false },
    { label: 'no fan', existingFanCfm: 0, fanType: 'exhaust', balanced: false },
    { label: 'balanced fan of 20 cfm', existingFanCfm: 20, fanType: 'balanced', balanced: true },
    { label: 'balanced fan of 50 cfm', existingFanCfm: 50, fanType: 'balanced', balanced: true },
  ] as const;

  for (const { label, existingFanCfm, fanType, balanced } of cases) {
    it(`equals the standard's level within the stated tolerance, ${label}`, () => {
      const evaluation = evaluateHome(
        home((h) => {
          h.ventilation = { existingFanCfm, fanType };
        }),
      );
      const expected = standardStopLevel({ ...BASE, existingFanCfm, balanced });
      const solved = ventilationThresholdCfm50(evaluation.model);
      expect(solved).not.toBeNull();
      // Solved from above: never below the exact level, never more than the tolerance over.
      expect(solved as number).toBeGreaterThanOrEqual(expected - 1e-9);
      expect((solved as number) - expected).toBeLessThanOrEqual(STOP_LEVEL_TOLERANCE_CFM50);
      // The engine's own closed form (core/plan/best-package/thresholds.ts) agrees.
      expect(Math.abs(fanThresholdCfm50(evaluation.model) - expected)).toBeLessThan(1e-3);
    });
  }

  it('names the stop level when the package leaves the house above it', () => {
    const evaluation = evaluateHome(home(() => {}));
    const order = buildWorkOrder(evaluation);
    const expected = standardStopLevel({ ...BASE, existingFanCfm: 20, balanced: false });
    // Hand figures: Q_tot = 0.03·1600 + 7.5·4 = 78 cfm; k = 0.052·0.55·(14/8.2)^0.4 = 0.03542;
    // Q50 = √(78·58)/k ≈ 1,899 CFM50.
    expect(expected).toBeCloseTo(1898.7, 0);
    expect(order.target.kind).toBe('stopAt');
    expect(order.target.targetCfm50).toBeCloseTo(3200 - 150, 6);
    expect(order.target.sentences[0]).toMatch(/Aim for about 3,050 CFM50 at test-out/);
    expect(order.target.sentences[1]).toMatch(
      new RegExp(`Stop level: ${Math.ceil(expected).toLocaleString('en-US')} CFM50`),
    );
    expect(order.target.sentences[1]).toMatch(/78 cfm/);
    expect(order.target.caution).toMatch(
      /combustion safety follow local codes and licensed practice/,
    );
  });

  it('gives no stop level when the package carries a fan, and says why', () => {
    // Test-in 1,800 CFM50 is already below the level of 2,202 CFM50 with no fan: 78 / k.
    const evaluation = evaluateHome(
      home((h) => {
        h.leakageTest = { cfm50: 1800 };
        h.ventilation = { existingFanCfm: 0, fanType: 'exhaust' };
      }),
    );
    const order = buildWorkOrder(evaluation);
    expect(order.target.kind).toBe('fanPlanned');
    expect(order.ventilationFan?.cfm).toBeGreaterThan(0);
    expect(order.target.thresholdCfm50).toBeCloseTo(
      standardStopLevel({ ...BASE, existingFanCfm: 0, balanced: false }),
      1,
    );
    expect(order.target.sentences[1]).toMatch(
      /^No stop level: the package includes a ventilation fan/,
    );
  });

  it('gives no stop level without a weather and shielding factor (no 62.2 credit)', () => {
    const evaluation = evaluateHome(
      home((h) => {
        delete h.climate.wsf;
      }),
    );
    const order = buildWorkOrder(evaluation);
    expect(ventilationThresholdCfm50(evaluation.model)).toBeNull();
    expect(order.target).toMatchObject({
      kind: 'fanPlanned',
      thresholdCfm50: null,
      infiltrationCreditTaken: false,
    });
    expect(order.target.sentences[1]).toMatch(/no infiltration credit is taken/);
    // With no credit 62.2 asks for the whole 78 cfm; the house runs 20, so the fan adds 58.
    expect(order.target.addedFanCfm).toBeCloseTo(78 - 20, 9);
  });

  it('gives no stop level when the fans already meet the whole 62.2 rate', () => {
    const evaluation = evaluateHome(
      home((h) => {
        h.ventilation = { existingFanCfm: 80, fanType: 'exhaust' };
      }),
    );
    const order = buildWorkOrder(evaluation);
    expect(order.target).toMatchObject({ kind: 'fansSuffice', thresholdCfm50: null });
    expect(order.target.sentences[1]).toMatch(/meet the whole ASHRAE 62.2 rate of 78 cfm/);
  });
});
