/**
 * Child of test/db/crash-safety.test.ts: writes to a project file in a loop until killed.
 *
 *   --db PATH        the project file
 *   --run N          this child's number (part of every transaction's name)
 *   --mode homes     each `store.write` imports one home file of random size
 *   --mode batch     each `store.write` imports a batch of --batch-homes homes
 *   --seed N         seed of the sizes
 *   --transactions N stop after N transactions and exit 0 (default: never)
 *   --cache-kib N    shrink this connection's page cache to N KiB (default: as opened)
 *
 * It prints `open` once the store is open, `begin ID` from inside each transaction (so
 * BEGIN IMMEDIATE has run), `spilled ID` the first time during a batch that the WAL file
 * changed before COMMIT (the page cache overflowed and uncommitted pages went to the WAL),
 * and `commit ID MS` once `store.write` has returned.
 */
import { statSync } from 'node:fs';
import { importHomeFile } from '../../../db/home-file.ts';
import { openStore } from '../../../db/store.ts';
import { declaringHomeFile, option, say, seededRandom, type SeededRandom } from './_shared.ts';

const dbPath = option('db');
const run = Number(option('run'));
const mode = option('mode');
const random = seededRandom(Number(option('seed', '1')));
const transactionLimit = Number(option('transactions', 'Infinity'));
const batchHomes = Number(option('batch-homes', '500'));
const cacheKib = option('cache-kib', '');
/** Notes filler per batch home, so that a batch of 500 writes about 3 MB. */
const BATCH_PADDING_CHARS = 4000;

function singleHome(id: string, rng: SeededRandom) {
  const testOuts = rng.integer(0, 2);
  return declaringHomeFile(
    {
      name: `tx ${id}`,
      marker: `tx ${id}`,
      measures: rng.integer(1, 40),
      testInPoints: rng.integer(2, 12),
      testOutPoints: Array.from({ length: testOuts }, () => rng.integer(2, 8)),
      paddingChars: rng.integer(0, 2000),
    },
    rng,
  );
}

function batchHome(id: string, index: number, rng: SeededRandom) {
  return declaringHomeFile(
    {
      name: `batch ${id} #${index}`,
      marker: `batch ${id} of ${batchHomes}`,
      measures: rng.integer(1, 4),
      testInPoints: rng.integer(2, 4),
      testOutPoints: rng.next() < 0.5 ? [] : [rng.integer(2, 3)],
      paddingChars: BATCH_PADDING_CHARS,
    },
    rng,
  );
}

/** Size and modification time of the WAL file, to see it written before COMMIT. */
function walStamp(): string {
  try {
    const stat = statSync(`${dbPath}-wal`, { bigint: true });
    return `${stat.size}/${stat.mtimeNs}`;
  } catch {
    return 'none';
  }
}

const store = openStore(dbPath);
// better-sqlite3 builds SQLite with a 16 MB page cache, so a 3 MB batch stays in memory until
// COMMIT. A smaller cache makes SQLite spill uncommitted pages into the WAL mid-transaction,
// the path a larger import takes; recovery must then ignore frames no commit frame covers.
if (cacheKib !== '') store.sqlite.pragma(`cache_size = -${Number(cacheKib)}`);
say('open');
for (let sequence = 1; sequence <= transactionLimit; sequence += 1) {
  const id = `r${run}.${mode === 'batch' ? 'b' : 't'}${sequence}`;
  const startedMs = performance.now();
  store.write((write) => {
    say(`begin ${id}`);
    if (mode === 'homes') {
      importHomeFile(write, singleHome(id, random));
      return;
    }
    const before = walStamp();
    let spilled = false;
    for (let index = 1; index <= batchHomes; index += 1) {
      importHomeFile(write, batchHome(id, index, random));
      if (!spilled && index % 20 === 0 && walStamp() !== before) {
        spilled = true;
        say(`spilled ${id} ${index}`);
      }
    }
  });
  say(`commit ${id} ${Math.round(performance.now() - startedMs)}`);
}
store.close();
