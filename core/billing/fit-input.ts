/**
 * The input of a degree-day fit and its checks: every problem of the bills, temperatures,
 * options and normal year at once, each at its field, then the bills with their weather.
 */
import { InputError, type InputProblem } from '../errors.ts';
import type { Fuel } from '../schema.ts';
import {
  billProblems,
  checkBills,
  checkDailyTemperatures,
  DAILY_MEAN_MAX_F,
  DAILY_MEAN_MIN_F,
  temperatureProblems,
  type BillInput,
  type DailyTemperature,
} from './bills.ts';
import {
  billWeather,
  checkNormalYear,
  type BillWeather,
  type DegreeDayKind,
  type NormalYear,
} from './degree-days.ts';

/** How bills count in the fit: by their days (PRISM), or each the same. */
export type BillWeighting = 'days' | 'none';

/** The bills, their weather and the year to normalize to. */
export interface DegreeDayFitInput {
  /** Bills of one fuel, in any order; use in the fuel's unit. */
  bills: readonly BillInput[];
  /** Daily means (°F) covering every billed day. */
  temperatures: readonly DailyTemperature[];
  /** The typical year NAC is stated for. */
  normalYear: NormalYear;
  /** Heating (the default) or cooling degree days. */
  kind?: DegreeDayKind;
  /** Bills weighted by their days (the default) or equally. */
  weighting?: BillWeighting;
  /** Range of τ searched, °F (default 40–80 °F); fitDegreeDaysAtBase ignores it. */
  baseRangeF?: { minF: number; maxF: number };
}

/** A checked input: one fuel's bills with their daily means, and the options filled in. */
export interface Prepared {
  weather: BillWeather[];
  fuel: Fuel;
  kind: DegreeDayKind;
  weighting: BillWeighting;
  normalYear: NormalYear;
}

function optionProblems(input: DegreeDayFitInput): InputProblem[] {
  const problems: InputProblem[] = [];
  if (input.kind !== undefined && input.kind !== 'heating' && input.kind !== 'cooling') {
    problems.push({ path: 'kind', message: `expected heating or cooling, got ${input.kind}` });
  }
  const weighting = input.weighting;
  if (weighting !== undefined && weighting !== 'days' && weighting !== 'none') {
    problems.push({ path: 'weighting', message: `expected days or none, got ${weighting}` });
  }
  try {
    checkNormalYear(input.normalYear);
  } catch (error) {
    if (!(error instanceof InputError)) throw error;
    problems.push(...error.problems);
  }
  return problems;
}

/**
 * Every check of the input, then the bills with their weather.
 *
 * @param input - the fit's input
 * @param parameterCount - p: 3 when τ is searched, 2 when given
 * @param otherProblems - problems the caller found in its own options, reported with these
 */
export function prepareFit(
  input: DegreeDayFitInput,
  parameterCount: number,
  otherProblems: readonly InputProblem[],
): Prepared {
  const problems = [
    ...otherProblems,
    ...billProblems(input.bills),
    ...temperatureProblems(input.temperatures),
    ...optionProblems(input),
  ];
  if (problems.length > 0) throw new InputError(problems);
  const bills = checkBills(input.bills);
  const [first] = bills;
  if (!first || bills.length <= parameterCount) {
    const what = parameterCount === 3 ? 'α, β and τ' : 'α and β';
    throw InputError.at(
      'bills',
      `expected at least ${parameterCount + 1} bills to fit ${what} with one to spare, got ${bills.length}`,
    );
  }
  const fuel = first.fuel;
  const mixed = bills.filter((bill) => bill.fuel !== fuel);
  if (mixed.length > 0) {
    throw new InputError(
      mixed.map((bill) => ({
        path: `bills[${bill.index}].fuel`,
        message: `expected ${fuel} as bills[0]: fit each fuel on its own, got ${bill.fuel}`,
      })),
    );
  }
  if (bills.every((bill) => bill.use === 0)) {
    throw InputError.at(
      'bills',
      'expected some use: every bill shows 0, so there is nothing to fit',
    );
  }
  const weather = billWeather(bills, checkDailyTemperatures(input.temperatures));
  const kind = input.kind ?? 'heating';
  const weighting = input.weighting ?? 'days';
  return { weather, fuel, kind, weighting, normalYear: input.normalYear };
}

/** The problem of a base temperature (°F) outside the band daily means may take, if any. */
export function temperatureFProblems(path: string, valueF: number): InputProblem[] {
  if (Number.isFinite(valueF) && valueF >= DAILY_MEAN_MIN_F && valueF <= DAILY_MEAN_MAX_F)
    return [];
  const message = `expected a temperature from ${DAILY_MEAN_MIN_F} to ${DAILY_MEAN_MAX_F} °F, got ${valueF}`;
  return [{ path, message }];
}
