/** Small helpers shared by the repositories: JSON columns, lookups that must find a row. */
import type { z } from 'zod';
import { InputError } from '../../core/errors.ts';
import { problemsFromZod } from '../../core/_lib/zod-problems.ts';
import { DbError } from '../errors.ts';

/** Parses a JSON column written by this layer. */
export function readJson<T>(text: string): T {
  return JSON.parse(text) as T;
}

/** Checks `input` against `schema`; throws InputError with every problem at `pathPrefix`. */
export function validated<S extends z.ZodType>(
  schema: S,
  input: unknown,
  pathPrefix = '',
): z.output<S> {
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const problems = problemsFromZod(result.error, input).map((problem) => ({
    path:
      pathPrefix === ''
        ? problem.path
        : problem.path === ''
          ? pathPrefix
          : `${pathPrefix}.${problem.path}`,
    message: problem.message,
  }));
  throw new InputError(problems);
}

/** The row, or a `notFound` error naming what was looked for. */
export function found<T>(row: T | undefined, what: string, field: string): T {
  if (row === undefined) throw new DbError('notFound', `${what} does not exist`, { field });
  return row;
}

/** SQLite booleans are 0/1 integers. */
export function flag(value: boolean | undefined): number {
  return value ? 1 : 0;
}
