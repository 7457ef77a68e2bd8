import { describe, expect, it } from 'vitest';
import { findMeasureType, MEASURE_LIBRARY, type MeasureType } from '../../core/measure-library.ts';
import { CAUTION_CODES } from '../../core/safety.ts';
import { LEAK_LOCATIONS } from '../../core/schema.ts';

const REQUIRED_IDS = [
  'attic-top-plates',
  'attic-chases',
  'attic-hatch',
  'attic-pull-down-stair',
  'recessed-lights',
  'plumbing-chase',
  'flue-chase',
  'kneewalls',
  'dropped-soffit',
  'rim-joist',
  'band-joist',
  'sill-plate',
  'plumbing-penetrations',
  'wiring-penetrations',
  'duct-boots',
  'exhaust-fan-vents',
  'dryer-vent',
  'door-weatherstrip',
  'window-sealing',
  'garage-house-wall',
  'fireplace-damper',
];

// The inch is exactly 2.54 cm and the foot exactly 0.3048 m (NIST SP 811); written out here
// rather than taken from core/constants.ts so the conversion is checked independently.
const CM2_PER_IN2 = 2.54 * 2.54;
const M_PER_FT = 0.3048;

function type(id: string): MeasureType {
  const found = findMeasureType(id);
  if (found === undefined) throw new Error(`missing measure type ${id}`);
  return found;
}

function sourceNotes(measure: MeasureType) {
  return Object.entries(measure.sources);
}

