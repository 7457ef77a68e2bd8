/**
 * The open home's choices beyond the ranked plan: the package's range of outcomes, the best
 * package within a budget, and the proposal's three options with their ranges. Each is
 * worked out in the page's workers (choices-workers.ts) from the home file and the project's
 * library as the store holds them now, and worked out again whenever the plan changes.
 */
import { untrack } from 'svelte';
import type { BestPackageReport, OptionReport, UncertaintyReport } from '../../core/choices.ts';
import type { PackageObjective } from '../../core/plan/best-package.ts';
import type { Distribution } from '../../core/uncertainty/distributions.ts';
import { call } from '../bridge.ts';
import { parseNumber } from '../text.ts';
import type { ChoicesInputs } from '../workers/choices-protocol.ts';
import { runChoicesJob, type ChoicesJobRequest, type ChoicesOutcome } from './choices-workers.ts';
import type { HoldsDrafts } from './kept-editors.svelte.ts';
import type { WorkspaceState } from './workspace.svelte.ts';

export type RunStatus = 'idle' | 'running' | 'ready' | 'failed';

/** The draws a run may take on the Plan screen. */
export const DRAW_CHOICES = [1_000, 10_000, 100_000] as const;

export interface RangeSettings {
  draws: number;
  seed: number;
  distribution: Distribution;
  escalation: boolean;
  efficiency: boolean;
  nFactor: boolean;
}

export interface BudgetSettings {
  /** The budget as typed, USD; empty for no limit. */
  budgetText: string;
  objective: PackageObjective;
  everyMeasureSirAtLeastOne: boolean;
  packageSirAtLeastOne: boolean;
}

/** One piece of work and what came of it. */
class Outcome<Value> {
  status = $state<RunStatus>('idle');
  value = $state.raw<Value | null>(null);
  failure = $state<string | null>(null);
  /** The field a refusal names, when it names one. */
  field = $state<string | null>(null);
  /** How long the worker took, milliseconds. */
  ms = $state<number | null>(null);
  /** Whether it has been asked for (so a change of plan asks again). */
  wanted = false;

  settle(outcome: ChoicesOutcome<never> | { ok: true; value: Value; ms: number }): void {
    if (outcome.ok) {
      this.value = outcome.value as Value;
      this.ms = outcome.ms;
      this.failure = null;
      this.field = null;
      this.status = 'ready';
    } else if (!outcome.replaced) {
      this.failure = outcome.message;
      this.field = outcome.field ?? null;
      this.status = 'failed';
    }
  }
}

export class ChoicesState implements HoldsDrafts {
  readonly hasUnsaved = false;
  readonly #workspace: WorkspaceState;
  /** The home these choices are of (the workspace moves on to other homes; these stay). */
  readonly homeId: number | null;
  #inputs: ChoicesInputs | null = null;
  #generation = 0;
  inputsFailure = $state<string | null>(null);

  rangeSettings = $state<RangeSettings>({
    draws: 10_000,
    seed: 1,
    distribution: 'pert',
    escalation: false,
    efficiency: false,
    nFactor: false,
  });
  budgetSettings = $state<BudgetSettings>({
    budgetText: '',
    objective: 'npv',
    everyMeasureSirAtLeastOne: false,
    packageSirAtLeastOne: false,
  });

  readonly ranges = new Outcome<UncertaintyReport>();
  readonly best = new Outcome<BestPackageReport>();
  readonly options = new Outcome<OptionReport[]>();

  /** Made under a root of its own (workspace.editor), so the effect lives as long as it. */
  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
    this.homeId = workspace.homeId;
    $effect(() => {
      const report = workspace.report;
      if (report !== null && workspace.homeId === this.homeId) {
        untrack(() => void this.#refresh());
      }
    });
  }

  /** Whether any of the work asked for is still running. */
  get running(): boolean {
    return [this.ranges, this.best, this.options].some(
      (outcome) => outcome.wanted && (outcome.status === 'running' || outcome.status === 'idle'),
    );
  }

