/**
 * The demo scenario's shape and variety: every home is a valid home file marked as invented,
 * with an address, a client, a dated test-in and a work scope; together they cover the ages,
 * fuels, methods, leakiness and estimate kinds the demo exists to show; each one evaluates.
 * These check what the invented data must contain, never its numbers as expected values.
 */
import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import { findMeasureType } from '../../core/measure-library.ts';
import type { EvaluationReport } from '../../core/report.ts';
import {
  checkHomeFile,
  FUELS,
  INFILTRATION_METHODS,
  type HomeFile,
  type LeakageTest,
} from '../../core/schema.ts';
import { DEMO_HOMES, DEMO_PROGRAM_NAME } from '../../db/demo/alder-creek.ts';

function parsed(): HomeFile[] {
  return DEMO_HOMES.map((input) => {
    const result = checkHomeFile(input);
    if (!result.ok) throw new Error(`${input.name}: ${JSON.stringify(result.problems)}`);
    return result.home;
  });
}

const HOMES = parsed();

const reports = new Map<string, EvaluationReport>();

/** The evaluation report of a demo home, computed once per run. */
function reportFor(home: HomeFile): EvaluationReport {
  const known = reports.get(home.name);
  if (known) return known;
  const report = evaluateHomeReport(home);
  reports.set(home.name, report);
  return report;
}

/**
 * CFM50 of a test, computed here rather than by the engine: a one-point test is its reading;
 * several points are fitted as ln Q = ln C + n·ln ΔP by least squares (ASTM E779 and
 * CGSB-149.10 fit the power law Q = C·ΔPⁿ this way), using simple-statistics' regression.
 */
function cfm50Of(test: Pick<LeakageTest, 'cfm50' | 'points'>): number {
  if (test.points) {
    const { m, b } = linearRegression(test.points.map((p) => [Math.log(p.pa), Math.log(p.cfm)]));
    return Math.exp(b + m * Math.log(50));
  }
  if (test.cfm50 === undefined) throw new Error('a test with neither cfm50 nor points');
  return test.cfm50;
}

/** ACH50 = CFM50 · 60 / V (ANSI/RESNET/ICC 380; ASTM E779). */
function ach50Of(home: HomeFile): number {
  return (cfm50Of(home.leakageTest) * 60) / home.house.conditionedVolumeFt3;
}

/** True when a `YYYY-MM-DD` text names a real calendar day. */
function isCalendarDate(text: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!match) return false;
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const date = new Date(Date.UTC(year, month - 1, day));
  return (
    date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day
  );
}

/** Every number anywhere inside a value, with its path. */
function numbersIn(value: unknown, path = ''): { path: string; value: number }[] {
  if (typeof value === 'number') return [{ path, value }];
  if (value === null || typeof value !== 'object') return [];
  return Object.entries(value).flatMap(([key, inner]) => numbersIn(inner, `${path}.${key}`));
}

describe('demo scenario: every home', () => {
  it('says it is the invented demo program', () => {
    expect(DEMO_PROGRAM_NAME).toMatch(/demo/i);
  });

  it.each(DEMO_HOMES.map((home) => [home.name, home] as const))(
    '%s is a valid home file',
    (_name, input) => {
      const result = checkHomeFile(input);
      expect(result.ok ? [] : result.problems).toEqual([]);
    },
  );

  it.each(HOMES.map((home) => [home.name, home] as const))(
    '%s is marked demo, with an address, a client, a dated test-in and a work scope',
    (_name, home) => {
      expect(home.demo).toBe(true);
      expect(home.notes ?? '').toMatch(/invented/i);
      expect(home.address?.street?.trim() ?? '').not.toBe('');
      expect(home.address?.town?.trim() ?? '').not.toBe('');
      expect(home.client?.name.trim() ?? '').not.toBe('');
      expect(isCalendarDate(home.leakageTest.testedOn ?? '')).toBe(true);
      expect(home.measures.length).toBeGreaterThanOrEqual(3);
      // The name starts with the street, so a list of homes reads as a list of addresses.
      expect(home.name.startsWith(home.address?.street ?? '\u0000')).toBe(true);
    },
  );

  it.each(HOMES.map((home) => [home.name, home] as const))(
    '%s evaluates, with no NaN or infinity in the package',
    (_name, home) => {
      const report = reportFor(home);
      const bad = numbersIn(report.package).filter(({ value }) => !Number.isFinite(value));
      expect(bad).toEqual([]);
      expect(report.measures.length).toBe(home.measures.length);
    },
  );

  it('keeps every client phone number in the 555-01xx range set aside for fiction', () => {
    // The 555-0100 to 555-0199 block is set aside for fictional use (North American Numbering
    // Plan Administrator, from memory); example.com/.net/.org are reserved for examples
    // (RFC 2606, from memory).
    for (const home of HOMES) {
      if (home.client?.phone !== undefined) expect(home.client.phone).toMatch(/^555-01\d\d$/);
      if (home.client?.email !== undefined) {
        expect(home.client.email).toMatch(/@example\.(com|net|org)$/);
      }
    }
  });
});

