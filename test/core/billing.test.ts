/**
 * Billing analysis: the bills and temperatures files, the checks of bills and daily means,
 * UTC dates, degree days, and a degree-day fit on bills small enough to work by hand.
 * Expected values are worked out in the comments beside each check.
 */
import { describe, expect, it } from 'vitest';
import {
  checkBills,
  checkDailyTemperatures,
  csvProblemText,
  dayDegreeDaysF,
  dayNumberOf,
  fitDegreeDays,
  fitDegreeDaysAtBase,
  isoDateOf,
  normalYearDegreeDaysF,
  parseBillsCsv,
  parseTemperaturesCsv,
  sumDegreeDaysF,
  type DailyTemperature,
  type UtilityBill,
} from '../../core/billing.ts';
import { InputError } from '../../core/errors.ts';

function problemsOf(call: () => unknown): string[] {
  try {
    call();
  } catch (error) {
    if (error instanceof InputError) return error.problems.map((p) => `${p.path}: ${p.message}`);
    throw error;
  }
  throw new Error('expected an InputError');
}

/** Daily means from `firstDate`, one a day. */
function days(firstDate: string, meansF: readonly number[]): DailyTemperature[] {
  const first = dayNumberOf(firstDate) ?? NaN;
  return meansF.map((meanTempF, i) => ({ date: isoDateOf(first + i), meanTempF }));
}

describe('dates', () => {
  it('counts whole UTC days (Unix time 946684800 s is 2000-01-01, day 10957)', () => {
    expect(dayNumberOf('1970-01-01')).toBe(0);
    expect(dayNumberOf('2000-01-01')).toBe(946_684_800 / 86_400);
    expect(isoDateOf(10_957)).toBe('2000-01-01');
    // Gregorian leap rules: 2024 is a leap year, 1900 is not, 2000 is.
    expect((dayNumberOf('2024-03-01') ?? 0) - (dayNumberOf('2024-02-28') ?? 0)).toBe(2);
    expect(dayNumberOf('1900-02-29')).toBeUndefined();
    expect(dayNumberOf('2000-02-29')).toBeDefined();
    expect(dayNumberOf('2023-02-30')).toBeUndefined();
    expect(dayNumberOf('2023-1-05')).toBeUndefined();
    expect(isoDateOf(dayNumberOf('0099-12-31') ?? 0)).toBe('0099-12-31');
  });

  it('ignores the local time zone across a daylight-saving change', () => {
    const zone = process.env.TZ;
    process.env.TZ = 'America/New_York';
    try {
      // US clocks moved forward on 2023-03-12; that day still counts as one.
      const [bill] = checkBills([
        { periodStart: '2023-03-12', periodEnd: '2023-03-13', use: 1, fuel: 'naturalGas' },
      ]);
      expect(bill?.days).toBe(1);
      const [march] = checkBills([
        { periodStart: '2023-03-01', periodEnd: '2023-04-01', use: 1, fuel: 'naturalGas' },
      ]);
      expect(march?.days).toBe(31);
    } finally {
      if (zone === undefined) delete process.env.TZ;
      else process.env.TZ = zone;
    }
  });
});

describe('bill and temperature checks', () => {
  const good: UtilityBill = {
    periodStart: '2023-01-05',
    periodEnd: '2023-02-03',
    use: 112.5,
    fuel: 'naturalGas',
  };

  it('takes periodEnd as the closing read, not billed: Jan 5 until Feb 3 is 29 days', () => {
    const [bill] = checkBills([good]);
    expect(bill?.days).toBe(29);
  });

  it('names every bad field at once', () => {
    const bills = [
      good,
      { periodStart: '2023-02-03', periodEnd: '2023-03-06', use: 98, fuel: 'naturalGas' },
      { periodStart: '2023-03-06', periodEnd: '2023-04-04', use: 80, fuel: 'naturalGas' },
      { periodStart: '2023-04-04', periodEnd: '2023-05-04', use: -1, fuel: 'gas' },
      { periodStart: '2023-05-04', periodEnd: '2023-05-04', use: 60, fuel: 'naturalGas' },
    ];
    expect(problemsOf(() => checkBills(bills))).toEqual([
      'bills[3].use: expected a number of at least 0, got -1',
      'bills[3].fuel: expected one of naturalGas, propane, heatingOil, kerosene, electricity, wood, pellets, got "gas"',
      'bills[4].periodEnd: expected a date after periodStart (2023-05-04), got 2023-05-04; periodEnd is the day of the closing meter read',
    ]);
  });

  it('refuses two bills of one fuel that share a day, but not bills of two fuels', () => {
    const overlapping = { ...good, periodStart: '2023-02-02', periodEnd: '2023-03-01' };
    expect(problemsOf(() => checkBills([good, overlapping]))).toEqual([
      'bills[1].periodStart: overlaps bills[0], which runs from 2023-01-05 until the read of 2023-02-03; a day may be on one naturalGas bill only',
    ]);
    // Consecutive bills share the read date and do not overlap.
    const next = { ...good, periodStart: '2023-02-03', periodEnd: '2023-03-01' };
    expect(checkBills([good, next])).toHaveLength(2);
    expect(checkBills([good, { ...overlapping, fuel: 'electricity' }])).toHaveLength(2);
  });

  it('refuses temperatures given twice, unreal dates and means outside −130 to 140 °F', () => {
    const temperatures = [
      { date: '2023-01-01', meanTempF: 20 },
      { date: '2023-01-01', meanTempF: 21 },
      { date: '2023-13-01', meanTempF: 22 },
      { date: '2023-01-03', meanTempF: 212 },
      { date: '2023-01-04', meanTempF: NaN },
    ];
    expect(problemsOf(() => checkDailyTemperatures(temperatures))).toEqual([
      'temperatures[1].date: 2023-01-01 is given twice (first at temperatures[0])',
      'temperatures[2].date: expected a real calendar date, got "2023-13-01"',
      'temperatures[3].meanTempF: expected a daily mean temperature from -130 to 140 °F, got 212',
      'temperatures[4].meanTempF: expected a daily mean temperature from -130 to 140 °F, got NaN',
    ]);
  });
});

