/**
 * Bundles the main process and the preload for Electron, which cannot run TypeScript: two
 * CommonJS files in dist/electron/, with electron and the native better-sqlite3 left out.
 */
import { build } from 'esbuild';
import { join } from 'node:path';

/** Builds dist/electron/main.cjs and preload.cjs; returns the main bundle's path. */
export async function buildDesktop(projectRoot: string): Promise<string> {
  const outdir = join(projectRoot, 'dist', 'electron');
  const common = {
    bundle: true,
    platform: 'node' as const,
    format: 'cjs' as const,
    target: 'node20',
    sourcemap: true,
    external: ['electron', 'better-sqlite3'],
    logLevel: 'warning' as const,
  };
  await build({
    ...common,
    entryPoints: [join(projectRoot, 'electron', 'main.ts')],
    outfile: join(outdir, 'main.cjs'),
  });
  await build({
    ...common,
    entryPoints: [join(projectRoot, 'electron', 'preload.ts')],
    outfile: join(outdir, 'preload.cjs'),
  });
  return join(outdir, 'main.cjs');
}
