/**
 * The House section's drafting rules, checked with plain data. Unit factors are the exact
 * ones of NIST SP 811 (2008), appendix B: 1 ft = 0.3048 m, 1 ft² = 0.09290304 m², and a
 * temperature difference of 1 °F = 5/9 K; 1 mph = 0.44704 m/s.
 */
import { describe, expect, it } from 'vitest';
import type { HomeData } from '../../core/schema.ts';
import {
  CLIMATE_FIELDS,
  EQUIPMENT_FIELDS,
  HOUSE_DATA_FIELDS,
  priceFields,
  SITE_SAFETY_FIELDS,
  type DataFieldSpec,
} from '../../ui/data-fields.ts';
import { draftPart, listWords, messageInShownUnits, storedText } from '../../ui/data-edit.ts';
import { parseNumber, sentence } from '../../ui/text.ts';

const PRICE_FIELDS = priceFields((fuel) => (fuel === 'electricity' ? 'kWh' : 'therm'));
const ALL = [
  ...HOUSE_DATA_FIELDS,
  ...CLIMATE_FIELDS,
  ...EQUIPMENT_FIELDS,
  ...PRICE_FIELDS,
  ...SITE_SAFETY_FIELDS,
];

function spec(id: string): DataFieldSpec {
  const found = ALL.find((field) => field.id === id);
  if (found === undefined) throw new Error(`no field ${id}`);
  return found;
}

const HOUSE: NonNullable<HomeData['house']> = {
  conditionedFloorAreaFt2: 1500,
  conditionedVolumeFt3: 12_000,
  stories: 1,
  heightFt: 10,
  bedrooms: 3,
  shelterClass: 3,
  foundation: 'basement',
  yearBuilt: 1950,
};

describe('numbers as typed', () => {
  it('reads digits with thousands separators and refuses anything else', () => {
    expect(parseNumber('1,850')).toBe(1850);
    expect(parseNumber(' 7.5 ')).toBe(7.5);
    expect(parseNumber('.5')).toBe(0.5);
    expect(parseNumber('12 ft')).toBeNull();
    expect(parseNumber('')).toBeNull();
    expect(parseNumber('1e3')).toBeNull();
  });
});

describe('drafting one part of a home', () => {
  it('stores a value typed in SI in the stored IP unit (NIST SP 811: 1 ft² = 0.09290304 m²)', () => {
    const draft = draftPart(
      { house: HOUSE },
      ALL,
      { 'house-conditionedFloorAreaFt2': '100' },
      'house',
      'SI',
    );
    expect(draft.errors).toEqual({});
    expect(draft.data.house?.conditionedFloorAreaFt2).toBeCloseTo(100 / 0.09290304, 9);
    // The rest of the house is as it was.
    expect({ ...draft.data.house, conditionedFloorAreaFt2: 1500 }).toEqual(HOUSE);
  });

  it('shows the stored value back in SI (1 ft = 0.3048 m)', () => {
    expect(storedText(spec('house-heightFt'), { house: HOUSE }, 'SI')).toBe('3.05');
    expect(storedText(spec('house-heightFt'), { house: HOUSE }, 'IP')).toBe('10');
  });

  it('takes percentages and stores fractions', () => {
    const data: HomeData = {
      heating: { fuel: 'naturalGas', equipment: 'furnace', efficiency: 0.8 },
    };
    expect(storedText(spec('heating-afue'), data, 'IP')).toBe('80');
    const draft = draftPart(data, ALL, { 'heating-afue': '92.5' }, 'heating', 'IP');
    expect(draft.data.heating?.efficiency).toBeCloseTo(0.925, 12);
  });

  it('refuses text where a number belongs, and blank where a figure is needed', () => {
    const draft = draftPart(
      { house: HOUSE },
      ALL,
      { 'house-bedrooms': 'three', 'house-stories': '' },
      'house',
      'IP',
    );
    expect(Object.keys(draft.errors).sort()).toEqual(['house-bedrooms', 'house-stories']);
    expect(draft.data.house).toEqual(HOUSE);
  });

  it('lets a new climate wait until its required figures are all there', () => {
    const first = draftPart({}, ALL, { 'climate-hdd': '5200' }, 'climate', 'IP');
    expect(first.missing).toEqual(['Weather station or place', 'Cooling degree days', 'Elevation']);
    const whole = draftPart(
      {},
      ALL,
      {
        'climate-hdd': '5200',
        'climate-name': 'Test station',
        'climate-cdd': '900',
        'climate-elevation': '300',
      },
      'climate',
      'SI',
    );
    expect(whole.missing).toEqual([]);
    // 5200 K·day is 5200 × 9/5 °F·day; 300 m is 300 / 0.3048 ft.
    expect(whole.data.climate?.hdd65F).toBeCloseTo(5200 * 1.8, 9);
    expect(whole.data.climate?.elevationFt).toBeCloseTo(300 / 0.3048, 9);
  });

  it('asks for both figures of a heating season once one is given', () => {
    const climate = { name: 'x', hdd65F: 5000, cdd65F: 800, elevationFt: 100 };
    const draft = draftPart({ climate }, ALL, { 'climate-heating-wind': '5' }, 'climate', 'SI');
    expect(draft.missing).toEqual(['Heating season: mean indoor − outdoor']);
    const both = draftPart(
      { climate },
      ALL,
      { 'climate-heating-wind': '5', 'climate-heating-delta': '20' },
      'climate',
      'SI',
    );
    expect(both.data.climate?.heatingSeason?.meanWindSpeedMph).toBeCloseTo(5 / 0.44704, 9);
    expect(both.data.climate?.heatingSeason?.meanDeltaTF).toBeCloseTo(36, 9);
  });

  it('removes an optional value left blank, and a fuel’s whole price when its price is blank', () => {
    const data: HomeData = {
      climate: { name: 'x', hdd65F: 5000, cdd65F: 800, elevationFt: 100, nFactorZone: 2 },
      prices: { propane: { usdPerUnit: 2.5, escalationRateReal: 0.01 } },
    };
    const zone = draftPart(data, ALL, { 'climate-zone': '' }, 'climate', 'IP');
    expect(zone.data.climate).toEqual({ name: 'x', hdd65F: 5000, cdd65F: 800, elevationFt: 100 });
    const price = draftPart(data, ALL, { 'price-propane': ' ' }, 'prices.propane', 'IP');
    expect(price.data.prices).toEqual({});
  });

  it('keeps parts apart: a refused house figure never holds back a price', () => {
    const draft = draftPart(
      { house: HOUSE },
      ALL,
      { 'house-bedrooms': 'many', 'price-naturalGas': '1.45' },
      'prices.naturalGas',
      'IP',
    );
    expect(draft.errors).toEqual({});
    expect(draft.data.prices).toEqual({ naturalGas: { usdPerUnit: 1.45 } });
    expect(draft.data.house).toEqual(HOUSE);
  });

  it('turns cooling off and on, asking for the SEER of a new air conditioner', () => {
    const withAc: HomeData = { cooling: { seer: 14 } };
    const off = draftPart(withAc, ALL, { 'cooling-presence': 'none' }, 'cooling', 'IP');
    expect(off.data.cooling).toBeNull();
    const on = draftPart(
      { cooling: null },
      ALL,
      { 'cooling-presence': 'present' },
      'cooling',
      'IP',
    );
    expect(on.missing).toEqual(['SEER']);
    const whole = draftPart(
      { cooling: null },
      ALL,
      { 'cooling-presence': 'present', 'cooling-seer': '16' },
      'cooling',
      'IP',
    );
    expect(whole.data.cooling).toEqual({ seer: 16 });
  });

  it('asks for the efficiency the chosen equipment is rated by', () => {
    const draft = draftPart(
      {},
      ALL,
      { 'heating-equipment': 'heatPump', 'heating-fuel': 'electricity' },
      'heating',
      'IP',
    );
    expect(draft.missing).toEqual(['HSPF']);
  });
});

