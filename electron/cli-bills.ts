/**
 * `sealwork bills BILLS.csv --temperatures TEMPS.csv --work-done YYYY-MM-DD [--estimate N]
 * [--json]`: what a home's bills say the work saved. The bills ending on or before the day
 * the work was done are the "before" bills, those starting on or after it the "after" bills
 * (a bill spanning the day is left out); each set gets the degree-day fit of core/billing.ts
 * with its Guideline 14 statistics, both normalized to the normal year the temperature file
 * itself gives (each calendar day's mean over its years), and the savings are compared with
 * the estimate when one is given. Pure arithmetic on the files: no project is opened.
 */
import {
  csvProblemText,
  fitDegreeDays,
  measuredSavings,
  normalYearFromSeries,
  parseBillsCsv,
  parseTemperaturesCsv,
  type DegreeDayFit,
} from '../core/billing.ts';
import { InputError } from '../core/errors.ts';
import { formatNumber } from '../core/format.ts';
import { EXIT_OK, readTextFile, UsageError, type CliOutput, type Parsed } from './cli-commands.ts';

function fitLines(label: string, fit: DegreeDayFit): string[] {
  const percent = (share: number) => `${formatNumber(share * 100, 1)} %`;
  return [
    `${label.padEnd(12)}${fit.billCount} bills, ${fit.dayCount} days: base ${formatNumber(fit.baseTempF, 1)} °F; ` +
      `${formatNumber(fit.baseLoadPerDay, 3)} ${fit.unit}/day + ${formatNumber(fit.usePerDegreeDay, 4)} ${fit.unit}/degree day`,
    `            normal year ${formatNumber(fit.normalizedAnnualUse, 1)} ${fit.unit}; R² ${fit.rSquared === null ? '—' : formatNumber(fit.rSquared, 3)}; ` +
      `CV(RMSE) ${percent(fit.cvRmse)}; NMBE ${percent(fit.nmbe)}`,
  ];
}

/** Runs `bills`. */
export async function runBills(parsed: Parsed, output: CliOutput): Promise<number> {
  const [billsPath, ...extra] = parsed.positionals;
  const { temperatures: temperaturesPath, workDone, estimate } = parsed.bills;
  if (
    billsPath === undefined ||
    extra.length > 0 ||
    temperaturesPath === undefined ||
    workDone === undefined
  ) {
    throw new UsageError('bills takes BILLS.csv --temperatures TEMPS.csv --work-done YYYY-MM-DD');
  }
  if (!/^\d{4}-\d{2}-\d{2}$/.test(workDone)) {
    throw new UsageError(`--work-done expects a date as YYYY-MM-DD, got "${workDone}"`);
  }
  const estimatedSavingsPerYear = estimate === undefined ? 0 : Number(estimate);
  if (!Number.isFinite(estimatedSavingsPerYear)) {
    throw new UsageError(`--estimate expects a number of fuel units a year, got "${estimate}"`);
  }
  const bills = parseBillsCsv(await readTextFile(billsPath));
  const temperatures = parseTemperaturesCsv(await readTextFile(temperaturesPath));
  const problems = [
    ...(bills.ok
      ? []
      : bills.problems.map((problem) => `${billsPath}: ${csvProblemText(problem)}`)),
    ...(temperatures.ok
      ? []
      : temperatures.problems.map((problem) => `${temperaturesPath}: ${csvProblemText(problem)}`)),
  ];
  if (!bills.ok || !temperatures.ok) {
    throw new InputError(problems.map((message) => ({ path: '', message })));
  }
  const before = bills.bills.filter((bill) => bill.periodEnd <= workDone);
  const after = bills.bills.filter((bill) => bill.periodStart >= workDone);
  const shared = {
    temperatures: temperatures.temperatures,
    normalYear: normalYearFromSeries(temperatures.temperatures),
  };
  const pre = fitDegreeDays({ ...shared, bills: before });
  const post = fitDegreeDays({ ...shared, bills: after });
  const savings = measuredSavings({ pre, post, estimatedSavingsPerYear });
  if (parsed.json) {
    output.out(JSON.stringify({ before: pre, after: post, savings }, null, 2));
    return EXIT_OK;
  }
  const lines = [...fitLines('Before', pre), ...fitLines('After', post)];
  lines.push(
    `Saved       ${formatNumber(savings.savingsPerYear, 1)} ${savings.unit} a year` +
      (savings.savingsShare === null ? '' : ` (${formatNumber(savings.savingsShare * 100, 1)} %)`) +
      (savings.realizationRate === null
        ? ''
        : `; ${formatNumber(savings.realizationRate * 100, 0)} % of the ${formatNumber(estimatedSavingsPerYear, 1)} estimated`),
  );
  for (const warning of savings.warnings) lines.push(`  ! ${warning.from}: ${warning.message}`);
  output.out(lines.join('\n'));
  return EXIT_OK;
}
