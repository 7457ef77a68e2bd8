/**
 * How each figure of a measure in the plan is worked out: the leakage it removes where the
 * plan put it, the air flows before and after as the model values them, the energy and the
 * money that difference is worth. Each line names its formula and inputs; its result is the
 * engine's own figure, so a trace always agrees with the report (core/report.ts).
 */
import type { Evaluation } from '../evaluate.ts';
import { InputError } from '../errors.ts';
import { elaIn2 } from '../leakage.ts';
import type { PlanEntry } from '../plan.ts';
import type { MeasureType, SourceNote } from '../measure-library.ts';
import type { Measure, Range } from '../schema.ts';
import { buildPriceBook } from './prices.ts';
import { energyLines } from './trace-energy.ts';
import { moneyLines } from './trace-money.ts';
import { figure, input, leakage, type TraceLine } from './trace-parts.ts';

export { TRACE_QUANTITIES } from './trace-parts.ts';
export type { TraceFigure, TraceInput, TraceLine, TraceQuantity } from './trace-parts.ts';

/** How many of the home's measure ids a refusal names; a home may have 200. */
const MAX_IDS_NAMED = 10;

export interface MeasureTrace {
  measureId: string;
  measureName: string;
  /** Position in the plan, as the report gives it. */
  rank: number;
  included: boolean;
  /** The measures applied before this one, whose leakage and energy it was valued after. */
  appliedAfter: string[];
  /** What the measure was valued on, in plain words. */
  basis: string;
  lines: TraceLine[];
}

/**
 * The working behind every figure of one measure of an evaluated plan.
 *
 * @param evaluation - an evaluation from evaluateHome
 * @param measureId - the measure's id in the home file
 * @returns the lines, from the leakage removed to the cost of saved energy
 * @throws InputError at `measureId` when the home has no measure of that id
 */
export function explainMeasure(evaluation: Evaluation, measureId: string): MeasureTrace {
  const entry = evaluation.plan.entries.find(({ step }) => step.measure.id === measureId);
  const written = evaluation.home.measures.find((measure) => measure.id === measureId);
  if (!entry || !written) {
    const ids = evaluation.home.measures.map((measure) => `"${measure.id}"`);
    const more = ids.length - MAX_IDS_NAMED;
    const known = [...ids.slice(0, MAX_IDS_NAMED), ...(more > 0 ? [`${more} more`] : [])];
    throw InputError.at(
      'measureId',
      ids.length === 0
        ? `expected the id of one of the home's measures, but the home has none (got "${measureId}")`
        : `expected the id of one of the home's measures (${known.join(', ')}), got "${measureId}"`,
    );
  }
  const appliedAfter = evaluation.plan.entries
    .filter((other) => other.included && (!entry.included || other.rank < entry.rank))
    .map((other) => other.step.measure.id);
  const prices = buildPriceBook(evaluation.home);
  const { model } = evaluation;
  const flows = {
    before: model.ventilatedAirflow(entry.step.leakageBefore),
    after: model.ventilatedAirflow(entry.step.leakageAfter),
  };
  const context = { evaluation, entry, written, prices, flows };
  return {
    measureId,
    measureName: entry.step.measure.type.name,
    rank: entry.rank,
    included: entry.included,
    appliedAfter,
    basis: basisWords(entry, appliedAfter),
    lines: [
      ...leakageLines(evaluation, entry, written),
      ...energyLines(context),
      ...moneyLines(context),
    ],
  };
}

function basisWords(entry: PlanEntry, appliedAfter: readonly string[]): string {
  const earlier =
    appliedAfter.length === 0
      ? 'the leakage found at the test-in'
      : `the leakage left after ${appliedAfter.join(', ')}`;
  return entry.included
    ? `Valued on ${earlier}, where the plan puts it (rank ${entry.rank}).`
    : `Left out of the package, so valued as one more step after it: on ${earlier}.`;
}

const WORK_UNIT_WORDS: Readonly<Record<MeasureType['unit'], string>> = {
  each: 'units',
  job: 'jobs',
  linearFt: 'ft',
  ft2: 'ft²',
};

/**
 * Where a figure of a measure comes from. A home file exported from a project carries the
 * library's figures written in, so a figure equal to the library's is credited to it.
 */
export function librarySource(given: Range | undefined, library: Range, note: SourceNote): string {
  const fromLibrary =
    given === undefined ||
    (given.low === library.low && given.likely === library.likely && given.high === library.high);
  return fromLibrary ? `library (${note.mark}): ${note.citation}` : 'the measure as entered';
}

