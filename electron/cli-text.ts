/**
 * The command line's text: the Homes list, the portfolio summary and a CSV dry run, in
 * aligned columns with numbers formatted for people.
 */
import { formatNumber, formatUsd } from '../core/format.ts';
import type { CsvImportPlan } from '../db/csv-import.ts';
import type { HomeSummary } from '../db/repositories/homes.ts';
import type { PortfolioSummary } from '../db/portfolio.ts';
import { textTable } from './plan-text.ts';

/** The stored homes as a table. */
export function homesText(homes: readonly HomeSummary[]): string {
  const rows = homes.map((home) => [
    String(home.id),
    home.name,
    home.town ?? '',
    home.clientName ?? '',
    home.heatingFuel ?? '',
    String(home.measureCount),
    home.isDemo ? 'demo' : '',
  ]);
  return textTable(
    [
      { title: 'Id', align: 'right' },
      { title: 'Home', align: 'left' },
      { title: 'Town', align: 'left' },
      { title: 'Client', align: 'left' },
      { title: 'Fuel', align: 'left' },
      { title: 'Measures', align: 'right' },
      { title: '', align: 'left' },
    ],
    rows,
  );
}

function countTable(title: string, rows: { label: string; homes: number }[]): string {
  return textTable(
    [
      { title, align: 'left' },
      { title: 'Homes', align: 'right' },
    ],
    rows.map(({ label, homes }) => [label, formatNumber(homes)]),
  );
}

/** The portfolio summary as text. */
export function portfolioText(summary: PortfolioSummary): string {
  const { leakage, measures } = summary;
  const parts = [
    `Portfolio: ${formatNumber(summary.homes)} homes (${formatNumber(summary.demoHomes)} demo, ` +
      `${formatNumber(summary.incompleteHomes)} not ready to plan)`,
  ];
  const left = leakage.leftOut;
  const spread = leakage.ach50;
  parts.push(
    [
      `Test-in leakage of ${formatNumber(leakage.homesCounted)} homes ` +
        `(${formatNumber(leakage.fittedMultipoint)} fitted from several readings): ` +
        `CFM50 total ${formatNumber(leakage.cfm50Total)}`,
      spread
        ? `  ACH50  min ${formatNumber(spread.min, 1)}  P10 ${formatNumber(spread.p10, 1)}  ` +
          `median ${formatNumber(spread.median, 1)}  P90 ${formatNumber(spread.p90, 1)}  ` +
          `max ${formatNumber(spread.max, 1)}  mean ${formatNumber(spread.mean, 1)}`
        : '  ACH50  no tested homes',
      `  Left out: ${left.noTestIn} without a test-in, ${left.noVolume} without a volume, ` +
        `${left.readingsUnfit} whose readings could not be fitted`,
    ].join('\n'),
  );
  const label = (value: string | number | null) => (value === null ? '(none)' : String(value));
  parts.push(
    countTable(
      'Heating fuel',
      summary.byFuel.map((row) => ({ ...row, label: label(row.fuel) })),
    ),
  );
  parts.push(
    countTable(
      'Town',
      summary.byTown.map((row) => ({ ...row, label: label(row.town) })),
    ),
  );
  parts.push(
    countTable(
      'Built',
      summary.byDecade.map((row) => ({
        ...row,
        label: row.decade === null ? '(none)' : `${row.decade}s`,
      })),
    ),
  );
  parts.push(
    countTable(
      'Job',
      summary.byJobStatus.map((row) => ({ ...row, label: row.status })),
    ),
  );
  const statuses = measures.byStatus
    .map((row) => `${row.status} ${formatNumber(row.count)} (${formatUsd(row.costUsd)})`)
    .join(', ');
  parts.push(
    `Measures: ${formatNumber(measures.count)} (${formatUsd(measures.costUsd)})${statuses ? `: ${statuses}` : ''}`,
  );
  if (measures.byType.length > 0) {
    parts.push(
      textTable(
        [
          { title: 'Measure type', align: 'left' },
          { title: 'Count', align: 'right' },
          { title: 'Planned', align: 'right' },
          { title: 'Planned cost', align: 'right' },
        ],
        measures.byType.map((row) => [
          row.type,
          formatNumber(row.count),
          formatNumber(row.plannedCount),
          formatUsd(row.plannedCostUsd, { cents: true }),
        ]),
      ),
    );
  }
  return parts.join('\n\n');
}

/** The homes a portfolio CSV would store, as a table, and their count. */
export function dryRunText(plan: CsvImportPlan): string {
  const rows = plan.homes.map(({ line, file, climateId, priceSetId }) => [
    String(line),
    file.name,
    file.address?.town ?? '',
    file.heating.fuel,
    file.leakageTest.points
      ? `${file.leakageTest.points.length} readings`
      : formatNumber(file.leakageTest.cfm50 ?? 0),
    climateId === null ? file.climate.name : `${file.climate.name} (stored)`,
    priceSetId === null ? 'own' : 'stored set',
  ]);
  const titles = ['Line', 'Home', 'Town', 'Fuel', 'CFM50', 'Climate', 'Prices'];
  const columns = titles.map((title, index) => ({
    title,
    align: index === 0 || index === 4 ? ('right' as const) : ('left' as const),
  }));
  return `${textTable(columns, rows)}\n${plan.homes.length} homes would be imported (dry run: nothing was written).`;
}
