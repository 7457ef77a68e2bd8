/**
 * The weather readers and degree days on files generated here: constant weather, where the
 * degree days follow by hand (HDD = 365·(base − T), design temperatures = T), and malformed
 * files, which must be refused with the line and field at fault. Conversions are checked
 * against NIST SP 811's exact definitions (1 mph = 0.44704 m/s; °F = 1.8·°C + 32).
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import {
  celsiusToFahrenheit,
  dailyMeanTemperatures,
  degreeDays,
  designTemperatures,
  detectAndParseWeather,
  heatingSeasonConditions,
  metersPerSecondToMph,
  parseEpw,
  parseTmy3,
  type HourlyWeather,
} from '../../core/weather.ts';

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Every hour of a year as [month, day, hour]; with 29 February when leap. */
function yearHours(leap = false): [number, number, number][] {
  const hours: [number, number, number][] = [];
  DAYS_IN_MONTH.forEach((days, index) => {
    const monthDays = leap && index === 1 ? 29 : days;
    for (let day = 1; day <= monthDays; day += 1) {
      for (let hour = 1; hour <= 24; hour += 1) hours.push([index + 1, day, hour]);
    }
  });
  return hours;
}

const EPW_HEADER = [
  'LOCATION,Testville,ST,Nowhere,generated,000000,40.5,-100.25,-6,500',
  'DESIGN CONDITIONS,0',
  'TYPICAL/EXTREME PERIODS,0',
  'GROUND TEMPERATURES,0',
  'HOLIDAYS/DAYLIGHT SAVING,No,0,0,0',
  'COMMENTS 1,constant weather generated in the test',
  'COMMENTS 2,none',
  'DATA PERIODS,1,1,Data,Sunday, 1/ 1,12/31',
];

/** A 35-field EPW row with the given dry-bulb (°C) and wind (m/s). */
function epwRow(month: number, day: number, hour: number, dryBulbC: number, windMs = 3): string {
  const fields = Array.from({ length: 35 }, () => '0');
  fields[0] = '2001';
  fields[1] = String(month);
  fields[2] = String(day);
  fields[3] = String(hour);
  fields[4] = '60';
  fields[5] = 'A7A7';
  fields[6] = String(dryBulbC);
  fields[7] = '-1.5';
  fields[8] = '60';
  fields[9] = '95000';
  fields[21] = String(windMs);
  return fields.join(',');
}

/** The lines of a constant-weather EPW year. */
function constantEpwLines(dryBulbC: number, leap = false): string[] {
  return [...EPW_HEADER, ...yearHours(leap).map(([m, d, h]) => epwRow(m, d, h, dryBulbC))];
}

/** The lines of a constant-weather TMY3 year (only the columns the reader uses, plus two). */
function constantTmy3Lines(dryBulbC: number): string[] {
  const pad = (value: number): string => String(value).padStart(2, '0');
  return [
    '999999,"TEST, GENERATED",ZZ,-7.0,35.000,-110.500,1200',
    'Date (MM/DD/YYYY),Time (HH:MM),GHI (W/m^2),Dry-bulb (C),Dew-point (C),RHum (%),Pressure (mbar),Wdir (degrees),Wspd (m/s)',
    ...yearHours().map(
      ([m, d, h]) => `${pad(m)}/${pad(d)}/1999,${pad(h)}:00,0,${dryBulbC},-3.0,40,880,180,4.5`,
    ),
  ];
}

function problemsOf(action: () => unknown): { path: string; message: string }[] {
  try {
    action();
  } catch (error) {
    if (error instanceof InputError) return [...error.problems];
    throw error;
  }
  throw new Error('expected an InputError');
}

