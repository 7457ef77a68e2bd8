/**
 * Calibration of the estimates from test-outs: the factors come back from homes made with known
 * factors, the bootstrap interval holds the truth and is as wide as the ordinary least-squares
 * standard error says (σ̂²(AᵀA)⁻¹, any regression text; computed here independently), seeds
 * reproduce, ratios equal their sums worked here, and bad input names its field.
 *
 * The homes are synthetic: the true factors (0.6, 0.9, 1.1) are this test's own choice, the
 * estimates and noise come from the project's seeded generator.
 */
import { describe, expect, it } from 'vitest';
import {
  applyCalibration,
  calibrateRange,
  fitRealization,
  revertCalibration,
  type TestedHome,
} from '../../core/calibration.ts';
import { Xoshiro128StarStar } from '../../core/uncertainty/random.ts';
import { expectInputError } from '../_lib/expect-input-error.ts';

const TRUE_FACTORS: Record<string, number> = { 'attic-bypass': 0.6, 'duct-seal': 0.9, rim: 1.1 };
const TYPES = Object.keys(TRUE_FACTORS);
const NOISE_CFM50 = 40;

/** A normal draw by Box–Muller from two fractions of the generator. */
function normal(generator: Xoshiro128StarStar): number {
  const u = 1 - generator.nextFraction();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * generator.nextFraction());
}

/** Homes with 1–3 of the types, estimates 50–400 CFM50, measured = Σ f·est + noise. */
function syntheticHomes(count: number, noiseCfm50: number, seed: number): TestedHome[] {
  const generator = new Xoshiro128StarStar();
  return Array.from({ length: count }, (_, index) => {
    generator.reseed(seed, 7, index);
    const estimatedByType: Record<string, number> = {};
    let measured = 0;
    const chosen = TYPES.filter(() => generator.nextFraction() < 0.55);
    if (chosen.length === 0) chosen.push(TYPES[Math.floor(generator.nextFraction() * 3)]!);
    for (const typeId of chosen) {
      const estimate = 50 + 350 * generator.nextFraction();
      estimatedByType[typeId] = estimate;
      measured += TRUE_FACTORS[typeId]! * estimate;
    }
    return {
      homeId: 1000 + index,
      measuredReductionCfm50: measured + noiseCfm50 * normal(generator),
      estimatedByType,
    };
  });
}

/** Ordinary least-squares factors and their standard errors, by Gauss–Jordan on AᵀA. */
function olsWithErrors(homes: TestedHome[]): { factors: number[]; errors: number[] } {
  const k = TYPES.length;
  const rows = homes.map((home) => TYPES.map((typeId) => home.estimatedByType[typeId] ?? 0));
  const gram = TYPES.map((_, i) =>
    TYPES.map((__, j) => rows.reduce((s, r) => s + r[i]! * r[j]!, 0)),
  );
  const inverse: number[][] = TYPES.map((_, i) => TYPES.map((__, j) => (i === j ? 1 : 0)));
  for (let col = 0; col < k; col += 1) {
    const pivot = gram[col]![col]!;
    for (let c = 0; c < k; c += 1) {
      gram[col]![c]! /= pivot;
      inverse[col]![c]! /= pivot;
    }
    for (let r = 0; r < k; r += 1) {
      if (r === col) continue;
      const factor = gram[r]![col]!;
      for (let c = 0; c < k; c += 1) {
        gram[r]![c]! -= factor * gram[col]![c]!;
        inverse[r]![c]! -= factor * inverse[col]![c]!;
      }
    }
  }
  const projection = TYPES.map((_, i) =>
    rows.reduce((s, r, h) => s + r[i]! * homes[h]!.measuredReductionCfm50, 0),
  );
  const factors = inverse.map((row) => row.reduce((s, v, j) => s + v * projection[j]!, 0));
  const residuals = rows.map(
    (r, h) => homes[h]!.measuredReductionCfm50 - r.reduce((s, v, j) => s + v * factors[j]!, 0),
  );
  const variance = residuals.reduce((s, v) => s + v * v, 0) / (homes.length - k);
  return { factors, errors: inverse.map((row, i) => Math.sqrt(variance * row[i]!)) };
}

