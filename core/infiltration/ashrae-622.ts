/**
 * The ventilation check of ANSI/ASHRAE Standard 62.2 (2016/2019): how much outdoor air a
 * dwelling needs, how much of it infiltration already supplies, and what a fan must add.
 *
 * This is the safety side of air sealing: every cfm sealed is a cfm a fan may have to make
 * up, and a tight house with no ventilation is a health problem, not a success.
 */
import { requireNonNegative, requirePositive } from '../_lib/checks.ts';
import { InputError } from '../errors.ts';

/** Floor-area and occupant rates of the total ventilation rate. Published: 62.2 §4.1. */
const VENTILATION_CFM_PER_FT2 = 0.03;
const VENTILATION_CFM_PER_OCCUPANT = 7.5;

/**
 * Coefficient of the effective annual infiltration rate, and its reference height and
 * height exponent. Published: 62.2-2016 §4.1.2 (Q_inf = 0.052·Q50·wsf·(H/H_r)^z,
 * H_r = 8.2 ft, z = 0.4).
 */
const INFILTRATION_COEFFICIENT = 0.052;
const REFERENCE_HEIGHT_FT = 8.2;
const HEIGHT_EXPONENT = 0.4;

/**
 * Share of a dwelling's envelope exposed to outdoors, A_ext. Published: 62.2 §4.1.2, 1 for a
 * detached house; attached dwellings get less infiltration credit, and this module does not
 * yet model them.
 */
const EXPOSED_ENVELOPE_SHARE_DETACHED = 1;

/**
 * Total ventilation rate a dwelling needs.
 *
 * @param options.floorAreaFt2 - conditioned floor area, ft²
 * @param options.bedrooms - number of bedrooms (whole number, at least 0)
 * @returns Q_tot, cfm
 *
 * Notes: Q_tot = 0.03·A_floor + 7.5·(N_br + 1); occupants are taken as bedrooms + 1.
 *
 * References: ANSI/ASHRAE Standard 62.2-2016 and -2019, §4.1 (total ventilation rate).
 */
export function requiredVentilationCfm(options: {
  floorAreaFt2: number;
  bedrooms: number;
}): number {
  requirePositive('floorAreaFt2', options.floorAreaFt2);
  if (!Number.isInteger(options.bedrooms) || options.bedrooms < 0) {
    throw InputError.at(
      'bedrooms',
      `expected a whole number of at least 0, got ${options.bedrooms}`,
    );
  }
  return (
    VENTILATION_CFM_PER_FT2 * options.floorAreaFt2 +
    VENTILATION_CFM_PER_OCCUPANT * (options.bedrooms + 1)
  );
}

/**
 * Effective annual average infiltration from a blower-door test.
 *
 * @param options.cfm50 - flow at 50 Pa, cfm
 * @param options.wsf - weather and shielding factor of the nearest station, 1/h (from the
 *   standard's normative appendix; never guessed)
 * @param options.heightFt - vertical distance between the lowest and highest above-grade
 *   points of the pressure boundary, ft
 * @returns Q_inf, cfm
 *
 * Notes: Q_inf = 0.052·Q50·wsf·(H/8.2 ft)^0.4.
 *
 * References: ANSI/ASHRAE Standard 62.2-2016 and -2019, §4.1.2 (infiltration credit) and
 * normative appendix (wsf).
 */
export function effectiveAnnualInfiltrationCfm(options: {
  cfm50: number;
  wsf: number;
  heightFt: number;
}): number {
  requireNonNegative('cfm50', options.cfm50);
  requirePositive('wsf', options.wsf);
  requirePositive('heightFt', options.heightFt);
  return (
    INFILTRATION_COEFFICIENT *
    options.cfm50 *
    options.wsf *
    (options.heightFt / REFERENCE_HEIGHT_FT) ** HEIGHT_EXPONENT
  );
}

/**
 * The continuous fan flow still needed once infiltration is credited, detached dwelling.
 *
 * @param options.requiredCfm - total ventilation rate Q_tot, cfm
 * @param options.infiltrationCfm - effective annual infiltration Q_inf, cfm
 * @param options.balanced - whether the fan system is balanced (supply = exhaust)
 * @returns Q_fan, cfm (never below 0)
 *
 * Notes: Q_fan = max(0, Q_tot − Φ·Q_inf·A_ext), Φ = 1 for balanced systems and Q_inf/Q_tot
 * for unbalanced ones, A_ext = 1 (detached). An unbalanced fan gets less credit because it
 * pushes or pulls through the same holes infiltration uses.
 *
 * References: ANSI/ASHRAE Standard 62.2-2016 and -2019, §4.1.2.
 */
export function ventilationFanNeedCfm(options: {
  requiredCfm: number;
  infiltrationCfm: number;
  balanced: boolean;
}): number {
  const { requiredCfm, infiltrationCfm } = options;
  requirePositive('requiredCfm', requiredCfm);
  requireNonNegative('infiltrationCfm', infiltrationCfm);
  const superposition = options.balanced ? 1 : infiltrationCfm / requiredCfm;
  return Math.max(
    0,
    requiredCfm - superposition * infiltrationCfm * EXPOSED_ENVELOPE_SHARE_DETACHED,
  );
}

/**
 * Outdoor air of a house with infiltration and fans running together.
 *
 * @param options.infiltrationCfm - natural infiltration, cfm
 * @param options.balancedFanCfm - balanced ventilation (supply and exhaust equal), cfm
 * @param options.unbalancedFanCfm - net unbalanced fan flow (exhaust or supply only), cfm
 * @returns combined outdoor air flow, cfm
 *
 * Notes: Q = Q_bal + √(Q_unbal² + Q_inf²). A balanced fan adds its whole flow; an
 * unbalanced one adds in quadrature, because it changes the house pressure that drives
 * infiltration.
 *
 * References: ASHRAE Handbook of Fundamentals 2009, ch. 16 (Ventilation and infiltration),
 * superposition of infiltration and mechanical ventilation.
 */
export function combinedAirflowCfm(options: {
  infiltrationCfm: number;
  balancedFanCfm: number;
  unbalancedFanCfm: number;
}): number {
  requireNonNegative('infiltrationCfm', options.infiltrationCfm);
  requireNonNegative('balancedFanCfm', options.balancedFanCfm);
  requireNonNegative('unbalancedFanCfm', options.unbalancedFanCfm);
  return options.balancedFanCfm + Math.hypot(options.unbalancedFanCfm, options.infiltrationCfm);
}