describe('constant weather (worked by hand)', () => {
  const weather = parseEpw(constantEpwLines(5).join('\n')); // 5 °C = 41 °F

  it('reads the location and every hour', () => {
    expect(weather.location).toEqual({
      name: 'Testville',
      region: 'ST',
      country: 'Nowhere',
      source: 'generated',
      stationId: '000000',
      latitude: 40.5,
      longitude: -100.25,
      timeZoneHours: -6,
      elevationM: 500,
    });
    expect(weather.hours).toHaveLength(8760);
    expect(weather.hours[8759]).toEqual({
      month: 12,
      day: 31,
      hour: 24,
      dryBulbC: 5,
      dewPointC: -1.5,
      relativeHumidityPct: 60,
      pressurePa: 95000,
      windSpeedMs: 3,
    });
  });

  it('HDD = 365·(base − T) and CDD = 0 by both definitions, month by month', () => {
    for (const method of ['daily-mean', 'hourly'] as const) {
      const result = degreeDays(weather, { baseF: 65, method });
      expect(result.heatingDegreeDaysF).toBe(365 * (65 - 41));
      expect(result.coolingDegreeDaysF).toBe(0);
      expect(result.monthly.map((m) => m.heatingDegreeDaysF)).toEqual(
        DAYS_IN_MONTH.map((days) => days * (65 - 41)),
      );
    }
  });

  it('CDD = 365·(T − base) below the temperature, and a base equal to T gives zero', () => {
    expect(degreeDays(weather, { baseF: 30 }).coolingDegreeDaysF).toBe(365 * 11);
    expect(degreeDays(weather, { baseF: 30 }).heatingDegreeDaysF).toBe(0);
    expect(degreeDays(weather, { baseF: 41 })).toMatchObject({
      heatingDegreeDaysF: 0,
      coolingDegreeDaysF: 0,
    });
  });

  it('every design temperature equals T', () => {
    const design = designTemperatures(weather);
    for (const entry of Object.values(design)) expect(entry.temperatureF).toBe(41);
    expect(design.heating99.definition).toContain('percentile 1 ');
    expect(design.cooling1.definition).toContain('percentile 99 ');
  });

  it('heating-season ΔT = indoor − T and wind in mph (NIST SP 811: 1 mph = 0.44704 m/s)', () => {
    const season = heatingSeasonConditions(weather, { baseF: 65 });
    expect(season.hoursBelowBase).toBe(8760);
    expect(season.meanDeltaTF).toBeCloseTo(68 - 41, 10);
    expect(season.meanWindSpeedMph).toBeCloseTo(3 / 0.44704, 10);
    expect(heatingSeasonConditions(weather, { baseF: 65, indoorF: 70 }).meanDeltaTF).toBeCloseTo(
      29,
      10,
    );
    expect(heatingSeasonConditions(weather, { baseF: 41 })).toMatchObject({
      hoursBelowBase: 0,
      meanDeltaTF: null,
      meanWindSpeedMph: null,
    });
  });

  it('a leap year of 8,784 hours is accepted and has 366 days', () => {
    const leap = parseEpw(constantEpwLines(5, true).join('\n'));
    expect(leap.hours).toHaveLength(8784);
    expect(degreeDays(leap, { baseF: 65 }).heatingDegreeDaysF).toBe(366 * 24);
  });

  it('refuses a base temperature that is not a temperature', () => {
    expect(problemsOf(() => degreeDays(weather, { baseF: Number.NaN }))[0]?.path).toBe('baseF');
  });
});

describe('a daily swing (brute force)', () => {
  // Each day: hours 1–12 at 0 °C (32 °F), 13–24 at 20 °C (68 °F); daily mean 50 °F.
  const lines = [
    ...EPW_HEADER,
    ...yearHours().map(([m, d, h]) => epwRow(m, d, h, h <= 12 ? 0 : 20)),
  ];
  const weather = parseEpw(lines.join('\n'));

  it('daily means are 50 °F; HDD65 daily-mean = 365·15, hourly = 365·(12·33)/24', () => {
    expect(dailyMeanTemperatures(weather).every((day) => day.meanDryBulbF === 50)).toBe(true);
    expect(degreeDays(weather, { baseF: 65 }).heatingDegreeDaysF).toBe(365 * 15);
    expect(degreeDays(weather, { baseF: 65, method: 'hourly' }).heatingDegreeDaysF).toBe(
      (365 * 12 * 33) / 24,
    );
    // At base 50 the daily-mean CDD is zero, but the warm hours count hour by hour.
    expect(degreeDays(weather, { baseF: 50 }).coolingDegreeDaysF).toBe(0);
    expect(degreeDays(weather, { baseF: 50, method: 'hourly' }).coolingDegreeDaysF).toBe(
      (365 * 12 * 18) / 24,
    );
  });

  it('design temperatures: half the hours at each value', () => {
    const design = designTemperatures(weather);
    expect(design.heating99.temperatureF).toBe(32);
    expect(design.cooling1.temperatureF).toBe(68);
  });

  it('does not change the weather it is given', () => {
    const copy = structuredClone(weather);
    designTemperatures(weather);
    degreeDays(weather, { baseF: 65, method: 'hourly' });
    heatingSeasonConditions(weather, { baseF: 65 });
    expect(weather).toEqual(copy);
  });
});

