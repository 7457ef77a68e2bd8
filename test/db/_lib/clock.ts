/**
 * A clock a test moves by hand, for the store's `clock` option: timestamps then say exactly
 * which write made them.
 */

/** A clock and the handle that moves it. */
export interface ManualClock {
  /** What the store calls for the time of each write. */
  clock: () => Date;
  /** Moves the clock forward. */
  advanceSeconds(seconds: number): void;
  /** The current time as the store writes it (ISO 8601, UTC). */
  nowIso(): string;
}

/**
 * A clock that stands still until moved.
 *
 * @param startIso - the first time it shows, ISO 8601 (e.g. `2024-03-01T09:00:00.000Z`)
 * @returns the clock and its handle
 */
export function manualClock(startIso: string): ManualClock {
  let currentMs = Date.parse(startIso);
  if (Number.isNaN(currentMs)) throw new Error(`not an ISO time: ${startIso}`);
  return {
    clock: () => new Date(currentMs),
    advanceSeconds(seconds) {
      currentMs += seconds * 1000;
    },
    nowIso: () => new Date(currentMs).toISOString(),
  };
}
