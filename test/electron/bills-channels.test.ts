/**
 * The bills channels on a real project file: a home's bills and daily means imported from
 * CSV (all rows or none, problems by line and column), the degree-day fits before and after
 * the work, and the measured savings beside the plan's estimate.
 *
 * The bills are made in the test from a known house (test/_lib/billing-files.ts: base
 * temperature τ, base load α, slope β; use = α·days + β·Σ max(0, τ − t̄), Fels 1986, "PRISM:
 * an introduction"), so on noise-free bills the fits must give back τ, α and β, R² = 1 and
 * CV(RMSE) = NMBE = 0 (ASHRAE Guideline 14-2014 definitions), and the normalized annual use
 * NAC = 365·α + β·DD_normal(τ) with DD_normal summed here from the calendar-day means.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { detectAndParseWeather, type HourlyWeather } from '../../core/weather.ts';
import { weatherYearOfClimate } from '../../db/repositories/weather-years.ts';
import { callChannel, type ChannelName } from '../../electron/channels.ts';
import {
  billingScenario,
  billsCsv,
  dayOfIso,
  isoOfDay,
  modelUse,
  normalDegreeDaysF,
  temperaturesCsv,
  type KnownHouse,
  type MadeUpBill,
} from '../_lib/billing-files.ts';
import { tmy3Year } from '../_lib/weather-files.ts';
import {
  addKnownRows,
  openChannelProject,
  valueOf,
  type ChannelProject,
} from './_lib/channel-project.ts';
import { baseHomeInput, type KnownIds } from './_lib/channel-requests.ts';

let project: ChannelProject;
let ids: KnownIds;

beforeAll(() => {
  project = openChannelProject('sealwork-bills-');
  ids = addKnownRows(project.context);
});
afterAll(() => project.close());

const call = <Name extends ChannelName>(name: Name, request: unknown) =>
  valueOf(callChannel(project.context, name, request));

/** τ is searched to 1e-6 °F (core/billing/prism.ts), so figures agree to about this share. */
const RELATIVE = 1e-6;

function expectNear(actual: number, expected: number, what: string): void {
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(
    RELATIVE * Math.max(1, Math.abs(expected)),
  );
}

function newHome(name: string): number {
  return call('homes.create', { ...baseHomeInput(null), name }).id;
}

