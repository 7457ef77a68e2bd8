/**
 * The channels of homes in and out as files: one home as a home file, and the whole
 * portfolio as CSV (checked, imported, exported) with its summary.
 */
import { z } from 'zod';
import { reportWithChoices, type EvaluationWithChoices } from '../../core/choices.ts';
import { evaluateHome } from '../../core/evaluate.ts';
import { InputError } from '../../core/errors.ts';
import {
  detectAndParseWeather,
  weatherYearData,
  weatherYearOf,
  type WeatherYearData,
} from '../../core/weather.ts';
import { checkHomeFile, type HomeFile } from '../../core/schema.ts';
import { weatherYearOfBlock } from '../../core/weather/weather-year-data.ts';
import { exportHomesCsv, resultsCsv, type HomesCsvExport } from '../../db/csv-export.ts';
import {
  commitCsvImport,
  planCsvImport,
  type CsvImportPlan,
  type CsvProblem,
} from '../../db/csv-import.ts';
import { exportHomeFile, importHomeFile } from '../../db/home-file.ts';
import {
  exportHomeFileWithAttachments,
  HOME_BUNDLE_FORMAT,
  importHomeFileWithAttachments,
  type HomeFileBundle,
} from '../../db/home-file-bundle.ts';
import { portfolioSummary, type PortfolioSummary } from '../../db/portfolio.ts';
import { effectiveLibrary } from '../../db/repositories/library.ts';
import type { MeasureType } from '../../core/measure-library.ts';
import {
  evaluatePortfolio,
  MAX_PORTFOLIO_HOMES,
  portfolioHomeInputs,
  type PortfolioEvaluation,
  type PortfolioSelection,
} from '../../db/portfolio-plans.ts';
import {
  applyCalibration,
  removeCalibration,
  type CalibrationOutcome,
} from '../../db/calibration-apply.ts';
import { JOB_STATUSES, LEAKINESS_BANDS } from '../../db/repositories/homes.ts';
import { byId, channel, id, nothing, recordOf } from './_define.ts';
import { choicesFields, choicesOf } from './choices.ts';

/** A weather file's text may be a leap year of EPW rows with comments: a few MB at most. */
const MAX_WEATHER_TEXT_CHARS = 8_000_000;

/** The year of a weather file's text, its errors naming `weatherText` and the line. */
function weatherYearOfText(text: string) {
  try {
    return weatherYearOf(detectAndParseWeather(text));
  } catch (error) {
    if (error instanceof InputError) {
      throw new InputError(
        error.problems.map((problem) => ({
          path: problem.path === '' ? 'weatherText' : `weatherText.${problem.path}`,
          message: problem.message,
        })),
      );
    }
    throw error;
  }
}

/** Whether an imported file is a bundle of a home file and its photos (by its format). */
function isBundle(file: unknown): boolean {
  return (
    typeof file === 'object' &&
    file !== null &&
    (file as { format?: unknown }).format === HOME_BUNDLE_FORMAT
  );
}

/** A home file asked to be planned hour by hour: `hourlyWeather` added when it has none. */
function withHourlyWeather(file: unknown): unknown {
  if (typeof file !== 'object' || file === null || Array.isArray(file)) return file;
  return 'hourlyWeather' in file ? file : { ...file, hourlyWeather: {} };
}

/**
 * The year a home file carries (`weatherYear`, written by export for an hourly home), or
 * undefined when it carries none or does not parse (evaluating it then lists the problems).
 */
function carriedWeatherYear(file: unknown) {
  const checked = checkHomeFile(file);
  if (!checked.ok || checked.home.weatherYear === undefined) return undefined;
  return weatherYearOfBlock(checked.home.weatherYear);
}

/** A home file evaluated on a weather file's text, else on the year it carries, if any. */
function evaluateFile(file: unknown, weatherText: string | undefined) {
  if (weatherText !== undefined) {
    return evaluateHome(withHourlyWeather(file), { weather: weatherYearOfText(weatherText) });
  }
  const weather = carriedWeatherYear(file);
  return weather === undefined ? evaluateHome(file) : evaluateHome(file, { weather });
}

/** The largest portfolio CSV a request may carry, characters (10,000 homes fit easily). */
const MAX_CSV_CHARS = 8 * 1024 * 1024;

/** Which homes a portfolio request is about: by id when `homeIds` is there, else a filter. */
const selectionFields = {
  filter: z
    .strictObject({
      search: z.string().max(200).optional(),
      town: z.string().max(100).optional(),
      heatingFuel: z.string().max(40).optional(),
      clientId: id.optional(),
      jobStatus: z.enum(JOB_STATUSES).optional(),
      leakiness: z.enum(LEAKINESS_BANDS).optional(),
    })
    .optional(),
  homeIds: z.array(id).min(1).max(MAX_PORTFOLIO_HOMES).optional(),
};

function selectionOf(request: {
  filter?: z.output<typeof selectionFields.filter>;
  homeIds?: number[] | undefined;
}): PortfolioSelection {
  return request.homeIds ? { homeIds: request.homeIds } : { filter: request.filter ?? {} };
}

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD');

