/**
 * A program's homes together: what their plans add up to, and how they spread. Every total is
 * the sum of the homes' own packages, added in Decimal from the cents each report gives, so a
 * program total equals the sum of its homes to the cent. Distributions (package SIR, leakage
 * before and after) and the figures by measure type come from the same reports; the
 * conservation supply curve orders every packaged energy measure by its cost of saved energy.
 */
import { InputError } from './errors.ts';
import { Decimal, sumUsd } from './money.ts';
import type { EvaluationReport, MeasureReport } from './report.ts';
import type { Fuel } from './schema.ts';
import { histogramOf, quantileSorted, type Histogram } from './uncertainty/summary.ts';

/** One home of a portfolio: its plan's report and the few facts the report leaves out. */
export interface PortfolioHome {
  homeId: number;
  name: string;
  heatingFuel: Fuel;
  volumeFt3: number;
  report: EvaluationReport;
}

/** How a figure spreads over the homes. */
export interface Spread {
  count: number;
  min: number;
  p10: number;
  p50: number;
  p90: number;
  max: number;
  mean: number;
}

export interface PortfolioTotals {
  homes: number;
  /** Measures in the homes' packages (health and safety among them). */
  measures: number;
  costUsd: number;
  healthAndSafetyCostUsd: number;
  /** The cost of the energy work alone. */
  costWithoutHealthAndSafetyUsd: number;
  annualSavingsUsd: number;
  pvSavingsUsd: number;
  npvUsd: number;
  mmbtu: number;
  co2Kg: number;
  coolingKwh: number;
  /** Heating fuel saved a year, by fuel, in each fuel's unit. */
  heatingByFuel: { fuel: Fuel; unit: string; units: number; homes: number }[];
  cfm50Before: number;
  cfm50After: number;
}

export interface MeasureTypeFigures {
  type: string;
  name: string;
  /** Measures of the type in the homes' packages, and the homes they are in. */
  measures: number;
  homes: number;
  costUsd: number;
  cfm50Removed: number;
  /** Cost per CFM50 removed; null when none was removed. */
  usdPerCfm50Removed: number | null;
  annualSavingsUsd: number;
  mmbtu: number;
  /** Share of the type's packaged energy measures with SIR ≥ 1. */
  shareSirAtLeastOne: number | null;
}

/** One step of the conservation supply curve. */
export interface SupplyStep {
  homeId: number;
  measureId: string;
  type: string;
  cceUsdPerMMBtu: number;
  mmbtu: number;
  /** Savings of this measure and every cheaper one, MMBtu a year. */
  cumulativeMmbtu: number;
}

export interface PortfolioFigures {
  totals: PortfolioTotals;
  /** Package SIR over the homes with energy work. */
  packageSir: Spread | null;
  shareHomesSirAtLeastOne: number | null;
  shareMeasuresSirAtLeastOne: number | null;
  leakage: {
    cfm50Before: Spread | null;
    cfm50After: Spread | null;
    ach50Before: Spread | null;
    ach50After: Spread | null;
    /** Before and after share their bins, so the two read on one axis. */
    histograms: {
      ach50Before: Histogram;
      ach50After: Histogram;
      cfm50Before: Histogram;
      cfm50After: Histogram;
    };
  };
  byType: MeasureTypeFigures[];
  supplyCurve: SupplyStep[];
}

/** One home's line of the portfolio: its package's figures. */
export interface PortfolioRow {
  homeId: number;
  name: string;
  heatingFuel: string;
  measures: number;
  costUsd: number;
  healthAndSafetyCostUsd: number;
  annualSavingsUsd: number;
  npvUsd: number;
  sir: number | null;
  mmbtu: number;
  co2Kg: number;
  cfm50Before: number;
  cfm50After: number;
  ach50Before: number;
  ach50After: number;
}

/** Histogram bins of the leakage distributions. */
export const LEAKAGE_HISTOGRAM_BINS = 20;

/** The spread of values (any order); null for none. */
export function spreadOfValues(values: readonly number[]): Spread | null {
  if (values.length === 0) return null;
  const sorted = Float64Array.from(values).sort();
  const sum = values.reduce((total, value) => total + value, 0);
  return {
    count: values.length,
    min: sorted[0] ?? Number.NaN,
    p10: quantileSorted(sorted, 0.1),
    p50: quantileSorted(sorted, 0.5),
    p90: quantileSorted(sorted, 0.9),
    max: sorted[sorted.length - 1] ?? Number.NaN,
    mean: sum / values.length,
  };
}

/** Sums report figures that are whole cents, in Decimal; the result is a number of cents. */
function sumCents(values: readonly number[]): number {
  return sumUsd(values.map((value) => new Decimal(value))).toNumber();
}

