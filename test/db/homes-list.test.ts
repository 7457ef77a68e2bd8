/**
 * The Homes list as the store gives it: each home's plan test-in as CFM50 and ACH50 (one point,
 * or the fit of several readings), its leakiness band, the filters by job state and leakiness,
 * every sort in both directions with homes lacking the figure last, and paging after the sort.
 *
 * Expected values come from the inputs written here and from published definitions computed
 * in the test: ACH50 = CFM50 × 60 / V (ANSI/RESNET/ICC 380; ASTM E779); the power law
 * Q = C·ΔPⁿ fitted by ordinary least squares on ln Q against ln ΔP (ASTM E779), done here with
 * simple-statistics' linearRegression. The band limits are written here with their sources:
 * 3 ACH50 (IECC 2012 R402.4.1.2, from memory), 7 ACH50 (IECC 2009 R402.4.2.1, from memory),
 * 15 ACH50 (common practice). The houses are invented for these tests.
 */
import { linearRegression } from 'simple-statistics';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { parseHomeFile } from '../../core/schema.ts';
import { createClient } from '../../db/repositories/clients.ts';
import {
  createHome,
  deleteHome,
  HOME_SORTS,
  listHomes,
  type HomeFilter,
  type HomeSummary,
} from '../../db/repositories/homes.ts';
import { addLeakageTest } from '../../db/repositories/leakage-tests.ts';
import { addMeasure } from '../../db/repositories/measures.ts';
import type { WriteAccess } from '../../db/store.ts';
import { validBaseHome } from '../_lib/base-home.ts';
import { manualClock, type ManualClock } from './_lib/clock.ts';
import { MULTIPOINT_READINGS } from './_lib/hand-homes.ts';
import { dataOfFile, openTempProject, type TempProject } from './_lib/store-home.ts';

let project: TempProject;
let time: ManualClock;
beforeEach(() => {
  time = manualClock('2024-05-01T08:00:00.000Z');
  project = openTempProject({ clock: time.clock });
});
afterEach(() => project.dispose());

const BASE = parseHomeFile(validBaseHome());
const BASE_DATA = dataOfFile(BASE);
const VOLUME_FT3 = BASE.house.conditionedVolumeFt3;

/** ACH50 = CFM50 × 60 / V (ANSI/RESNET/ICC 380). */
function ach50Of(cfm50: number, volumeFt3: number): number {
  return (cfm50 * 60) / volumeFt3;
}

/** The CFM50 that gives `ach50` in the base house's volume. */
function cfm50For(ach50: number): number {
  return (ach50 * VOLUME_FT3) / 60;
}

/** CFM50 of a power law fitted by least squares on (ln ΔP, ln Q), ASTM E779. */
function fittedCfm50(points: readonly { pa: number; cfm: number }[]): number {
  const { m, b } = linearRegression(
    points.map((point) => [Math.log(point.pa), Math.log(point.cfm)]),
  );
  return Math.exp(b) * 50 ** m;
}

interface Spec {
  name: string;
  town?: string;
  yearBuilt?: number;
  floorAreaFt2?: number;
  cfm50?: number;
  points?: { pa: number; cfm: number }[];
  measures?: number;
  jobStatus?: 'audited' | 'scoped' | 'approved' | 'inProgress' | 'testedOut' | 'closed';
  noHouse?: boolean;
  clientId?: number;
}

function addHome(write: WriteAccess, spec: Spec): number {
  const house = {
    ...BASE.house,
    ...(spec.yearBuilt === undefined ? {} : { yearBuilt: spec.yearBuilt }),
    ...(spec.floorAreaFt2 === undefined ? {} : { conditionedFloorAreaFt2: spec.floorAreaFt2 }),
  };
  const { house: _house, ...rest } = BASE_DATA;
  const id = createHome(write, {
    name: spec.name,
    ...(spec.town === undefined ? {} : { address: { town: spec.town } }),
    ...(spec.jobStatus === undefined ? {} : { jobStatus: spec.jobStatus }),
    ...(spec.clientId === undefined ? {} : { clientId: spec.clientId }),
    data: spec.noHouse ? rest : { ...BASE_DATA, house },
  });
  if (spec.cfm50 !== undefined) addLeakageTest(write, id, { kind: 'testIn', cfm50: spec.cfm50 });
  if (spec.points !== undefined) addLeakageTest(write, id, { kind: 'testIn', points: spec.points });
  const measure = BASE.measures[0];
  if (measure === undefined) throw new Error('the base home has no measure');
  for (let index = 0; index < (spec.measures ?? 0); index++) {
    addMeasure(write, id, { ...measure, id: `m-${index}` });
  }
  return id;
}

