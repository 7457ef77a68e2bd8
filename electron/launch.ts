/**
 * What `npm start` runs: the desktop window where the Electron binary is installed, the
 * browser host otherwise (same screens, same channels, on 127.0.0.1). Options:
 * `--db PATH` (the project file), `--demo` (fill a new file with the demo homes),
 * `--no-open` (do not open the system browser), `--browser` (the browser host even where
 * Electron is present).
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { defaultProjectPath, openProject } from '../db/project.ts';
import { buildDesktop } from './desktop/build.ts';
import { startBrowserHost } from './serve.ts';

const HERE = dirname(fileURLToPath(import.meta.url));
const UI_ROOT = join(HERE, '..', 'ui', 'dist');

/**
 * The Electron binary's path when it is really installed, else null (`packageFolder`, the
 * electron package's folder, is found through Node's resolution unless given). Reads the package's
 * `path.txt` rather than `require('electron')`, which tries to download a missing binary.
 */
export function electronBinary(packageFolder?: string): string | null {
  try {
    const folder =
      packageFolder ?? dirname(createRequire(import.meta.url).resolve('electron/package.json'));
    const pathFile = join(folder, 'path.txt');
    if (!existsSync(pathFile)) return null;
    const binary = join(folder, 'dist', readFileSync(pathFile, 'utf8').trim());
    return existsSync(binary) ? binary : null;
  } catch {
    return null;
  }
}

/**
 * Builds the screens into ui/dist when they are not built yet (a fresh clone), so `npm start`
 * right after `npm ci` shows them.
 */
async function ensureScreensBuilt(): Promise<boolean> {
  if (existsSync(join(UI_ROOT, 'index.html'))) return true;
  try {
    const { build } = await import('vite');
    console.log('Building the screens (first start)…');
    await build({ configFile: join(HERE, '..', 'ui', 'vite.config.mts'), logLevel: 'warn' });
    return existsSync(join(UI_ROOT, 'index.html'));
  } catch (error) {
    console.error(`The screens could not be built: ${(error as Error).message}`);
    return false;
  }
}

function openInBrowser(url: string): void {
  const command =
    process.platform === 'darwin' ? 'open' : process.platform === 'win32' ? 'explorer' : 'xdg-open';
  const child = spawn(command, [url], { detached: true, stdio: 'ignore' });
  child.on('error', () => undefined); // no system browser: the printed address is enough
  child.unref();
}

export async function launch(argv: readonly string[]): Promise<void> {
  const { values } = parseArgs({
    args: [...argv],
    options: {
      db: { type: 'string' },
      demo: { type: 'boolean' },
      'no-open': { type: 'boolean' },
      browser: { type: 'boolean' },
    },
  });
  const screens = await ensureScreensBuilt();
  const binary = values.browser ? null : electronBinary();
  if (binary) {
    const mainBundle = await buildDesktop(join(HERE, '..'));
    const child = spawn(binary, [mainBundle, ...argv], { stdio: 'inherit' });
    child.on('exit', (code) => process.exit(code ?? 0));
    return;
  }
  const path = values.db ?? defaultProjectPath();
  const { store } = openProject(path, {
    demoWhenNew: values.db === undefined || values.demo === true,
  });
  const host = await startBrowserHost({
    context: { store },
    uiRoot: screens ? UI_ROOT : null,
  });
  console.log(
    `Sealwork is running in your browser at ${host.url} (token ${host.token}); project ${path}`,
  );
  if (!screens) console.log('The screens are not available; the channels answer at /api/.');
  if (!values['no-open']) openInBrowser(host.url);
  const stop = () => {
    void host.close().then(() => {
      store.close();
      process.exit(0);
    });
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
