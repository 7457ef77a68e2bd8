/**
 * One open home: what the store holds for it (homes.get), its evaluation (plan.evaluate), the
 * units the project shows, the changes to it saved through homes.update, and the session's
 * edits that can be undone. Replies for a home that is no longer the open one are dropped.
 */
import { call } from '../bridge.ts';
import { KeptEditors, type HoldsDrafts } from './kept-editors.svelte.ts';
import type { ChannelRequest, ChannelResponse } from '../../electron/channels.ts';
import type { EvaluationReport } from '../../core/report.ts';
import type { UnitSystem } from '../quantities.ts';
import type { LoadStatus } from './homes.svelte.ts';

export type HomeRecord = ChannelResponse<'homes.get'>;
export type StoredHome = HomeRecord['home'];
export type TestRecord = HomeRecord['tests'][number];
type HomeInput = ChannelRequest<'homes.update'>['home'];

/** What a save of the home may replace. */
export type HomeChange = Partial<Pick<HomeInput, 'data' | 'climateId' | 'priceSetId'>>;

/** A saved edit that can be taken back: `revert` asks the store to put back what was before. */
export interface UndoableEdit {
  homeId: number;
  /** What was changed, in words: "Floor area", "Added test-out". */
  label: string;
  revert(): Promise<{ ok: true } | { ok: false; error: { message: string } }>;
}

/** How many edits of a session can be undone. */
const UNDO_LIMIT = 50;

/** A field's problem from a refusal, keyed by the field's path (`home.data.house.bedrooms`). */
export interface FieldProblem {
  path: string;
  message: string;
}

export type SaveOutcome = { ok: true } | { ok: false; message: string; problems: FieldProblem[] };

/**
 * The whole request body homes.update needs, from the home as homes.get returned it. The job's
 * status is left out: it moves only by jobs.changeStatus (which keeps its history), and
 * homes.update refuses any other than the one stored, so an undo of an edit made before a
 * status change would otherwise be refused.
 */
export function homeInputOf(home: StoredHome, data: StoredHome['data']): HomeInput {
  return {
    name: home.name,
    clientId: home.clientId,
    climateId: home.climateId,
    priceSetId: home.priceSetId,
    address: home.address,
    isDemo: home.isDemo,
    notes: home.notes,
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
  /** The session's saved edits, oldest first, across the homes opened. */
  #edits = $state.raw<UndoableEdit[]>([]);
  undoing = $state(false);
  undoFailure = $state<string | null>(null);
  /** The label of the edit last undone, for the status line. */
  undone = $state<string | null>(null);
  /** The editors of each home opened, kept across section changes so nothing typed is lost. */
  #editors = new KeptEditors();

  /** Whether any home's editor holds typed text not saved yet (the page warns before closing). */
  hasUnsaved = $derived(this.#editors.hasUnsaved);

  /**
   * The open home's editor of one kind, made once and kept while the page is open: leaving a
   * section and coming back finds what was typed there, saved or not.
   *
   * @param kind - which editor ("house", "test entry")
   * @param make - makes the editor the first time
   */
  editor<Editor extends HoldsDrafts>(kind: string, make: () => Editor): Editor {
    return this.#editors.editor(`${this.homeId ?? 'none'}/${kind}`, make);
  }

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

  /** Reads the open home again and asks for its plan again (after a change saved elsewhere). */
  async reloadHome(): Promise<void> {
    const homeId = this.homeId;
    if (homeId === null) return;
    // Both read what the store holds now, so they are asked at once: one round trip saved.
    await Promise.all([this.#loadHome(homeId), this.#loadReport(homeId)]);
  }

  /**
   * Saves a change to the open home (its description, or which stored climate or price set
   * it uses); on success the home is read again, its plan evaluated again, and the change
   * can be undone. On a refusal nothing changes here.
   *
   * @param change - the parts to replace; the rest of the home is sent as it is stored
   * @param label - what was changed, in words, for the undo offer ("Floor area")
   */
  async saveHome(change: HomeChange, label: string): Promise<SaveOutcome> {
    const record = this.record;
    if (record === null) return { ok: false, message: 'The home is not open.', problems: [] };
    const homeId = record.home.id;
    const before = homeInputOf(record.home, record.home.data);
    const input: HomeInput = { ...before, ...change };
    const reply = await call('homes.update', { id: homeId, home: input });
    if (!reply.ok) {
      return { ok: false, message: reply.error.message, problems: reply.error.problems ?? [] };
    }
    this.remember({
      homeId,
      label,
      revert: () => call('homes.update', { id: homeId, home: before }),
    });
    if (this.homeId === homeId) await this.reloadHome();
    return { ok: true };
  }

  /** Keeps an edit that was saved so it can be undone; the oldest go beyond `UNDO_LIMIT`. */
  remember(edit: UndoableEdit): void {
    this.#edits = [...this.#edits, edit].slice(-UNDO_LIMIT);
    this.undoFailure = null;
  }

  /** The edit Undo would take back in the open home, or null. */
  lastEdit = $derived.by((): UndoableEdit | null => {
    const homeId = this.homeId;
    const mine = this.#edits.filter((edit) => edit.homeId === homeId);
    return mine[mine.length - 1] ?? null;
  });

  /**
   * Takes back the open home's last edit: the store is asked to put back what was there
   * before it; the home is then read and evaluated again. A refusal (say, the thing edited
   * was deleted since) is said in `undoFailure` and the edit stays offered.
   */
  async undoLast(): Promise<void> {
    const edit = this.lastEdit;
    if (edit === null || this.undoing) return;
    this.undoing = true;
    const reply = await edit.revert();
    this.undoing = false;
    if (!reply.ok) {
      this.undoFailure = `“${edit.label}” could not be undone. ${reply.error.message}`;
      return;
    }
    this.#edits = this.#edits.filter((kept) => kept !== edit);
    this.undoFailure = null;
    this.undone = edit.label;
    if (this.homeId === edit.homeId) await this.reloadHome();
  }
}
