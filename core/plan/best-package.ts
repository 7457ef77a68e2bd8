/**
 * The best package of a home's measures within a budget, found by exact search.
 *
 * What a package is. The canonical order is the order of the plan's entries with declined
 * measures dropped: the health-and-safety measures first (in the order given), then the
 * measures the plan takes (in the order it takes them), then those it leaves out (ranked on
 * what the package left). A package is every health-and-safety measure plus any subset of the
 * other measures (the energy measures), applied in the canonical order, each step on what the
 * earlier steps of the package left, exactly as the plan applies its steps (`applyMeasure`:
 * never more than is left at the location, never below the leakage floor; energy by
 * `model.energyOf`, with the 62.2 fan the state calls for). A fixed order makes every subset's
 * value one number, and lets the search reuse the state after each prefix; re-sequencing each
 * subset greedily would not. The plan's own package is a prefix of the order, so it is valued
 * here exactly as the plan values it.
 *
 * What a package is worth, as the plan reports it (core/plan.ts): each step's year of savings
 * priced to the cent, its present value over the measure's own life with the NIST Handbook 135
 * UPV* factors to the cent; savings = Σ a year's savings; cost = Σ measure costs + the
 * ventilation fan when the final leakage needs more 62.2 fan flow than the house runs;
 * NPV = Σ PV − cost; SIR = Σ PV of the energy measures ÷ Σ their cost (null when they cost
 * nothing). Objectives: 'npv' (default), 'savings' (a year, USD) or 'sir' (a null SIR ranks
 * below every number).
 *
 * The budget covers the energy measures. Health-and-safety work (its measures and the fan a
 * package calls for) is done whatever the budget, so it is in every package's cost and NPV
 * but not held against the budget, and is reported apart. Hence the package of health-and-
 * safety work alone (no energy measure) always fits: it is the answer when nothing else does.
 *
 * Constraints: energy cost ≤ budget (in whole cents); optionally every energy measure's SIR
 * ≥ 1 where the package puts it (a measure that costs nothing has no SIR and passes);
 * optionally the package SIR ≥ 1 (a null SIR passes).
 *
 * Ranking: the higher score; among equal exact scores the lower cost, then fewer measures,
 * then the measures that come earliest in the canonical order.
 *
 * Search (best-package/search.ts): depth first over subsets in the canonical order, every
 * package's figures in whole cents, certain to equal the Decimal figures
 * (best-package/step-cents.ts), so scores and ties compare exactly and the winner's figures
 * are computed once, here, by `packageFigures`. Subtrees are cut only where nothing in them
 * can win: over budget, a failed own SIR, a measure that removes nothing, and a bound on
 * what any package below a node can score: for the methods whose infiltration is linear in
 * CFM50 (nFactor, lblBasic, ashrae622) best-package/bounds.ts on the energy table of
 * best-package/energy-cells.ts, where a state's energy depends on its total alone; for the
 * enhanced model (aim2) on degree-day seasons best-package/bounds-aim2.ts, which bounds the
 * flow over the box of leakage by location the subtree can reach (interval bounds on AIM-2's
 * formulas and their derivatives, best-package/aim2-box.ts; a box of its own for each range
 * of final totals, with the floor raised to the range's low end; PV less cost bounded jointly
 * per measure; and a bound on PV by parts, best-package/path-factors.ts, that needs only the
 * range of a year's dollars, not the flow's slope). That bound is looser than the linear one
 * (interval bounds widen with the box, and its slopes have no bound where the box reaches a
 * distribution at which the interval rules cannot bound AIM-2's derivative), so AIM-2
 * searches stay slower. Hour-by-hour homes on the linear methods use the linear bound (each
 * season's mean flows, the latent one included, stay linear in CFM50); on aim2 the AIM-2
 * bound, its seasons' hours gathered in bins (best-package/aim2-hourly-bins.ts).
 * test/core/best-package.test.ts and best-package-aim2.test.ts check the search against brute
 * force (degree-day, AIM-2 and hour-by-hour homes) and each condition the bounds rest on;
 * best-package-interval.test.ts checks the interval rules; best-package-aim2-cuts.test.ts the
 * AIM-2 refinements (share cuts, one-location falls, raised floors, the budget's reach), and
 * brute force on homes with most of their leakage in the ceiling;
 * best-package-aim2-hourly.test.ts the bins of hours; best-package-path-factors.test.ts the
 * bound by parts.
 */