describe('demo scenario: variety', () => {
  it('has at least twelve homes with distinct names and distinct addresses', () => {
    expect(HOMES.length).toBeGreaterThanOrEqual(12);
    expect(new Set(HOMES.map((home) => home.name)).size).toBe(HOMES.length);
    expect(new Set(HOMES.map((home) => home.address?.street)).size).toBe(HOMES.length);
  });

  it('spreads the homes over two or three towns', () => {
    const towns = new Set(HOMES.map((home) => home.address?.town));
    expect(towns.size).toBeGreaterThanOrEqual(2);
    expect(towns.size).toBeLessThanOrEqual(3);
  });

  it('spans house ages from 1900 or before to 2010 or after', () => {
    const years = HOMES.map((home) => home.house.yearBuilt);
    expect(Math.min(...years)).toBeLessThanOrEqual(1900);
    expect(Math.max(...years)).toBeGreaterThanOrEqual(2010);
  });

  it('heats with at least five different fuels, all of them known fuels', () => {
    const fuels = new Set(HOMES.map((home) => home.heating.fuel));
    expect(fuels.size).toBeGreaterThanOrEqual(5);
    for (const fuel of fuels) expect(FUELS).toContain(fuel);
  });

  it('uses all four infiltration methods', () => {
    const methods = new Set(HOMES.map((home) => home.infiltrationMethod));
    expect([...methods].sort()).toEqual([...INFILTRATION_METHODS].sort());
  });

  it('runs from a tight house (under 5 ACH50) to a very leaky one (over 15 ACH50)', () => {
    const ach50s = HOMES.map(ach50Of);
    expect(Math.min(...ach50s)).toBeLessThan(5);
    expect(Math.max(...ach50s)).toBeGreaterThan(15);
  });

  it('has one-point and multipoint tests, the multipoint ones rising with pressure', () => {
    const multipoint = HOMES.filter((home) => home.leakageTest.points !== undefined);
    expect(multipoint.length).toBeGreaterThanOrEqual(2);
    expect(multipoint.length).toBeLessThan(HOMES.length);
    for (const home of multipoint) {
      const points = home.leakageTest.points ?? [];
      expect(points.length).toBeGreaterThanOrEqual(5);
      for (let i = 1; i < points.length; i += 1) {
        expect(points[i]?.pa ?? 0).toBeGreaterThan(points[i - 1]?.pa ?? Infinity);
        expect(points[i]?.cfm ?? 0).toBeGreaterThan(points[i - 1]?.cfm ?? Infinity);
      }
      // Flow exponents of real houses lie between 0.5 (orifice) and 1 (laminar crack); most
      // fall near 0.6–0.7 (ASTM E779; ASHRAE Handbook of Fundamentals, infiltration chapter).
      const { m: exponentN } = linearRegression(
        points.map((p) => [Math.log(p.pa), Math.log(p.cfm)]),
      );
      expect(exponentN).toBeGreaterThan(0.5);
      expect(exponentN).toBeLessThan(1);
    }
  });

  it('uses all three estimate kinds and many library types', () => {
    const measures = HOMES.flatMap((home) => home.measures);
    expect(measures.some((m) => m.reductionCfm50 !== undefined)).toBe(true);
    expect(measures.some((m) => m.byUnits !== undefined)).toBe(true);
    expect(measures.some((m) => m.shareOfLocation !== undefined)).toBe(true);
    for (const measure of measures) expect(findMeasureType(measure.type)).toBeDefined();
    expect(new Set(measures.map((m) => m.type)).size).toBeGreaterThanOrEqual(15);
  });

  it('has done, declined and health-and-safety measures', () => {
    const measures = HOMES.flatMap((home) => home.measures);
    expect(measures.some((m) => m.status === 'done')).toBe(true);
    expect(measures.some((m) => m.status === 'declined')).toBe(true);
    expect(measures.some((m) => m.cost.healthAndSafety === true)).toBe(true);
  });

  it('has at least one home whose plan adds a ventilation fan, and some that need none', () => {
    const fanAdded = HOMES.map((home) => reportFor(home).package.ventilation.fanAdded);
    expect(fanAdded).toContain(true);
    expect(fanAdded).toContain(false);
  });
});

describe('demo scenario: test-outs', () => {
  const withTestOut = HOMES.filter((home) =>
    (home.otherLeakageTests ?? []).some((test) => test.kind === 'testOut'),
  );

  it('has test-outs, only in homes where work is done', () => {
    expect(withTestOut.length).toBeGreaterThanOrEqual(2);
    for (const home of withTestOut) {
      expect(home.measures.some((m) => m.status === 'done')).toBe(true);
    }
  });

  it.each(withTestOut.map((home) => [home.name, home] as const))(
    '%s: each test-out is dated after the test-in and leaks less',
    (_name, home) => {
      const testIn = home.leakageTest;
      for (const test of home.otherLeakageTests ?? []) {
        if (test.kind !== 'testOut') continue;
        expect(isCalendarDate(test.testedOn ?? '')).toBe(true);
        // ISO dates of one form order as text.
        expect((test.testedOn ?? '') > (testIn.testedOn ?? '')).toBe(true);
        expect(cfm50Of(test)).toBeLessThan(cfm50Of(testIn));
      }
    },
  );
});
