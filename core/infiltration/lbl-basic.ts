/**
 * The LBL basic infiltration model: natural air flow from the effective leakage area, the
 * indoor–outdoor temperature difference (stack effect) and the wind.
 *
 * The handbook tabulates its coefficients in SI. We keep those tables exactly as published
 * and derive the IP coefficients from them by unit conversion, so there is one source of
 * truth and the two unit systems cannot drift apart.
 */
import {
  LITERS_PER_SECOND_PER_CFM,
  METERS_PER_SECOND_PER_MPH,
  MINUTES_PER_HOUR,
  SQUARE_CM_PER_SQUARE_INCH,
} from '../constants.ts';
import { requireAtLeast, requireNonNegative, requirePositive } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import type { NaturalInfiltration, ShelterClass } from './n-factor.ts';

/**
 * Stack coefficient Cs by stories 1, 2, 3, (L/s)²/(cm⁴·K). Published: ASHRAE Handbook of
 * Fundamentals, ventilation and infiltration chapter, basic model.
 */
const STACK_COEFFICIENT_SI_BY_STORIES = [0.000145, 0.00029, 0.000435];

/**
 * Wind coefficient Cw by shelter class 1–5 (rows) and stories 1, 2, 3 (columns),
 * (L/s)²/(cm⁴·(m/s)²). Published: ASHRAE Handbook of Fundamentals, ventilation and
 * infiltration chapter, basic model.
 */
const WIND_COEFFICIENT_SI_BY_CLASS: Record<ShelterClass, readonly number[]> = {
  1: [0.000319, 0.00042, 0.000494],
  2: [0.000246, 0.000325, 0.000382],
  3: [0.000174, 0.000231, 0.000271],
  4: [0.000104, 0.000137, 0.000161],
  5: [0.000032, 0.000042, 0.000049],
};

/**
 * Q scales with area and with the square root of the coefficient, so one flow-per-area
 * factor, squared, carries the coefficients between unit systems:
 * (cm² per in²) / (L/s per cfm) turns L/s per cm² into cfm per in².
 */
const FLOW_PER_AREA_SI_TO_IP = SQUARE_CM_PER_SQUARE_INCH / LITERS_PER_SECOND_PER_CFM;

/** A temperature difference of 1 °F is 1/1.8 K. Exact by definition. */
const KELVIN_PER_FAHRENHEIT_DEGREE = 1 / 1.8;

function windRow(shelterClass: ShelterClass): readonly number[] {
  const row = WIND_COEFFICIENT_SI_BY_CLASS[shelterClass];
  if (row === undefined) {
    throw InputError.at('shelterClass', `expected a shelter class 1 to 5, got ${shelterClass}`);
  }
  return row;
}

/** Linear in stories between the 1-, 2- and 3-story columns; held at 1 and 3 outside. */
function interpolateInStories(byStories: readonly number[], stories: number): number {
  const clamped = Math.min(Math.max(stories, 1), 3);
  const lower = Math.min(Math.floor(clamped), 2);
  const share = clamped - lower;
  return byStories[lower - 1]! * (1 - share) + byStories[lower]! * share;
}

/**
 * Stack coefficient of the basic model, SI.
 *
 * @param stories - stories above grade (at least 1; interpolated between 1, 2 and 3, held
 *   at 3 above)
 * @returns Cs, (L/s)²/(cm⁴·K)
 *
 * Notes: tabulated 0.000145 / 0.000290 / 0.000435 for 1 / 2 / 3 stories.
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter (basic
 * model stack coefficient); Sherman & Grimsrud 1980, ASHRAE Transactions 86(2).
 */
export function lblStackCoefficientSi(stories: number): number {
  requireAtLeast('stories', stories, 1);
  return interpolateInStories(STACK_COEFFICIENT_SI_BY_STORIES, stories);
}

/**
 * Wind coefficient of the basic model, SI.
 *
 * @param shelterClass - LBL shelter class, 1 (no obstructions) to 5 (obstructions closer
 *   than one house height)
 * @param stories - stories above grade (at least 1; interpolated between 1, 2 and 3, held
 *   at 3 above)
 * @returns Cw, (L/s)²/(cm⁴·(m/s)²)
 *
 * Notes: tabulated by shelter class and stories; the wind speed it multiplies is the one
 * measured at the weather station.
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter (basic
 * model wind coefficient).
 */
export function lblWindCoefficientSi(shelterClass: ShelterClass, stories: number): number {
  const row = windRow(shelterClass);
  requireAtLeast('stories', stories, 1);
  return interpolateInStories(row, stories);
}

/**
 * Stack coefficient of the basic model, IP, converted from the SI table.
 *
 * @param stories - stories above grade (at least 1)
 * @returns Cs, cfm²/(in⁴·°F)
 *
 * Notes: Cs,IP = Cs,SI·(6.4516 cm²/in² ÷ 0.4719 L/s per cfm)² / 1.8.
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter.
 */
export function lblStackCoefficientIp(stories: number): number {
  return (
    lblStackCoefficientSi(stories) * FLOW_PER_AREA_SI_TO_IP ** 2 * KELVIN_PER_FAHRENHEIT_DEGREE
  );
}

