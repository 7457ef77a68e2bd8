/**
 * The Portfolio screen's state: which homes (the same filters as the Homes list), the
 * portfolio's figures for them (portfolio.evaluate), and the choices the filters offer (the
 * towns and heating fuels the project's homes have).
 */
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import type { ProgramRangeResult } from '../../core/uncertainty/program-range.ts';
import { call } from '../bridge.ts';
import { runChoicesJob } from './choices-workers.ts';
import type { LoadStatus } from './homes.svelte.ts';

export type PortfolioReply = ChannelResponse<'portfolio.evaluate'>;
type Filter = NonNullable<ChannelRequest<'portfolio.evaluate'>['filter']>;
type Selection = ChannelResponse<'settings.get'>['portfolioSelections'][number];

/** The filters as the boxes hold them; '' is "any". */
export interface PortfolioFilterText {
  town: string;
  heatingFuel: string;
  jobStatus: string;
  leakiness: string;
}

export class PortfolioState {
  filter = $state<PortfolioFilterText>({ town: '', heatingFuel: '', jobStatus: '', leakiness: '' });
  value = $state.raw<PortfolioReply | null>(null);
  status = $state<LoadStatus>('loading');
  failure = $state<string | null>(null);
  towns = $state.raw<string[]>([]);
  fuels = $state.raw<string[]>([]);
  /** How long the last evaluation took, from asking to the answer, milliseconds. */
  ms = $state<number | null>(null);
  #asked = 0;
  /** The program's range, worked out in the page's worker from the chosen homes' files. */
  range = $state.raw<ProgramRangeResult | null>(null);
  rangeStatus = $state<'idle' | 'running' | 'ready' | 'failed'>('idle');
  rangeFailure = $state<string | null>(null);
  rangeDraws = $state(1000);
  /** A program-wide bias's ± fraction on every home's estimates; 0 for homes independent. */
  rangeBias = $state(0);
  rangeSeed = 1;

  async runRange(): Promise<void> {
    this.rangeStatus = 'running';
    const files = await call('portfolio.homeFiles', { filter: this.requestFilter() });
    if (!files.ok) {
      this.rangeFailure = files.error.message;
      this.rangeStatus = 'failed';
      return;
    }
    const outcome = await runChoicesJob({
      kind: 'program',
      inputs: {
        homeFiles: files.value.files,
        libraryTypes: files.value.libraryTypes,
        weatherYears: files.value.weatherYears,
        weatherOfHome: files.value.weatherOfHome,
      },
      request: {
        draws: this.rangeDraws,
        seed: this.rangeSeed,
        ...(this.rangeBias > 0 ? { programBias: this.rangeBias } : {}),
      },
    });
    if (outcome.ok) {
      this.range = outcome.value;
      this.rangeFailure = null;
      this.rangeStatus = 'ready';
    } else if (!outcome.replaced) {
      this.rangeFailure = outcome.message;
      this.rangeStatus = 'failed';
    }
  }
  /** What the last apply or remove of the calibration did, in words. */
  calibrationMessage = $state<string | null>(null);
  calibrationBusy = $state(false);

  /** Writes the fitted factors into the chosen homes not yet started (or removes them). */
  async changeCalibration(apply: boolean): Promise<void> {
    this.calibrationBusy = true;
    const filter = this.requestFilter();
    const today = new Date().toISOString().slice(0, 10);
    const reply = apply
      ? await call('portfolio.applyCalibration', {
          filter,
          basis: { label: `Test-outs of the program to ${today}`, date: today },
        })
      : await call('portfolio.removeCalibration', { filter });
    this.calibrationBusy = false;
    if (!reply.ok) {
      this.calibrationMessage = `Not done: ${reply.error.message}`;
      return;
    }
    const { homeIds, factors } = reply.value;
    const homes = `${homeIds.length} ${homeIds.length === 1 ? 'home' : 'homes'}`;
    this.calibrationMessage = apply
      ? factors.length === 0
        ? 'No factor rests on enough tested homes yet (5 or more with the type), so nothing was applied.'
        : `Applied ${factors.length} ${factors.length === 1 ? 'factor' : 'factors'} to the estimates of ${homes} not yet started; their plans say so.`
      : `Removed the factors from ${homes}; their estimates are as they were.`;
    await this.load();
  }

