/**
 * The channel table is the only door from the screens to the core and the project file.
 * These tests run it in Node on a real project file (db/project.ts with the demo homes):
 *
 * - a corpus built from each channel's own zod request schema (through zod's JSON Schema
 *   export) breaks every field of a valid request one way at a time, and fast-check adds
 *   `fc.anything()` requests and random near misses; every one is refused with
 *   `{ ok: false, error: { kind: 'invalid', message, field? } }`, and a digest of every row
 *   of every table is the same before and after all of them;
 * - valid requests of every channel do what they say;
 * - a handler that fails rolls its write back; an unexpected exception says nothing of its
 *   insides; names from outside cannot reach `Object.prototype`.
 *
 * Sources (OWASP titles from memory): OWASP Input Validation Cheat Sheet (allow-list
 * validation of type, range and length on the trusted side, refusing unknown fields); OWASP
 * Prototype Pollution Prevention Cheat Sheet (`__proto__`, `constructor`, `prototype` keys
 * from untrusted JSON); Electron's Security tutorial, checklist item 17 "Validate the sender
 * of all IPC messages" (the main process treats every message as untrusted).
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { InputError } from '../../core/errors.ts';
import { evaluateHomeReport } from '../../core/evaluate.ts';
import { measureTypeEditSchema } from '../../core/measure-library.ts';
import { climateSchema, parseHomeFile, pricesSchema } from '../../core/schema.ts';
import { exportHomeFile } from '../../db/home-file.ts';
import { callChannel, channels, isChannelName, type ChannelName } from '../../electron/channels.ts';
import {
  addKnownRows,
  openChannelProject,
  valueOf,
  type ChannelProject,
} from './_lib/channel-project.ts';
import {
  baseHomeFile,
  baseHomeInput,
  EDITED_TYPE_ID,
  handlerCheckedFields,
  validRequests,
  type KnownIds,
  type ValidRequests,
} from './_lib/channel-requests.ts';
import { malformedRequests, POLLUTING_VALUE } from './_lib/malformed-requests.ts';
import { nearMissArbitrary } from './_lib/near-miss-arbitrary.ts';
import { refusalProblems } from './_lib/reply-checks.ts';
import { jsonSchemaOf } from './_lib/request-schema.ts';
import { changesSoFar, projectDigest } from './_lib/table-digest.ts';

/** Fixed so a failure reproduces; change only on purpose. */
const FUZZ_SEED = 0x5ea1;
/** fast-check runs per channel for each kind of fuzzing (39 channels). */
const RUNS_PER_CHANNEL = 40;
/** The whole corpus and fuzzing must reach at least this many requests (the brief's floor). */
const MIN_REFUSED_REQUESTS = 1000;

const NAMES = Object.keys(channels) as ChannelName[];

/**
 * Where a channel's handler checks a `z.unknown()` field itself, its error names the field
 * inside that value (`house.bedrooms`), not inside the request (`file.house.bedrooms`):
 * core's parseHomeFile and the library repository are called without a path prefix, while
 * the climate and price set repositories pass `data`. Recorded here as found.
 */
const FIELD_NAMED_INSIDE: Partial<Record<ChannelName, string>> = {
  'homeFile.import': 'file',
  'homeFile.evaluate': 'file',
  'library.saveEdit': 'edit',
};

function expectedField(name: ChannelName, fault: { field: string; removed: boolean }): string {
  const wrapper = FIELD_NAMED_INSIDE[name];
  const { field } = fault;
  // Leaving the field itself out is refused by the request schema, which names it.
  if (wrapper === undefined || (field === wrapper && fault.removed)) return field;
  if (field === wrapper) return '';
  return field.startsWith(`${wrapper}.`) ? field.slice(wrapper.length + 1) : field;
}

let project: ChannelProject;
let ids: KnownIds;
let requests: ValidRequests;
let refusedCount = 0;

beforeAll(() => {
  project = openChannelProject('sealwork-channels-');
  ids = addKnownRows(project.context);
  requests = validRequests(ids);
});

afterAll(() => project.close());

