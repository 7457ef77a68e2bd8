/**
 * Evaluates a home file end to end: leakage from the test, infiltration by the chosen
 * method, the sequenced and priced plan, and the cautions. `evaluateHome` returns the full
 * result with Decimal money for other code; `reportOf` turns it into the plain JSON report
 * the command line prints (money as numbers to the cent).
 */
import { assumedLeakShares, buildHomeModel, type HomeModel } from './home-model.ts';
import {
  ach50,
  cfm50PerEnvelopeFt2,
  elaIn2,
  eqlaIn2,
  estimateEnvelopeAreaFt2,
  fitMultipointTest,
  normalizedLeakage,
  onePointTest,
  type LeakageFit,
} from './leakage.ts';
import { SHIPPED_LIBRARY, type MeasureLookup } from './measure-library.ts';
import { estimateReductionCfm50, prepareMeasures, type PreparedMeasure } from './measures.ts';
import { FUEL_FACTS } from './fuels.ts';
import { planHome, type PlanResult } from './plan.ts';
import { buildPriceBook, type PriceBook } from './plan/prices.ts';
import { assessSafety, type Caution } from './safety.ts';
import {
  parseHomeFile,
  type HomeFile,
  LEAK_LOCATIONS,
  type LeakLocation,
  type LeakShares,
} from './schema.ts';
import { buildReport, type EvaluationReport } from './report.ts';
import type { WeatherYear } from './weather/hourly-airflow.ts';
import { hourlyClimateOf } from './weather/hourly-climate.ts';

export interface Evaluation {
  home: HomeFile;
  fit: LeakageFit;
  model: HomeModel;
  plan: PlanResult;
  cautions: Caution[];
  notes: string[];
}

/** The blower-door fit of a home's test. */
export function fitOfTest(test: HomeFile['leakageTest']): LeakageFit {
  if (test.points) {
    return fitMultipointTest(
      test.points.map((point) => ({ pressurePa: point.pa, flowCfm: point.cfm })),
    );
  }
  return onePointTest(test.cfm50 ?? 0, test.exponentN);
}

export interface EvaluateOptions {
  /** The measure library to take defaults from (a project's edits); the shipped one by default. */
  library?: MeasureLookup;
  /** The weather year of the home's climate, for a home planned hour by hour. */
  weather?: WeatherYear;
}

/** A home ready to plan: parsed, its test fitted, its model, prices and measures made. */
export interface PreparedHome {
  home: HomeFile;
  fit: LeakageFit;
  model: HomeModel;
  prices: PriceBook;
  measures: PreparedMeasure[];
}

/**
 * The steps every plan of a home starts with (the full evaluation, and a portfolio's quicker
 * package): the home file checked, the test fitted, the model, the prices and the measures
 * (with the home's calibration, when it has one).
 *
 * @throws InputError listing every problem with the input
 */
export function prepareHome(input: unknown, options: EvaluateOptions = {}): PreparedHome {
  const library = options.library ?? SHIPPED_LIBRARY;
  const home = parseHomeFile(input);
  const fit = fitOfTest(home.leakageTest);
  const model = buildHomeModel(
    home,
    fit,
    home.leakShares ?? assumedSharesFor(home, fit, library),
    hourlyClimateOf(home, fit.exponentN, options.weather),
  );
  const prices = buildPriceBook(home);
  const measures = prepareMeasures(home.measures, {
    exponentN: fit.exponentN,
    testIn: model.testIn,
    library,
    ...(home.calibration ? { calibration: home.calibration } : {}),
  });
  return { home, fit, model, prices, measures };
}

/**
 * Evaluates a home.
 *
 * @param input - a home file (parsed or raw JSON); raw input is validated first
 * @throws InputError listing every problem with the input
 */
export function evaluateHome(input: unknown, options: EvaluateOptions = {}): Evaluation {
  const { home, fit, model, prices, measures } = prepareHome(input, options);
  const plan = planHome({ model, prices, measures, ranking: home.economics.ranking ?? 'sir' });
  const pkg = plan.package;
  const included = plan.entries.filter((entry) => entry.included);

  const cautions = assessSafety({
    house: home.house,
    heating: home.heating,
    combustionAppliances: home.combustionAppliances ?? [],
    plannedMeasures: included.map((entry) => ({
      id: entry.step.measure.id,
      type: entry.step.measure.type.id,
      location: entry.step.measure.location,
    })),
    leakage: {
      cfm50Before: pkg.cfm50Before,
      cfm50After: pkg.cfm50After,
      volumeFt3: home.house.conditionedVolumeFt3,
    },
    ventilation: {
      requiredCfm: pkg.ventilation.requiredCfm,
      fanNeedBeforeCfm: pkg.ventilation.fanCfmBefore,
      fanNeedAfterCfm: pkg.ventilation.fanCfm,
      existingFanCfm: pkg.ventilation.existingFanCfm,
      fanAdded: pkg.ventilation.addedFan !== null,
      infiltrationCreditTaken: pkg.ventilation.infiltrationCreditTaken,
    },
  });

  return { home, fit, model, plan, cautions, notes: notesOf(home, model, plan) };
}

