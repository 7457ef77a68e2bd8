/** The channels of the homes themselves: list, read, create, change, delete and duplicate. */
import { z } from 'zod';
import { exportHomeFile, importHomeFile } from '../../db/home-file.ts';
import { copyBills } from '../../db/repositories/bills.ts';
import {
  createHome,
  deleteHome,
  getHome,
  HOME_SORTS,
  homeInputSchema,
  JOB_STATUSES,
  LEAKINESS_BANDS,
  type Home,
  type HomeSummary,
  listHomes,
  purgeHome,
  restoreHome,
  updateHome,
} from '../../db/repositories/homes.ts';
import { listLeakageTests, type LeakageTestRecord } from '../../db/repositories/leakage-tests.ts';
import { listMeasures, type MeasureRecord } from '../../db/repositories/measures.ts';
import { byId, channel, done, DONE, id, recordOf } from './_define.ts';

const homeFilterSchema = z.strictObject({
  search: z.string().max(200).optional(),
  town: z.string().max(100).optional(),
  heatingFuel: z.string().max(40).optional(),
  clientId: id.optional(),
  jobStatus: z.enum(JOB_STATUSES).optional(),
  leakiness: z.enum(LEAKINESS_BANDS).optional(),
  sort: z.enum(HOME_SORTS).optional(),
  descending: z.boolean().optional(),
  deleted: z.boolean().optional(),
  limit: z.int().min(1).max(10_000).optional(),
  offset: z.int().min(0).optional(),
});

/** The `homes.*` channels. */
export const homeChannels = {
  'homes.list': channel({
    request: homeFilterSchema,
    response: z.array(recordOf<HomeSummary>()),
    handle: ({ store }, filter) => store.read((read) => listHomes(read, filter)),
  }),
  'homes.get': channel({
    request: byId,
    response: z.strictObject({
      home: recordOf<Home>(),
      tests: z.array(recordOf<LeakageTestRecord>()),
      measures: z.array(recordOf<MeasureRecord>()),
    }),
    handle: ({ store }, { id: homeId }) =>
      store.read((read) => ({
        home: getHome(read, homeId),
        tests: listLeakageTests(read, homeId),
        measures: listMeasures(read, homeId),
      })),
  }),
  'homes.create': channel({
    request: homeInputSchema,
    response: byId,
    handle: ({ store }, input) => ({ id: store.write((write) => createHome(write, input)) }),
  }),
  'homes.update': channel({
    request: z.strictObject({ id, home: homeInputSchema }),
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => updateHome(write, request.id, request.home));
      return DONE;
    },
  }),
  'homes.delete': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => deleteHome(write, request.id));
      return DONE;
    },
  }),
  'homes.restore': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => restoreHome(write, request.id));
      return DONE;
    },
  }),
  'homes.purge': channel({
    request: byId,
    response: done,
    handle: ({ store }, request) => {
      store.write((write) => purgeHome(write, request.id));
      return DONE;
    },
  }),
  'homes.duplicate': channel({
    request: z.strictObject({ id, name: z.string().trim().min(1).max(200) }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        // An hourly home's year comes along, so the copy links to the same stored climate.
        const file = exportHomeFile(write, request.id, { withWeatherYear: true });
        const copy = importHomeFile(write, { ...file, name: request.name, demo: false });
        // Bills are not part of the home file; the copy keeps them all the same.
        copyBills(write, request.id, copy);
        return copy;
      }),
    }),
  }),
} as const;
