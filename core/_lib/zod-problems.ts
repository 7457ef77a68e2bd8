/**
 * Turns zod's issues into Sealwork's input problems: a dotted path and a plain sentence of
 * what was expected, so people read `measures[2].cost.laborHours: expected a number of at
 * least 0, got -3` rather than a validator's jargon.
 */
import type { z } from 'zod';
import type { InputProblem } from '../errors.ts';

/** `['measures', 2, 'cost']` → `measures[2].cost`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let text = '';
  for (const key of path) {
    if (typeof key === 'number') text += `[${key}]`;
    else text += text === '' ? String(key) : `.${String(key)}`;
  }
  return text;
}

/** The value found at `path` inside `root`, or undefined. */
function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let value: unknown = root;
  for (const key of path) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<PropertyKey, unknown>)[key];
  }
  return value;
}

/** A short description of what was actually given. */
function describe(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'string')
    return `"${value.length > 40 ? value.slice(0, 37) + '...' : value}"`;
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : String(value);
  if (typeof value === 'object') return 'an object';
  return String(value);
}

const TYPE_WORDS: Record<string, string> = {
  number: 'a number',
  int: 'a whole number',
  string: 'text',
  boolean: 'true or false',
  object: 'an object',
  array: 'a list',
  null: 'null',
};

function boundWords(
  direction: 'min' | 'max',
  bound: unknown,
  inclusive: boolean,
  origin: unknown,
): string {
  if (origin === 'array') {
    return direction === 'min'
      ? `at least ${String(bound)} item${bound === 1 ? '' : 's'}`
      : `at most ${String(bound)} items`;
  }
  if (origin === 'string') {
    return direction === 'min'
      ? `text of at least ${String(bound)} character${bound === 1 ? '' : 's'}`
      : `text of at most ${String(bound)} characters`;
  }
  if (direction === 'min') return `a number ${inclusive ? 'of at least' : 'greater than'} ${bound}`;
  return `a number ${inclusive ? 'of at most' : 'less than'} ${bound}`;
}

/** Plain-words problems for every zod issue, in the order zod found them. */
export function problemsFromZod(error: z.ZodError, input: unknown): InputProblem[] {
  const problems: InputProblem[] = [];
  for (const issue of error.issues) {
    const path = formatPath(issue.path);
    const given = describe(valueAt(input, issue.path));
    switch (issue.code) {
      case 'invalid_type': {
        const wanted = TYPE_WORDS[issue.expected] ?? issue.expected;
        const missing = valueAt(input, issue.path) === undefined;
        problems.push({
          path,
          message: missing ? `is required: expected ${wanted}` : `expected ${wanted}, got ${given}`,
        });
        break;
      }
      case 'too_small':
        problems.push({
          path,
          message: `expected ${boundWords('min', issue.minimum, issue.inclusive ?? true, issue.origin)}, got ${given}`,
        });
        break;
      case 'too_big':
        problems.push({
          path,
          message: `expected ${boundWords('max', issue.maximum, issue.inclusive ?? true, issue.origin)}, got ${given}`,
        });
        break;
      case 'invalid_value': {
        const options = issue.values.map((v) => JSON.stringify(v)).join(', ');
        const wanted = issue.values.length === 1 ? options : `one of ${options}`;
        const missing = valueAt(input, issue.path) === undefined;
        problems.push({
          path,
          message: missing ? `is required: expected ${wanted}` : `expected ${wanted}, got ${given}`,
        });
        break;
      }
      case 'unrecognized_keys':
        for (const key of issue.keys) {
          problems.push({
            path: path === '' ? key : `${path}.${key}`,
            message: 'is not a field Sealwork knows here (check the spelling)',
          });
        }
        break;
      case 'invalid_format':
        // A pattern carries the schema's own words for what was expected.
        problems.push({
          path,
          message:
            issue.format === 'regex'
              ? `${issue.message}, got ${given}`
              : `expected ${issue.format} text, got ${given}`,
        });
        break;
      default:
        problems.push({ path, message: issue.message });
    }
  }
  return problems;
}
