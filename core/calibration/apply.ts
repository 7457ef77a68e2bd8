/**
 * Applying a realization factor to a new estimate: every bound of a low / likely / high CFM50
 * range times the factor, and a record of what was applied (the type, the factor, its homes
 * and interval, the basis it came from, the range before and after) to be stored with a plan.
 * The record keeps the range as it was, so taking the calibration back returns it exactly
 * (dividing by the factor would not, and cannot for a factor of 0).
 *
 * Only the factor scales the range; its interval is recorded, not folded into the bounds.
 */
import { InputError } from '../errors.ts';
import type { Range } from '../schema.ts';
import type { FactorInterval, TypeRealization } from './realization.ts';

/** Which fit a factor came from: a label people read, and the day it was fitted. */
export interface CalibrationBasis {
  /** E.g. "Test-outs of 2024, 212 homes". */
  label: string;
  /** The fit's date as YYYY-MM-DD (the core has no clock; the caller gives it). */
  date: string;
}

/** A calibration as applied to one estimate: pure data, reversible with `revertCalibration`. */
export interface CalibrationRecord {
  typeId: string;
  /** Measured CFM50 per estimated CFM50 (≥ 0). */
  factor: number;
  /** Homes the factor was fitted on that had the type (n). */
  homes: number;
  /** Fewer homes than the threshold to trust the factor (see `FEW_HOMES_THRESHOLD`). */
  fewHomes: boolean;
  interval: FactorInterval | null;
  basis: CalibrationBasis;
  /** The estimate before, CFM50. */
  originalCfm50: Range;
  /** The estimate after: each bound times the factor, CFM50. */
  calibratedCfm50: Range;
}

const ISO_DATE = /^\d{4}-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/;

function checkedRange(path: string, range: Range): Range {
  if (range === null || typeof range !== 'object') {
    throw InputError.at(path, 'expected a low / likely / high range of CFM50');
  }
  for (const bound of ['low', 'likely', 'high'] as const) {
    const value = range[bound];
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      throw InputError.at(`${path}.${bound}`, `expected a finite number of CFM50, got ${value}`);
    }
  }
  if (!(range.low <= range.likely && range.likely <= range.high)) {
    throw InputError.at(
      path,
      `expected low ≤ likely ≤ high, got ${range.low} / ${range.likely} / ${range.high}`,
    );
  }
  return { low: range.low, likely: range.likely, high: range.high };
}

function checkedFactor(path: string, factor: number | null): number {
  if (factor === null) {
    throw InputError.at(path, 'the factor is undetermined: the test-outs do not fix it');
  }
  if (typeof factor !== 'number' || !Number.isFinite(factor) || factor < 0) {
    throw InputError.at(path, `expected a factor of at least 0, got ${factor}`);
  }
  return factor;
}

function checkedBasis(basis: CalibrationBasis): CalibrationBasis {
  if (basis === null || typeof basis !== 'object') {
    throw InputError.at('basis', 'expected the label and date of the fit');
  }
  if (typeof basis.label !== 'string' || basis.label.trim() === '') {
    throw InputError.at('basis.label', 'expected a label saying which test-outs were fitted');
  }
  if (typeof basis.date !== 'string' || !ISO_DATE.test(basis.date)) {
    throw InputError.at('basis.date', `expected a date as YYYY-MM-DD, got ${String(basis.date)}`);
  }
  return { label: basis.label, date: basis.date };
}

/**
 * A CFM50 range with each bound times the factor.
 *
 * @param rangeCfm50 - the estimate, CFM50 (low ≤ likely ≤ high)
 * @param factor - measured CFM50 per estimated CFM50, at least 0
 * @returns {low·f, likely·f, high·f}, CFM50; the order holds since f ≥ 0
 * @throws InputError at `rangeCfm50…` or `factor`
 */
export function calibrateRange(rangeCfm50: Range, factor: number): Range {
  const range = checkedRange('rangeCfm50', rangeCfm50);
  const checked = checkedFactor('factor', factor);
  return { low: range.low * checked, likely: range.likely * checked, high: range.high * checked };
}

/**
 * Applies a type's fitted factor to an estimate and records what was applied.
 *
 * @param rangeCfm50 - the estimate of a measure of that type, CFM50
 * @param realization - the type's result from `fitRealization`
 * @param basis - which fit it is, and its date
 * @returns the record, with the range before and after
 * @throws InputError at `rangeCfm50…`, `realization.factor` (undetermined), `basis.label`,
 *   `basis.date`
 */
export function applyCalibration(
  rangeCfm50: Range,
  realization: TypeRealization,
  basis: CalibrationBasis,
): CalibrationRecord {
  const originalCfm50 = checkedRange('rangeCfm50', rangeCfm50);
  const factor = checkedFactor('realization.factor', realization.factor);
  return {
    typeId: realization.typeId,
    factor,
    homes: realization.homes,
    fewHomes: realization.fewHomes,
    interval: realization.interval ? { ...realization.interval } : null,
    basis: checkedBasis(basis),
    originalCfm50,
    calibratedCfm50: calibrateRange(originalCfm50, factor),
  };
}

/**
 * Takes a calibration back.
 *
 * @param record - as `applyCalibration` made it (and as stored with a plan)
 * @returns the estimate as it was before, CFM50 (a copy)
 * @throws InputError at `record.originalCfm50…` when the stored range is not one
 */
export function revertCalibration(record: CalibrationRecord): Range {
  return checkedRange('record.originalCfm50', record.originalCfm50);
}