describe('what was seen at the house', () => {
  it('reads a hazard not recorded as not seen, and stores yes and no as flags', () => {
    expect(storedText(spec('house-knob-and-tube'), { house: HOUSE }, 'IP')).toBe('no');
    const seen = draftPart({ house: HOUSE }, ALL, { 'house-knob-and-tube': 'yes' }, 'house', 'IP');
    expect(seen.data.house).toEqual({ ...HOUSE, knobAndTubeWiring: true });
    const cleared = draftPart(seen.data, ALL, { 'house-knob-and-tube': 'no' }, 'house', 'IP');
    expect(cleared.data.house?.knobAndTubeWiring).toBe(false);
  });

  it('starts a ventilation part from one figure, all of its fields being optional', () => {
    const draft = draftPart({}, ALL, { 'ventilation-existing': '20' }, 'ventilation', 'SI');
    expect(draft.missing).toEqual([]);
    // 20 L/s = 20 / (0.3048³ × 1000 / 60) cfm (NIST SP 811: 1 ft = 0.3048 m).
    expect(draft.data.ventilation?.existingFanCfm).toBeCloseTo(20 / ((0.3048 ** 3 * 1000) / 60), 9);
  });
});

describe('refusals in the units the field is typed in', () => {
  it('converts the store’s bounds and the given value (1 ft = 0.3048 m)', () => {
    const message = 'expected a number of at most 15000, got 20000';
    expect(messageInShownUnits(message, spec('climate-elevation'), 'SI')).toBe(
      'expected a number of at most 4,572 m, got 6,096 m',
    );
    expect(messageInShownUnits(message, spec('climate-elevation'), 'IP')).toBe(
      'expected a number of at most 15,000 ft, got 20,000 ft',
    );
  });

  it('states fractions as percentages', () => {
    expect(
      messageInShownUnits(
        'expected a number of at least 0.3, got 0.2',
        spec('heating-distribution'),
        'IP',
      ),
    ).toBe('expected a number of at least 30 %, got 20 %');
  });

  it('leaves the words of other fields alone', () => {
    expect(messageInShownUnits('expected text, got 3', spec('climate-name'), 'SI')).toBe(
      'expected text, got 3',
    );
  });
});

describe('sentences from the store’s words', () => {
  it('capitalizes and ends with a full stop, once', () => {
    expect(sentence(' expected a number ')).toBe('Expected a number.');
    expect(sentence('Done!')).toBe('Done!');
  });
});

describe('lists in words', () => {
  it('joins with commas and a final "and"', () => {
    expect(listWords(['A'])).toBe('A');
    expect(listWords(['A', 'B'])).toBe('A and B');
    expect(listWords(['A', 'B', 'C'])).toBe('A, B and C');
  });
});
