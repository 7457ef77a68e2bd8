/** The channels of a home's leakage tests and its air-sealing measures. */
import { z } from 'zod';
import { measureSchema, otherLeakageTestSchema } from '../../core/schema.ts';
import {
  addLeakageTest,
  deleteLeakageTest,
  updateLeakageTest,
} from '../../db/repositories/leakage-tests.ts';
import { addMeasure, deleteMeasure, updateMeasure } from '../../db/repositories/measures.ts';
import { byId, channel, done, DONE, id } from './_define.ts';

/** The `tests.*` and `measures.*` channels. */
export const testAndMeasureChannels = {
  'tests.add': channel({
    request: z.strictObject({ homeId: id, test: otherLeakageTestSchema }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => addLeakageTest(write, request.homeId, request.test)),
    }),
  }),
  'tests.update': channel({
    request: z.strictObject({ id, test: otherLeakageTestSchema }),
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => updateLeakageTest(write, request.id, request.test));
      return DONE;
    },
  }),
  'tests.delete': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => deleteLeakageTest(write, request.id));
      return DONE;
    },
  }),
  'measures.add': channel({
    request: z.strictObject({ homeId: id, measure: measureSchema }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => addMeasure(write, request.homeId, request.measure)),
    }),
  }),
  'measures.update': channel({
    request: z.strictObject({ id, measure: measureSchema }),
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => updateMeasure(write, request.id, request.measure));
      return DONE;
    },
  }),
  'measures.delete': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => deleteMeasure(write, request.id));
      return DONE;
    },
  }),
} as const;
