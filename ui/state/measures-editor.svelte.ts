/**
 * The Measures section's work: the library to add from, the form of a new measure (kept as
 * typed until the store accepts it, so a refusal loses nothing), and the status changes and
 * deletions of stored measures. After any change the open home is read again and its plan
 * evaluated again.
 */
import { call } from '../bridge.ts';
import { roundToCents, usd } from '../../core/money.ts';
import type { MeasureType } from '../../core/measure-library/types.ts';
import type { Measure, MeasureStatus } from '../../core/schema.ts';
import type { FieldProblem, HomeRecord, WorkspaceState } from './workspace.svelte.ts';

export type MeasureEntry = HomeRecord['measures'][number];

/**
 * Labour rate used when the project's settings cannot be read. An invented demo figure, not a
 * market rate.
 */
const DEMO_LABOR_RATE_USD_PER_HOUR = 58;

/** A measure's cost as line items in dollars, each to the cent, and their total. */
export interface CostLines {
  materialsUsd: number;
  laborUsd: number;
  markupUsd: number;
  totalUsd: number;
}

/**
 * A measure's cost line items, rounded as the core rounds them.
 *
 * @param cost - materials (USD), labour hours (h) × rate (USD/h), markup fraction (0..5)
 * @returns materials, labour, markup and total, in USD to the cent
 *
 * Notes: materials and labour are each rounded to the cent; markup = (materials + labour) ×
 * fraction, rounded to the cent; total = the sum of the three, exact.
 */
export function costLinesOf(cost: Measure['cost']): CostLines {
  const materials = roundToCents(usd(cost.materialsUsd));
  const labor = roundToCents(usd(cost.laborHours).times(cost.laborRateUsdPerHour));
  const markup = roundToCents(materials.plus(labor).times(cost.markupFraction ?? 0));
  return {
    materialsUsd: materials.toNumber(),
    laborUsd: labor.toNumber(),
    markupUsd: markup.toNumber(),
    totalUsd: materials.plus(labor).plus(markup).toNumber(),
  };
}

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

/** Text typed as a number: separators allowed ("1,850"), nothing else. */
function parseNumber(text: string): number | null {
  const cleaned = text.trim().replace(/,/g, '');
  if (cleaned === '' || !/^[-+]?(\d+\.?\d*|\.\d+)$/.test(cleaned)) return null;
  return Number(cleaned);
}

/** A number for an input box: at most two decimals, no separators. */
function boxText(value: number): string {
  return String(Math.round(value * 100) / 100);
}

/** The boxes of the new-measure form, and the request path each one fills. */
const DRAFT_PATHS = {
  type: 'measure.type',
  id: 'measure.id',
  units: 'measure.byUnits.units',
  low: 'measure.reductionCfm50.low',
  likely: 'measure.reductionCfm50.likely',
  high: 'measure.reductionCfm50.high',
  materialsUsd: 'measure.cost.materialsUsd',
  laborHours: 'measure.cost.laborHours',
  laborRateUsdPerHour: 'measure.cost.laborRateUsdPerHour',
  markupPercent: 'measure.cost.markupFraction',
} as const;

export type DraftKey = keyof typeof DRAFT_PATHS;
type NumberKey = Exclude<DraftKey, 'type' | 'id'>;
export type EstimateKind = 'byUnits' | 'direct';

export type ActionStatus =
  | { kind: 'idle' }
  | { kind: 'working'; words: string }
  | { kind: 'done'; words: string }
  | { kind: 'refused'; words: string };

