/**
 * The new measure of the Measures section: its library type and id, and a form that starts
 * from the library's figures × the quantity (costs, the direct estimate) and the project's
 * labour rate and markup. What is typed stays until the store accepts the measure.
 */
import { call } from '../bridge.ts';
import type { MeasureType } from '../../core/measure-library/types.ts';
import type { Range } from '../../core/schema.ts';
import type { EstimateMethod, FieldContext, NumberKey, Problem } from '../measure-fields.ts';
import { byUnitsEstimateCfm50, roundedRange, valueOfField } from '../measure-form.ts';
import { storedWork } from '../quantities.ts';
import { MeasureDraft, type ActionStatus } from './measure-draft.svelte.ts';
import type { WorkspaceState } from './workspace.svelte.ts';
import { sentence } from '../text.ts';

/**
 * Labour rate used when the project's settings cannot be read. An invented demo figure, not a
 * market rate.
 */
const DEMO_LABOR_RATE_USD_PER_HOUR = 58;

/**
 * The first id of the form `<type id>-<n>` that no measure of the home has yet.
 *
 * @param typeId - the library type's id
 * @param taken - the ids of the home's measures
 * @returns `typeId-1`, or the next free number
 */
export function nextMeasureId(typeId: string, taken: readonly string[]): string {
  for (let count = 1; ; count++) {
    const candidate = `${typeId}-${count}`;
    if (!taken.includes(candidate)) return candidate;
  }
}

/** Two decimals, as a starting value in a box (cents, hundredths of an hour). */
function hundredths(value: number): number {
  return Math.round(value * 100) / 100;
}

export interface AddingHost {
  workspace: WorkspaceState;
  library: () => readonly MeasureType[];
  /** Reads the home again and asks for its plan again. */
  reload: (homeId: number) => Promise<void>;
}

export class NewMeasure {
  #host: AddingHost;
  /** Where the labour rate and markup came from, for the fields' hints. */
  rateFromSettings = $state(false);
  #laborRateUsdPerHour = DEMO_LABOR_RATE_USD_PER_HOUR;
  #markupFraction = 0;
  typeId = $state('');
  id = $state('');
  #idTyped = false;
  errors = $state<{ type?: string; id?: string }>({});
  readonly draft = new MeasureDraft({
    method: 'byUnits',
    base: {},
    typed: {},
    location: '',
    healthAndSafety: false,
    note: '',
  });
  status = $state<ActionStatus>({ kind: 'idle' });

  type = $derived.by(
    (): MeasureType | null =>
      this.#host.library().find((candidate) => candidate.id === this.typeId) ?? null,
  );

  constructor(host: AddingHost) {
    this.#host = host;
  }

