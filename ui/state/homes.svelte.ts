/**
 * The Homes list: what is searched for, the filters and the order asked for, the homes the
 * store returned for them, and whether the last request is still out or failed. Replies that
 * arrive after a newer request are dropped, so fast typing never leaves an older, wider list on
 * screen. The list's own actions live here too: copying a home under a new name, deleting one
 * with the offer to bring it back, and the message that says what the last action did.
 */
import { call } from '../bridge.ts';
import { NewHomeForm } from './homes-new-form.svelte.ts';
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import { nameParts } from '../labels.ts';
import { isJobStatus, isLeakinessBand, startsDescending, type HomeSort } from './homes-choices.ts';

export type HomeSummary = ChannelResponse<'homes.list'>[number];
type ListRequest = ChannelRequest<'homes.list'>;

export type LoadStatus = 'loading' | 'ready' | 'failed';

/** The filters as the boxes hold them; '' is "any". */
export interface HomeFilters {
  clientId: string;
  town: string;
  jobStatus: string;
  heatingFuel: string;
  leakiness: string;
}

export type FilterKey = keyof HomeFilters;

const NO_FILTERS: HomeFilters = {
  clientId: '',
  town: '',
  jobStatus: '',
  heatingFuel: '',
  leakiness: '',
};

/** What the filters can be set to: the project's clients, and the towns and fuels its homes have. */
export interface FilterChoices {
  clients: readonly { id: number; name: string }[];
  towns: readonly string[];
  fuels: readonly string[];
}

/** What the last action on the list did, shown above it until dismissed or replaced. */
export type HomesNotice =
  | { kind: 'deleted'; homeId: number; name: string; failure: string | null }
  | { kind: 'done'; words: string; link: { href: string; words: string } | null }
  | { kind: 'failed'; words: string };

/** The name of a home being copied, as typed, and why the store refused it. */
export interface CopyDraft {
  homeId: number;
  name: string;
  error: string | null;
  working: boolean;
}

/** The longest name a home may have (the store's rule). */
const MAX_NAME_CHARS = 200;

/**
 * The name a copy starts with: "(copy)" after the short title, the description kept, so
 * "14 Mill Lane: 1924 farmhouse" becomes "14 Mill Lane (copy): 1924 farmhouse".
 *
 * @param name - the home's name
 * @returns the suggested name, at most 200 characters
 */
export function copyNameOf(name: string): string {
  const { title, detail } = nameParts(name);
  const copy = detail === null ? `${title} (copy)` : `${title} (copy): ${detail}`;
  return copy.slice(0, MAX_NAME_CHARS);
}

export class HomesState {
  search = $state('');
  filters = $state<HomeFilters>({ ...NO_FILTERS });
  sort = $state<HomeSort>('name');
  descending = $state(false);
  /** Whether the filter and sort boxes are shown. */
  filtersOpen = $state(false);
  /** The homes of the last reply, replaced whole each time. */
  homes = $state.raw<readonly HomeSummary[]>([]);
  status = $state<LoadStatus>('loading');
  /** The search the shown homes answer (it lags `search` while a reply is on its way). */
  shownSearch = $state('');
  /** How many filters the shown homes answer. */
  shownFilterCount = $state(0);
  failure = $state<string | null>(null);
  openId = $state<number | null>(null);
  /** True once a list has arrived, so later searches keep it on screen while they run. */
  everLoaded = $state(false);
  choices = $state.raw<FilterChoices>({ clients: [], towns: [], fuels: [] });
  notice = $state<HomesNotice | null>(null);
  copying = $state<CopyDraft | null>(null);
  /** The panel open above the list, kept here so leaving the list and coming back keeps it. */
  panel = $state<'new' | 'import' | null>(null);
  /** The new-home form, kept here so what is typed in it survives a visit to another screen. */
  readonly newHomeForm = new NewHomeForm();
  /** A panel asked for from elsewhere (the desktop menu's New home), for the screen to open. */
  requestedPanel = $state<'new' | null>(null);

  count = $derived(this.homes.length);
  filterCount = $derived(Object.values(this.filters).filter((value) => value !== '').length);

  #latestRequest = 0;

