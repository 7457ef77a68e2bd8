/**
 * The working behind one measure's figures in the open home (plan.explain), fetched when
 * asked for. Replies for another measure or home than the one now asked about are dropped.
 */
import type { MeasureTrace } from '../../core/plan/trace.ts';
import { call } from '../bridge.ts';
import type { WorkspaceState } from './workspace.svelte.ts';

/** Nothing asked for yet, on the way, shown, or refused with a message. */
export type TraceStatus = 'idle' | 'loading' | 'ready' | 'failed';

export class FigureTraceState {
  /** The measure whose working is asked for (its id in the home file), or null. */
  measureId = $state<string | null>(null);
  status = $state<TraceStatus>('idle');
  trace = $state.raw<MeasureTrace | null>(null);
  failure = $state<string | null>(null);
  readonly #workspace: Pick<WorkspaceState, 'homeId' | 'report'>;
  /** Counts the requests, so only the latest reply is kept. */
  #asked = 0;
  /** The evaluation the trace was worked from, to tell when the plan has changed since. */
  #fromReport = $state.raw<unknown>(null);

  constructor(workspace: Pick<WorkspaceState, 'homeId' | 'report'>) {
    this.#workspace = workspace;
  }

  /** True when the plan was evaluated again after the trace shown was fetched. */
  stale = $derived.by(() => this.status === 'ready' && this.#workspace.report !== this.#fromReport);

  /** Asks for the working behind a measure's figures in the open home. */
  async show(measureId: string): Promise<void> {
    const homeId = this.#workspace.homeId;
    const asked = (this.#asked += 1);
    this.measureId = measureId;
    this.trace = null;
    if (homeId === null) {
      this.failure = 'No home is open.';
      this.status = 'failed';
      return;
    }
    this.failure = null;
    this.status = 'loading';
    const report = this.#workspace.report;
    const reply = await call('plan.explain', { homeId, measureId });
    if (asked !== this.#asked || this.#workspace.homeId !== homeId) return;
    if (reply.ok) {
      this.trace = reply.value;
      this.#fromReport = report;
      this.status = 'ready';
    } else {
      this.failure = reply.error.message;
      this.status = 'failed';
    }
  }

  /** Shows a measure's working, or hides it when it is the one already shown. */
  toggle(measureId: string): Promise<void> {
    if (this.measureId === measureId && this.status !== 'failed') {
      this.close();
      return Promise.resolve();
    }
    return this.show(measureId);
  }

  /** Asks again for the measure shown (after a failure, or after the plan changed). */
  reload(): Promise<void> {
    return this.measureId === null ? Promise.resolve() : this.show(this.measureId);
  }

  /** Hides the working; a reply still on the way is dropped. */
  close(): void {
    this.#asked += 1;
    this.measureId = null;
    this.trace = null;
    this.failure = null;
    this.status = 'idle';
  }
}
