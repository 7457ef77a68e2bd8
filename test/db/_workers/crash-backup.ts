/**
 * Child of test/db/crash-safety.test.ts: backs the project up, over and over, until killed.
 *
 *   --db PATH      the project file
 *   --backup PATH  the backup's final name
 *   --count N      stop after N backups and exit 0 (default: never)
 *
 * Prints `open`, then `begin N` before each `backupTo` and `done N MS` after it returns.
 */
import { backupTo } from '../../../db/backup.ts';
import { openStore } from '../../../db/store.ts';
import { option, say } from './_shared.ts';

const store = openStore(option('db'));
const backupPath = option('backup');
const count = Number(option('count', 'Infinity'));
say('open');
for (let attempt = 1; attempt <= count; attempt += 1) {
  const startedMs = performance.now();
  say(`begin ${attempt}`);
  backupTo(store, backupPath);
  say(`done ${attempt} ${Math.round(performance.now() - startedMs)}`);
}
store.close();