/** Calls a channel with a request that must be refused; returns the problems with the reply. */
function refusedProblems(name: ChannelName, request: unknown, field?: string): string[] {
  refusedCount += 1;
  const reply: unknown = callChannel(project.context, name, request);
  return refusalProblems(reply, { kind: 'invalid', field });
}

describe('malformed requests are refused and write nothing', () => {
  let digestBefore: string;
  let changesBefore: number;

  beforeAll(() => {
    digestBefore = projectDigest(project.store.sqlite);
    changesBefore = changesSoFar(project.store.sqlite);
  });

  it('starts from a valid request for every channel (so each case is a near miss)', () => {
    for (const name of NAMES) {
      const parsed = channels[name].request.safeParse(requests[name]);
      expect(parsed.success, `${name}: ${JSON.stringify(parsed.error?.issues)}`).toBe(true);
    }
    // The fields the handlers check themselves hold valid values too.
    expect(() => parseHomeFile(requests['homeFile.import'].file)).not.toThrow();
    expect(measureTypeEditSchema.safeParse(requests['library.saveEdit'].edit).success).toBe(true);
    expect(climateSchema.safeParse(requests['climates.save'].data).success).toBe(true);
    expect(pricesSchema.safeParse(requests['priceSets.save'].data).success).toBe(true);
  });

  it('refuses every case of the corpus, naming the field at fault', () => {
    const nested = handlerCheckedFields();
    const failures: string[] = [];
    const perChannel: Record<string, number> = {};
    for (const name of NAMES) {
      const cases = malformedRequests(
        jsonSchemaOf(channels[name].request),
        requests[name],
        nested[name],
      );
      perChannel[name] = cases.length;
      for (const item of cases) {
        const problems = refusedProblems(name, item.request, expectedField(name, item));
        if (problems.length > 0) failures.push(`${name}: ${item.label}: ${problems.join('; ')}`);
      }
    }
    expect(failures.slice(0, 25), `${failures.length} failures`).toEqual([]);
    // Every channel is probed, the ones without fields by wrong types and unknown fields.
    for (const name of NAMES) expect(perChannel[name], name).toBeGreaterThanOrEqual(10);
  });

  it('refuses fc.anything() requests the request schema does not accept', () => {
    for (const [index, name] of NAMES.entries()) {
      const schema = channels[name].request;
      const anything = fc.anything({
        key: fc.oneof(fc.string(), fc.constantFrom('__proto__', 'constructor', 'id', 'homeId')),
        withNullPrototype: true,
        withBigInt: true,
        withDate: true,
        withMap: true,
        withSet: true,
        withTypedArray: true,
        withSparseArray: true,
      });
      fc.assert(
        fc.property(anything, (request) => {
          // A request the schema accepts is not malformed (e.g. `{}` for `homes.list`).
          fc.pre(!schema.safeParse(request ?? {}).success);
          expect(refusedProblems(name, request)).toEqual([]);
        }),
        { seed: FUZZ_SEED + index, numRuns: RUNS_PER_CHANNEL },
      );
    }
  });

  it('refuses random near misses of every valid request', () => {
    const nested = handlerCheckedFields();
    for (const [index, name] of NAMES.entries()) {
      const nearMiss = nearMissArbitrary(
        jsonSchemaOf(channels[name].request),
        requests[name],
        nested[name],
      );
      fc.assert(
        fc.property(nearMiss, (request) => {
          expect(refusedProblems(name, request)).toEqual([]);
        }),
        { seed: FUZZ_SEED + 100 + index, numRuns: RUNS_PER_CHANNEL },
      );
    }
  });

  it('refuses near misses only the handlers can see (rules across fields)', () => {
    const file = requests['homeFile.import'].file as Record<string, unknown>;
    const cases: [ChannelName, unknown, string][] = [
      // zod's trim() runs before min(1): blank names are empty names.
      ['homes.duplicate', { id: ids.homeId, name: '   ' }, 'name'],
      ['plans.save', { homeId: ids.homeId, name: '\t\n' }, 'name'],
      ['homes.create', { ...requests['homes.create'], name: '  ' }, 'name'],
      ['clients.create', { name: '   ' }, 'name'],
      ['climates.save', { ...requests['climates.save'], name: ' ' }, 'name'],
      // The ISO 8601 pattern passes, the calendar does not (no 30 February).
      [
        'tests.add',
        { homeId: ids.homeId, test: { kind: 'testIn', cfm50: 1, testedOn: '2024-02-30' } },
        'test.testedOn',
      ],
      [
        'tests.add',
        {
          homeId: ids.homeId,
          test: {
            kind: 'testIn',
            cfm50: 1,
            points: [
              { pa: 50, cfm: 1 },
              { pa: 25, cfm: 1 },
            ],
          },
        },
        'test',
      ],
      ['tests.add', { homeId: ids.homeId, test: { kind: 'testOut' } }, 'test'],
      [
        'measures.add',
        {
          homeId: ids.homeId,
          measure: {
            ...requests['measures.add'].measure,
            reductionCfm50: { low: 300, likely: 200, high: 100 },
          },
        },
        'measure.reductionCfm50',
      ],
      [
        'measures.add',
        {
          homeId: ids.homeId,
          measure: { ...requests['measures.add'].measure, type: 'not-in-the-library' },
        },
        'type',
      ],
      [
        'measures.add',
        {
          homeId: ids.homeId,
          measure: {
            ...requests['measures.add'].measure,
            shareOfLocation: { share: { low: 0.1, likely: 0.2, high: 0.3 } },
          },
        },
        '',
      ],
      [
        'homeFile.import',
        { file: { ...file, leakShares: { ceiling: 0.5, wall: 0.5, floor: 0.5, flue: 0.5 } } },
        'leakShares',
      ],
      [
        'library.saveEdit',
        {
          typeId: 'attic-top-plates',
          edit: { sealingEffectiveness: { low: 0.9, likely: 0.5, high: 0.6 } },
        },
        'sealingEffectiveness',
      ],
    ];
    for (const [name, request, field] of cases) {
      expect(refusedProblems(name, request, field), `${name} ${JSON.stringify(request)}`).toEqual(
        [],
      );
    }
  });

  it('wrote nothing, changed nothing, and polluted no prototype', () => {
    expect(refusedCount).toBeGreaterThanOrEqual(MIN_REFUSED_REQUESTS);
    expect(projectDigest(project.store.sqlite)).toBe(digestBefore);
    expect(changesSoFar(project.store.sqlite)).toBe(changesBefore);
    const probe: Record<string, unknown> = {};
    expect(probe.polluted).toBeUndefined();
    expect(Object.keys(POLLUTING_VALUE)).toEqual(['polluted']);
  });
});

