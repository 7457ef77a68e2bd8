/**
 * The corpus of malformed requests: for every slot of a valid request, the values its schema
 * refuses (wrong type, null where null is not allowed, numbers past each bound, fractions
 * for whole numbers, zero and negative ids, text past its length, values outside an enum,
 * lists for objects), the required fields removed, and unknown fields added to every object
 * (prototype keys among them). Each case changes one thing, so the reply must name it.
 */
import {
  allowsNull,
  changedAt,
  dottedPath,
  REMOVE,
  slotsOf,
  withoutNull,
  type JsonSchema,
  type PathKey,
  type Slot,
} from './request-schema.ts';

/** One malformed request and where its one fault is. */
export interface MalformedCase {
  /** What was changed, for the failure message. */
  label: string;
  /** The dotted path of the fault (empty for the whole request). */
  field: string;
  /** Whether the fault is a required field left out (rather than a value put in). */
  removed: boolean;
  request: unknown;
}

/** A string far past any length a request field allows (1 MB). */
export const HUGE_TEXT = 'x'.repeat(1_000_000);

/**
 * Keys that name `Object.prototype` members or the prototype itself; a handler that copied
 * them with plain assignment could change every object in the process.
 */
export const PROTOTYPE_KEYS: readonly string[] = [
  '__proto__',
  'constructor',
  'prototype',
  'toString',
  'hasOwnProperty',
  '__defineGetter__',
];

/** The value put under a prototype key: if it ever reached a prototype, `polluted` shows it. */
export const POLLUTING_VALUE = { polluted: 'yes' } as const;

interface Candidate {
  label: string;
  value: unknown;
}

function typeWrongValues(kind: string, value: unknown, nullable: boolean): Candidate[] {
  const all: Candidate[] = [
    { label: 'text', value: 'text' },
    { label: 'a number as text', value: '12' },
    { label: 'a number', value: 42 },
    { label: 'true', value: true },
    { label: 'false', value: false },
    { label: 'an empty list', value: [] },
    { label: 'the value in a list', value: [value ?? 1] },
    { label: 'an empty object', value: {} },
    { label: 'an array-like object', value: { 0: value ?? 1, length: 1 } },
  ];
  const sameKind: Record<string, (candidate: unknown) => boolean> = {
    number: (candidate) => typeof candidate === 'number',
    integer: (candidate) => typeof candidate === 'number',
    string: (candidate) => typeof candidate === 'string',
    boolean: (candidate) => typeof candidate === 'boolean',
    array: (candidate) => Array.isArray(candidate),
    object: (candidate) =>
      typeof candidate === 'object' && candidate !== null && !Array.isArray(candidate),
  };
  const matches = sameKind[kind] ?? (() => false);
  const wrong = all.filter((candidate) => !matches(candidate.value));
  return nullable ? wrong : [...wrong, { label: 'null', value: null }];
}

function numberValues(schema: JsonSchema, integer: boolean): Candidate[] {
  const values: Candidate[] = [
    { label: 'NaN', value: Number.NaN },
    { label: 'Infinity', value: Number.POSITIVE_INFINITY },
    { label: '-Infinity', value: Number.NEGATIVE_INFINITY },
  ];
  const step = (bound: number) => (integer ? 1 : Math.max(1e-6, Math.abs(bound) * 1e-6));
  if (schema.minimum !== undefined) {
    values.push({ label: 'just under the minimum', value: schema.minimum - step(schema.minimum) });
    values.push({ label: 'far under the minimum', value: -1e300 });
  }
  if (schema.exclusiveMinimum !== undefined) {
    const bound = schema.exclusiveMinimum;
    values.push({ label: 'the excluded lower bound', value: bound });
    values.push({ label: 'under the lower bound', value: bound - 1 });
    if (bound === 0) values.push({ label: 'negative zero', value: -0 });
  }
  if (schema.maximum !== undefined) {
    values.push({ label: 'just over the maximum', value: schema.maximum + step(schema.maximum) });
    values.push({ label: 'far over the maximum', value: 1e300 });
  }
  if (schema.exclusiveMaximum !== undefined) {
    values.push({ label: 'the excluded upper bound', value: schema.exclusiveMaximum });
  }
  if (integer) {
    const lowest = schema.minimum ?? (schema.exclusiveMinimum ?? -1) + 1;
    values.push({ label: 'a fraction', value: lowest + 0.5 });
    values.push({ label: 'a tiny fraction', value: lowest + 1e-9 });
  }
  return values;
}

function stringValues(schema: JsonSchema): Candidate[] {
  const values: Candidate[] = [];
  if (schema.maxLength !== undefined) {
    values.push({ label: 'one character too long', value: 'y'.repeat(schema.maxLength + 1) });
    if (schema.maxLength < HUGE_TEXT.length) values.push({ label: 'huge text', value: HUGE_TEXT });
  }
  if (schema.minLength !== undefined && schema.minLength > 0) {
    values.push({ label: 'too short', value: 'y'.repeat(schema.minLength - 1) });
  }
  if (schema.pattern !== undefined) {
    const pattern = new RegExp(schema.pattern, 'u');
    const misfit = ['NOT VALID!', 'x y', '-', ''].find((text) => !pattern.test(text));
    if (misfit !== undefined) values.push({ label: 'text off the pattern', value: misfit });
  }
  return values;
}

