/**
 * How a draw turns its uniform numbers into values: each measure's range and each varied
 * condition (fuel escalation, efficiency, N) gets a sampler once a run, with its PERT table
 * found beforehand, so a draw looks nothing up. The values are `rangeQuantile`'s
 * (distributions.ts): PERT from its table, interpolated linearly, or the triangular inverse
 * CDF.
 */
import type { DrawConditions, PackageKernel } from '../plan/kernel.ts';
import type { Range } from '../schema.ts';
import { pertQuantileTable, triangularQuantile, type Distribution } from './distributions.ts';
import type { RunSettings } from './settings.ts';

/**
 * How a draw turns its uniform number into a value of one range: the range's point when it
 * has no width, its PERT table, or the triangular inverse CDF. Worked out once a run, so a
 * draw looks nothing up.
 */
export interface RangeSampler {
  range: Range;
  low: number;
  width: number;
  /** The standardized PERT quantiles, or null when the range is a point or triangular. */
  table: Float64Array | null;
}

export function rangeSampler(distribution: Distribution, range: Range): RangeSampler {
  const width = range.high - range.low;
  return {
    range,
    low: range.low,
    width,
    table:
      distribution === 'pert' && width > 0
        ? pertQuantileTable((range.likely - range.low) / width)
        : null,
  };
}

/**
 * The value of a range at fraction u: `rangeQuantile` (PERT from its table, interpolated
 * linearly, or triangular) with the table found beforehand.
 */
export function sampleRange(sampler: RangeSampler, fraction: number): number {
  const { width, table } = sampler;
  if (!(width > 0)) return sampler.range.likely;
  if (table === null) return triangularQuantile(sampler.range, fraction);
  const steps = table.length - 1;
  const position = fraction * steps;
  const cell = Math.min(steps - 1, Math.floor(position));
  const lower = table[cell] ?? 0;
  return sampler.low + width * (lower + (position - cell) * ((table[cell + 1] ?? 1) - lower));
}

/** How a measure's range is sampled: its likely value, its PERT table or triangular. */
const POINT = 0;
const TABLE = 1;
const TRIANGULAR = 2;

/**
 * The samplers of a package's measures laid out for the draw loop: one entry per measure in
 * typed arrays, so a draw reads numbers, not objects.
 */
export interface ReductionSamplers {
  readonly count: number;
  /** POINT, TABLE or TRIANGULAR. */
  readonly kind: Uint8Array;
  readonly low: Float64Array;
  readonly width: Float64Array;
  readonly likely: Float64Array;
  /** Each measure's standardized PERT quantiles (the shared cached table); empty if none. */
  readonly tables: readonly Float64Array[];
  readonly ranges: readonly Range[];
}

const NO_TABLE = new Float64Array(0);

/** The samplers of the measures' ranges, in package order (as `rangeSampler` finds them). */
export function reductionSamplers(
  distribution: Distribution,
  ranges: readonly Range[],
): ReductionSamplers {
  const count = ranges.length;
  const kind = new Uint8Array(count);
  const low = new Float64Array(count);
  const width = new Float64Array(count);
  const likely = new Float64Array(count);
  const tables: Float64Array[] = [];
  ranges.forEach((range, index) => {
    const sampler = rangeSampler(distribution, range);
    low[index] = sampler.low;
    width[index] = sampler.width;
    likely[index] = range.likely;
    kind[index] = !(sampler.width > 0) ? POINT : sampler.table === null ? TRIANGULAR : TABLE;
    tables.push(sampler.table ?? NO_TABLE);
  });
  return { count, kind, low, width, likely, tables, ranges };
}

/**
 * One draw's reductions: measure i's value of its range at fractions[i] (`sampleRange`'s),
 * into out[i].
 */
export function sampleReductions(
  samplers: ReductionSamplers,
  fractions: Float64Array,
  out: Float64Array,
): void {
  const { count, kind, low, width, likely, tables } = samplers;
  for (let index = 0; index < count; index += 1) {
    const fraction = fractions[index] as number;
    const measureKind = kind[index];
    if (measureKind === TABLE) {
      const table = tables[index] as Float64Array;
      const steps = table.length - 1;
      const position = fraction * steps;
      const cell = Math.min(steps - 1, Math.floor(position));
      const lower = table[cell] as number;
      out[index] =
        (low[index] as number) +
        (width[index] as number) *
          (lower + (position - cell) * ((table[cell + 1] as number) - lower));
    } else if (measureKind === POINT) {
      out[index] = likely[index] as number;
    } else {
      out[index] = triangularQuantile(samplers.ranges[index] as Range, fraction);
    }
  }
}

/** The varied conditions' samplers, each null when that condition is not varied. */
export interface ConditionSamplers {
  heatingEscalation: RangeSampler | null;
  electricityEscalation: RangeSampler | null;
  efficiency: RangeSampler | null;
  nFactor: RangeSampler | null;
}

export function conditionSamplers(kernel: PackageKernel, settings: RunSettings): ConditionSamplers {
  const { distribution, vary } = settings;
  const base = kernel.baseConditions;
  const escalation = vary.escalationPlusMinusRate;
  const efficiency = vary.efficiencyBelowRatingFraction;
  const nFactor = vary.nFactorPlusMinusFraction;
  const sampler = (range: Range | null) => (range ? rangeSampler(distribution, range) : null);
  return {
    heatingEscalation: sampler(
      escalation === null ? null : aroundPoint(base.heatingEscalationRate, escalation),
    ),
    electricityEscalation: sampler(
      escalation === null ? null : aroundPoint(base.electricityEscalationRate, escalation),
    ),
    efficiency: sampler(efficiency === null ? null : { low: 1 - efficiency, likely: 1, high: 1 }),
    nFactor: sampler(nFactor === null ? null : { low: 1 - nFactor, likely: 1, high: 1 + nFactor }),
  };
}

/** Sets a draw's conditions from its condition numbers (slots 0–4, always drawn). */
export function drawConditions(
  samplers: ConditionSamplers,
  fractions: Float64Array,
  conditions: DrawConditions,
): void {
  const { heatingEscalation, electricityEscalation, efficiency, nFactor } = samplers;
  if (heatingEscalation && electricityEscalation) {
    conditions.heatingEscalationRate = sampleRange(heatingEscalation, fractions[0] ?? 0);
    conditions.electricityEscalationRate = sampleRange(electricityEscalation, fractions[1] ?? 0);
  }
  if (efficiency) {
    conditions.heatingEfficiencyFactor = sampleRange(efficiency, fractions[2] ?? 0);
    conditions.coolingEfficiencyFactor = sampleRange(efficiency, fractions[3] ?? 0);
  }
  if (nFactor) conditions.infiltrationDivisor = sampleRange(nFactor, fractions[4] ?? 0);
}

function aroundPoint(point: number, plusMinus: number): Range {
  return { low: point - plusMinus, likely: point, high: point + plusMinus };
}
