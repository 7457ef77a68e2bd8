/**
 * The plan: measure estimates and costs, assumed leak locations, sequencing by each ranking,
 * the leakage floor, location limits, health-and-safety measures and the ventilation fan.
 * Expected values are computed here from the published formulas, not read from the engine.
 */
import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { evaluateHome, evaluateHomeReport } from '../../core/evaluate.ts';
import { assumedLeakShares } from '../../core/home-model.ts';
import { findMeasureType } from '../../core/measure-library.ts';
import { estimateReductionCfm50, measureCost } from '../../core/measures.ts';
import type { HomeFileInput } from '../../core/schema.ts';

type MeasureInput = HomeFileInput['measures'][number];

function direct(
  id: string,
  type: string,
  likely: number,
  cost: number,
  extra: Partial<MeasureInput> = {},
) {
  return {
    id,
    type,
    reductionCfm50: { low: likely * 0.5, likely, high: likely * 1.5 },
    cost: { materialsUsd: cost, laborHours: 0, laborRateUsdPerHour: 0 },
    lifeYears: 20,
    ...extra,
  } satisfies MeasureInput;
}

function home(overrides: Partial<HomeFileInput> = {}): HomeFileInput {
  return {
    format: 'sealwork-home/1',
    name: 'test house',
    house: {
      conditionedFloorAreaFt2: 1500,
      conditionedVolumeFt3: 12_000,
      stories: 1,
      heightFt: 10,
      bedrooms: 3,
      shelterClass: 3,
      foundation: 'basement',
      yearBuilt: 1985,
    },
    climate: {
      name: 'test climate',
      hdd65F: 6000,
      cdd65F: 0,
      elevationFt: 0,
      wsf: 0.5,
      heatingSeason: { meanDeltaTF: 35, meanWindSpeedMph: 10 },
    },
    heating: {
      fuel: 'naturalGas',
      equipment: 'furnace',
      efficiency: 0.8,
      combustionVenting: 'sealed',
    },
    cooling: null,
    prices: { naturalGas: { usdPerUnit: 1.5 }, electricity: { usdPerUnit: 0.15 } },
    economics: { discountRateReal: 0.03 },
    infiltrationMethod: 'nFactor',
    nFactorOverride: 20,
    leakageTest: { cfm50: 4000 },
    // Leaky enough that 62.2 asks for no fan before or after the measures below.
    measures: [],
    ...overrides,
  };
}

/** Therms a season saves per CFM50 removed with the N-factor method: 1.08·24·HDD/N ÷ AFUE ÷ 1e5. */
function thermsPerCfm50(hdd65F: number, nFactor: number, afue: number): number {
  // ASHRAE HoF 1.08 Btu/(h·cfm·°F) at sea level; ACHnat = ACH50/N (Sherman 1987); EIA therm.
  return (1.08 * 24 * hdd65F) / nFactor / afue / 100_000;
}

describe('measure cost', () => {
  it('is materials + labour + markup, each to the cent', () => {
    const cost = measureCost({
      materialsUsd: 120,
      laborHours: 6,
      laborRateUsdPerHour: 55.5,
      markupFraction: 0.1,
    });
    expect(cost.materialsUsd.toFixed(2)).toBe('120.00');
    expect(cost.laborUsd.toFixed(2)).toBe('333.00');
    expect(cost.markupUsd.toFixed(2)).toBe('45.30');
    expect(cost.totalUsd.toFixed(2)).toBe('498.30');
  });

  it('rounds a markup of half a cent up (commercial rounding)', () => {
    const cost = measureCost({
      materialsUsd: 0.05,
      laborHours: 0,
      laborRateUsdPerHour: 0,
      markupFraction: 0.1,
    });
    expect(cost.markupUsd.toFixed(2)).toBe('0.01');
  });
});

