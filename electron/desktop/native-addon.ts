/**
 * better-sqlite3 for Electron. node_modules keeps the addon built for Node (the tests and the
 * browser host use it); the desktop app needs one built for Electron's ABI. It is built once,
 * into a folder of its own, from a scratch copy of the package, with npm's node-gyp and
 * Electron's headers, and opened with better-sqlite3's `nativeBinding` option. So `npm test`
 * and `npm start` both work, in any order, with no manual rebuild.
 */
import { execFileSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

/** Where the Electron build of the addon lives for an Electron version. */
export function electronAddonPath(projectRoot: string, electronVersion: string): string {
  return join(
    projectRoot,
    'node_modules',
    '.sealwork-native',
    `electron-${electronVersion}`,
    'better_sqlite3.node',
  );
}

/**
 * Builds the addon for Electron when it is not there yet.
 *
 * @returns the addon's path
 * @throws when the build fails (no compiler, no network for Electron's headers)
 */
export function ensureElectronAddon(projectRoot: string, electronVersion: string): string {
  const target = electronAddonPath(projectRoot, electronVersion);
  if (existsSync(target)) return target;
  const requireHere = createRequire(join(projectRoot, 'package.json'));
  const packageFolder = dirname(requireHere.resolve('better-sqlite3/package.json'));
  const scratch = join(dirname(target), 'better-sqlite3');
  rmSync(scratch, { recursive: true, force: true });
  mkdirSync(dirname(target), { recursive: true });
  cpSync(packageFolder, scratch, {
    recursive: true,
    filter: (source) => !source.includes(`${join('build', '')}`),
  });
  execFileSync(
    'npm',
    [
      'exec',
      '--yes',
      '--',
      'node-gyp',
      'rebuild',
      '--release',
      `--target=${electronVersion}`,
      '--runtime=electron',
      '--dist-url=https://electronjs.org/headers',
    ],
    { cwd: scratch, stdio: 'inherit' },
  );
  cpSync(join(scratch, 'build', 'Release', 'better_sqlite3.node'), target);
  rmSync(scratch, { recursive: true, force: true });
  return target;
}
