/**
 * The plan as text for a terminal: the house's leakage, the ranked measures, the package and
 * the cautions, in aligned columns.
 */
import { formatNumber, formatRatio, formatUsd, formatYears } from '../core/format.ts';
import type { EvaluationWithChoices } from '../core/choices.ts';

interface Column {
  title: string;
  align: 'left' | 'right';
}

/** Lays out rows under titles, each column as wide as its widest cell. */
export function textTable(columns: readonly Column[], rows: readonly string[][]): string {
  const widths = columns.map((column, index) =>
    Math.max(column.title.length, ...rows.map((row) => (row[index] ?? '').length)),
  );
  const line = (cells: readonly string[]) =>
    columns
      .map((column, index) => {
        const cell = cells[index] ?? '';
        const width = widths[index] ?? 0;
        return column.align === 'right' ? cell.padStart(width) : cell.padEnd(width);
      })
      .join('  ')
      .trimEnd();
  const rule = widths.map((width) => '─'.repeat(width)).join('  ');
  return [line(columns.map((column) => column.title)), rule, ...rows.map(line)].join('\n');
}

/** "P10 a · P50 b · P90 c" of a spread, each formatted. */
function percentiles(
  spread: { p10: number; p50: number; p90: number },
  format: (value: number) => string,
): string {
  return `P10 ${format(spread.p10)} · P50 ${format(spread.p50)} · P90 ${format(spread.p90)}`;
}

/** The range of outcomes and the best package within a budget, when asked for. */
function choicesLines(report: EvaluationWithChoices): string[] {
  const lines: string[] = [];
  const run = report.uncertainty;
  if (run) {
    const usd = (value: number) => formatUsd(value);
    lines.push(
      `Range       ${formatNumber(run.draws)} draws (${run.distribution === 'pert' ? 'PERT' : 'triangular'}, seed ${run.seed}) over the estimates' ranges`,
      `            CFM50 after ${percentiles(run.cfm50After, (value) => formatNumber(value))}`,
      `            saves/yr    ${percentiles(run.annualSavingsUsd, usd)}`,
      `            NPV         ${percentiles(run.npvUsd, usd)}`,
    );
    if (run.chanceSirAtLeastOne !== null) {
      lines.push(
        `            chance the package SIR is at least 1: ${formatNumber(run.chanceSirAtLeastOne * 100, 0)} %`,
      );
    }
  }
  const best = report.bestPackage;
  if (best) {
    const budget =
      best.budgetUsd === null ? 'no limit' : formatUsd(best.budgetUsd, { cents: true });
    lines.push(
      `Best        by ${best.objective === 'npv' ? 'NPV' : best.objective === 'sir' ? 'SIR' : 'savings a year'} ` +
        `within ${budget} of energy work: ` +
        (best.measureIds.length === 0 ? 'no measure fits' : best.measureIds.join(', ')),
      `            costs ${formatUsd(best.costUsd, { cents: true })} (energy ${formatUsd(best.energyCostUsd, { cents: true })}); ` +
        `saves ${formatUsd(best.annualSavingsUsd)}/yr; NPV ${formatUsd(best.npvUsd, { cents: true })}; ` +
        `SIR ${formatRatio(best.sir)}`,
    );
  }
  return lines;
}

/** Width the plan's prose is wrapped to, in characters. */
const TEXT_WIDTH = 100;

/** Wraps prose at word boundaries: the first line after `lead`, the rest under it. */
export function wrapText(text: string, lead: string, width = TEXT_WIDTH): string {
  const indent = ' '.repeat(lead.length);
  const lines: string[] = [];
  let line = lead;
  for (const word of text.split(/\s+/).filter((w) => w !== '')) {
    const fresh = line === lead || line === indent;
    if (!fresh && line.length + 1 + word.length > width) {
      lines.push(line);
      line = indent + word;
    } else {
      line += (fresh ? '' : ' ') + word;
    }
  }
  lines.push(line);
  return lines.join('\n');
}

const SEVERITY_WORDS: Record<string, string> = {
  danger: 'DANGER ',
  warning: 'WARNING',
  notice: 'NOTICE ',
};

/** Where the year's loads come from, in one line. */
export function climateSourceText(source: EvaluationWithChoices['climateSource']): string {
  const days = `${formatNumber(source.heatingDegreeDaysF)} HDD, ${formatNumber(source.coolingDegreeDaysF)} CDD`;
  if (source.kind === 'hourly') {
    return (
      `hour by hour: ${formatNumber(source.hours ?? 0)} hours of ${source.name} ` +
      `(${days} at balance points ${source.heatingBalancePointF} / ${source.coolingBalancePointF} °F)`
    );
  }
  return `degree days of ${source.name} (${days}, base 65 °F)`;
}