describe('CFM50 estimates', () => {
  const type = findMeasureType('recessed-lights');
  if (!type) throw new Error('library lacks recessed-lights');
  const testIn = { ceiling: 1000, wall: 2000, floor: 1000, flue: 0 };

  it('by units: units × leakage area × effectiveness, as ELA at 4 Pa scaled to 50 Pa', () => {
    const estimate = estimateReductionCfm50(
      {
        id: 'cans',
        type: 'recessed-lights',
        byUnits: {
          units: 10,
          leakageAreaIn2PerUnit: { low: 1, likely: 2, high: 3 },
          sealingEffectiveness: { low: 0.5, likely: 0.8, high: 1 },
        },
        cost: { materialsUsd: 0, laborHours: 0, laborRateUsdPerHour: 0 },
      },
      type,
      { exponentN: 0.65, testIn },
    );
    // ASHRAE HoF: Q = A·√(2ΔP/ρ) at 4 Pa with ρ = 1.2 kg/m³, C_D = 1; Q50 = Q4·(50/4)^n.
    const cfm50Of = (areaIn2: number) =>
      ((areaIn2 * 0.00064516 * Math.sqrt((2 * 4) / 1.2)) / (0.3048 ** 3 / 60)) * (50 / 4) ** 0.65;
    expect(estimate.method).toBe('byUnits');
    expect(estimate.range.low).toBeCloseTo(cfm50Of(10 * 1 * 0.5), 9);
    expect(estimate.range.likely).toBeCloseTo(cfm50Of(10 * 2 * 0.8), 9);
    expect(estimate.range.high).toBeCloseTo(cfm50Of(10 * 3 * 1), 9);
  });

  it('share of location: the share of the test-in leakage at its location', () => {
    const estimate = estimateReductionCfm50(
      {
        id: 'cans',
        type: 'recessed-lights',
        shareOfLocation: { share: { low: 0.1, likely: 0.2, high: 0.3 } },
        cost: { materialsUsd: 0, laborHours: 0, laborRateUsdPerHour: 0 },
      },
      type,
      { exponentN: 0.65, testIn },
    );
    expect(estimate.range).toEqual({ low: 100, likely: 200, high: 300 });
  });
});

describe('assumed leak shares', () => {
  it('are the default split when the scope fits inside it', () => {
    expect(assumedLeakShares({ cfm50: 4000, expectedByLocation: { ceiling: 500 } })).toEqual({
      ceiling: 0.25,
      wall: 0.5,
      floor: 0.25,
      flue: 0,
    });
  });

  it('make room for what the scope expects at a location, and still sum to one', () => {
    const shares = assumedLeakShares({
      cfm50: 4000,
      expectedByLocation: { ceiling: 2000, flue: 200 },
    });
    expect(shares.ceiling).toBeCloseTo(0.5, 12);
    expect(shares.flue).toBeCloseTo(0.05, 12);
    // The rest (0.45) split between walls and floor in the default 2:1 proportion.
    expect(shares.wall).toBeCloseTo(0.3, 12);
    expect(shares.floor).toBeCloseTo(0.15, 12);
  });

  it('split by the scope when it expects more than the house leaks', () => {
    const shares = assumedLeakShares({
      cfm50: 1000,
      expectedByLocation: { ceiling: 900, wall: 300 },
    });
    expect(shares.ceiling + shares.wall + shares.floor + shares.flue).toBeCloseTo(1, 12);
    expect(shares.ceiling).toBeCloseTo(0.75, 12);
  });
});

