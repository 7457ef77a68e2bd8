/**
 * The layers of DESIGN.md, enforced: core → nothing but core and two pure packages; db →
 * core; electron → core and db; ui → core, plus `import type` from electron/channels.ts.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const LAYERS = ['core', 'db', 'electron', 'ui'] as const;
type Layer = (typeof LAYERS)[number];

interface Rule {
  /** Project folders this layer may import from. */
  folders: readonly Layer[];
  /** npm packages it may import; `*` for any. */
  packages: readonly string[] | '*';
  nodeBuiltins: boolean;
}

const RULES: Record<Layer, Rule> = {
  core: { folders: ['core'], packages: ['decimal.js', 'zod'], nodeBuiltins: false },
  db: {
    folders: ['core', 'db'],
    packages: ['better-sqlite3', 'papaparse', 'zod', 'decimal.js'],
    nodeBuiltins: true,
  },
  electron: { folders: ['core', 'db', 'electron'], packages: '*', nodeBuiltins: true },
  ui: {
    folders: ['core', 'ui'],
    packages: ['svelte', 'chart.js', 'chartjs-plugin-annotation', 'decimal.js', 'zod'],
    nodeBuiltins: false,
  },
};

function allowedText(layer: Layer): string {
  const rule = RULES[layer];
  const packages = rule.packages === '*' ? 'any package' : `packages ${rule.packages.join(', ')}`;
  const extra = layer === 'ui' ? '; `import type` from electron/channels.ts' : '';
  return `${layer}/ may import ${rule.folders.map((f) => `${f}/`).join(', ')}; ${packages}${
    rule.nodeBuiltins ? '; Node built-ins' : '; no Node built-ins'
  }${extra}`;
}

export interface ImportUse {
  specifier: string;
  typeOnly: boolean;
}

/** Every module a source text imports, re-exports or loads dynamically. */
export function importsOf(source: string): ImportUse[] {
  const uses: ImportUse[] = [];
  const patterns = [
    /^\s*(import|export)\s+(type\s+)?[^'";]*?from\s+['"]([^'"]+)['"]/gm,
    /^\s*import\s+['"]([^'"]+)['"]/gm,
    /\bimport\(\s*['"]([^'"]+)['"]\s*\)/g,
    /\brequire\(\s*['"]([^'"]+)['"]\s*\)/g,
  ];
  for (const match of source.matchAll(patterns[0] as RegExp)) {
    uses.push({ specifier: match[3] ?? '', typeOnly: match[2] !== undefined });
  }
  for (const pattern of patterns.slice(1)) {
    for (const match of source.matchAll(pattern))
      uses.push({ specifier: match[1] ?? '', typeOnly: false });
  }
  return uses;
}

/** The problem with one import of a file in `layer`, or null when it is allowed. */
export function checkImport(layer: Layer, fileRelative: string, use: ImportUse): string | null {
  const rule = RULES[layer];
  const { specifier } = use;
  if (specifier.startsWith('.')) {
    const target = relative(ROOT, resolve(ROOT, dirname(fileRelative), specifier))
      .split(sep)
      .join('/');
    const folder = target.split('/')[0] as Layer;
    if (rule.folders.includes(folder)) return null;
    if (layer === 'ui' && use.typeOnly && target === 'electron/channels.ts') return null;
    return `${fileRelative} imports ${target}`;
  }
  if (specifier.startsWith('node:') || BUILTINS.has(specifier.split('/')[0] ?? '')) {
    return rule.nodeBuiltins ? null : `${fileRelative} imports the Node built-in ${specifier}`;
  }
  const packageName = specifier.startsWith('@')
    ? specifier.split('/').slice(0, 2).join('/')
    : (specifier.split('/')[0] ?? specifier);
  if (rule.packages === '*' || rule.packages.includes(packageName)) return null;
  return `${fileRelative} imports the package ${packageName}`;
}

const BUILTINS = new Set([
  'fs',
  'path',
  'os',
  'child_process',
  'http',
  'https',
  'net',
  'url',
  'util',
  'crypto',
  'stream',
  'events',
  'worker_threads',
  'process',
]);

/**
 * Build configuration (vite.config.*) runs in Node at build time, not in the layer it
 * configures, so it may import build tools; it is left out of the check by name.
 */
const BUILD_CONFIG = /^vite\.config\.[cm]?[jt]s$/;

function sourceFiles(folder: string): string[] {
  const absolute = join(ROOT, folder);
  let entries: string[];
  try {
    entries = readdirSync(absolute);
  } catch {
    return [];
  }
  return entries.flatMap((entry) => {
    const path = join(folder, entry);
    if (statSync(join(ROOT, path)).isDirectory()) {
      return entry === 'node_modules' || entry === 'dist' ? [] : sourceFiles(path);
    }
    if (BUILD_CONFIG.test(entry)) return [];
    return /\.(ts|mts|js|mjs|svelte)$/.test(entry) ? [path.split(sep).join('/')] : [];
  });
}

describe('layering', () => {
  for (const layer of LAYERS) {
    it(`${layer}/ imports only what its layer allows`, () => {
      const problems = sourceFiles(layer).flatMap((file) =>
        importsOf(readFileSync(join(ROOT, file), 'utf8'))
          .map((use) => checkImport(layer, file, use))
          .filter((problem): problem is string => problem !== null),
      );
      expect(problems, `${problems.join('\n')}\nAllowed: ${allowedText(layer)}`).toEqual([]);
    });
  }

  it('core/ holds source files to check', () => {
    expect(sourceFiles('core').length).toBeGreaterThan(10);
  });

  describe('the checker itself', () => {
    it('flags a core file that reads the disk or imports db/', () => {
      const uses = importsOf(
        "import { readFileSync } from 'node:fs';\nimport { x } from '../db/demo/a.ts';",
      );
      expect(uses.map((use) => checkImport('core', 'core/plan.ts', use))).toEqual([
        'core/plan.ts imports the Node built-in node:fs',
        'core/plan.ts imports db/demo/a.ts',
      ]);
    });

    it('flags db/ importing the shell and ui/ importing db/', () => {
      expect(
        checkImport('db', 'db/homes.ts', { specifier: '../electron/main.ts', typeOnly: false }),
      ).toBe('db/homes.ts imports electron/main.ts');
      expect(
        checkImport('ui', 'ui/bridge.ts', { specifier: '../db/open.ts', typeOnly: false }),
      ).toBe('ui/bridge.ts imports db/open.ts');
      expect(checkImport('core', 'core/a.ts', { specifier: 'electron', typeOnly: false })).toBe(
        'core/a.ts imports the package electron',
      );
      expect(
        checkImport('core', 'core/a.ts', { specifier: 'better-sqlite3', typeOnly: false }),
      ).toBe('core/a.ts imports the package better-sqlite3');
    });

    it('lets ui/ take only types from the channel table', () => {
      const typeUse = importsOf("import type { Channels } from '../electron/channels.ts';")[0];
      const valueUse = importsOf("import { channels } from '../electron/channels.ts';")[0];
      expect(typeUse && checkImport('ui', 'ui/bridge.ts', typeUse)).toBeNull();
      expect(valueUse && checkImport('ui', 'ui/bridge.ts', valueUse)).toBe(
        'ui/bridge.ts imports electron/channels.ts',
      );
    });

    it('finds dynamic imports and re-exports', () => {
      const uses = importsOf("export { a } from './a.ts';\nconst m = await import('node:os');");
      expect(uses.map((use) => use.specifier).sort()).toEqual(['./a.ts', 'node:os']);
    });
  });
});
