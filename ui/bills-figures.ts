/**
 * The figures of a home's billing analysis as the Bills panel shows them: each fit's rows
 * (before and after the work), in the shown units, and the warnings in plain words. Pure,
 * so the screens' rules can be tested without a page.
 */
import type { ChannelResponse } from '../electron/channels.ts';
import { formatNumber } from '../core/format.ts';
import type { UnitSystem } from './quantities.ts';

export type BillsAnalysis = ChannelResponse<'bills.analyse'>;
type Fit = BillsAnalysis['pre'];

/** One row of the fits' table: what it is, and its value before and after the work. */
export interface FitRow {
  key: string;
  label: string;
  before: string;
  after: string;
}

/** °F in one K (or °C) of difference: 9/5, exact (NIST SP 811). */
const FAHRENHEIT_PER_KELVIN = 1.8;

/** A temperature (°F) in the shown system: °F or °C. */
export function temperatureText(valueF: number, units: UnitSystem): string {
  return units === 'IP'
    ? `${formatNumber(valueF, 1)} °F`
    : `${formatNumber((valueF - 32) / FAHRENHEIT_PER_KELVIN, 1)} °C`;
}

/** Use per degree day (per °F·day stored) in the shown system: per °F·day or per K·day. */
export function slopeText(usePerDegreeDayF: number, unit: string, units: UnitSystem): string {
  return units === 'IP'
    ? `${formatNumber(usePerDegreeDayF, 4)} ${unit} per °F·day`
    : `${formatNumber(usePerDegreeDayF * FAHRENHEIT_PER_KELVIN, 4)} ${unit} per K·day`;
}

/** A share as a percentage: 0.0312 → "3.1 %". */
export function percentText(share: number | null, decimals = 1): string {
  return share === null ? '—' : `${formatNumber(share * 100, decimals)} %`;
}

/**
 * The rows of the fits' table.
 *
 * @param pre - the fit of the bills before the work
 * @param post - the fit of the bills after it
 * @param units - the shown system
 */
export function fitRows(pre: Fit, post: Fit, units: UnitSystem): FitRow[] {
  const unit = pre.unit;
  const rows: { key: string; label: string; of: (fit: Fit) => string }[] = [
    {
      key: 'bills',
      label: 'Bills fitted',
      of: (fit) => `${fit.billCount} (${formatNumber(fit.dayCount)} days)`,
    },
    { key: 'base', label: 'Base temperature', of: (fit) => temperatureText(fit.baseTempF, units) },
    {
      key: 'base-load',
      label: 'Base load',
      of: (fit) => `${formatNumber(fit.baseLoadPerDay, 3)} ${unit} a day`,
    },
    {
      key: 'slope',
      label: 'Use per degree day',
      of: (fit) => slopeText(fit.usePerDegreeDay, unit, units),
    },
    {
      key: 'nac',
      label: 'Normalized annual use',
      of: (fit) => `${formatNumber(fit.normalizedAnnualUse, 1)} ${unit} a year`,
    },
    {
      key: 'r2',
      label: 'R²',
      of: (fit) => (fit.rSquared === null ? '—' : formatNumber(fit.rSquared, 3)),
    },
    { key: 'cv', label: 'CV(RMSE)', of: (fit) => percentText(fit.cvRmse) },
    { key: 'nmbe', label: 'NMBE', of: (fit) => percentText(fit.nmbe) },
  ];
  return rows.map((row) => ({
    key: row.key,
    label: row.label,
    before: row.of(pre),
    after: row.of(post),
  }));
}

const WARNING_FROM: Readonly<Record<string, string>> = {
  pre: 'Bills before the work',
  post: 'Bills after the work',
  savings: 'Savings',
};

/** The warnings of both fits and of the savings, each as one sentence saying where it comes from. */
export function warningLines(analysis: BillsAnalysis): string[] {
  return analysis.savings.warnings.map(
    (warning) => `${WARNING_FROM[warning.from] ?? warning.from}: ${warning.message}.`,
  );
}

/** The measured savings beside the plan's estimate, in words. */
export function savingsWords(analysis: BillsAnalysis): {
  measured: string;
  estimated: string;
  realization: string;
} {
  const { savings, estimate } = analysis;
  const unit = savings.unit;
  return {
    measured: `${formatNumber(savings.savingsPerYear, 1)} ${unit} a year (${percentText(savings.savingsShare)} of the use before)`,
    estimated:
      estimate.perYear === null
        ? `none: ${estimate.words}`
        : `${formatNumber(estimate.perYear, 1)} ${unit} a year`,
    realization: savings.realizationRate === null ? '—' : percentText(savings.realizationRate, 0),
  };
}
