/**
 * The working of `bills.analyse`: a home's bills split at the day the work was done, each
 * side fitted by the variable-base degree-day model (core/billing.ts), both normalized to one
 * typical year, and the measured savings set against the plan's estimate for that fuel.
 *
 * Daily means come from the home's own series (`stored`), or from the hourly weather year of
 * the home's stored climate (`weatherYear`): each billed date takes the mean of the same
 * month and day in that year (29 February the 28th's when the year has none). A typical year
 * stands in for the bills' real weather there, so its fits are rougher; the reply says which
 * source was used. The normal year is the weather year when the home's climate has one
 * (a typical year is what normals are for), else each calendar day's mean of the series.
 */
import {
  dayNumberOf,
  fitDegreeDays,
  isoDateOf,
  measuredSavings,
  normalYearFromSeries,
  type DailyTemperature,
  type DegreeDayFit,
  type DegreeDayKind,
  type MeasuredSavings,
  type NormalYear,
  type UtilityBill,
} from '../../core/billing.ts';
import { InputError } from '../../core/errors.ts';
import type { Evaluation } from '../../core/evaluate.ts';
import type { Fuel } from '../../core/schema.ts';
import { dailyMeanTemperatures, type DailyMean, type HourlyWeather } from '../../core/weather.ts';
import { listBills, listDailyTemperatures } from '../../db/repositories/bills.ts';
import { getHome } from '../../db/repositories/homes.ts';
import {
  weatherYearOfClimate,
  weatherYearSummaryOfClimate,
  type WeatherYearSummary,
} from '../../db/repositories/weather-years.ts';
import type { ReadAccess } from '../../db/store.ts';
import { evaluateStoredHome } from '../../db/evaluation-inputs.ts';

export type TemperatureSource = 'stored' | 'weatherYear';

export interface AnalysisRequest {
  homeId: number;
  workDone: string;
  fuel?: Fuel | undefined;
  kind?: DegreeDayKind | undefined;
  temperatures?: TemperatureSource | undefined;
}

/** The plan's estimate of the year's savings in the bills' fuel, or why there is none. */
export interface PlanEstimate {
  perYear: number | null;
  words: string;
}

export interface BillsAnalysis {
  fuel: Fuel;
  kind: DegreeDayKind;
  workDone: string;
  temperatureSource: TemperatureSource;
  /** Where the normal year came from: the climate's weather year or the daily series. */
  normalYearSource: 'weatherYear' | 'series';
  /** Bills left out because their period spans the day the work was done. */
  spanningBills: number;
  pre: DegreeDayFit;
  post: DegreeDayFit;
  savings: MeasuredSavings;
  estimate: PlanEstimate;
}

/** An InputError's problems moved under `at` (the fit of the bills before or after). */
function under<T>(at: string, work: () => T): T {
  try {
    return work();
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    throw new InputError(
      error.problems.map((problem) => ({
        path: problem.path === '' ? at : `${at}.${problem.path}`,
        message: problem.message,
      })),
    );
  }
}

/** The year's days as a 365-day normal year (29 February left out). */
function normalYearOfDays(days: readonly DailyMean[]): NormalYear {
  const common = days.filter((day) => !(day.month === 2 && day.day === 29));
  return { dailyMeanTempsF: common.map((day) => day.meanDryBulbF) };
}

/**
 * Daily means for every date from `firstDay` up to `endDay` (exclusive, UTC day numbers),
 * each the weather year's mean of that month and day.
 */
function datedFromWeatherYear(
  days: readonly DailyMean[],
  firstDay: number,
  endDay: number,
): DailyTemperature[] {
  const byMonthDay = new Map(days.map((day) => [`${day.month}-${day.day}`, day.meanDryBulbF]));
  const dated: DailyTemperature[] = [];
  for (let dayNumber = firstDay; dayNumber < endDay; dayNumber += 1) {
    const date = isoDateOf(dayNumber);
    const month = Number(date.slice(5, 7));
    const day = Number(date.slice(8, 10));
    const meanTempF = byMonthDay.get(`${month}-${day}`) ?? byMonthDay.get(`${month}-${day - 1}`);
    if (meanTempF === undefined) {
      throw InputError.at('temperatures', `the weather year has no day ${month}/${day}`);
    }
    dated.push({ date, meanTempF });
  }
  return dated;
}

