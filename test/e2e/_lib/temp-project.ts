/**
 * A project file with the demo homes in a fresh temporary folder, opened as the hosts open
 * it (db/project.ts), and removed again afterwards.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { openProject } from '../../../db/project.ts';
import type { Store } from '../../../db/store.ts';

export interface TempProject {
  store: Store;
  close(): void;
}

/**
 * Opens a new project file seeded with the demo scenario.
 *
 * @param prefix - the start of the temporary folder's name
 * @returns the open store; `close()` closes it and deletes the folder
 */
export function openTempProject(prefix: string): TempProject {
  const folder = mkdtempSync(join(tmpdir(), prefix));
  const { store } = openProject(join(folder, 'project.db'), { demoWhenNew: true });
  return {
    store,
    close() {
      store.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}
