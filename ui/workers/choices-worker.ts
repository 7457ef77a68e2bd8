/**
 * The page's worker for the work that takes a while: the Monte Carlo range of a package, the
 * exact best package within a budget and the proposal's options. It runs the core itself
 * (the same code the hosts run), so typing in the page never waits for it.
 */
import './jitless.ts';
import { bestPackageFor, proposalOptionsReport, uncertaintyReportOf } from '../../core/choices.ts';
import { InputError } from '../../core/errors.ts';
import { evaluateHome, type Evaluation } from '../../core/evaluate.ts';
import { lookupOf } from '../../core/measure-library.ts';
import { weatherYearFromData } from '../../core/weather/weather-year-data.ts';
import { programRange } from '../../core/uncertainty/program-range.ts';
import type { ChoicesAnswer, ChoicesInputs, ChoicesJob, ChoicesValue } from './choices-protocol.ts';

interface WorkerScope {
  onmessage: ((event: MessageEvent<ChoicesJob>) => void) | null;
  postMessage(message: ChoicesAnswer): void;
}

const scope = globalThis as unknown as WorkerScope;

/** The last evaluation, kept while jobs come with the same inputs (a new seed, a new budget). */
let kept: { key: string; evaluation: Evaluation } | null = null;

function evaluationOf(inputs: ChoicesInputs): Evaluation {
  if (kept?.key !== inputs.key) {
    const evaluation = evaluateHome(inputs.homeFile, {
      library: lookupOf(inputs.libraryTypes),
      ...(inputs.weather ? { weather: weatherYearFromData(inputs.weather) } : {}),
    });
    kept = { key: inputs.key, evaluation };
  }
  return kept.evaluation;
}

function run(job: ChoicesJob): ChoicesValue {
  if (job.kind === 'program') {
    const { homeFiles, libraryTypes, weatherYears = [], weatherOfHome = [] } = job.inputs;
    const years = weatherYears.map(weatherYearFromData);
    const weatherOf = (index: number) => {
      const place = weatherOfHome[index];
      return place === null || place === undefined ? undefined : years[place];
    };
    const value = programRange(homeFiles, job.request, lookupOf(libraryTypes), weatherOf);
    return { kind: 'program', value };
  }
  const evaluation = evaluationOf(job.inputs);
  switch (job.kind) {
    case 'ranges':
      return { kind: 'ranges', value: uncertaintyReportOf(evaluation, job.request) };
    case 'best':
      return { kind: 'best', value: bestPackageFor(evaluation, job.request) };
    case 'options':
      return { kind: 'options', value: proposalOptionsReport(evaluation, job.request) };
  }
}

scope.onmessage = ({ data: job }) => {
  const started = performance.now();
  try {
    const value = run(job);
    scope.postMessage({ id: job.id, ok: true, ms: performance.now() - started, ...value });
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    scope.postMessage({
      id: job.id,
      ok: false,
      error: error instanceof InputError ? { message, field: error.field } : { message },
    });
  }
};
