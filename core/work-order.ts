/**
 * The crew's work order for an approved package: each measure with where it is in the house,
 * how much of it, the materials and labour hours it needs and the cautions that apply to it;
 * the cautions about the whole house; the bill of materials across measures; and the test-out
 * target (the CFM50 to aim for and the 62.2 stop level) in plain words.
 *
 * The tool informs; every caution defers to local codes and licensed practice.
 */
import { InputError } from './errors.ts';
import type { Evaluation } from './evaluate.ts';
import type { MeasureType } from './measure-library/types.ts';
import { Decimal } from './money.ts';
import type { Caution } from './safety.ts';
import type { LeakLocation, MeasureStatus } from './schema.ts';
import { approvedMeasures, replayPackage } from './work-order/package.ts';
import {
  billOfMaterials,
  materialNeeds,
  type BillLine,
  type MaterialNeed,
} from './work-order/bill-of-materials.ts';
import { testOutTarget, type TestOutTarget } from './work-order/test-out-target.ts';

export type { BillLine, MaterialNeed } from './work-order/bill-of-materials.ts';
export {
  STOP_LEVEL_TOLERANCE_CFM50,
  ventilationThresholdCfm50,
  type StopLevelKind,
  type TestOutTarget,
} from './work-order/test-out-target.ts';
export { renderWorkOrderText } from './work-order/text.ts';

/** Where each leak location is, in the words a crew uses. */
export const LOCATION_WORDS: Readonly<Record<LeakLocation, string>> = {
  ceiling: 'Ceiling and attic',
  wall: 'Walls',
  floor: 'Floor, basement or crawlspace',
  flue: 'Flue and chimney',
};

/** A measure type's unit in words. */
export const UNIT_WORDS: Readonly<Record<MeasureType['unit'], string>> = {
  each: 'each',
  linearFt: 'ft',
  ft2: 'ft²',
  job: 'job',
};

/** Where a measure's quantity came from. */
export type QuantitySource = 'units' | 'given' | 'job';

export interface WorkOrderMeasure {
  id: string;
  typeId: string;
  name: string;
  /** What the crew does (the library's description). */
  description: string;
  /** "planned", or "done" for work already done (left out of the materials and hours). */
  status: MeasureStatus;
  location: LeakLocation;
  locationWords: string;
  /** The auditor's note on the measure (where exactly, what to watch for), or null. */
  note: string | null;
  /** In the type's unit; null when the home file gives no count (estimated directly). */
  quantity: number | null;
  quantitySource: QuantitySource | null;
  unit: MeasureType['unit'];
  unitWords: string;
  materials: MaterialNeed[];
  /** The labour the plan priced for this measure (its cost line), hours. */
  laborHours: number;
  healthAndSafety: boolean;
  /** The CFM50 the plan expects it to remove where it stands in the package. */
  expectedReductionCfm50: number;
  /** Cautions about this measure's own work (its library caution codes, raised for this house). */
  cautions: Caution[];
}

export interface WorkOrder {
  homeName: string;
  demo: boolean;
  measures: WorkOrderMeasure[];
  /** Cautions about the whole house: combustion appliances, ventilation, tightness. */
  houseCautions: Caution[];
  billOfMaterials: BillLine[];
  /** Σ labour hours of the measures still to do. */
  laborHoursTotal: number;
  /** The ventilation fan the package adds, or null. */
  ventilationFan: { cfm: number; fanType: 'exhaust' | 'supply' | 'balanced' } | null;
  target: TestOutTarget;
  /** What the order could not work out, in words (e.g. a measure with no count). */
  notes: string[];
}

export interface WorkOrderOptions {
  /** The approved measure ids; the plan's recommended package when left out. */
  measureIds?: readonly string[];
  /** Counts for measures the home file estimated without one, by measure id, in the type's unit. */
  quantities?: Readonly<Record<string, number>>;
}

function checkQuantities(
  quantities: Readonly<Record<string, number>>,
  packageIds: ReadonlySet<string>,
): void {
  for (const [id, value] of Object.entries(quantities)) {
    if (!packageIds.has(id)) {
      throw InputError.at(`quantities.${id}`, 'expected the id of a measure in the package');
    }
    if (!Number.isFinite(value) || value <= 0 || value > 100_000) {
      throw InputError.at(
        `quantities.${id}`,
        `expected a number above 0 and at most 100000, got ${value}`,
      );
    }
  }
}

