/**
 * A plan's climate from hourly weather (core/weather/climate.ts), on weather made here whose
 * figures follow by hand: a year at 5 °C (41 °F) has 365 × (65 − 41) = 8,760 HDD65 and none
 * to cool; days alternating 5 °C and 30 °C (86 °F) have 183 × 24 HDD65 and 182 × 21 CDD65.
 * Wind 4.5 m/s = 4.5 / 0.44704 mph (NIST SP 811). Then the climate is used by a plan, and
 * stored through the `climates.importWeather` channel in a real SQLite file.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluateHome } from '../../core/evaluate.ts';
import { climateFromWeather, detectAndParseWeather } from '../../core/weather.ts';
import { openStore } from '../../db/store.ts';
import { callChannel } from '../../electron/channels.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { makeTempFolder } from '../_lib/cli-harness.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';
import { tmy3Year } from '../_lib/weather-files.ts';

const MPH = 4.5 / 0.44704;

describe('a climate from hourly weather', () => {
  it('gives the degree days and seasons a constant year has', () => {
    const climate = climateFromWeather(detectAndParseWeather(tmy3Year(() => 5)), 'Constant');
    expect(climate).toMatchObject({ name: 'Constant', hdd65F: 8760, cdd65F: 0, elevationFt: 3937 });
    expect(climate.heatingSeason?.meanDeltaTF).toBeCloseTo(27, 9);
    expect(climate.heatingSeason?.meanWindSpeedMph).toBeCloseTo(MPH, 9);
    expect(climate.coolingSeason).toBeUndefined();
  });

  it('splits a year of cold and hot days into a heating and a cooling season', () => {
    const weather = detectAndParseWeather(tmy3Year((day) => (day % 2 === 0 ? 5 : 30)));
    const climate = climateFromWeather(weather);
    expect(climate.name).toBe('TEST, GENERATED, ZZ');
    expect(climate.hdd65F).toBe(183 * 24);
    expect(climate.cdd65F).toBe(182 * 21);
    expect(climate.heatingSeason?.meanDeltaTF).toBeCloseTo(27, 9);
    expect(climate.coolingSeason?.meanDeltaTF).toBeCloseTo(11, 9);
    // The plan takes it as it takes a typed climate.
    const home = { ...validBaseHome(), climate: { ...climate, nFactorZone: 2 } };
    expect(evaluateHome(home).plan.package.cfm50Before).toBeGreaterThan(0);
  });

  it('refuses weather with no hour below 65 °F', () => {
    expectInputError(
      () => climateFromWeather(detectAndParseWeather(tmy3Year(() => 30))),
      'hours',
      /hours below 65 °F/,
    );
  });

  it('is stored through climates.importWeather', () => {
    const folder = makeTempFolder('sealwork-weather-climate-');
    const store = openStore(join(folder.path, 'project.db'));
    try {
      const reply = callChannel({ store }, 'climates.importWeather', {
        text: tmy3Year(() => 5),
        name: 'Imported constant',
      });
      expect(reply.ok).toBe(true);
      const listed = callChannel({ store }, 'climates.list', {});
      expect(listed.ok && listed.value.map((entry) => entry.name)).toEqual(['Imported constant']);
      const refused = callChannel({ store }, 'climates.importWeather', { text: 'not weather' });
      expect(refused.ok).toBe(false);
    } finally {
      store.close();
      folder.remove();
    }
  });
});
