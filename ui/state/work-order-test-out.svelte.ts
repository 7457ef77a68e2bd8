/**
 * A test-out reading as it is typed in the work order: the flow at 50 Pa in the shown unit
 * (cfm or L/s, ui/quantities.ts), the date, who tested and a note. The store
 * (workOrder.recordTestOut) stores the reading, sets it against the work order's target and
 * the plan's estimate, and moves the job to tested out, or refuses it all; its refusals are
 * shown beside the box they name, figures restated in the unit typed.
 */
import { call } from '../bridge.ts';
import type { ChannelResponse } from '../../electron/channels.ts';
import { messageInShownUnits } from '../data-edit.ts';
import type { DataFieldSpec } from '../data-fields.ts';
import { storedValue, unitOf, type UnitSystem } from '../quantities.ts';
import { sentence, todayIso } from './work-order.svelte.ts';

export type TestOutOutcome = ChannelResponse<'workOrder.recordTestOut'>;

/** The boxes a refusal can name, and `form` for the rest (a job not in progress, say). */
export type TestOutBox = 'cfm50' | 'testedOn' | 'by' | 'note' | 'form';

/** How a flow's refusal is restated: a flow at 50 Pa, in cfm or L/s. */
const FLOW_FIELD: DataFieldSpec = {
  kind: 'number',
  id: 'test-out-cfm50',
  path: ['cfm50'],
  label: 'Reading',
  quantity: 'flowCfm',
};

const BOXES: readonly string[] = ['cfm50', 'testedOn', 'by', 'note'];

/** A typed figure: digits with an optional decimal point and thousands commas; else null. */
export function typedNumber(text: string): number | null {
  const plain = text.trim().replace(/,/g, '');
  if (!/^\d+(?:\.\d+)?$|^\.\d+$/.test(plain)) return null;
  return Number(plain);
}

export class TestOutForm {
  readonly homeId: number;
  reading = $state('');
  testedOn = $state(todayIso());
  by = $state('');
  note = $state('');
  saving = $state(false);
  errors = $state<Partial<Record<TestOutBox, string>>>({});
  outcome = $state.raw<TestOutOutcome | null>(null);
  /** The date of the reading recorded, for the result's heading. */
  recordedOn = $state('');

  hasUnsaved = $derived(this.reading.trim() !== '' || this.note.trim() !== '');

  constructor(homeId: number) {
    this.homeId = homeId;
  }

  /** Forgets a refusal once its box is typed in again. */
  touched(box: TestOutBox): void {
    const { [box]: _gone, form: _form, ...rest } = this.errors;
    this.errors = rest;
  }

  /**
   * Records the reading.
   *
   * @param units - the unit system the reading is typed in
   * @returns true when the store took it
   */
  async record(units: UnitSystem): Promise<boolean> {
    if (this.saving) return false;
    const shown = typedNumber(this.reading);
    if (shown === null || shown <= 0) {
      this.errors = {
        cfm50: `Enter the blower door's flow at 50 Pa in digits, in ${unitOf('flowCfm', units)}.`,
      };
      return false;
    }
    this.saving = true;
    const note = this.note.trim();
    const reply = await call('workOrder.recordTestOut', {
      homeId: this.homeId,
      cfm50: storedValue('flowCfm', shown, units),
      testedOn: this.testedOn,
      by: this.by,
      ...(note === '' ? {} : { note }),
    });
    this.saving = false;
    if (!reply.ok) {
      this.errors = placedProblems(reply.error, units);
      return false;
    }
    this.errors = {};
    this.outcome = reply.value;
    this.recordedOn = this.testedOn;
    this.reading = '';
    this.note = '';
    return true;
  }
}

function placedProblems(
  error: { message: string; problems?: readonly { path: string; message: string }[] | undefined },
  units: UnitSystem,
): Partial<Record<TestOutBox, string>> {
  const placed: Partial<Record<TestOutBox, string>> = {};
  for (const problem of error.problems ?? []) {
    const box = (BOXES.includes(problem.path) ? problem.path : 'form') as TestOutBox;
    const message =
      box === 'cfm50' ? messageInShownUnits(problem.message, FLOW_FIELD, units) : problem.message;
    const words = sentence(message);
    placed[box] = placed[box] === undefined ? words : `${placed[box]} ${words}`;
  }
  if (Object.keys(placed).length === 0) placed.form = sentence(error.message);
  if (placed.form !== undefined) placed.form = `Not recorded: ${placed.form}`;
  return placed;
}
