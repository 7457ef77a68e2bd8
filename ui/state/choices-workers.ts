/**
 * The page's choices workers: one per kind of job (ranges, best package, options), started
 * when first needed. A new job of a kind replaces the one still running — its worker is
 * stopped and a fresh one started — so a search for a budget typed a moment ago never holds
 * up the one typed now, and the page itself never waits.
 */
import type { ChoicesAnswer, ChoicesJob, ChoicesValue } from '../workers/choices-protocol.ts';

type Kind = ChoicesJob['kind'];
type DistributiveOmit<T, K extends PropertyKey> = T extends unknown ? Omit<T, K> : never;
export type ChoicesJobRequest = DistributiveOmit<ChoicesJob, 'id'>;

/** A job's outcome: its value and how long the worker took, or why it failed. */
export type ChoicesOutcome<K extends Kind> =
  | { ok: true; value: Extract<ChoicesValue, { kind: K }>['value']; ms: number }
  | { ok: false; replaced: boolean; message: string; field?: string };

interface Running {
  id: number;
  settle(answer: ChoicesAnswer | 'replaced'): void;
}

interface Slot {
  worker: Worker;
  running: Running | null;
}

const slots = new Map<Kind, Slot>();
let nextId = 1;

function startWorker(kind: Kind): Slot {
  const worker = new Worker(new URL('../workers/choices-worker.ts', import.meta.url), {
    type: 'module',
    name: `sealwork-${kind}`,
  });
  const slot: Slot = { worker, running: null };
  worker.onmessage = (event: MessageEvent<ChoicesAnswer>) => {
    const running = slot.running;
    if (running === null || running.id !== event.data.id) return;
    slot.running = null;
    running.settle(event.data);
  };
  worker.onerror = (event) => {
    event.preventDefault();
    const running = slot.running;
    slot.running = null;
    running?.settle({
      id: running.id,
      ok: false,
      error: { message: `The calculation stopped: ${event.message || 'the worker failed'}.` },
    });
    slots.delete(kind);
    worker.terminate();
  };
  slots.set(kind, slot);
  return slot;
}

/**
 * Runs a job in its kind's worker.
 *
 * @returns the value, or a failure (`replaced` when a newer job of the same kind took over)
 */
export function runChoicesJob<K extends Kind>(
  job: Extract<ChoicesJobRequest, { kind: K }>,
): Promise<ChoicesOutcome<K>> {
  let slot = slots.get(job.kind);
  if (slot?.running) {
    // Stop the job still running: its answer is no longer wanted.
    slot.running.settle('replaced');
    slot.worker.terminate();
    slots.delete(job.kind);
    slot = undefined;
  }
  const active = slot ?? startWorker(job.kind);
  const id = nextId++;
  return new Promise((resolve) => {
    active.running = {
      id,
      settle(answer) {
        if (answer === 'replaced') {
          resolve({ ok: false, replaced: true, message: 'Replaced by a newer request.' });
        } else if (answer.ok) {
          resolve({ ok: true, value: answer.value as never, ms: answer.ms });
        } else {
          resolve({ ok: false, replaced: false, ...answer.error });
        }
      },
    };
    active.worker.postMessage({ ...job, id });
  });
}
