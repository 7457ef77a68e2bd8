/**
 * Rules about fuel-burning appliances: the test-out a tighter house calls for, natural-draft
 * and unvented appliances, venting nobody recorded, and CO alarms.
 *
 * Why tightening matters: exhaust fans, dryers and the stack effect depressurize the house;
 * the less leakage there is to relieve that, the further the pressure in the combustion
 * appliance zone (CAZ) falls, and a natural-draft flue can spill or backdraft. That is
 * common practice, and the reason combustion safety test-out procedures exist.
 */
import { formatNumber } from '../format.ts';
import type { ApplianceKind } from '../schema.ts';
import type { SafetyContext, FuelBurner } from './context.ts';
import { makeCaution } from './definitions.ts';
import { mostSevere } from './severity.ts';
import type { Caution, CautionSeverity } from './types.ts';

/** Sealed-combustion appliances draw combustion air from outdoors, so only CO is left to check. */
const SEALED_ONLY_ADVICE =
  'Sealed-combustion appliances take their combustion air from outdoors, so a tighter house should not upset their venting; still measure CO at each appliance and in the living space after the work.';

/**
 * Appliance kinds built to vent outdoors; "unvented" for one of these means a missing or
 * broken vent, not a design (common practice). Space heaters and ranges are made unvented.
 */
const MUST_VENT_KINDS: ReadonlySet<ApplianceKind | 'heating'> = new Set([
  'heating',
  'waterHeater',
  'furnace',
  'boiler',
  'dryer',
  'fireplace',
  'stove',
]);

function insideBurners(context: SafetyContext): FuelBurner[] {
  return context.burners.filter((burner) => burner.insidePressureBoundary);
}

function labels(burners: readonly FuelBurner[]): string {
  return burners.map((burner) => burner.label).join(', ');
}

/** Natural draft, or venting nobody recorded: until it is known it is treated as natural draft. */
function mayBeNaturalDraft(burner: FuelBurner): boolean {
  return burner.venting === 'naturalDraft' || burner.venting === undefined;
}

/**
 * Combustion safety test-out: needed when fuel-burning appliances sit inside the pressure
 * boundary and the plan lowers CFM50.
 *
 * @param context - derived safety facts (CFM50 before and after, appliances)
 * @returns danger where any inside appliance is natural draft or of unknown venting, notice
 *   where all are sealed combustion, warning otherwise; undefined when not needed
 *
 * @remarks
 * References: common practice (worst-case CAZ depressurization, spillage, draft and CO
 * testing, as written in the combustion safety standards programs adopt).
 */
export function combustionSafetyTestRule(context: SafetyContext): Caution | undefined {
  const inside = insideBurners(context);
  if (inside.length === 0 || !context.reducesLeakage) return undefined;
  const { cfm50Before, cfm50After } = context.input.leakage;
  const facts = `The plan tightens the house from ${formatNumber(cfm50Before)} to ${formatNumber(cfm50After)} CFM50 with fuel-burning appliances inside: ${labels(inside)}.`;
  const allSealed = inside.every((burner) => burner.venting === 'sealed');
  let severity: CautionSeverity = 'warning';
  if (inside.some(mayBeNaturalDraft)) severity = 'danger';
  else if (allSealed) severity = 'notice';
  return makeCaution('combustion-safety-test', {
    measureIds: context.planMeasureIds,
    facts,
    severity,
    ...(allSealed ? { advice: SEALED_ONLY_ADVICE } : {}),
  });
}

/**
 * Natural-draft appliances inside a house the plan tightens.
 *
 * @param context - derived safety facts
 * @returns a warning naming the appliances, or undefined
 *
 * @remarks
 * References: common practice (spillage and backdrafting of natural-draft appliances under
 * depressurization).
 */
export function naturalDraftApplianceRule(context: SafetyContext): Caution | undefined {
  const naturalDraft = insideBurners(context).filter((burner) => burner.venting === 'naturalDraft');
  if (naturalDraft.length === 0 || !context.reducesLeakage) return undefined;
  return makeCaution('natural-draft-appliance', {
    measureIds: context.planMeasureIds,
    facts: `Natural-draft appliances inside the pressure boundary: ${labels(naturalDraft)}.`,
  });
}

/**
 * A fuel-burning appliance inside whose venting is not recorded.
 *
 * @param context - derived safety facts
 * @returns a warning naming the appliances, or undefined
 */
export function unknownVentingRule(context: SafetyContext): Caution | undefined {
  const unknown = insideBurners(context).filter((burner) => burner.venting === undefined);
  if (unknown.length === 0) return undefined;
  return makeCaution('unknown-venting', {
    measureIds: [],
    facts: `How these appliances vent is not recorded: ${labels(unknown)}.`,
  });
}

function unventedSeverity(burner: FuelBurner): CautionSeverity {
  if (MUST_VENT_KINDS.has(burner.kind)) return 'danger';
  return burner.kind === 'spaceHeater' ? 'warning' : 'notice';
}

/**
 * Fuel-burning appliances inside that release their combustion gases into the house.
 *
 * @param context - derived safety facts
 * @returns danger for an appliance built to vent outdoors that does not, warning for an
 *   unvented space heater, notice for a gas range alone; undefined when there is none
 *
 * @remarks
 * References: common practice; ASHRAE 62.2 section 5 asks for local kitchen exhaust (from
 * memory for the section number).
 */
export function unventedCombustionRule(context: SafetyContext): Caution | undefined {
  const unvented = insideBurners(context).filter((burner) => burner.venting === 'none');
  const [first, ...rest] = unvented.map(unventedSeverity);
  if (first === undefined) return undefined;
  return makeCaution('unvented-combustion', {
    measureIds: [],
    facts: `Unvented fuel-burning appliances inside: ${labels(unvented)}.`,
    severity: mostSevere([first, ...rest]),
  });
}

/**
 * CO alarms: wherever fuel is burned in or beside the house, or the plan seals a garage wall.
 *
 * @param context - derived safety facts
 * @returns a notice, or undefined in an all-electric house with no garage work
 *
 * @remarks
 * References: residential codes require CO alarms in dwellings with fuel-fired appliances or
 * an attached garage (IRC R315, from memory for the section number).
 */
export function coAlarmRule(context: SafetyContext): Caution | undefined {
  const garageIds = context.measures
    .filter((measure) => measure.type.cautionCodes.includes('attached-garage'))
    .map((measure) => measure.id);
  if (context.burners.length === 0 && garageIds.length === 0) return undefined;
  return makeCaution('co-alarm', { measureIds: garageIds });
}
