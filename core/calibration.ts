/**
 * Calibration: learning from test-outs how far the audits' estimates can be trusted, and
 * correcting new estimates by it.
 *
 * An audit estimates, for each measure, how many CFM50 the work will take off the blower-door
 * reading. After the work, the test-out says how many it really took off. Over many homes the
 * two can be compared type by type: if attic air sealing, say, was estimated at 300 CFM50 a home
 * and measured at 180, its realization factor is 0.6. Because most homes get several types of
 * measure at once and only the total is measured, the factors are found together, as the
 * non-negative least-squares fit of measured = Σ factor × estimated over all the homes; a
 * bootstrap of the homes says how sure each factor is, and a type seen in few homes is flagged.
 * A type the data cannot separate from others is reported undetermined, not guessed.
 *
 * Calibrating a new estimate multiplies its low, likely and high CFM50 by the type's factor and
 * keeps a record (factor, homes, interval, which fit and when, the range before) so the plan can
 * show what was changed and take it back.
 *
 * Everything here is pure: no files, no clock, randomness only from a given seed.
 */
export {
  solveNnls,
  solveNnlsNormal,
  type DenseMatrix,
  type MatrixInput,
  type NnlsResult,
  type NormalEquations,
} from './calibration/nnls.ts';
export {
  DEFAULT_LEVEL,
  DEFAULT_RESAMPLES,
  FEW_HOMES_THRESHOLD,
  fitRealization,
  type FactorInterval,
  type FactorStatus,
  type HomeRealization,
  type RealizationFit,
  type RealizationOptions,
  type TestedHome,
  type TypeRealization,
} from './calibration/realization.ts';
export {
  applyCalibration,
  calibrateRange,
  revertCalibration,
  type CalibrationBasis,
  type CalibrationRecord,
} from './calibration/apply.ts';