describe('bills CSV', () => {
  it('reads a good file: columns in any order, quotes, CR LF, a byte-order mark', () => {
    const text =
      '\uFEFFfuel,use,periodStart,periodEnd\r\n' +
      'naturalGas,112.5,2023-01-05,2023-02-03\r\n' +
      '\r\n' +
      '"naturalGas"," 98",2023-02-03,2023-03-06\r\n';
    expect(parseBillsCsv(text)).toEqual({
      ok: true,
      bills: [
        { periodStart: '2023-01-05', periodEnd: '2023-02-03', use: 112.5, fuel: 'naturalGas' },
        { periodStart: '2023-02-03', periodEnd: '2023-03-06', use: 98, fuel: 'naturalGas' },
      ],
    });
  });

  it('lists every problem of the rows with its line and column', () => {
    const text = [
      'periodStart,periodEnd,use,fuel',
      '2023-01-05,2023-02-03,112.5,naturalGas',
      '2023-02-03,2023-02-03,98,naturalGas',
      '2023-03-01,2023-02-30,80,naturalGas',
      '2023/04/01,2023-05-01,"1,200",naturalGas',
      '2023-05-01,2023-06-01,-4,gas',
      '2023-01-20,2023-02-10,5,naturalGas',
      '2023-07-01,2023-08-01,,naturalGas,x',
    ].join('\n');
    const result = parseBillsCsv(text);
    expect(result.ok).toBe(false);
    const lines = result.ok ? [] : result.problems.map(csvProblemText);
    expect(lines).toEqual([
      'line 3, column periodEnd: expected a date after periodStart (2023-02-03), got 2023-02-03; periodEnd is the day of the closing meter read',
      'line 4, column periodEnd: expected a real calendar date, got "2023-02-30"',
      'line 5, column periodStart: expected a date as YYYY-MM-DD, got "2023/04/01"',
      'line 5, column use: expected a number without thousands separators, got "1,200"',
      'line 6, column use: expected a number of at least 0, got -4',
      'line 6, column fuel: expected one of naturalGas, propane, heatingOil, kerosene, electricity, wood, pellets, got "gas"',
      'line 7, column periodStart: overlaps line 2, which runs from 2023-01-05 until the read of 2023-02-03; a day may be on one naturalGas bill only',
      'line 8: has 5 fields; the header names 4',
      "line 8, column use: is required: expected the period's use in the fuel's unit",
    ]);
  });

  it('lists every problem of the header at line 1', () => {
    const result = parseBillsCsv(
      'periodstart,periodEnd,use,fuel,use,note\n2023-01-05,2023-02-03,1,propane',
    );
    expect(result.ok ? [] : result.problems.map(csvProblemText)).toEqual([
      'line 1, column periodstart: is not a column of a bills file (did you mean "periodStart"?)',
      'line 1, column note: is not a column of a bills file (its columns are periodStart, periodEnd, use, fuel)',
      'line 1, column periodStart: is required: the header has no such column',
      'line 1, column use: appears twice in the header',
    ]);
  });

  it('says where quoting goes wrong, and that an empty file is empty', () => {
    const unclosed = parseBillsCsv(
      'periodStart,periodEnd,use,fuel\n2023-01-05,2023-02-03,"1,propane\n',
    );
    expect(unclosed.ok ? [] : unclosed.problems.map(csvProblemText)).toContain(
      'line 2: a quoted field has no closing quote',
    );
    const stray = parseBillsCsv(
      'periodStart,periodEnd,use,fuel\n2023-01-05,2023-02-03,1 "a",propane',
    );
    expect(stray.ok ? [] : stray.problems.map(csvProblemText)).toContain(
      'line 2: a quote inside a field must be doubled ("") and the field quoted',
    );
    const empty = parseBillsCsv('\n\n');
    expect(empty.ok ? [] : empty.problems.map(csvProblemText)).toEqual([
      'line 1: the file is empty: expected a header row (periodStart,periodEnd,use,fuel), then the rows',
    ]);
  });

  it('counts a quoted line break in a field toward the lines that follow', () => {
    const text =
      'periodStart,periodEnd,use,fuel\n"2023-01-05\n",2023-02-03,1,propane\n2023-02-03,2023-03-01,x,propane';
    const result = parseBillsCsv(text);
    expect(result.ok ? [] : result.problems.map((p) => [p.line, p.column])).toEqual([[4, 'use']]);
  });
});