/** The likely estimate as the measure's estimate method makes it. */
function estimateLine(evaluation: Evaluation, entry: PlanEntry, written: Measure): TraceLine {
  const { measure } = entry.step;
  const result = figure(measure.estimateCfm50.likely, 'CFM50', 'flowCfm');
  const label = 'Leakage the measure is expected to remove (likely estimate)';
  if (measure.estimateMethod === 'byUnits' && written.byUnits) {
    const areaIn2 = (written.byUnits.leakageAreaIn2PerUnit ?? measure.type.leakageAreaIn2PerUnit)
      .likely;
    const effectiveness = (
      written.byUnits.sealingEffectiveness ?? measure.type.sealingEffectiveness
    ).likely;
    const exponentN = evaluation.model.exponentN;
    const { type } = measure;
    const perItem = type.unit === 'each' || type.unit === 'job';
    return {
      key: 'estimate',
      label,
      formula: 'E = N × A × ε ÷ ELA₄(1 CFM50, n)',
      inputs: [
        input('Units of work N', written.byUnits.units, WORK_UNIT_WORDS[type.unit], {
          source: 'the measure as entered',
        }),
        input(
          'Leakage area per unit A (at 4 Pa)',
          areaIn2,
          perItem ? 'in²' : `in²/${WORK_UNIT_WORDS[type.unit]}`,
          {
            ...(perItem ? { quantity: 'leakageAreaIn2' as const } : {}),
            source: librarySource(
              written.byUnits.leakageAreaIn2PerUnit,
              type.leakageAreaIn2PerUnit,
              type.sources.leakageArea,
            ),
          },
        ),
        input('Share of that leakage the work removes ε', effectiveness, '', {
          source: librarySource(
            written.byUnits.sealingEffectiveness,
            type.sealingEffectiveness,
            type.sources.effectiveness,
          ),
        }),
        input('Flow exponent n', exponentN, '', { source: 'the blower-door test' }),
        input('Leakage area at 4 Pa of 1 CFM50 with that exponent', elaIn2(1, exponentN), 'in²', {
          quantity: 'leakageAreaIn2',
          source:
            'ELA = Q₄·√(ρ/(2·4 Pa)), Q₄ = 1 cfm × (4/50)ⁿ, ρ = 1.2 kg/m³ (ASHRAE HoF, ventilation and infiltration chapter)',
        }),
      ],
      result,
    };
  }
  if (measure.estimateMethod === 'shareOfLocation' && written.shareOfLocation) {
    return {
      key: 'estimate',
      label,
      formula: 'E = s × L₀(location)',
      inputs: [
        input('Share of the leakage at the location s', written.shareOfLocation.share.likely, '', {
          source: 'the measure as entered',
        }),
        leakage(
          `Test-in leakage at the ${measure.location}`,
          evaluation.model.testIn[measure.location],
          'the test-in CFM50 split by the leak shares',
        ),
      ],
      result,
    };
  }
  return {
    key: 'estimate',
    label,
    formula: 'E = the likely CFM50 reduction entered',
    inputs: [
      leakage('Likely reduction entered', measure.estimateCfm50.likely, 'the measure as entered'),
    ],
    result,
  };
}

function leakageLines(evaluation: Evaluation, entry: PlanEntry, written: Measure): TraceLine[] {
  const { step } = entry;
  const { model } = evaluation;
  const floorSource =
    evaluation.home.leakageFloorCfm50 === undefined
      ? 'none set in the home file, so 0'
      : 'the home file (leakageFloorCfm50), never above the test-in';
  const limitNote =
    step.limitedBy === 'location'
      ? `Limited to the leakage left at the ${step.measure.location}.`
      : step.limitedBy === 'floor'
        ? 'Limited by the leakage floor.'
        : undefined;
  const removed: TraceLine = {
    key: 'cfm50-removed',
    label: 'Leakage this step removes',
    formula: 'ΔCFM50 = min(E, L(location), max(0, CFM50 before − floor))',
    inputs: [
      leakage('Likely estimate E', Math.max(0, step.measure.estimateCfm50.likely), 'line above'),
      leakage(
        `Leakage left at the ${step.measure.location} L(location)`,
        step.leakageBefore[step.measure.location],
        'the test-in split by location, less what earlier steps removed there',
      ),
      leakage('CFM50 before this step', step.cfm50Before),
      leakage('Leakage floor', model.floorCfm50, floorSource),
    ],
    result: figure(step.appliedCfm50, 'CFM50', 'flowCfm'),
    ...(limitNote === undefined ? {} : { note: limitNote }),
  };
  const after: TraceLine = {
    key: 'cfm50-after',
    label: 'House leakage after this step',
    formula: 'CFM50 after = CFM50 before − ΔCFM50',
    inputs: [
      leakage('CFM50 before this step', step.cfm50Before),
      leakage('Leakage removed ΔCFM50', step.appliedCfm50, 'line above'),
    ],
    result: figure(step.cfm50After, 'CFM50', 'flowCfm'),
  };
  return [estimateLine(evaluation, entry, written), removed, after];
}
