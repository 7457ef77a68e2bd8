/**
 * An hourly home through the homeFile channels, as the Homes screen's "Save as a home file"
 * and the command line use them: homeFile.export (and exportBundle) write the climate's
 * weather year into the file, homeFile.import in another project stores it again, and there
 * plan.evaluate and plan.compareDegreeDays give the same figures as where the home was made;
 * homeFile.evaluate plans the file on the year it carries. A broken year is refused naming
 * the field.
 *
 * Checked against: the degree days summed from the generated TMY3 text itself (Σ (65 − T)⁺
 * / 24 over its hours, the hourly definition of ASHRAE HoF's energy estimating chapter); the
 * rest sets one project's figures beside the other's.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { callChannel, type ChannelName } from '../../electron/channels.ts';
import { homeFileText } from '../../core/weather/home-file-text.ts';
import { setAt, type JsonObject } from '../_lib/base-home.ts';
import { hourlyDegreeDaysF, hourlyYearText } from '../_lib/hourly-home.ts';
import { openChannelProject, valueOf, type ChannelProject } from './_lib/channel-project.ts';
import { baseHomeInput } from './_lib/channel-requests.ts';

const TEXT = hourlyYearText();

let origin: ChannelProject;
let elsewhere: ChannelProject;
let homeId: number;

const call = <Name extends ChannelName>(project: ChannelProject, name: Name, request: unknown) =>
  valueOf(callChannel(project.context, name, request));

/** An hourly home made as the screens make one: a climate from the weather file, then the home. */
function makeHourlyHome(project: ChannelProject): number {
  const climateId = call(project, 'climates.importWeather', {
    text: TEXT,
    name: 'Generated swing year',
  }).id;
  const input = baseHomeInput(null);
  const id = call(project, 'homes.create', {
    ...input,
    name: 'Hour-by-hour house',
    climateId,
    data: { ...input.data, infiltrationMethod: 'lblBasic', hourlyWeather: {} },
  }).id;
  call(project, 'tests.add', { homeId: id, test: { kind: 'testIn', cfm50: 3400 } });
  call(project, 'measures.add', {
    homeId: id,
    measure: {
      id: 'attic-1',
      type: 'attic-top-plates',
      reductionCfm50: { low: 200, likely: 320, high: 450 },
      cost: { materialsUsd: 90, laborHours: 6, laborRateUsdPerHour: 55 },
    },
  });
  return id;
}

/** What a file saved on one machine reads as on another: its text, parsed. */
const throughText = (value: unknown) => JSON.parse(homeFileText(value)) as JsonObject;

beforeAll(() => {
  origin = openChannelProject('sealwork-hourly-file-a-');
  elsewhere = openChannelProject('sealwork-hourly-file-b-');
  homeId = makeHourlyHome(origin);
});
afterAll(() => {
  origin.close();
  elsewhere.close();
});

describe('an hourly home saved as a home file and opened in another project', () => {
  it('is planned there to exactly the same figures', () => {
    const file = throughText(call(origin, 'homeFile.export', { id: homeId }));
    const imported = call(elsewhere, 'homeFile.import', { file }).id;
    const before = call(origin, 'plan.evaluate', { homeId });
    const after = call(elsewhere, 'plan.evaluate', { homeId: imported });
    expect(after).toEqual(before);
    expect(after.climateSource).toMatchObject({ kind: 'hourly', hours: 8760 });
    expect(after.climateSource.heatingDegreeDaysF).toBeCloseTo(hourlyDegreeDaysF(TEXT, 65), 6);
    expect(call(elsewhere, 'plan.compareDegreeDays', { homeId: imported })).toEqual(
      call(origin, 'plan.compareDegreeDays', { homeId }),
    );
    expect(call(elsewhere, 'climates.weatherYearOfHome', { homeId: imported })).toEqual(
      call(origin, 'climates.weatherYearOfHome', { homeId }),
    );
  });

  it('with its photos (the bundle) likewise', () => {
    const bundle = throughText(call(origin, 'homeFile.exportBundle', { id: homeId }));
    expect((bundle.file as JsonObject).weatherYear).toBeDefined();
    const imported = call(elsewhere, 'homeFile.import', { file: bundle }).id;
    expect(call(elsewhere, 'plan.evaluate', { homeId: imported })).toEqual(
      call(origin, 'plan.evaluate', { homeId }),
    );
  });

  it('is planned on the year it carries when evaluated as a file', () => {
    const file = throughText(call(origin, 'homeFile.export', { id: homeId }));
    expect(call(elsewhere, 'homeFile.evaluate', { file })).toEqual(
      call(origin, 'plan.evaluate', { homeId }),
    );
  });

  it('is refused naming the field when its year is broken, and nothing is stored', () => {
    const file = throughText(call(origin, 'homeFile.export', { id: homeId }));
    setAt(file, 'weatherYear.hours.pressurePa[10]', 5);
    const homesBefore = call(elsewhere, 'homes.list', {}).length;
    const climatesBefore = call(elsewhere, 'climates.list', {}).length;
    const reply = callChannel(elsewhere.context, 'homeFile.import', { file });
    expect(reply.ok).toBe(false);
    if (!reply.ok) {
      expect(reply.error.field).toBe('weatherYear.hours.pressurePa[10]');
      expect(reply.error.message).toMatch(/from 31000 to 120000 Pa, got 5/);
    }
    expect(call(elsewhere, 'homes.list', {}).length).toBe(homesBefore);
    expect(call(elsewhere, 'climates.list', {}).length).toBe(climatesBefore);
  });

  it('made a copy of in its own project keeps its year: the same figures, no new climate', () => {
    const climatesBefore = call(origin, 'climates.list', {}).length;
    const copy = call(origin, 'homes.duplicate', { id: homeId, name: 'Hour-by-hour copy' }).id;
    const original = call(origin, 'plan.evaluate', { homeId });
    expect(call(origin, 'plan.evaluate', { homeId: copy })).toEqual({
      ...original,
      name: 'Hour-by-hour copy',
    });
    expect(call(origin, 'climates.list', {}).length).toBe(climatesBefore);
  });
});
