/**
 * What each caution says and how serious it is by default: one table, so a message or a
 * severity is changed in one place and every code is sure to have both (the `Record` type
 * fails to compile if a code is left out).
 *
 * Sources behind the advice (named here and beside the rules that use them):
 * - US EPA Renovation, Repair and Painting rule, 40 CFR 745 subpart E; "target housing" is
 *   housing built before 1978 (TSCA § 401, 15 U.S.C. 2681(17); 40 CFR 745.103). Published.
 * - US EPA and ATSDR, "Current Best Practices for Vermiculite Attic Insulation" (May 2003):
 *   assume it may contain asbestos, leave it undisturbed, use trained and certified
 *   professionals. Published.
 * - ANSI/ASHRAE Standard 62.2, sections 4.1 and 4.1.2 (total ventilation, infiltration
 *   credit and its weather and shielding factor). Published.
 * - Combustion safety test-out (worst-case CAZ depressurization, spillage, draft, CO), flue
 *   clearances, IC-AT fixtures, dryer ducts, spray-foam handling, garage fire separation:
 *   common practice, written down in residential codes and field standards that differ by
 *   place, which is why every message defers to them.
 */
import type { CautionCode, CautionSeverity, Caution } from './types.ts';

export interface CautionDefinition {
  /** Severity when the rule has no reason to raise or lower it. */
  severity: CautionSeverity;
  /** What to do, in plain words. */
  advice: string;
}

/** Closes every message: the tool informs, codes and licensed practice decide. */
export const DEFERRAL =
  'Local codes, the manufacturer’s instructions and licensed professionals have the final word; this note does not replace them.';