/** The `homeFile.*` and `portfolio.*` channels. */
export const fileAndPortfolioChannels = {
  // A home file, or a bundle of one with its photos (`sealwork-home-bundle/1`).
  'homeFile.import': channel({
    request: z.strictObject({ file: z.unknown() }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) =>
        isBundle(request.file)
          ? importHomeFileWithAttachments(write, request.file)
          : importHomeFile(write, request.file),
      ),
    }),
  }),
  // A stored home as a home file with its photos, each as base64 with its SHA-256; an hourly
  // home's file carries its weather year, as homeFile.export's does.
  'homeFile.exportBundle': channel({
    request: byId,
    response: recordOf<HomeFileBundle>(),
    handle: ({ store }, request) =>
      store.read((read) => exportHomeFileWithAttachments(read, request.id)),
  }),
  // An hourly home's file carries the weather year of its climate (`weatherYear`), so it
  // can be evaluated and imported on its own elsewhere.
  'homeFile.export': channel({
    request: byId,
    response: recordOf<HomeFile>(),
    handle: ({ store }, request) =>
      store.read((read) => exportHomeFile(read, request.id, { withWeatherYear: true })),
  }),
  // With `weatherText` (an EPW or TMY3 file) the home is planned hour by hour on that year;
  // without it, a file that carries its weather year (`weatherYear`) is planned on that.
  'homeFile.evaluate': channel({
    request: z.strictObject({
      file: z.unknown(),
      weatherText: z.string().min(1).max(MAX_WEATHER_TEXT_CHARS).optional(),
      ...choicesFields,
    }),
    response: recordOf<EvaluationWithChoices>(),
    handle: (_context, { file, weatherText, ...request }) =>
      reportWithChoices(evaluateFile(file, weatherText), choicesOf(request)),
  }),
  'portfolio.summary': channel({
    request: nothing,
    response: recordOf<PortfolioSummary>(),
    handle: ({ store }) => store.read((read) => portfolioSummary(read)),
  }),
  // The homes given by id when `homeIds` is there, else those the filter lists (all by default).
  'portfolio.evaluate': channel({
    request: z.strictObject(selectionFields),
    response: recordOf<Omit<PortfolioEvaluation, 'homes'>>(),
    handle: ({ store }, request) =>
      store.read((read) => {
        const { homes: _reports, ...rest } = evaluatePortfolio(read, selectionOf(request));
        return rest;
      }),
  }),
  // The chosen homes' files and the project's library, for the page's worker to draw from.
  'portfolio.homeFiles': channel({
    request: z.strictObject(selectionFields),
    response: z.strictObject({
      files: z.array(recordOf<HomeFile>()),
      libraryTypes: z.array(recordOf<MeasureType>()),
      // Homes planned hour by hour: each year once, and file i's place among them (or null).
      weatherYears: z.array(recordOf<WeatherYearData>()),
      weatherOfHome: z.array(z.int().min(0).nullable()),
    }),
    handle: ({ store }, request) =>
      store.read((read) => {
        const inputs = portfolioHomeInputs(read, selectionOf(request));
        return {
          files: inputs.files,
          libraryTypes: [...effectiveLibrary(read).all()],
          weatherYears: inputs.weatherYears.map(weatherYearData),
          weatherOfHome: inputs.weatherOfHome,
        };
      }),
  }),
  // The program's fitted factors written into the chosen homes not yet started.
  'portfolio.applyCalibration': channel({
    request: z.strictObject({
      ...selectionFields,
      basis: z.strictObject({ label: z.string().trim().min(1).max(200), date: isoDate }),
    }),
    response: recordOf<CalibrationOutcome>(),
    handle: ({ store }, request) =>
      store.write((write) => applyCalibration(write, selectionOf(request), request.basis)),
  }),
  'portfolio.removeCalibration': channel({
    request: z.strictObject(selectionFields),
    response: recordOf<CalibrationOutcome>(),
    handle: ({ store }, request) =>
      store.write((write) => removeCalibration(write, selectionOf(request))),
  }),
  'portfolio.checkCsv': channel({
    request: z.strictObject({ csv: z.string().max(MAX_CSV_CHARS) }),
    response: recordOf<CsvImportPlan>(),
    handle: ({ store }, request) => store.read((read) => planCsvImport(read, request.csv)),
  }),
  'portfolio.importCsv': channel({
    request: z.strictObject({ csv: z.string().max(MAX_CSV_CHARS) }),
    response: z.strictObject({ ids: z.array(id), problems: z.array(recordOf<CsvProblem>()) }),
    handle: ({ store }, request) =>
      // Checked and written in one transaction, so the stored sets it names cannot vanish between.
      store.write((write) => {
        const plan = planCsvImport(write, request.csv);
        if (plan.problems.length > 0) return { ids: [], problems: plan.problems };
        return { ids: commitCsvImport(write, plan), problems: [] };
      }),
  }),
  'portfolio.homesCsv': channel({
    request: nothing,
    response: recordOf<HomesCsvExport>(),
    handle: ({ store }) => store.read((read) => exportHomesCsv(read)),
  }),
  'portfolio.resultsCsv': channel({
    request: nothing,
    response: z.strictObject({ csv: z.string() }),
    handle: ({ store }) => store.read((read) => ({ csv: resultsCsv(read) })),
  }),
} as const;