/** The quantity of a measure: its units, a count given for the order, or one job. */
function quantityOf(
  written: Evaluation['home']['measures'][number] | undefined,
  type: MeasureType,
  given: number | undefined,
): { quantity: number; source: QuantitySource } | null {
  if (written?.byUnits) return { quantity: written.byUnits.units, source: 'units' };
  if (given !== undefined) return { quantity: given, source: 'given' };
  if (type.unit === 'job') return { quantity: 1, source: 'job' };
  return null;
}

/**
 * Builds the work order of an approved package.
 *
 * @param evaluation - the home's evaluation (core/evaluate.ts)
 * @param options.measureIds - the approved measure ids (default: the plan's package)
 * @param options.quantities - counts for measures estimated without one, by id
 * @returns the work order
 * @throws InputError at `measureIds[i]`, `measureIds` or `quantities.<id>` for bad input
 *
 * Notes: a measure's cautions are those whose code its library type lists and which name it;
 * every other caution of the package concerns the house. Materials = quantity × the type's
 * use per unit; done measures are listed but left out of the bill and the hours.
 */
export function buildWorkOrder(evaluation: Evaluation, options: WorkOrderOptions = {}): WorkOrder {
  const measures = approvedMeasures(evaluation, options.measureIds);
  const quantities = options.quantities ?? {};
  checkQuantities(quantities, new Set(measures.map((measure) => measure.id)));
  const approved = replayPackage(evaluation, measures);
  const { home } = evaluation;
  const notes: string[] = [];

  const isOwn = (caution: Caution, measureId: string, type: MeasureType) =>
    caution.measureIds.includes(measureId) && type.cautionCodes.includes(caution.code);

  const lines: WorkOrderMeasure[] = approved.steps.map((step) => {
    const { measure } = step;
    const written = home.measures.find((candidate) => candidate.id === measure.id);
    const quantity = quantityOf(written, measure.type, quantities[measure.id]);
    if (quantity === null) {
      notes.push(
        `${measure.id}: no count in the home file (its reduction was estimated ${measure.estimateMethod === 'direct' ? 'directly in CFM50' : 'as a share of the leakage at its location'}); count it on site, or give one, for its materials.`,
      );
    }
    const needs =
      quantity === null || measure.status === 'done'
        ? []
        : materialNeeds(measure.type, quantity.quantity);
    return {
      id: measure.id,
      typeId: measure.type.id,
      name: measure.type.name,
      description: measure.type.description,
      status: measure.status,
      location: measure.location,
      locationWords: LOCATION_WORDS[measure.location],
      note: written?.note ?? null,
      quantity: quantity?.quantity ?? null,
      quantitySource: quantity?.source ?? null,
      unit: measure.type.unit,
      unitWords: UNIT_WORDS[measure.type.unit],
      materials: needs,
      laborHours: written?.cost.laborHours ?? 0,
      healthAndSafety: measure.cost.healthAndSafety,
      expectedReductionCfm50: step.appliedCfm50,
      cautions: approved.cautions.filter((caution) => isOwn(caution, measure.id, measure.type)),
    };
  });

  const houseCautions = approved.cautions.filter(
    (caution) => !approved.steps.some((step) => isOwn(caution, step.measure.id, step.measure.type)),
  );
  const toDo = lines.filter((line) => line.status !== 'done');
  const fan = approved.ventilation.addedFan;
  return {
    homeName: home.name,
    demo: home.demo ?? false,
    measures: lines,
    houseCautions,
    billOfMaterials: billOfMaterials(toDo.map((line) => ({ id: line.id, needs: line.materials }))),
    // In Decimal so 0.1 + 0.2 hours read 0.3.
    laborHoursTotal: toDo
      .reduce((total, line) => total.plus(line.laborHours), new Decimal(0))
      .toNumber(),
    ventilationFan:
      fan === null ? null : { cfm: fan.cfm, fanType: home.ventilation?.fanType ?? 'exhaust' },
    target: testOutTarget({
      model: evaluation.model,
      cfm50After: approved.cfm50After,
      ventilation: approved.ventilation,
      volumeFt3: home.house.conditionedVolumeFt3,
    }),
    notes,
  };
}
