/**
 * Safety: turns a house and a plan into cautions. The rules live in core/safety/; this file
 * runs them, merges what they find and sorts it. The tool informs; every message defers to
 * local codes, the manufacturer's instructions and licensed practice.
 */
import {
  coAlarmRule,
  combustionSafetyTestRule,
  naturalDraftApplianceRule,
  unknownVentingRule,
  unventedCombustionRule,
} from './safety/combustion-rules.ts';
import { buildSafetyContext, type SafetyContext } from './safety/context.ts';
import { measureHazardRules } from './safety/measure-rules.ts';
import { compareSeverity } from './safety/severity.ts';
import type { Caution, SafetyInput } from './safety/types.ts';
import {
  noInfiltrationCreditRule,
  ventilationBeforeSealingRule,
  ventilationNeededRule,
  veryTightRule,
} from './safety/ventilation-rules.ts';

export {
  CAUTION_CODES,
  CAUTION_SEVERITIES,
  type Caution,
  type CautionCode,
  type CautionSeverity,
  type PlannedMeasure,
  type SafetyInput,
} from './safety/types.ts';
export { CAUTION_DEFINITIONS, DEFERRAL, type CautionDefinition } from './safety/definitions.ts';
export { LEAD_PAINT_CUTOFF_YEAR } from './safety/measure-rules.ts';
export {
  MECHANICAL_VENTILATION_ACH50,
  VENTILATION_DANGER_ACH50,
} from './safety/ventilation-rules.ts';

type Rule = (context: SafetyContext) => Caution | Caution[] | undefined;

const RULES: readonly Rule[] = [
  combustionSafetyTestRule,
  naturalDraftApplianceRule,
  unknownVentingRule,
  unventedCombustionRule,
  coAlarmRule,
  ventilationNeededRule,
  ventilationBeforeSealingRule,
  noInfiltrationCreditRule,
  veryTightRule,
  measureHazardRules,
];

/** One caution per code: the more severe message wins, measure ids are pooled in order. */
function mergeByCode(cautions: readonly Caution[]): Caution[] {
  const byCode = new Map<string, Caution>();
  for (const caution of cautions) {
    const earlier = byCode.get(caution.code);
    if (earlier === undefined) {
      byCode.set(caution.code, { ...caution, measureIds: [...new Set(caution.measureIds)] });
      continue;
    }
    const kept = compareSeverity(caution.severity, earlier.severity) < 0 ? caution : earlier;
    byCode.set(caution.code, {
      ...kept,
      measureIds: [...new Set([...earlier.measureIds, ...caution.measureIds])],
    });
  }
  return [...byCode.values()];
}

function compareCautions(first: Caution, second: Caution): number {
  const bySeverity = compareSeverity(first.severity, second.severity);
  if (bySeverity !== 0) return bySeverity;
  // Plain code-unit order, not locale order, so the result is the same on every machine.
  if (first.code < second.code) return -1;
  return first.code > second.code ? 1 : 0;
}

/**
 * Assesses a house and a planned package of measures for safety.
 *
 * @param input - house (year built, old wiring, suspect insulation), heating and other
 *   fuel-burning appliances, planned measures (library type ids), leakage (CFM50 before and
 *   after, volume ft³) and ventilation (62.2 required cfm, fan need before and after in cfm,
 *   existing fan cfm)
 * @returns cautions sorted danger → warning → notice, then by code; each code once, with
 *   every planned measure id it concerns. The input is not changed.
 * @throws InputError naming each field at fault (non-finite or negative flows, volume ≤ 0,
 *   CFM50 after above CFM50 before, a measure type not in the library)
 *
 * @remarks
 * Notes: ACH50 = CFM50 · 60 / V; combustion rules apply to fuel-burning appliances inside
 * the pressure boundary when CFM50 after < CFM50 before; ventilation rules compare the
 * 62.2 fan need with the existing fan flow; measure rules read each type's caution codes.
 *
 * References: ANSI/ASHRAE Standard 62.2 sections 4.1 and 4.1.2; US EPA Renovation, Repair
 * and Painting rule, 40 CFR 745 (pre-1978 housing); US EPA and ATSDR, "Current Best
 * Practices for Vermiculite Attic Insulation" (2003); combustion safety test-out, flue
 * clearances and the rest: common practice.
 */
export function assessSafety(input: SafetyInput): Caution[] {
  const context = buildSafetyContext(input);
  const found: Caution[] = [];
  for (const rule of RULES) {
    const result = rule(context);
    if (result === undefined) continue;
    found.push(...(Array.isArray(result) ? result : [result]));
  }
  return mergeByCode(found).sort(compareCautions);
}
