/**
 * The parent's look at a project file after a child was killed: SQLite's own checks, and
 * every transaction the crash writer left, whole or not.
 */
import { createHash } from 'node:crypto';
import { openStore } from '../../../db/store.ts';
import { declaredRows } from './_shared.ts';

/** What one inspection found. */
export interface Inspection {
  /** `PRAGMA integrity_check`: 'ok' or the first problems SQLite lists. */
  integrity: string;
  /** `PRAGMA foreign_key_check` rows (empty when every link holds). */
  foreignKeyProblems: unknown[];
  schemaVersion: number;
  /** Ids of the transactions whose homes are in the file. */
  transactions: Set<string>;
  /** Homes whose rows differ from their declaration, and batches with homes missing. */
  incomplete: string[];
  homeCount: number;
}

interface HomeCounts {
  name: string;
  notes: string | null;
  measures: number;
  tests: number;
  points: number;
}

const HOME_COUNTS_SQL = `
  SELECT h.name, h.notes,
         (SELECT count(*) FROM measures m WHERE m.home_id = h.id) AS measures,
         (SELECT count(*) FROM leakage_tests t WHERE t.home_id = h.id) AS tests,
         (SELECT count(*) FROM leakage_test_points p JOIN leakage_tests t ON t.id = p.test_id
           WHERE t.home_id = h.id) AS points
  FROM homes h ORDER BY h.id`;

/**
 * Opens the file as the app would (the first connection after a crash recovers the WAL)
 * and checks it.
 *
 * @param dbPath - the project file
 * @param options - `readonly` leaves the WAL as the killed process left it (a read-only
 *   connection cannot checkpoint), so the next writer has to recover it itself
 */
export function inspectProject(dbPath: string, options: { readonly: boolean }): Inspection {
  const store = openStore(dbPath, { readonly: options.readonly });
  try {
    const integrity = String(store.sqlite.pragma('integrity_check', { simple: true }));
    const foreignKeyProblems = store.sqlite.pragma('foreign_key_check') as unknown[];
    const schemaVersion = store.sqlite.pragma('user_version', { simple: true }) as number;
    const homes = store.sqlite.prepare(HOME_COUNTS_SQL).all() as HomeCounts[];
    const transactions = new Set<string>();
    const incomplete: string[] = [];
    const batches = new Map<string, { declaredHomes: number; indexes: Set<number> }>();
    for (const home of homes) {
      const declared = declaredRows(home.notes);
      const counted = { measures: home.measures, tests: home.tests, points: home.points };
      if (!declared || JSON.stringify(declared) !== JSON.stringify(counted)) {
        incomplete.push(
          `${home.name}: declares ${JSON.stringify(declared)}, has ${JSON.stringify(counted)}`,
        );
      }
      const single = /^tx (\S+)$/.exec(home.name);
      const batched = /^batch (\S+) #(\d+)$/.exec(home.name);
      const batchSize = /^batch \S+ of (\d+) /.exec(home.notes ?? '');
      if (single?.[1]) transactions.add(single[1]);
      else if (batched?.[1] && batched[2] && batchSize?.[1]) {
        const batch = batches.get(batched[1]) ?? {
          declaredHomes: Number(batchSize[1]),
          indexes: new Set<number>(),
        };
        batch.indexes.add(Number(batched[2]));
        batches.set(batched[1], batch);
        transactions.add(batched[1]);
      } else incomplete.push(`${home.name}: not written by the crash writer`);
    }
    for (const [id, batch] of batches) {
      if (batch.indexes.size !== batch.declaredHomes) {
        incomplete.push(`batch ${id}: ${batch.indexes.size} of ${batch.declaredHomes} homes`);
      }
    }
    return {
      integrity,
      foreignKeyProblems,
      schemaVersion,
      transactions,
      incomplete,
      homeCount: homes.length,
    };
  } finally {
    store.close();
  }
}

const CONTENT_QUERIES = [
  'SELECT id, name, notes, data, created_at, updated_at FROM homes ORDER BY id',
  'SELECT id, home_id, position, key, estimate, materials_usd FROM measures ORDER BY id',
  'SELECT id, home_id, position, kind, cfm50 FROM leakage_tests ORDER BY id',
  'SELECT test_id, position, pressure_pa, flow_cfm FROM leakage_test_points ORDER BY test_id, position',
];

/**
 * A SHA-256 over the homes, measures and tests of a file, to compare a project with its
 * backup or with itself before a kill.
 *
 * @param dbPath - a project file or a backup
 * @returns hex digest
 */
export function contentDigest(dbPath: string): string {
  const store = openStore(dbPath, { readonly: true });
  try {
    const hash = createHash('sha256');
    for (const sql of CONTENT_QUERIES) {
      for (const row of store.sqlite.prepare(sql).raw().iterate()) hash.update(JSON.stringify(row));
    }
    return hash.digest('hex');
  } finally {
    store.close();
  }
}
