/**
 * The Proposal's money figures, read from the evaluation report: the options a family can
 * choose from (the ranked plan's real cumulative steps), and the package's cost split into
 * health-and-safety work and energy work. Money is summed in whole cents, as the report gives
 * it, so a total is the exact sum of its parts; the full package's figures are the report's own.
 */
import type { EvaluationReport, MeasureReport } from '../core/report.ts';

type PackageReport = EvaluationReport['package'];

/** One choice for the family: the plan's measures up to one step, done in the plan's order. */
export interface ProposalOption {
  key: string;
  title: string;
  /** The measures this option adds to the one before it. */
  added: readonly MeasureReport[];
  /** Every measure this option includes, in the plan's order. */
  measures: readonly MeasureReport[];
  costUsd: number;
  annualSavingsUsd: number;
  /** First year's savings, carried through each measure's life in today's dollars. */
  pvSavingsUsd: number;
  npvUsd: number;
  /** Present value of the energy measures' savings ÷ their cost; null when there is no energy work. */
  sir: number | null;
  simplePaybackYears: number | null;
  isFullPackage: boolean;
  /** Whether the option carries the ventilation fan the full package calls for. */
  includesFan: boolean;
}

/** One line of the health-and-safety work. */
export interface SafetyWorkItem {
  key: string;
  name: string;
  costUsd: number;
}

function cents(amountUsd: number): number {
  return Math.round(amountUsd * 100);
}

function dollars(amountCents: number): number {
  return amountCents / 100;
}

/** The measures of the package in the order the plan applies them. */
export function packageMeasures(report: EvaluationReport): MeasureReport[] {
  return report.measures.filter((measure) => measure.included).sort((a, b) => a.rank - b.rank);
}

/** Sums of a run of measures, in cents, with the energy measures' part for the SIR. */
function totalsOf(measures: readonly MeasureReport[]) {
  let costCents = 0;
  let savingsCents = 0;
  let pvCents = 0;
  let energyCostCents = 0;
  let energyPvCents = 0;
  for (const measure of measures) {
    costCents += cents(measure.costUsd);
    savingsCents += cents(measure.annualSavings.usd);
    pvCents += cents(measure.pvSavingsUsd);
    if (!measure.healthAndSafety) {
      energyCostCents += cents(measure.costUsd);
      energyPvCents += cents(measure.pvSavingsUsd);
    }
  }
  return { costCents, savingsCents, pvCents, energyCostCents, energyPvCents };
}

/** The package as an option: every figure as the report gives it. */
function fullPackageOption(
  pkg: PackageReport,
  measures: readonly MeasureReport[],
  added: readonly MeasureReport[],
  index: number,
): ProposalOption {
  return {
    key: 'full-package',
    title: index === 0 ? 'The package' : `Option ${index + 1}`,
    added,
    measures,
    costUsd: pkg.costUsd,
    annualSavingsUsd: pkg.annualSavingsUsd,
    pvSavingsUsd: pkg.pvSavingsUsd,
    npvUsd: pkg.npvUsd,
    sir: pkg.sir,
    simplePaybackYears: pkg.simplePaybackYears,
    isFullPackage: true,
    includesFan: pkg.ventilation.fanAdded,
  };
}

/**
 * The options: the plan's health-and-safety measures (which it always puts first) with the
 * first energy measure, then with the first two, and so on to the full package, whose cost
 * also holds the ventilation fan it calls for. A package of health-and-safety work alone is
 * one option; an empty package has none.
 *
 * @param report - the home's evaluation
 * @returns the options, smallest first, the last being the recommended package
 */
export function proposalOptions(report: EvaluationReport): ProposalOption[] {
  const measures = packageMeasures(report);
  if (measures.length === 0) return [];
  const firstEnergy = measures.findIndex((measure) => !measure.healthAndSafety);
  // The steps that end on an energy measure; with no energy measure, the whole package.
  const ends =
    firstEnergy === -1
      ? [measures.length]
      : measures.flatMap((measure, index) =>
          index >= firstEnergy && !measure.healthAndSafety ? [index + 1] : [],
        );
  const lastEnd = ends.at(-1) ?? measures.length;
  if (lastEnd < measures.length) ends[ends.length - 1] = measures.length;

  return ends.map((end, index) => {
    const included = measures.slice(0, end);
    const added = measures.slice(index === 0 ? 0 : (ends[index - 1] ?? 0), end);
    if (index === ends.length - 1) return fullPackageOption(report.package, included, added, index);
    const totals = totalsOf(included);
    return {
      key: `option-${index + 1}`,
      title: `Option ${index + 1}`,
      added,
      measures: included,
      costUsd: dollars(totals.costCents),
      annualSavingsUsd: dollars(totals.savingsCents),
      pvSavingsUsd: dollars(totals.pvCents),
      npvUsd: dollars(totals.pvCents - totals.costCents),
      sir: totals.energyCostCents > 0 ? totals.energyPvCents / totals.energyCostCents : null,
      simplePaybackYears: totals.savingsCents > 0 ? totals.costCents / totals.savingsCents : null,
      isFullPackage: false,
      includesFan: false,
    };
  });
}

/**
 * The package's health-and-safety work: its measures so marked, and the ventilation fan
 * when the tighter house needs one. Their total is the report's health-and-safety cost.
 */
export function safetyWorkItems(report: EvaluationReport): SafetyWorkItem[] {
  const items: SafetyWorkItem[] = packageMeasures(report)
    .filter((measure) => measure.healthAndSafety)
    .map((measure) => ({ key: measure.id, name: measure.name, costUsd: measure.costUsd }));
  const vent = report.package.ventilation;
  if (vent.fanAdded) {
    items.push({
      key: 'ventilation-fan',
      name: 'Fresh-air ventilation fan',
      costUsd: vent.fanCostUsd,
    });
  }
  return items;
}

/** The package's cost less its health-and-safety work, to the cent. */
export function energyWorkCostUsd(pkg: PackageReport): number {
  return dollars(cents(pkg.costUsd) - cents(pkg.healthAndSafetyCostUsd));
}