function listed(filter: HomeFilter = {}): HomeSummary[] {
  return project.store.read((read) => listHomes(read, filter));
}

const names = (homes: readonly HomeSummary[]) => homes.map((home) => home.name);

describe('the plan test-in of each listed home', () => {
  it('gives the CFM50 and ACH50 of a one-point test and of a fitted multipoint test', () => {
    const ids = project.store.write((write) => ({
      onePoint: addHome(write, { name: 'One point', cfm50: 2400 }),
      multipoint: addHome(write, { name: 'Multipoint', points: [...MULTIPOINT_READINGS] }),
      untested: addHome(write, { name: 'Untested' }),
      noHouse: addHome(write, { name: 'No house yet', cfm50: 2400, noHouse: true }),
    }));
    const byId = new Map(listed().map((home) => [home.id, home]));

    const onePoint = byId.get(ids.onePoint);
    expect(onePoint?.planCfm50).toBe(2400);
    expect(onePoint?.latestTestInCfm50).toBe(2400);
    expect(onePoint?.ach50).toBeCloseTo(ach50Of(2400, VOLUME_FT3), 10);
    expect(onePoint?.volumeFt3).toBe(VOLUME_FT3);

    const multipoint = byId.get(ids.multipoint);
    const expectedCfm50 = fittedCfm50(MULTIPOINT_READINGS);
    expect(multipoint?.latestTestInCfm50).toBeNull();
    expect(multipoint?.planCfm50).toBeCloseTo(expectedCfm50, 6);
    expect(multipoint?.ach50).toBeCloseTo(ach50Of(expectedCfm50, VOLUME_FT3), 8);

    expect(byId.get(ids.untested)).toMatchObject({
      planCfm50: null,
      ach50: null,
      leakiness: 'unknown',
    });
    // A test-in but no house: the CFM50 is known, the ACH50 is not.
    expect(byId.get(ids.noHouse)).toMatchObject({
      planCfm50: 2400,
      ach50: null,
      volumeFt3: null,
      leakiness: 'unknown',
    });
  });

  it('puts each ACH50 in its band, each band holding its lower limit', () => {
    const cases: [number, HomeSummary['leakiness']][] = [
      [1.5, 'tight'],
      [2.99, 'tight'],
      [3, 'moderate'],
      [6.99, 'moderate'],
      [7, 'leaky'],
      [14.99, 'leaky'],
      [15, 'veryLeaky'],
      [32, 'veryLeaky'],
    ];
    project.store.write((write) => {
      cases.forEach(([ach50], index) =>
        addHome(write, { name: `Band case ${index}`, cfm50: cfm50For(ach50) }),
      );
    });
    for (const [index, [ach50, band]] of cases.entries()) {
      const home = listed({ search: `case ${index}` })[0];
      expect(home?.ach50, `ACH50 ${ach50}`).toBeCloseTo(ach50, 9);
      expect(home?.leakiness, `ACH50 ${ach50}`).toBe(band);
    }
    expect(names(listed({ leakiness: 'tight' })).sort()).toEqual(['Band case 0', 'Band case 1']);
    expect(names(listed({ leakiness: 'veryLeaky' })).sort()).toEqual([
      'Band case 6',
      'Band case 7',
    ]);
    expect(listed({ leakiness: 'unknown' })).toEqual([]);
  });
});