  /** Reads the home file and the library again, then redoes the work asked for so far. */
  async #refresh(): Promise<void> {
    const homeId = this.homeId;
    if (homeId === null || this.#workspace.homeId !== homeId) return;
    const generation = ++this.#generation;
    const [file, library, weather] = await Promise.all([
      call('homeFile.export', { id: homeId }),
      call('library.list', {}),
      call('climates.weatherYearOfHome', { homeId }),
    ]);
    if (generation !== this.#generation) return;
    if (!file.ok) {
      this.inputsFailure = file.error.message;
      return;
    }
    if (!library.ok) {
      this.inputsFailure = library.error.message;
      return;
    }
    if (!weather.ok) {
      this.inputsFailure = weather.error.message;
      return;
    }
    this.inputsFailure = null;
    this.#inputs = {
      key: `${homeId}/${generation}`,
      homeFile: file.value,
      libraryTypes: library.value.types,
      ...(weather.value === null ? {} : { weather: weather.value }),
    };
    if (this.ranges.wanted) void this.runRanges();
    if (this.best.wanted) void this.findBest();
    if (this.options.wanted) void this.loadOptions();
  }

  async #run<Value>(outcome: Outcome<Value>, job: ChoicesJobRequest | null): Promise<void> {
    outcome.wanted = true;
    const inputs = this.#inputs;
    if (inputs === null || job === null) return; // asked again once the inputs arrive
    outcome.status = 'running';
    const answer = await runChoicesJob({ ...job, inputs } as never);
    if (inputs !== this.#inputs) return; // the plan changed meanwhile; the newer run counts
    outcome.settle(answer as ChoicesOutcome<never>);
  }

  /** The package's range of outcomes with the current settings. */
  runRanges(): Promise<void> {
    const settings = this.rangeSettings;
    return this.#run(this.ranges, {
      kind: 'ranges',
      inputs: this.#inputs as ChoicesInputs,
      request: {
        draws: settings.draws,
        seed: settings.seed,
        distribution: settings.distribution,
        vary: {
          escalation: settings.escalation,
          efficiency: settings.efficiency,
          nFactor: settings.nFactor,
        },
      },
    });
  }

  /** The budget typed, USD (null for none), or a refusal in words. */
  budgetUsd(): { ok: true; usd: number | null } | { ok: false; message: string } {
    const text = this.budgetSettings.budgetText.trim();
    if (text === '') return { ok: true, usd: null };
    const usd = parseNumber(text.replace(/^\$/, ''));
    if (usd === null || !(usd >= 0)) {
      return {
        ok: false,
        message: 'Type the budget in dollars (for example 2500), or leave it empty for no limit.',
      };
    }
    return { ok: true, usd };
  }

  /** The best package within the budget typed. */
  findBest(): Promise<void> {
    const budget = this.budgetUsd();
    if (!budget.ok) {
      this.best.wanted = true;
      this.best.failure = budget.message;
      this.best.field = 'budgetUsd';
      this.best.status = 'failed';
      return Promise.resolve();
    }
    const settings = this.budgetSettings;
    return this.#run(this.best, {
      kind: 'best',
      inputs: this.#inputs as ChoicesInputs,
      request: {
        budgetUsd: budget.usd,
        objective: settings.objective,
        everyMeasureSirAtLeastOne: settings.everyMeasureSirAtLeastOne,
        packageSirAtLeastOne: settings.packageSirAtLeastOne,
      },
    });
  }

  /** The proposal's three options, each with its range (the range settings' draws and seed). */
  loadOptions(): Promise<void> {
    const settings = this.rangeSettings;
    return this.#run(this.options, {
      kind: 'options',
      inputs: this.#inputs as ChoicesInputs,
      request: {
        draws: settings.draws,
        seed: settings.seed,
        distribution: settings.distribution,
      },
    });
  }
}
