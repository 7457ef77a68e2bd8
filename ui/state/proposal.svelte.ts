/**
 * What the Proposal shows beside the evaluation: the home as a home file (homeFile.export),
 * which is what the evaluation was computed from, with the client, the address and the
 * assumptions filled in from the project's stored climate and price sets.
 */
import { call } from '../bridge.ts';
import type { HomeFile } from '../../core/schema.ts';
import type { LoadStatus } from './homes.svelte.ts';

export class ProposalState {
  homeId = $state<number | null>(null);
  file = $state.raw<HomeFile | null>(null);
  status = $state<LoadStatus>('loading');
  failure = $state<string | null>(null);

  /** Reads the home's file; a reply for a home no longer asked for is dropped. */
  async load(homeId: number): Promise<void> {
    this.homeId = homeId;
    this.status = 'loading';
    const reply = await call('homeFile.export', { id: homeId });
    if (this.homeId !== homeId) return;
    if (reply.ok) {
      this.file = reply.value;
      this.failure = null;
      this.status = 'ready';
    } else {
      this.file = null;
      this.failure = reply.error.message;
      this.status = 'failed';
    }
  }
}
