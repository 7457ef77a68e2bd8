/**
 * fast-check arbitraries of near misses: a valid request with one to three of its slots
 * broken at random (a number just past a bound, a fraction for a whole number, text one
 * character too long or off its pattern, a value of another type, an unknown field with a
 * random name, a required field removed). Every break is refused by the slot's schema on
 * its own, and none can repair another, so every generated request is malformed.
 */
import fc from 'fast-check';
import { PROTOTYPE_KEYS } from './malformed-requests.ts';
import {
  allowsNull,
  changedAt,
  REMOVE,
  slotsOf,
  withoutNull,
  type JsonSchema,
  type PathKey,
  type Slot,
} from './request-schema.ts';

/** One break: the value put at a path (or the field removed). */
interface Break {
  path: readonly PathKey[];
  value: unknown;
}

function isPlainObject(value: unknown): boolean {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Any value but undefined (an absent optional field is valid), of another kind than asked. */
function otherThan(isKind: (value: unknown) => boolean, nullable: boolean): fc.Arbitrary<unknown> {
  return fc
    .anything({ maxDepth: 2 })
    .filter((value) => value !== undefined && !(nullable && value === null) && !isKind(value));
}

function numberBreaks(schema: JsonSchema, integer: boolean): fc.Arbitrary<unknown>[] {
  const breaks: fc.Arbitrary<unknown>[] = [
    fc.constantFrom(Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY),
  ];
  // The filters keep the break strict: fast-check may give -0 for an excluded 0 bound, and
  // -0 passes `min(0)`.
  const minimum = schema.minimum;
  if (minimum !== undefined) {
    breaks.push(
      fc.double({ max: minimum, maxExcluded: true, noNaN: true }).filter((v) => v < minimum),
    );
  }
  const exclusiveMinimum = schema.exclusiveMinimum;
  if (exclusiveMinimum !== undefined) {
    breaks.push(
      fc.double({ max: exclusiveMinimum, noNaN: true }).filter((v) => !(v > exclusiveMinimum)),
    );
  }
  const maximum = schema.maximum;
  if (maximum !== undefined) {
    breaks.push(
      fc.double({ min: maximum, minExcluded: true, noNaN: true }).filter((v) => v > maximum),
    );
  }
  if (integer) {
    const low = schema.minimum ?? schema.exclusiveMinimum ?? -1e6;
    const high = Math.min(schema.maximum ?? 1e6, 1e9);
    breaks.push(
      fc
        .double({ min: low, max: high, noNaN: true, noDefaultInfinity: true })
        .filter((value) => !Number.isInteger(value)),
    );
  }
  return breaks;
}

function stringBreaks(schema: JsonSchema): fc.Arbitrary<unknown>[] {
  const breaks: fc.Arbitrary<unknown>[] = [];
  const maxLength = schema.maxLength;
  if (maxLength !== undefined) {
    breaks.push(fc.string({ maxLength: 8 }).map((tail) => 'y'.repeat(maxLength + 1) + tail));
  }
  if (schema.minLength !== undefined && schema.minLength > 0) breaks.push(fc.constant(''));
  if (schema.pattern !== undefined) {
    const pattern = new RegExp(schema.pattern, 'u');
    breaks.push(fc.string().filter((text) => !pattern.test(text)));
  }
  return breaks;
}

/** Values the slot's schema refuses. */
function refusedArbitrary(schema: JsonSchema): fc.Arbitrary<unknown> | undefined {
  const nullable = allowsNull(schema);
  const main = withoutNull(schema);
  const options = main.enum ?? (main.const === undefined ? undefined : [main.const]);
  if (options !== undefined) {
    const numeric = typeof options[0] === 'number';
    const other: fc.Arbitrary<unknown> = numeric ? fc.double() : fc.string();
    const outside = other.filter((value) => !options.includes(value));
    const otherType = otherThan((value) => typeof value === typeof options[0], nullable);
    return fc.oneof(outside, otherType);
  }
  const kind = main.type;
  if (kind === 'number' || kind === 'integer') {
    const wrong = otherThan((value) => typeof value === 'number', nullable);
    return fc.oneof(wrong, ...numberBreaks(main, kind === 'integer'));
  }
  if (kind === 'string') {
    return fc.oneof(
      otherThan((value) => typeof value === 'string', nullable),
      ...stringBreaks(main),
    );
  }
  if (kind === 'boolean') return otherThan((value) => typeof value === 'boolean', nullable);
  if (kind === 'object') return otherThan(isPlainObject, nullable);
  if (kind === 'array') return otherThan(Array.isArray, nullable);
  return undefined;
}

function breaksOf(slot: Slot, isRoot: boolean): fc.Arbitrary<Break>[] {
  const main = withoutNull(slot.schema);
  const breaks: fc.Arbitrary<Break>[] = [];
  const refused = refusedArbitrary(slot.schema);
  const rootMayBeNull = (main.required ?? []).length > 0;
  if (refused !== undefined) {
    // A missing request reads as `{}` (see callChannel), so null is refused only when the
    // request has required fields.
    const value = isRoot && !rootMayBeNull ? refused.filter((v) => v !== null) : refused;
    breaks.push(value.map((v) => ({ path: slot.path, value: v })));
  }
  if (!slot.present) return breaks;
  const last = slot.path[slot.path.length - 1];
  if (slot.required && typeof last === 'string') {
    breaks.push(fc.constant({ path: slot.path, value: REMOVE }));
  }
  if (main.type === 'object' && main.additionalProperties === false) {
    const known = Object.keys(main.properties ?? {});
    const key = fc
      .oneof(fc.string({ maxLength: 12 }), fc.constantFrom(...PROTOTYPE_KEYS))
      .filter((name) => !known.includes(name));
    breaks.push(
      fc
        .tuple(
          key,
          fc.anything({ maxDepth: 1 }).filter((v) => v !== undefined),
        )
        .map(([name, value]) => ({
          path: [...slot.path, name],
          value,
        })),
    );
  }
  return breaks;
}

/**
 * Malformed requests near a valid one.
 *
 * @param schema - the channel's request JSON Schema
 * @param request - a valid request
 * @param nested - schemas of the `z.unknown()` fields the handler checks, by dotted path
 * @returns requests with one to three breaks each
 */
export function nearMissArbitrary(
  schema: JsonSchema,
  request: unknown,
  nested: Readonly<Record<string, JsonSchema>> = {},
): fc.Arbitrary<unknown> {
  const breaks = slotsOf(schema, request, nested).flatMap((slot) =>
    breaksOf(slot, slot.path.length === 0),
  );
  return fc.array(fc.oneof(...breaks), { minLength: 1, maxLength: 3 }).map((chosen) => {
    let result: unknown = request;
    for (const item of chosen) {
      const changed = changedAt(result, item.path, item.value);
      if (changed) result = changed.result;
    }
    return result;
  });
}
