/**
 * Child of test/db/concurrency.test.ts: opens project files (creating and migrating them if
 * new). Errors go to stderr and the exit code is 1.
 *
 *   --db PATH             prints `loaded`, opens PATH, prints `opened MS JOURNAL_MODE`
 *   --series DIR --count N --step-ms MS
 *                         prints `ready`, waits for `go EPOCH_MS` on stdin, then opens
 *                         DIR/new-<k>.sealwork for k = 1…N, each at the wall-clock instant
 *                         EPOCH_MS + k·MS, so children given the same `go` race to create
 *                         each file; reports each failure and prints `series N FAILED`
 */
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import { DbError } from '../../../db/errors.ts';
import { openStore } from '../../../db/store.ts';
import { complain, option, say } from './_shared.ts';

/** Opens and closes `path`; returns the journal mode, or throws. */
function openOnce(path: string): string {
  const store = openStore(path);
  try {
    return String(store.sqlite.pragma('journal_mode', { simple: true }));
  } finally {
    store.close();
  }
}

function describeError(error: unknown): string {
  const kind = error instanceof DbError ? `DbError ${error.kind}` : 'error';
  const cause = error instanceof Error ? (error.cause as { code?: string } | undefined) : undefined;
  return `${kind}${cause?.code ? ` (${cause.code})` : ''}: ${String(error)}`;
}

const series = option('series', '');
if (series === '') {
  say('loaded');
  const startedMs = performance.now();
  try {
    const journalMode = openOnce(option('db'));
    say(`opened ${Math.round(performance.now() - startedMs)} ${journalMode}`);
  } catch (error) {
    complain(`after ${Math.round(performance.now() - startedMs)} ms: ${describeError(error)}`);
    process.exitCode = 1;
  }
} else {
  const count = Number(option('count'));
  const stepMs = Number(option('step-ms'));
  say('ready');
  let startMs = Number.NaN;
  const lines = createInterface({ input: process.stdin });
  for await (const line of lines) {
    if (line.startsWith('go ')) {
      startMs = Number(line.slice(3));
      break;
    }
  }
  lines.close();
  let failed = 0;
  for (let file = 1; file <= count; file += 1) {
    // Spin rather than sleep: a sleeping process wakes up milliseconds late.
    while (Date.now() < startMs + file * stepMs);
    try {
      openOnce(join(series, `new-${file}.sealwork`));
    } catch (error) {
      failed += 1;
      complain(`new-${file}.sealwork: ${describeError(error)}`);
    }
  }
  if (failed > 0) process.exitCode = 1;
  say(`series ${count} ${failed}`);
}
