/**
 * A stored home as a `sealwork-home/1` file and back. Export resolves everything the home
 * relies on (a linked climate or price set, the library defaults its measures use) so the
 * file stands on its own; import stores it as a new home. Export → import → export gives the
 * same file.
 *
 * A home planned hour by hour relies on the weather year its climate was made from. Asked
 * for (`withWeatherYear`, as the homeFile.export channels and the command line ask), export
 * writes that year into the file (`weatherYear`); import then stores the file's climate
 * with those hours, or links the home to an identical stored climate (home-file-weather.ts),
 * so the home evaluates to the same figures in any project. Left out otherwise: the store's
 * own evaluations read the hours from the store, and a portfolio's files should not carry a
 * copy of the year for every home.
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
import { climateOfWeatherYear, homeWeatherYearOfClimate } from './home-file-weather.ts';
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

/** What an export writes besides the home itself. */
export interface HomeFileExportOptions {
  /**
   * For a home planned hour by hour: the weather year of its climate, so the file can be
   * evaluated and imported elsewhere (left out when the climate has no stored hours).
   */
  withWeatherYear?: boolean;
}

/**
 * The home as a home file.
 *
 * @param options.withWeatherYear - write an hourly home's weather year into the file
 * @throws InputError naming each part the home still lacks (a draft cannot be exported)
 */
export function exportHomeFile(
  read: ReadAccess,
  homeId: number,
  options: HomeFileExportOptions = {},
): HomeFile {
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
  if (options.withWeatherYear && data.hourlyWeather !== undefined && home.climateId !== null) {
    const weatherYear = homeWeatherYearOfClimate(read, home.climateId);
    if (weatherYear !== undefined) file.weatherYear = weatherYear;
  }
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
    weatherYear: _weatherYear,
    ...data
  } = file;
  return data;
}

/**
 * Stores a home file as a new home, with its client (matched by name and email, or new),
 * tests and measures; a file with a `weatherYear` links the home to a stored climate with
 * those hours (an identical one already stored, or a new one).
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
  const climateId =
    file.weatherYear === undefined
      ? null
      : climateOfWeatherYear(write, file.climate, file.weatherYear);
  const homeId = createHome(write, {
    name: file.name,
    clientId,
    ...(climateId === null ? {} : { climateId }),
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
