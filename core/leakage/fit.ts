/**
 * The envelope's power law from a blower-door test: the least-squares fit of a multipoint
 * test with its uncertainty and warnings, and the one-point shortcut.
 *
 * A blower door measures how much air the fan moves to hold the house at a pressure. Over
 * the test range the flow follows Q = C·ΔPⁿ; C says how leaky the house is, n what kind of
 * holes it has (0.5 for sharp orifices, 1 for long narrow cracks).
 */
import { DEFAULT_FLOW_EXPONENT, TEST_PRESSURE_PA } from '../constants.ts';
import { requirePositive } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import type { InputProblem } from '../errors.ts';
import { requireExponent } from './flow-exponent.ts';

/** One reading of a multipoint test: the house pressure held and the fan flow it took. */
export interface BlowerDoorPoint {
  /** Indoor–outdoor pressure difference, Pa (magnitude). */
  pressurePa: number;
  /** Fan flow, cfm, already corrected to the air density the test is reported at. */
  flowCfm: number;
}

/** Something about a test that does not stop the calculation but should be looked at. */
export interface LeakageWarning {
  code: 'exponent-out-of-range' | 'few-points' | 'narrow-pressure-span';
  message: string;
}

/** The power law Q = C·ΔPⁿ that describes the envelope, with how well the data pin it down. */
export interface LeakageFit {
  /** C, cfm/Paⁿ. */
  coefficientCfmPerPaN: number;
  /** n, dimensionless. */
  exponentN: number;
  /** Flow at 50 Pa from the fitted law, cfm. */
  cfm50: number;
  pointCount: number;
  /** Standard error of ln C; null when the data leave no degrees of freedom (≤ 2 points). */
  standardErrorLnC: number | null;
  /** Standard error of n; null when the data leave no degrees of freedom (≤ 2 points). */
  standardErrorN: number | null;
  /** R² of the fit in log-log space; null when it cannot say anything (≤ 2 points). */
  rSquared: number | null;
  /** 95 % confidence band of the fitted CFM50, cfm; null with ≤ 2 points. */
  cfm50Low95: number | null;
  cfm50High95: number | null;
  warnings: LeakageWarning[];
}

/** Flow exponents real envelopes show. Published: ASTM E779 (n between 0.5 and 1). */
const EXPONENT_PLAUSIBLE_MIN = 0.5;
const EXPONENT_PLAUSIBLE_MAX = 1;

/** Fewer points than this and the fit's uncertainty is itself poorly known. Common practice. */
const RECOMMENDED_MIN_POINTS = 5;

/** A multipoint test should span at least this pressure range, Pa. Common practice. */
const RECOMMENDED_MIN_SPAN_PA = 30;

/**
 * Two-sided 95 % critical values of Student's t by degrees of freedom, 1–30, then 40, 60,
 * 120 and ∞. Published: NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.2.
 */
const T_975_BY_DF = [
  12.706, 4.303, 3.182, 2.776, 2.571, 2.447, 2.365, 2.306, 2.262, 2.228, 2.201, 2.179, 2.16, 2.145,
  2.131, 2.12, 2.11, 2.101, 2.093, 2.086, 2.08, 2.074, 2.069, 2.064, 2.06, 2.056, 2.052, 2.048,
  2.045, 2.042,
];
const T_975_TAIL: readonly (readonly [number, number])[] = [
  [30, 2.042],
  [40, 2.021],
  [60, 2.0],
  [120, 1.98],
  [Infinity, 1.96],
];

/** t₀.₉₇₅; beyond 30 df the table is interpolated linearly in 1/df, as such tables intend. */
function tCritical95(degreesOfFreedom: number): number {
  const tabulated = T_975_BY_DF[degreesOfFreedom - 1];
  if (tabulated !== undefined) return tabulated;
  for (let i = 1; i < T_975_TAIL.length; i++) {
    const [dfHigh, tHigh] = T_975_TAIL[i]!;
    if (degreesOfFreedom <= dfHigh) {
      const [dfLow, tLow] = T_975_TAIL[i - 1]!;
      const share = (1 / dfLow - 1 / degreesOfFreedom) / (1 / dfLow - 1 / dfHigh);
      return tLow + share * (tHigh - tLow);
    }
  }
  return 1.96;
}

function exponentWarning(exponentN: number): LeakageWarning[] {
  if (exponentN >= EXPONENT_PLAUSIBLE_MIN && exponentN <= EXPONENT_PLAUSIBLE_MAX) return [];
  return [
    {
      code: 'exponent-out-of-range',
      message: `flow exponent ${exponentN.toFixed(3)} is outside 0.5–1.0; check the readings (wind, a door that moved, a gauge zero)`,
    },
  ];
}

type FitUncertainty = Pick<
  LeakageFit,
  'standardErrorLnC' | 'standardErrorN' | 'rSquared' | 'cfm50Low95' | 'cfm50High95'
>;

/** What a fit with no spare degrees of freedom (or a one-point test) can say about itself. */
const NO_UNCERTAINTY: FitUncertainty = {
  standardErrorLnC: null,
  standardErrorN: null,
  rSquared: null,
  cfm50Low95: null,
  cfm50High95: null,
};

/** Warnings about how the readings were taken: too few, or too close together. */
function samplingWarnings(points: readonly BlowerDoorPoint[]): LeakageWarning[] {
  const warnings: LeakageWarning[] = [];
  if (points.length < RECOMMENDED_MIN_POINTS) {
    warnings.push({
      code: 'few-points',
      message: `${points.length} readings; take at least ${RECOMMENDED_MIN_POINTS} so the fit's uncertainty means something`,
    });
  }
  const pressures = points.map((point) => point.pressurePa);
  const spanPa = Math.max(...pressures) - Math.min(...pressures);
  if (spanPa < RECOMMENDED_MIN_SPAN_PA) {
    warnings.push({
      code: 'narrow-pressure-span',
      message: `readings span ${spanPa.toFixed(1)} Pa; spread them over at least ${RECOMMENDED_MIN_SPAN_PA} Pa so n is pinned down`,
    });
  }
  return warnings;
}