describe('measure library: shape', () => {
  it('has at least 18 types and every required id', () => {
    expect(MEASURE_LIBRARY.length).toBeGreaterThanOrEqual(18);
    const ids = MEASURE_LIBRARY.map((measure) => measure.id);
    for (const id of REQUIRED_IDS) expect(ids).toContain(id);
  });

  it('has unique kebab-case ids, found by findMeasureType', () => {
    const ids = MEASURE_LIBRARY.map((measure) => measure.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const measure of MEASURE_LIBRARY) {
      expect(measure.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
      expect(findMeasureType(measure.id)).toBe(measure);
    }
    expect(findMeasureType('no-such-measure')).toBeUndefined();
  });

  it('has a name, a description and a known location and unit for each type', () => {
    for (const measure of MEASURE_LIBRARY) {
      expect(measure.name.trim()).not.toBe('');
      expect(measure.description.trim().length).toBeGreaterThan(20);
      expect(LEAK_LOCATIONS).toContain(measure.location);
      expect(['each', 'linearFt', 'ft2', 'job']).toContain(measure.unit);
    }
  });

  it('orders every range low ≤ likely ≤ high, with no zero placeholder', () => {
    for (const measure of MEASURE_LIBRARY) {
      for (const range of [measure.leakageAreaIn2PerUnit, measure.sealingEffectiveness]) {
        expect(range.low, measure.id).toBeLessThanOrEqual(range.likely);
        expect(range.likely, measure.id).toBeLessThanOrEqual(range.high);
        expect(range.low, measure.id).toBeGreaterThan(0);
      }
    }
  });

  it('keeps sealing effectiveness within 0..1, short of 1', () => {
    // Common practice: no field sealing removes every bit of a leak.
    for (const measure of MEASURE_LIBRARY) {
      const { low, high } = measure.sealingEffectiveness;
      expect(low, measure.id).toBeGreaterThan(0);
      expect(high, measure.id).toBeLessThan(1);
    }
  });

  it('gives whole-year lives within 1..100 and nonzero demo costs', () => {
    for (const measure of MEASURE_LIBRARY) {
      expect(Number.isInteger(measure.defaultLifeYears), measure.id).toBe(true);
      expect(measure.defaultLifeYears).toBeGreaterThanOrEqual(1);
      expect(measure.defaultLifeYears).toBeLessThanOrEqual(100);
      expect(measure.defaultCost.materialsUsdPerUnit, measure.id).toBeGreaterThan(0);
      expect(measure.defaultCost.laborHoursPerUnit, measure.id).toBeGreaterThan(0);
    }
  });

  it('lists only caution codes the safety check defines', () => {
    for (const measure of MEASURE_LIBRARY) {
      for (const code of measure.cautionCodes) expect(CAUTION_CODES, measure.id).toContain(code);
      expect(new Set(measure.cautionCodes).size).toBe(measure.cautionCodes.length);
    }
  });
});

describe('measure library: sources', () => {
  it('gives every number a marked source note with a citation', () => {
    const marks = ['published', 'from memory', 'common practice', 'demo default'];
    for (const measure of MEASURE_LIBRARY) {
      for (const [field, note] of sourceNotes(measure)) {
        expect(marks, `${measure.id}.${field}`).toContain(note.mark);
        expect(note.citation.trim().length, `${measure.id}.${field}`).toBeGreaterThan(10);
      }
    }
  });

  it('names the source in every published citation', () => {
    for (const measure of MEASURE_LIBRARY) {
      for (const [field, note] of sourceNotes(measure)) {
        if (note.mark !== 'published') continue;
        expect(note.citation, `${measure.id}.${field}`).toMatch(
          /NIST|ASHRAE|EPA|CFR|Energy Options Northwest/,
        );
      }
    }
  });

  it('marks costs as demo defaults, never as facts', () => {
    for (const measure of MEASURE_LIBRARY) expect(measure.sources.cost.mark).toBe('demo default');
  });

  it('puts attic bypasses at the ceiling and the fireplace in the flue term', () => {
    // Common practice: attic bypasses are ceiling leaks; AIM-2's flue term is the open flue
    // (Walker & Wilson 1998).
    for (const measure of MEASURE_LIBRARY.filter((m) => m.group === 'atticBypass')) {
      expect(measure.location, measure.id).toBe('ceiling');
    }
    expect(type('fireplace-damper').location).toBe('flue');
  });
});

describe('measure library: published component sizes', () => {
  // NIST CONTAM residential library RESMISC (Appendix C2), ELA at 4 Pa: tight and typical
  // values per item, in cm². Our low is the tight value and our likely the typical one.
  const perItemCm2: [id: string, tightCm2: number, typicalCm2: number][] = [
    ['attic-hatch', 18, 30], // attic door
    ['door-weatherstrip', 12, 21], // exterior single door
    ['exhaust-fan-vents', 10, 20], // bathroom exhaust vent
    ['range-hood-damper', 5, 40], // kitchen exhaust vent
    ['duct-boots', 1, 5], // HVAC ceiling penetration
  ];
  it.each(perItemCm2)('%s matches the NIST library per item', (id, tightCm2, typicalCm2) => {
    const { low, likely } = type(id).leakageAreaIn2PerUnit;
    expect(low * CM2_PER_IN2).toBeCloseTo(tightCm2, 6);
    expect(likely * CM2_PER_IN2).toBeCloseTo(typicalCm2, 6);
  });

  // Same library, joints in cm² per metre.
  const perLengthCm2PerM: [id: string, tightCm2PerM: number, typicalCm2PerM: number][] = [
    ['attic-top-plates', 0.5, 1.5], // ceiling-wall joint
    ['baseboard-sealing', 0.8, 4], // floor-wall joint
  ];
  it.each(perLengthCm2PerM)(
    '%s matches the NIST library per metre of joint',
    (id, tightCm2PerM, typicalCm2PerM) => {
      const measure = type(id);
      expect(measure.unit).toBe('linearFt');
      const { low, likely } = measure.leakageAreaIn2PerUnit;
      expect((low * CM2_PER_IN2) / M_PER_FT).toBeCloseTo(tightCm2PerM, 6);
      expect((likely * CM2_PER_IN2) / M_PER_FT).toBeCloseTo(typicalCm2PerM, 6);
    },
  );

  it('sizes a closed fireplace damper at about 30 in²', () => {
    // Energy Options Northwest 1990 field study (closed dampers averaged about 30 in² ELA), as
    // reported by Battic Door; a secondary source.
    expect(type('fireplace-damper').leakageAreaIn2PerUnit.likely).toBe(30);
  });
});
