/**
 * A plan worked hour by hour (home.hourlyWeather with a weather year) against the same plan
 * on degree days. On a year of constant weather the two must agree exactly: Σ_h 1.08·Q·(65 −
 * T)⁺ over 8,760 equal hours is 1.08·Q·24·HDD65 with HDD65 = 365·(65 − T), and the season's
 * mean ΔT and wind are the hour's (ASHRAE Handbook of Fundamentals, degree-day method of the
 * energy estimating chapter). The hourly flows themselves are held to the models' equations in
 * test/reference/hourly-airflow.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { evaluateHome, reportOf } from '../../core/evaluate.ts';
import { compilePackageKernel, emptyFigures } from '../../core/plan/kernel.ts';
import type { HomeFileInput, InfiltrationMethod } from '../../core/schema.ts';
import { compareWithDegreeDays } from '../../core/weather/degree-day-comparison.ts';
import { indoorHumidityRatio, type WeatherYear } from '../../core/weather/hourly-airflow.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

const HOURS = 8760;
const GRAINS_PER_POUND = 7000; // by definition of the grain (1/7000 lb)

function constantYear(outdoorF: number, windMph: number, humidityRatio: number): WeatherYear {
  return {
    name: `Constant ${outdoorF} °F`,
    elevationFt: 0,
    outdoorF: new Float64Array(HOURS).fill(outdoorF),
    windMph: new Float64Array(HOURS).fill(windMph),
    humidityRatio: new Float64Array(HOURS).fill(humidityRatio),
  };
}

function homeWith(method: InfiltrationMethod, climate: HomeFileInput['climate']): HomeFileInput {
  const home = validBaseHome() as unknown as HomeFileInput;
  return { ...home, infiltrationMethod: method, climate };
}

const COLD_F = 30;
const WIND_MPH = 10;
/** The degree-day twin of 8,760 hours at 30 °F and 10 mph (heating only). */
const COLD_CLIMATE: HomeFileInput['climate'] = {
  name: 'Constant cold',
  hdd65F: 365 * (65 - COLD_F),
  cdd65F: 0,
  elevationFt: 0,
  nFactorZone: 2,
  wsf: 0.55,
  heatingSeason: { meanDeltaTF: 68 - COLD_F, meanWindSpeedMph: WIND_MPH, indoorTempF: 68 },
  coolingSeason: { meanDeltaTF: 0, meanWindSpeedMph: WIND_MPH, indoorTempF: 75 },
};

const HOT_F = 85;
/** 0.018 lb/lb: humid summer air (about a 73 °F dew point at sea level). */
const HOT_HUMIDITY_RATIO = 0.018;
const indoorW = indoorHumidityRatio({ indoorF: 75, relativeHumidityPct: 50 });
/** The twin of 8,760 hours at 85 °F, humid (cooling only). */
const HOT_CLIMATE: HomeFileInput['climate'] = {
  name: 'Constant hot',
  hdd65F: 0,
  cdd65F: 365 * (HOT_F - 65),
  elevationFt: 0,
  nFactorZone: 2,
  wsf: 0.55,
  heatingSeason: { meanDeltaTF: 0, meanWindSpeedMph: WIND_MPH, indoorTempF: 68 },
  coolingSeason: {
    meanDeltaTF: HOT_F - 75,
    meanWindSpeedMph: WIND_MPH,
    indoorTempF: 75,
    latentGrainHours: HOURS * (HOT_HUMIDITY_RATIO - indoorW) * GRAINS_PER_POUND,
  },
};

const CASES = [
  { label: 'cold', climate: COLD_CLIMATE, year: constantYear(COLD_F, WIND_MPH, 0.002) },
  {
    label: 'hot and humid',
    climate: HOT_CLIMATE,
    year: constantYear(HOT_F, WIND_MPH, HOT_HUMIDITY_RATIO),
  },
];
const METHODS: InfiltrationMethod[] = ['nFactor', 'lblBasic', 'aim2', 'ashrae622'];