describe('sequencing', () => {
  it('values each measure by hand with the N-factor method and ranks by SIR', () => {
    const report = evaluateHomeReport(
      home({
        measures: [
          direct('cheap', 'attic-top-plates', 300, 200),
          direct('dear', 'rim-joist', 300, 900),
          direct('mid', 'attic-chases', 200, 250),
        ],
      }),
    );
    const perCfm50 = thermsPerCfm50(6000, 20, 0.8);
    const upv = (1 - 1.03 ** -20) / 0.03; // NIST Handbook 135, UPV(3 %, 20)
    const expected = [
      ['cheap', 300, 200],
      ['mid', 200, 250],
      ['dear', 300, 900],
    ] as const;
    expect(report.measures.map((m) => m.id)).toEqual(expected.map(([id]) => id));
    for (const [id, cfm50, cost] of expected) {
      const measure = report.measures.find((m) => m.id === id);
      const usd = new Decimal(cfm50 * perCfm50 * 1.5).toDecimalPlaces(2).toNumber();
      expect(measure?.annualSavings.heatingFuelUnits).toBeCloseTo(cfm50 * perCfm50, 9);
      expect(measure?.annualSavings.usd).toBeCloseTo(usd, 2);
      expect(measure?.sir).toBeCloseTo((cfm50 * perCfm50 * 1.5 * upv) / cost, 3);
    }
  });

  it('leaves out measures that fail SIR ≥ 1 and flags them', () => {
    const report = evaluateHomeReport(
      home({
        measures: [
          direct('good', 'attic-top-plates', 400, 300),
          direct('poor', 'window-sealing', 20, 900),
        ],
      }),
    );
    const poor = report.measures.find((m) => m.id === 'poor');
    expect(poor?.included).toBe(false);
    expect(poor?.sirBelowOne).toBe(true);
    expect(report.package.measureIds).toEqual(['good']);
  });

  it('puts health-and-safety measures first and keeps their cost out of the SIR', () => {
    const report = evaluateHomeReport(
      home({
        measures: [
          direct('energy', 'attic-top-plates', 400, 300),
          {
            ...direct('safety', 'dryer-vent', 10, 500),
            cost: {
              materialsUsd: 500,
              laborHours: 0,
              laborRateUsdPerHour: 0,
              healthAndSafety: true,
            },
          },
        ],
      }),
    );
    expect(report.measures.map((m) => m.id)).toEqual(['safety', 'energy']);
    expect(report.measures[0]?.sir).toBeNull();
    const energy = report.measures[1];
    expect(report.package.costUsd).toBeCloseTo(800, 2);
    expect(report.package.healthAndSafetyCostUsd).toBeCloseTo(500, 2);
    expect(report.package.sir).toBeCloseTo((energy?.pvSavingsUsd ?? NaN) / 300, 3);
  });

  it('never goes below the leakage floor, and says so', () => {
    const evaluation = evaluateHome(
      home({
        leakageFloorCfm50: 3500,
        measures: [direct('a', 'attic-top-plates', 300, 10), direct('b', 'attic-chases', 300, 10)],
      }),
    );
    expect(evaluation.plan.package.cfm50After).toBeCloseTo(3500, 9);
    const second = evaluation.plan.entries[1];
    expect(second?.step.appliedCfm50).toBeCloseTo(200, 9);
    expect(second?.step.limitedBy).toBe('floor');
    expect(evaluation.notes.some((note) => note.includes('leakage floor'))).toBe(true);
  });

  it('never removes more than is left at a location', () => {
    const evaluation = evaluateHome(
      home({
        leakShares: { ceiling: 0.1, wall: 0.5, floor: 0.4, flue: 0 },
        measures: [direct('a', 'attic-top-plates', 300, 10), direct('b', 'attic-chases', 300, 10)],
      }),
    );
    // 10 % of 4000 CFM50 is at the ceiling: both measures together can remove 400 at most.
    const removed = evaluation.plan.entries.reduce(
      (sum, entry) => sum + entry.step.appliedCfm50,
      0,
    );
    expect(removed).toBeCloseTo(400, 9);
    expect(evaluation.plan.entries[1]?.step.limitedBy).toBe('location');
  });

  it('orders by NPV, payback or cost of saved energy when asked', () => {
    const measures = [
      direct('big', 'attic-top-plates', 800, 900), // larger NPV, slower payback
      direct('small', 'attic-chases', 200, 100), // quicker payback, smaller NPV
    ];
    const byNpv = evaluateHomeReport(
      home({ measures, economics: { discountRateReal: 0.03, ranking: 'npv' } }),
    );
    const byPayback = evaluateHomeReport(
      home({ measures, economics: { discountRateReal: 0.03, ranking: 'payback' } }),
    );
    const byCce = evaluateHomeReport(
      home({ measures, economics: { discountRateReal: 0.03, ranking: 'cce' } }),
    );
    expect(byNpv.measures.map((m) => m.id)).toEqual(['big', 'small']);
    expect(byPayback.measures.map((m) => m.id)).toEqual(['small', 'big']);
    expect(byCce.measures.map((m) => m.id)).toEqual(['small', 'big']);
  });

  it('leaves declined measures out and lists them last', () => {
    const report = evaluateHomeReport(
      home({
        measures: [
          direct('declined', 'attic-top-plates', 900, 10, { status: 'declined' }),
          direct('kept', 'attic-chases', 200, 100),
        ],
      }),
    );
    expect(report.measures.map((m) => [m.id, m.included])).toEqual([
      ['kept', true],
      ['declined', false],
    ]);
    expect(report.package.cfm50After).toBeCloseTo(3800, 9);
  });
});

