/**
 * A portfolio's home as its uncertainty run needs it: the parsed home, its model and its
 * package's measures in the order applied. That is what `evaluateHome` gives the engine,
 * without the parts of the plan a Monte Carlo run never reads: the Decimal money of every
 * plan entry and of the package (worth, IRR, low and high totals, financing) and the notes.
 * They take most of `evaluateHome`'s time (about 0.6 of 0.85 ms a demo home here), and a
 * portfolio of 10,000 homes runs them 10,000 times.
 *
 * The result is the one `evaluateHome` gives, errors included:
 * - the steps up to the package are `evaluateHome`'s and `planHome`'s own calls, in their
 *   order (parse, fit, leak shares, model, prices, measures, `sequenceMeasures`), so the
 *   package is the plan's;
 * - the steps the plan values beside them (the package at its low and high estimates, each
 *   left-out measure at its low and high after the package) are valued here too where their
 *   money could refuse the home, that is when it has no electricity price (a step's energy
 *   is finite and its valuation cannot throw for any leakage state a step leaves), the
 *   ventilation outcome is worked out as `evaluateHome` works it out, and the safety check's
 *   input is checked as `assessSafety` checks it (`buildSafetyContext`, the one part of it
 *   that can refuse a home; its rules only write cautions, which a run never reads);
 * - what is left, the Decimal money, can refuse only a non-finite saving or a missing
 *   electricity price, which are checked;
 * - when anything here throws or a check fails, the home is evaluated in full, so the error
 *   is the one `evaluateHome` throws first.
 * test/core/uncertainty.test.ts holds it to `evaluateHome` on varied and broken homes.
 */
import { evaluateHome, prepareHome, type EvaluateOptions, type Evaluation } from '../evaluate.ts';
import type { HomeModel } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import type { PriceBook } from '../plan/prices.ts';
import { sequenceMeasures, type SequencedPlan } from '../plan/sequence.ts';
import {
  applyMeasure,
  stateAfter,
  stateOf,
  type PlanState,
  type StepOutcome,
} from '../plan/step.ts';
import { ventilationAfterPackage } from '../plan/ventilation-fan.ts';
import { buildSafetyContext } from '../safety/context.ts';
import type { HomeFile, Range } from '../schema.ts';

/** A home's package and what its kernel is compiled from. */
export interface HomePackage {
  home: HomeFile;
  model: HomeModel;
  /** The plan's included measures, in the order applied. */
  measures: readonly PreparedMeasure[];
}

/**
 * The package of a home file, as `evaluateHome` would plan it.
 *
 * @param input - a home file (parsed or raw JSON); raw input is validated first
 * @param options.library - the measure library (the shipped one by default)
 * @throws InputError as `evaluateHome` throws it
 */
export function homePackageOf(input: unknown, options: EvaluateOptions = {}): HomePackage {
  let quick: HomePackage | null;
  try {
    quick = quickPackage(input, options);
  } catch {
    // The full evaluation throws its own first error.
    quick = null;
  }
  return quick ?? packageOfEvaluation(evaluateHome(input, options));
}

/** The package of a full evaluation. */
export function packageOfEvaluation(evaluation: Evaluation): HomePackage {
  return {
    home: evaluation.home,
    model: evaluation.model,
    measures: evaluation.plan.entries
      .filter((entry) => entry.included)
      .map((entry) => entry.step.measure),
  };
}

/** The package without the plan's money, or null when the money might refuse the home. */
function quickPackage(input: unknown, options: EvaluateOptions): HomePackage | null {
  const { home, model, prices, measures } = prepareHome(input, options);
  const start = stateOf(model, model.testIn);
  const sequenced = sequenceMeasures({
    model,
    prices,
    measures,
    startState: start,
    ranking: home.economics.ranking ?? 'sir',
  });
  const included = sequenced.included.map((step) => step.measure);
  const ventilation = ventilationAfterPackage({
    model,
    prices,
    leakageAfter: sequenced.finalState.leakage,
  });
  // What assessSafety throws, it throws here: its rules, run after this check, throw nothing.
  buildSafetyContext({
    house: home.house,
    heating: home.heating,
    combustionAppliances: home.combustionAppliances ?? [],
    plannedMeasures: included.map((measure) => ({
      id: measure.id,
      type: measure.type.id,
      location: measure.location,
    })),
    leakage: {
      cfm50Before: model.testInCfm50,
      cfm50After: sequenced.included.at(-1)?.cfm50After ?? model.testInCfm50,
      volumeFt3: home.house.conditionedVolumeFt3,
    },
    ventilation: {
      requiredCfm: ventilation.requiredCfm,
      fanNeedBeforeCfm: ventilation.fanCfmBefore,
      fanNeedAfterCfm: ventilation.fanCfm,
      existingFanCfm: ventilation.existingFanCfm,
      fanAdded: ventilation.addedFan !== null,
      infiltrationCreditTaken: ventilation.infiltrationCreditTaken,
    },
  });
  const valued = [...sequenced.included, ...sequenced.excluded];
  const ranged = () => rangedSteps(model, start, sequenced);
  return moneyCannotRefuse(prices, valued, ranged) ? { home, model, measures: included } : null;
}

/**
 * The steps `planHome` values at a low or high estimate: the package replayed at each, and
 * every left-out measure at each after the package.
 */
function rangedSteps(model: HomeModel, start: PlanState, sequenced: SequencedPlan): StepOutcome[] {
  const steps: StepOutcome[] = [];
  for (const estimate of ['low', 'high'] as const satisfies readonly (keyof Range)[]) {
    let state = start;
    for (const step of sequenced.included) {
      const outcome = applyMeasure(model, state, step.measure, estimate);
      steps.push(outcome);
      state = stateAfter(outcome);
    }
  }
  for (const step of sequenced.excluded) {
    steps.push(applyMeasure(model, sequenced.finalState, step.measure, 'low'));
    steps.push(applyMeasure(model, sequenced.finalState, step.measure, 'high'));
  }
  return steps;
}

/**
 * True when the plan's money cannot throw: each valued step's savings are finite (its worth
 * reads them as finite Decimals), and without an electricity price no step saves or adds
 * electricity (its worth would ask for the price), the low and high steps (`ranged`, worked
 * out only then) included. Rates, lives, costs and loan terms are held in range by the home
 * file's schema.
 */
function moneyCannotRefuse(
  prices: PriceBook,
  valued: readonly StepOutcome[],
  ranged: () => readonly StepOutcome[],
): boolean {
  const finite = valued.every(({ saved }) =>
    [saved.heatingFuelUnits, saved.coolingKwh, saved.ventilationFanKwh, saved.siteMMBtu].every(
      Number.isFinite,
    ),
  );
  if (!finite) return false;
  if (prices.electricity !== null) return true;
  return [...valued, ...ranged()].every(
    ({ saved }) => saved.coolingKwh + saved.ventilationFanKwh === 0,
  );
}