function firstUpper(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export class MeasuresEditor {
  #workspace: WorkspaceState;
  library = $state.raw<readonly MeasureType[]>([]);
  libraryFailure = $state<string | null>(null);
  /** Where the labour rate and markup came from, for the fields' hints. */
  rateFromSettings = $state(false);
  draft = $state<Record<DraftKey, string>>({
    type: '',
    id: '',
    units: '1',
    low: '',
    likely: '',
    high: '',
    materialsUsd: '',
    laborHours: '',
    laborRateUsdPerHour: String(DEMO_LABOR_RATE_USD_PER_HOUR),
    markupPercent: '0',
  });
  estimate = $state<EstimateKind>('byUnits');
  /** Boxes the person typed into, which a change of type or quantity leaves alone. */
  #touched = new Set<DraftKey>();
  errors = $state<Partial<Record<DraftKey, string>>>({});
  addStatus = $state<ActionStatus>({ kind: 'idle' });
  /** Problems with a stored measure's status change or deletion, by its store id. */
  rowErrors = $state<Record<number, string>>({});
  rowStatus = $state<ActionStatus>({ kind: 'idle' });

  entries = $derived.by((): readonly MeasureEntry[] => this.#workspace.record?.measures ?? []);
  chosenType = $derived.by(
    (): MeasureType | null => this.library.find((type) => type.id === this.draft.type) ?? null,
  );

  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
  }

  /** Reads the library and the project's labour rate and markup, and prefills the form. */
  async load(): Promise<void> {
    const [library, settings] = await Promise.all([
      call('library.list', {}),
      call('settings.get', {}),
    ]);
    if (settings.ok) {
      this.draft.laborRateUsdPerHour = boxText(settings.value.laborRateUsdPerHour);
      this.draft.markupPercent = boxText(settings.value.markupFraction * 100);
      this.rateFromSettings = true;
    }
    if (!library.ok) {
      this.libraryFailure = library.error.message;
      return;
    }
    this.library = library.value.types;
    this.libraryFailure = null;
    const first = this.library[0];
    if (first !== undefined) this.choose(first.id);
  }

  typeOf(typeId: string): MeasureType | undefined {
    return this.library.find((type) => type.id === typeId);
  }

  /** Picks the library type of the new measure; refills what was not typed by hand. */
  choose(typeId: string): void {
    this.draft.type = typeId;
    this.#touched.delete('id');
    this.#prefill();
  }

  edit(key: DraftKey, text: string): void {
    this.draft[key] = text;
    if (key !== 'units') this.#touched.add(key);
    if (key === 'units') this.#prefill();
  }

  /** The id, materials and labour hours from the library's demo defaults × the quantity. */
  #prefill(): void {
    const type = this.chosenType;
    if (type === null) return;
    if (!this.#touched.has('id')) {
      this.draft.id = nextMeasureId(
        type.id,
        this.entries.map((entry) => entry.measure.id),
      );
    }
    const units = parseNumber(this.draft.units);
    if (units === null) return;
    if (!this.#touched.has('materialsUsd')) {
      this.draft.materialsUsd = boxText(type.defaultCost.materialsUsdPerUnit * units);
    }
    if (!this.#touched.has('laborHours')) {
      this.draft.laborHours = boxText(type.defaultCost.laborHoursPerUnit * units);
    }
  }

  #number(key: NumberKey, problems: Partial<Record<DraftKey, string>>): number {
    const value = parseNumber(this.draft[key]);
    if (value === null) problems[key] = 'Enter a number, in digits (such as 12 or 7.5).';
    return value ?? 0;
  }

  /** The measure the form describes, or the problems that keep it from being one. */
  #measureOfDraft(): { measure: Measure } | { problems: Partial<Record<DraftKey, string>> } {
    const problems: Partial<Record<DraftKey, string>> = {};
    const units = this.#number('units', problems);
    const cost: Measure['cost'] = {
      materialsUsd: this.#number('materialsUsd', problems),
      laborHours: this.#number('laborHours', problems),
      laborRateUsdPerHour: this.#number('laborRateUsdPerHour', problems),
      markupFraction: this.#number('markupPercent', problems) / 100,
    };
    const id = this.draft.id.trim();
    if (this.entries.some((entry) => entry.measure.id === id)) {
      problems.id = `Another measure of this home already has the id “${id}”.`;
    }
    const measure: Measure = { id, type: this.draft.type, cost, status: 'planned' };
    if (this.estimate === 'byUnits') {
      measure.byUnits = { units };
    } else {
      measure.reductionCfm50 = {
        low: this.#number('low', problems),
        likely: this.#number('likely', problems),
        high: this.#number('high', problems),
      };
    }
    return Object.keys(problems).length > 0 ? { problems } : { measure };
  }

  /** Adds the measure the form describes, or says beside each box why it cannot. */
  async add(): Promise<boolean> {
    const made = this.#measureOfDraft();
    if ('problems' in made) {
      this.errors = made.problems;
      this.addStatus = { kind: 'refused', words: 'Not added: see the marked boxes.' };
      return false;
    }
    const homeId = this.#workspace.homeId;
    if (homeId === null) return false;
    this.addStatus = { kind: 'working', words: `Adding ${made.measure.id}…` };
    const reply = await call('measures.add', { homeId, measure: made.measure });
    if (!reply.ok) {
      this.#showRefusal(reply.error.message, reply.error.problems ?? []);
      return false;
    }
    this.errors = {};
    this.#touched.clear();
    await this.#reload(homeId);
    this.#prefill();
    this.addStatus = { kind: 'done', words: `Added ${made.measure.id} to the plan.` };
    return true;
  }

  #showRefusal(message: string, problems: readonly FieldProblem[]): void {
    const errors: Partial<Record<DraftKey, string>> = {};
    const unplaced: string[] = [];
    for (const problem of problems) {
      const key = (Object.keys(DRAFT_PATHS) as DraftKey[]).find(
        (candidate) =>
          problem.path === DRAFT_PATHS[candidate] ||
          problem.path.startsWith(`${DRAFT_PATHS[candidate]}.`),
      );
      if (key === undefined) unplaced.push(problem.message);
      else errors[key] ??= `${firstUpper(problem.message)}.`;
    }
    this.errors = errors;
    const rest = unplaced.length > 0 ? unplaced.join('; ') : problems.length === 0 ? message : '';
    this.addStatus = {
      kind: 'refused',
      words: `Not added: ${rest === '' ? 'see the marked boxes.' : `${rest}.`}`,
    };
  }

  /** Marks a stored measure planned, done or declined. */
  async setStatus(entry: MeasureEntry, status: MeasureStatus): Promise<void> {
    const homeId = this.#workspace.homeId;
    if (homeId === null || (entry.measure.status ?? 'planned') === status) return;
    this.rowStatus = { kind: 'working', words: `Saving ${entry.measure.id}…` };
    const reply = await call('measures.update', {
      id: entry.id,
      measure: { ...entry.measure, status },
    });
    this.#settleRow(entry, reply, `${entry.measure.id} is now ${status}.`);
    if (reply.ok) await this.#reload(homeId);
  }

  /** Deletes a stored measure (the page has asked for confirmation first). */
  async remove(entry: MeasureEntry): Promise<void> {
    const homeId = this.#workspace.homeId;
    if (homeId === null) return;
    this.rowStatus = { kind: 'working', words: `Deleting ${entry.measure.id}…` };
    const reply = await call('measures.delete', { id: entry.id });
    this.#settleRow(entry, reply, `Deleted ${entry.measure.id}.`);
    if (reply.ok) await this.#reload(homeId);
  }

  #settleRow(
    entry: MeasureEntry,
    reply: { ok: true } | { ok: false; error: { message: string } },
    words: string,
  ): void {
    if (reply.ok) {
      delete this.rowErrors[entry.id];
      this.rowStatus = { kind: 'done', words };
    } else {
      this.rowErrors[entry.id] = reply.error.message;
      this.rowStatus = {
        kind: 'refused',
        words: `Nothing changed for ${entry.measure.id}: ${reply.error.message}`,
      };
    }
  }

  /** Reads the home again and asks for its plan again, if it is still the open one. */
  async #reload(homeId: number): Promise<void> {
    const reply = await call('homes.get', { id: homeId });
    if (this.#workspace.homeId !== homeId) return;
    if (reply.ok) this.#workspace.record = reply.value;
    void this.#workspace.reloadReport();
  }
}
