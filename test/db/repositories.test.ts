/**
 * The repositories on a real project file in a temporary folder: what goes in comes back, the
 * rules of the data are enforced with typed errors naming the field, timestamps follow the
 * store's clock, deleting is soft until purged, the Homes list filters literally, library
 * edits reach the evaluation, saved plans reproduce, and a failed write leaves nothing.
 *
 * Expected values come from the inputs written here, from SQLite's documented behaviour, and
 * (for the library edit) from the ELA definition of the ASHRAE Handbook of Fundamentals.
 */
import { createHash } from 'node:crypto';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import { SHIPPED_LIBRARY } from '../../core/measure-library.ts';
import { parseHomeFile } from '../../core/schema.ts';
import { ENGINE_VERSION } from '../../core/version.ts';
import { DbError } from '../../db/errors.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import {
  createClient,
  findOrCreateClient,
  getClient,
  listClients,
  updateClient,
} from '../../db/repositories/clients.ts';
import {
  createHome,
  deleteHome,
  getHome,
  listHomes,
  purgeHome,
  restoreHome,
  updateHome,
  type HomeInput,
} from '../../db/repositories/homes.ts';
import {
  addLeakageTest,
  deleteLeakageTest,
  listLeakageTests,
  updateLeakageTest,
} from '../../db/repositories/leakage-tests.ts';
import {
  effectiveLibrary,
  listLibraryEdits,
  resetLibraryEdit,
  saveLibraryEdit,
} from '../../db/repositories/library.ts';
import {
  addMeasure,
  deleteMeasure,
  listMeasures,
  updateMeasure,
} from '../../db/repositories/measures.ts';
import { getPlan, listPlans, savePlan } from '../../db/repositories/plans.ts';
import { climates, priceSets } from '../../db/repositories/reusable-sets.ts';
import { DEFAULT_SETTINGS, getSettings, updateSettings } from '../../db/repositories/settings.ts';
import { openStore } from '../../db/store.ts';
import { setAt, validBaseHome } from '../_lib/base-home.ts';
import { manualClock, type ManualClock } from './_lib/clock.ts';
import { MULTIPOINT_READINGS } from './_lib/hand-homes.ts';
import { rowCounts } from './_lib/sqlite-rows.ts';
import { dataOfFile, openTempProject, storeHomeFile, type TempProject } from './_lib/store-home.ts';

let project: TempProject;
let time: ManualClock;
beforeEach(() => {
  time = manualClock('2024-04-01T08:00:00.000Z');
  project = openTempProject({ clock: time.clock });
});
afterEach(() => project.dispose());

const BASE = parseHomeFile(validBaseHome());
const BASE_DATA = dataOfFile(BASE);

/** The valid base home under another name. */
function named(name: string) {
  const home = validBaseHome();
  setAt(home, 'name', name);
  return home;
}

const COST = { materialsUsd: 40, laborHours: 2, laborRateUsdPerHour: 50 };

/** The error `work` throws (the test fails if it throws none). */
function thrownBy(work: () => unknown): unknown {
  try {
    work();
  } catch (error) {
    return error;
  }
  throw new Error('expected an error, none was thrown');
}

function expectDbError(work: () => unknown, kind: DbError['kind'], field?: string): void {
  const error = thrownBy(work);
  expect(error).toBeInstanceOf(DbError);
  expect({ kind: (error as DbError).kind, field: (error as DbError).field }).toEqual({
    kind,
    field,
  });
}

function inputPaths(work: () => unknown): string[] {
  const error = thrownBy(work);
  expect(error).toBeInstanceOf(InputError);
  return (error as InputError).problems.map((problem) => problem.path);
}

describe('clients', () => {
  it('create, get, list by name, update (createdAt kept, updatedAt moved)', () => {
    const { store } = project;
    const created = time.nowIso();
    const zoe = store.write((write) =>
      createClient(write, { name: 'Zoe Park', phone: '555-0101', email: 'zoe@example.org' }),
    );
    const abe = store.write((write) => createClient(write, { name: 'Abe Lund' }));
    expect(store.read((read) => getClient(read, zoe))).toEqual({
      id: zoe,
      name: 'Zoe Park',
      phone: '555-0101',
      email: 'zoe@example.org',
      notes: null,
      createdAt: created,
      updatedAt: created,
    });
    expect(store.read((read) => listClients(read)).map((client) => client.id)).toEqual([abe, zoe]);
    time.advanceSeconds(60);
    store.write((write) => updateClient(write, abe, { name: 'Abe Lund', notes: 'landlord' }));
    const updated = store.read((read) => getClient(read, abe));
    expect(updated).toMatchObject({
      notes: 'landlord',
      createdAt: created,
      updatedAt: time.nowIso(),
    });
  });

  it('refuses an empty name (InputError at name) and an unknown id (DbError notFound)', () => {
    const { store } = project;
    expect(inputPaths(() => store.write((write) => createClient(write, { name: '   ' })))).toEqual([
      'name',
    ]);
    expectDbError(() => store.read((read) => getClient(read, 42)), 'notFound', 'clientId');
    expectDbError(
      () => store.write((write) => updateClient(write, 42, { name: 'Nobody' })),
      'notFound',
      'clientId',
    );
  });

  it('findOrCreateClient matches on name and email together', () => {
    const { store } = project;
    const first = store.write((write) =>
      findOrCreateClient(write, { name: 'Lee', email: 'a@x.org' }),
    );
    const same = store.write((write) =>
      findOrCreateClient(write, { name: 'Lee', email: 'a@x.org' }),
    );
    const other = store.write((write) =>
      findOrCreateClient(write, { name: 'Lee', email: 'b@x.org' }),
    );
    expect(same).toBe(first);
    expect(other).not.toBe(first);
  });
});

