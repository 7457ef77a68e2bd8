/**
 * Where the project file lives and how it first comes to be. The default file is in the
 * user's data folder and starts with the demo scenario; a file named explicitly starts empty
 * unless the demo is asked for.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { homedir } from 'node:os';
import { dirname, join } from 'node:path';
import { DEMO_HOMES } from './demo/alder-creek.ts';
import { importHomeFile } from './home-file.ts';
import { openStore, type Store, type StoreOptions, type WriteAccess } from './store.ts';

/**
 * The user's data folder for Sealwork: %APPDATA% on Windows, ~/Library/Application Support
 * on macOS, $XDG_DATA_HOME (or ~/.local/share) elsewhere.
 */
export function userDataFolder(
  env: Readonly<Record<string, string | undefined>> = process.env,
  platform: NodeJS.Platform = process.platform,
): string {
  if (platform === 'win32')
    return join(env.APPDATA ?? join(homedir(), 'AppData', 'Roaming'), 'Sealwork');
  if (platform === 'darwin') return join(homedir(), 'Library', 'Application Support', 'Sealwork');
  return join(env.XDG_DATA_HOME ?? join(homedir(), '.local', 'share'), 'sealwork');
}

/** The project file: `SEALWORK_DB` when set, else `sealwork.db` in the user's data folder. */
export function defaultProjectPath(
  env: Readonly<Record<string, string | undefined>> = process.env,
): string {
  return env.SEALWORK_DB ?? join(userDataFolder(env), 'sealwork.db');
}

/** Fills a project with the invented demo scenario. */
export function seedDemo(write: WriteAccess): number[] {
  return DEMO_HOMES.map((home) => importHomeFile(write, home));
}

export interface OpenProjectOptions extends StoreOptions {
  /** Seed the demo when the file is new. */
  demoWhenNew: boolean;
}

/** Opens a project file, creating its folder and, when new and asked for, its demo homes. */
export function openProject(
  path: string,
  options: OpenProjectOptions,
): { store: Store; created: boolean } {
  const created = !existsSync(path);
  if (created) mkdirSync(dirname(path), { recursive: true });
  const store = openStore(path, options);
  if (created && options.demoWhenNew) store.write(seedDemo);
  return { store, created };
}
