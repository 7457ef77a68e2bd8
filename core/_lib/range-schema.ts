/**
 * A low / likely / high estimate. It lives on its own so the schema and the measure library
 * can both use it without importing each other.
 */
import { z } from 'zod';

/** A low / likely / high estimate; the order is checked once the numbers parse. */
export function rangeSchema(options: { min: number; max: number }) {
  const bound = () => z.number().min(options.min).max(options.max);
  return z.strictObject({ low: bound(), likely: bound(), high: bound() }).check((ctx) => {
    const { low, likely, high } = ctx.value;
    if (!(low <= likely && likely <= high)) {
      ctx.issues.push({
        code: 'custom',
        input: ctx.value,
        message: `expected low ≤ likely ≤ high, got ${low} / ${likely} / ${high}`,
      });
    }
  });
}

export type Range = { low: number; likely: number; high: number };