describe('filters and sorts', () => {
  function seed() {
    return project.store.write((write) => {
      const client = createClient(write, { name: 'Ines Varga' });
      const ids = {
        a: addHome(write, {
          name: '14 Mill Lane',
          town: 'Ashby',
          yearBuilt: 1920,
          floorAreaFt2: 1800,
          cfm50: cfm50For(18),
          measures: 2,
          jobStatus: 'approved',
        }),
        b: addHome(write, {
          name: '120 Mill Lane',
          town: 'Fallbrook',
          yearBuilt: 1985,
          floorAreaFt2: 1200,
          cfm50: cfm50For(4),
          measures: 0,
          clientId: client,
        }),
        c: addHome(write, {
          name: '9 Alder Court',
          yearBuilt: 1955,
          floorAreaFt2: 2400,
          points: [...MULTIPOINT_READINGS],
          measures: 1,
          jobStatus: 'approved',
        }),
        d: addHome(write, { name: 'Draft on Birch Street', noHouse: true, measures: 0 }),
      };
      return ids;
    });
  }

  it('filters by job state and by leakiness, with the other filters and the search', () => {
    const ids = seed();
    const idsOf = (filter: HomeFilter) =>
      listed(filter)
        .map((home) => home.id)
        .sort();
    expect(idsOf({ jobStatus: 'approved' })).toEqual([ids.a, ids.c].sort());
    expect(idsOf({ jobStatus: 'approved', town: 'Ashby' })).toEqual([ids.a]);
    expect(idsOf({ jobStatus: 'testedOut' })).toEqual([]);
    const multipointBand = ach50Of(fittedCfm50(MULTIPOINT_READINGS), VOLUME_FT3);
    // The readings' house is in the leaky band (7 to 15 ACH50): the check below depends on it.
    expect(multipointBand).toBeGreaterThanOrEqual(7);
    expect(multipointBand).toBeLessThan(15);
    expect(idsOf({ leakiness: 'leaky' })).toEqual([ids.c]);
    expect(idsOf({ leakiness: 'veryLeaky' })).toEqual([ids.a]);
    expect(idsOf({ leakiness: 'moderate', search: 'Mill' })).toEqual([ids.b]);
    expect(idsOf({ leakiness: 'unknown' })).toEqual([ids.d]);
    expect(listed({ search: 'Mill', sort: 'name' }).map((home) => home.clientName)).toEqual([
      null,
      'Ines Varga',
    ]);
  });

  it('sorts by every figure both ways, homes without the figure last, ties by name', () => {
    const ids = seed();
    // Names in reading order: the numbers in them compare as numbers.
    expect(listed({ sort: 'name' }).map((home) => home.id)).toEqual([ids.c, ids.a, ids.b, ids.d]);
    expect(listed({ sort: 'name', descending: true }).map((home) => home.id)).toEqual([
      ids.d,
      ids.b,
      ids.a,
      ids.c,
    ]);
    const expected: Record<(typeof HOME_SORTS)[number], { up: number[]; down: number[] }> = {
      name: { up: [ids.c, ids.a, ids.b, ids.d], down: [ids.d, ids.b, ids.a, ids.c] },
      town: { up: [ids.a, ids.b, ids.c, ids.d], down: [ids.b, ids.a, ids.c, ids.d] },
      yearBuilt: { up: [ids.a, ids.c, ids.b, ids.d], down: [ids.b, ids.c, ids.a, ids.d] },
      floorArea: { up: [ids.b, ids.a, ids.c, ids.d], down: [ids.c, ids.a, ids.b, ids.d] },
      leakiness: { up: [ids.b, ids.c, ids.a, ids.d], down: [ids.a, ids.c, ids.b, ids.d] },
      // 0 measures twice: "120 Mill Lane" before "Draft on Birch Street" by name, both ways.
      measures: { up: [ids.b, ids.d, ids.c, ids.a], down: [ids.a, ids.c, ids.b, ids.d] },
      updated: { up: [ids.a, ids.b, ids.c, ids.d], down: [ids.d, ids.c, ids.b, ids.a] },
    };
    for (const sort of HOME_SORTS) {
      if (sort === 'updated') continue; // the clock stood still while seeding: see below
      expect(
        listed({ sort }).map((home) => home.id),
        sort,
      ).toEqual(expected[sort].up);
      expect(
        listed({ sort, descending: true }).map((home) => home.id),
        sort,
      ).toEqual(expected[sort].down);
    }
    // Changed one by one, a second apart, in the order a, b, c, d.
    for (const id of [ids.a, ids.b, ids.c, ids.d]) {
      time.advanceSeconds(1);
      project.store.write((write) =>
        write.statement('UPDATE homes SET updated_at = ? WHERE id = ?').run(time.nowIso(), id),
      );
    }
    expect(listed({ sort: 'updated' }).map((home) => home.id)).toEqual(expected.updated.up);
    expect(listed({ sort: 'updated', descending: true }).map((home) => home.id)).toEqual(
      expected.updated.down,
    );
  });

  it('pages the sorted list with limit and offset, and lists deleted homes apart', () => {
    const ids = seed();
    const order = [ids.a, ids.c, ids.b, ids.d]; // leakiest first, the unknown last
    const page = (offset: number) =>
      listed({ sort: 'leakiness', descending: true, limit: 2, offset }).map((home) => home.id);
    expect(page(0)).toEqual(order.slice(0, 2));
    expect(page(2)).toEqual(order.slice(2, 4));
    expect(page(4)).toEqual([]);
    project.store.write((write) => deleteHome(write, ids.c));
    expect(listed({ sort: 'leakiness', descending: true }).map((home) => home.id)).toEqual([
      ids.a,
      ids.b,
      ids.d,
    ]);
    expect(listed({ deleted: true, leakiness: 'leaky' }).map((home) => home.id)).toEqual([ids.c]);
  });
});