// Regression check (once a bug in core/schema-rules.ts, measureRules): the duplicate-id rule runs `measures.findIndex(
// (other) => other.id === measure.id)` while building its rules, before it knows which
// measures parsed, so one `null` in `measures` throws a TypeError out of parseHomeFile. The
// channel then answers kind 'unexpected' instead of naming `measures[0]`. Expected to fail
// until the rule skips measures that are not objects; then turn this into a plain `it`.
it('refuses a home file with null among its measures as invalid at measures[0]', () => {
  const file = baseHomeFile();
  (file.measures as unknown[])[0] = null;
  const reply = callChannel(project.context, 'homeFile.import', { file });
  expect(refusalProblems(reply, { kind: 'invalid', field: 'measures[0]' })).toEqual([]);
});

describe('valid requests do what they say', () => {
  const call = <Name extends ChannelName>(name: Name, request: unknown) =>
    valueOf(callChannel(project.context, name, request));

  it('creates, reads, updates and lists a home, and filters the list', () => {
    const input = baseHomeInput(ids.clientId);
    const { id } = call('homes.create', input);
    const created = call('homes.get', { id });
    expect(created.home).toMatchObject({ name: input.name, jobStatus: 'approved', isDemo: false });
    expect(created.home.address).toEqual(input.address);
    expect(created.tests).toEqual([]);
    call('homes.update', { id, home: { ...input, name: 'Renamed house' } });
    expect(call('homes.get', { id }).home).toMatchObject({
      name: 'Renamed house',
      jobStatus: 'approved',
    });
    // The job moves on only by a status change, which keeps its history (jobs.changeStatus).
    const moved = callChannel(project.context, 'homes.update', {
      id,
      home: { ...input, jobStatus: 'testedOut' },
    });
    expect(refusalProblems(moved, { kind: 'invalid', field: 'jobStatus' })).toEqual([]);
    const byTown = call('homes.list', { town: 'Testford', search: 'Renamed' });
    expect(byTown.map((home) => home.id)).toEqual([id]);
    expect(call('homes.list', { limit: 1 })).toHaveLength(1);
  });

  it('adds, updates and deletes tests and measures', () => {
    const { id: homeId } = call('homes.create', baseHomeInput(null));
    const { id: testId } = call('tests.add', { ...requests['tests.add'], homeId });
    call('tests.update', { ...requests['tests.update'], id: testId });
    expect(call('homes.get', { id: homeId }).tests.map((record) => record.test)).toEqual([
      requests['tests.update'].test,
    ]);
    const { id: measureId } = call('measures.add', { ...requests['measures.add'], homeId });
    call('measures.update', { ...requests['measures.update'], id: measureId });
    const stored = call('homes.get', { id: homeId }).measures;
    expect(stored.map((record) => record.measure)).toEqual([requests['measures.update'].measure]);
    call('measures.delete', { id: measureId });
    call('tests.delete', { id: testId });
    expect(call('homes.get', { id: homeId })).toMatchObject({ tests: [], measures: [] });
  });

  it('evaluates each stored demo home exactly as the core does from its exported file', () => {
    // With no library edits in the project, the shipped library is the one in effect.
    expect(call('library.list', {}).editedIds).toEqual([]);
    const demoHomes = call('homes.list', {}).filter((home) => home.isDemo);
    expect(demoHomes.length).toBeGreaterThan(0);
    let evaluated = 0;
    for (const { id } of demoHomes) {
      let direct: unknown;
      try {
        direct = project.store.read((read) => evaluateHomeReport(exportHomeFile(read, id)));
      } catch (error) {
        expect(error, `home ${id}`).toBeInstanceOf(InputError);
        expect(callChannel(project.context, 'plan.evaluate', { homeId: id })).toMatchObject({
          ok: false,
          error: { kind: 'invalid' },
        });
        continue;
      }
      expect(call('plan.evaluate', { homeId: id }), `home ${id}`).toStrictEqual(direct);
      evaluated += 1;
    }
    expect(evaluated).toBeGreaterThan(0);
  });

  it('saves a plan with the exact inputs and result, and lists it', () => {
    const { id } = call('plans.save', { homeId: ids.homeId, name: 'Second plan' });
    const plan = call('plans.get', { id });
    const inputs = project.store.read((read) => exportHomeFile(read, ids.homeId));
    expect(plan).toMatchObject({ homeId: ids.homeId, name: 'Second plan', inputs });
    expect(plan.result).toStrictEqual(call('plan.evaluate', { homeId: ids.homeId }));
    expect(call('plans.list', { homeId: ids.homeId }).map((saved) => saved.id)).toContain(id);
  });

  it('exports a home file that imports as a home exporting the same file', () => {
    const file = call('homeFile.export', { id: ids.homeId });
    const { id } = call('homeFile.import', { file });
    expect(id).not.toBe(ids.homeId);
    expect(call('homeFile.export', { id })).toStrictEqual(file);
    const imported = call('homeFile.import', requests['homeFile.import']);
    expect(call('homes.get', { id: imported.id }).tests).toHaveLength(2);
  });

  it('edits a library type, shows the edit, and resets it to the shipped values', () => {
    const shipped = call('library.shipped', {}).find((type) => type.id === EDITED_TYPE_ID);
    expect(shipped).toBeDefined();
    call('library.saveEdit', requests['library.saveEdit']);
    const edited = call('library.list', {});
    expect(edited.editedIds).toEqual([EDITED_TYPE_ID]);
    const type = edited.types.find((candidate) => candidate.id === EDITED_TYPE_ID);
    expect(type).toMatchObject({ name: 'Top plates (program figures)', defaultLifeYears: 25 });
    expect(call('library.shipped', {}).find((t) => t.id === EDITED_TYPE_ID)).toEqual(shipped);
    call('library.reset', { typeId: EDITED_TYPE_ID });
    const reset = call('library.list', {});
    expect(reset.editedIds).toEqual([]);
    expect(reset.types.find((candidate) => candidate.id === EDITED_TYPE_ID)).toEqual(shipped);
  });

  it('updates some settings and keeps the others', () => {
    const before = call('settings.get', {});
    const after = call('settings.update', { units: 'SI', laborRateUsdPerHour: 70 });
    expect(after).toEqual({ ...before, units: 'SI', laborRateUsdPerHour: 70 });
    expect(call('settings.get', {})).toEqual(after);
  });

  it('soft-deletes, restores and purges a home', () => {
    const { id } = call('homes.create', baseHomeInput(null));
    const live = () => call('homes.list', {}).map((home) => home.id);
    const deleted = () => call('homes.list', { deleted: true }).map((home) => home.id);
    call('homes.delete', { id });
    expect(live()).not.toContain(id);
    expect(deleted()).toContain(id);
    call('homes.restore', { id });
    expect(live()).toContain(id);
    call('homes.delete', { id });
    call('homes.purge', { id });
    expect([...live(), ...deleted()]).not.toContain(id);
    expect(callChannel(project.context, 'homes.get', { id })).toMatchObject({
      ok: false,
      error: { kind: 'notFound', field: 'homeId' },
    });
  });

  it('duplicates a home with its tests and measures under a new name', () => {
    const { id } = call('homes.duplicate', { id: ids.homeId, name: 'Twin house' });
    const original = call('homes.get', { id: ids.homeId });
    const copy = call('homes.get', { id });
    expect(copy.home).toMatchObject({ name: 'Twin house', isDemo: false });
    expect(copy.tests.map((record) => record.test)).toEqual(original.tests.map((r) => r.test));
    expect(copy.measures.map((record) => record.measure.id)).toEqual(
      original.measures.map((record) => record.measure.id),
    );
  });

  it('creates clients, climates and price sets and lists them', () => {
    const { id: clientId } = call('clients.create', requests['clients.create']);
    expect(call('clients.list', {}).map((client) => client.id)).toContain(clientId);
    const climate = call('climates.save', { ...requests['climates.save'], id: undefined });
    call('climates.save', {
      ...requests['climates.save'],
      id: climate.id,
      name: 'Renamed climate',
    });
    expect(call('climates.list', {}).find((set) => set.id === climate.id)?.name).toBe(
      'Renamed climate',
    );
    const prices = call('priceSets.save', {
      name: 'Second prices',
      data: requests['priceSets.save'].data,
    });
    expect(call('priceSets.list', {}).map((set) => set.id)).toContain(prices.id);
  });
});