/** Leak shares for a home file that gives none, from the default split and its work scope. */
export function assumedSharesFor(
  home: HomeFile,
  fit: LeakageFit,
  library: MeasureLookup,
): LeakShares {
  const expectedByLocation: Partial<Record<LeakLocation, number>> = {};
  const noLocationNeeded = { ceiling: 0, wall: 0, floor: 0, flue: 0 };
  for (const measure of home.measures) {
    const type = library.find(measure.type);
    if (!type || measure.status === 'declined' || measure.shareOfLocation) continue;
    const location = measure.location ?? type.location;
    const { range } = estimateReductionCfm50(measure, type, {
      exponentN: fit.exponentN,
      testIn: noLocationNeeded,
    });
    expectedByLocation[location] = (expectedByLocation[location] ?? 0) + range.likely;
  }
  return assumedLeakShares({ cfm50: fit.cfm50, expectedByLocation });
}

/** Assumptions worth saying beside the figures. */
function notesOf(home: HomeFile, model: HomeModel, plan: PlanResult): string[] {
  const notes: string[] = [];
  if (!home.leakShares) {
    const shares = LEAK_LOCATIONS.map(
      (location) =>
        `${location} ${Math.round((model.testIn[location] / Math.max(model.testInCfm50, 1e-9)) * 100)} %`,
    ).join(', ');
    notes.push(
      `No leak shares given: assumed ${shares} (a quarter each in ceiling and floor, half in the walls, raised where the measures expect more).`,
    );
  }
  if (home.emissions === undefined && (home.cooling || home.heating.fuel === 'electricity')) {
    notes.push('No grid CO2 factor given: electricity is counted at 0 kg CO2/kWh.');
  }
  if (!home.house.envelopeAreaFt2) {
    notes.push('Envelope area estimated from floor area, stories and height (a box).');
  }
  if (home.calibration) {
    const scaled = plan.entries
      .map((entry) => entry.step.measure)
      .filter((measure) => measure.calibrationFactor !== undefined)
      .map((measure) => `${measure.id} × ${measure.calibrationFactor?.toFixed(2)}`);
    notes.push(
      `Estimates scaled by the realization factors of “${home.calibration.basis.label}” (${home.calibration.basis.date}): ` +
        (scaled.length === 0
          ? 'no measure not yet done is of a listed type.'
          : `${scaled.join(', ')}.`),
    );
  }
  const fan = plan.package.ventilation.addedFan;
  if (fan && home.ventilation?.fanCostUsd === undefined) {
    notes.push('Ventilation fan cost is a default; set ventilation.fanCostUsd for this job.');
  }
  if (home.infiltrationMethod === 'aim2') {
    const risen = plan.entries.filter(
      ({ step }) =>
        step.appliedCfm50 > 0 &&
        model.airflow(step.leakageAfter).heatingCfm > model.airflow(step.leakageBefore).heatingCfm,
    );
    if (risen.length > 0) {
      notes.push(
        `The enhanced model gives more natural infiltration after ${risen.map((entry) => entry.step.measure.id).join(', ')} than before: ` +
          'its closed-form factors are approximate when nearly all leakage is at the ceiling and floor. Check the leak shares, or compare with the LBL basic method.',
      );
    }
  }
  for (const entry of plan.entries) {
    if (entry.step.limitedBy === 'floor') {
      notes.push(`${entry.step.measure.id}: reduction limited by the leakage floor.`);
    } else if (entry.step.limitedBy === 'location') {
      notes.push(
        `${entry.step.measure.id}: reduction limited to the leakage left at its location.`,
      );
    }
  }
  return notes;
}

/** Evaluates a home and returns the plain JSON report. */
export function evaluateHomeReport(
  input: unknown,
  options: EvaluateOptions = {},
): EvaluationReport {
  return reportOf(evaluateHome(input, options));
}

/** The plain JSON report of an evaluation. */
export function reportOf(evaluation: Evaluation): EvaluationReport {
  const { home, fit, model } = evaluation;
  const envelopeAreaFt2 =
    home.house.envelopeAreaFt2 ??
    estimateEnvelopeAreaFt2({
      floorAreaFt2: home.house.conditionedFloorAreaFt2,
      stories: home.house.stories,
      heightFt: home.house.heightFt,
    });
  const ela = elaIn2(fit.cfm50, fit.exponentN);
  const airflow = model.airflow(model.testIn);
  return buildReport({
    evaluation,
    leakage: {
      cfm50: fit.cfm50,
      ach50: ach50(fit.cfm50, home.house.conditionedVolumeFt3),
      elaIn2: ela,
      eqlaIn2: eqlaIn2(fit.cfm50, fit.exponentN),
      exponentN: fit.exponentN,
      coefficientCfmPerPaN: fit.coefficientCfmPerPaN,
      normalizedLeakage: normalizedLeakage({
        elaIn2: ela,
        floorAreaFt2: home.house.conditionedFloorAreaFt2,
        heightFt: home.house.heightFt,
      }),
      cfm50PerEnvelopeFt2: cfm50PerEnvelopeFt2(fit.cfm50, envelopeAreaFt2),
      envelopeAreaFt2,
      envelopeAreaEstimated: home.house.envelopeAreaFt2 === undefined,
      pointCount: fit.pointCount,
      rSquared: fit.rSquared,
      standardErrorN: fit.standardErrorN,
      standardErrorLnC: fit.standardErrorLnC,
      warnings: fit.warnings,
    },
    airflow,
    heatingFuelUnit: FUEL_FACTS[home.heating.fuel].unit,
  });
}
