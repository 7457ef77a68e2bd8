/** The channels of a home's plan (evaluated and saved) and of the project's measure library. */
import { z } from 'zod';
import {
  reportWithChoices,
  type ChoicesRequest,
  type EvaluationWithChoices,
} from '../../core/choices.ts';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import {
  compareWithDegreeDays,
  type DegreeDayComparison,
} from '../../core/weather/degree-day-comparison.ts';
import { MEASURE_LIBRARY, type MeasureType } from '../../core/measure-library.ts';
import { explainMeasure, TRACE_QUANTITIES } from '../../core/plan/trace.ts';
import { ENGINE_VERSION } from '../../core/version.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import {
  effectiveLibrary,
  listLibraryEdits,
  resetLibraryEdit,
  saveLibraryEdit,
} from '../../db/repositories/library.ts';
import { getPlan, listPlans, savePlan, type SavedPlan } from '../../db/repositories/plans.ts';
import { choicesFields, choicesOf } from './choices.ts';
import {
  byId,
  channel,
  done,
  DONE,
  id,
  nothing,
  recordOf,
  type ChannelContext,
} from './_define.ts';
import { evaluateOptionsOf, evaluateStoredHome } from '../../db/evaluation-inputs.ts';

/** The evaluation report of a stored home, with the project's library edits and the choices asked. */
function evaluateStored(context: ChannelContext, homeId: number, choices: ChoicesRequest) {
  return context.store.read((read) =>
    reportWithChoices(evaluateStoredHome(read, homeId).evaluation, choices),
  );
}

/** A figure of a trace: a finite number or none, its unit, and the quantity it converts as. */
const traceFigure = {
  value: z.number().nullable(),
  unit: z.string(),
  quantity: z.enum(TRACE_QUANTITIES).optional(),
};

/** The working behind one measure's figures (core/plan/trace.ts `MeasureTrace`). */
const measureTraceSchema = z.strictObject({
  measureId: z.string(),
  measureName: z.string(),
  rank: z.int().positive(),
  included: z.boolean(),
  appliedAfter: z.array(z.string()),
  basis: z.string(),
  lines: z.array(
    z.strictObject({
      key: z.string(),
      label: z.string(),
      formula: z.string(),
      inputs: z.array(
        z.strictObject({ label: z.string(), ...traceFigure, source: z.string().optional() }),
      ),
      result: z.strictObject(traceFigure),
      note: z.string().optional(),
    }),
  ),
});

/** The `plan.evaluate`, `plan.explain`, `plans.*` and `library.*` channels. */
export const planAndLibraryChannels = {
  'plan.evaluate': channel({
    request: z.strictObject({ homeId: id, ...choicesFields }),
    response: recordOf<EvaluationWithChoices>(),
    handle: (context, request) => evaluateStored(context, request.homeId, choicesOf(request)),
  }),
  'plan.explain': channel({
    request: z.strictObject({ homeId: id, measureId: z.string().min(1).max(64) }),
    response: measureTraceSchema,
    handle: ({ store }, request) =>
      store.read((read) =>
        explainMeasure(evaluateStoredHome(read, request.homeId).evaluation, request.measureId),
      ),
  }),
  // A home planned hour by hour, each step set beside degree days; null on degree days.
  'plan.compareDegreeDays': channel({
    request: z.strictObject({ homeId: id }),
    response: recordOf<DegreeDayComparison>().nullable(),
    handle: ({ store }, request) =>
      store.read((read) => {
        const { file, options, evaluation } = evaluateStoredHome(read, request.homeId);
        return file.hourlyWeather === undefined ? null : compareWithDegreeDays(evaluation, options);
      }),
  }),
  'plans.save': channel({
    request: z.strictObject({ homeId: id, name: z.string().trim().min(1).max(200) }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        const inputs = exportHomeFile(write, request.homeId);
        const result = evaluateHomeReport(inputs, evaluateOptionsOf(write, request.homeId, inputs));
        return savePlan(write, {
          homeId: request.homeId,
          name: request.name,
          engineVersion: ENGINE_VERSION,
          inputs,
          result,
        });
      }),
    }),
  }),
  'plans.list': channel({
    request: z.strictObject({ homeId: id }),
    response: z.array(recordOf<SavedPlan>()),
    handle: ({ store }, request) => store.read((read) => listPlans(read, request.homeId)),
  }),
  'plans.get': channel({
    request: byId,
    response: recordOf<SavedPlan>(),
    handle: ({ store }, request) => store.read((read) => getPlan(read, request.id)),
  }),
  'library.list': channel({
    request: nothing,
    response: z.strictObject({
      types: z.array(recordOf<MeasureType>()),
      editedIds: z.array(z.string()),
    }),
    handle: ({ store }) =>
      store.read((read) => ({
        types: [...effectiveLibrary(read).all()],
        editedIds: [...listLibraryEdits(read).keys()],
      })),
  }),
  'library.shipped': channel({
    request: nothing,
    response: z.array(recordOf<MeasureType>()),
    handle: () => [...MEASURE_LIBRARY],
  }),
  'library.saveEdit': channel({
    request: z.strictObject({ typeId: z.string().max(64), edit: z.unknown() }),
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => saveLibraryEdit(write, request.typeId, request.edit));
      return DONE;
    },
  }),
  'library.reset': channel({
    request: z.strictObject({ typeId: z.string().max(64) }),
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => resetLibraryEdit(write, request.typeId));
      return DONE;
    },
  }),
} as const;