describe('homes', () => {
  it('stores a whole home and gives it back as given', () => {
    const { store } = project;
    const clientId = store.write((write) => createClient(write, { name: 'Marta Ruiz' }));
    const id = store.write((write) =>
      createHome(write, {
        name: 'Ruiz house',
        clientId,
        address: { street: '9 Weir Road', town: 'Fallbrook', region: 'ME', postalCode: '04999' },
        notes: 'side door',
        jobStatus: 'approved',
        data: BASE_DATA,
      }),
    );
    expect(store.read((read) => getHome(read, id))).toEqual({
      id,
      name: 'Ruiz house',
      clientId,
      climateId: null,
      priceSetId: null,
      address: { street: '9 Weir Road', town: 'Fallbrook', region: 'ME', postalCode: '04999' },
      isDemo: false,
      notes: 'side door',
      jobStatus: 'approved',
      data: BASE_DATA,
      createdAt: time.nowIso(),
      updatedAt: time.nowIso(),
      deletedAt: null,
    });
  });

  it('accepts a draft with parts missing, and a new home starts "audited"', () => {
    const { store } = project;
    const empty = store.write((write) => createHome(write, { name: 'Empty draft', data: {} }));
    const houseOnly = store.write((write) =>
      createHome(write, { name: 'House only', data: { house: BASE.house } }),
    );
    expect(store.read((read) => getHome(read, empty)).data).toEqual({});
    expect(store.read((read) => getHome(read, houseOnly))).toMatchObject({
      data: { house: BASE.house },
      jobStatus: 'audited',
    });
  });

  it('refuses a part present but not whole: InputError naming data.house.…', () => {
    const { store } = project;
    const { yearBuilt: _yearBuilt, ...houseWithoutYear } = BASE.house;
    const before = rowCounts(store.sqlite);
    const paths = inputPaths(() =>
      store.write((write) =>
        createHome(write, {
          name: 'Broken house',
          // Deliberately not a valid house: no year built, too many storeys.
          data: { house: { ...houseWithoutYear, stories: 9 } } as unknown as HomeInput['data'],
        }),
      ),
    );
    expect(paths.sort()).toEqual(['data.house.stories', 'data.house.yearBuilt']);
    expect(rowCounts(store.sqlite)).toEqual(before);
  });

  it('refuses a link to a client, climate or price set that does not exist (DbError foreignKey)', () => {
    const { store } = project;
    for (const field of ['clientId', 'climateId', 'priceSetId'] as const) {
      expectDbError(
        () => store.write((write) => createHome(write, { name: 'Orphan', [field]: 77, data: {} })),
        'foreignKey',
        field,
      );
    }
    expect(rowCounts(store.sqlite).homes).toBe(0);
  });

  it('updateHome replaces the fields; an unknown or deleted home is notFound', () => {
    const { store } = project;
    const id = store.write((write) => createHome(write, { name: 'Before', data: BASE_DATA }));
    store.write((write) =>
      updateHome(write, id, {
        name: 'After',
        address: { town: 'Ashby' },
        data: { house: BASE.house },
      }),
    );
    expect(store.read((read) => getHome(read, id))).toMatchObject({
      name: 'After',
      address: { town: 'Ashby' },
      data: { house: BASE.house },
    });
    expectDbError(
      () => store.write((write) => updateHome(write, 999, { name: 'x', data: {} })),
      'notFound',
      'homeId',
    );
    store.write((write) => deleteHome(write, id));
    expectDbError(
      () => store.write((write) => updateHome(write, id, { name: 'x', data: {} })),
      'notFound',
      'homeId',
    );
  });
});

describe('leakage tests', () => {
  it('keeps one-point and multipoint tests in the order added, the points in the order taken', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Tested', data: {} }));
    const onePoint = {
      kind: 'testIn',
      cfm50: 3100,
      exponentN: 0.61,
      testedOn: '2024-01-09',
      note: 'gusty',
    };
    const multipoint = { kind: 'testOut', points: MULTIPOINT_READINGS, testedOn: '2024-05-02' };
    const ids = store.write((write) => [
      addLeakageTest(write, homeId, onePoint),
      addLeakageTest(write, homeId, multipoint),
    ]);
    const tests = store.read((read) => listLeakageTests(read, homeId));
    expect(tests.map((record) => record.id)).toEqual(ids);
    expect(tests.map((record) => record.test)).toEqual([onePoint, multipoint]);
    expect(tests[1]?.test.points?.map((point) => point.pa)).toEqual([50, 30, 45, 20, 12]);
  });

  it('update replaces the readings (fewer points leave none behind); delete removes the test', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Retested', data: {} }));
    const testId = store.write((write) =>
      addLeakageTest(write, homeId, { kind: 'testIn', points: MULTIPOINT_READINGS }),
    );
    const fewer = {
      kind: 'testIn',
      points: [
        { pa: 50, cfm: 2900 },
        { pa: 25, cfm: 1900 },
      ],
    };
    store.write((write) => updateLeakageTest(write, testId, fewer));
    expect(
      store.read((read) => listLeakageTests(read, homeId)).map((record) => record.test),
    ).toEqual([fewer]);
    expect(rowCounts(store.sqlite).leakage_test_points).toBe(2);
    store.write((write) => deleteLeakageTest(write, testId));
    expect(rowCounts(store.sqlite)).toMatchObject({ leakage_tests: 0, leakage_test_points: 0 });
  });

  it('refuses a test that is both one-point and multipoint (InputError)', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Bad test', data: {} }));
    const error = thrownBy(() =>
      store.write((write) =>
        addLeakageTest(write, homeId, { kind: 'testIn', cfm50: 3000, points: MULTIPOINT_READINGS }),
      ),
    );
    expect(error).toBeInstanceOf(InputError);
    expect(rowCounts(store.sqlite).leakage_tests).toBe(0);
  });
});

