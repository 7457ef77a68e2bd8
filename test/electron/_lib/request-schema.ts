/**
 * A channel's zod request schema seen as JSON Schema (zod's own `z.toJSONSchema`), walked
 * alongside a valid request: every place in the request where a near miss can be put, with
 * the bounds the schema states for it. The corpus and the fuzzing both start from these
 * slots, so a field added to a schema is fuzzed without anyone writing a case for it.
 */
import { z } from 'zod';

/** The parts of JSON Schema (draft 2020-12) that zod writes for Sealwork's request schemas. */
export interface JsonSchema {
  type?: string;
  properties?: Record<string, JsonSchema>;
  required?: readonly string[];
  additionalProperties?: boolean | JsonSchema;
  items?: JsonSchema;
  minItems?: number;
  maxItems?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  enum?: readonly unknown[];
  const?: unknown;
  anyOf?: readonly JsonSchema[];
}

/** One step into a request: a field name or a list index. */
export type PathKey = string | number;

/** Where a near miss goes in a request, and what the schema says belongs there. */
export interface Slot {
  path: readonly PathKey[];
  /** The schema of the value at `path` (null allowed or not, see `allowsNull`). */
  schema: JsonSchema;
  /** Whether the valid request has a value here (absent optional fields are slots too). */
  present: boolean;
  /** The valid request's value here (undefined when absent). */
  value: unknown;
  /** Whether the field must be there. */
  required: boolean;
}

/**
 * The JSON Schema of a zod schema, as a request arrives (before defaults and transforms).
 *
 * @param schema - a zod request schema
 * @returns its JSON Schema; refinements that JSON Schema cannot state are left out
 */
export function jsonSchemaOf(schema: z.ZodType): JsonSchema {
  return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as JsonSchema;
}

/**
 * Whether `null` is a valid value for the schema.
 *
 * @param schema - a JSON Schema node
 * @returns true for `anyOf [..., { type: 'null' }]` or `type: 'null'`
 */
export function allowsNull(schema: JsonSchema): boolean {
  return schema.type === 'null' || (schema.anyOf ?? []).some((branch) => allowsNull(branch));
}

/**
 * The schema without its null branch (`nullable()` is written as `anyOf [X, null]`).
 *
 * @param schema - a JSON Schema node
 * @returns the single non-null branch, or the schema itself
 */
export function withoutNull(schema: JsonSchema): JsonSchema {
  const branches = (schema.anyOf ?? []).filter((branch) => branch.type !== 'null');
  return branches.length === 1 && branches[0] !== undefined ? branches[0] : schema;
}

/**
 * A path as the error `field` names it: `measures[2].cost.laborHours` (core/errors.ts).
 *
 * @param path - the keys from the request's root
 * @returns the dotted path; empty for the whole request
 */
export function dottedPath(path: readonly PathKey[]): string {
  let text = '';
  for (const key of path) {
    if (typeof key === 'number') text += `[${key}]`;
    else text += text === '' ? key : `.${key}`;
  }
  return text;
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * Every slot of a valid request: each field present (recursively), each field the schema
 * allows but the request leaves out (not entered further), each list item.
 *
 * @param schema - the request's JSON Schema
 * @param request - a request the schema accepts
 * @param nested - schemas for `z.unknown()` fields that the handler checks itself, by dotted
 *   path (e.g. `file` of `homeFile.import` is a home file)
 * @returns the slots, root first
 */
export function slotsOf(
  schema: JsonSchema,
  request: unknown,
  nested: Readonly<Record<string, JsonSchema>> = {},
): Slot[] {
  const slots: Slot[] = [];
  const walk = (
    node: JsonSchema,
    value: unknown,
    path: readonly PathKey[],
    present: boolean,
    required: boolean,
  ): void => {
    const resolved = nested[dottedPath(path)] ?? node;
    slots.push({ path, schema: resolved, present, value, required });
    if (!present) return;
    const main = withoutNull(resolved);
    if (main.type === 'object' && isPlainObject(value)) {
      for (const [key, property] of Object.entries(main.properties ?? {})) {
        const has = Object.hasOwn(value, key);
        const isRequired = (main.required ?? []).includes(key);
        walk(property, has ? value[key] : undefined, [...path, key], has, isRequired);
      }
    } else if (main.type === 'array' && Array.isArray(value) && main.items) {
      const items = main.items;
      value.forEach((item, index) => walk(items, item, [...path, index], true, true));
    }
  };
  walk(schema, request, [], true, true);
  return slots;
}

/** Marks a field to be removed rather than replaced. */
export const REMOVE: unique symbol = Symbol('remove the field');

/**
 * A deep copy of a request with one value replaced, added or removed. Keys such as
 * `__proto__` become own fields (as `JSON.parse` makes them), never the prototype; NaN and
 * -0 survive the copy (structured clone), so one near miss cannot undo another.
 *
 * @param root - a request (not changed)
 * @param path - where to change it; the parent must exist with the right shape
 * @param value - the new value, or `REMOVE`
 * @returns the changed copy, or undefined when the parent is missing or of another shape
 */
export function changedAt(
  root: unknown,
  path: readonly PathKey[],
  value: unknown,
): { result: unknown } | undefined {
  if (path.length === 0) return value === REMOVE ? undefined : { result: value };
  const copy: unknown = structuredClone(root);
  let parent: unknown = copy;
  for (const key of path.slice(0, -1)) {
    if (typeof key === 'number' ? !Array.isArray(parent) : !isPlainObject(parent)) return undefined;
    parent = (parent as Record<PathKey, unknown>)[key];
  }
  const last = path[path.length - 1] as PathKey;
  if (typeof last === 'number') {
    if (!Array.isArray(parent) || value === REMOVE) return undefined;
    parent[last] = value;
  } else {
    if (!isPlainObject(parent)) return undefined;
    if (value === REMOVE) delete parent[last];
    else
      Object.defineProperty(parent, last, {
        value,
        enumerable: true,
        writable: true,
        configurable: true,
      });
  }
  return { result: copy };
}