function enumValues(options: readonly unknown[]): Candidate[] {
  const first = options[0];
  if (typeof first === 'string') {
    const values: Candidate[] = [
      { label: 'not an option', value: 'not-an-option' },
      { label: 'an option with a space', value: `${first} ` },
      { label: 'an option in a list', value: [first] },
      { label: 'a number', value: 7 },
    ];
    const shouted = first.toUpperCase() === first ? first.toLowerCase() : first.toUpperCase();
    if (!options.includes(shouted))
      values.push({ label: 'an option in the wrong case', value: shouted });
    return values;
  }
  const numbers = options.filter((option): option is number => typeof option === 'number');
  return [
    { label: 'past the last option', value: Math.max(...numbers) + 1 },
    { label: 'before the first option', value: Math.min(...numbers) - 1 },
    { label: 'between options', value: Math.min(...numbers) + 0.5 },
    { label: 'an option as text', value: String(first) },
  ];
}

/**
 * The values a schema node refuses.
 *
 * @param schema - a JSON Schema node
 * @param value - the valid value there, if any (some near misses wrap it)
 * @returns labelled values, each refused by the node
 */
export function refusedValues(schema: JsonSchema, value: unknown): Candidate[] {
  const nullable = allowsNull(schema);
  const main = withoutNull(schema);
  if (main.enum !== undefined) {
    const kind = typeof main.enum[0] === 'number' ? 'number' : 'string';
    return [...typeWrongValues(kind, value, nullable), ...enumValues(main.enum)];
  }
  if (main.const !== undefined) {
    return [
      ...typeWrongValues(typeof main.const, value, nullable),
      { label: 'a different constant', value: `${String(main.const)}x` },
    ];
  }
  const kind = main.type;
  if (kind === undefined) return [];
  const wrongType = typeWrongValues(kind, value, nullable);
  if (kind === 'number' || kind === 'integer') {
    return [...wrongType, ...numberValues(main, kind === 'integer')];
  }
  if (kind === 'string') return [...wrongType, ...stringValues(main)];
  return wrongType;
}

function extraKeyCases(slot: Slot, main: JsonSchema): Candidate[] {
  const known = Object.keys(main.properties ?? {});
  const keys = ['unexpectedField', ...PROTOTYPE_KEYS];
  const firstKnown = known[0];
  if (firstKnown !== undefined) {
    const recased = firstKnown.charAt(0).toUpperCase() + firstKnown.slice(1);
    if (!known.includes(recased)) keys.push(recased);
  }
  return keys
    .filter((key) => !known.includes(key))
    .map((key) => ({ label: key, value: key === '__proto__' ? POLLUTING_VALUE : 1 }));
}

function casesAt(request: unknown, slot: Slot): MalformedCase[] {
  const cases: MalformedCase[] = [];
  const field = dottedPath(slot.path);
  const put = (
    label: string,
    path: readonly PathKey[],
    value: unknown,
    fault = { field: dottedPath(path), removed: value === REMOVE },
  ) => {
    const changed = changedAt(request, path, value);
    if (changed) cases.push({ label, ...fault, request: changed.result });
  };
  const isRoot = slot.path.length === 0;
  const main = withoutNull(slot.schema);
  const firstRequired = (main.required ?? [])[0];
  for (const candidate of refusedValues(slot.schema, slot.value)) {
    const label = `${field || 'request'} = ${candidate.label}`;
    if (isRoot && candidate.value === null) {
      // callChannel reads a missing request (undefined or null) as `{}`: refused only when
      // the request has required fields, and then for the first of them, as left out.
      if (firstRequired !== undefined) {
        put(label, slot.path, null, { field: firstRequired, removed: true });
      }
      continue;
    }
    put(label, slot.path, candidate.value);
  }
  if (!slot.present) return cases;
  const last = slot.path[slot.path.length - 1];
  if (slot.required && typeof last === 'string') put(`${field} removed`, slot.path, REMOVE);
  if (main.type === 'object' && main.additionalProperties === false) {
    for (const extra of extraKeyCases(slot, main)) {
      put(
        `unknown field ${extra.label} in ${field || 'request'}`,
        [...slot.path, extra.label],
        extra.value,
      );
    }
  }
  if (main.type === 'array' && Array.isArray(slot.value) && slot.value.length > 0) {
    if (main.maxItems !== undefined) {
      const first: unknown = slot.value[0];
      const tooMany = Array.from({ length: main.maxItems + 1 }, () => first);
      put(`${field} with too many items`, slot.path, tooMany);
    }
    if (main.minItems !== undefined && main.minItems > 0) {
      put(`${field} with too few items`, slot.path, slot.value.slice(0, main.minItems - 1));
    }
  }
  return cases;
}

/**
 * The malformed requests built from one valid request.
 *
 * @param schema - the channel's request JSON Schema
 * @param request - a valid request (not changed)
 * @param nested - schemas of the `z.unknown()` fields the handler checks, by dotted path
 * @returns one case per fault; every case is refused by the schema it was built from
 */
export function malformedRequests(
  schema: JsonSchema,
  request: unknown,
  nested: Readonly<Record<string, JsonSchema>> = {},
): MalformedCase[] {
  return slotsOf(schema, request, nested).flatMap((slot) => casesAt(request, slot));
}