describe('measures', () => {
  const measure = (id: string, type = 'rim-joist') => ({
    id,
    type,
    reductionCfm50: { low: 50, likely: 80, high: 120 },
    cost: COST,
  });

  it('keeps the listed order, through an update of the middle one, and every optional field', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Listed', data: {} }));
    const full = {
      id: 'b',
      type: 'attic-hatch',
      location: 'wall' as const,
      byUnits: { units: 2, sealingEffectiveness: { low: 0.5, likely: 0.6, high: 0.7 } },
      cost: { ...COST, markupFraction: 0.25, healthAndSafety: true },
      lifeYears: 12,
      status: 'declined' as const,
      note: 'owner declined',
    };
    const ids = store.write((write) => [
      addMeasure(write, homeId, measure('c')),
      addMeasure(write, homeId, measure('a')),
      addMeasure(write, homeId, measure('z')),
    ]);
    store.write((write) => updateMeasure(write, ids[1] ?? 0, full));
    const listed = store.read((read) => listMeasures(read, homeId));
    expect(listed.map((record) => record.id)).toEqual(ids);
    expect(listed.map((record) => record.measure)).toEqual([measure('c'), full, measure('z')]);
    store.write((write) => deleteMeasure(write, ids[0] ?? 0));
    expect(
      store.read((read) => listMeasures(read, homeId)).map((record) => record.measure.id),
    ).toEqual(['b', 'z']);
  });

  it('a measure id used twice in one home is DbError constraint at "id"; another home may use it', () => {
    const { store } = project;
    const [first, second] = store.write((write) => [
      createHome(write, { name: 'One', data: {} }),
      createHome(write, { name: 'Two', data: {} }),
    ]) as [number, number];
    const kept = store.write((write) => addMeasure(write, first, measure('rim')));
    expectDbError(
      () => store.write((write) => addMeasure(write, first, measure('rim'))),
      'constraint',
      'id',
    );
    const other = store.write((write) => addMeasure(write, first, measure('other')));
    expectDbError(
      () => store.write((write) => updateMeasure(write, other, measure('rim'))),
      'constraint',
      'id',
    );
    store.write((write) => addMeasure(write, second, measure('rim')));
    expect(store.read((read) => listMeasures(read, first)).map((record) => record.id)).toEqual([
      kept,
      other,
    ]);
  });

  it('an unknown measure type is InputError at "type"', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Typo', data: {} }));
    expect(
      inputPaths(() =>
        store.write((write) => addMeasure(write, homeId, measure('x', 'attic-top-plate'))),
      ),
    ).toEqual(['type']);
    expect(rowCounts(store.sqlite).measures).toBe(0);
  });
});

