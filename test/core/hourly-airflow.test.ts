/**
 * Hour-by-hour infiltration (core/weather/hourly-airflow.ts) against the seasonal methods it
 * must reduce to, and against hand sums.
 *
 * A year whose every hour is the same is one season of one condition, so the hourly
 * degree-hour-weighted flow must be the seasonal flow at that condition and the hourly loads
 * the seasonal loads (core/seasonal-airflow.ts and core/energy.ts, with a climate whose degree
 * days and season means are that hour's). The season totals are checked against sums worked
 * by hand in the test.
 */
import { describe, expect, it } from 'vitest';
import { standardPressurePa } from '../../core/air.ts';
import {
  annualEnergyOfAirflow,
  seasonalLatentLoadBtu,
  seasonalSensibleLoadBtu,
  seasonTotalsOfClimate,
} from '../../core/energy.ts';
import type { LeakageByLocation } from '../../core/home-model.ts';
import { parseHomeFile, type HomeFile } from '../../core/schema.ts';
import { seasonalAirflowMethod } from '../../core/seasonal-airflow.ts';
import {
  DEFAULT_HOURLY_BASIS,
  hourlyAirflowMethod,
  hourlySeasons,
  humidityRatioFromDewPoint,
  parseTmy3,
  weatherYearOf,
  type HourlyBasis,
  type WeatherYear,
} from '../../core/weather.ts';
import { validBaseHome, type JsonObject } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { tmy3Year } from '../_lib/weather-files.ts';

const METHODS = ['lblBasic', 'aim2'] as const;
const STATES: readonly LeakageByLocation[] = [
  { ceiling: 900, wall: 1400, floor: 600, flue: 100 },
  { ceiling: 300, wall: 2100, floor: 150, flue: 0 },
];
const EXPONENT_N = 0.62;

/** The base home with a method and climate; `change` edits the JSON before parsing. */
function homeWith(change: (json: JsonObject) => void): HomeFile {
  const json = validBaseHome();
  change(json);
  return parseHomeFile(json);
}

/** A parsed home without its climate's seasons (which the hourly method must not need). */
function withoutSeasons(home: HomeFile): HomeFile {
  const copy = structuredClone(home);
  delete copy.climate.heatingSeason;
  delete copy.climate.coolingSeason;
  return copy;
}

function constantYear(options: {
  hours: number;
  outdoorF: number;
  windMph: number;
  humidityRatio: number;
  elevationFt: number;
}): WeatherYear {
  return {
    name: 'constant',
    elevationFt: options.elevationFt,
    outdoorF: new Float64Array(options.hours).fill(options.outdoorF),
    windMph: new Float64Array(options.hours).fill(options.windMph),
    humidityRatio: new Float64Array(options.hours).fill(options.humidityRatio),
  };
}

/** Relative agreement to 12 digits: the two sides differ only by rounding. */
function expectSame(actual: number, expected: number): void {
  expect(expected).not.toBe(0);
  expect(actual / expected - 1).toBeCloseTo(0, 12);
}

describe('a constant cold year equals the seasonal heating formula (seasonal-airflow.ts, energy.ts)', () => {
  // Every hour −1 °C (30.2 °F), 4.5 m/s, from the TMY3 generator (1200 m elevation).
  const year = weatherYearOf(parseTmy3(tmy3Year(() => -1, 4.5)));
  const seasons = hourlySeasons(year, DEFAULT_HOURLY_BASIS);
  const outdoorF = year.outdoorF[0]!;
  const windMph = year.windMph[0]!;

  it('has 8,760 heating hours of (65 − 30.2) °F each', () => {
    expect(seasons.heatingHours).toBe(8760);
    expect(seasons.coolingHours).toBe(0);
    expectSame(seasons.hddF, ((65 - outdoorF) * 8760) / 24);
    expect(seasons.cddF).toBe(0);
  });

  it.each(METHODS)('%s: heating flow and load equal the seasonal ones', (method) => {
    const home = homeWith((json) => {
      json.infiltrationMethod = method;
      json.climate = {
        name: 'Constant cold',
        hdd65F: seasons.hddF,
        cdd65F: 0,
        elevationFt: year.elevationFt,
        heatingSeason: { meanDeltaTF: 68 - outdoorF, meanWindSpeedMph: windMph, indoorTempF: 68 },
        // Required by the home file for a cooled house; no degree day of cooling weighs it.
        coolingSeason: { meanDeltaTF: 5, meanWindSpeedMph: 5 },
      };
    });
    const seasonal = seasonalAirflowMethod(home, EXPONENT_N);
    const hourly = hourlyAirflowMethod(
      withoutSeasons(home),
      EXPONENT_N,
      year,
      DEFAULT_HOURLY_BASIS,
    );
    const context = {
      seasons: seasonTotalsOfClimate(home.climate),
      heating: home.heating,
      cooling: home.cooling ?? null,
      electricityKgCo2PerKwh: 0,
    };
    for (const leakage of STATES) {
      const flows = hourly(leakage);
      expectSame(flows.heatingCfm, seasonal(leakage).heatingCfm);
      const hourlyLoadBtu = seasonalSensibleLoadBtu({
        airflowCfm: flows.heatingCfm,
        degreeDaysF: seasons.hddF,
        elevationFt: year.elevationFt,
      });
      expectSame(hourlyLoadBtu, annualEnergyOfAirflow(context, seasonal(leakage)).heatingLoadBtu);
      expect(flows.coolingCfm).toBe(0);
      expect(flows.coolingLatentCfm).toBe(0);
    }
  });
});