import { savingsToInvestmentRatio, simplePaybackYears } from '../economics/index.ts';
import { InputError } from '../errors.ts';
import type { Evaluation } from '../evaluate.ts';
import { totalCfm50 } from '../home-model.ts';
import type { PreparedMeasure } from '../measures.ts';
import { Decimal, roundToCents, sumUsd } from '../money.ts';
import { aim2Bounded, buildAim2Bound } from './best-package/bounds-aim2.ts';
import { buildEnergyCells } from './best-package/energy-cells.ts';
import { searchPackages, type PackageCents } from './best-package/search.ts';
import { BOUNDED_METHODS, fanThresholdCfm50 } from './best-package/thresholds.ts';
import { buildPriceBook, type PriceBook } from './prices.ts';
import { applyMeasure, stateAfter, stateOf, type PlanState, type StepOutcome } from './step.ts';
import { DEFAULT_FAN_COST_USD, ventilationAfterPackage } from './ventilation-fan.ts';

export { BOUNDED_METHODS, fanThresholdCfm50, usefulFloorCfm50 } from './best-package/thresholds.ts';

export const PACKAGE_OBJECTIVES = ['npv', 'savings', 'sir'] as const;
export type PackageObjective = (typeof PACKAGE_OBJECTIVES)[number];

export interface BestPackageOptions {
  /** What the energy measures may cost, USD (Infinity for no limit). */
  budgetUsd: number;
  objective?: PackageObjective;
  everyMeasureSirAtLeastOne?: boolean;
  packageSirAtLeastOne?: boolean;
}

/** A package's figures, each exact as the plan reports it. */
export interface PackageFigures {
  /** Every measure of the package in the order applied, health and safety first. */
  measureIds: string[];
  healthAndSafetyMeasureIds: string[];
  /** What the budget covers: the energy measures' cost, USD. */
  budgetCostUsd: Decimal;
  /** Health-and-safety measures and the fan the package calls for, USD. */
  healthAndSafetyCostUsd: Decimal;
  /** Everything: budgetCostUsd + healthAndSafetyCostUsd, USD. */
  costUsd: Decimal;
  annualSavingsUsd: Decimal;
  pvSavingsUsd: Decimal;
  npvUsd: Decimal;
  sir: Decimal | null;
  simplePaybackYears: Decimal | null;
  fanAdded: boolean;
  cfm50After: number;
  /** Each energy measure's SIR where the package puts it (null when it costs nothing). */
  measureSirs: { id: string; sir: Decimal | null }[];
}

export interface BestPackage extends PackageFigures {
  objective: PackageObjective;
  budgetUsd: number;
  /** Packages whose state the search computed (at most 2^n for n energy measures). */
  nodesVisited: number;
  /** Whether the subtree bounds were used (false for methods without a proven bound). */
  boundsUsed: boolean;
  /** The result is the exact optimum (the search is exhaustive up to sound cuts). */
  proven: true;
}

/** The canonical order of an evaluation's measures (declined dropped), split by kind. */
export function canonicalMeasures(evaluation: Evaluation): {
  healthAndSafety: PreparedMeasure[];
  energy: PreparedMeasure[];
} {
  const measures = evaluation.plan.entries
    .map((entry) => entry.step.measure)
    .filter((measure) => measure.status !== 'declined');
  return {
    healthAndSafety: measures.filter((measure) => measure.cost.healthAndSafety),
    energy: measures.filter((measure) => !measure.cost.healthAndSafety),
  };
}

/**
 * The exact figures of a package.
 *
 * @param evaluation - the home's evaluation
 * @param energyMeasureIds - the energy measures chosen (any order; applied in canonical order)
 * @throws InputError when an id is not one of the home's energy measures that is not declined
 */