function requireHomes(homes: readonly PortfolioHome[]): void {
  homes.forEach((home, index) => {
    if (!(home.volumeFt3 > 0)) {
      throw InputError.at(`homes[${index}].volumeFt3`, 'expected a volume above 0 ft³');
    }
    if (home.report?.package === undefined) {
      throw InputError.at(`homes[${index}].report`, 'expected the evaluation report of the home');
    }
  });
}

function packaged(report: EvaluationReport): MeasureReport[] {
  return report.measures.filter((measure) => measure.included);
}

function totalsOf(homes: readonly PortfolioHome[]): PortfolioTotals {
  const packages = homes.map((home) => home.report.package);
  const byFuel = new Map<Fuel, { unit: string; units: number; homes: number }>();
  for (const home of homes) {
    const saved = home.report.package.annualSavings;
    const entry = byFuel.get(home.heatingFuel) ?? {
      unit: saved.heatingFuelUnit,
      units: 0,
      homes: 0,
    };
    entry.units += saved.heatingFuelUnits;
    entry.homes += 1;
    byFuel.set(home.heatingFuel, entry);
  }
  const costUsd = sumCents(packages.map((pkg) => pkg.costUsd));
  const healthAndSafetyCostUsd = sumCents(packages.map((pkg) => pkg.healthAndSafetyCostUsd));
  return {
    homes: homes.length,
    measures: homes.reduce((count, home) => count + packaged(home.report).length, 0),
    costUsd,
    healthAndSafetyCostUsd,
    costWithoutHealthAndSafetyUsd: new Decimal(costUsd).minus(healthAndSafetyCostUsd).toNumber(),
    annualSavingsUsd: sumCents(packages.map((pkg) => pkg.annualSavingsUsd)),
    pvSavingsUsd: sumCents(packages.map((pkg) => pkg.pvSavingsUsd)),
    npvUsd: sumCents(packages.map((pkg) => pkg.npvUsd)),
    mmbtu: packages.reduce((total, pkg) => total + pkg.annualSavings.mmbtu, 0),
    co2Kg: packages.reduce((total, pkg) => total + pkg.annualSavings.co2Kg, 0),
    coolingKwh: packages.reduce((total, pkg) => total + pkg.annualSavings.coolingKwh, 0),
    heatingByFuel: [...byFuel.entries()]
      .map(([fuel, entry]) => ({ fuel, ...entry }))
      .sort((a, b) => a.fuel.localeCompare(b.fuel)),
    cfm50Before: packages.reduce((total, pkg) => total + pkg.cfm50Before, 0),
    cfm50After: packages.reduce((total, pkg) => total + pkg.cfm50After, 0),
  };
}

function byTypeOf(homes: readonly PortfolioHome[]): MeasureTypeFigures[] {
  const types = new Map<string, { name: string; measures: MeasureReport[]; homes: Set<number> }>();
  for (const home of homes) {
    for (const measure of packaged(home.report)) {
      const entry = types.get(measure.type) ?? {
        name: measure.name,
        measures: [],
        homes: new Set<number>(),
      };
      entry.measures.push(measure);
      entry.homes.add(home.homeId);
      types.set(measure.type, entry);
    }
  }
  return [...types.entries()]
    .map(([type, entry]) => {
      const costUsd = sumCents(entry.measures.map((measure) => measure.costUsd));
      const cfm50Removed = entry.measures.reduce((sum, measure) => sum + measure.cfm50Reduction, 0);
      const energy = entry.measures.filter((measure) => measure.sir !== null);
      return {
        type,
        name: entry.name,
        measures: entry.measures.length,
        homes: entry.homes.size,
        costUsd,
        cfm50Removed,
        usdPerCfm50Removed: cfm50Removed > 0 ? costUsd / cfm50Removed : null,
        annualSavingsUsd: sumCents(entry.measures.map((measure) => measure.annualSavings.usd)),
        mmbtu: entry.measures.reduce((sum, measure) => sum + measure.annualSavings.mmbtu, 0),
        shareSirAtLeastOne:
          energy.length === 0
            ? null
            : energy.filter((measure) => (measure.sir ?? 0) >= 1).length / energy.length,
      };
    })
    .sort((a, b) => a.type.localeCompare(b.type));
}

/** Every packaged energy measure with a cost of saved energy, cheapest first, summed up. */
function supplyCurveOf(homes: readonly PortfolioHome[]): SupplyStep[] {
  const steps = homes.flatMap((home) =>
    packaged(home.report)
      .filter(
        (measure) =>
          !measure.healthAndSafety &&
          measure.cceUsdPerMMBtu !== null &&
          measure.annualSavings.mmbtu > 0,
      )
      .map((measure) => ({
        homeId: home.homeId,
        measureId: measure.id,
        type: measure.type,
        cceUsdPerMMBtu: measure.cceUsdPerMMBtu ?? 0,
        mmbtu: measure.annualSavings.mmbtu,
      })),
  );
  steps.sort(
    (a, b) =>
      a.cceUsdPerMMBtu - b.cceUsdPerMMBtu ||
      a.homeId - b.homeId ||
      a.measureId.localeCompare(b.measureId),
  );
  let cumulative = 0;
  return steps.map((step) => {
    cumulative += step.mmbtu;
    return { ...step, cumulativeMmbtu: cumulative };
  });
}