describe('a constant hot, humid year equals the seasonal cooling formula (seasonal-airflow.ts, energy.ts)', () => {
  // Every hour 92 °F, 7 mph, dew point 22 °C at 2000 ft's pressure (standard atmosphere).
  const elevationFt = 2000;
  const year = constantYear({
    hours: 8760,
    outdoorF: 92,
    windMph: 7,
    humidityRatio: humidityRatioFromDewPoint(22, standardPressurePa(elevationFt * 0.3048)),
    elevationFt,
  });
  const seasons = hourlySeasons(year, DEFAULT_HOURLY_BASIS);

  it('has 8,760 cooling hours and their excess humidity', () => {
    expect(seasons.coolingHours).toBe(8760);
    expectSame(seasons.cddF, ((92 - 65) * 8760) / 24);
    const excessGrains = (year.humidityRatio[0]! - DEFAULT_HOURLY_BASIS.indoorHumidityRatio) * 7000;
    expect(excessGrains).toBeGreaterThan(0);
    expectSame(seasons.latentGrainHours, excessGrains * 8760);
  });

  it.each(METHODS)('%s: cooling sensible and latent load equal the seasonal ones', (method) => {
    const home = homeWith((json) => {
      json.infiltrationMethod = method;
      json.climate = {
        name: 'Constant hot',
        hdd65F: 0,
        cdd65F: seasons.cddF,
        elevationFt,
        heatingSeason: { meanDeltaTF: 30, meanWindSpeedMph: 8 },
        coolingSeason: {
          meanDeltaTF: 92 - 75,
          meanWindSpeedMph: 7,
          indoorTempF: 75,
          latentGrainHours: seasons.latentGrainHours,
        },
      };
    });
    const seasonal = seasonalAirflowMethod(home, EXPONENT_N);
    const hourly = hourlyAirflowMethod(
      withoutSeasons(home),
      EXPONENT_N,
      year,
      DEFAULT_HOURLY_BASIS,
    );
    const context = {
      seasons: seasonTotalsOfClimate(home.climate),
      heating: home.heating,
      cooling: home.cooling ?? null,
      electricityKgCo2PerKwh: 0,
    };
    for (const leakage of STATES) {
      const flows = hourly(leakage);
      expectSame(flows.coolingCfm, seasonal(leakage).coolingCfm);
      expectSame(flows.coolingLatentCfm, seasonal(leakage).coolingCfm);
      const hourlyLoadBtu =
        seasonalSensibleLoadBtu({
          airflowCfm: flows.coolingCfm,
          degreeDaysF: seasons.cddF,
          elevationFt,
        }) +
        seasonalLatentLoadBtu({
          airflowCfm: flows.coolingLatentCfm,
          latentGrainHours: seasons.latentGrainHours,
          elevationFt,
        });
      expectSame(hourlyLoadBtu, annualEnergyOfAirflow(context, seasonal(leakage)).coolingLoadBtu);
      expect(flows.heatingCfm).toBe(0);
    }
  });

  it('gives no cooling flow to a house without cooling equipment', () => {
    const home = homeWith((json) => {
      json.infiltrationMethod = 'aim2';
      delete json.cooling;
    });
    const flows = hourlyAirflowMethod(home, EXPONENT_N, year, DEFAULT_HOURLY_BASIS)(STATES[0]!);
    expect(flows).toEqual({ heatingCfm: 0, coolingCfm: 0, coolingLatentCfm: 0 });
  });
});

