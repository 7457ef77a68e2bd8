/**
 * A new blower-door test as it is typed: one point (CFM50 and, if known, the exponent) or
 * several readings of pressure and flow. The draft is checked as it changes so the fitted
 * line can be shown before anything is saved; the store (tests.add) has the last word and
 * its refusals are shown beside the boxes they name. Nothing typed is cleared until the test
 * is saved.
 */
import { call } from '../bridge.ts';
import type { LeakageTestKind, OtherLeakageTest } from '../../core/schema.ts';
import { messageInShownUnits } from '../data-edit.ts';
import type { DataFieldSpec } from '../data-fields.ts';
import { checkDraft, type ReadingRow, type TestMethod } from '../test-draft.ts';
import type { WorkspaceState } from './workspace.svelte.ts';

export type EntryStatus =
  | { kind: 'idle' }
  | { kind: 'saving' }
  | { kind: 'saved'; words: string }
  | { kind: 'refused'; words: string };

/** How a flow's refusal is restated: a flow at 50 Pa, in cfm or L/s. */
const FLOW_FIELD: DataFieldSpec = {
  kind: 'number',
  id: 'test-flow',
  path: ['flow'],
  label: 'Flow',
  quantity: 'flowCfm',
};

/** A blank row count that suits a usual multipoint test (five to ten readings). */
const FIRST_ROWS = 5;

/** Today as YYYY-MM-DD in the user's own time zone. */
function today(): string {
  const now = new Date();
  const month = String(now.getMonth() + 1).padStart(2, '0');
  const day = String(now.getDate()).padStart(2, '0');
  return `${now.getFullYear()}-${month}-${day}`;
}

export class TestEntry {
  #workspace: WorkspaceState;
  open = $state(false);
  kind = $state<LeakageTestKind>('testIn');
  method = $state<TestMethod>('multipoint');
  testedOn = $state(today());
  cfm50 = $state('');
  exponentN = $state('');
  note = $state('');
  rows = $state<ReadingRow[]>([]);
  /** Refusals from the store, by box id; cleared as the draft changes. */
  storeErrors = $state<Record<string, string>>({});
  status = $state<EntryStatus>({ kind: 'idle' });
  /** Whether the user has asked to save (problems show only from then on). */
  tried = $state(false);
  #nextKey = 0;

  /** Whether the form holds anything typed that is not saved. */
  hasUnsaved = $derived(
    this.cfm50.trim() !== '' ||
      this.exponentN.trim() !== '' ||
      this.note.trim() !== '' ||
      this.rows.some((row) => row.pressurePa.trim() !== '' || row.flow.trim() !== ''),
  );

  check = $derived.by(() =>
    checkDraft(
      {
        kind: this.kind,
        method: this.method,
        testedOn: this.testedOn,
        cfm50: this.cfm50,
        exponentN: this.exponentN,
        rows: this.rows,
        note: this.note,
      },
      this.#workspace.units,
    ),
  );

  /** The problems shown beside the boxes. */
  errors = $derived.by((): Record<string, string> => ({
    ...(this.tried ? this.check.errors : {}),
    ...this.storeErrors,
  }));

  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
    this.rows = Array.from({ length: FIRST_ROWS }, () => this.#blankRow());
  }

  #blankRow(): ReadingRow {
    return { key: this.#nextKey++, pressurePa: '', flow: '' };
  }

  /** Opens the form; a test-out is the likely kind once the home has a test-in. */
  start(hasTestIn: boolean): void {
    if (!this.open) this.kind = hasTestIn ? 'testOut' : 'testIn';
    this.open = true;
  }

  addRow(): void {
    this.rows.push(this.#blankRow());
  }

  removeRow(key: number): void {
    this.rows = this.rows.filter((row) => row.key !== key);
    if (this.rows.length === 0) this.addRow();
  }

  /** Forgets a store refusal once the box it names is typed in again. */
  touched(boxId: string): void {
    delete this.storeErrors[boxId];
  }

  /** Saves the test; true when the store took it. */
  async save(): Promise<boolean> {
    this.tried = true;
    const homeId = this.#workspace.homeId;
    const test = this.check.test;
    if (homeId === null) return false;
    if (test === null) {
      this.status = { kind: 'refused', words: 'The test was not saved: see the boxes marked.' };
      return false;
    }
    this.status = { kind: 'saving' };
    const reply = await call('tests.add', { homeId, test });
    if (!reply.ok) {
      this.storeErrors = this.#placed(reply.error.problems ?? []);
      this.status = { kind: 'refused', words: `The test was not saved. ${reply.error.message}` };
      return false;
    }
    const label = test.kind === 'testIn' ? 'Added test-in' : 'Added test-out';
    const id = reply.value.id;
    this.#workspace.remember({ homeId, label, revert: () => call('tests.delete', { id }) });
    this.#reset();
    this.status = { kind: 'saved', words: `${label} saved.` };
    await this.#workspace.reloadHome();
    return true;
  }

  /** The store's problems (paths like `test.points[2].pa`) placed on the boxes they name. */
  #placed(problems: readonly { path: string; message: string }[]): Record<string, string> {
    const placed: Record<string, string> = {};
    const activeRows = this.rows.filter(
      (row) => row.pressurePa.trim() !== '' || row.flow.trim() !== '',
    );
    const units = this.#workspace.units;
    for (const problem of problems) {
      const reading = /^test\.points\[(\d+)\]\.(pa|cfm)$/.exec(problem.path);
      // Flows are stored in cfm; a limit the store quotes is restated in the unit typed.
      const isFlow = reading?.[2] === 'cfm' || problem.path === 'test.cfm50';
      const message = isFlow
        ? messageInShownUnits(problem.message, FLOW_FIELD, units)
        : problem.message;
      const words = `${message.charAt(0).toUpperCase()}${message.slice(1)}.`;
      if (reading !== null) {
        const row = activeRows[Number(reading[1])];
        if (row !== undefined)
          placed[`reading-${row.key}-${reading[2] === 'pa' ? 'pa' : 'flow'}`] = words;
      } else if (problem.path === 'test.cfm50') placed['test-cfm50'] = words;
      else if (problem.path === 'test.exponentN') placed['test-exponent'] = words;
      else if (problem.path === 'test.testedOn') placed['test-date'] = words;
      else if (problem.path.startsWith('test.points')) placed['test-readings'] = words;
    }
    return placed;
  }

  #reset(): void {
    this.open = false;
    this.tried = false;
    this.cfm50 = '';
    this.exponentN = '';
    this.note = '';
    this.storeErrors = {};
    this.rows = Array.from({ length: FIRST_ROWS }, () => this.#blankRow());
  }

  /** Deletes a stored test (after the screen's confirmation); it can be undone. */
  async remove(testId: number, test: OtherLeakageTest): Promise<void> {
    const homeId = this.#workspace.homeId;
    if (homeId === null) return;
    const reply = await call('tests.delete', { id: testId });
    if (!reply.ok) {
      this.status = { kind: 'refused', words: `The test was not deleted. ${reply.error.message}` };
      return;
    }
    const label = test.kind === 'testIn' ? 'Deleted test-in' : 'Deleted test-out';
    this.#workspace.remember({
      homeId,
      label,
      revert: async () => {
        const again = await call('tests.add', { homeId, test });
        return again.ok ? { ok: true } : again;
      },
    });
    this.status = { kind: 'saved', words: `${label}.` };
    await this.#workspace.reloadHome();
  }
}
