/** An assertion shared by the reference tests: `run` throws an InputError at `field`. */
import { expect } from 'vitest';
import { InputError } from '../../core/errors.ts';

export function expectInputError(run: () => unknown, field: string, wording: RegExp): void {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(InputError);
  expect((caught as InputError).field).toBe(field);
  expect((caught as InputError).message).toMatch(wording);
}
