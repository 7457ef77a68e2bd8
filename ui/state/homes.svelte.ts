/**
 * The Homes list: what is searched for, the homes the store returned for it, and whether the
 * last request is still out or failed. Replies that arrive after a newer request are dropped,
 * so fast typing never leaves an older, wider list on screen.
 */
import { call } from '../bridge.ts';
import type { ChannelResponse } from '../../electron/channels.ts';

export type HomeSummary = ChannelResponse<'homes.list'>[number];

export type LoadStatus = 'loading' | 'ready' | 'failed';

export class HomesState {
  search = $state('');
  /** The homes of the last reply, replaced whole each time. */
  homes = $state.raw<readonly HomeSummary[]>([]);
  status = $state<LoadStatus>('loading');
  /** The search the shown homes answer (it lags `search` while a reply is on its way). */
  shownSearch = $state('');
  failure = $state<string | null>(null);
  openId = $state<number | null>(null);
  /** True once a list has arrived, so later searches keep it on screen while they run. */
  everLoaded = $state(false);

  count = $derived(this.homes.length);

  #latestRequest = 0;

  /** Asks the store for the homes matching the current search. */
  async load(): Promise<void> {
    const requestNumber = ++this.#latestRequest;
    const search = this.search.trim();
    this.status = 'loading';
    const reply = await call('homes.list', search === '' ? {} : { search });
    if (requestNumber !== this.#latestRequest) return;
    if (reply.ok) {
      this.homes = reply.value;
      this.shownSearch = search;
      this.failure = null;
      this.status = 'ready';
      this.everLoaded = true;
      if (this.openId !== null && !reply.value.some((home) => home.id === this.openId)) {
        this.openId = null;
      }
    } else {
      this.failure = reply.error.message;
      this.status = 'failed';
    }
  }

  /** Searches for `text` (words matched against name, street, town and client). */
  searchFor(text: string): Promise<void> {
    this.search = text;
    return this.load();
  }

  /** Opens a home's details, or closes them when they are open. */
  toggle(homeId: number): void {
    this.openId = this.openId === homeId ? null : homeId;
  }
}
