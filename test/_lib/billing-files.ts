/**
 * Bills and daily temperatures made for tests from a known house: a base temperature τ
 * (°F), a base load α (units/day) and a slope β (units per °F·day), so a fit's expected
 * figures follow from the numbers written here and not from the code under test. Use of a
 * bill = α·days + β·Σ max(0, τ − t̄) over its billed days (periodEnd not billed), the
 * variable-base degree-day model of Fels (1986, "PRISM: an introduction").
 */

/** A house's use as the model has it. */
export interface KnownHouse {
  baseTempF: number;
  baseLoadPerDay: number;
  usePerDegreeDay: number;
}

/** Milliseconds in a day. */
const DAY_MS = 86_400_000;

/** `YYYY-MM-DD` of a UTC day number (days since 1970-01-01). */
export function isoOfDay(dayNumber: number): string {
  return new Date(dayNumber * DAY_MS).toISOString().slice(0, 10);
}

/** The UTC day number of `YYYY-MM-DD`. */
export function dayOfIso(date: string): number {
  return Date.parse(`${date}T00:00:00Z`) / DAY_MS;
}

/**
 * A made-up daily mean temperature (°F): a yearly wave from about 22 °F in mid-January
 * to 78 °F in mid-July, with a small ripple so no two weeks are alike.
 */
export function madeUpMeanTempF(dayNumber: number): number {
  const yearly = Math.cos((2 * Math.PI * (dayNumber - dayOfIso('2000-07-15'))) / 365.25);
  const ripple = Math.sin((2 * Math.PI * dayNumber) / 9);
  return Math.round((50 + 28 * yearly + 3 * ripple) * 10) / 10;
}

/** Daily means from `firstDate` for `days` days. */
export function madeUpTemperatures(
  firstDate: string,
  days: number,
): { date: string; meanTempF: number }[] {
  const first = dayOfIso(firstDate);
  return Array.from({ length: days }, (_, index) => ({
    date: isoOfDay(first + index),
    meanTempF: madeUpMeanTempF(first + index),
  }));
}

/** A temperatures CSV (`date,meanTempF`). */
export function temperaturesCsv(
  temperatures: readonly { date: string; meanTempF: number }[],
): string {
  return ['date,meanTempF', ...temperatures.map((day) => `${day.date},${day.meanTempF}`)].join(
    '\n',
  );
}

/** The model's use over the days [startDay, endDay), from the daily means given. */
export function modelUse(
  house: KnownHouse,
  meanTempFOfDay: (dayNumber: number) => number,
  startDay: number,
  endDay: number,
): number {
  let use = 0;
  for (let day = startDay; day < endDay; day += 1) {
    use +=
      house.baseLoadPerDay +
      house.usePerDegreeDay * Math.max(0, house.baseTempF - meanTempFOfDay(day));
  }
  return use;
}

/** A made-up bill. */
export interface MadeUpBill {
  periodStart: string;
  periodEnd: string;
  use: number;
  fuel: string;
}

/**
 * Consecutive bills of `periodDays` days each (the last of a bill is the next one's read day).
 *
 * @param house - the model the use follows
 * @param firstRead - the first opening read, `YYYY-MM-DD`
 * @param count - how many bills
 */
export function madeUpBills(options: {
  house: KnownHouse;
  firstRead: string;
  count: number;
  periodDays: number;
  fuel: string;
}): MadeUpBill[] {
  const start = dayOfIso(options.firstRead);
  return Array.from({ length: options.count }, (_, index) => {
    const from = start + index * options.periodDays;
    const to = from + options.periodDays;
    return {
      periodStart: isoOfDay(from),
      periodEnd: isoOfDay(to),
      use: modelUse(options.house, madeUpMeanTempF, from, to),
      fuel: options.fuel,
    };
  });
}

/** A bills CSV (`periodStart,periodEnd,use,fuel`). */
export function billsCsv(bills: readonly MadeUpBill[]): string {
  return [
    'periodStart,periodEnd,use,fuel',
    ...bills.map((bill) => `${bill.periodStart},${bill.periodEnd},${bill.use},${bill.fuel}`),
  ].join('\n');
}

/**
 * The degree days of a normal year made from a daily series as the test computes it: each
 * calendar day's mean over the years given (29 February with 28 February), then
 * Σ max(0, τ − t̄) over the 365 days.
 */
export function normalDegreeDaysF(
  temperatures: readonly { date: string; meanTempF: number }[],
  baseTempF: number,
): number {
  const sums = new Map<string, { sum: number; count: number }>();
  for (const { date, meanTempF } of temperatures) {
    const key = date.slice(5) === '02-29' ? '02-28' : date.slice(5);
    const entry = sums.get(key) ?? { sum: 0, count: 0 };
    entry.sum += meanTempF;
    entry.count += 1;
    sums.set(key, entry);
  }
  let total = 0;
  for (const { sum, count } of sums.values()) total += Math.max(0, baseTempF - sum / count);
  return total;
}

/** A house before and after its work, with the files of its bills and temperatures. */
export interface BillingScenario {
  before: KnownHouse;
  after: KnownHouse;
  workDone: string;
  bills: MadeUpBill[];
  temperatures: { date: string; meanTempF: number }[];
}

/**
 * Two years of 30-day gas bills (12 before the work, 12 after) and 760 days of daily means
 * covering them; the figures of the house are made up for the tests.
 *
 * @param afterCount - how many bills after the work (12 unless a test wants fewer)
 */
export function billingScenario(afterCount = 12): BillingScenario {
  const before = { baseTempF: 62, baseLoadPerDay: 0.9, usePerDegreeDay: 0.21 };
  const after = { baseTempF: 58, baseLoadPerDay: 0.9, usePerDegreeDay: 0.16 };
  const fuel = 'naturalGas';
  return {
    before,
    after,
    workDone: '2024-01-10',
    bills: [
      ...madeUpBills({ house: before, firstRead: '2023-01-02', count: 12, periodDays: 30, fuel }),
      ...madeUpBills({
        house: after,
        firstRead: '2024-01-20',
        count: afterCount,
        periodDays: 30,
        fuel,
      }),
    ],
    temperatures: madeUpTemperatures('2023-01-01', 760),
  };
}