export const CAUTION_DEFINITIONS: Readonly<Record<CautionCode, CautionDefinition>> = {
  'combustion-safety-test': {
    severity: 'warning',
    advice:
      'Run a combustion safety test before and after the work: worst-case depressurization of the combustion appliance zone (CAZ), spillage and draft at each vented appliance, and CO in the flue gas and in the room, following the combustion safety standard your program uses. Fix any failure before the crew leaves.',
  },
  'natural-draft-appliance': {
    severity: 'warning',
    advice:
      'A natural-draft appliance relies on warm flue gas rising on its own; a tighter house, exhaust fans and a clothes dryer can pull that gas back into the house. Test it under worst-case conditions, keep its combustion air supply open, and consider a sealed-combustion or power-vented replacement or make-up air.',
  },
  'unknown-venting': {
    severity: 'warning',
    advice:
      'Find out how it vents (natural draft, induced draft or sealed combustion) before any sealing, and treat it as natural draft until you know.',
  },
  'unvented-combustion': {
    severity: 'warning',
    advice:
      'Combustion gases released into the house carry CO, nitrogen dioxide and moisture that a tighter house holds in. Furnaces, boilers, water heaters, dryers, fireplaces and stoves must vent outdoors: have a qualified technician inspect any that do not. Remove unvented space heaters or replace them with vented units, and run a kitchen fan ducted outdoors whenever a gas range is on.',
  },
  'co-alarm': {
    severity: 'notice',
    advice:
      'Check that working carbon monoxide (CO) alarms are installed where local code requires them, usually outside sleeping areas and on each level, and test them.',
  },
  'ventilation-needed': {
    severity: 'warning',
    advice:
      'Install a ventilation fan sized to that need before or with the sealing, measure its flow once installed, and set it to run continuously or on a schedule that meets ASHRAE 62.2.',
  },
  'ventilation-before-sealing': {
    severity: 'warning',
    advice:
      'The house is short of fresh air before any sealing; add or repair ventilation as part of this job, not after it.',
  },
  'no-infiltration-credit': {
    severity: 'notice',
    advice:
      'No infiltration credit was taken (no weather and shielding factor was given), so the fan was sized for the whole ASHRAE 62.2 requirement. With the nearest weather station’s factor from the standard’s normative appendix the fan may be smaller.',
  },
  'very-tight': {
    severity: 'notice',
    advice:
      'Plan on a ventilation fan whatever the calculation says. Exhaust fans, the dryer and kitchen hoods depressurize a tight house more: check large exhaust appliances for make-up air and watch for moisture problems.',
  },
  'flue-clearance': {
    severity: 'danger',
    advice:
      'Around chimneys and flues use only noncombustible materials: sheet metal fitted to the opening and sealed with high-temperature sealant. Keep the clearance to combustibles that the flue’s listing or code requires, and never put foam, board or insulation against the flue.',
  },
  'recessed-light-rating': {
    severity: 'warning',
    advice:
      'Recessed lights not rated for insulation contact and air-tight (IC and AT) run hot: cover each one with a cover rated for the purpose, or have it replaced with an IC-AT fixture, and keep the required clearance between any non-IC fixture and insulation.',
  },
  'knob-and-tube-wiring': {
    severity: 'danger',
    advice:
      'Have a licensed electrician evaluate the knob-and-tube wiring before the work. Do not bury or enclose it in insulation or foam where codes forbid it; dam it off or have it replaced first.',
  },
  vermiculite: {
    severity: 'danger',
    advice:
      'Assume suspected vermiculite insulation may contain asbestos and do not disturb it. Have it sampled and tested by an accredited laboratory or a licensed asbestos professional, and have a licensed abatement contractor deal with it before any work that would disturb it.',
  },
  'lead-safe-work': {
    severity: 'warning',
    advice:
      'Painted surfaces in a house built before 1978 may contain lead. Where the work disturbs paint, a certified renovator must use lead-safe work practices under the US EPA Renovation, Repair and Painting rule (40 CFR 745): containment, no dry sanding or open-flame removal, and cleaning with verification. Test the paint or presume it contains lead.',
  },
  'spray-foam-handling': {
    severity: 'warning',
    advice:
      'Where spray foam is used: ventilate the work area, give installers the respiratory, skin and eye protection the maker specifies, keep occupants out until the maker’s re-occupancy time has passed, and cover the foam with an ignition or thermal barrier where code requires.',
  },
  'dryer-vent': {
    severity: 'warning',
    advice:
      'The dryer must exhaust outdoors through rigid or semi-rigid metal duct, as short and straight as practical, ending in a hood with a backdraft damper. Never seal the vent shut and never end it in the attic, a crawlspace or a wall cavity; clean out the lint while there.',
  },
  'exhaust-termination': {
    severity: 'warning',
    advice:
      'Bath and kitchen fans must be ducted outdoors to a hood with a backdraft damper, never into the attic, a soffit or a crawlspace, where their moisture causes mold and rot.',
  },
  fireplace: {
    severity: 'warning',
    advice:
      'Have a qualified chimney professional check the damper, flue and chimney before changing them. A damper plug must be removed and the damper opened before any fire, and a fireplace used in a tighter house needs its draft checked and a CO test.',
  },
  'attached-garage': {
    severity: 'warning',
    advice:
      'Sealing the garage-to-house wall and ceiling keeps car exhaust and fumes out of the house. Keep the fire separation intact: restore fire-rated drywall wherever it is opened, use fire-rated sealant at penetrations, and keep the house door self-closing where code requires.',
  },
};

/**
 * Builds one caution from the table.
 *
 * @param code - the caution
 * @param options.measureIds - planned measure ids it concerns (empty for the house)
 * @param options.facts - what was found in this house, put before the advice
 * @param options.severity - overrides the table's severity when the rule has a reason
 * @param options.advice - replaces the table's advice where this case needs other steps
 * @returns the caution, its message ending with the deferral to codes and licensed practice
 */
export function makeCaution(
  code: CautionCode,
  options: {
    measureIds: readonly string[];
    facts?: string;
    severity?: CautionSeverity;
    advice?: string;
  },
): Caution {
  const definition = CAUTION_DEFINITIONS[code];
  const parts = [options.facts, options.advice ?? definition.advice, DEFERRAL].filter(
    (part): part is string => part !== undefined && part !== '',
  );
  return {
    code,
    severity: options.severity ?? definition.severity,
    message: parts.join(' '),
    measureIds: [...options.measureIds],
  };
}