describe('malformed EPW files are refused with the line and field', () => {
  const good = constantEpwLines(5);

  it('a non-numeric dry-bulb names line 12, field 7', () => {
    const lines = [...good];
    lines[11] = epwRow(1, 1, 4, 0).replace(/^((?:[^,]*,){6})[^,]*/, '$1x');
    expect(problemsOf(() => parseEpw(lines.join('\n')))).toEqual([
      {
        path: 'line 12.dryBulbC',
        message: "line 12, field 7 (dry-bulb): expected a number, got 'x'",
      },
    ]);
  });

  it("EPW's missing-value markers are refused, each by name", () => {
    const lines = [...good];
    lines[20] = epwRow(1, 1, 13, 99.9);
    lines[30] = epwRow(1, 1, 23, 5, 999);
    const problems = problemsOf(() => parseEpw(lines.join('\n')));
    expect(problems.map((p) => p.path)).toEqual(['line 21.dryBulbC', 'line 31.windSpeedMs']);
    expect(problems[0]?.message).toContain('missing-value marker');
  });

  it('a wrong field count and an empty field are both reported at once', () => {
    const lines = [...good];
    lines[9] = `${good[9]},extra`;
    lines[100] = (good[100] ?? '').replace(/^((?:[^,]*,){21})[^,]*/, '$1');
    const problems = problemsOf(() => parseEpw(lines.join('\n')));
    expect(problems).toEqual([
      { path: 'line 10', message: 'line 10: expected 35 fields, got 36' },
      {
        path: 'line 101.windSpeedMs',
        message: "line 101, field 22 (wind speed): expected a number, got ''",
      },
    ]);
  });

  it('a truncated file says how many hours it has', () => {
    const problems = problemsOf(() => parseEpw(good.slice(0, -5).join('\n')));
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe('hours');
    expect(problems[0]?.message).toContain(
      'expected 8760 hourly rows (8784 in a leap year), got 8755',
    );
  });

  it('a missing header line names the line', () => {
    const lines = good.filter((line) => !line.startsWith('DESIGN CONDITIONS'));
    const problems = problemsOf(() => parseEpw(lines.join('\n')));
    expect(problems[0]?.path).toBe('line 2');
    expect(problems[0]?.message).toContain('DESIGN CONDITIONS');
  });

  it('sub-hourly data (4 records per hour) is refused at line 8, field 3', () => {
    const lines = [...good];
    lines[7] = 'DATA PERIODS,1,4,Data,Sunday, 1/ 1,12/31';
    expect(problemsOf(() => parseEpw(lines.join('\n')))).toEqual([
      {
        path: 'line 8.recordsPerHour',
        message: "line 8, field 3 (records per hour): expected 1 (hourly data), got '4'",
      },
    ]);
  });

  it('hours out of order name the line and the hour', () => {
    const lines = [...good];
    lines[8 + 5] = epwRow(1, 1, 7, 5);
    lines[8 + 6] = epwRow(1, 1, 6, 5);
    expect(problemsOf(() => parseEpw(lines.join('\n'))).map((p) => p.path)).toEqual([
      'line 14.hour',
      'line 15.hour',
    ]);
  });

  it('a wholly wrong file lists 50 problems and how many more', () => {
    const lines = [...EPW_HEADER, ...yearHours().map(() => 'a,b')];
    const problems = problemsOf(() => parseEpw(lines.join('\n')));
    expect(problems).toHaveLength(51);
    // 8,760 bad rows, one problem each: 50 listed, 8,710 counted.
    expect(problems[50]?.message).toBe('and 8710 more problems');
  });
});

