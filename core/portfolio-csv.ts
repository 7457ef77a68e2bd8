/**
 * A portfolio's tables as CSV files (RFC 4180: comma-separated, a header row, fields with a
 * comma, quote or line break quoted and their quotes doubled, CRLF line ends), for a
 * spreadsheet: each home's package, the figures by measure type, and the test-out results.
 */
import type { PortfolioFigures, PortfolioRow } from './portfolio.ts';
import type { TestOutResult } from './test-out.ts';

/** What the files are made from: the portfolio's rows, figures and test-out results. */
export interface PortfolioTables {
  rows: readonly PortfolioRow[];
  figures: Pick<PortfolioFigures, 'byType'>;
  testOut: { results: readonly TestOutResult[] };
}

type PortfolioReply = PortfolioTables;

type Cell = string | number | boolean | null;

/** One field, quoted when it must be. */
export function csvField(value: Cell): string {
  if (value === null) return '';
  const text =
    typeof value === 'number' ? (Number.isFinite(value) ? String(value) : '') : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A whole file: the header, then one line a row. */
export function csvText(header: readonly string[], rows: readonly (readonly Cell[])[]): string {
  return [header, ...rows].map((row) => row.map(csvField).join(',')).join('\r\n') + '\r\n';
}

const round = (value: number, places: number) => Math.round(value * 10 ** places) / 10 ** places;

/** Each home's package, a line each. */
export function homesCsv(portfolio: PortfolioReply): string {
  return csvText(
    [
      'homeId',
      'name',
      'heatingFuel',
      'measures',
      'costUsd',
      'healthAndSafetyCostUsd',
      'annualSavingsUsd',
      'npvUsd',
      'sir',
      'mmbtu',
      'co2Kg',
      'cfm50Before',
      'cfm50After',
      'ach50Before',
      'ach50After',
    ],
    portfolio.rows.map((row) => [
      row.homeId,
      row.name,
      row.heatingFuel,
      row.measures,
      row.costUsd,
      row.healthAndSafetyCostUsd,
      row.annualSavingsUsd,
      row.npvUsd,
      row.sir,
      round(row.mmbtu, 3),
      round(row.co2Kg, 1),
      round(row.cfm50Before, 1),
      round(row.cfm50After, 1),
      round(row.ach50Before, 2),
      round(row.ach50After, 2),
    ]),
  );
}

/** The figures by measure type. */
export function typesCsv(portfolio: PortfolioReply): string {
  return csvText(
    [
      'type',
      'name',
      'measures',
      'homes',
      'costUsd',
      'cfm50Removed',
      'usdPerCfm50Removed',
      'annualSavingsUsd',
      'mmbtu',
      'shareSirAtLeastOne',
    ],
    portfolio.figures.byType.map((type) => [
      type.type,
      type.name,
      type.measures,
      type.homes,
      type.costUsd,
      round(type.cfm50Removed, 1),
      type.usdPerCfm50Removed === null ? null : round(type.usdPerCfm50Removed, 4),
      type.annualSavingsUsd,
      round(type.mmbtu, 3),
      type.shareSirAtLeastOne === null ? null : round(type.shareSirAtLeastOne, 4),
    ]),
  );
}

/** Each test-out against its estimate. */
export function testOutCsv(portfolio: PortfolioReply): string {
  return csvText(
    [
      'homeId',
      'name',
      'testInCfm50',
      'testOutCfm50',
      'targetCfm50',
      'estimatedReductionCfm50',
      'measuredReductionCfm50',
      'realizationRate',
      'targetReachedFraction',
      'packageAssumed',
      'review',
    ],
    portfolio.testOut.results.map((result) => [
      result.homeId,
      result.name,
      round(result.testInCfm50, 1),
      round(result.testOutCfm50, 1),
      round(result.targetCfm50, 1),
      round(result.estimatedReductionCfm50, 1),
      round(result.measuredReductionCfm50, 1),
      result.realizationRate === null ? null : round(result.realizationRate, 4),
      result.targetReachedFraction === null ? null : round(result.targetReachedFraction, 4),
      result.packageAssumed,
      result.review.join(' '),
    ]),
  );
}
