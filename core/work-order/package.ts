/**
 * The approved package of a work order: the plan's recommended measures, or a list of measure
 * ids the client approved (a proposal's option, say), replayed on the house the way the plan
 * and the proposal value a package, with the ventilation it calls for and its cautions.
 */
import { InputError } from '../errors.ts';
import type { Evaluation } from '../evaluate.ts';
import type { PreparedMeasure } from '../measures.ts';
import { canonicalMeasures } from '../plan/best-package.ts';
import { buildPriceBook } from '../plan/prices.ts';
import { applyMeasure, stateAfter, stateOf, type StepOutcome } from '../plan/step.ts';
import { ventilationAfterPackage, type VentilationOutcome } from '../plan/ventilation-fan.ts';
import { assessSafety, type Caution } from '../safety.ts';

/** A package replayed on the house. */
export interface ApprovedPackage {
  /** Each measure's step, in the order applied (health and safety first). */
  steps: StepOutcome[];
  cfm50Before: number;
  cfm50After: number;
  ventilation: VentilationOutcome;
  /** The safety check of this package, as the evaluation runs it for the plan's. */
  cautions: Caution[];
}

/**
 * The measures of the approved package, in the order they are applied.
 *
 * @param evaluation - the home's evaluation
 * @param measureIds - the approved ids; the plan's recommended package when undefined
 * @throws InputError at `measureIds[i]` for an id that is not a measure of the home, is
 *   declined or is repeated, and at `measureIds` for an empty package
 *
 * Notes: the order is the one the proposal's options use (core/plan/best-package.ts
 * `canonicalMeasures`): health-and-safety measures first, then the others in plan order, so
 * the recommended package replays exactly as the plan applied it.
 */
export function approvedMeasures(
  evaluation: Evaluation,
  measureIds: readonly string[] | undefined,
): PreparedMeasure[] {
  const ids = measureIds ?? evaluation.plan.package.measureIds;
  if (ids.length === 0) {
    throw InputError.at(
      'measureIds',
      measureIds === undefined
        ? 'expected at least one measure: the plan recommends none for this home'
        : 'expected at least one measure id',
    );
  }
  const all = evaluation.plan.entries.map((entry) => entry.step.measure);
  const seen = new Set<string>();
  ids.forEach((id, index) => {
    const measure = all.find((candidate) => candidate.id === id);
    if (measure === undefined) {
      throw InputError.at(`measureIds[${index}]`, `expected a measure of this home, got "${id}"`);
    }
    if (measure.status === 'declined') {
      throw InputError.at(`measureIds[${index}]`, `"${id}" is declined; it cannot be approved`);
    }
    if (seen.has(id)) throw InputError.at(`measureIds[${index}]`, `"${id}" is listed twice`);
    seen.add(id);
  });
  const { healthAndSafety, energy } = canonicalMeasures(evaluation);
  return [...healthAndSafety, ...energy].filter((measure) => seen.has(measure.id));
}

/**
 * Replays the approved measures on the house at their likely estimates.
 *
 * @param evaluation - the home's evaluation
 * @param measures - the approved measures in order ({@link approvedMeasures})
 * @returns the steps, CFM50 before and after, the ventilation outcome and the cautions
 *
 * Notes: each step removes its likely CFM50, limited to what is left at its location and
 * above the leakage floor (core/plan/step.ts); the 62.2 check and fan follow the package
 * (core/plan/ventilation-fan.ts); the cautions come from the same safety check and inputs as
 * core/evaluate.ts gives it for the plan's package.
 */
export function replayPackage(
  evaluation: Evaluation,
  measures: readonly PreparedMeasure[],
): ApprovedPackage {
  const { model, home } = evaluation;
  let state = stateOf(model, model.testIn);
  const steps = measures.map((measure) => {
    const outcome = applyMeasure(model, state, measure);
    state = stateAfter(outcome);
    return outcome;
  });
  const prices = buildPriceBook(home);
  const ventilation = ventilationAfterPackage({ model, prices, leakageAfter: state.leakage });
  const cfm50Before = model.testInCfm50;
  // As the plan reports it: the last step's CFM50 after (the same sum of parts).
  const cfm50After = steps.at(-1)?.cfm50After ?? cfm50Before;
  const cautions = assessSafety({
    house: home.house,
    heating: home.heating,
    combustionAppliances: home.combustionAppliances ?? [],
    plannedMeasures: steps.map((step) => ({
      id: step.measure.id,
      type: step.measure.type.id,
      location: step.measure.location,
    })),
    leakage: { cfm50Before, cfm50After, volumeFt3: home.house.conditionedVolumeFt3 },
    ventilation: {
      requiredCfm: ventilation.requiredCfm,
      fanNeedBeforeCfm: ventilation.fanCfmBefore,
      fanNeedAfterCfm: ventilation.fanCfm,
      existingFanCfm: ventilation.existingFanCfm,
      fanAdded: ventilation.addedFan !== null,
      infiltrationCreditTaken: ventilation.infiltrationCreditTaken,
    },
  });
  return { steps, cfm50Before, cfm50After, ventilation, cautions };
}