function validatePoints(points: readonly BlowerDoorPoint[]): void {
  if (points.length < 2) {
    throw InputError.at('points', `expected at least 2 readings, got ${points.length}`);
  }
  const problems: InputProblem[] = [];
  points.forEach((point, i) => {
    if (!Number.isFinite(point.pressurePa) || point.pressurePa <= 0) {
      problems.push({
        path: `points[${i}].pa`,
        message: `expected a pressure greater than 0 Pa, got ${point.pressurePa}`,
      });
    }
    if (!Number.isFinite(point.flowCfm) || point.flowCfm <= 0) {
      problems.push({
        path: `points[${i}].cfm`,
        message: `expected a flow greater than 0 cfm, got ${point.flowCfm}`,
      });
    }
  });
  if (problems.length > 0) throw new InputError(problems);
  if (points.every((point) => point.pressurePa === points[0]!.pressurePa)) {
    throw InputError.at('points', 'expected readings at two or more different pressures');
  }
}

/**
 * Fits the envelope's power law to a multipoint blower-door test.
 *
 * @param points - readings, each a pressure (Pa) and a fan flow (cfm); at least 2, at two or
 *   more different pressures
 * @returns C (cfm/Paⁿ), n, CFM50 (cfm), standard errors of ln C and n, R², the 95 % band of
 *   CFM50 (cfm), and warnings
 *
 * Notes: ordinary least squares of y = ln Q on x = ln ΔP: n = Sxy/Sxx, ln C = ȳ − n·x̄.
 * With s² = SSE/(N − 2): SE(n) = s/√Sxx, SE(ln C) = s·√(1/N + x̄²/Sxx), and the band of
 * ln Q at x₅₀ = ln 50 is ± t₀.₉₇₅(N − 2)·s·√(1/N + (x₅₀ − x̄)²/Sxx).
 *
 * References: ASTM E779 (Determining Air Leakage Rate by Fan Pressurization), regression and
 * confidence limits; CGSB-149.10; ANSI/RESNET/ICC 380.
 */
export function fitMultipointTest(points: readonly BlowerDoorPoint[]): LeakageFit {
  validatePoints(points);
  const count = points.length;
  const xs = points.map((point) => Math.log(point.pressurePa));
  const ys = points.map((point) => Math.log(point.flowCfm));
  const meanX = xs.reduce((sum, x) => sum + x, 0) / count;
  const meanY = ys.reduce((sum, y) => sum + y, 0) / count;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  xs.forEach((x, i) => {
    const dy = ys[i]! - meanY;
    sxx += (x - meanX) ** 2;
    sxy += (x - meanX) * dy;
    syy += dy ** 2;
  });
  const exponentN = sxy / sxx;
  const lnC = meanY - exponentN * meanX;
  const coefficientCfmPerPaN = Math.exp(lnC);
  const cfm50 = coefficientCfmPerPaN * TEST_PRESSURE_PA ** exponentN;

  const sse = xs.reduce((sum, x, i) => sum + (ys[i]! - lnC - exponentN * x) ** 2, 0);
  const degreesOfFreedom = count - 2;
  let uncertainty = NO_UNCERTAINTY;
  if (degreesOfFreedom > 0) {
    const s = Math.sqrt(sse / degreesOfFreedom);
    const x50 = Math.log(TEST_PRESSURE_PA);
    const halfWidthLn =
      tCritical95(degreesOfFreedom) * s * Math.sqrt(1 / count + (x50 - meanX) ** 2 / sxx);
    uncertainty = {
      standardErrorLnC: s * Math.sqrt(1 / count + meanX ** 2 / sxx),
      standardErrorN: s / Math.sqrt(sxx),
      // All flows equal: there is no spread to explain, so R² says nothing.
      rSquared: syy > 0 ? 1 - sse / syy : null,
      cfm50Low95: cfm50 * Math.exp(-halfWidthLn),
      cfm50High95: cfm50 * Math.exp(halfWidthLn),
    };
  }
  const warnings = [...exponentWarning(exponentN), ...samplingWarnings(points)];
  return { coefficientCfmPerPaN, exponentN, cfm50, pointCount: count, ...uncertainty, warnings };
}

/**
 * The power law of a one-point test: CFM50 measured, n assumed.
 *
 * @param cfm50 - flow at 50 Pa, cfm
 * @param exponentN - assumed flow exponent (default 0.65)
 * @returns the fit with C = CFM50/50ⁿ (cfm/Paⁿ); no uncertainty is known
 *
 * Notes: C = Q₅₀ / 50ⁿ.
 *
 * References: ASTM E1827 and ANSI/RESNET/ICC 380 (single-point test, n = 0.65 assumed; the
 * default is from memory).
 */
export function onePointTest(cfm50: number, exponentN = DEFAULT_FLOW_EXPONENT): LeakageFit {
  requirePositive('cfm50', cfm50);
  requireExponent('exponentN', exponentN);
  return {
    coefficientCfmPerPaN: cfm50 / TEST_PRESSURE_PA ** exponentN,
    exponentN,
    cfm50,
    pointCount: 1,
    ...NO_UNCERTAINTY,
    warnings: exponentWarning(exponentN),
  };
}
