/**
 * The built screens. `npm test` builds them before vitest starts; a run of the e2e tests on
 * their own builds them once when ui/dist is missing.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const REPO_ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..', '..');
export const UI_DIST = join(REPO_ROOT, 'ui', 'dist');

/**
 * Builds the screens when ui/dist has no index.html.
 *
 * @returns the folder of the built screens
 */
export function ensureUiBuilt(): string {
  if (!existsSync(join(UI_DIST, 'index.html'))) {
    execFileSync('npm', ['run', '--silent', 'build:ui'], { cwd: REPO_ROOT, stdio: 'pipe' });
  }
  return UI_DIST;
}