describe('realization factors from synthetic homes with known factors', () => {
  it('recovers the factors to 1e-9 without noise, and the interval collapses on them', () => {
    const fit = fitRealization(syntheticHomes(60, 0, 11), { seed: 5, resamples: 200 });
    for (const type of fit.types) {
      const truth = TRUE_FACTORS[type.typeId]!;
      expect(type.status).toBe('fitted');
      expect(Math.abs(type.factor! - truth)).toBeLessThanOrEqual(1e-9 * truth);
      expect(Math.abs(type.interval!.low - truth)).toBeLessThanOrEqual(1e-9);
      expect(Math.abs(type.interval!.high - truth)).toBeLessThanOrEqual(1e-9);
    }
    expect(fit.residualNormCfm50).toBeLessThan(1e-9);
  });

  it('holds each true factor within its 95 % interval, about ±1.96 OLS standard errors wide', () => {
    const homes = syntheticHomes(300, NOISE_CFM50, 12);
    const fit = fitRealization(homes, { seed: 42 });
    const ols = olsWithErrors(homes);
    fit.types.forEach((type, column) => {
      const truth = TRUE_FACTORS[type.typeId]!;
      expect(type.interval!.low).toBeLessThan(truth);
      expect(type.interval!.high).toBeGreaterThan(truth);
      expect(type.resamplesUsed).toBe(1000);
      // Every factor is well above 0 here, so NNLS is OLS.
      expect(type.factor).toBeCloseTo(ols.factors[column]!, 9);
      const width = type.interval!.high - type.interval!.low;
      expect(width / (2 * 1.959964 * ols.errors[column]!)).toBeGreaterThan(0.8);
      expect(width / (2 * 1.959964 * ols.errors[column]!)).toBeLessThan(1.25);
    });
  });

  it('gives a narrower interval at a lower level, from the same refits', () => {
    const homes = syntheticHomes(80, NOISE_CFM50, 13);
    const wide = fitRealization(homes, { seed: 3, resamples: 400 });
    const narrow = fitRealization(homes, { seed: 3, resamples: 400, level: 0.5 });
    wide.types.forEach((type, column) => {
      const inner = narrow.types[column]!.interval!;
      expect(inner.level).toBe(0.5);
      expect(inner.low).toBeGreaterThan(type.interval!.low);
      expect(inner.high).toBeLessThan(type.interval!.high);
    });
  });
});

describe('seeds', () => {
  const homes = syntheticHomes(50, NOISE_CFM50, 14);
  it('gives identical intervals for the same seed and different ones for another', () => {
    const first = fitRealization(homes, { seed: 99, resamples: 300 });
    const again = fitRealization(homes, { seed: 99, resamples: 300 });
    const other = fitRealization(homes, { seed: 100, resamples: 300 });
    expect(again).toEqual(first);
    first.types.forEach((type, column) => {
      expect(other.types[column]!.factor).toBe(type.factor);
      expect(other.types[column]!.interval).not.toEqual(type.interval);
    });
  });
});

describe('what the data cannot fix, and the plain ratios', () => {
  it('reports a type no home had, and types always done together, as undetermined', () => {
    const homes: TestedHome[] = [1, 2, 3, 4, 5, 6].map((n) => ({
      homeId: n,
      measuredReductionCfm50: 100 * n,
      estimatedByType: { attic: 80 * n, door: 40 * n, rim: n % 2 ? 0 : 30 * n },
    }));
    const fit = fitRealization(homes, { seed: 1, resamples: 50, typeIds: ['window'] });
    const byId = Object.fromEntries(fit.types.map((type) => [type.typeId, type]));
    expect(byId.window).toMatchObject({
      factor: null,
      status: 'undetermined',
      interval: null,
      homes: 0,
    });
    expect(byId.window!.fewHomes).toBe(true);
    // attic = 2 × door in every home: only 80a + 40d is fixed, not a and d.
    expect(byId.attic!.status).toBe('undetermined');
    expect(byId.door!.status).toBe('undetermined');
    expect(byId.rim!.homes).toBe(3);
    expect(byId.rim!.fewHomes).toBe(true);
  });

  it('holds at 0 a type whose homes measured nothing beyond the other types', () => {
    const homes: TestedHome[] = [1, 2, 3, 4, 5, 6, 7, 8].map((n) => ({
      homeId: n,
      measuredReductionCfm50: 50 * n - (n % 2 ? 0 : 20 * n),
      estimatedByType: { attic: 50 * n, ...(n % 2 ? {} : { rim: 20 * n }) },
    }));
    const fit = fitRealization(homes, { seed: 2, resamples: 100 });
    const rim = fit.types.find((type) => type.typeId === 'rim')!;
    expect(rim).toMatchObject({ factor: 0, status: 'at-zero' });
    expect(rim.interval!.low).toBe(0);
  });

  it('gives home rates, the program rate and single-type ratios as the sums worked here', () => {
    const homes: TestedHome[] = [
      { homeId: 7, measuredReductionCfm50: 120, estimatedByType: { attic: 200 } },
      { homeId: 8, measuredReductionCfm50: 90, estimatedByType: { attic: 100, rim: 50 } },
      { homeId: 9, measuredReductionCfm50: -10, estimatedByType: { rim: 0 } },
      { homeId: 3, measuredReductionCfm50: 60, estimatedByType: { attic: 100 } },
    ];
    const fit = fitRealization(homes, { seed: 0, resamples: 20 });
    expect(fit.homes.map((home) => home.rate)).toEqual([120 / 200, 90 / 150, null, 60 / 100]);
    expect(fit.homes[1]!.estimatedReductionCfm50).toBe(150);
    // Homes with an estimate: (120 + 90 + 60) / (200 + 150 + 100).
    expect(fit.programRate).toBeCloseTo(270 / 450, 15);
    const attic = fit.types.find((type) => type.typeId === 'attic')!;
    expect(attic.singleTypeRatio).toBeCloseTo((120 + 60) / (200 + 100), 15);
    expect(attic.singleTypeHomes).toBe(2);
    expect(fit.types.find((type) => type.typeId === 'rim')!.singleTypeRatio).toBeNull();
  });
});