describe('temperatures CSV', () => {
  it('reads °F as given', () => {
    expect(parseTemperaturesCsv('date,meanTempF\n2023-01-01,12.5\n2023-01-02,-3')).toEqual({
      ok: true,
      temperatures: [
        { date: '2023-01-01', meanTempF: 12.5 },
        { date: '2023-01-02', meanTempF: -3 },
      ],
    });
  });

  it('converts °C exactly: t/°F = 1.8·t/°C + 32 (NIST SP 811), rounded once', () => {
    const result = parseTemperaturesCsv(
      'meanTempC,date\n-39.5,2023-01-01\n-40,2023-01-02\n37,2023-01-03\n21.7,2023-01-04',
    );
    // −39.5·1.8 + 32 = −39.1 exactly; in binary floating point −39.5 * 1.8 + 32 is
    // −39.10000000000001, which the conversion must not give.
    expect(result.ok ? result.temperatures.map((t) => t.meanTempF) : []).toEqual([
      -39.1, -40, 98.6, 71.06,
    ]);
  });

  it('lists every problem with line and column, in the unit of the column', () => {
    const text = [
      'date,meanTempC',
      '2023-01-01,5',
      '2023-01-01,6',
      '2023-01-03,75',
      '2023-01-32,4',
      '2023-01-05,warm',
      '2023-01-06,',
    ].join('\n');
    const result = parseTemperaturesCsv(text);
    expect(result.ok ? [] : result.problems.map(csvProblemText)).toEqual([
      'line 3, column date: 2023-01-01 is given twice (first at line 2)',
      'line 4, column meanTempC: expected a daily mean temperature from -90 to 60 °C, got 75',
      'line 5, column date: expected a real calendar date, got "2023-01-32"',
      `line 6, column meanTempC: expected a number (the day's mean temperature, °C), got "warm"`,
      "line 7, column meanTempC: is required: expected the day's mean temperature, °C",
    ]);
    const f = parseTemperaturesCsv('date,meanTempF\n2023-01-01,141');
    expect(f.ok ? [] : f.problems.map(csvProblemText)).toEqual([
      'line 2, column meanTempF: expected a daily mean temperature from -130 to 140 °F, got 141',
    ]);
  });

  it('wants exactly one of meanTempF and meanTempC', () => {
    const both = parseTemperaturesCsv('date,meanTempF,meanTempC\n2023-01-01,32,0');
    expect(both.ok ? [] : both.problems.map(csvProblemText)).toEqual([
      'line 1, column meanTempC: give one of meanTempF or meanTempC, not both',
    ]);
    const neither = parseTemperaturesCsv('date\n2023-01-01');
    expect(neither.ok ? [] : neither.problems.map(csvProblemText)).toEqual([
      'line 1, column meanTempF: is required: the header needs meanTempF or meanTempC',
    ]);
  });
});