describe('bills from CSV with the home’s own daily means', () => {
  const scenario = billingScenario();

  it('fits τ, α and β before and after, and the savings against the plan’s estimate', () => {
    const homeId = ids.homeId;
    expect(call('bills.import', { homeId, csv: billsCsv(scenario.bills) })).toEqual({
      count: 24,
      fuels: ['naturalGas'],
      problems: [],
    });
    expect(
      call('bills.importTemperatures', { homeId, csv: temperaturesCsv(scenario.temperatures) }),
    ).toEqual({ days: 760, problems: [] });
    const listed = call('bills.list', { homeId });
    expect(listed.bills).toHaveLength(24);
    expect(listed.temperatures).toEqual({ days: 760, first: '2023-01-01', last: '2025-01-29' });
    expect(listed.weatherYear).toBeNull();

    const analysis = call('bills.analyse', { homeId, workDone: scenario.workDone });
    expect(analysis).toMatchObject({
      fuel: 'naturalGas',
      kind: 'heating',
      temperatureSource: 'stored',
      normalYearSource: 'series',
      spanningBills: 0,
    });
    const nac = (house: KnownHouse) =>
      365 * house.baseLoadPerDay +
      house.usePerDegreeDay * normalDegreeDaysF(scenario.temperatures, house.baseTempF);
    for (const [fit, house] of [
      [analysis.pre, scenario.before],
      [analysis.post, scenario.after],
    ] as const) {
      expect(fit.billCount).toBe(12);
      expectNear(fit.baseTempF, house.baseTempF, 'τ');
      expectNear(fit.baseLoadPerDay, house.baseLoadPerDay, 'α');
      expectNear(fit.usePerDegreeDay, house.usePerDegreeDay, 'β');
      expectNear(fit.rSquared ?? 0, 1, 'R²');
      expect(Math.abs(fit.cvRmse)).toBeLessThan(1e-6);
      expect(Math.abs(fit.nmbe)).toBeLessThan(1e-6);
      expectNear(fit.normalizedAnnualUse, nac(house), 'NAC');
      expect(fit.warnings).toEqual([]);
    }
    expectNear(
      analysis.savings.savingsPerYear,
      nac(scenario.before) - nac(scenario.after),
      'saved',
    );
    // The estimate is the plan's own package for the heating fuel, as plan.evaluate shows it.
    const plan = call('plan.evaluate', { homeId });
    const estimated = plan.package.annualSavings.heatingFuelUnits;
    expect(analysis.estimate.perYear).toBe(estimated);
    expect(analysis.savings.estimatedSavingsPerYear).toBe(estimated);
    expectNear(
      analysis.savings.realizationRate ?? 0,
      (nac(scenario.before) - nac(scenario.after)) / estimated,
      'realization rate',
    );
  });

  it('warns in plain words when the bills after the work are too few to trust', () => {
    const homeId = newHome('Few bills after');
    const few = billingScenario(6);
    call('bills.import', { homeId, csv: billsCsv(few.bills) });
    call('bills.importTemperatures', { homeId, csv: temperaturesCsv(few.temperatures) });
    const analysis = call('bills.analyse', { homeId, workDone: few.workDone });
    expect(analysis.post.warnings.map((warning) => warning.code)).toEqual(['few-bills']);
    expect(analysis.savings.warnings).toContainEqual(
      expect.objectContaining({ from: 'post', code: 'few-bills' }),
    );
  });

  it('refuses a bills file with problems by line and column, storing none of it', () => {
    const homeId = newHome('Bad bills file');
    // Line 2 is whole; the others break the rules of core/billing/bills-csv.ts one way each.
    const csv = [
      'periodStart,periodEnd,use,fuel',
      '2024-01-05,2024-02-04,120.5,naturalGas',
      '2024-02-04,2024-02-01,1,200,naturalGas',
      '2024-03-05,2024-04-04,lots,naturalGas',
      '2024-04-04,2024-05-04,12,coal',
    ].join('\n');
    const reply = call('bills.import', { homeId, csv });
    expect(reply.count).toBe(0);
    expect(reply.problems.map(({ line, column }) => `${line}:${column}`)).toEqual([
      '3:',
      '3:periodEnd',
      '3:fuel',
      '4:use',
      '5:fuel',
    ]);
    expect(call('bills.list', { homeId }).bills).toEqual([]);
  });

  it('says which field is missing when there is nothing to fit', () => {
    const homeId = newHome('No bills yet');
    const reply = callChannel(project.context, 'bills.analyse', { homeId, workDone: '2024-01-01' });
    expect(reply.ok ? null : { kind: reply.error.kind, field: reply.error.field }).toEqual({
      kind: 'invalid',
      field: 'homeId',
    });
    const scenario4 = billingScenario(3);
    call('bills.import', { homeId, csv: billsCsv(scenario4.bills) });
    call('bills.importTemperatures', { homeId, csv: temperaturesCsv(scenario4.temperatures) });
    const tooFew = callChannel(project.context, 'bills.analyse', {
      homeId,
      workDone: scenario4.workDone,
    });
    expect(tooFew.ok ? null : tooFew.error.field).toBe('after.bills');
    // This home's climate is its own figures: there is no weather year to take days from.
    const noYear = callChannel(project.context, 'bills.analyse', {
      homeId,
      workDone: scenario4.workDone,
      temperatures: 'weatherYear',
    });
    expect(noYear.ok ? null : noYear.error.field).toBe('temperatures');
    const missing = callChannel(project.context, 'bills.list', { homeId: 99_999 });
    expect(missing.ok ? null : { kind: missing.error.kind, field: missing.error.field }).toEqual({
      kind: 'notFound',
      field: 'homeId',
    });
  });

  it('clears bills and temperatures, and a duplicated home keeps its bills', () => {
    const homeId = newHome('To be copied');
    call('tests.add', { homeId, test: { kind: 'testIn', cfm50: 3100 } });
    call('bills.import', { homeId, csv: billsCsv(scenario.bills) });
    call('bills.importTemperatures', { homeId, csv: temperaturesCsv(scenario.temperatures) });
    const copy = call('homes.duplicate', { id: homeId, name: 'The copy' }).id;
    expect(call('bills.list', { homeId: copy }).bills).toHaveLength(24);
    expect(call('bills.list', { homeId: copy }).temperatures.days).toBe(760);
    expect(call('bills.clear', { homeId, temperatures: true })).toEqual({ bills: 24, days: 760 });
    expect(call('bills.list', { homeId }).bills).toEqual([]);
    expect(call('bills.list', { homeId: copy }).bills).toHaveLength(24);
  });
});