describe('TMY3', () => {
  const good = constantTmy3Lines(-2);

  it('reads the quoted station name, finds columns by name and gives pressure in Pa', () => {
    const weather = parseTmy3(good.join('\n'));
    expect(weather.location).toEqual({
      name: 'TEST, GENERATED',
      region: 'ZZ',
      stationId: '999999',
      latitude: 35,
      longitude: -110.5,
      timeZoneHours: -7,
      elevationM: 1200,
    });
    expect(weather.hours[0]).toEqual({
      month: 1,
      day: 1,
      hour: 1,
      dryBulbC: -2,
      dewPointC: -3,
      relativeHumidityPct: 40,
      pressurePa: 88000,
      windSpeedMs: 4.5,
    });
    expect(degreeDays(weather, { baseF: 65 }).heatingDegreeDaysF).toBeCloseTo(
      365 * (65 - celsiusToFahrenheit(-2)),
      9,
    );
  });

  it('a non-numeric dry-bulb names the line and the column', () => {
    const lines = [...good];
    lines[11] = (good[11] ?? '').replace(',-2,', ',x,');
    expect(problemsOf(() => parseTmy3(lines.join('\n')))).toEqual([
      {
        path: 'line 12.dryBulbC',
        message: `line 12, column 4 "Dry-bulb (C)" (dry-bulb): expected a number, got 'x'`,
      },
    ]);
  });

  it('a missing column, a short row and a truncated file are refused', () => {
    const noColumn = [
      good[0] ?? '',
      (good[1] ?? '').replace('Wspd (m/s)', 'Wind'),
      ...good.slice(2),
    ];
    expect(problemsOf(() => parseTmy3(noColumn.join('\n')))[0]).toEqual({
      path: 'line 2.windSpeedMs',
      message: 'line 2: no column named "Wspd (m/s)"',
    });
    const shortRow = [...good];
    shortRow[4] = '01/01/1999,03:00,0,-2';
    expect(problemsOf(() => parseTmy3(shortRow.join('\n')))).toEqual([
      { path: 'line 5', message: 'line 5: expected 9 fields (one per column of line 2), got 4' },
    ]);
    expect(problemsOf(() => parseTmy3(good.slice(0, 100).join('\n')))[0]?.path).toBe('hours');
  });
});

describe('choosing the format by content', () => {
  it('reads EPW and TMY3 whatever the file is called', () => {
    expect(detectAndParseWeather(constantEpwLines(5).join('\n'), 'a.csv').location.name).toBe(
      'Testville',
    );
    expect(detectAndParseWeather(constantTmy3Lines(5).join('\r\n'), 'b.epw').location.name).toBe(
      'TEST, GENERATED',
    );
  });

  it('refuses anything else, naming the file', () => {
    const problems = problemsOf(() =>
      detectAndParseWeather('date,temp\n2020-01-01,3\n', 'temps.csv'),
    );
    expect(problems[0]?.message).toContain("'temps.csv' is neither EPW");
  });
});

describe('conversions (NIST SP 811, exact definitions)', () => {
  it('°F = 1.8·°C + 32; 1 m/s = 1/0.44704 mph = 2.236936… mph', () => {
    expect(celsiusToFahrenheit(100)).toBe(212);
    expect(celsiusToFahrenheit(-40)).toBe(-40);
    expect(metersPerSecondToMph(0.44704)).toBeCloseTo(1, 12);
    expect(metersPerSecondToMph(1)).toBeCloseTo(2.236936, 6);
  });
});

describe('dailyMeanTemperatures', () => {
  it('refuses hours that are not whole days', () => {
    const weather: HourlyWeather = parseEpw(constantEpwLines(5).join('\n'));
    const broken = { ...weather, hours: weather.hours.slice(1) };
    expect(problemsOf(() => dailyMeanTemperatures(broken))[0]?.path).toBe('hours');
    const shifted = { ...weather, hours: [...weather.hours.slice(1), weather.hours[0]!] };
    expect(problemsOf(() => dailyMeanTemperatures(shifted))[0]?.path).toBe('hours[0]');
  });
});
