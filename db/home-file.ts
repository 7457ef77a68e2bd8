/**
 * A stored home as a `sealwork-home/1` file and back. Export resolves everything the home
 * relies on (a linked climate or price set, the library defaults its measures use) so the
 * file stands on its own; import stores it as a new home. Export → import → export gives the
 * same file.
 */
import { InputError } from '../core/errors.ts';
import type { MeasureLookup } from '../core/measure-library.ts';
import {
  HOME_FILE_FORMAT,
  parseHomeFile,
  type HomeData,
  type HomeFile,
  type Measure,
  type OtherLeakageTest,
} from '../core/schema.ts';
import { createClient, findOrCreateClient, getClient } from './repositories/clients.ts';
import { createHome, getHome } from './repositories/homes.ts';
import {
  addLeakageTest,
  listLeakageTests,
  type LeakageTestRecord,
} from './repositories/leakage-tests.ts';
import { effectiveLibrary } from './repositories/library.ts';
import { addMeasure, listMeasures } from './repositories/measures.ts';
import { climates, priceSets } from './repositories/reusable-sets.ts';
import type { ReadAccess, WriteAccess } from './store.ts';

/**
 * The test-in a plan is built on: the one marked as its basis; without a mark, the latest
 * dated one, and among tests of the same date (or undated) the first listed.
 */
export function planTestOf(tests: readonly LeakageTestRecord[]): LeakageTestRecord | undefined {
  const marked = tests.find((record) => record.planBasis && record.test.kind === 'testIn');
  if (marked) return marked;
  let chosen: LeakageTestRecord | undefined;
  for (const record of tests) {
    if (record.test.kind !== 'testIn') continue;
    if (chosen === undefined || (record.test.testedOn ?? '') > (chosen.test.testedOn ?? ''))
      chosen = record;
  }
  return chosen;
}

/** A measure with the library defaults it relies on written out. */
function withDefaults(measure: Measure, library: MeasureLookup): Measure {
  const type = library.find(measure.type);
  if (!type) return measure;
  const resolved: Measure = { ...measure, location: measure.location ?? type.location };
  if (measure.byUnits) {
    resolved.byUnits = {
      units: measure.byUnits.units,
      leakageAreaIn2PerUnit: measure.byUnits.leakageAreaIn2PerUnit ?? {
        ...type.leakageAreaIn2PerUnit,
      },
      sealingEffectiveness: measure.byUnits.sealingEffectiveness ?? {
        ...type.sealingEffectiveness,
      },
    };
  }
  resolved.lifeYears = measure.lifeYears ?? type.defaultLifeYears;
  return resolved;
}

function withoutKind(test: OtherLeakageTest): HomeFile['leakageTest'] {
  const { kind: _kind, ...rest } = test;
  return rest;
}

/**
 * The home as a home file.
 *
 * @throws InputError naming each part the home still lacks (a draft cannot be exported)
 */
export function exportHomeFile(read: ReadAccess, homeId: number): HomeFile {
  const home = getHome(read, homeId);
  const tests = listLeakageTests(read, homeId);
  const planTest = planTestOf(tests);
  if (!planTest) throw InputError.at('leakageTest', 'is required: the home has no test-in yet');
  const library = effectiveLibrary(read);
  const client = home.clientId === null ? undefined : getClient(read, home.clientId);
  const { data } = home;
  const file: Record<string, unknown> = { format: HOME_FILE_FORMAT, name: home.name };
  if (home.isDemo) file.demo = true;
  if (Object.keys(home.address).length > 0) file.address = { ...home.address };
  if (client) {
    file.client = {
      name: client.name,
      ...(client.phone === null ? {} : { phone: client.phone }),
      ...(client.email === null ? {} : { email: client.email }),
    };
  }
  if (home.notes !== null) file.notes = home.notes;
  Object.assign(file, data);
  file.climate = home.climateId === null ? data.climate : climates.get(read, home.climateId).data;
  file.prices = home.priceSetId === null ? data.prices : priceSets.get(read, home.priceSetId).data;
  file.leakageTest = withoutKind(planTest.test);
  const others = tests.filter((record) => record !== planTest).map((record) => record.test);
  if (others.length > 0) file.otherLeakageTests = others;
  file.measures = listMeasures(read, homeId).map((record) => withDefaults(record.measure, library));
  return parseHomeFile(file);
}

/** The parts of a home file a home row stores as its data. */
export function dataOf(file: HomeFile): HomeData {
  const {
    format: _format,
    name: _name,
    demo: _demo,
    address: _address,
    client: _client,
    notes: _notes,
    leakageTest: _leakageTest,
    otherLeakageTests: _others,
    measures: _measures,
    ...data
  } = file;
  return data;
}

/**
 * Stores a home file as a new home, with its client (matched by name and email, or new),
 * tests and measures.
 *
 * @returns the new home's id
 * @throws InputError listing every problem of the file; nothing is written then
 */
export function importHomeFile(
  write: WriteAccess,
  input: unknown,
  options: { newClient?: boolean } = {},
): number {
  const file = parseHomeFile(input);
  let clientId: number | null = null;
  if (file.client)
    clientId = options.newClient
      ? createClient(write, file.client)
      : findOrCreateClient(write, file.client);
  const homeId = createHome(write, {
    name: file.name,
    clientId,
    ...(file.address ? { address: file.address } : {}),
    isDemo: file.demo ?? false,
    ...(file.notes === undefined ? {} : { notes: file.notes }),
    data: dataOf(file),
  });
  addLeakageTest(write, homeId, { kind: 'testIn', ...file.leakageTest }, { planBasis: true });
  for (const test of file.otherLeakageTests ?? []) addLeakageTest(write, homeId, test);
  file.measures.forEach((measure, index) => {
    try {
      addMeasure(write, homeId, measure);
    } catch (error) {
      if (error instanceof InputError) {
        throw new InputError(
          error.problems.map((problem) => ({
            path: problem.path === '' ? `measures[${index}]` : `measures[${index}].${problem.path}`,
            message: problem.message,
          })),
        );
      }
      throw error;
    }
  });
  return homeId;
}