describe('degree days', () => {
  it('sums max(0, τ − t̄) over the billed days (hand computation)', () => {
    // Means 50, 60, 70 °F at τ = 65 °F: heating 15 + 5 + 0 = 20; cooling 0 + 0 + 5 = 5.
    expect(sumDegreeDaysF([50, 60, 70], 65, 'heating')).toBe(20);
    expect(sumDegreeDaysF([50, 60, 70], 65, 'cooling')).toBe(5);
    expect(dayDegreeDaysF(65, 65, 'heating')).toBe(0);
    expect(sumDegreeDaysF([], 65, 'heating')).toBe(0);
  });

  it('states a normal year of 366 days as a 365-day one', () => {
    // 366 days at 50 °F, base 65 °F: 15 °F·day × 365 = 5475.
    const leap = { dailyMeanTempsF: new Array<number>(366).fill(50) };
    expect(normalYearDegreeDaysF(leap, 65, 'heating')).toBe(5475);
  });

  it('refuses a bill missing a day of temperature, naming the bill and the days', () => {
    const bills: UtilityBill[] = [0, 1, 2, 3].map((k) => ({
      periodStart: isoDateOf((dayNumberOf('2023-01-01') ?? 0) + 10 * k),
      periodEnd: isoDateOf((dayNumberOf('2023-01-01') ?? 0) + 10 * k + 10),
      use: 10 + k,
      fuel: 'naturalGas',
    }));
    const temperatures = days('2023-01-01', new Array<number>(40).fill(30)).filter(
      (entry) => !['2023-01-25', '2023-01-26'].includes(entry.date),
    );
    const normalYear = { dailyMeanTempsF: new Array<number>(365).fill(40) };
    expect(problemsOf(() => fitDegreeDays({ bills, temperatures, normalYear }))).toEqual([
      "bills[2]: no daily mean temperature for 2023-01-25, 2023-01-26 of this bill (2023-01-21 until the read of 2023-01-31); give every billed day's temperature, or leave the bill out",
    ]);
  });
});

describe('a fit on bills worked by hand', () => {
  // Five 30-day bills, each with every day at one mean: 30, 40, 50, 60, 70 °F. At τ = 65 °F
  // the per-day degree days are 35, 25, 15, 5, 0; use = 30·(2 + 0.1·DD/day) therm gives
  // 165, 135, 105, 75, 60 therm, so α = 2 therm/day and β = 0.1 therm/(°F·day) exactly.
  const means = [30, 40, 50, 60, 70];
  const first = dayNumberOf('2023-01-01') ?? 0;
  const bills: UtilityBill[] = means.map((_, k) => ({
    periodStart: isoDateOf(first + 30 * k),
    periodEnd: isoDateOf(first + 30 * k + 30),
    use: [165, 135, 105, 75, 60][k] ?? 0,
    fuel: 'naturalGas',
  }));
  const temperatures = days(
    '2023-01-01',
    means.flatMap((meanF) => new Array<number>(30).fill(meanF)),
  );
  // A normal year of 365 days at 45 °F: 20 °F·day a day at 65 °F, 7300 a year.
  const normalYear = { dailyMeanTempsF: new Array<number>(365).fill(45) };

  it('finds α, β, NAC = 365·2 + 0.1·7300 = 1460 therm, R² = 1', () => {
    const fit = fitDegreeDaysAtBase({ bills, temperatures, normalYear, baseTempF: 65 });
    expect(fit.baseLoadPerDay).toBeCloseTo(2, 12);
    expect(fit.usePerDegreeDay).toBeCloseTo(0.1, 12);
    expect(fit.normalDegreeDaysF).toBe(7300);
    expect(fit.normalizedAnnualUse).toBeCloseTo(1460, 9);
    expect(fit.rSquared).toBeCloseTo(1, 12);
    expect(fit.unit).toBe('therm');
    expect(fit.bills.map((bill) => bill.degreeDaysF)).toEqual([1050, 750, 450, 150, 0]);
    expect(fit.warnings.map((w) => w.code)).toEqual(['few-bills']);
  });

  it('does not change its input', () => {
    const frozen = Object.freeze(bills.map((bill) => Object.freeze({ ...bill })));
    const before = JSON.stringify(frozen);
    fitDegreeDaysAtBase({ bills: frozen, temperatures, normalYear, baseTempF: 65 });
    expect(JSON.stringify(frozen)).toBe(before);
  });

  it('refuses mixed fuels, too few bills, all-zero use and a bad range, naming the field', () => {
    const mixed = [...bills.slice(0, 4), { ...bills[4]!, fuel: 'propane' as const }];
    expect(problemsOf(() => fitDegreeDays({ bills: mixed, temperatures, normalYear }))).toEqual([
      'bills[4].fuel: expected naturalGas as bills[0]: fit each fuel on its own, got propane',
    ]);
    expect(
      problemsOf(() => fitDegreeDays({ bills: bills.slice(0, 3), temperatures, normalYear })),
    ).toEqual(['bills: expected at least 4 bills to fit α, β and τ with one to spare, got 3']);
    const zero = bills.map((bill) => ({ ...bill, use: 0 }));
    expect(problemsOf(() => fitDegreeDays({ bills: zero, temperatures, normalYear }))).toEqual([
      'bills: expected some use: every bill shows 0, so there is nothing to fit',
    ]);
    const baseRangeF = { minF: 70, maxF: 60 };
    const short = { dailyMeanTempsF: [40] };
    expect(
      problemsOf(() => fitDegreeDays({ bills, temperatures, normalYear: short, baseRangeF })),
    ).toEqual([
      'baseRangeF.maxF: expected more than minF (70 °F), got 60',
      'normalYear.dailyMeanTempsF: expected the daily means of one whole year (365 or 366 days), got 1',
    ]);
  });
});
