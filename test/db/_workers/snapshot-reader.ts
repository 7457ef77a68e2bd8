/**
 * Child of test/db/concurrency.test.ts: reads the shared home over and over while
 * counter-writer.ts children update it.
 *
 *   --db PATH    the project file
 *   --home ID    the shared home
 *   --until N    stop once the home has N measures
 *   --hold-ms N  how long each read transaction stays open between its two reads
 *
 * Each `store.read` reads the measure count and the notes counter, holds the transaction
 * open, asks a second connection what is committed by now, and reads both again. Inside one
 * read transaction the two reads must agree (one snapshot) and the counter must equal the
 * count (a writer's commit is seen whole or not at all). A second connection that already
 * sees more measures proves a writer committed while the snapshot was held.
 *
 * Prints `ready`, waits for `go`, then `done READS OUTLIVED DISTINCT`. Violations go to
 * stderr and the exit code is 1.
 */
import { createInterface } from 'node:readline';
import { getHome } from '../../../db/repositories/homes.ts';
import { openStore, type ReadAccess } from '../../../db/store.ts';
import { complain, option, say, sleepMs } from './_shared.ts';

/** The reader gives up if the writers have not finished by then. */
const DEADLINE_MS = 30_000;

const homeId = Number(option('home'));
const until = Number(option('until'));
const holdMs = Number(option('hold-ms', '5'));

function stateOf(read: ReadAccess): { measures: number; counter: number } {
  const { count } = read
    .statement('SELECT count(*) AS count FROM measures WHERE home_id = ?')
    .get(homeId) as { count: number };
  const { counter } = JSON.parse(getHome(read, homeId).notes ?? '{"counter":0}') as {
    counter: number;
  };
  return { measures: count, counter };
}

async function waitForGo(): Promise<void> {
  const lines = createInterface({ input: process.stdin });
  for await (const line of lines) if (line === 'go') break;
  lines.close();
}

try {
  const store = openStore(option('db'));
  const observer = openStore(option('db'), { readonly: true });
  say('ready');
  await waitForGo();
  const startedMs = performance.now();
  const seen = new Set<number>();
  let reads = 0;
  let outlived = 0;
  for (;;) {
    const { first, second, committed } = store.read((read) => {
      const firstState = stateOf(read);
      sleepMs(holdMs);
      const latest = observer.read(stateOf);
      return { first: firstState, second: stateOf(read), committed: latest.measures };
    });
    reads += 1;
    if (first.counter !== first.measures) {
      throw new Error(`torn read: counter ${first.counter} with ${first.measures} measures`);
    }
    if (second.measures !== first.measures || second.counter !== first.counter) {
      throw new Error(`snapshot moved: ${JSON.stringify(first)} then ${JSON.stringify(second)}`);
    }
    if (committed > first.measures) outlived += 1;
    seen.add(first.measures);
    if (first.measures >= until) break;
    if (performance.now() - startedMs > DEADLINE_MS)
      throw new Error(`only ${first.measures} of ${until} measures`);
  }
  observer.close();
  store.close();
  say(`done ${reads} ${outlived} ${seen.size}`);
} catch (error) {
  complain(`reader: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
  process.exitCode = 1;
}
