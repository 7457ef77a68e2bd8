/**
 * The figures the trade derives from a blower-door result: the leakage area at a reference
 * pressure (ELA, EqLA) and its inverse, and the leakage scaled to the house (ACH50,
 * normalized leakage, CFM50 per square foot of envelope, and the envelope area estimate
 * they need).
 */
import {
  AIR_DENSITY_STANDARD_KG_PER_M3,
  CUBIC_METERS_PER_SECOND_PER_CFM,
  MINUTES_PER_HOUR,
  SQUARE_CM_PER_SQUARE_INCH,
  TEST_PRESSURE_PA,
} from '../constants.ts';
import { requireAtLeast, requireNonNegative, requirePositive } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';
import { requireExponent } from './flow-exponent.ts';

/** ELA: 4 Pa, C_D = 1 (LBL). Published: ASHRAE HoF ventilation and infiltration chapter. */
const ELA_REFERENCE_PRESSURE_PA = 4;
const ELA_DISCHARGE_COEFFICIENT = 1;

/** EqLA: 10 Pa, C_D = 0.611 (sharp-edged orifice). From memory: CGSB-149.10. */
const EQLA_REFERENCE_PRESSURE_PA = 10;
const EQLA_DISCHARGE_COEFFICIENT = 0.611;

const SQUARE_METERS_PER_SQUARE_INCH = SQUARE_CM_PER_SQUARE_INCH / 10_000;
const SQUARE_INCHES_PER_SQUARE_FOOT = 144;

/** Reference story height of normalized leakage, ft (2.5 m). Published: ASHRAE Std 119. */
const NL_REFERENCE_HEIGHT_FT = 8.2;
/** Height exponent of normalized leakage. From memory: ASHRAE Std 119. */
const NL_HEIGHT_EXPONENT = 0.3;

/**
 * Air changes per hour at 50 Pa.
 *
 * @param cfm50 - flow at 50 Pa, cfm
 * @param volumeFt3 - conditioned volume inside the pressure boundary, ft³
 * @returns ACH50, 1/h
 *
 * Notes: ACH50 = CFM50·60 / V.
 *
 * References: ANSI/RESNET/ICC 380 (definition of ACH50); ASTM E779.
 */
export function ach50(cfm50: number, volumeFt3: number): number {
  requireNonNegative('cfm50', cfm50);
  requirePositive('volumeFt3', volumeFt3);
  return (cfm50 * MINUTES_PER_HOUR) / volumeFt3;
}

/**
 * The area of a single orifice that would pass the envelope's flow at a reference pressure.
 *
 * @param options.cfm50 - flow at 50 Pa, cfm
 * @param options.exponentN - flow exponent
 * @param options.referencePressurePa - reference pressure ΔP_r, Pa
 * @param options.dischargeCoefficient - orifice discharge coefficient C_D
 * @param options.airDensityKgPerM3 - air density ρ, kg/m³ (default 1.2)
 * @returns leakage area, in²
 *
 * Notes: A_L = Q_r·√(ρ/(2·ΔP_r)) / C_D, Q_r = C·ΔP_rⁿ = CFM50·(ΔP_r/50)ⁿ, worked in m³/s
 * and m², then converted to in².
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter
 * (effective leakage area).
 */
export function leakageAreaIn2(options: {
  cfm50: number;
  exponentN: number;
  referencePressurePa: number;
  dischargeCoefficient: number;
  airDensityKgPerM3?: number;
}): number {
  const { cfm50, exponentN, referencePressurePa, dischargeCoefficient } = options;
  const densityKgPerM3 = options.airDensityKgPerM3 ?? AIR_DENSITY_STANDARD_KG_PER_M3;
  requireNonNegative('cfm50', cfm50);
  requireExponent('exponentN', exponentN);
  requirePositive('referencePressurePa', referencePressurePa);
  if (
    !Number.isFinite(dischargeCoefficient) ||
    dischargeCoefficient <= 0 ||
    dischargeCoefficient > 1
  ) {
    throw InputError.at(
      'dischargeCoefficient',
      `expected a number greater than 0 and at most 1, got ${dischargeCoefficient}`,
    );
  }
  requirePositive('airDensityKgPerM3', densityKgPerM3);
  const flowAtReferenceM3PerS =
    cfm50 * (referencePressurePa / TEST_PRESSURE_PA) ** exponentN * CUBIC_METERS_PER_SECOND_PER_CFM;
  const areaM2 =
    (flowAtReferenceM3PerS * Math.sqrt(densityKgPerM3 / (2 * referencePressurePa))) /
    dischargeCoefficient;
  return areaM2 / SQUARE_METERS_PER_SQUARE_INCH;
}

/**
 * Effective leakage area (LBL): the leakage area at 4 Pa with C_D = 1, at ρ = 1.2 kg/m³.
 *
 * @param cfm50 - flow at 50 Pa, cfm
 * @param exponentN - flow exponent
 * @returns ELA, in²
 *
 * Notes: A_L = Q₄·√(ρ/(2·4 Pa)), Q₄ = CFM50·(4/50)ⁿ.
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter;
 * Sherman & Grimsrud 1980, ASHRAE Transactions 86(2).
 */
export function elaIn2(cfm50: number, exponentN: number): number {
  return leakageAreaIn2({
    cfm50,
    exponentN,
    referencePressurePa: ELA_REFERENCE_PRESSURE_PA,
    dischargeCoefficient: ELA_DISCHARGE_COEFFICIENT,
  });
}

