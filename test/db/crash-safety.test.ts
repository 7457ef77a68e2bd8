/**
 * A project file survives the process that writes it being killed at any moment. A child
 * process (test/db/_workers/crash-writer.ts) writes to a real file in a temporary folder,
 * each transaction self-describing (a home's notes declare its measures, tests and test
 * points; a batch's homes declare the batch size), and this test SIGKILLs it again and
 * again, reopening the same file each time so damage would pile up.
 *
 * What SQLite promises, and so what is checked after every kill:
 * - "Atomic Commit In SQLite" (sqlite.org/atomiccommit.html): a transaction appears whole
 *   or not at all, even when the process dies part-way through writing it. Checked: every
 *   home has exactly the rows it declares, every batch has all its homes or none, and
 *   `PRAGMA integrity_check` is 'ok' and `PRAGMA foreign_key_check` empty.
 * - "Write-Ahead Logging" (sqlite.org/wal.html): a transaction commits when a frame marked
 *   as a commit is appended to the WAL; frames after the last commit frame (a killed
 *   transaction, pages a full cache spilled early, a COMMIT half written) are ignored by the
 *   next connection, which rebuilds the WAL index from the file. Checked with read-only
 *   inspections that leave the killed process's WAL for the next writer to recover and
 *   write after, and with kills right after the child saw uncommitted pages reach the WAL.
 * - `PRAGMA synchronous` (sqlite.org/pragma.html#pragma_synchronous): in WAL mode with
 *   NORMAL, a commit may be lost to a power cut but transactions are durable across
 *   application crashes. Checked: every transaction whose `store.write` returned before
 *   the kill is in the file, and stays there.
 *
 * The kill schedule (kinds, delays, sizes) comes from a seeded generator, so a run can be
 * replayed with SEALWORK_CRASH_SEED; where exactly a kill lands still depends on timing,
 * which is why a kill only counts as "inside a transaction" when the file proves it: the
 * child announced the transaction from inside BEGIN IMMEDIATE and it is absent afterwards.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { backupTo, checkBackup } from '../../db/backup.ts';
import { importHomeFile } from '../../db/home-file.ts';
import { LATEST_SCHEMA_VERSION } from '../../db/migrations/index.ts';
import { openStore } from '../../db/store.ts';
import { makeTempFolder } from '../_lib/cli-harness.ts';
import { delay, killRunningWorkers, startWorker, type WorkerExit } from './_workers/_harness.ts';
import { contentDigest, inspectProject } from './_workers/_inspect.ts';
import { declaringHomeFile, seededRandom } from './_workers/_shared.ts';

const SEED = Number(process.env.SEALWORK_CRASH_SEED ?? 20_250_611);
/** Homes per batch transaction. */
const BATCH_HOMES = 500;
/** The page cache of the children that must spill a batch into the WAL before COMMIT, KiB. */
const SPILL_CACHE_KIB = 1024;
/** Expected run on 2 cores is 25–40 s; the limits leave room for a loaded machine. */
const KILL_TEST_TIMEOUT_MS = 75_000;
const BACKUP_TEST_TIMEOUT_MS = 40_000;

type KillKind = 'homes' | 'batch' | 'spill' | 'startup';
/** How many kills of each kind; 24 in all, shuffled by the seed. */
const KILL_PLAN: Record<KillKind, number> = { homes: 8, batch: 7, spill: 6, startup: 3 };

const folder = makeTempFolder('sealwork-crash-');
afterAll(() => {
  killRunningWorkers();
  folder.remove();
});

function commitTimesMs(lines: readonly string[]): number[] {
  return lines
    .filter((line) => line.startsWith('commit '))
    .map((line) => Number(line.split(' ')[2]));
}

function shuffledPlan(random: ReturnType<typeof seededRandom>): KillKind[] {
  const kinds = (Object.entries(KILL_PLAN) as [KillKind, number][]).flatMap(([kind, count]) =>
    Array.from({ length: count }, () => kind),
  );
  for (let index = kinds.length - 1; index > 0; index -= 1) {
    const other = random.integer(0, index);
    [kinds[index], kinds[other]] = [kinds[other] as KillKind, kinds[index] as KillKind];
  }
  return kinds;
}

/** Transactions announced and acknowledged across all children, and what the file showed. */
class Ledger {
  readonly begun = new Set<string>();
  readonly committed = new Set<string>();
  readonly rolledBack = new Set<string>();
  present = new Set<string>();

