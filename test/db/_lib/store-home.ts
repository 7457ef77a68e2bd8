/**
 * Opens a fresh project file in a temporary folder, and stores a home file through the
 * repositories one part at a time (home, tests, measures), the way the screens build a home,
 * rather than through the importer under test elsewhere.
 */
import { parseHomeFile } from '../../../core/schema.ts';
import { dataOf as dataOfFile } from '../../../db/home-file.ts';
import { createHome, type HomeInput } from '../../../db/repositories/homes.ts';
import { addLeakageTest } from '../../../db/repositories/leakage-tests.ts';
import { addMeasure } from '../../../db/repositories/measures.ts';
import { openStore, type Store, type StoreOptions, type WriteAccess } from '../../../db/store.ts';
import { makeTempFolder, type TempFolder } from '../../_lib/cli-harness.ts';

/** A project file in its own temporary folder. */
export interface TempProject {
  folder: TempFolder;
  path: string;
  store: Store;
  /** Closes the store (if still open) and removes the folder. */
  dispose(): void;
}

/**
 * Opens a new project file under the OS temporary folder.
 *
 * @param options - passed to openStore (a test clock, a target version)
 * @returns the folder, the file's path and the open store
 */
export function openTempProject(options: StoreOptions = {}): TempProject {
  const folder = makeTempFolder('sealwork-db-');
  const path = `${folder.path}/project.db`;
  const store = openStore(path, options);
  return {
    folder,
    path,
    store,
    dispose() {
      if (store.sqlite.open) store.close();
      folder.remove();
    },
  };
}

/** The parts of a home file a home row keeps as its data (the store's own split). */
export { dataOfFile };

/**
 * Stores a home file through createHome, addLeakageTest and addMeasure.
 *
 * @param write - write access
 * @param input - a home file (validated here)
 * @param extra - home fields the file does not carry (clientId, climateId, …)
 * @returns the new home's id
 */
export function storeHomeFile(
  write: WriteAccess,
  input: unknown,
  extra: Partial<Omit<HomeInput, 'data'>> = {},
): number {
  const file = parseHomeFile(input);
  const homeId = createHome(write, { name: file.name, ...extra, data: dataOfFile(file) });
  addLeakageTest(write, homeId, { kind: 'testIn', ...file.leakageTest });
  for (const test of file.otherLeakageTests ?? []) addLeakageTest(write, homeId, test);
  for (const measure of file.measures) addMeasure(write, homeId, measure);
  return homeId;
}
