/**
 * The home's combustion appliances (beyond its heating system, described in the House
 * section): listed, added and removed, each change saved with the home and open to undo.
 * The Safety check reads them for the cautions about draft, spillage and carbon monoxide.
 */
import type {
  ApplianceKind,
  CombustionAppliance as Appliance,
  CombustionVenting,
  Fuel,
} from '../../core/schema.ts';
import type { SaveOutcome, WorkspaceState } from './workspace.svelte.ts';

export interface ApplianceDraft {
  kind: ApplianceKind;
  fuel: Fuel;
  venting: CombustionVenting;
  inside: 'yes' | 'no';
}

const FIRST_DRAFT: ApplianceDraft = {
  kind: 'waterHeater',
  fuel: 'naturalGas',
  venting: 'naturalDraft',
  inside: 'yes',
};

export type ApplianceStatus =
  | { kind: 'idle' }
  | { kind: 'saving' }
  | { kind: 'done'; words: string }
  | { kind: 'refused'; words: string };

export class AppliancesEditor {
  #workspace: WorkspaceState;
  draft = $state<ApplianceDraft>({ ...FIRST_DRAFT });
  status = $state<ApplianceStatus>({ kind: 'idle' });

  appliances = $derived.by(
    (): readonly Appliance[] => this.#workspace.record?.home.data.combustionAppliances ?? [],
  );

  /** Choices are saved only with Add; a changed draft is not yet in the home. */
  hasUnsaved = $derived(JSON.stringify(this.draft) !== JSON.stringify(FIRST_DRAFT));

  constructor(workspace: WorkspaceState) {
    this.#workspace = workspace;
  }

  async add(words: string): Promise<boolean> {
    const { kind, fuel, venting, inside } = this.draft;
    const appliance: Appliance = { kind, fuel, venting, insidePressureBoundary: inside === 'yes' };
    const saved = await this.#save([...this.appliances, appliance], `Added ${words}`);
    if (saved) this.draft = { ...FIRST_DRAFT };
    return saved;
  }

  remove(index: number, words: string): Promise<boolean> {
    return this.#save(
      this.appliances.filter((_appliance, at) => at !== index),
      `Removed ${words}`,
    );
  }

  async #save(appliances: Appliance[], label: string): Promise<boolean> {
    const data = this.#workspace.record?.home.data;
    if (data === undefined) return false;
    this.status = { kind: 'saving' };
    const outcome: SaveOutcome = await this.#workspace.saveHome(
      { data: { ...data, combustionAppliances: appliances } },
      label,
    );
    this.status = outcome.ok
      ? { kind: 'done', words: `${label}.` }
      : {
          kind: 'refused',
          words: `Not saved: ${outcome.problems[0]?.message ?? outcome.message}.`,
        };
    return outcome.ok;
  }
}