describe('climates and price sets', () => {
  const sets = [
    { what: 'climates', repository: climates, data: BASE.climate, field: 'climateId' },
    { what: 'price sets', repository: priceSets, data: BASE.prices, field: 'priceSetId' },
  ] as const;

  it.each(sets)('$what: create, get, findByName, list, update, remove', ({ repository, data }) => {
    const { store } = project;
    const id = store.write((write) => repository.create(write, 'Valley', data));
    store.write((write) => repository.create(write, 'Coast', data));
    expect(store.read((read) => repository.get(read, id))).toMatchObject({
      id,
      name: 'Valley',
      data,
    });
    expect(store.read((read) => repository.findByName(read, 'Valley'))?.id).toBe(id);
    expect(store.read((read) => repository.findByName(read, 'Nowhere'))).toBeUndefined();
    expect(store.read((read) => repository.list(read)).map((set) => set.name)).toEqual([
      'Coast',
      'Valley',
    ]);
    store.write((write) => repository.update(write, id, 'Valley floor', data));
    expect(store.read((read) => repository.get(read, id)).name).toBe('Valley floor');
    store.write((write) => repository.remove(write, id));
    expect(store.read((read) => repository.list(read)).map((set) => set.name)).toEqual(['Coast']);
  });

  it.each(sets)(
    '$what: a name used twice is DbError constraint at "name"',
    ({ repository, data }) => {
      const { store } = project;
      store.write((write) => repository.create(write, 'Valley', data));
      const coast = store.write((write) => repository.create(write, 'Coast', data));
      expectDbError(
        () => store.write((write) => repository.create(write, 'Valley', data)),
        'constraint',
        'name',
      );
      expectDbError(
        () => store.write((write) => repository.update(write, coast, 'Valley', data)),
        'constraint',
        'name',
      );
    },
  );

  it.each(sets)(
    '$what: removing a set a home uses is refused and the set stays',
    ({ repository, data }) => {
      const { store } = project;
      const id = store.write((write) => repository.create(write, 'In use', data));
      const link = repository === climates ? { climateId: id } : { priceSetId: id };
      store.write((write) => createHome(write, { name: 'Linked', ...link, data: {} }));
      expect(thrownBy(() => store.write((write) => repository.remove(write, id)))).toBeInstanceOf(
        DbError,
      );
      expect(store.read((read) => repository.get(read, id)).name).toBe('In use');
    },
  );

  // Regression check (once a bug in db/repositories/reusable-sets.ts, remove): homes reference climates and price sets
  // ON DELETE RESTRICT, which SQLite reports as SQLITE_CONSTRAINT_TRIGGER, not
  // SQLITE_CONSTRAINT_FOREIGNKEY; remove() only maps the latter, so the caller gets
  // DbError 'constraint' with no field. Expected: kind 'foreignKey', field climateId/priceSetId.
  it.each(sets)(
    '$what: the refusal is DbError foreignKey at $field',
    ({ repository, data, field }) => {
      const { store } = project;
      const id = store.write((write) => repository.create(write, 'In use', data));
      const link = repository === climates ? { climateId: id } : { priceSetId: id };
      store.write((write) => createHome(write, { name: 'Linked', ...link, data: {} }));
      expectDbError(
        () => store.write((write) => repository.remove(write, id)),
        'foreignKey',
        field,
      );
    },
  );

  it('a home linked to a climate and a price set exports their data, and follows their edits', () => {
    const { store } = project;
    const hill = { ...BASE.climate, name: 'Hill', hdd65F: 7300 };
    const winter = { ...BASE.prices, naturalGas: { usdPerUnit: 1.9 } };
    const climateId = store.write((write) => climates.create(write, 'Hill', hill));
    const priceSetId = store.write((write) => priceSets.create(write, 'Winter', winter));
    // The home's own climate and prices are replaced by the links, so the row never holds both.
    const homeId = store.write((write) =>
      storeHomeFile(write, validBaseHome(), { climateId, priceSetId }),
    );
    expect(store.read((read) => getHome(read, homeId)).data).not.toHaveProperty('climate');
    expect(store.read((read) => getHome(read, homeId)).data).not.toHaveProperty('prices');
    const exported = store.read((read) => exportHomeFile(read, homeId));
    expect(exported.climate).toEqual(hill);
    expect(exported.prices).toEqual(winter);
    const colder = { ...hill, hdd65F: 8100 };
    store.write((write) => climates.update(write, climateId, 'Hill', colder));
    expect(store.read((read) => exportHomeFile(read, homeId)).climate).toEqual(colder);
  });
});

describe('timestamps follow the store clock', () => {
  it('every edit of a home, its tests or its measures moves updatedAt; createdAt stays', () => {
    const { store } = project;
    const createdAt = time.nowIso();
    const homeId = store.write((write) => createHome(write, { name: 'Clocked', data: {} }));
    const home = () => store.read((read) => getHome(read, homeId));
    const steps: [string, () => void][] = [
      [
        'updateHome',
        () => store.write((write) => updateHome(write, homeId, { name: 'Clocked 2', data: {} })),
      ],
      [
        'addLeakageTest',
        () =>
          store.write((write) => addLeakageTest(write, homeId, { kind: 'testIn', cfm50: 2000 })),
      ],
      [
        'updateLeakageTest',
        () => {
          const [test] = store.read((read) => listLeakageTests(read, homeId));
          store.write((write) =>
            updateLeakageTest(write, test?.id ?? 0, { kind: 'testIn', cfm50: 2100 }),
          );
        },
      ],
      [
        'addMeasure',
        () =>
          store.write((write) =>
            addMeasure(write, homeId, {
              id: 'm',
              type: 'rim-joist',
              reductionCfm50: { low: 1, likely: 2, high: 3 },
              cost: COST,
            }),
          ),
      ],
      [
        'updateMeasure',
        () => {
          const [record] = store.read((read) => listMeasures(read, homeId));
          store.write((write) =>
            updateMeasure(write, record?.id ?? 0, {
              id: 'm',
              type: 'rim-joist',
              reductionCfm50: { low: 1, likely: 3, high: 4 },
              cost: COST,
            }),
          );
        },
      ],
      [
        'deleteMeasure',
        () => store.write((write) => deleteMeasure(write, listMeasures(write, homeId)[0]?.id ?? 0)),
      ],
      [
        'deleteLeakageTest',
        () =>
          store.write((write) =>
            deleteLeakageTest(write, listLeakageTests(write, homeId)[0]?.id ?? 0),
          ),
      ],
    ];
    for (const [what, step] of steps) {
      time.advanceSeconds(90);
      step();
      expect({ what, createdAt: home().createdAt, updatedAt: home().updatedAt }).toEqual({
        what,
        createdAt,
        updatedAt: time.nowIso(),
      });
    }
  });

  it('a test or measure record keeps its createdAt and moves its updatedAt on update', () => {
    const { store } = project;
    const homeId = store.write((write) => createHome(write, { name: 'Records', data: {} }));
    const added = time.nowIso();
    const testId = store.write((write) =>
      addLeakageTest(write, homeId, { kind: 'testIn', cfm50: 2000 }),
    );
    time.advanceSeconds(3600);
    store.write((write) => updateLeakageTest(write, testId, { kind: 'testOut', cfm50: 1500 }));
    expect(store.read((read) => listLeakageTests(read, homeId))[0]).toMatchObject({
      createdAt: added,
      updatedAt: time.nowIso(),
    });
  });
});