describe('the N-factor and 62.2 methods do not depend on the weather', () => {
  const year = constantYear({
    hours: 48,
    outdoorF: 20,
    windMph: 15,
    humidityRatio: 0.002,
    elevationFt: 0,
  });
  it.each(['nFactor', 'ashrae622'] as const)('%s: the seasonal flows exactly', (method) => {
    const home = homeWith((json) => {
      json.infiltrationMethod = method;
    });
    const seasonal = seasonalAirflowMethod(home, EXPONENT_N);
    const hourly = hourlyAirflowMethod(home, EXPONENT_N, year, DEFAULT_HOURLY_BASIS);
    for (const leakage of STATES) {
      const expected = seasonal(leakage);
      expect(hourly(leakage)).toEqual({ ...expected, coolingLatentCfm: expected.coolingCfm });
    }
  });
});

describe('hourlySeasons against sums worked by hand', () => {
  const year: WeatherYear = {
    name: 'ten hours',
    elevationFt: 0,
    outdoorF: Float64Array.from([10, 40, 64.5, 65, 65.5, 80, 95, 30, 70, 100]),
    windMph: new Float64Array(10).fill(5),
    humidityRatio: Float64Array.from([
      0.001, 0.003, 0.02, 0.02, 0.012, 0.008, 0.015, 0.002, 0.0095, 0.02,
    ]),
  };
  const basis: HourlyBasis = { ...DEFAULT_HOURLY_BASIS, indoorHumidityRatio: 0.009 };

  it('sums degree-hours beyond 65 °F and the excess grains of the cooling hours', () => {
    // Heating hours (< 65): 10, 40, 64.5, 30 → 55 + 25 + 0.5 + 35 = 115.5 °F·h.
    // Cooling hours (> 65): 65.5, 80, 95, 70, 100 → 0.5 + 15 + 30 + 5 + 35 = 85.5 °F·h.
    // Their humidity above 0.009: 0.003, 0, 0.006, 0.0005, 0.011 → 0.0205 lb/lb·h.
    const seasons = hourlySeasons(year, basis);
    expect(seasons.heatingHours).toBe(4);
    expect(seasons.coolingHours).toBe(5);
    expect(seasons.hddF).toBeCloseTo(115.5 / 24, 12);
    expect(seasons.cddF).toBeCloseTo(85.5 / 24, 12);
    expect(seasons.latentGrainHours).toBeCloseTo(0.0205 * 7000, 9);
  });

  it('moves the split with the balance points', () => {
    // Heating below 60: 10, 40, 30 → 50 + 20 + 30 = 100; cooling above 70: 80, 95, 100 →
    // 10 + 25 + 30 = 65; their humidity above 0.009: 0, 0.006, 0.011.
    const seasons = hourlySeasons(year, {
      ...basis,
      heatingBalancePointF: 60,
      coolingBalancePointF: 70,
    });
    expect(seasons).toEqual({
      hddF: expect.closeTo(100 / 24, 12) as number,
      cddF: expect.closeTo(65 / 24, 12) as number,
      latentGrainHours: expect.closeTo(0.017 * 7000, 9) as number,
      heatingHours: 3,
      coolingHours: 3,
    });
  });

  it('the default basis is 65/65 °F, 68/75 °F indoors and a computed indoor humidity', () => {
    expect(DEFAULT_HOURLY_BASIS).toMatchObject({
      heatingBalancePointF: 65,
      coolingBalancePointF: 65,
      indoorHeatingF: 68,
      indoorCoolingF: 75,
    });
    // 75 °F and 50 % at sea level holds about 65 grains/lb (common practice: 64–65 gr/lb).
    expect(DEFAULT_HOURLY_BASIS.indoorHumidityRatio * 7000).toBeGreaterThan(63);
    expect(DEFAULT_HOURLY_BASIS.indoorHumidityRatio * 7000).toBeLessThan(66);
  });
});

