/**
 * Child of test/db/concurrency.test.ts: read-modify-write updates of one shared home.
 *
 *   --db PATH      the project file (already created)
 *   --home ID      the shared home
 *   --worker NAME  written into each measure's note, to tell the writers apart afterwards
 *   --updates N    how many updates
 *   --seed N       seed of the pauses
 *
 * Each update is one `store.write`: count the home's measures, add measure `m<count + 1>`,
 * read the home and write its notes back with the counter one higher. If two writers ever
 * ran those steps interleaved, one would reuse a key (UNIQUE (home_id, key) refuses it and
 * this child fails) or lose an increment (the parent finds the counter short).
 *
 * Prints `ready` once open, waits for `go` on stdin (so the writers start together), then
 * `done N MAX_WRITE_MS`. Any error goes to stderr and the exit code is 1.
 */
import { createInterface } from 'node:readline';
import { DbError } from '../../../db/errors.ts';
import { getHome, updateHome, type Home, type HomeInput } from '../../../db/repositories/homes.ts';
import { addMeasure } from '../../../db/repositories/measures.ts';
import { openStore } from '../../../db/store.ts';
import { complain, option, say, seededRandom, sleepMs } from './_shared.ts';

/** The fields `updateHome` takes, as the home has them. */
function inputOf(home: Home): HomeInput {
  return {
    name: home.name,
    clientId: home.clientId,
    climateId: home.climateId,
    priceSetId: home.priceSetId,
    address: home.address,
    isDemo: home.isDemo,
    notes: home.notes,
    jobStatus: home.jobStatus,
    data: home.data,
  };
}

async function waitForGo(): Promise<void> {
  const lines = createInterface({ input: process.stdin });
  for await (const line of lines) if (line === 'go') break;
  lines.close();
}

const homeId = Number(option('home'));
const worker = option('worker');
const updates = Number(option('updates'));
const random = seededRandom(Number(option('seed', '1')));

try {
  const store = openStore(option('db'));
  say('ready');
  await waitForGo();
  let maxWriteMs = 0;
  for (let update = 1; update <= updates; update += 1) {
    const startedMs = performance.now();
    let attempts = 0;
    store.write((write) => {
      attempts += 1;
      const { count } = write
        .statement('SELECT count(*) AS count FROM measures WHERE home_id = ?')
        .get(homeId) as { count: number };
      // Widens the window in which a second writer would slip in, were the lock not held.
      sleepMs(random.integer(0, 1));
      addMeasure(write, homeId, {
        id: `m${count + 1}`,
        type: 'attic-top-plates',
        reductionCfm50: { low: 5, likely: 10, high: 15 },
        cost: { materialsUsd: 10, laborHours: 0.5, laborRateUsdPerHour: 60 },
        note: worker,
      });
      const home = getHome(write, homeId);
      const { counter } = JSON.parse(home.notes ?? '{"counter":0}') as { counter: number };
      updateHome(write, homeId, {
        ...inputOf(home),
        notes: JSON.stringify({ counter: counter + 1 }),
      });
    });
    // The store re-runs a transaction that met SQLITE_BUSY; this one must have run once.
    if (attempts !== 1) throw new Error(`update ${update} ran ${attempts} times (busy, retried)`);
    maxWriteMs = Math.max(maxWriteMs, performance.now() - startedMs);
    // Other work between writes, so the lock changes hands instead of one writer keeping it.
    sleepMs(random.integer(0, 2));
  }
  store.close();
  say(`done ${updates} ${Math.round(maxWriteMs)}`);
} catch (error) {
  const detail =
    error instanceof DbError
      ? `DbError ${error.kind} (${String((error.cause as { code?: string })?.code)})`
      : '';
  complain(
    `${worker}: ${detail} ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`,
  );
  process.exitCode = 1;
}