export function packageFigures(
  evaluation: Evaluation,
  energyMeasureIds: readonly string[],
  prices: PriceBook = buildPriceBook(evaluation.home),
): PackageFigures {
  const { healthAndSafety, energy } = canonicalMeasures(evaluation);
  const wanted = new Set(energyMeasureIds);
  for (const id of wanted) {
    if (!energy.some((measure) => measure.id === id)) {
      throw InputError.at(
        'measureIds',
        `"${id}" is not one of the home's energy measures (expected a measure that is neither health and safety nor declined)`,
      );
    }
  }
  const model = evaluation.model;
  const chosen = [...healthAndSafety, ...energy.filter((measure) => wanted.has(measure.id))];
  let state: PlanState = stateOf(model, model.testIn);
  const steps: StepOutcome[] = chosen.map((measure) => {
    const outcome = applyMeasure(model, state, measure);
    state = stateAfter(outcome);
    return outcome;
  });
  const worths = steps.map((step) => {
    const worth = prices.annualWorth(step.saved);
    return {
      step,
      annualUsd: worth.totalUsd,
      pvUsd: prices.presentValue(worth, step.measure.lifeYears),
    };
  });
  const ventilation = ventilationAfterPackage({ model, prices, leakageAfter: state.leakage });
  const fanCostUsd = ventilation.addedFan?.costUsd ?? new Decimal(0);
  const energyWorths = worths.filter(({ step }) => !step.measure.cost.healthAndSafety);
  const budgetCostUsd = sumUsd(energyWorths.map(({ step }) => step.measure.cost.totalUsd));
  const healthAndSafetyCostUsd = sumUsd(
    healthAndSafety.map((measure) => measure.cost.totalUsd),
  ).plus(fanCostUsd);
  const costUsd = budgetCostUsd.plus(healthAndSafetyCostUsd);
  const annualSavingsUsd = sumUsd(worths.map((worth) => worth.annualUsd));
  const pvSavingsUsd = sumUsd(worths.map((worth) => worth.pvUsd));
  const sirOf = (pvUsd: Decimal, investmentUsd: Decimal) =>
    investmentUsd.gt(0)
      ? savingsToInvestmentRatio({ presentValueSavingsUsd: pvUsd, investmentUsd })
      : null;
  return {
    measureIds: chosen.map((measure) => measure.id),
    healthAndSafetyMeasureIds: healthAndSafety.map((measure) => measure.id),
    budgetCostUsd,
    healthAndSafetyCostUsd,
    costUsd,
    annualSavingsUsd,
    pvSavingsUsd,
    npvUsd: pvSavingsUsd.minus(costUsd),
    sir: sirOf(sumUsd(energyWorths.map((worth) => worth.pvUsd)), budgetCostUsd),
    simplePaybackYears: simplePaybackYears({
      investmentUsd: costUsd,
      firstYearSavingsUsd: annualSavingsUsd,
    }),
    fanAdded: ventilation.addedFan !== null,
    cfm50After: totalCfm50(state.leakage),
    measureSirs: energyWorths.map(({ step, pvUsd }) => ({
      id: step.measure.id,
      sir: sirOf(pvUsd, step.measure.cost.totalUsd),
    })),
  };
}

/** The exact score of a package under an objective (null: a package with no SIR). */
export function objectiveValue(
  figures: PackageFigures,
  objective: PackageObjective,
): Decimal | null {
  switch (objective) {
    case 'npv':
      return figures.npvUsd;
    case 'savings':
      return figures.annualSavingsUsd;
    case 'sir':
      return figures.sir;
  }
}

/** Negative when package `a` is better than `b` (the tie rules of the top comment). */
export function comparePackages(
  a: { figures: PackageFigures; positions: readonly number[] },
  b: { figures: PackageFigures; positions: readonly number[] },
  objective: PackageObjective,
): number {
  const valueA = objectiveValue(a.figures, objective);
  const valueB = objectiveValue(b.figures, objective);
  if (valueA === null || valueB === null) {
    if (valueA !== valueB) return valueA === null ? 1 : -1;
  } else if (!valueA.eq(valueB)) {
    return valueA.gt(valueB) ? -1 : 1;
  }
  if (!a.figures.costUsd.eq(b.figures.costUsd))
    return a.figures.costUsd.lt(b.figures.costUsd) ? -1 : 1;
  if (a.positions.length !== b.positions.length) return a.positions.length - b.positions.length;
  for (let index = 0; index < a.positions.length; index += 1) {
    const difference = (a.positions[index] ?? 0) - (b.positions[index] ?? 0);
    if (difference !== 0) return difference;
  }
  return 0;
}

function readOptions(options: BestPackageOptions): Required<BestPackageOptions> {
  const { budgetUsd } = options;
  if (typeof budgetUsd !== 'number' || Number.isNaN(budgetUsd) || budgetUsd < 0) {
    throw InputError.at('budgetUsd', 'expected a number of dollars of at least 0 (or Infinity)');
  }
  const objective = options.objective ?? 'npv';
  if (!PACKAGE_OBJECTIVES.includes(objective)) {
    throw InputError.at('objective', `expected one of ${PACKAGE_OBJECTIVES.join(', ')}`);
  }
  return {
    budgetUsd,
    objective,
    everyMeasureSirAtLeastOne: options.everyMeasureSirAtLeastOne ?? false,
    packageSirAtLeastOne: options.packageSirAtLeastOne ?? false,
  };
}