  /** The request for the current search, filters and order. */
  #request(): ListRequest {
    const request: ListRequest = { sort: this.sort, descending: this.descending };
    const search = this.search.trim();
    if (search !== '') request.search = search;
    const { clientId, town, jobStatus, heatingFuel, leakiness } = this.filters;
    if (clientId !== '') request.clientId = Number(clientId);
    if (town !== '') request.town = town;
    if (isJobStatus(jobStatus)) request.jobStatus = jobStatus;
    if (heatingFuel !== '') request.heatingFuel = heatingFuel;
    if (isLeakinessBand(leakiness)) request.leakiness = leakiness;
    return request;
  }

  /** Asks the store for the homes matching the current search and filters, in order. */
  async load(): Promise<void> {
    const requestNumber = ++this.#latestRequest;
    const request = this.#request();
    const filterCount = this.filterCount;
    this.status = 'loading';
    const reply = await call('homes.list', request);
    if (requestNumber !== this.#latestRequest) return;
    if (reply.ok) {
      this.homes = reply.value;
      this.shownSearch = request.search ?? '';
      this.shownFilterCount = filterCount;
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

  /**
   * Reads what the filters can be set to. Without an answer the boxes offer what they held
   * before; the list itself says when the store cannot be reached.
   */
  async loadChoices(): Promise<void> {
    const [clients, summary] = await Promise.all([
      call('clients.list', {}),
      call('portfolio.summary', {}),
    ]);
    const known = (values: readonly (string | null)[]) =>
      values.filter((value): value is string => value !== null);
    this.choices = {
      clients: clients.ok
        ? clients.value.map((client) => ({ id: client.id, name: client.name }))
        : this.choices.clients,
      towns: summary.ok
        ? known(summary.value.byTown.map((group) => group.town)).sort((a, b) => a.localeCompare(b))
        : this.choices.towns,
      fuels: summary.ok
        ? known(summary.value.byFuel.map((group) => group.fuel))
        : this.choices.fuels,
    };
  }

  /** Reads the list and the filters' choices again, after a change to the project's homes. */
  async refresh(): Promise<void> {
    await Promise.all([this.load(), this.loadChoices()]);
  }

  /** Searches for `text` (words matched against name, street, town and client). */
  searchFor(text: string): Promise<void> {
    this.search = text;
    return this.load();
  }

  setFilter(key: FilterKey, value: string): Promise<void> {
    this.filters[key] = value;
    return this.load();
  }

  clearFilters(): Promise<void> {
    this.filters = { ...NO_FILTERS };
    return this.load();
  }

  /** Orders the list by `sort`, in the direction that sort is most often wanted. */
  setSort(sort: HomeSort): Promise<void> {
    this.sort = sort;
    this.descending = startsDescending(sort);
    return this.load();
  }

  setDescending(descending: boolean): Promise<void> {
    this.descending = descending;
    return this.load();
  }

  /** Opens a home's details, or closes them when they are open. */
  toggle(homeId: number): void {
    this.openId = this.openId === homeId ? null : homeId;
    if (this.copying !== null && this.copying.homeId !== homeId) this.copying = null;
  }

  /** Says what an action elsewhere on the screen did (an import, a new home). */
  tell(notice: HomesNotice | null): void {
    this.notice = notice;
  }

  dismiss(): void {
    this.notice = null;
  }

  /**
   * Deletes a home (softly: the store keeps it until purged) and offers to bring it back.
   *
   * @returns true when the store deleted it
   */
  async remove(home: HomeSummary): Promise<boolean> {
    const name = nameParts(home.name).title;
    const reply = await call('homes.delete', { id: home.id });
    if (!reply.ok) {
      this.notice = { kind: 'failed', words: `${name} was not deleted: ${reply.error.message}` };
      return false;
    }
    if (this.openId === home.id) this.openId = null;
    if (this.copying?.homeId === home.id) this.copying = null;
    this.notice = { kind: 'deleted', homeId: home.id, name, failure: null };
    await this.refresh();
    return true;
  }

  /**
   * Brings back the home the notice says was deleted, and opens its details.
   *
   * @returns its id, or null when there was nothing to undo or the store refused
   */
  async undo(): Promise<number | null> {
    const notice = this.notice;
    if (notice?.kind !== 'deleted') return null;
    const reply = await call('homes.restore', { id: notice.homeId });
    if (!reply.ok) {
      this.notice = { ...notice, failure: reply.error.message };
      return null;
    }
    this.notice = { kind: 'done', words: `${notice.name} is back in the list.`, link: null };
    this.openId = notice.homeId;
    await this.refresh();
    return notice.homeId;
  }

  startCopy(home: HomeSummary): void {
    this.copying = { homeId: home.id, name: copyNameOf(home.name), error: null, working: false };
  }

  editCopyName(text: string): void {
    if (this.copying !== null) this.copying = { ...this.copying, name: text, error: null };
  }

  cancelCopy(): void {
    this.copying = null;
  }

  /**
   * Copies the home being copied under the typed name: its house, tests and measures, as a
   * home of its own (never a demo home).
   *
   * @returns the copy's id, or null when the store refused (the name stays as typed)
   */
  async copy(): Promise<number | null> {
    const draft = this.copying;
    if (draft === null || draft.working) return null;
    const source = this.homes.find((home) => home.id === draft.homeId);
    this.copying = { ...draft, working: true, error: null };
    const reply = await call('homes.duplicate', { id: draft.homeId, name: draft.name });
    if (!reply.ok) {
      const problems = reply.error.problems ?? [];
      const own = problems.find((problem) => problem.path === 'name');
      const noTest = problems.some((problem) => problem.path === 'leakageTest');
      const why = own
        ? `The name: ${own.message}.`
        : noTest
          ? 'A home is copied with its test-in, and this one has no test-in yet.'
          : reply.error.message;
      this.copying = { ...draft, working: false, error: why };
      return null;
    }
    const from = source === undefined ? 'The home' : nameParts(source.name).title;
    const copyName = nameParts(draft.name.trim()).title;
    this.copying = null;
    this.notice = {
      kind: 'done',
      words: `${from} was copied as ${copyName}.`,
      link: { href: `#/homes/${reply.value.id}/house`, words: `Open ${copyName}` },
    };
    this.openId = reply.value.id;
    await this.refresh();
    return reply.value.id;
  }
}