describe('bills with the daily means of the climate’s stored weather year', () => {
  /** A made-up year: each day's dry-bulb (°C, one decimal) on a yearly wave. */
  const dryBulbCOfDay = (day: number) =>
    Math.round((8 - 14 * Math.cos((2 * Math.PI * (day - 10)) / 365)) * 10) / 10;
  const text = tmy3Year(dryBulbCOfDay);

  /** The °F of a date's month and day in that year (every hour of a day is the same). */
  function meanTempFOfDate(dayNumber: number): number {
    const date = isoOfDay(dayNumber);
    const dayOfYear = (dayOfIso(`2023${date.slice(4)}`) - dayOfIso('2023-01-01')) | 0;
    return dryBulbCOfDay(dayOfYear) * 1.8 + 32;
  }

  function billsOf(house: KnownHouse, firstRead: string, count: number): MadeUpBill[] {
    const start = dayOfIso(firstRead);
    return Array.from({ length: count }, (_, index) => ({
      periodStart: isoOfDay(start + index * 30),
      periodEnd: isoOfDay(start + (index + 1) * 30),
      use: modelUse(house, meanTempFOfDate, start + index * 30, start + (index + 1) * 30),
      fuel: 'naturalGas',
    }));
  }

  it('stores the hours with the climate, exactly as parsed', () => {
    const { id } = call('climates.importWeather', { text, name: 'Made-up year' });
    const stored: HourlyWeather | null = project.store.read((read) =>
      weatherYearOfClimate(read, id),
    );
    expect(stored).toStrictEqual(detectAndParseWeather(text));
  });

  it('fits bills on that year’s days and normalizes to that year', () => {
    const climate = call('climates.importWeather', { text, name: 'Made-up year for bills' });
    const input = { ...baseHomeInput(null), name: 'Weather-year house', climateId: climate.id };
    const homeId = call('homes.create', input).id;
    const before = { baseTempF: 60, baseLoadPerDay: 1.2, usePerDegreeDay: 0.18 };
    const after = { baseTempF: 57, baseLoadPerDay: 1.1, usePerDegreeDay: 0.13 };
    const bills = [...billsOf(before, '2022-01-03', 12), ...billsOf(after, '2023-01-08', 12)];
    call('bills.import', { homeId, csv: billsCsv(bills) });
    expect(call('bills.list', { homeId }).weatherYear).toMatchObject({
      hourCount: 8760,
      format: 'tmy3',
    });
    const analysis = call('bills.analyse', { homeId, workDone: '2023-01-01' });
    expect(analysis).toMatchObject({
      temperatureSource: 'weatherYear',
      normalYearSource: 'weatherYear',
    });
    const normalDd = (baseF: number) =>
      Array.from({ length: 365 }, (_, day) =>
        Math.max(0, baseF - (dryBulbCOfDay(day) * 1.8 + 32)),
      ).reduce((sum, value) => sum + value, 0);
    for (const [fit, house] of [
      [analysis.pre, before],
      [analysis.post, after],
    ] as const) {
      expectNear(fit.baseTempF, house.baseTempF, 'τ');
      expectNear(fit.usePerDegreeDay, house.usePerDegreeDay, 'β');
      expectNear(
        fit.normalizedAnnualUse,
        365 * house.baseLoadPerDay + house.usePerDegreeDay * normalDd(house.baseTempF),
        'NAC',
      );
    }
  });
});
