/**
 * A portfolio's figures (core/portfolio.ts) on generated homes (test/_lib/home-arbitrary.ts,
 * fixed seed). Independent checks: the totals against each home's own plan summed here in
 * whole cents (integers), the figures by type against a plain group-by of the reports, the
 * spreads against simple-statistics' quantile (type 7 as numpy's) for the same values.
 */
import fc from 'fast-check';
import { quantile } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { evaluateHome, reportOf } from '../../core/evaluate.ts';
import { portfolioFigures, type PortfolioHome } from '../../core/portfolio.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { homeArbitrary } from '../_lib/home-arbitrary.ts';

const SEED = 77;
const HOMES = 30;

const homes: PortfolioHome[] = fc
  .sample(homeArbitrary({ measureCount: { min: 0, max: 8 } }), { seed: SEED, numRuns: HOMES })
  .map((file, index) => {
    const evaluation = evaluateHome(file);
    return {
      homeId: index + 1,
      name: evaluation.home.name,
      heatingFuel: evaluation.home.heating.fuel,
      volumeFt3: evaluation.home.house.conditionedVolumeFt3,
      report: reportOf(evaluation),
    };
  });

const cents = (usd: number) => Math.round(usd * 100);

describe('portfolio figures', () => {
  const figures = portfolioFigures(homes);

  it('totals each money figure to the cent as the sum of the homes’ own packages', () => {
    const sum = (pick: (home: PortfolioHome) => number) =>
      homes.reduce((total, home) => total + cents(pick(home)), 0) / 100;
    const totals = figures.totals;
    expect(totals.homes).toBe(HOMES);
    expect(totals.costUsd).toBe(sum((home) => home.report.package.costUsd));
    expect(totals.healthAndSafetyCostUsd).toBe(
      sum((home) => home.report.package.healthAndSafetyCostUsd),
    );
    expect(totals.costWithoutHealthAndSafetyUsd).toBe(
      sum((home) => home.report.package.costUsd - home.report.package.healthAndSafetyCostUsd),
    );
    expect(totals.annualSavingsUsd).toBe(sum((home) => home.report.package.annualSavingsUsd));
    expect(totals.npvUsd).toBe(sum((home) => home.report.package.npvUsd));
    const mmbtu = homes.reduce((total, home) => total + home.report.package.annualSavings.mmbtu, 0);
    expect(totals.mmbtu).toBeCloseTo(mmbtu, 9);
    const fuels = new Set(homes.map((home) => home.heatingFuel));
    expect(totals.heatingByFuel.map((entry) => entry.fuel).sort()).toEqual([...fuels].sort());
    for (const entry of totals.heatingByFuel) {
      const own = homes.filter((home) => home.heatingFuel === entry.fuel);
      expect(entry.homes).toBe(own.length);
      expect(entry.units).toBeCloseTo(
        own.reduce((total, home) => total + home.report.package.annualSavings.heatingFuelUnits, 0),
        9,
      );
    }
  });

  it('groups the packaged measures by type with their cost per CFM50 removed', () => {
    const packaged = homes.flatMap((home) =>
      home.report.measures
        .filter((measure) => measure.included)
        .map((measure) => ({ home, measure })),
    );
    expect(figures.byType.reduce((total, type) => total + type.measures, 0)).toBe(packaged.length);
    for (const type of figures.byType) {
      const own = packaged.filter(({ measure }) => measure.type === type.type);
      const costCents = own.reduce((total, { measure }) => total + cents(measure.costUsd), 0);
      const removed = own.reduce((total, { measure }) => total + measure.cfm50Reduction, 0);
      expect(type.costUsd).toBe(costCents / 100);
      expect(type.homes).toBe(new Set(own.map(({ home }) => home.homeId)).size);
      if (removed > 0) expect(type.usdPerCfm50Removed).toBeCloseTo(costCents / 100 / removed, 9);
    }
  });

  it('orders the supply curve by cost of saved energy, its last step the energy measures’ savings', () => {
    const curve = figures.supplyCurve;
    for (let index = 1; index < curve.length; index += 1) {
      expect(curve[index]?.cceUsdPerMMBtu).toBeGreaterThanOrEqual(
        curve[index - 1]?.cceUsdPerMMBtu ?? 0,
      );
    }
    const energySaved = homes
      .flatMap((home) => home.report.measures)
      .filter(
        (measure) =>
          measure.included &&
          !measure.healthAndSafety &&
          measure.cceUsdPerMMBtu !== null &&
          measure.annualSavings.mmbtu > 0,
      )
      .reduce((total, measure) => total + measure.annualSavings.mmbtu, 0);
    expect(curve.at(-1)?.cumulativeMmbtu ?? 0).toBeCloseTo(energySaved, 9);
  });

  it('spreads ACH50 and package SIR as simple-statistics’ quantiles give them', () => {
    const before = homes.map((home) => (home.report.package.cfm50Before * 60) / home.volumeFt3);
    expect(figures.leakage.ach50Before?.p10).toBeCloseTo(quantile(before, 0.1), 9);
    expect(figures.leakage.ach50Before?.p90).toBeCloseTo(quantile(before, 0.9), 9);
    const sirs = homes
      .map((home) => home.report.package.sir)
      .filter((sir): sir is number => sir !== null);
    expect(figures.packageSir?.p50).toBeCloseTo(quantile(sirs, 0.5), 9);
    const histogram = figures.leakage.histograms;
    expect(histogram.ach50Before.counts.reduce((a, b) => a + b, 0)).toBe(HOMES);
    expect(histogram.ach50After.counts.reduce((a, b) => a + b, 0)).toBe(HOMES);
    expect(histogram.ach50After.edges).toEqual(histogram.ach50Before.edges);
    expect(histogram.cfm50Before.counts.reduce((a, b) => a + b, 0)).toBe(HOMES);
    expect(histogram.cfm50After.edges).toEqual(histogram.cfm50Before.edges);
    // Each home in its own bin: the counts of the values inside each bin's edges.
    const cfm50 = homes.map((home) => home.report.package.cfm50Before);
    const edges = histogram.cfm50Before.edges;
    histogram.cfm50Before.counts.forEach((count, bin) => {
      const low = edges[bin] ?? 0;
      const high = edges[bin + 1] ?? 0;
      const last = bin === histogram.cfm50Before.counts.length - 1;
      const inside = cfm50.filter((value) => value >= low && (last ? value <= high : value < high));
      expect(count, `bin ${bin}`).toBe(inside.length);
    });
  });

  it('refuses a home without a volume, naming it', () => {
    const broken = homes.map((home, index) => (index === 3 ? { ...home, volumeFt3: 0 } : home));
    expectInputError(() => portfolioFigures(broken), 'homes[3].volumeFt3', /above 0/);
  });
});