/**
 * Wind coefficient of the basic model, IP, converted from the SI table.
 *
 * @param shelterClass - LBL shelter class, 1 to 5
 * @param stories - stories above grade (at least 1)
 * @returns Cw, cfm²/(in⁴·mph²)
 *
 * Notes: Cw,IP = Cw,SI·(6.4516 cm²/in² ÷ 0.4719 L/s per cfm)²·(0.44704 m/s per mph)².
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter.
 */
export function lblWindCoefficientIp(shelterClass: ShelterClass, stories: number): number {
  return (
    lblWindCoefficientSi(shelterClass, stories) *
    FLOW_PER_AREA_SI_TO_IP ** 2 *
    METERS_PER_SECOND_PER_MPH ** 2
  );
}

function requireFinite(path: string, value: number): void {
  if (!Number.isFinite(value)) {
    throw InputError.at(path, `expected a finite number, got ${value}`);
  }
}

/**
 * Natural air flow of the basic model, SI.
 *
 * @param options.elaCm2 - effective leakage area at 4 Pa, cm²
 * @param options.stackCoefficient - Cs, (L/s)²/(cm⁴·K)
 * @param options.windCoefficient - Cw, (L/s)²/(cm⁴·(m/s)²)
 * @param options.deltaTK - indoor − outdoor temperature difference, K (sign ignored)
 * @param options.windSpeedMps - wind speed at the weather station, m/s
 * @returns natural air flow, L/s
 *
 * Notes: Q = A_L·√(Cs·|ΔT| + Cw·U²).
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter (basic
 * model); Sherman & Grimsrud 1980, ASHRAE Transactions 86(2).
 */
export function lblBasicFlowLps(options: {
  elaCm2: number;
  stackCoefficient: number;
  windCoefficient: number;
  deltaTK: number;
  windSpeedMps: number;
}): number {
  const { elaCm2, stackCoefficient, windCoefficient, deltaTK, windSpeedMps } = options;
  requireNonNegative('elaCm2', elaCm2);
  requireNonNegative('stackCoefficient', stackCoefficient);
  requireNonNegative('windCoefficient', windCoefficient);
  requireFinite('deltaTK', deltaTK);
  requireNonNegative('windSpeedMps', windSpeedMps);
  return (
    elaCm2 * Math.sqrt(stackCoefficient * Math.abs(deltaTK) + windCoefficient * windSpeedMps ** 2)
  );
}

/**
 * Natural air flow of the basic model, IP.
 *
 * @param options.elaIn2 - effective leakage area at 4 Pa, in²
 * @param options.stackCoefficient - Cs, cfm²/(in⁴·°F)
 * @param options.windCoefficient - Cw, cfm²/(in⁴·mph²)
 * @param options.deltaTF - indoor − outdoor temperature difference, °F (sign ignored, so a
 *   cooling season's negative ΔT drives flow too)
 * @param options.windSpeedMph - wind speed at the weather station, mph
 * @returns natural air flow, cfm
 *
 * Notes: Q = A_L·√(Cs·|ΔT| + Cw·U²).
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter (basic
 * model); Sherman & Grimsrud 1980, ASHRAE Transactions 86(2).
 */
export function lblBasicFlowCfm(options: {
  elaIn2: number;
  stackCoefficient: number;
  windCoefficient: number;
  deltaTF: number;
  windSpeedMph: number;
}): number {
  const { elaIn2, stackCoefficient, windCoefficient, deltaTF, windSpeedMph } = options;
  requireNonNegative('elaIn2', elaIn2);
  requireNonNegative('stackCoefficient', stackCoefficient);
  requireNonNegative('windCoefficient', windCoefficient);
  requireFinite('deltaTF', deltaTF);
  requireNonNegative('windSpeedMph', windSpeedMph);
  return (
    elaIn2 * Math.sqrt(stackCoefficient * Math.abs(deltaTF) + windCoefficient * windSpeedMph ** 2)
  );
}

/**
 * Natural infiltration of a house by the basic model, with the tabulated coefficients.
 *
 * @param options.elaIn2 - effective leakage area at 4 Pa, in²
 * @param options.stories - stories above grade (at least 1)
 * @param options.shelterClass - LBL shelter class, 1 to 5
 * @param options.deltaTF - indoor − outdoor temperature difference, °F (sign ignored)
 * @param options.windSpeedMph - wind speed at the weather station, mph
 * @param options.volumeFt3 - conditioned volume, ft³
 * @returns natural flow (cfm) and air changes (1/h)
 *
 * Notes: Q = ELA·√(Cs(stories)·|ΔT| + Cw(class, stories)·U²); ACHnat = Q·60 / V.
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter (basic
 * model and its tables).
 */
export function lblBasicInfiltration(options: {
  elaIn2: number;
  stories: number;
  shelterClass: ShelterClass;
  deltaTF: number;
  windSpeedMph: number;
  volumeFt3: number;
}): NaturalInfiltration {
  const { volumeFt3 } = options;
  requirePositive('volumeFt3', volumeFt3);
  const cfmNatural = lblBasicFlowCfm({
    elaIn2: options.elaIn2,
    stackCoefficient: lblStackCoefficientIp(options.stories),
    windCoefficient: lblWindCoefficientIp(options.shelterClass, options.stories),
    deltaTF: options.deltaTF,
    windSpeedMph: options.windSpeedMph,
  });
  return { cfmNatural, achNatural: (cfmNatural * MINUTES_PER_HOUR) / volumeFt3 };
}