  get context(): FieldContext {
    return { units: this.#host.workspace.units, workUnit: this.type?.unit ?? 'each' };
  }

  /** The project's labour rate and markup, for the cost boxes to start from. */
  useSettings(settings: { laborRateUsdPerHour: number; markupFraction: number }): void {
    this.#laborRateUsdPerHour = settings.laborRateUsdPerHour;
    this.#markupFraction = settings.markupFraction;
    this.rateFromSettings = true;
  }

  /** Picks the library type of the new measure; refills what was not typed by hand. */
  choose(typeId: string): void {
    this.typeId = typeId;
    this.#idTyped = false;
    delete this.errors.type;
    this.#prefill();
  }

  typeIdText(text: string): void {
    this.id = text;
    this.#idTyped = true;
  }

  /** A box typed into; the quantity refills the defaults that follow it. */
  typeIn(key: NumberKey, text: string): void {
    this.draft.type(key, text, this.#host.workspace.units);
    if (key === 'units') this.#prefill();
  }

  chooseMethod(method: EstimateMethod): void {
    this.draft.method = method;
    this.#prefill();
  }

  /** The amount of work in the type's IP unit, when the box holds one. */
  quantity(): number | null {
    const value = valueOfField(this.draft.values(), 'units', this.type?.unit ?? 'each');
    return typeof value === 'number' && value > 0 ? value : null;
  }

  /** The library's estimate for the quantity, when the house's flow exponent is known. */
  libraryEstimate(): Range | null {
    const type = this.type;
    const quantity = this.quantity();
    const exponentN = this.#host.workspace.report?.leakage.exponentN ?? null;
    if (type === null || quantity === null || exponentN === null) return null;
    return byUnitsEstimateCfm50({
      unitsCount: quantity,
      areaIn2PerUnit: type.leakageAreaIn2PerUnit,
      sealed: type.sealingEffectiveness,
      exponentN,
    });
  }

  /** The id, costs and direct estimate from the library's figures × the quantity. */
  #prefill(): void {
    const type = this.type;
    if (type === null) return;
    const { draft } = this;
    if (!this.#idTyped) {
      this.id = nextMeasureId(type.id, this.#takenIds());
    }
    // One of the shown unit (1 m, not 0.3 m, in SI) until a quantity is typed.
    if (!draft.wasTyped('units')) {
      draft.base.units = storedWork(1, type.unit, this.#host.workspace.units);
    }
    draft.base.laborRateUsdPerHour = this.#laborRateUsdPerHour;
    draft.base.markup = this.#markupFraction;
    const quantity = this.quantity();
    if (quantity === null) return;
    draft.base.materialsUsd = hundredths(type.defaultCost.materialsUsdPerUnit * quantity);
    draft.base.laborHours = hundredths(type.defaultCost.laborHoursPerUnit * quantity);
    const estimate = this.libraryEstimate();
    if (estimate !== null) {
      const rounded = roundedRange(estimate);
      draft.base.cfmLow = rounded.low;
      draft.base.cfmLikely = rounded.likely;
      draft.base.cfmHigh = rounded.high;
    }
  }

  #takenIds(): string[] {
    return (this.#host.workspace.record?.measures ?? []).map((entry) => entry.measure.id);
  }

  /** Adds the measure the form describes, or says beside each box why it cannot. */
  async add(): Promise<boolean> {
    const homeId = this.#host.workspace.homeId;
    const type = this.type;
    if (homeId === null || type === null) return false;
    const id = this.id.trim();
    const taken = this.#takenIds().includes(id);
    this.errors = taken ? { id: `Another measure of this home already has the id “${id}”.` } : {};
    const made = this.draft.build({ id, type: type.id, workUnit: type.unit });
    if ('problems' in made || taken) {
      this.status = { kind: 'refused', words: 'Not added: see the marked boxes.' };
      return false;
    }
    this.status = { kind: 'working', words: `Adding ${id}…` };
    const reply = await call('measures.add', { homeId, measure: made.measure });
    if (!reply.ok) {
      const unplaced = this.draft.refuse(reply.error.problems ?? [], this.context);
      const rest = this.#placeProblems(unplaced);
      const words =
        rest.length > 0 ? rest.join(' ') : reply.error.problems ? '' : reply.error.message;
      this.status = {
        kind: 'refused',
        words: `Not added: ${words === '' ? 'see the marked boxes.' : sentence(words)}`,
      };
      return false;
    }
    const addedId = reply.value.id;
    this.#host.workspace.remember({
      homeId,
      label: `Added ${id}`,
      revert: () => call('measures.delete', { id: addedId }),
    });
    this.draft.settle();
    this.draft.location = '';
    this.draft.healthAndSafety = false;
    this.draft.note = '';
    this.#idTyped = false;
    await this.#host.reload(homeId);
    this.#prefill();
    this.status = { kind: 'done', words: `Added ${id} to the plan.` };
    return true;
  }

  /** The type and id problems beside their boxes; returns the words of the rest. */
  #placeProblems(problems: readonly Problem[]): string[] {
    const rest: string[] = [];
    for (const problem of problems) {
      if (problem.path === 'measure.type') this.errors.type ??= sentence(problem.message);
      else if (problem.path === 'measure.id') this.errors.id ??= sentence(problem.message);
      else rest.push(sentence(problem.message));
    }
    return rest;
  }
}