/** Cents of a Decimal amount already rounded to the cent. */
function centsOf(amountUsd: Decimal): number {
  return amountUsd.times(100).toNumber();
}

/** The health-and-safety work every package holds: its state and figures, cents. */
function healthAndSafetyWork(evaluation: Evaluation, prices: PriceBook) {
  const model = evaluation.model;
  let state: PlanState = stateOf(model, model.testIn);
  let pvCents = 0;
  let annualCents = 0;
  let costCents = 0;
  for (const measure of canonicalMeasures(evaluation).healthAndSafety) {
    const outcome = applyMeasure(model, state, measure);
    const worth = prices.annualWorth(outcome.saved);
    pvCents += centsOf(prices.presentValue(worth, measure.lifeYears));
    annualCents += centsOf(worth.totalUsd);
    costCents += centsOf(measure.cost.totalUsd);
    state = stateAfter(outcome);
  }
  return { state, cents: { pvCents, annualCents, costCents } };
}

/**
 * The search's cents must be the figures' cents (step-cents.ts); a difference would mean the
 * search ranked packages on figures the plan does not report.
 */
function checkAgreement(
  figures: PackageFigures,
  found: PackageCents,
  health: { pvCents: number; annualCents: number },
): void {
  const agrees =
    centsOf(figures.pvSavingsUsd) === health.pvCents + found.pvCents &&
    centsOf(figures.annualSavingsUsd) === health.annualCents + found.annualCents &&
    centsOf(figures.budgetCostUsd) === found.costCents &&
    figures.fanAdded === found.fanNeeded;
  if (!agrees) throw new Error('best package: the search and the package figures disagree');
}

/**
 * The best package within a budget.
 *
 * @param evaluation - the home's evaluation (evaluateHome)
 * @param options.budgetUsd - what the energy measures may cost, USD (Infinity: no limit)
 * @param options.objective - 'npv' (default), 'savings' (a year, USD) or 'sir'
 * @param options.everyMeasureSirAtLeastOne - each energy measure SIR ≥ 1 where it stands
 * @param options.packageSirAtLeastOne - the package SIR ≥ 1
 * @returns the optimal package's exact figures and how many packages the search valued
 * @throws InputError naming the option that is out of range
 */
export function bestPackage(evaluation: Evaluation, options: BestPackageOptions): BestPackage {
  const settings = readOptions(options);
  const model = evaluation.model;
  const prices = buildPriceBook(evaluation.home);
  const { energy } = canonicalMeasures(evaluation);
  const health = healthAndSafetyWork(evaluation, prices);
  const linear = BOUNDED_METHODS.includes(model.home.infiltrationMethod);
  const aim2 = aim2Bounded(model) ? buildAim2Bound(model, prices) : null;
  const boundsUsed = linear || aim2 !== null;
  const fanUsd = roundToCents(
    new Decimal(model.home.ventilation?.fanCostUsd ?? DEFAULT_FAN_COST_USD),
  );
  const outcome = searchPackages({
    model,
    prices,
    energy,
    objective: settings.objective,
    budgetCents: Number.isFinite(settings.budgetUsd)
      ? new Decimal(settings.budgetUsd).times(100).floor().toNumber()
      : Infinity,
    everyMeasureSirAtLeastOne: settings.everyMeasureSirAtLeastOne,
    packageSirAtLeastOne: settings.packageSirAtLeastOne,
    root: health.state,
    health: health.cents,
    fanCents: centsOf(fanUsd),
    cells: linear ? buildEnergyCells(model, prices, totalCfm50(health.state.leakage)) : null,
    aim2,
    fanThresholdCfm50: fanThresholdCfm50(model),
  });
  const figures = packageFigures(
    evaluation,
    outcome.best.positions.map((position) => energy[position]?.id ?? ''),
    prices,
  );
  checkAgreement(figures, outcome.best, health.cents);
  return {
    ...figures,
    objective: settings.objective,
    budgetUsd: settings.budgetUsd,
    nodesVisited: outcome.nodesVisited,
    boundsUsed,
    proven: true,
  };
}