  /** The saved choices of homes (the project's settings). */
  selections = $state.raw<Selection[]>([]);
  selectionName = $state('');
  selectionMessage = $state<string | null>(null);

  async loadSelections(): Promise<void> {
    const reply = await call('settings.get', {});
    if (reply.ok) this.selections = reply.value.portfolioSelections;
  }

  /** Saves the filters as they stand under the name typed (replacing one of that name). */
  async saveSelection(): Promise<void> {
    const name = this.selectionName.trim();
    if (name === '') {
      this.selectionMessage = 'Not saved: type a name for these filters first.';
      return;
    }
    const next = [
      ...this.selections.filter((entry) => entry.name !== name),
      { name, filter: this.requestFilter() },
    ];
    const reply = await call('settings.update', { portfolioSelections: next });
    if (!reply.ok) {
      this.selectionMessage = `Not saved: ${reply.error.message}`;
      return;
    }
    this.selections = reply.value.portfolioSelections;
    this.selectionName = '';
    this.selectionMessage = `Saved “${name}”.`;
  }

  /** Puts a saved choice's filters in the boxes and evaluates its homes. */
  async useSelection(name: string): Promise<void> {
    const chosen = this.selections.find((entry) => entry.name === name);
    if (!chosen) return;
    this.filter = {
      town: chosen.filter.town ?? '',
      heatingFuel: chosen.filter.heatingFuel ?? '',
      jobStatus: chosen.filter.jobStatus ?? '',
      leakiness: chosen.filter.leakiness ?? '',
    };
    this.selectionMessage = null;
    await this.load();
  }

  /** How many of the project's homes stand at each job status (portfolio.summary). */
  jobCounts = $state.raw<readonly { status: string; homes: number }[] | null>(null);
  jobCountsFailure = $state<string | null>(null);

  async loadJobCounts(): Promise<void> {
    const reply = await call('portfolio.summary', {});
    if (reply.ok) {
      this.jobCounts = reply.value.byJobStatus;
      this.jobCountsFailure = null;
    } else {
      this.jobCountsFailure = reply.error.message;
    }
  }

  /** The towns and fuels of the project's homes, for the filters' choices. */
  async loadChoices(): Promise<void> {
    const reply = await call('homes.list', { limit: 10_000 });
    if (!reply.ok) return;
    const distinct = (values: (string | null)[]) =>
      [
        ...new Set(values.filter((value): value is string => value !== null && value !== '')),
      ].sort();
    this.towns = distinct(reply.value.map((home) => home.town));
    this.fuels = distinct(reply.value.map((home) => home.heatingFuel));
  }

  /** The request's filter from the boxes: only the ones given. */
  requestFilter(): Filter {
    const text = this.filter;
    const filter: Filter = {};
    if (text.town !== '') filter.town = text.town;
    if (text.heatingFuel !== '') filter.heatingFuel = text.heatingFuel;
    if (text.jobStatus !== '') filter.jobStatus = text.jobStatus as Filter['jobStatus'];
    if (text.leakiness !== '') filter.leakiness = text.leakiness as Filter['leakiness'];
    return filter;
  }

  /** Evaluates the homes the filters choose; a reply to an earlier request is dropped. */
  async load(): Promise<void> {
    const asked = ++this.#asked;
    this.status = 'loading';
    const started = performance.now();
    const reply = await call('portfolio.evaluate', { filter: this.requestFilter() });
    if (asked !== this.#asked) return;
    this.ms = performance.now() - started;
    if (reply.ok) {
      this.value = reply.value;
      this.failure = null;
      this.status = 'ready';
    } else {
      this.failure = reply.error.message;
      this.status = 'failed';
    }
  }
}