describe('the corpus starts from requests that succeed', () => {
  it('runs every valid request of the corpus with ok: true, on a project of its own', () => {
    const own = openChannelProject('sealwork-channels-valid-');
    try {
      const valid = validRequests(addKnownRows(own.context));
      // Reads and exports first, while the known home still has its test-in; the deletes last,
      // in the order soft delete, restore, delete again, purge.
      const last: ChannelName[] = ['tests.update', 'tests.delete', 'measures.delete'];
      const ends: ChannelName[] = ['homes.delete', 'homes.restore', 'homes.delete', 'homes.purge'];
      const first = NAMES.filter((name) => !last.includes(name) && !ends.includes(name));
      for (const name of [...first, ...last, ...ends]) {
        const reply = callChannel(own.context, name, valid[name]);
        expect(reply.ok, `${name}: ${JSON.stringify(reply.ok ? '' : reply.error)}`).toBe(true);
      }
    } finally {
      own.close();
    }
  });
});

describe('a failing handler changes nothing and tells nothing of its insides', () => {
  it('rolls back a refused update of a missing home', () => {
    const digest = projectDigest(project.store.sqlite);
    const reply = callChannel(project.context, 'homes.update', {
      id: 999_999,
      home: baseHomeInput(null),
    });
    expect(refusalProblems(reply, { kind: 'notFound', field: 'homeId' })).toEqual([]);
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('rolls back the write a handler made before it failed', () => {
    // measures.add first moves the home's updatedAt, then the insert meets the unique key.
    const digest = projectDigest(project.store.sqlite);
    const changes = changesSoFar(project.store.sqlite);
    const measure = valueOf(callChannel(project.context, 'homes.get', { id: ids.homeId }))
      .measures[0]?.measure;
    const reply = callChannel(project.context, 'measures.add', { homeId: ids.homeId, measure });
    expect(refusalProblems(reply, { kind: 'constraint', field: 'id' })).toEqual([]);
    expect(changesSoFar(project.store.sqlite)).toBeGreaterThan(changes);
    expect(projectDigest(project.store.sqlite)).toBe(digest);
  });

  it('answers kind unexpected, with no message, stack or path of the exception', () => {
    const secret = 'secret detail at /home/someone/project.db (db/store.ts:42:7)';
    const failing = () => {
      throw new Error(secret);
    };
    const broken = { store: { ...project.store, read: failing, write: failing } };
    for (const name of ['homes.list', 'homes.create'] as const) {
      const reply = callChannel(broken, name, name === 'homes.list' ? {} : requests[name]);
      expect(refusalProblems(reply, { kind: 'unexpected', field: '' })).toEqual([]);
      expect(JSON.stringify(reply)).not.toContain('secret');
    }
    // A real one: better-sqlite3 throws a TypeError on a closed connection.
    const other = openChannelProject('sealwork-channels-closed-');
    other.store.close();
    const reply = callChannel(other.context, 'homes.list', {});
    expect(refusalProblems(reply, { kind: 'unexpected', field: '' })).toEqual([]);
    other.folder.remove();
  });
});

describe('isChannelName', () => {
  it('accepts every channel of the table', () => {
    for (const name of NAMES) expect(isChannelName(name), name).toBe(true);
  });

  it('refuses names inherited from Object.prototype and near misses of real names', () => {
    const names = [
      '__proto__',
      'constructor',
      'toString',
      'hasOwnProperty',
      'valueOf',
      'isPrototypeOf',
      '__defineGetter__',
      'prototype',
      '',
      'homes',
      'homes.list ',
      ' homes.list',
      'HOMES.LIST',
      'homes.list\u0000',
      'homes/list',
      'homes.list.extra',
    ];
    for (const name of names) expect(isChannelName(name), JSON.stringify(name)).toBe(false);
  });
});

describe('the refusal check used above', () => {
  it('catches an accepted request, another kind, a wrong field and a message with insides', () => {
    expect(refusalProblems({ ok: true, value: [] }, { kind: 'invalid' })).not.toEqual([]);
    const refusal = (error: object) => ({ ok: false, error });
    const plain = { kind: 'invalid', message: 'id: expected a whole number, got 1.5', field: 'id' };
    expect(refusalProblems(refusal(plain), { kind: 'invalid', field: 'id' })).toEqual([]);
    expect(refusalProblems(refusal(plain), { kind: 'notFound' })).not.toEqual([]);
    expect(refusalProblems(refusal(plain), { kind: 'invalid', field: 'name' })).not.toEqual([]);
    const leaky = 'TypeError: x is null\n    at handle (/work/main/electron/channels.ts:12:3)';
    const withStack = { ...plain, message: leaky };
    expect(refusalProblems(refusal(withStack), { kind: 'invalid' })).not.toEqual([]);
    expect(refusalProblems(refusal({ ...plain, stack: 'at x' }), { kind: 'invalid' })).not.toEqual(
      [],
    );
  });
});

// FINDING (electron/channels.ts, replyForError): the message joins every problem, one line
// per unknown field, with no limit, so a request of 10,000 made-up fields (about 90 kB of
// JSON) is answered with a message of about 700 kB, over the browser host too (a 2 MB body
// of such fields gives several MB back). A person reads the first few problems; the rest
// add nothing but size.
// Expected to fail until the reply lists a few problems and counts the others.
it('keeps the refusal of a request with thousands of unknown fields short', () => {
  const request = Object.fromEntries(
    Array.from({ length: 10_000 }, (_, index) => [`made_up_${index}`, 1]),
  );
  const reply = callChannel(project.context, 'homes.get', { id: ids.homeId, ...request });
  expect(refusalProblems(reply, { kind: 'invalid' })).toEqual([]);
});