  /** Reads a child's lines; returns the transaction it was in when it died, if any. */
  record(exit: WorkerExit): string | undefined {
    let open: string | undefined;
    for (const line of exit.lines) {
      const [word, id] = line.split(' ');
      if (word === 'begin' && id) {
        this.begun.add(id);
        open = id;
      }
      if (word === 'commit' && id) {
        this.committed.add(id);
        open = undefined;
      }
    }
    return open;
  }

  /** Problems of a new inspection against everything known so far. */
  problems(found: Set<string>): string[] {
    const problems: string[] = [];
    for (const id of this.committed) if (!found.has(id)) problems.push(`committed ${id} is gone`);
    for (const id of this.present) if (!found.has(id)) problems.push(`${id} was there, now gone`);
    for (const id of found) {
      if (!this.begun.has(id)) problems.push(`${id} was never begun`);
      if (this.rolledBack.has(id)) problems.push(`${id} came back after being rolled back`);
    }
    this.present = found;
    return problems;
  }
}

describe('a project file killed mid-write (SIGKILL)', () => {
  it(
    'keeps every transaction whole or absent and every commit, across 24 kills of one file',
    async () => {
      const random = seededRandom(SEED);
      const dbPath = join(folder.path, 'project.sealwork');
      const ledger = new Ledger();
      const context = `seed ${SEED}`;

      // A clean run first: it creates the file, shows the writer leaves whole batches when
      // not killed, and times a batch so the kills below can aim inside one.
      const calibration = await startWorker('crash-writer.ts', [
        ...['--db', dbPath, '--run', '0', '--mode', 'batch', '--transactions', '2'],
        ...['--seed', String(SEED)],
      ]).exited;
      expect(calibration.stderr, context).toBe('');
      expect(calibration.code, context).toBe(0);
      ledger.record(calibration);
      const batchMs = Math.max(...commitTimesMs(calibration.lines));
      expect(ledger.problems(inspectProject(dbPath, { readonly: false }).transactions)).toEqual([]);

      const insideByKind: Record<KillKind, number> = { homes: 0, batch: 0, spill: 0, startup: 0 };
      let leftoverWals = 0;
      const plan = shuffledPlan(random);
      for (const [index, kind] of plan.entries()) {
        const run = index + 1;
        const args = ['--db', dbPath, '--run', String(run), '--seed', String(SEED + run)];
        if (kind === 'homes' || kind === 'startup') args.push('--mode', 'homes');
        else args.push('--mode', 'batch', '--batch-homes', String(BATCH_HOMES));
        if (kind === 'spill') args.push('--cache-kib', String(SPILL_CACHE_KIB));
        const worker = startWorker('crash-writer.ts', args);
        if (kind === 'startup') {
          // Anywhere from loading modules through opening the file to the first writes.
          await delay(random.integer(100, 900));
        } else {
          await worker.waitForLine((line) =>
            line.startsWith(kind === 'spill' ? 'spilled ' : 'begin '),
          );
          const waitMs = kind === 'homes' ? random.integer(5, 150) : random.next() * 0.9 * batchMs;
          await delay(kind === 'spill' ? random.integer(0, 15) : waitMs);
        }
        worker.kill();
        const exit = await worker.exited;
        const where = `${context}, kill ${run} (${kind})`;
        expect(exit.signal, where).toBe('SIGKILL');
        expect(exit.stderr, where).toBe('');
        const openAtKill = ledger.record(exit);
        if (existsSync(`${dbPath}-wal`)) leftoverWals += 1;

        // Mostly read-only, so the killed child's WAL is left for the next child to recover;
        // every fourth time read-write, which recovers, checkpoints and removes the WAL.
        const found = inspectProject(dbPath, { readonly: run % 4 !== 0 });
        expect(found.integrity, where).toBe('ok');
        expect(found.foreignKeyProblems, where).toEqual([]);
        expect(found.schemaVersion, where).toBe(LATEST_SCHEMA_VERSION);
        expect(found.incomplete, where).toEqual([]);
        expect(ledger.problems(found.transactions), where).toEqual([]);
        if (openAtKill !== undefined && !found.transactions.has(openAtKill)) {
          ledger.rolledBack.add(openAtKill);
          insideByKind[kind] += 1;
        }
      }

      // After all the kills the file still takes writes, and a clean run leaves it whole.
      const last = await startWorker('crash-writer.ts', [
        ...['--db', dbPath, '--run', String(plan.length + 1), '--mode', 'homes'],
        ...['--transactions', '20', '--seed', String(SEED)],
      ]).exited;
      expect(last.stderr, context).toBe('');
      expect(last.code, context).toBe(0);
      ledger.record(last);
      const final = inspectProject(dbPath, { readonly: false });
      expect(final.integrity, context).toBe('ok');
      expect(final.incomplete, context).toEqual([]);
      expect(ledger.problems(final.transactions), context).toEqual([]);

      const inside = Object.values(insideByKind).reduce((sum, count) => sum + count, 0);
      console.log(
        `crash-safety: ${plan.length} kills, ${inside} proven inside a transaction ` +
          `(${JSON.stringify(insideByKind)}), ${ledger.rolledBack.size} transactions rolled back, ` +
          `${ledger.committed.size} committed, ${leftoverWals} kills left a WAL, ` +
          `${final.homeCount} homes, batch ${batchMs} ms, ${context}`,
      );
      // A kill in a batch waits for the child's "spilled" line and fires within 15 ms, while
      // the batch still has most of its homes to import: each of these must land inside.
      expect(insideByKind.spill, context).toBe(KILL_PLAN.spill);
      expect(inside, context).toBeGreaterThanOrEqual(KILL_PLAN.spill + KILL_PLAN.batch / 2);
    },
    KILL_TEST_TIMEOUT_MS,
  );

  it(
    'a backup killed part-way leaves the project as it was and no half backup under the final name',
    async () => {
      const random = seededRandom(SEED ^ 0x5bd1e995);
      const dbPath = join(folder.path, 'backed-up.sealwork');
      const backupPath = join(folder.path, 'backed-up.backup.sealwork');
      const store = openStore(dbPath);
      store.write((write) => {
        for (let index = 1; index <= 600; index += 1) {
          const file = declaringHomeFile(
            {
              name: `tx seed.${index}`,
              marker: `tx seed.${index}`,
              ...{ measures: 3, testInPoints: 4, testOutPoints: [2], paddingChars: 8000 },
            },
            random,
          );
          importHomeFile(write, file);
        }
      });
      store.close();
      const before = contentDigest(dbPath);

      // Two whole backups, to time one and to leave a good backup under the final name.
      const calibration = await startWorker('crash-backup.ts', [
        ...['--db', dbPath, '--backup', backupPath, '--count', '2'],
      ]).exited;
      expect(calibration.stderr).toBe('');
      expect(calibration.code).toBe(0);
      const backupMs = Math.max(
        ...calibration.lines
          .filter((l) => l.startsWith('done '))
          .map((l) => Number(l.split(' ')[2])),
      );
      expect(contentDigest(backupPath)).toBe(before);

      let killedMidCopy = 0;
      for (let kill = 1; kill <= 5; kill += 1) {
        const worker = startWorker('crash-backup.ts', ['--db', dbPath, '--backup', backupPath]);
        await worker.waitForLine((line) => line.startsWith('begin '));
        await delay(random.next() * backupMs);
        worker.kill();
        const exit = await worker.exited;
        const where = `seed ${SEED}, backup kill ${kill}`;
        expect(exit.signal, where).toBe('SIGKILL');
        expect(exit.stderr, where).toBe('');
        // A `.partial` left behind means the kill came between VACUUM INTO and the rename.
        if (existsSync(`${backupPath}.partial`)) killedMidCopy += 1;

        const project = inspectProject(dbPath, { readonly: false });
        expect(project.integrity, where).toBe('ok');
        expect(project.foreignKeyProblems, where).toEqual([]);
        expect(contentDigest(dbPath), where).toBe(before);
        // Under the final name there is only ever a whole backup: the previous one, intact.
        expect(checkBackup(backupPath), where).toBe(LATEST_SCHEMA_VERSION);
        expect(contentDigest(backupPath), where).toBe(before);
      }
      console.log(
        `crash-safety: ${killedMidCopy} of 5 backup kills landed mid-copy (${backupMs} ms)`,
      );
      expect(killedMidCopy).toBeGreaterThanOrEqual(1);

      // The next backup clears what a killed one left and writes a whole one.
      const reopened = openStore(dbPath);
      backupTo(reopened, backupPath);
      reopened.close();
      expect(existsSync(`${backupPath}.partial`)).toBe(false);
      expect(contentDigest(backupPath)).toBe(before);
    },
    BACKUP_TEST_TIMEOUT_MS,
  );
});
