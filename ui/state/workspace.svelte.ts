/**
 * One open home: what the store holds for it (homes.get), its evaluation (plan.evaluate), the
 * units the project shows, and the changes to its house saved through homes.update. Replies
 * for a home that is no longer the open one are dropped.
 */
import { call } from '../bridge.ts';
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import type { EvaluationReport } from '../../core/report.ts';
import type { House } from '../../core/schema.ts';
import type { UnitSystem } from '../quantities.ts';
import type { LoadStatus } from './homes.svelte.ts';

export type HomeRecord = ChannelResponse<'homes.get'>;
export type StoredHome = HomeRecord['home'];
export type TestRecord = HomeRecord['tests'][number];
type HomeInput = ChannelRequest<'homes.update'>['home'];

/** A field's problem from a refusal, keyed by the field's path (`home.data.house.bedrooms`). */
export interface FieldProblem {
  path: string;
  message: string;
}

export type SaveOutcome = { ok: true } | { ok: false; message: string; problems: FieldProblem[] };

/** The whole request body homes.update needs, from the home as homes.get returned it. */
export function homeInputOf(home: StoredHome, data: StoredHome['data']): HomeInput {
  return {
    name: home.name,
    clientId: home.clientId,
    climateId: home.climateId,
    priceSetId: home.priceSetId,
    address: home.address,
    isDemo: home.isDemo,
    notes: home.notes,
    jobStatus: home.jobStatus,
    data,
  };
}

export class WorkspaceState {
  homeId = $state<number | null>(null);
  record = $state.raw<HomeRecord | null>(null);
  status = $state<LoadStatus>('loading');
  failure = $state<string | null>(null);
  report = $state.raw<EvaluationReport | null>(null);
  reportStatus = $state<LoadStatus>('loading');
  reportFailure = $state<string | null>(null);
  units = $state<UnitSystem>('IP');
  unitsFailure = $state<string | null>(null);

  /** Opens a home (again, when it is already open, only if it failed to load). */
  async open(homeId: number): Promise<void> {
    if (this.homeId === homeId && this.status !== 'failed') return;
    this.homeId = homeId;
    this.record = null;
    this.report = null;
    this.status = 'loading';
    void this.loadUnits();
    if (await this.#loadHome(homeId)) await this.#loadReport(homeId);
  }

  /** Reads the home; true when it arrived and is still the open one. */
  async #loadHome(homeId: number): Promise<boolean> {
    const reply = await call('homes.get', { id: homeId });
    if (this.homeId !== homeId) return false;
    if (reply.ok) {
      this.record = reply.value;
      this.failure = null;
      this.status = 'ready';
      return true;
    }
    this.failure = reply.error.message;
    this.status = 'failed';
    return false;
  }

  async #loadReport(homeId: number): Promise<void> {
    this.reportStatus = 'loading';
    const reply = await call('plan.evaluate', { homeId });
    if (this.homeId !== homeId) return;
    if (reply.ok) {
      this.report = reply.value;
      this.reportFailure = null;
      this.reportStatus = 'ready';
    } else {
      this.report = null;
      this.reportFailure = reply.error.message;
      this.reportStatus = 'failed';
    }
  }

  /** Asks the evaluation again (after a failure, or after the home changed). */
  reloadReport(): Promise<void> {
    return this.homeId === null ? Promise.resolve() : this.#loadReport(this.homeId);
  }

  async loadUnits(): Promise<void> {
    const reply = await call('settings.get', {});
    if (reply.ok) this.units = reply.value.units;
  }

  /** Shows figures in `units` from now on, for the whole project. */
  async setUnits(units: UnitSystem): Promise<void> {
    const before = this.units;
    this.units = units;
    const reply = await call('settings.update', { units });
    if (reply.ok) {
      this.units = reply.value.units;
      this.unitsFailure = null;
    } else {
      this.units = before;
      this.unitsFailure = reply.error.message;
    }
  }

  /**
   * Saves the open home with `house` in place of its house; on success the home is read
   * again and its plan evaluated again, on a refusal nothing changes here.
   */
  async saveHouse(house: House): Promise<SaveOutcome> {
    const record = this.record;
    if (record === null) return { ok: false, message: 'The home is not open.', problems: [] };
    const homeId = record.home.id;
    const input = homeInputOf(record.home, { ...record.home.data, house });
    const reply = await call('homes.update', { id: homeId, home: input });
    if (!reply.ok) {
      return { ok: false, message: reply.error.message, problems: reply.error.problems ?? [] };
    }
    if (this.homeId === homeId) {
      await this.#loadHome(homeId);
      void this.#loadReport(homeId);
    }
    return { ok: true };
  }
}
