/**
 * Utility bills and daily mean temperatures, the two inputs of a billing analysis, and their
 * checks. Every problem is reported at once, each at its field (`bills[4].periodEnd`).
 *
 * A bill runs from `periodStart` (the day of the opening meter read, billed) up to
 * `periodEnd` (the day of the closing meter read, not billed): its days are periodStart,
 * periodStart + 1, …, periodEnd − 1, and there are periodEnd − periodStart of them. The end
 * is exclusive so that consecutive bills share their read date (one bill's periodEnd is the
 * next one's periodStart) and no day is counted twice or lost. Dates are whole UTC days.
 */
import { InputError, type InputProblem } from '../errors.ts';
import { FUEL_FACTS, type FuelFacts } from '../fuels.ts';
import { FUELS, type Fuel } from '../schema.ts';
import { dateMessage, dayNumberOf, isoDateOf } from './dates.ts';

/** One utility bill of one fuel. */
export interface UtilityBill {
  /** First billed day, `YYYY-MM-DD` (the opening meter read). */
  periodStart: string;
  /** Day of the closing meter read, `YYYY-MM-DD`, not billed itself (exclusive end). */
  periodEnd: string;
  /** Use over the period, in the fuel's unit (therm, gallon, kWh, cord, ton). */
  use: number;
  fuel: Fuel;
}

/** A bill as it arrives from outside (a file, a form), its fuel not yet known to be valid. */
export type BillInput = Omit<UtilityBill, 'fuel'> & { fuel: string };

/** The mean outdoor temperature of one day. */
export interface DailyTemperature {
  /** The day, `YYYY-MM-DD`. */
  date: string;
  /** Daily mean dry-bulb temperature, °F. */
  meanTempF: number;
}

/** A bill that passed the checks, with its days as UTC day numbers. */
export interface CheckedBill {
  /** Position in the list given, for messages (`bills[index]`). */
  index: number;
  /** First billed day (days since 1970-01-01, UTC). */
  startDay: number;
  /** Day of the closing read, not billed (days since 1970-01-01, UTC). */
  endDay: number;
  /** Billed days, endDay − startDay. */
  days: number;
  /** Use over the period, in the fuel's unit. */
  use: number;
  fuel: Fuel;
}

/** Checked daily means, °F, by UTC day number. */
export interface TemperatureSeries {
  readonly meanTempFByDay: ReadonlyMap<number, number>;
}

/**
 * Daily means outside this band are typing errors or the wrong unit: the world's recorded
 * extremes are about −89 °C (−128 °F) and 57 °C (134 °F), from memory (WMO archive of
 * weather and climate extremes); the band is −90 °C to 60 °C, exactly −130 °F to 140 °F.
 */
export const DAILY_MEAN_MIN_F = -130;
export const DAILY_MEAN_MAX_F = 140;

const FUEL_NAMES: ReadonlySet<string> = new Set(FUELS);

/** The unit a fuel's use is billed in. */
export function fuelUnit(fuel: Fuel): FuelFacts['unit'] {
  return FUEL_FACTS[fuel].unit;
}

/** Whether a text names one of Sealwork's fuels. */
export function isFuel(text: string): text is Fuel {
  return FUEL_NAMES.has(text);
}

/** The message for a fuel that is not one of Sealwork's. */
export function fuelMessage(value: unknown): string {
  return `expected one of ${FUELS.join(', ')}, got ${JSON.stringify(value)}`;
}

function oneBillProblems(bill: BillInput, at: string, problems: InputProblem[]): void {
  const startDay = dayNumberOf(String(bill.periodStart));
  const endDay = dayNumberOf(String(bill.periodEnd));
  if (startDay === undefined) {
    problems.push({ path: `${at}.periodStart`, message: dateMessage(bill.periodStart) });
  }
  if (endDay === undefined) {
    problems.push({ path: `${at}.periodEnd`, message: dateMessage(bill.periodEnd) });
  } else if (startDay !== undefined && endDay <= startDay) {
    problems.push({
      path: `${at}.periodEnd`,
      message: `expected a date after periodStart (${bill.periodStart}), got ${bill.periodEnd}; periodEnd is the day of the closing meter read`,
    });
  }
  if (typeof bill.use !== 'number' || !Number.isFinite(bill.use) || bill.use < 0) {
    problems.push({
      path: `${at}.use`,
      message: `expected a number of at least 0, got ${bill.use}`,
    });
  }
  if (!isFuel(String(bill.fuel))) {
    problems.push({ path: `${at}.fuel`, message: fuelMessage(bill.fuel) });
  }
}

