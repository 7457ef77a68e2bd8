/**
 * What the benches share: the median of their runs, and a demo home with measures of the
 * library's types added up to a count (the benches' "20-measure home"), priced at an invented
 * labour rate from each type's default materials and hours.
 */
import { MEASURE_LIBRARY, type MeasureType } from '../../../core/measure-library.ts';
import type { HomeFileInput } from '../../../core/schema.ts';

/** An invented labour rate for the measures a bench adds. */
export const BENCH_LABOR_RATE_USD_PER_HOUR = 58;

/** The middle run (the upper middle of an even count). */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)] ?? Number.NaN;
}

/**
 * The home's measures, then measures of the library's types in turn (2 to 6 units each) until
 * there are `count`.
 */
export function withLibraryMeasures(
  home: HomeFileInput,
  count: number,
  types: readonly MeasureType[] = MEASURE_LIBRARY,
): HomeFileInput['measures'] {
  const measures = [...home.measures];
  for (let index = 0; measures.length < count; index++) {
    const type = types[index % types.length];
    if (type === undefined) break;
    const units = 2 + (index % 5);
    measures.push({
      id: `bench-${index + 1}`,
      type: type.id,
      byUnits: { units },
      cost: {
        materialsUsd: type.defaultCost.materialsUsdPerUnit * units,
        laborHours: type.defaultCost.laborHoursPerUnit * units,
        laborRateUsdPerHour: BENCH_LABOR_RATE_USD_PER_HOUR,
      },
    });
  }
  return measures;
}