describe('soft delete, restore and purge', () => {
  function homeWithEverything(): number {
    return project.store.write((write) => {
      const id = storeHomeFile(write, validBaseHome());
      addLeakageTest(write, id, { kind: 'testOut', points: MULTIPOINT_READINGS });
      return id;
    });
  }

  it('a deleted home is hidden from listHomes and getHome; restoreHome brings it back unchanged', () => {
    const { store } = project;
    const id = homeWithEverything();
    const before = store.read((read) => ({
      home: getHome(read, id),
      tests: listLeakageTests(read, id),
      measures: listMeasures(read, id),
    }));
    time.advanceSeconds(60);
    store.write((write) => deleteHome(write, id));
    expect(store.read((read) => listHomes(read))).toEqual([]);
    expect(store.read((read) => listHomes(read, { deleted: true })).map((home) => home.id)).toEqual(
      [id],
    );
    expectDbError(() => store.read((read) => getHome(read, id)), 'notFound', 'homeId');
    expectDbError(() => store.write((write) => deleteHome(write, id)), 'notFound', 'homeId');
    time.advanceSeconds(60);
    store.write((write) => restoreHome(write, id));
    const after = store.read((read) => ({
      home: getHome(read, id),
      tests: listLeakageTests(read, id),
      measures: listMeasures(read, id),
    }));
    // Delete and restore are edits of the home, so its updatedAt moves; nothing else does.
    expect(after).toEqual({ ...before, home: { ...before.home, updatedAt: time.nowIso() } });
    expectDbError(() => store.write((write) => restoreHome(write, id)), 'notFound', 'homeId');
  });

  it('purgeHome removes a deleted home with its tests, points, measures and plans; other homes stay', () => {
    const { store } = project;
    const doomed = homeWithEverything();
    const kept = homeWithEverything();
    store.write((write) => {
      for (const homeId of [doomed, kept]) {
        const inputs = exportHomeFile(write, homeId);
        savePlan(write, {
          homeId,
          name: 'Plan',
          engineVersion: ENGINE_VERSION,
          inputs,
          result: evaluateHomeReport(inputs),
        });
      }
    });
    const countFor = (homeId: number) =>
      store.sqlite
        .prepare(
          `SELECT (SELECT count(*) FROM homes WHERE id = @id) AS homes,
                  (SELECT count(*) FROM leakage_tests WHERE home_id = @id) AS tests,
                  (SELECT count(*) FROM leakage_test_points p JOIN leakage_tests t ON t.id = p.test_id
                    WHERE t.home_id = @id) AS points,
                  (SELECT count(*) FROM measures WHERE home_id = @id) AS measures,
                  (SELECT count(*) FROM plans WHERE home_id = @id) AS plans`,
        )
        .get({ id: homeId });
    const keptBefore = countFor(kept);
    expect(keptBefore).toEqual({
      homes: 1,
      tests: 2,
      points: MULTIPOINT_READINGS.length,
      measures: 3,
      plans: 1,
    });
    expectDbError(() => store.write((write) => purgeHome(write, doomed)), 'notFound', 'homeId');
    expect(countFor(doomed)).toEqual(keptBefore);
    store.write((write) => deleteHome(write, doomed));
    store.write((write) => purgeHome(write, doomed));
    expect(countFor(doomed)).toEqual({ homes: 0, tests: 0, points: 0, measures: 0, plans: 0 });
    expect(countFor(kept)).toEqual(keptBefore);
  });
});