/** Bills of one fuel whose periods overlap: each later-starting one is blamed. */
function overlapProblems(bills: readonly CheckedBill[], path: string): InputProblem[] {
  const problems: InputProblem[] = [];
  const byStart = [...bills].sort((a, b) => a.startDay - b.startDay || a.index - b.index);
  const lastOfFuel = new Map<Fuel, CheckedBill>();
  for (const bill of byStart) {
    const earlier = lastOfFuel.get(bill.fuel);
    if (earlier && bill.startDay < earlier.endDay) {
      problems.push({
        path: `${path}[${bill.index}].periodStart`,
        message: `overlaps ${path}[${earlier.index}], which runs from ${isoDateOf(earlier.startDay)} until the read of ${isoDateOf(earlier.endDay)}; a day may be on one ${bill.fuel} bill only`,
      });
    }
    if (!earlier || bill.endDay > earlier.endDay) lastOfFuel.set(bill.fuel, bill);
  }
  return problems;
}

/**
 * Every problem of a list of bills: dates that are not real, a period that does not end
 * after it starts, a negative or missing use, an unknown fuel, two bills of one fuel that
 * share a day.
 *
 * @param bills - the bills, in any order; use in the fuel's unit
 * @param path - the list's field path for messages (default `bills`)
 * @returns the problems, each at its field (`bills[4].periodEnd`); empty when all is well
 */
export function billProblems(bills: readonly BillInput[], path = 'bills'): InputProblem[] {
  const problems: InputProblem[] = [];
  const whole: CheckedBill[] = [];
  bills.forEach((bill, index) => {
    const at = `${path}[${index}]`;
    const before = problems.length;
    oneBillProblems(bill, at, problems);
    // A bill whose use alone is wrong still has a period, which may overlap another's.
    const periodWrong = problems.slice(before).some((problem) => problem.path !== `${at}.use`);
    if (!periodWrong) whole.push(toChecked(bill as UtilityBill, index));
  });
  return [...problems, ...overlapProblems(whole, path)];
}

function toChecked(bill: UtilityBill, index: number): CheckedBill {
  const startDay = dayNumberOf(bill.periodStart) ?? 0;
  const endDay = dayNumberOf(bill.periodEnd) ?? 0;
  return { index, startDay, endDay, days: endDay - startDay, use: bill.use, fuel: bill.fuel };
}

/**
 * Checks bills and turns their dates into day numbers.
 *
 * @param bills - the bills, in any order; use in the fuel's unit
 * @param path - the list's field path for messages (default `bills`)
 * @returns the bills in the order given, with their days (periodEnd exclusive)
 * @throws InputError listing every problem of `billProblems`
 */
export function checkBills(bills: readonly BillInput[], path = 'bills'): CheckedBill[] {
  const problems = billProblems(bills, path);
  if (problems.length > 0) throw new InputError(problems);
  return bills.map((bill, index) => toChecked(bill as UtilityBill, index));
}

/**
 * Every problem of a list of daily means: dates that are not real or are given twice,
 * temperatures that are not numbers or lie outside −130 to 140 °F.
 *
 * @param temperatures - daily means (°F), in any order
 * @param path - the list's field path for messages (default `temperatures`)
 * @returns the problems, each at its field (`temperatures[3].meanTempF`)
 */
export function temperatureProblems(
  temperatures: readonly DailyTemperature[],
  path = 'temperatures',
): InputProblem[] {
  const problems: InputProblem[] = [];
  const firstIndexByDay = new Map<number, number>();
  temperatures.forEach((entry, index) => {
    const day = dayNumberOf(String(entry.date));
    if (day === undefined) {
      problems.push({ path: `${path}[${index}].date`, message: dateMessage(entry.date) });
    } else if (firstIndexByDay.has(day)) {
      const first = firstIndexByDay.get(day) ?? 0;
      problems.push({
        path: `${path}[${index}].date`,
        message: `${entry.date} is given twice (first at ${path}[${first}])`,
      });
    } else {
      firstIndexByDay.set(day, index);
    }
    const tempF = entry.meanTempF;
    if (
      typeof tempF !== 'number' ||
      !Number.isFinite(tempF) ||
      tempF < DAILY_MEAN_MIN_F ||
      tempF > DAILY_MEAN_MAX_F
    ) {
      problems.push({
        path: `${path}[${index}].meanTempF`,
        message: `expected a daily mean temperature from ${DAILY_MEAN_MIN_F} to ${DAILY_MEAN_MAX_F} °F, got ${tempF}`,
      });
    }
  });
  return problems;
}

/**
 * Checks daily means and indexes them by day.
 *
 * @param temperatures - daily means (°F), in any order
 * @param path - the list's field path for messages (default `temperatures`)
 * @returns the means (°F) by UTC day number
 * @throws InputError listing every problem of `temperatureProblems`
 */
export function checkDailyTemperatures(
  temperatures: readonly DailyTemperature[],
  path = 'temperatures',
): TemperatureSeries {
  const problems = temperatureProblems(temperatures, path);
  if (problems.length > 0) throw new InputError(problems);
  const meanTempFByDay = new Map<number, number>();
  for (const entry of temperatures) {
    meanTempFByDay.set(dayNumberOf(entry.date) ?? 0, entry.meanTempF);
  }
  return { meanTempFByDay };
}
