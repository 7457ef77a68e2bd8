/**
 * The messages between the page and its choices worker (ui/workers/choices-worker.ts): a job
 * carries the home as a home file and the project's measure library, so the worker evaluates
 * exactly what the host does, and an answer carries the job's id back.
 */
import type {
  BestPackageReport,
  BudgetRequest,
  OptionReport,
  RangesRequest,
  UncertaintyReport,
} from '../../core/choices.ts';
import type { MeasureType } from '../../core/measure-library.ts';
import type { ProposalOptionsSettings } from '../../core/plan/options.ts';
import type { ProgramRangeResult } from '../../core/uncertainty/program-range.ts';
import type { WeatherYearData } from '../../core/weather/weather-year-data.ts';

/** What the worker evaluates from: the home file and the library it takes defaults from. */
export interface ChoicesInputs {
  /** Names these inputs: jobs with the same key share one evaluation in the worker. */
  key: string;
  homeFile: unknown;
  libraryTypes: readonly MeasureType[];
  /** The weather year of a home planned hour by hour (climates.weatherYearOfHome). */
  weather?: WeatherYearData;
}

export type ChoicesJob =
  | ({ id: number; inputs: ChoicesInputs } & (
      | { kind: 'ranges'; request: RangesRequest & { draws: number; seed: number } }
      | { kind: 'best'; request: BudgetRequest }
      | { kind: 'options'; request: ProposalOptionsSettings & RangesRequest }
    ))
  | {
      id: number;
      kind: 'program';
      /**
       * A portfolio's home files (home i draws on stream i), the project's library, and the
       * weather years of homes planned hour by hour (file i's is weatherYears[weatherOfHome[i]]).
       */
      inputs: {
        homeFiles: readonly unknown[];
        libraryTypes: readonly MeasureType[];
        weatherYears?: readonly WeatherYearData[];
        weatherOfHome?: readonly (number | null)[];
      };
      request: { draws: number; seed: number; programBias?: number };
    };

export type ChoicesValue =
  | { kind: 'ranges'; value: UncertaintyReport }
  | { kind: 'best'; value: BestPackageReport }
  | { kind: 'options'; value: OptionReport[] }
  | { kind: 'program'; value: ProgramRangeResult };

export type ChoicesAnswer =
  | ({ id: number; ok: true; ms: number } & ChoicesValue)
  | { id: number; ok: false; error: { message: string; field?: string } };