describe('where the leak is (enhanced model)', () => {
  it('values the same CFM50 differently at the ceiling and in the walls', () => {
    const aim2 = (type: string) =>
      evaluateHomeReport(
        home({
          infiltrationMethod: 'aim2',
          leakShares: { ceiling: 0.4, wall: 0.3, floor: 0.3, flue: 0 },
          house: {
            ...home().house,
            stories: 2,
            heightFt: 20,
            conditionedVolumeFt3: 24_000,
            conditionedFloorAreaFt2: 3000,
          },
          measures: [direct('m', type, 600, 100)],
        }),
      ).measures[0]?.annualSavings.heatingFuelUnits ?? NaN;
    const ceiling = aim2('attic-top-plates');
    const wall = aim2('band-joist');
    expect(ceiling).toBeGreaterThan(0);
    expect(wall).toBeGreaterThan(0);
    expect(Math.abs(ceiling - wall) / wall).toBeGreaterThan(0.01);
  });
});

describe('ventilation', () => {
  it('carries a fan when sealing takes the house below its 62.2 need', () => {
    const report = evaluateHomeReport(
      home({
        leakageTest: { cfm50: 1200 },
        ventilation: { existingFanCfm: 0, fanCostUsd: 400 },
        measures: [direct('a', 'attic-top-plates', 100, 10)],
      }),
    );
    // ANSI/ASHRAE 62.2-2016 4.1.1: Q_tot = 0.03·1500 + 7.5·(3 + 1) = 75 cfm.
    const requiredCfm = 0.03 * 1500 + 7.5 * 4;
    // 4.1.2: Q_inf = 0.052·Q50·wsf·(H/8.2)^0.4; unbalanced fan Q_fan = Q_tot − Q_inf²/Q_tot.
    const infiltrationAfter = 0.052 * 1100 * 0.5 * (10 / 8.2) ** 0.4;
    const fanAfter = requiredCfm - infiltrationAfter ** 2 / requiredCfm;
    const vent = report.package.ventilation;
    expect(vent.requiredCfm).toBeCloseTo(requiredCfm, 9);
    expect(vent.infiltrationCfm).toBeCloseTo(infiltrationAfter, 9);
    expect(vent.fanCfm).toBeCloseTo(fanAfter, 9);
    expect(vent.fanAdded).toBe(true);
    expect(report.package.costUsd).toBeCloseTo(410, 2);
    expect(report.package.healthAndSafetyCostUsd).toBeCloseTo(400, 2);
    expect(report.cautions.some((caution) => caution.code === 'ventilation-needed')).toBe(true);
  });

  it('charges the measures for the ventilation they call for', () => {
    const measures = [direct('a', 'attic-top-plates', 300, 10)];
    const leaky = evaluateHomeReport(home({ measures }));
    const tight = evaluateHomeReport(
      home({
        measures,
        leakageTest: { cfm50: 1000 },
        climate: { ...home().climate, wsf: 0.5 },
        ventilation: {},
      }),
    );
    // The same 300 CFM50 saves the N-factor amount in a leaky house with no fan need...
    expect(leaky.measures[0]?.annualSavings.heatingFuelUnits).toBeCloseTo(
      300 * thermsPerCfm50(6000, 20, 0.8),
      9,
    );
    // ...but much less where the fan must make up the air the sealing removed.
    expect(tight.measures[0]?.annualSavings.usd ?? NaN).toBeLessThan(
      (leaky.measures[0]?.annualSavings.usd ?? 0) * 0.8,
    );
  });
});