/** The whole plan of one home as text. */
export function planText(report: EvaluationWithChoices): string {
  const { leakage, infiltration, package: pkg } = report;
  const unit = pkg.annualSavings.heatingFuelUnit;
  const lines: string[] = [];
  lines.push(report.name);
  lines.push('');
  lines.push(
    `Leak test   ${formatNumber(leakage.cfm50)} CFM50   ${formatNumber(leakage.ach50, 1)} ACH50   ` +
      `ELA ${formatNumber(leakage.elaIn2, 0)} in²   n ${formatNumber(leakage.exponentN, 2)}` +
      (leakage.rSquared === null ? '' : `   R² ${formatNumber(leakage.rSquared, 3)}`),
  );
  lines.push(
    `Natural     ${formatNumber(infiltration.cfmNatural, 0)} cfm   ${formatNumber(infiltration.achNatural, 2)} ACHnat ` +
      `(${infiltration.method}, heating season)`,
  );
  lines.push(`Climate     ${climateSourceText(report.climateSource)}`);
  for (const warning of leakage.warnings) lines.push(wrapText(warning.message, '  ! '));
  lines.push('');

  const rows = report.measures.map((measure) => [
    measure.included ? String(measure.rank) : '–',
    measure.id,
    measure.name,
    formatNumber(measure.cfm50Reduction),
    formatUsd(measure.annualSavings.usd),
    formatUsd(measure.costUsd),
    formatUsd(measure.npvUsd),
    measure.healthAndSafety ? 'H&S' : formatRatio(measure.sir) + (measure.sirBelowOne ? ' <1' : ''),
    formatYears(measure.simplePaybackYears),
  ]);
  lines.push(
    textTable(
      [
        { title: '#', align: 'right' },
        { title: 'Measure', align: 'left' },
        { title: 'Type', align: 'left' },
        { title: 'CFM50 cut', align: 'right' },
        { title: 'Saves/yr', align: 'right' },
        { title: 'Cost', align: 'right' },
        { title: 'NPV', align: 'right' },
        { title: 'SIR', align: 'right' },
        { title: 'Payback', align: 'right' },
      ],
      rows,
    ),
  );
  lines.push('');
  lines.push(
    `Ranked by ${report.ranking}; measures marked – are left out of the package (SIR below 1 or declined).`,
  );
  lines.push('');
  lines.push(
    `Package     ${formatNumber(pkg.cfm50Before)} → ${formatNumber(pkg.cfm50After)} CFM50 ` +
      `(${formatNumber(pkg.ach50After, 1)} ACH50 after)`,
  );
  lines.push(
    `            saves ${formatUsd(pkg.annualSavingsUsd)}/yr (range ${formatUsd(pkg.annualSavingsUsdRange.low)}–` +
      `${formatUsd(pkg.annualSavingsUsdRange.high)}), ${formatNumber(pkg.annualSavings.heatingFuelUnits, 1)} ${unit}` +
      (pkg.annualSavings.coolingKwh === 0
        ? ''
        : `, ${formatNumber(pkg.annualSavings.coolingKwh, 0)} kWh cooling`) +
      `, ${formatNumber(pkg.annualSavings.co2Kg, 0)} kg CO2`,
  );
  lines.push(
    `            costs ${formatUsd(pkg.costUsd, { cents: true })}; NPV ${formatUsd(pkg.npvUsd, { cents: true })}; ` +
      `SIR ${formatRatio(pkg.sir)}; payback ${formatYears(pkg.simplePaybackYears)}`,
  );
  const vent = pkg.ventilation;
  lines.push(
    `Ventilation 62.2 needs ${formatNumber(vent.requiredCfm)} cfm; infiltration credit ${formatNumber(vent.infiltrationCfm)} cfm; ` +
      `fan need ${formatNumber(vent.fanCfm)} cfm` +
      (vent.fanAdded
        ? `: the package adds a ${formatNumber(vent.addedFanCfm)} cfm fan (${formatUsd(vent.fanCostUsd)}, ${formatUsd(vent.fanAnnualCostUsd)}/yr to run)`
        : ''),
  );
  if (pkg.financing) {
    const loan = pkg.financing;
    lines.push(
      `Financing   ${formatUsd(loan.monthlyPaymentUsd, { cents: true })}/month for ${loan.months} months against ` +
        `${formatUsd(loan.monthlySavingsUsd, { cents: true })}/month saved`,
      `            first year ${formatUsd(loan.firstYearNetUsd, { cents: true })} after payments; ` +
        `${formatUsd(loan.totalPaidUsd, { cents: true })} paid in all; ` +
        `${formatUsd(loan.lifetimeNetUsd, { cents: true })} ahead over the measures' lives`,
    );
  }
  lines.push(...choicesLines(report));
  if (report.cautions.length > 0) {
    lines.push('');
    lines.push('Safety');
    for (const caution of report.cautions) {
      const lead = `  ${SEVERITY_WORDS[caution.severity] ?? caution.severity}  `;
      lines.push(wrapText(caution.message, lead));
    }
  }
  if (report.notes.length > 0) {
    lines.push('');
    lines.push('Assumptions');
    for (const note of report.notes) lines.push(wrapText(note, '  · '));
  }
  return lines.join('\n');
}