describe('a plan hour by hour on constant weather', () => {
  for (const { label, climate, year } of CASES) {
    for (const method of METHODS) {
      it(`equals the degree-day plan (${label}, ${method})`, () => {
        const degreeDays = evaluateHome(homeWith(method, climate));
        const hourly = evaluateHome(
          { ...homeWith(method, climate), hourlyWeather: {} },
          { weather: year },
        );
        expect(hourly.model.climateBasis.kind).toBe('hourly');
        const seasons = hourly.model.energyContext.seasons;
        expect(seasons.heatingDegreeDaysF).toBeCloseTo(climate.hdd65F, 9);
        expect(seasons.coolingDegreeDaysF).toBeCloseTo(climate.cdd65F, 9);
        const hourlyEntries = hourly.plan.entries;
        const ddEntries = degreeDays.plan.entries;
        expect(hourlyEntries.map((entry) => entry.step.measure.id)).toEqual(
          ddEntries.map((entry) => entry.step.measure.id),
        );
        hourlyEntries.forEach((entry, index) => {
          const twin = ddEntries[index];
          if (!twin) throw new Error('the plans differ in length');
          const relative = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));
          expect(
            relative(entry.step.saved.heatingLoadBtu, twin.step.saved.heatingLoadBtu),
          ).toBeLessThan(1e-9);
          expect(
            relative(entry.step.saved.coolingLoadBtu, twin.step.saved.coolingLoadBtu),
          ).toBeLessThan(1e-9);
          expect(entry.worth.annualSavingsUsd.toFixed(2)).toBe(
            twin.worth.annualSavingsUsd.toFixed(2),
          );
        });
        expect(reportOf(hourly).package.npvUsd).toBe(reportOf(degreeDays).package.npvUsd);
      });
    }
  }

  it('compares every step at a ratio of 1 with degree days', () => {
    const { climate, year } = CASES[0] as (typeof CASES)[number];
    const options = { weather: year };
    const hourly = evaluateHome({ ...homeWith('lblBasic', climate), hourlyWeather: {} }, options);
    const comparison = compareWithDegreeDays(hourly, options);
    expect(comparison.measures.length).toBeGreaterThan(0);
    for (const measure of comparison.measures) expect(measure.ratio).toBeCloseTo(1, 9);
    expect(comparison.hourly.testInHeatingCfm).toBeCloseTo(
      comparison.degreeDays.testInHeatingCfm,
      9,
    );
    expect(comparison.reasons[0]).toMatch(/12,775 from the hours below the balance point of 65 °F/);
  });
});

describe('the package kernel of an hourly plan', () => {
  // A year that swings: the season's means no longer stand for the hours.
  const swinging: WeatherYear = {
    name: 'Swinging',
    elevationFt: 0,
    outdoorF: Float64Array.from(
      { length: HOURS },
      (_, hour) =>
        50 - 35 * Math.cos((2 * Math.PI * hour) / HOURS) + 8 * Math.sin((2 * Math.PI * hour) / 24),
    ),
    windMph: Float64Array.from(
      { length: HOURS },
      (_, hour) => 6 + 5 * Math.abs(Math.sin(hour / 37)),
    ),
    humidityRatio: Float64Array.from(
      { length: HOURS },
      (_, hour) => 0.004 + (0.012 * (1 - Math.cos((2 * Math.PI * hour) / HOURS))) / 2,
    ),
  };

  for (const method of METHODS) {
    it(`equals the exact plan at the likely point (${method})`, () => {
      const evaluation = evaluateHome(
        { ...homeWith(method, COLD_CLIMATE), hourlyWeather: { heatingBalancePointF: 60 } },
        { weather: swinging },
      );
      const report = reportOf(evaluation).package;
      const kernel = compilePackageKernel(evaluation);
      const figures = kernel.evaluate(
        Float64Array.from(kernel.ranges, (range) => range.likely),
        kernel.baseConditions,
        emptyFigures(),
      );
      // The report rounds each step's money to the cent.
      const cents = 0.005 * (kernel.measureIds.length + 1) + 1e-9;
      expect(figures.cfm50After).toBeCloseTo(report.cfm50After, 9);
      expect(Math.abs(figures.annualSavingsUsd - report.annualSavingsUsd)).toBeLessThan(cents);
      expect(Math.abs(figures.npvUsd - report.npvUsd)).toBeLessThan(2 * cents);
    });
  }

  it('states the hours in the report and weighs them apart from degree days', () => {
    const options = { weather: swinging };
    const evaluation = evaluateHome(
      { ...homeWith('aim2', COLD_CLIMATE), hourlyWeather: { heatingBalancePointF: 60 } },
      options,
    );
    const source = reportOf(evaluation).climateSource;
    expect(source).toMatchObject({
      kind: 'hourly',
      name: 'Swinging',
      hours: HOURS,
      heatingBalancePointF: 60,
    });
    // Σ(60 − T)⁺/24 of the year, summed here apart from the engine.
    let degreeHours = 0;
    for (const outdoorF of swinging.outdoorF) degreeHours += Math.max(0, 60 - outdoorF);
    expect(source.heatingDegreeDaysF).toBeCloseTo(degreeHours / 24, 9);
    const comparison = compareWithDegreeDays(evaluation, options);
    expect(comparison.measures.some((measure) => Math.abs((measure.ratio ?? 1) - 1) > 0.01)).toBe(
      true,
    );
  });
});

describe('a home that asks for hours', () => {
  it('is refused without a weather year, naming hourlyWeather', () => {
    expectInputError(
      () => evaluateHome({ ...homeWith('lblBasic', COLD_CLIMATE), hourlyWeather: {} }),
      'hourlyWeather',
      /has no weather year/,
    );
  });

  it('is refused with a balance point out of range', () => {
    expectInputError(
      () =>
        evaluateHome(
          { ...homeWith('lblBasic', COLD_CLIMATE), hourlyWeather: { heatingBalancePointF: 120 } },
          { weather: constantYear(30, 5, 0.002) },
        ),
      'hourlyWeather.heatingBalancePointF',
      /80/,
    );
  });
});
