/**
 * The channel table: every operation the screens (and the command line) may ask of the core
 * and the project file, each a name with a zod request schema, a zod response schema and a
 * handler. The hosts (the desktop main process, the browser host, the command line) all call
 * `callChannel`, so they cannot drift apart. Handlers never trust their input: a request
 * that does not parse is refused before anything is read or written.
 */
import { z } from 'zod';
import { InputError } from '../core/errors.ts';
import { problemsFromZod } from '../core/_lib/zod-problems.ts';
import { evaluateHomeReport } from '../core/evaluate.ts';
import { MEASURE_LIBRARY, type MeasureType } from '../core/measure-library.ts';
import type { EvaluationReport } from '../core/report.ts';
import {
  measureSchema,
  otherLeakageTestSchema,
  type Climate,
  type HomeFile,
} from '../core/schema.ts';
import { ENGINE_VERSION } from '../core/version.ts';
import { exportHomesCsv, resultsCsv, type HomesCsvExport } from '../db/csv-export.ts';
import {
  commitCsvImport,
  planCsvImport,
  type CsvImportPlan,
  type CsvProblem,
} from '../db/csv-import.ts';
import { DbError } from '../db/errors.ts';
import { portfolioSummary, type PortfolioSummary } from '../db/portfolio.ts';
import { exportHomeFile, importHomeFile } from '../db/home-file.ts';
import {
  createHome,
  deleteHome,
  getHome,
  homeInputSchema,
  type Home,
  type HomeSummary,
  listHomes,
  purgeHome,
  restoreHome,
  updateHome,
} from '../db/repositories/homes.ts';
import {
  addLeakageTest,
  deleteLeakageTest,
  listLeakageTests,
  updateLeakageTest,
  type LeakageTestRecord,
} from '../db/repositories/leakage-tests.ts';
import {
  effectiveLibrary,
  listLibraryEdits,
  resetLibraryEdit,
  saveLibraryEdit,
} from '../db/repositories/library.ts';
import {
  addMeasure,
  deleteMeasure,
  listMeasures,
  updateMeasure,
  type MeasureRecord,
} from '../db/repositories/measures.ts';
import { getPlan, listPlans, savePlan, type SavedPlan } from '../db/repositories/plans.ts';
import { climates, priceSets, type NamedSet } from '../db/repositories/reusable-sets.ts';
import { getSettings, settingsSchema, updateSettings } from '../db/repositories/settings.ts';
import { createClient, listClients, type Client } from '../db/repositories/clients.ts';
import type { Store } from '../db/store.ts';
import type { ChannelNameList } from './channel-names.ts';

/** What a handler works with. */
export interface ChannelContext {
  store: Store;
}

interface Channel<Request extends z.ZodType, Response extends z.ZodType> {
  request: Request;
  response: Response;
  handle(context: ChannelContext, request: z.output<Request>): z.input<Response>;
}

function channel<Request extends z.ZodType, Response extends z.ZodType>(
  definition: Channel<Request, Response>,
): Channel<Request, Response> {
  return definition;
}

const id = z.int().positive();
const byId = z.strictObject({ id });
const nothing = z.strictObject({});
const done = z.strictObject({ done: z.literal(true) });
const DONE = { done: true } as const;
/**
 * A record of the store's own type. The store builds these from validated rows, so the reply
 * checks only that an object came back; the type travels to the screens through `ChannelResponse`.
 */
function recordOf<T extends object>() {
  return z.custom<T>(
    (value) => typeof value === 'object' && value !== null && !Array.isArray(value),
    'expected a record',
  );
}

const homeFilterSchema = z.strictObject({
  search: z.string().max(200).optional(),
  town: z.string().max(100).optional(),
  heatingFuel: z.string().max(40).optional(),
  clientId: id.optional(),
  deleted: z.boolean().optional(),
  limit: z.int().min(1).max(10_000).optional(),
  offset: z.int().min(0).optional(),
});

/** The largest portfolio CSV a request may carry, characters (10,000 homes fit easily). */
const MAX_CSV_CHARS = 8 * 1024 * 1024;

const namedSet = z.strictObject({ name: z.string().max(200), data: z.unknown() });

/** The evaluation report of a stored home, with the project's library edits. */
function evaluateStored(context: ChannelContext, homeId: number) {
  return context.store.read((read) =>
    evaluateHomeReport(exportHomeFile(read, homeId), { library: effectiveLibrary(read) }),
  );
}

