/**
 * Plain JSON of the choices a plan offers: the range of outcomes of a package, the best
 * package within a budget and a proposal's options. Money goes to the cent (Decimal figures
 * rounded as the evaluation report rounds them; Monte Carlo percentiles, which are float64
 * statistics, rounded to the cent too); ratios to four places; CFM50 to a tenth.
 */
import type { Distribution } from './uncertainty/distributions.ts';
import { centsToNumber, type Decimal } from './money.ts';
import type { BestPackage, PackageObjective } from './plan/best-package.ts';
import type { ProposalTier, ProposalTierId, ProposalTierRange } from './plan/options.ts';
import type {
  FigureSpread,
  Histogram,
  PackageUncertainty,
  ResolvedVariations,
} from './uncertainty/monte-carlo.ts';

/** P10 / P50 / P90 and the mean of one figure, with the run it came from. */
export interface SpreadReport {
  draws: number;
  seed: number;
  p10: number;
  p50: number;
  p90: number;
  mean: number;
}

export interface UncertaintyReport {
  draws: number;
  seed: number;
  distribution: Distribution;
  vary: ResolvedVariations;
  /** The package's measures in the order applied. */
  measureIds: string[];
  cfm50After: SpreadReport;
  annualSavingsUsd: SpreadReport;
  npvUsd: SpreadReport;
  /** Null when the package has no energy measure with a cost. */
  sir: SpreadReport | null;
  chanceSirAtLeastOne: number | null;
  chanceFanAdded: number;
  histograms: { npvUsd: Histogram; annualSavingsUsd: Histogram };
}

export interface BestPackageReport {
  /** The energy measures' budget, USD; null for none. */
  budgetUsd: number | null;
  objective: PackageObjective;
  everyMeasureSirAtLeastOne: boolean;
  packageSirAtLeastOne: boolean;
  /** Every measure of the package in the order applied, health and safety first. */
  measureIds: string[];
  /** What the budget covers: the energy measures. */
  energyCostUsd: number;
  /** Health-and-safety measures and the ventilation fan, done whatever the budget. */
  healthAndSafetyCostUsd: number;
  costUsd: number;
  annualSavingsUsd: number;
  npvUsd: number;
  sir: number | null;
  simplePaybackYears: number | null;
  fanAdded: boolean;
  cfm50After: number;
  /** Packages the exact search valued, and whether proven bounds cut it. */
  packagesValued: number;
  boundsUsed: boolean;
}

export interface OptionReport {
  id: ProposalTierId;
  name: string;
  description: string;
  measureIds: string[];
  costUsd: number;
  healthAndSafetyCostUsd: number;
  annualSavingsUsd: number;
  simplePaybackYears: number | null;
  npvUsd: number;
  sir: number | null;
  fanAdded: boolean;
  /** Null when no draws were asked for. */
  range: ProposalTierRange | null;
}

function cents(amountUsd: number): number {
  const rounded = Math.round(amountUsd * 100) / 100;
  return rounded === 0 ? 0 : rounded;
}

function ratio(value: Decimal | number | null): number | null {
  if (value === null || (typeof value === 'number' && Number.isNaN(value))) return null;
  return typeof value === 'number'
    ? Math.round(value * 1e4) / 1e4
    : value.toDecimalPlaces(4).toNumber();
}

function spread(
  run: Pick<PackageUncertainty, 'draws' | 'seed'>,
  figure: FigureSpread,
  round: (value: number) => number,
): SpreadReport {
  return {
    draws: run.draws,
    seed: run.seed,
    p10: round(figure.p10),
    p50: round(figure.p50),
    p90: round(figure.p90),
    mean: round(figure.mean),
  };
}

const tenth = (value: number) => Math.round(value * 10) / 10;
const fourPlaces = (value: number) => Math.round(value * 1e4) / 1e4;

/** The JSON of a package's uncertainty. */
export function uncertaintyReport(run: PackageUncertainty): UncertaintyReport {
  return {
    draws: run.draws,
    seed: run.seed,
    distribution: run.distribution,
    vary: { ...run.vary },
    measureIds: [...run.measureIds],
    cfm50After: spread(run, run.cfm50After, tenth),
    annualSavingsUsd: spread(run, run.annualSavingsUsd, cents),
    npvUsd: spread(run, run.npvUsd, cents),
    sir: run.sir === null ? null : spread(run, run.sir, fourPlaces),
    chanceSirAtLeastOne:
      run.chanceSirAtLeastOne === null ? null : fourPlaces(run.chanceSirAtLeastOne),
    chanceFanAdded: fourPlaces(run.chanceFanAdded),
    histograms: run.histograms,
  };
}

/** The JSON of a best package. */
export function bestPackageReport(
  best: BestPackage,
  constraints: { everyMeasureSirAtLeastOne: boolean; packageSirAtLeastOne: boolean },
): BestPackageReport {
  return {
    budgetUsd: Number.isFinite(best.budgetUsd) ? best.budgetUsd : null,
    objective: best.objective,
    ...constraints,
    measureIds: [...best.measureIds],
    energyCostUsd: centsToNumber(best.budgetCostUsd),
    healthAndSafetyCostUsd: centsToNumber(best.healthAndSafetyCostUsd),
    costUsd: centsToNumber(best.costUsd),
    annualSavingsUsd: centsToNumber(best.annualSavingsUsd),
    npvUsd: centsToNumber(best.npvUsd),
    sir: ratio(best.sir),
    simplePaybackYears: ratio(best.simplePaybackYears),
    fanAdded: best.fanAdded,
    cfm50After: tenth(best.cfm50After),
    packagesValued: best.nodesVisited,
    boundsUsed: best.boundsUsed,
  };
}

function rangeReport(range: ProposalTierRange): ProposalTierRange {
  const money = ({ p10, p50, p90 }: { p10: number; p50: number; p90: number }) => ({
    p10: cents(p10),
    p50: cents(p50),
    p90: cents(p90),
  });
  return {
    annualSavingsUsd: money(range.annualSavingsUsd),
    npvUsd: money(range.npvUsd),
    chanceSirAtLeastOne: fourPlaces(range.chanceSirAtLeastOne),
  };
}

/** The JSON of a proposal's option. */
export function optionReport(tier: ProposalTier): OptionReport {
  return {
    id: tier.id,
    name: tier.name,
    description: tier.description,
    measureIds: [...tier.measureIds],
    costUsd: centsToNumber(tier.costUsd),
    healthAndSafetyCostUsd: centsToNumber(tier.healthAndSafetyCostUsd),
    annualSavingsUsd: centsToNumber(tier.annualSavingsUsd),
    simplePaybackYears: ratio(tier.simplePaybackYears),
    npvUsd: centsToNumber(tier.npvUsd),
    sir: ratio(tier.sir),
    fanAdded: tier.fanAdded,
    range: tier.range ? rangeReport(tier.range) : null,
  };
}