function planEstimate(
  read: ReadAccess,
  homeId: number,
  fuel: Fuel,
  kind: DegreeDayKind,
): PlanEstimate {
  let evaluation: Evaluation;
  try {
    evaluation = evaluateStoredHome(read, homeId).evaluation;
  } catch (error) {
    // A draft home (no test-in yet, say) has no plan: the bills can still be fitted.
    if (!(error instanceof InputError)) throw error;
    return { perYear: null, words: 'the plan cannot be worked out yet, so there is no estimate.' };
  }
  const saved = evaluation.plan.package.annualSavings;
  if (kind === 'heating' && evaluation.home.heating.fuel === fuel) {
    return { perYear: saved.heatingFuelUnits, words: "the plan's package, heating" };
  }
  if (kind === 'cooling' && fuel === 'electricity') {
    return { perYear: saved.coolingKwh, words: "the plan's package, cooling" };
  }
  return {
    perYear: null,
    words: `the plan estimates no ${kind} savings in ${fuel} (the home heats with ${evaluation.home.heating.fuel}).`,
  };
}

/** The fuel to analyse: the one asked, else the fuel of most bills. */
function fuelOf(bills: readonly UtilityBill[], asked: Fuel | undefined): Fuel {
  if (asked !== undefined) return asked;
  const counts = new Map<Fuel, number>();
  for (const bill of bills) counts.set(bill.fuel, (counts.get(bill.fuel) ?? 0) + 1);
  const [first] = [...counts.entries()].sort((a, b) => b[1] - a[1]);
  if (first === undefined)
    throw InputError.at('homeId', 'this home has no bills yet: import a bills file first');
  return first[0];
}

/**
 * The billing analysis of a stored home.
 *
 * @throws InputError naming `homeId` (no bills), `temperatures` (none to use, or days
 *   missing), `before.…`/`after.…` (a fit that cannot be made, e.g. too few bills)
 */
export function analyseBills(read: ReadAccess, request: AnalysisRequest): BillsAnalysis {
  const home = getHome(read, request.homeId);
  const stored = listBills(read, request.homeId);
  const fuel = fuelOf(stored, request.fuel);
  const kind = request.kind ?? 'heating';
  const bills: UtilityBill[] = stored
    .filter((bill) => bill.fuel === fuel)
    .map(({ periodStart, periodEnd, use }) => ({ periodStart, periodEnd, use, fuel }));
  if (bills.length === 0) throw InputError.at('fuel', `this home has no ${fuel} bills`);
  const weather: HourlyWeather | null =
    home.climateId === null ? null : weatherYearOfClimate(read, home.climateId);
  const yearDays = weather === null ? null : dailyMeanTemperatures(weather);
  const series = listDailyTemperatures(read, request.homeId);
  const source: TemperatureSource =
    request.temperatures ?? (series.length > 0 || yearDays === null ? 'stored' : 'weatherYear');
  let temperatures: DailyTemperature[];
  if (source === 'stored') {
    if (series.length === 0)
      throw InputError.at(
        'temperatures',
        'this home has no daily temperatures: import a file first',
      );
    temperatures = series;
  } else {
    if (yearDays === null)
      throw InputError.at(
        'temperatures',
        "this home's climate was not made from a weather file, so it has no weather year",
      );
    const starts = bills.map((bill) => dayNumberOf(bill.periodStart) ?? 0);
    const ends = bills.map((bill) => dayNumberOf(bill.periodEnd) ?? 0);
    temperatures = datedFromWeatherYear(yearDays, Math.min(...starts), Math.max(...ends));
  }
  const normalYear =
    yearDays === null
      ? under('temperatures', () => normalYearFromSeries(temperatures))
      : normalYearOfDays(yearDays);
  const before = bills.filter((bill) => bill.periodEnd <= request.workDone);
  const after = bills.filter((bill) => bill.periodStart >= request.workDone);
  const shared = { temperatures, normalYear, kind };
  const pre = under('before', () => fitDegreeDays({ ...shared, bills: before }));
  const post = under('after', () => fitDegreeDays({ ...shared, bills: after }));
  const estimate = planEstimate(read, request.homeId, fuel, kind);
  const savings = measuredSavings({ pre, post, estimatedSavingsPerYear: estimate.perYear ?? 0 });
  return {
    fuel,
    kind,
    workDone: request.workDone,
    temperatureSource: source,
    normalYearSource: yearDays === null ? 'series' : 'weatherYear',
    spanningBills: bills.length - before.length - after.length,
    pre,
    post,
    savings,
    estimate,
  };
}

/** Whether a home's climate has a stored weather year (for the list of what a home has). */
export function weatherYearOfHome(read: ReadAccess, homeId: number): WeatherYearSummary | null {
  const home = getHome(read, homeId);
  return home.climateId === null ? null : weatherYearSummaryOfClimate(read, home.climateId);
}
