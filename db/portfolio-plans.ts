/**
 * The stored homes of a portfolio evaluated together: each chosen home's plan (as the
 * `plan.evaluate` channel gives it, with the project's library edits), the portfolio's figures
 * (core/portfolio.ts), and the test-out results of the homes that have one (core/test-out.ts).
 * A home that cannot be planned yet (no test-in, no prices, …) is listed with the reason and
 * left out of the figures, so one unfinished home never hides the rest.
 */
import { fitRealization, type RealizationFit } from '../core/calibration.ts';
import { InputError } from '../core/errors.ts';
import type { HomeFile } from '../core/schema.ts';
import { evaluateHome, reportOf } from '../core/evaluate.ts';
import {
  portfolioFigures,
  portfolioRowOf,
  type PortfolioFigures,
  type PortfolioHome,
  type PortfolioRow,
} from '../core/portfolio.ts';
import {
  realizationByType,
  testOutInputOf,
  testOutResults,
  type TestOutInput,
  type TestOutResult,
  type TypeRealization,
} from '../core/test-out.ts';
import { DbError } from './errors.ts';
import { exportHomeFile } from './home-file.ts';
import { listHomes, type HomeFilter } from './repositories/homes.ts';
import type { ReadAccess } from './store.ts';
import {
  evaluateOptionsOf,
  weatherYearOfHome,
  type WeatherYearCache,
} from './evaluation-inputs.ts';
import type { WeatherYear } from '../core/weather.ts';

/** Which homes: those of a filter (as the Homes list), or exactly these ids. */
export type PortfolioSelection =
  | { filter: Omit<HomeFilter, 'limit' | 'offset' | 'sort' | 'descending'> }
  | { homeIds: readonly number[] };

export interface SkippedHome {
  homeId: number;
  name: string;
  /** Why it could not be planned, with the field at fault when there is one. */
  reason: string;
  field?: string;
}

export interface PortfolioEvaluation {
  homes: PortfolioHome[];
  rows: PortfolioRow[];
  figures: PortfolioFigures;
  testOut: { results: TestOutResult[]; byType: TypeRealization[] };
  /** Realization factors by type fitted jointly over the tested homes; null with none. */
  calibration: RealizationFit | null;
  skipped: SkippedHome[];
}

/** The bootstrap's seed when none is given: the same figures every time. */
export const CALIBRATION_SEED = 1;

/**
 * The calibration of the tested homes: measured reduction on estimates summed by type. Homes
 * that tested leakier after the work are left out: their tests want checking first.
 */
function calibrationOf(results: readonly TestOutResult[], seed: number): RealizationFit | null {
  const trusted = results.filter((result) => result.testOutCfm50 <= result.testInCfm50);
  if (trusted.length === 0) return null;
  return fitRealization(
    trusted.map((result) => {
      const estimatedByType: Record<string, number> = {};
      for (const measure of result.done) {
        estimatedByType[measure.type] =
          (estimatedByType[measure.type] ?? 0) + measure.estimatedReductionCfm50;
      }
      return {
        homeId: result.homeId,
        measuredReductionCfm50: result.measuredReductionCfm50,
        estimatedByType,
      };
    }),
    { seed },
  );
}

/** The most homes one portfolio evaluation takes. */
export const MAX_PORTFOLIO_HOMES = 20_000;

function selectedHomes(read: ReadAccess, selection: PortfolioSelection) {
  if ('homeIds' in selection) {
    const wanted = new Set(selection.homeIds);
    const live = listHomes(read, { limit: MAX_PORTFOLIO_HOMES });
    const found = live.filter((home) => wanted.has(home.id));
    const missing = [...wanted].filter((homeId) => !found.some((home) => home.id === homeId));
    if (missing.length > 0) {
      throw InputError.at('homeIds', `no live home has the id ${missing.slice(0, 5).join(', ')}`);
    }
    return found;
  }
  return listHomes(read, { ...selection.filter, limit: MAX_PORTFOLIO_HOMES });
}

/**
 * The chosen homes as home files, those that can be planned (have a test-in and every part a
 * plan needs); the others are left out, as `evaluatePortfolio` leaves them out.
 */
export function portfolioHomeFiles(read: ReadAccess, selection: PortfolioSelection): HomeFile[] {
  return portfolioHomeInputs(read, selection).files;
}

/**
 * The chosen homes' files, and for those planned hour by hour their weather years: each
 * year once in `weatherYears`, `weatherOfHome[i]` its place there for file i (null on degree
 * days).
 */
export function portfolioHomeInputs(
  read: ReadAccess,
  selection: PortfolioSelection,
): { files: HomeFile[]; weatherYears: WeatherYear[]; weatherOfHome: (number | null)[] } {
  const files: HomeFile[] = [];
  const weatherOfHome: (number | null)[] = [];
  const cache: WeatherYearCache = new Map();
  const weatherYears: WeatherYear[] = [];
  for (const summary of selectedHomes(read, selection)) {
    try {
      const file = exportHomeFile(read, summary.id);
      const year = weatherYearOfHome(read, summary.id, file, cache);
      files.push(file);
      if (year === undefined) {
        weatherOfHome.push(null);
      } else {
        if (!weatherYears.includes(year)) weatherYears.push(year);
        weatherOfHome.push(weatherYears.indexOf(year));
      }
    } catch (error) {
      if (!(error instanceof InputError) && !(error instanceof DbError)) throw error;
    }
  }
  return { files, weatherYears, weatherOfHome };
}

/**
 * Evaluates the chosen homes of the project.
 *
 * @param onProgress - told after each home (done, of)
 */
export function evaluatePortfolio(
  read: ReadAccess,
  selection: PortfolioSelection,
  onProgress?: (done: number, of: number) => void,
  calibrationSeed = CALIBRATION_SEED,
): PortfolioEvaluation {
  const chosen = selectedHomes(read, selection);
  const weatherYears: WeatherYearCache = new Map();
  const homes: PortfolioHome[] = [];
  const testOuts: TestOutInput[] = [];
  const skipped: SkippedHome[] = [];
  chosen.forEach((summary, index) => {
    try {
      const file = exportHomeFile(read, summary.id);
      const evaluation = evaluateHome(
        file,
        evaluateOptionsOf(read, summary.id, file, weatherYears),
      );
      homes.push({
        homeId: summary.id,
        name: summary.name,
        heatingFuel: evaluation.home.heating.fuel,
        volumeFt3: evaluation.home.house.conditionedVolumeFt3,
        report: reportOf(evaluation),
      });
      const testOut = testOutInputOf(summary.id, evaluation);
      if (testOut) testOuts.push(testOut);
    } catch (error) {
      if (!(error instanceof InputError) && !(error instanceof DbError)) throw error;
      skipped.push({
        homeId: summary.id,
        name: summary.name,
        reason: error.message,
        ...(error instanceof InputError && error.field ? { field: error.field } : {}),
      });
    }
    onProgress?.(index + 1, chosen.length);
  });
  const results = testOutResults(testOuts);
  return {
    homes,
    rows: homes.map(portfolioRowOf),
    figures: portfolioFigures(homes),
    testOut: { results, byType: realizationByType(results) },
    calibration: calibrationOf(results, calibrationSeed),
    skipped,
  };
}