describe('applying a factor to a new estimate', () => {
  const fit = fitRealization(syntheticHomes(40, NOISE_CFM50, 15), { seed: 8, resamples: 100 });
  const duct = fit.types.find((type) => type.typeId === 'duct-seal')!;
  const basis = { label: 'Synthetic test-outs', date: '2024-06-11' };

  it('multiplies each bound and records what was applied, reversibly', () => {
    const range = { low: 100, likely: 150, high: 240 };
    expect(calibrateRange(range, 0.5)).toEqual({ low: 50, likely: 75, high: 120 });
    const record = applyCalibration(range, duct, basis);
    expect(record.calibratedCfm50).toEqual({
      low: 100 * duct.factor!,
      likely: 150 * duct.factor!,
      high: 240 * duct.factor!,
    });
    expect(record).toMatchObject({ typeId: 'duct-seal', homes: duct.homes, basis });
    expect(record.interval).toEqual(duct.interval);
    const stored = JSON.parse(JSON.stringify(record));
    expect(revertCalibration(stored)).toEqual(range);
    expect(range).toEqual({ low: 100, likely: 150, high: 240 });
  });

  it('refuses an undetermined factor and a bad range or basis', () => {
    const undetermined = { ...duct, factor: null, status: 'undetermined' as const };
    const range = { low: 1, likely: 2, high: 3 };
    expectInputError(
      () => applyCalibration(range, undetermined, basis),
      'realization.factor',
      /undetermined/,
    );
    expectInputError(
      () => calibrateRange({ low: 3, likely: 2, high: 1 }, 1),
      'rangeCfm50',
      /low ≤ likely/,
    );
    expectInputError(() => calibrateRange({ ...range, high: NaN }, 1), 'rangeCfm50.high', /finite/);
    expectInputError(() => calibrateRange(range, -0.1), 'factor', /at least 0/);
    expectInputError(
      () => applyCalibration(range, duct, { ...basis, date: '11/06/2024' }),
      'basis.date',
      /YYYY-MM-DD/,
    );
    expectInputError(
      () => applyCalibration(range, duct, { ...basis, label: ' ' }),
      'basis.label',
      /label/,
    );
  });
});

describe('bad input names the field', () => {
  const homes = syntheticHomes(5, NOISE_CFM50, 16);
  const fit = (list: TestedHome[], options: Record<string, unknown> = {}) =>
    fitRealization(list, { seed: 1, resamples: 10, ...options });
  it('refuses a home, a type or a setting that cannot be used', () => {
    const bad = structuredClone(homes);
    bad[3]!.measuredReductionCfm50 = NaN;
    expectInputError(() => fit(bad), 'homes[3].measuredReductionCfm50', /finite number of CFM50/);
    const negative = structuredClone(homes);
    negative[1]!.estimatedByType = { rim: -5 };
    expectInputError(() => fit(negative), 'homes[1].estimatedByType.rim', /at least 0 CFM50/);
    const repeated = [...homes, { ...homes[0]! }];
    expectInputError(() => fit(repeated), 'homes[5].homeId', /also homes\[0\]/);
    expectInputError(() => fit(homes, { seed: -1 }), 'seed', /whole number/);
    expectInputError(() => fit(homes, { resamples: 0 }), 'resamples', /from 1/);
    expectInputError(() => fit(homes, { level: 1 }), 'level', /between 0 and 1/);
    expectInputError(() => fit(homes, { typeIds: ['rim', 'rim'] }), 'typeIds[1]', /twice/);
  });

  it('takes no homes without complaint: every type undetermined', () => {
    const result = fit([], { typeIds: ['rim'] });
    expect(result.types).toMatchObject([{ typeId: 'rim', factor: null, interval: null }]);
    expect(result.programRate).toBeNull();
  });
});
