/**
 * Degree days of bills and of a normal year at any base temperature.
 *
 * A day's heating degree days at base τ are max(0, τ − t̄), t̄ the day's mean temperature;
 * its cooling degree days max(0, t̄ − τ). A bill's are the sum over its billed days.
 *
 * A bill that lacks any billed day's temperature is refused, naming the bill and the days:
 * dropping it quietly would change which bills are fitted without the user knowing, and a
 * pre/post comparison must rest on the bills the user sees. Trim the bills or complete the
 * temperatures.
 */
import { InputError, type InputProblem } from '../errors.ts';
import {
  DAILY_MEAN_MAX_F,
  DAILY_MEAN_MIN_F,
  type CheckedBill,
  type TemperatureSeries,
} from './bills.ts';
import { isoDateOf } from './dates.ts';

/** Which side of the base the model counts: below it (heating) or above it (cooling). */
export type DegreeDayKind = 'heating' | 'cooling';

/** Days in the year the normalized annual use is stated for. */
export const DAYS_PER_NORMAL_YEAR = 365;

/**
 * The typical year the fits are normalized to: its daily mean temperatures (°F, 365 or 366
 * days, e.g. a station's daily normals), or a function giving its degree days at a base.
 */
export type NormalYear =
  | { dailyMeanTempsF: readonly number[] }
  | { degreeDaysPerYear: (baseTempF: number, kind: DegreeDayKind) => number };

/** A bill with the daily means (°F) of each of its billed days, in day order. */
export interface BillWeather {
  bill: CheckedBill;
  dailyMeansF: Float64Array;
}

/**
 * One day's degree days.
 *
 * @param meanTempF - the day's mean temperature, °F
 * @param baseTempF - the base τ, °F
 * @param kind - heating (below the base) or cooling (above it)
 * @returns °F·day, never negative
 *
 * Notes: heating max(0, τ − t̄); cooling max(0, t̄ − τ).
 *
 * References: ASHRAE Handbook of Fundamentals, climatic design information (degree days
 * from daily means at a base temperature); Fels 1986, Energy and Buildings 9, "PRISM: an
 * introduction" (the variable base).
 */
export function dayDegreeDaysF(meanTempF: number, baseTempF: number, kind: DegreeDayKind): number {
  return Math.max(0, kind === 'heating' ? baseTempF - meanTempF : meanTempF - baseTempF);
}

/**
 * The degree days of a run of days.
 *
 * @param dailyMeansF - each day's mean temperature, °F
 * @param baseTempF - the base τ, °F
 * @param kind - heating or cooling
 * @returns the sum of the days' degree days, °F·day
 */
export function sumDegreeDaysF(
  dailyMeansF: ArrayLike<number>,
  baseTempF: number,
  kind: DegreeDayKind,
): number {
  let sum = 0;
  for (let i = 0; i < dailyMeansF.length; i++) {
    sum += dayDegreeDaysF(dailyMeansF[i] ?? 0, baseTempF, kind);
  }
  return sum;
}

function missingDaysMessage(bill: CheckedBill, missing: readonly number[]): string {
  const shown = missing.slice(0, 3).map(isoDateOf).join(', ');
  const more = missing.length > 3 ? ` and ${missing.length - 3} more` : '';
  const period = `${isoDateOf(bill.startDay)} until the read of ${isoDateOf(bill.endDay)}`;
  return `no daily mean temperature for ${shown}${more} of this bill (${period}); give every billed day's temperature, or leave the bill out`;
}

/**
 * Each bill's daily means, for degree days at any base.
 *
 * @param bills - checked bills
 * @param temperatures - checked daily means, °F
 * @param path - the bills' field path for messages (default `bills`)
 * @returns each bill with its days' means (°F), in the order given
 * @throws InputError at `bills[i]` for every bill lacking a billed day's temperature
 */
export function billWeather(
  bills: readonly CheckedBill[],
  temperatures: TemperatureSeries,
  path = 'bills',
): BillWeather[] {
  const problems: InputProblem[] = [];
  const weather = bills.map((bill) => {
    const dailyMeansF = new Float64Array(bill.days);
    const missing: number[] = [];
    for (let day = bill.startDay; day < bill.endDay; day++) {
      const meanF = temperatures.meanTempFByDay.get(day);
      if (meanF === undefined) missing.push(day);
      else dailyMeansF[day - bill.startDay] = meanF;
    }
    if (missing.length > 0) {
      problems.push({ path: `${path}[${bill.index}]`, message: missingDaysMessage(bill, missing) });
    }
    return { bill, dailyMeansF };
  });
  if (problems.length > 0) throw new InputError(problems);
  return weather;
}

/**
 * Refuses a normal year that cannot be used.
 *
 * @param normalYear - daily means (°F) of 365 or 366 days, or a degree-day function
 * @param path - its field path for messages (default `normalYear`)
 * @throws InputError naming the field: a wrong number of days, or a mean that is not a
 *   number from −130 to 140 °F
 */
export function checkNormalYear(normalYear: NormalYear, path = 'normalYear'): void {
  if ('degreeDaysPerYear' in normalYear) {
    if (typeof normalYear.degreeDaysPerYear !== 'function') {
      throw InputError.at(`${path}.degreeDaysPerYear`, 'expected a function of the base, °F');
    }
    return;
  }
  const means = normalYear.dailyMeanTempsF;
  if (means.length !== 365 && means.length !== 366) {
    throw InputError.at(
      `${path}.dailyMeanTempsF`,
      `expected the daily means of one whole year (365 or 366 days), got ${means.length}`,
    );
  }
  const problems: InputProblem[] = [];
  means.forEach((meanF, index) => {
    if (!Number.isFinite(meanF) || meanF < DAILY_MEAN_MIN_F || meanF > DAILY_MEAN_MAX_F) {
      problems.push({
        path: `${path}.dailyMeanTempsF[${index}]`,
        message: `expected a daily mean temperature from ${DAILY_MEAN_MIN_F} to ${DAILY_MEAN_MAX_F} °F, got ${meanF}`,
      });
    }
  });
  if (problems.length > 0) throw new InputError(problems);
}

/**
 * The normal year's degree days at a base.
 *
 * @param normalYear - checked by `checkNormalYear`
 * @param baseTempF - the base τ, °F
 * @param kind - heating or cooling
 * @param path - its field path for messages (default `normalYear`)
 * @returns °F·day per 365-day year
 * @throws InputError when a degree-day function gives anything but a number of 0 or more
 *
 * Notes: from daily means, DD = (365/N)·Σ dd(t̄ᵢ, τ) over the N days given, so a 366-day
 * year counts as a 365-day one, matching the 365·α of the normalized annual use.
 */
export function normalYearDegreeDaysF(
  normalYear: NormalYear,
  baseTempF: number,
  kind: DegreeDayKind,
  path = 'normalYear',
): number {
  if ('degreeDaysPerYear' in normalYear) {
    const degreeDays = normalYear.degreeDaysPerYear(baseTempF, kind);
    if (typeof degreeDays !== 'number' || !Number.isFinite(degreeDays) || degreeDays < 0) {
      throw InputError.at(
        `${path}.degreeDaysPerYear`,
        `expected a number of at least 0 °F·day at base ${baseTempF} °F, got ${degreeDays}`,
      );
    }
    return degreeDays;
  }
  const means = normalYear.dailyMeanTempsF;
  return (sumDegreeDaysF(means, baseTempF, kind) * DAYS_PER_NORMAL_YEAR) / means.length;
}