describe('listHomes', () => {
  function seedList(): Record<string, number> {
    return project.store.write((write) => {
      const ruiz = createClient(write, { name: 'Marta Ruiz' });
      const oak = createClient(write, { name: 'Oakridge Rentals' });
      const oil = {
        ...BASE_DATA,
        heating: { ...BASE.heating, fuel: 'heatingOil' as const, equipment: 'boiler' as const },
      };
      const add = (name: string, town: string, clientId: number | null, data = BASE_DATA) =>
        createHome(write, { name, clientId, address: { street: `${name} St`, town }, data });
      return {
        ruiz: add('Ruiz house', 'Fallbrook', ruiz, oil),
        percent: add('100% sealed', 'Ashby', oak),
        thousand: add('1000 Oaks', 'Ashby', null),
        underscore: add('Lot_7', 'Ashby', null),
        lotx: add('Lotx7', 'Fallbrook', oak, oil),
        slash: add('Barn \\ loft', 'Fallbrook', null),
      };
    });
  }
  const ids = (filter: Parameters<typeof listHomes>[1]) =>
    project.store.read((read) => listHomes(read, filter)).map((home) => home.id);

  it('searches name, street, town and client name; filters by town, client and fuel', () => {
    const homes = seedList();
    expect(ids({ search: 'ruiz' })).toEqual([homes.ruiz]);
    expect(ids({ search: 'Oakridge' }).sort()).toEqual([homes.percent, homes.lotx].sort());
    expect(ids({ search: 'Fallbrook' }).length).toBe(3);
    expect(ids({ search: 'Lotx7 St' })).toEqual([homes.lotx]);
    expect(ids({ town: 'Ashby' }).sort()).toEqual(
      [homes.percent, homes.thousand, homes.underscore].sort(),
    );
    const oakridge = project.store.read((read) => listHomes(read, { search: '100%' }))[0];
    expect(oakridge?.clientName).toBe('Oakridge Rentals');
    expect(ids({ heatingFuel: 'heatingOil' }).sort()).toEqual([homes.ruiz, homes.lotx].sort());
    expect(ids({ heatingFuel: 'heatingOil', town: 'Fallbrook' }).sort()).toEqual(
      [homes.ruiz, homes.lotx].sort(),
    );
    expect(ids({ heatingFuel: 'propane' })).toEqual([]);
    const clientId = project.store
      .read((read) => listClients(read))
      .find((client) => client.name === 'Marta Ruiz')?.id;
    expect(ids({ clientId: clientId ?? 0 })).toEqual([homes.ruiz]);
  });

  it('treats LIKE wildcards and the escape character in the search literally', () => {
    // SQLite docs, LIKE: % matches any run of characters and _ any one character; a search
    // for "100%" must not match "1000 Oaks", nor "Lot_7" match "Lotx7".
    const homes = seedList();
    expect(ids({ search: '100%' })).toEqual([homes.percent]);
    expect(ids({ search: 'Lot_7' })).toEqual([homes.underscore]);
    expect(ids({ search: '\\' })).toEqual([homes.slash]);
    expect(ids({ search: '%' })).toEqual([homes.percent]);
  });

  it('orders by name, pages with limit/offset, and sums up each home', () => {
    const { store } = project;
    const a = store.write((write) => storeHomeFile(write, named('Alpha')));
    const b = store.write((write) => createHome(write, { name: 'Beta draft', data: {} }));
    expect(ids({ limit: 1 })).toEqual([a]);
    expect(ids({ limit: 1, offset: 1 })).toEqual([b]);
    const [alpha, beta] = store.read((read) => listHomes(read));
    expect(alpha).toMatchObject({
      name: 'Alpha',
      yearBuilt: BASE.house.yearBuilt,
      floorAreaFt2: BASE.house.conditionedFloorAreaFt2,
      heatingFuel: BASE.heating.fuel,
      latestTestInCfm50: BASE.leakageTest.cfm50,
      measureCount: BASE.measures.length,
    });
    expect(beta).toMatchObject({
      yearBuilt: null,
      heatingFuel: null,
      latestTestInCfm50: null,
      measureCount: 0,
    });
  });
  // Regression check (once a bug in db/repositories/homes.ts, listHomes): latest_cfm50 orders by date then position
  // DESC, so among undated (or same-day) test-ins it shows the last listed, while the plan is
  // built on the first listed (planTestOf in db/home-file.ts). Expected: the Homes list shows
  // the CFM50 of the test the plan uses.
  it('latestTestInCfm50 is the CFM50 of the test-in the plan is built on', () => {
    const { store } = project;
    const homeId = store.write((write) => {
      const id = createHome(write, { name: 'Two test-ins', data: BASE_DATA });
      addLeakageTest(write, id, { kind: 'testIn', cfm50: 3000 });
      addLeakageTest(write, id, { kind: 'testIn', cfm50: 2500 });
      return id;
    });
    const planCfm50 = store.read((read) => exportHomeFile(read, homeId)).leakageTest.cfm50;
    expect(planCfm50).toBe(3000);
    expect(store.read((read) => listHomes(read))[0]?.latestTestInCfm50).toBe(planCfm50);
  });
});

