/**
 * Rules about fresh air: the ASHRAE 62.2 fan need before and after the plan, the
 * infiltration credit, and how tight the plan leaves the house.
 */
import { formatNumber } from '../format.ts';
import type { SafetyContext } from './context.ts';
import { makeCaution } from './definitions.ts';
import type { Caution, CautionSeverity } from './types.ts';

/**
 * ACH50 below which the residential code calls for whole-house mechanical ventilation.
 * From memory: International Residential Code 2012, R303.4 ("5 air changes per hour ... at
 * 50 Pa").
 */
export const MECHANICAL_VENTILATION_ACH50 = 5;

/**
 * ACH50 below which a ventilation shortfall is a danger when fuel-burning appliances use
 * house air. Why 3: it is the envelope limit new houses are built to in cold climates (from
 * memory: IECC 2012 R402.4.1.2, climate zones 3–8), houses designed to get their air from a
 * fan. Left without one, such a house has too little leakage to dilute combustion gases or
 * to relieve the depressurization that makes a flue spill. A judgement, not a rule of any
 * standard; above it a shortfall stays a warning.
 */
export const VENTILATION_DANGER_ACH50 = 3;

function cfm(value: number): string {
  return `${Math.round(value)} cfm`;
}

/** Fuel-burning appliances inside that take combustion air from the house. */
function houseAirBurnerCount(context: SafetyContext): number {
  return context.burners.filter(
    (burner) => burner.insidePressureBoundary && burner.venting !== 'sealed',
  ).length;
}

/**
 * The fan needed after the plan is larger than the fan the house has.
 *
 * @param context - derived facts; fan needs and flows in cfm, ACH50 in 1/h at 50 Pa
 * @returns notice when the plan adds the fan; danger when ACH50 after is below
 *   {@link VENTILATION_DANGER_ACH50} with appliances using house air; warning otherwise;
 *   undefined when the existing fan suffices
 *
 * @remarks
 * Notes: shortfall when Q_fan,after > Q_fan,existing; Q_fan = Q_tot − credit (62.2 4.1.2).
 *
 * References: ANSI/ASHRAE Standard 62.2, sections 4.1 and 4.1.2.
 */
export function ventilationNeededRule(context: SafetyContext): Caution | undefined {
  const { requiredCfm, fanNeedAfterCfm, existingFanCfm, fanAdded } = context.input.ventilation;
  if (fanNeedAfterCfm <= existingFanCfm) return undefined;
  const parts = [
    `ASHRAE 62.2 asks for ${cfm(requiredCfm)} of ventilation in total; after the plan the house needs a fan of ${cfm(fanNeedAfterCfm)} and the existing fan gives ${cfm(existingFanCfm)}.`,
  ];
  let severity: CautionSeverity = 'warning';
  if (fanAdded) {
    severity = 'notice';
    parts.push('The plan includes a fan for this.');
  } else if (context.ach50After < VENTILATION_DANGER_ACH50 && houseAirBurnerCount(context) > 0) {
    severity = 'danger';
    parts.push(
      `At ${formatNumber(context.ach50After, 1)} ACH50, with fuel-burning appliances using house air, too little leakage is left to dilute combustion gases.`,
    );
  }
  return makeCaution('ventilation-needed', {
    measureIds: context.planMeasureIds,
    facts: parts.join(' '),
    severity,
  });
}

/**
 * The house needs more fan than it has even before sealing.
 *
 * @param context - derived facts; fan needs and flows in cfm
 * @returns a warning (a notice when the plan adds the fan), or undefined
 *
 * @remarks
 * References: ANSI/ASHRAE Standard 62.2, section 4.1.2.
 */
export function ventilationBeforeSealingRule(context: SafetyContext): Caution | undefined {
  const { fanNeedBeforeCfm, existingFanCfm, fanAdded } = context.input.ventilation;
  if (fanNeedBeforeCfm <= existingFanCfm) return undefined;
  return makeCaution('ventilation-before-sealing', {
    measureIds: [],
    facts: `At test-in leakage the house already needs a fan of ${cfm(fanNeedBeforeCfm)}; the existing fan gives ${cfm(existingFanCfm)}.`,
    severity: fanAdded ? 'notice' : 'warning',
  });
}

/**
 * The fan was sized without an infiltration credit.
 *
 * @param context - derived facts; required ventilation in cfm
 * @returns a notice, or undefined when the credit was taken
 *
 * @remarks
 * References: ANSI/ASHRAE Standard 62.2, section 4.1.2 (the credit needs the weather and
 * shielding factor of the normative appendix).
 */
export function noInfiltrationCreditRule(context: SafetyContext): Caution | undefined {
  const { requiredCfm, infiltrationCreditTaken } = context.input.ventilation;
  if (infiltrationCreditTaken) return undefined;
  return makeCaution('no-infiltration-credit', {
    measureIds: [],
    facts: `The ASHRAE 62.2 total is ${cfm(requiredCfm)}.`,
  });
}

/**
 * The plan leaves the house below the ACH50 where codes call for mechanical ventilation.
 *
 * @param context - derived facts; ACH50 in 1/h at 50 Pa
 * @returns a notice, or undefined
 *
 * @remarks
 * Notes: ACH50 = CFM50 · 60 / V[ft³]; fires when ACH50 after < 5 and the plan lowers CFM50.
 *
 * References: International Residential Code 2012, R303.4 (from memory).
 */
export function veryTightRule(context: SafetyContext): Caution | undefined {
  if (!context.reducesLeakage || context.ach50After >= MECHANICAL_VENTILATION_ACH50) {
    return undefined;
  }
  return makeCaution('very-tight', {
    measureIds: context.planMeasureIds,
    facts: `After the plan the house will test at about ${formatNumber(context.ach50After, 1)} ACH50, below the ${MECHANICAL_VENTILATION_ACH50} ACH50 under which the residential code calls for whole-house mechanical ventilation.`,
  });
}