export const channels = {
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
        const file = exportHomeFile(write, request.id);
        return importHomeFile(write, { ...file, name: request.name, demo: false });
      }),
    }),
  }),
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
  'plan.evaluate': channel({
    request: z.strictObject({ homeId: id }),
    response: recordOf<EvaluationReport>(),
    handle: (context, request) => evaluateStored(context, request.homeId),
  }),
  'plans.save': channel({
    request: z.strictObject({ homeId: id, name: z.string().trim().min(1).max(200) }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        const inputs = exportHomeFile(write, request.homeId);
        const result = evaluateHomeReport(inputs, { library: effectiveLibrary(write) });
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
  'clients.list': channel({
    request: nothing,
    response: z.array(recordOf<Client>()),
    handle: ({ store }) => store.read((read) => listClients(read)),
  }),
  'clients.create': channel({
    request: z.strictObject({
      name: z.string().max(200),
      phone: z.string().max(50).optional(),
      email: z.string().max(200).optional(),
    }),
    response: byId,
    handle: ({ store }, input) => ({ id: store.write((write) => createClient(write, input)) }),
  }),
  'climates.list': channel({
    request: nothing,
    response: z.array(recordOf<NamedSet<Climate>>()),
    handle: ({ store }) => store.read((read) => climates.list(read)),
  }),
  'climates.save': channel({
    request: namedSet.extend({ id: id.optional() }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        if (request.id === undefined) return climates.create(write, request.name, request.data);
        climates.update(write, request.id, request.name, request.data);
        return request.id;
      }),
    }),
  }),
  'priceSets.list': channel({
    request: nothing,
    response: z.array(recordOf<NamedSet<HomeFile['prices']>>()),
    handle: ({ store }) => store.read((read) => priceSets.list(read)),
  }),
  'priceSets.save': channel({
    request: namedSet.extend({ id: id.optional() }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => {
        if (request.id === undefined) return priceSets.create(write, request.name, request.data);
        priceSets.update(write, request.id, request.name, request.data);
        return request.id;
      }),
    }),
  }),
  'settings.get': channel({
    request: nothing,
    response: settingsSchema,
    handle: ({ store }) => store.read((read) => getSettings(read)),
  }),
  'settings.update': channel({
    request: settingsSchema.partial(),
    response: settingsSchema,
    handle: ({ store }, patch) => store.write((write) => updateSettings(write, patch)),
  }),
  'homeFile.import': channel({
    request: z.strictObject({ file: z.unknown() }),
    response: byId,
    handle: ({ store }, request) => ({
      id: store.write((write) => importHomeFile(write, request.file)),
    }),
  }),
  'homeFile.export': channel({
    request: byId,
    response: recordOf<HomeFile>(),
    handle: ({ store }, request) => store.read((read) => exportHomeFile(read, request.id)),
  }),
  'homeFile.evaluate': channel({
    request: z.strictObject({ file: z.unknown() }),
    response: recordOf<EvaluationReport>(),
    handle: (_context, request) => evaluateHomeReport(request.file),
  }),
  'portfolio.summary': channel({
    request: nothing,
    response: recordOf<PortfolioSummary>(),
    handle: ({ store }) => store.read((read) => portfolioSummary(read)),
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

export type Channels = typeof channels;
export type ChannelName = keyof Channels;
export type ChannelRequest<Name extends ChannelName> = z.input<Channels[Name]['request']>;
export type ChannelResponse<Name extends ChannelName> = z.output<Channels[Name]['response']>;

export interface ChannelError {
  /** `invalid` for a request or input that does not parse; otherwise a DbError kind or `unexpected`. */
  kind: string;
  message: string;
  field?: string;
  /** With `invalid`: every problem (up to 500) with its field, to show beside the fields. */
  problems?: { path: string; message: string }[];
}

export type Reply<Value> = { ok: true; value: Value } | { ok: false; error: ChannelError };

/** Whether `name` is a channel of the table (for hosts that receive names from outside). */
export function isChannelName(name: string): name is ChannelName {
  return Object.hasOwn(channels, name);
}

/** How many problems the message of a reply spells out; the rest are counted. */
const MAX_PROBLEMS_IN_MESSAGE = 10;
/** How many problems a reply lists, each with its field, for a caller to show beside the fields. */
const MAX_PROBLEMS_LISTED = 500;

/** The reply for an error thrown by a handler: only the kind, a plain message and the field. */
export function replyForError(error: unknown): { ok: false; error: ChannelError } {
  if (error instanceof InputError) {
    const first = error.problems[0];
    const shown = error.problems
      .slice(0, MAX_PROBLEMS_IN_MESSAGE)
      .map((p) => (p.path ? `${p.path}: ${p.message}` : p.message));
    const more = error.problems.length - shown.length;
    return {
      ok: false,
      error: {
        kind: 'invalid',
        message: [...shown, ...(more > 0 ? [`and ${more} more problems`] : [])].join('\n'),
        ...(first?.path ? { field: first.path } : {}),
        problems: error.problems
          .slice(0, MAX_PROBLEMS_LISTED)
          .map((p) => ({ path: p.path, message: p.message })),
      },
    };
  }
  if (error instanceof DbError) {
    return {
      ok: false,
      error: {
        kind: error.kind,
        message: error.message,
        ...(error.field ? { field: error.field } : {}),
      },
    };
  }
  return {
    ok: false,
    error: {
      kind: 'unexpected',
      message: 'Something went wrong inside Sealwork; nothing was saved by this request.',
    },
  };
}

/**
 * Calls one channel with an untrusted request.
 *
 * @returns `{ ok: true, value }`, or `{ ok: false, error }` for a request that does not
 *   parse (nothing is read or written then) or a handler that fails (its write rolls back)
 */
export function callChannel<Name extends ChannelName>(
  context: ChannelContext,
  name: Name,
  request: unknown,
): Reply<ChannelResponse<Name>> {
  const definition = channels[name] as unknown as Channel<z.ZodType, z.ZodType>;
  try {
    const parsed = definition.request.safeParse(request ?? {});
    if (!parsed.success) {
      return replyForError(new InputError(problemsFromZod(parsed.error, request)));
    }
    const value = definition.response.parse(
      definition.handle(context, parsed.data),
    ) as ChannelResponse<Name>;
    return { ok: true, value };
  } catch (error) {
    return replyForError(error);
  }
}

// The preload's list and the table name the same channels, no more and no fewer.
type SameNames<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const NAMES_MATCH: SameNames<ChannelName, ChannelNameList> = true;
void NAMES_MATCH;
