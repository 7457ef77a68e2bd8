/**
 * Homes planned hour by hour through the channels, on a real project file: a climate made
 * from a weather file keeps its hours, a home on that climate with `hourlyWeather` is planned
 * on them (the report says so, and its degree days are the hours' own), the page gets the
 * same year to run the ranges in its worker, and a home file can be planned on a weather
 * file's text. The expected degree days are summed here from the generated year, apart from
 * the engine (Σ (65 − T)⁺ / 24 over the hours, the hourly definition of ASHRAE HoF's energy
 * estimating chapter).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callChannel, type ChannelName } from '../../electron/channels.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { tmy3Year } from '../_lib/weather-files.ts';
import { openChannelProject, valueOf, type ChannelProject } from './_lib/channel-project.ts';
import { baseHomeInput } from './_lib/channel-requests.ts';

let project: ChannelProject;

beforeAll(() => {
  project = openChannelProject('sealwork-hourly-');
});
afterAll(() => project.close());

const call = <Name extends ChannelName>(name: Name, request: unknown) =>
  valueOf(callChannel(project.context, name, request));

/** A year whose daily mean swings from −2 °C to 26 °C and back (hours vary about it). */
const dailyMeanC = (day: number) => 12 - 14 * Math.cos((2 * Math.PI * (day - 15)) / 365);
const TEXT = tmy3Year(dailyMeanC);

/** Σ (base − T)⁺ / 24 over the file's hourly dry-bulbs, °F·day, read from the text itself. */
function hourlyDegreeDaysF(text: string, baseF: number): number {
  const [, header = '', ...rows] = text.trim().split('\n');
  const column = header.split(',').indexOf('Dry-bulb (C)');
  let degreeHours = 0;
  for (const row of rows) {
    const celsius = Number(row.split(',')[column]);
    degreeHours += Math.max(0, baseF - (celsius * 9) / 5 - 32);
  }
  return degreeHours / 24;
}

function hourlyHome(climateId: number, hourlyWeather: Record<string, number> | undefined): number {
  const input = baseHomeInput(null);
  const homeId = call('homes.create', {
    ...input,
    name: 'Hour-by-hour house',
    climateId,
    data: {
      ...input.data,
      infiltrationMethod: 'lblBasic',
      ...(hourlyWeather === undefined ? {} : { hourlyWeather }),
    },
  }).id;
  call('tests.add', { homeId, test: { kind: 'testIn', cfm50: 3400 } });
  call('measures.add', {
    homeId,
    measure: {
      id: 'attic-1',
      type: 'attic-top-plates',
      reductionCfm50: { low: 200, likely: 320, high: 450 },
      cost: { materialsUsd: 90, laborHours: 6, laborRateUsdPerHour: 55 },
    },
  });
  return homeId;
}

describe('a stored home planned hour by hour', () => {
  let climateId: number;

  it('is planned on its climate’s hours, at its balance point', () => {
    climateId = call('climates.importWeather', { text: TEXT, name: 'Generated swing year' }).id;
    const homeId = hourlyHome(climateId, { heatingBalancePointF: 60 });
    const report = call('plan.evaluate', { homeId });
    expect(report.climateSource).toMatchObject({
      kind: 'hourly',
      hours: 8760,
      heatingBalancePointF: 60,
      coolingBalancePointF: 65,
    });
    expect(report.climateSource.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 60), 6);
    expect(report.package.annualSavingsUsd).toBeGreaterThan(0);
  });

  it('gives the page the same year, and the plan beside degree days', () => {
    const homeId = hourlyHome(climateId, {});
    const year = call('climates.weatherYearOfHome', { homeId });
    expect(year).not.toBeNull();
    expect(year?.outdoorF).toHaveLength(8760);
    const compared = call('plan.compareDegreeDays', { homeId });
    expect(compared?.hourly.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 65), 6);
    expect(compared?.measures.map((measure) => measure.measureId)).toEqual(['attic-1']);
    expect(compared?.reasons.length).toBeGreaterThanOrEqual(3);
  });

  it('is refused, naming hourlyWeather, when its climate has no hours', () => {
    const figures = call('climates.save', {
      name: 'Typed-in climate',
      data: (validBaseHome() as { climate: unknown }).climate,
    }).id;
    const homeId = hourlyHome(figures, {});
    const outcome = callChannel(project.context, 'plan.evaluate', { homeId });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.error.message).toMatch(/hourlyWeather: .*no weather year/);
    expect(call('climates.weatherYearOfHome', { homeId })).toBeNull();
  });

  it('has nothing to compare when planned on degree days', () => {
    const homeId = hourlyHome(climateId, undefined);
    expect(call('plan.evaluate', { homeId }).climateSource.kind).toBe('degreeDays');
    expect(call('climates.weatherYearOfHome', { homeId })).toBeNull();
    expect(call('plan.compareDegreeDays', { homeId })).toBeNull();
  });
});

describe('a home file planned on a weather file’s text', () => {
  it('is planned hour by hour on that year', () => {
    const report = call('homeFile.evaluate', { file: validBaseHome(), weatherText: TEXT });
    expect(report.climateSource.kind).toBe('hourly');
    expect(report.climateSource.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 65), 6);
  });

  it('names the line of a broken weather file', () => {
    const broken = TEXT.split('\n').slice(0, 40).join('\n');
    const outcome = callChannel(project.context, 'homeFile.evaluate', {
      file: validBaseHome(),
      weatherText: broken,
    });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.error.message).toMatch(/weatherText/);
  });
});