describe('malformed input is refused, naming the field', () => {
  const good = (): WeatherYear =>
    constantYear({ hours: 24, outdoorF: 40, windMph: 6, humidityRatio: 0.004, elevationFt: 500 });
  const home = homeWith((json) => {
    json.infiltrationMethod = 'aim2';
  });
  const cases: [string, (year: WeatherYear) => void, string][] = [
    ['an empty year', (year) => Object.assign(year, emptyArrays()), 'outdoorF'],
    ['a short wind array', (year) => (year.windMph = new Float64Array(23)), 'windMph'],
    [
      'a long humidity array',
      (year) => (year.humidityRatio = new Float64Array(25)),
      'humidityRatio',
    ],
    ['a NaN temperature', (year) => (year.outdoorF[7] = Number.NaN), 'outdoorF[7]'],
    ['a negative wind', (year) => (year.windMph[3] = -1), 'windMph[3]'],
    ['a NaN humidity', (year) => (year.humidityRatio[20] = Number.NaN), 'humidityRatio[20]'],
    ['a NaN elevation', (year) => (year.elevationFt = Number.NaN), 'elevationFt'],
  ];
  function emptyArrays(): Partial<WeatherYear> {
    return {
      outdoorF: new Float64Array(0),
      windMph: new Float64Array(0),
      humidityRatio: new Float64Array(0),
    };
  }

  it.each(cases)('%s', (_, breakIt, field) => {
    const year = good();
    breakIt(year);
    expectInputError(() => hourlySeasons(year, DEFAULT_HOURLY_BASIS), field, /expected/);
    expectInputError(
      () => hourlyAirflowMethod(home, EXPONENT_N, year, DEFAULT_HOURLY_BASIS),
      field,
      /expected/,
    );
  });

  it.each([
    'heatingBalancePointF',
    'coolingBalancePointF',
    'indoorHeatingF',
    'indoorCoolingF',
    'indoorHumidityRatio',
  ] as const)('a NaN %s in the basis', (field) => {
    const basis = { ...DEFAULT_HOURLY_BASIS, [field]: Number.NaN };
    expectInputError(() => hourlySeasons(good(), basis), field, /expected a number/);
  });

  it('a negative or NaN CFM50 at a location', () => {
    const flows = hourlyAirflowMethod(home, EXPONENT_N, good(), DEFAULT_HOURLY_BASIS);
    expectInputError(
      () => flows({ ceiling: 100, wall: -5, floor: 0, flue: 0 }),
      'leakage.wall',
      /at least 0/,
    );
    expectInputError(
      () => flows({ ceiling: 100, wall: 5, floor: Number.NaN, flue: 0 }),
      'leakage.floor',
      /at least 0/,
    );
  });

  it('a missing N-factor zone when the method needs it, as the seasonal method says', () => {
    const copy = structuredClone(
      homeWith((json) => {
        json.infiltrationMethod = 'nFactor';
      }),
    );
    delete copy.climate.nFactorZone;
    expectInputError(
      () => hourlyAirflowMethod(copy, EXPONENT_N, good(), DEFAULT_HOURLY_BASIS),
      'climate.nFactorZone',
      /required/,
    );
  });

  it('an hourly weather file with no hours, or a bad hour', () => {
    const weather = parseTmy3(tmy3Year(() => 5));
    expectInputError(() => weatherYearOf({ ...weather, hours: [] }), 'hours', /at least one/);
    const hours = weather.hours.map((hour) => ({ ...hour }));
    hours[5]!.dewPointC = Number.NaN;
    expectInputError(() => weatherYearOf({ ...weather, hours }), 'hours[5].dewPointC', /expected/);
    hours[5]!.dewPointC = 0;
    hours[9]!.windSpeedMs = 99;
    expectInputError(() => weatherYearOf({ ...weather, hours }), 'hours[9].windSpeedMs', /0 to 40/);
  });
});

describe('weatherYearOf', () => {
  it('turns each hour into °F, mph and a humidity ratio, and the elevation into feet', () => {
    const weather = parseTmy3(tmy3Year((day) => (day % 7) - 3, 3));
    const year = weatherYearOf(weather, 'seven-day cycle');
    expect(year.name).toBe('seven-day cycle');
    expect(year.outdoorF).toHaveLength(8760);
    // Day 10 of the generator is (10 % 7) − 3 = 0 °C = 32 °F; 3 m/s = 3 / 0.44704 mph.
    expect(year.outdoorF[10 * 24 + 5]).toBeCloseTo(32, 12);
    expect(year.windMph[100]).toBeCloseTo(3 / 0.44704, 12);
    // The generator's 1200 m, over 0.3048 m/ft (exact, NIST SP 811).
    expect(year.elevationFt).toBeCloseTo(1200 / 0.3048, 9);
    // Its dew point −3 °C at 880 mbar, through the same module as the reference tests check.
    expect(year.humidityRatio[0]).toBeCloseTo(humidityRatioFromDewPoint(-3, 88_000), 15);
  });
});
