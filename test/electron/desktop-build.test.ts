/**
 * The desktop bundles: Electron runs two CommonJS files built from the TypeScript sources.
 * Built into a temporary copy of the output folder; nothing here loads Electron.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { afterAll, describe, expect, it } from 'vitest';

const ROOT = join(import.meta.dirname, '..', '..');
const OUT = mkdtempSync(join(tmpdir(), 'sealwork-desktop-'));
afterAll(() => rmSync(OUT, { recursive: true, force: true }));

async function bundle(entry: string): Promise<string> {
  const outfile = join(OUT, `${entry}.cjs`);
  await build({
    entryPoints: [join(ROOT, 'electron', `${entry}.ts`)],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    external: ['electron', 'better-sqlite3'],
    logLevel: 'silent',
  });
  return readFileSync(outfile, 'utf8');
}

describe('desktop bundles', () => {
  it('bundle the main process with electron and the native addon left to the runtime', async () => {
    const main = await bundle('main');
    expect(main).toContain('require("electron")');
    expect(main).toContain('require("better-sqlite3")');
    // The channel table and the core travel inside the bundle.
    expect(main).toContain('homes.list');
    expect(main).toContain('sealwork-home/1');
  }, 30_000);

  it('bundle a preload that needs nothing but electron', async () => {
    const preload = await bundle('preload');
    const required = [...preload.matchAll(/require\("([^"]+)"\)/g)].map((match) => match[1]);
    expect([...new Set(required)]).toEqual(['electron']);
    expect(preload).toContain('exposeInMainWorld');
  }, 30_000);
});