describe('library edits', () => {
  const TYPE_ID = 'recessed-lights';
  const shipped = () => {
    const type = SHIPPED_LIBRARY.find(TYPE_ID);
    if (!type) throw new Error(`${TYPE_ID} is not in the shipped library`);
    return type;
  };

  it('an edit changes the effective values and marks them "user edit"; reset restores the shipped ones', () => {
    const { store } = project;
    const area = { low: 0.5, likely: 1.5, high: 4 };
    store.write((write) =>
      saveLibraryEdit(write, TYPE_ID, {
        leakageAreaIn2PerUnit: area,
        defaultLifeYears: 12,
        note: 'our field data',
      }),
    );
    const edited = store.read((read) => effectiveLibrary(read).find(TYPE_ID));
    expect(edited).toMatchObject({ leakageAreaIn2PerUnit: area, defaultLifeYears: 12 });
    expect(edited?.sources.leakageArea).toEqual({ mark: 'user edit', citation: 'our field data' });
    expect(edited?.sources.life.mark).toBe('user edit');
    // What was not edited keeps the shipped value and its source.
    expect(edited?.sealingEffectiveness).toEqual(shipped().sealingEffectiveness);
    expect(edited?.sources.effectiveness).toEqual(shipped().sources.effectiveness);
    expect([...store.read((read) => listLibraryEdits(read)).keys()]).toEqual([TYPE_ID]);
    // Other types are untouched.
    expect(store.read((read) => effectiveLibrary(read).find('rim-joist'))).toEqual(
      SHIPPED_LIBRARY.find('rim-joist'),
    );
    store.write((write) => resetLibraryEdit(write, TYPE_ID));
    expect(store.read((read) => effectiveLibrary(read).find(TYPE_ID))).toEqual(shipped());
    expect(store.read((read) => listLibraryEdits(read)).size).toBe(0);
  });

  it('an edit for an unknown type, or with values out of range, is refused and nothing is stored', () => {
    const { store } = project;
    expectDbError(
      () => store.write((write) => saveLibraryEdit(write, 'no-such-type', { defaultLifeYears: 5 })),
      'notFound',
      'typeId',
    );
    const error = thrownBy(() =>
      store.write((write) =>
        saveLibraryEdit(write, TYPE_ID, {
          sealingEffectiveness: { low: 0.5, likely: 0.9, high: 1.5 },
        }),
      ),
    );
    expect(error).toBeInstanceOf(InputError);
    expect(rowCounts(store.sqlite).measure_library_edits).toBe(0);
  });

  it('a stored byUnits measure relying on library defaults is evaluated with the edited leakage area', () => {
    const { store } = project;
    // CFM50 removed = units × ELA per unit × effectiveness × (CFM50 per in² of ELA). ELA at
    // 4 Pa with C_D = 1 (ASHRAE Handbook of Fundamentals, ventilation and infiltration
    // chapter): Q4 = A·√(2·ΔP/ρ), ρ = 1.2 kg/m³; Q50 = Q4·(50/4)ⁿ (power law, ASTM E779).
    const EXPONENT_N = 0.65;
    const M2_PER_IN2 = 0.0254 ** 2; // exact by the definition of the inch
    const CFM_PER_M3_PER_S = 60 / 0.3048 ** 3; // exact by the definition of the foot
    const cfm50PerIn2 =
      M2_PER_IN2 * Math.sqrt((2 * 4) / 1.2) * CFM_PER_M3_PER_S * (50 / 4) ** EXPONENT_N;
    const UNITS = 10;
    // No fans: an unbalanced fan's flow combines with infiltration non-linearly, and the
    // leak shares are given so the measure is not capped at its location.
    const { ventilation: _ventilation, ...data } = BASE_DATA;
    const homeId = store.write((write) => {
      const id = createHome(write, {
        name: 'Cans',
        data: { ...data, leakShares: { ceiling: 0.4, wall: 0.3, floor: 0.25, flue: 0.05 } },
      });
      addLeakageTest(write, id, { kind: 'testIn', cfm50: 5000, exponentN: EXPONENT_N });
      addMeasure(write, id, { id: 'cans', type: TYPE_ID, byUnits: { units: UNITS }, cost: COST });
      return id;
    });
    const evaluate = () =>
      store.read((read) =>
        evaluateHomeReport(exportHomeFile(read, homeId), { library: effectiveLibrary(read) }),
      );
    const before = evaluate();
    const editedArea = { low: 0.5, likely: 1.5, high: 4 };
    store.write((write) => saveLibraryEdit(write, TYPE_ID, { leakageAreaIn2PerUnit: editedArea }));
    const after = evaluate();

    const [measureBefore] = before.measures;
    const [measureAfter] = after.measures;
    if (!measureBefore || !measureAfter) throw new Error('expected one measure in each report');
    const effectiveness = shipped().sealingEffectiveness.likely;
    const expectedBefore =
      UNITS * shipped().leakageAreaIn2PerUnit.likely * effectiveness * cfm50PerIn2;
    const expectedAfter = UNITS * editedArea.likely * effectiveness * cfm50PerIn2;
    expect(measureBefore.cfm50Reduction / expectedBefore).toBeCloseTo(1, 3);
    expect(measureAfter.cfm50Reduction / expectedAfter).toBeCloseTo(1, 3);
    // With the climate-factor method ACHnat = ACH50 / N (Sherman 1987), the heating saved is
    // 1.08·ΔQ·24·HDD / efficiency: linear in the CFM50 removed, so it scales as the area.
    const areaRatio = editedArea.likely / shipped().leakageAreaIn2PerUnit.likely;
    expect(
      measureAfter.annualSavings.heatingFuelUnits / measureBefore.annualSavings.heatingFuelUnits,
    ).toBeCloseTo(areaRatio, 9);
    expect(areaRatio).not.toBeCloseTo(1, 1);
    // The stored measure still relies on the library: no area was written into it.
    expect(store.read((read) => listMeasures(read, homeId))[0]?.measure.byUnits).toEqual({
      units: UNITS,
    });
    store.write((write) => resetLibraryEdit(write, TYPE_ID));
    expect(evaluate()).toEqual(before);
  });
});