/** A home's line of the portfolio. */
export function portfolioRowOf(home: PortfolioHome): PortfolioRow {
  const pkg = home.report.package;
  const ach = (cfm50: number) => (cfm50 * 60) / home.volumeFt3;
  return {
    homeId: home.homeId,
    name: home.name,
    heatingFuel: home.heatingFuel,
    measures: pkg.measureIds.length,
    costUsd: pkg.costUsd,
    healthAndSafetyCostUsd: pkg.healthAndSafetyCostUsd,
    annualSavingsUsd: pkg.annualSavingsUsd,
    npvUsd: pkg.npvUsd,
    sir: pkg.sir,
    mmbtu: pkg.annualSavings.mmbtu,
    co2Kg: pkg.annualSavings.co2Kg,
    cfm50Before: pkg.cfm50Before,
    cfm50After: pkg.cfm50After,
    ach50Before: ach(pkg.cfm50Before),
    ach50After: ach(pkg.cfm50After),
  };
}

/** Histograms of two sets of values over one set of bins (those of both together). */
function sharedHistograms(
  first: readonly number[],
  second: readonly number[],
): [Histogram, Histogram] {
  const shared = histogramOf(Float64Array.from([...first, ...second]), LEAKAGE_HISTOGRAM_BINS);
  const binned = (values: readonly number[]): Histogram => {
    const counts = new Array<number>(Math.max(0, shared.edges.length - 1)).fill(0);
    const low = shared.edges[0] ?? 0;
    const high = shared.edges[shared.edges.length - 1] ?? low;
    const width = counts.length > 0 ? (high - low) / counts.length : 0;
    for (const value of values) {
      const bin = width > 0 ? Math.min(counts.length - 1, Math.floor((value - low) / width)) : 0;
      if (counts.length > 0) counts[bin] = (counts[bin] ?? 0) + 1;
    }
    return { edges: shared.edges, counts };
  };
  return [binned(first), binned(second)];
}

/**
 * The figures of a portfolio.
 *
 * @param homes - each home's report with its heating fuel and volume
 * @returns totals (sums of the homes' own packages), spreads, figures by measure type and the
 *   conservation supply curve
 * @throws InputError naming the home whose facts are missing
 */
export function portfolioFigures(homes: readonly PortfolioHome[]): PortfolioFigures {
  requireHomes(homes);
  const withEnergy = homes.filter((home) => home.report.package.sir !== null);
  const energyMeasures = homes.flatMap((home) =>
    packaged(home.report).filter((measure) => measure.sir !== null),
  );
  const ach = (cfm50: number, volumeFt3: number) => (cfm50 * 60) / volumeFt3;
  const ach50Before = homes.map((home) => ach(home.report.package.cfm50Before, home.volumeFt3));
  const ach50After = homes.map((home) => ach(home.report.package.cfm50After, home.volumeFt3));
  const cfm50Before = homes.map((home) => home.report.package.cfm50Before);
  const cfm50After = homes.map((home) => home.report.package.cfm50After);
  const [achBeforeBins, achAfterBins] = sharedHistograms(ach50Before, ach50After);
  const [cfmBeforeBins, cfmAfterBins] = sharedHistograms(cfm50Before, cfm50After);
  return {
    totals: totalsOf(homes),
    packageSir: spreadOfValues(withEnergy.map((home) => home.report.package.sir ?? 0)),
    shareHomesSirAtLeastOne:
      withEnergy.length === 0
        ? null
        : withEnergy.filter((home) => (home.report.package.sir ?? 0) >= 1).length /
          withEnergy.length,
    shareMeasuresSirAtLeastOne:
      energyMeasures.length === 0
        ? null
        : energyMeasures.filter((measure) => (measure.sir ?? 0) >= 1).length /
          energyMeasures.length,
    leakage: {
      cfm50Before: spreadOfValues(cfm50Before),
      cfm50After: spreadOfValues(cfm50After),
      ach50Before: spreadOfValues(ach50Before),
      ach50After: spreadOfValues(ach50After),
      histograms: {
        ach50Before: achBeforeBins,
        ach50After: achAfterBins,
        cfm50Before: cfmBeforeBins,
        cfm50After: cfmAfterBins,
      },
    },
    byType: byTypeOf(homes),
    supplyCurve: supplyCurveOf(homes),
  };
}
