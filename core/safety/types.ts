/**
 * The words of the safety check: caution codes, severities, and the input the rules read.
 * Kept apart from the rules so the measure library can name caution codes without importing
 * any rule code.
 */
import type {
  CombustionAppliance,
  CombustionVenting,
  Fuel,
  HeatingEquipment,
  LeakLocation,
} from '../schema.ts';

/**
 * Every caution the check can raise. The measure library tags each measure type with the
 * codes its work may call for; the house and the plan decide whether a tagged code applies.
 */
export const CAUTION_CODES = [
  'combustion-safety-test',
  'natural-draft-appliance',
  'unknown-venting',
  'unvented-combustion',
  'co-alarm',
  'ventilation-needed',
  'ventilation-before-sealing',
  'no-infiltration-credit',
  'very-tight',
  'flue-clearance',
  'recessed-light-rating',
  'knob-and-tube-wiring',
  'vermiculite',
  'lead-safe-work',
  'spray-foam-handling',
  'dryer-vent',
  'exhaust-termination',
  'fireplace',
  'attached-garage',
] as const;
export type CautionCode = (typeof CAUTION_CODES)[number];

/**
 * - danger: a risk to life or of fire if ignored; resolve before the crew starts.
 * - warning: must be handled as part of the job (a test, a rule, a material choice).
 * - notice: good practice or information for the auditor and the client.
 */
export const CAUTION_SEVERITIES = ['danger', 'warning', 'notice'] as const;
export type CautionSeverity = (typeof CAUTION_SEVERITIES)[number];

export interface Caution {
  code: CautionCode;
  severity: CautionSeverity;
  /** Plain words: what was found, what to do, and the deferral to codes and licensed practice. */
  message: string;
  /** Ids of the planned measures this caution concerns; empty when it is about the house. */
  measureIds: string[];
}

/** One measure of the package, as the safety check needs it. */
export interface PlannedMeasure {
  id: string;
  /** A measure type id from the library. */
  type: string;
  location: LeakLocation;
}

export interface SafetyInput {
  house: { yearBuilt: number; knobAndTubeWiring?: boolean; vermiculiteSuspected?: boolean };
  heating: {
    fuel: Fuel;
    equipment: HeatingEquipment;
    combustionVenting?: CombustionVenting;
    /** Default: inside the pressure boundary. */
    insidePressureBoundary?: boolean;
  };
  /** Other fuel-burning appliances: water heater, range, dryer, fireplace, … */
  combustionAppliances: readonly CombustionAppliance[];
  plannedMeasures: readonly PlannedMeasure[];
  leakage: { cfm50Before: number; cfm50After: number; volumeFt3: number };
  ventilation: {
    /** ASHRAE 62.2 total required ventilation, cfm. */
    requiredCfm: number;
    /** Mechanical ventilation the house needs at test-in leakage, cfm. */
    fanNeedBeforeCfm: number;
    /** Mechanical ventilation the house needs after the plan, cfm. */
    fanNeedAfterCfm: number;
    existingFanCfm: number;
    /** Whether the plan adds a ventilation fan. */
    fanAdded: boolean;
    /** Whether the fan need was reduced by a 62.2 infiltration credit. */
    infiltrationCreditTaken: boolean;
  };
}