describe('saved plans', () => {
  it('savePlan keeps inputs, result, engine version and the SHA-256 of the stored inputs', () => {
    const { store } = project;
    const homeId = store.write((write) => storeHomeFile(write, validBaseHome()));
    const inputs = store.read((read) => exportHomeFile(read, homeId));
    const result = evaluateHomeReport(inputs);
    const planId = store.write((write) =>
      savePlan(write, {
        homeId,
        name: 'Proposal A',
        engineVersion: ENGINE_VERSION,
        inputs,
        result,
      }),
    );
    const saved = store.read((read) => getPlan(read, planId));
    expect(saved).toMatchObject({
      id: planId,
      homeId,
      name: 'Proposal A',
      engineVersion: ENGINE_VERSION,
      createdAt: time.nowIso(),
    });
    expect(saved.inputs).toEqual(inputs);
    const row = store.sqlite
      .prepare('SELECT inputs, inputs_sha256, result FROM plans WHERE id = ?')
      .get(planId) as {
      inputs: string;
      inputs_sha256: string;
      result: string;
    };
    // node:crypto is the outside reference for SHA-256 (FIPS 180-4).
    expect(row.inputs_sha256).toBe(createHash('sha256').update(row.inputs, 'utf8').digest('hex'));
    expect(saved.inputsSha256).toBe(row.inputs_sha256);
    // The saved inputs evaluate again to exactly the saved result, byte for byte.
    expect(JSON.stringify(evaluateHomeReport(saved.inputs))).toBe(row.result);
  });

  it('lists a home’s plans newest first; a plan for a missing home is notFound', () => {
    const { store } = project;
    const homeId = store.write((write) => storeHomeFile(write, validBaseHome()));
    const inputs = store.read((read) => exportHomeFile(read, homeId));
    const result = evaluateHomeReport(inputs);
    const first = store.write((write) =>
      savePlan(write, { homeId, name: 'First', engineVersion: ENGINE_VERSION, inputs, result }),
    );
    time.advanceSeconds(600);
    const second = store.write((write) =>
      savePlan(write, { homeId, name: 'Second', engineVersion: ENGINE_VERSION, inputs, result }),
    );
    expect(store.read((read) => listPlans(read, homeId)).map((plan) => plan.id)).toEqual([
      second,
      first,
    ]);
    expectDbError(
      () =>
        store.write((write) =>
          savePlan(write, {
            homeId: 999,
            name: 'Lost',
            engineVersion: ENGINE_VERSION,
            inputs,
            result,
          }),
        ),
      'notFound',
      'homeId',
    );
    expectDbError(() => store.read((read) => getPlan(read, 999)), 'notFound', 'planId');
  });
});

describe('settings', () => {
  it('a new file has the defaults; an update changes only what it names and survives reopening', () => {
    const { store } = project;
    expect(store.read((read) => getSettings(read))).toEqual(DEFAULT_SETTINGS);
    const returned = store.write((write) =>
      updateSettings(write, { units: 'SI', discountRateReal: 0.04 }),
    );
    const expected = { ...DEFAULT_SETTINGS, units: 'SI', discountRateReal: 0.04 };
    expect(returned).toEqual(expected);
    store.write((write) => updateSettings(write, { laborRateUsdPerHour: 72 }));
    expect(store.read((read) => getSettings(read))).toEqual({
      ...expected,
      laborRateUsdPerHour: 72,
    });
    store.close();
    const reopened = openStore(project.path);
    expect(reopened.read((read) => getSettings(read))).toEqual({
      ...expected,
      laborRateUsdPerHour: 72,
    });
    reopened.close();
  });

  it('an invalid value is InputError naming the setting, and nothing is written', () => {
    const { store } = project;
    expect(
      inputPaths(() =>
        store.write((write) => updateSettings(write, { units: 'SI', discountRateReal: 0.9 })),
      ),
    ).toEqual(['discountRateReal']);
    expect(rowCounts(store.sqlite).settings).toBe(0);
    expect(store.read((read) => getSettings(read))).toEqual(DEFAULT_SETTINGS);
  });

  it('a stored value out of range (edited by hand) falls back to its default', () => {
    const { store } = project;
    store.sqlite
      .prepare("INSERT INTO settings (key, value, updated_at) VALUES ('markupFraction', '99', 'x')")
      .run();
    expect(store.read((read) => getSettings(read))).toEqual(DEFAULT_SETTINGS);
  });

  // Regression check (once a bug in db/repositories/settings.ts, getSettings): a key this version does not know (as a
  // newer Sealwork may store) fails the strict schema with an issue at the root, which the
  // repair loop cannot map to a key, so getSettings throws a ZodError. Its comment promises
  // that a setting from a newer version falls back; expected: the unknown key is ignored.
  it('a setting stored by a newer version is ignored', () => {
    const { store } = project;
    store.sqlite
      .prepare("INSERT INTO settings (key, value, updated_at) VALUES ('futureSetting', '1', 'x')")
      .run();
    expect(store.read((read) => getSettings(read))).toEqual(DEFAULT_SETTINGS);
  });
});

describe('store.write is all or nothing', () => {
  it('a write that throws after two inserts leaves no row behind', () => {
    const { store } = project;
    store.write((write) => createClient(write, { name: 'Already here' }));
    const before = rowCounts(store.sqlite);
    expect(() =>
      store.write((write) => {
        const clientId = createClient(write, { name: 'Half written' });
        createHome(write, { name: 'Half written home', clientId, data: {} });
        throw new Error('the third step failed');
      }),
    ).toThrow('the third step failed');
    expect(rowCounts(store.sqlite)).toEqual(before);
    expect(store.read((read) => listClients(read)).map((client) => client.name)).toEqual([
      'Already here',
    ]);
  });
});