/**
 * Equivalent leakage area (Canadian practice): the leakage area at 10 Pa with C_D = 0.611.
 *
 * @param cfm50 - flow at 50 Pa, cfm
 * @param exponentN - flow exponent
 * @returns EqLA, in²
 *
 * Notes: A_L = Q₁₀·√(ρ/(2·10 Pa)) / 0.611, Q₁₀ = CFM50·(10/50)ⁿ, ρ = 1.2 kg/m³.
 *
 * References: CGSB-149.10 (reference pressure and C_D from memory); ASHRAE Handbook of
 * Fundamentals, ventilation and infiltration chapter.
 */
export function eqlaIn2(cfm50: number, exponentN: number): number {
  return leakageAreaIn2({
    cfm50,
    exponentN,
    referencePressurePa: EQLA_REFERENCE_PRESSURE_PA,
    dischargeCoefficient: EQLA_DISCHARGE_COEFFICIENT,
  });
}

/**
 * The CFM50 that a given ELA stands for: the exact inverse of {@link elaIn2}, used to turn a
 * component's leakage area into blower-door terms.
 *
 * @param elaIn2 - effective leakage area at 4 Pa, in²
 * @param exponentN - flow exponent
 * @returns flow at 50 Pa, cfm
 *
 * Notes: ELA is proportional to CFM50 at a fixed n, so CFM50 = ELA / ELA(1 cfm50, n).
 *
 * References: ASHRAE Handbook of Fundamentals, ventilation and infiltration chapter.
 */
export function cfm50FromElaIn2(elaIn2: number, exponentN: number): number {
  requireNonNegative('elaIn2', elaIn2);
  const elaOfOneCfm50In2 = leakageAreaIn2({
    cfm50: 1,
    exponentN,
    referencePressurePa: ELA_REFERENCE_PRESSURE_PA,
    dischargeCoefficient: ELA_DISCHARGE_COEFFICIENT,
  });
  return elaIn2 / elaOfOneCfm50In2;
}

/**
 * Normalized leakage: ELA per floor area, scaled to a one-story house.
 *
 * @param options.elaIn2 - effective leakage area, in²
 * @param options.floorAreaFt2 - conditioned floor area, ft²
 * @param options.heightFt - building height (stack height), ft
 * @returns NL, dimensionless
 *
 * Notes: NL = 1000·(ELA/A_floor)·(H/8.2 ft)^0.3, ELA and A_floor in the same units.
 * ASHRAE 62.2-2013 uses the same form with exponent 0.4 for its own purposes.
 *
 * References: ASHRAE Standard 119 (Air Leakage Performance for Detached Single-Family
 * Residential Buildings); the 0.3 exponent is from memory.
 */
export function normalizedLeakage(options: {
  elaIn2: number;
  floorAreaFt2: number;
  heightFt: number;
}): number {
  requireNonNegative('elaIn2', options.elaIn2);
  requirePositive('floorAreaFt2', options.floorAreaFt2);
  requirePositive('heightFt', options.heightFt);
  const elaFt2 = options.elaIn2 / SQUARE_INCHES_PER_SQUARE_FOOT;
  return (
    1000 *
    (elaFt2 / options.floorAreaFt2) *
    (options.heightFt / NL_REFERENCE_HEIGHT_FT) ** NL_HEIGHT_EXPONENT
  );
}

/**
 * CFM50 per square foot of the pressure boundary's surface.
 *
 * @param cfm50 - flow at 50 Pa, cfm
 * @param envelopeAreaFt2 - area of the pressure boundary (walls, ceiling, floor), ft²
 * @returns cfm per ft² at 50 Pa
 *
 * Notes: q₅₀ = CFM50 / A_envelope.
 *
 * References: common practice (envelope-normalized leakage used by codes and programs).
 */
export function cfm50PerEnvelopeFt2(cfm50: number, envelopeAreaFt2: number): number {
  requireNonNegative('cfm50', cfm50);
  requirePositive('envelopeAreaFt2', envelopeAreaFt2);
  return cfm50 / envelopeAreaFt2;
}

/**
 * The envelope area of a house, estimated as a box when it was not measured.
 *
 * @param options.floorAreaFt2 - conditioned floor area, all stories, ft²
 * @param options.stories - stories above grade (at least 1)
 * @param options.heightFt - height of the walls of the pressure boundary, ft
 * @returns envelope area, ft²
 *
 * Notes: footprint = A_floor / stories, taken square; walls = 4·√footprint·H; area = walls
 * + ceiling + floor = walls + 2·footprint. Real houses are longer than square and have bays
 * and ells, so this is a floor on the true area.
 *
 * References: common practice approximation.
 */
export function estimateEnvelopeAreaFt2(options: {
  floorAreaFt2: number;
  stories: number;
  heightFt: number;
}): number {
  requirePositive('floorAreaFt2', options.floorAreaFt2);
  requireAtLeast('stories', options.stories, 1);
  requirePositive('heightFt', options.heightFt);
  const footprintFt2 = options.floorAreaFt2 / options.stories;
  const wallsFt2 = 4 * Math.sqrt(footprintFt2) * options.heightFt;
  return wallsFt2 + 2 * footprintFt2;
}
