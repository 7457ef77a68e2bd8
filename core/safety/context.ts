/**
 * Checks the safety input and works out the facts every rule reads: the planned measures with
 * their library types, whether the plan tightens the house, ACH50 before and after, and the
 * fuel-burning appliances with where they sit and how they vent.
 */
import { InputError, type InputProblem } from '../errors.ts';
import { MINUTES_PER_HOUR } from '../constants.ts';
import { findMeasureType, type MeasureType } from '../measure-library.ts';
import {
  COMBUSTION_FUELS,
  LEAK_LOCATIONS,
  type ApplianceKind,
  type CombustionVenting,
  type Fuel,
} from '../schema.ts';
import type { SafetyInput } from './types.ts';

/** A fuel-burning appliance: the heating system or one of the other appliances. */
export interface FuelBurner {
  kind: ApplianceKind | 'heating';
  /** Plain words for messages, e.g. "natural gas water heater (natural draft)". */
  label: string;
  /** Undefined where the home file does not say. */
  venting: CombustionVenting | undefined;
  insidePressureBoundary: boolean;
}

export interface SafetyContext {
  input: SafetyInput;
  /** Planned measures in plan order, each id once, with its library type. */
  measures: readonly { id: string; type: MeasureType }[];
  /** Ids of all planned measures, in plan order. */
  planMeasureIds: readonly string[];
  /** True when the plan lowers CFM50. */
  reducesLeakage: boolean;
  ach50Before: number;
  ach50After: number;
  burners: readonly FuelBurner[];
}

const FUEL_WORDS: Readonly<Record<Fuel, string>> = {
  naturalGas: 'natural gas',
  propane: 'propane',
  heatingOil: 'oil',
  kerosene: 'kerosene',
  electricity: 'electric',
  wood: 'wood',
  pellets: 'pellet',
};

const KIND_WORDS: Readonly<Record<ApplianceKind, string>> = {
  waterHeater: 'water heater',
  furnace: 'furnace',
  boiler: 'boiler',
  spaceHeater: 'space heater',
  range: 'range',
  dryer: 'clothes dryer',
  fireplace: 'fireplace',
  stove: 'stove',
};

const VENTING_WORDS: Readonly<Record<CombustionVenting, string>> = {
  naturalDraft: 'natural draft',
  inducedDraft: 'induced draft',
  sealed: 'sealed combustion',
  none: 'unvented',
};

function ventingWords(venting: CombustionVenting | undefined): string {
  return venting === undefined ? 'venting not recorded' : VENTING_WORDS[venting];
}

function isCombustionFuel(fuel: Fuel): boolean {
  return COMBUSTION_FUELS.includes(fuel);
}

function numberProblem(
  path: string,
  value: number,
  limits: { min: number; exclusiveMin?: boolean },
): InputProblem | undefined {
  if (!Number.isFinite(value)) {
    return { path, message: `expected a finite number, got ${String(value)}` };
  }
  const tooSmall = limits.exclusiveMin ? value <= limits.min : value < limits.min;
  if (tooSmall) {
    const bound = limits.exclusiveMin ? `greater than ${limits.min}` : `at least ${limits.min}`;
    return { path, message: `expected a number ${bound}, got ${value}` };
  }
  return undefined;
}

function inputProblems(input: SafetyInput): InputProblem[] {
  const { house, leakage, ventilation } = input;
  const problems: (InputProblem | undefined)[] = [];
  if (!Number.isInteger(house.yearBuilt) || house.yearBuilt < 1600 || house.yearBuilt > 2100) {
    problems.push({
      path: 'house.yearBuilt',
      message: `expected a whole year from 1600 to 2100, got ${house.yearBuilt}`,
    });
  }
  problems.push(
    numberProblem('leakage.cfm50Before', leakage.cfm50Before, { min: 0 }),
    numberProblem('leakage.cfm50After', leakage.cfm50After, { min: 0 }),
    numberProblem('leakage.volumeFt3', leakage.volumeFt3, { min: 0, exclusiveMin: true }),
    numberProblem('ventilation.requiredCfm', ventilation.requiredCfm, { min: 0 }),
    numberProblem('ventilation.existingFanCfm', ventilation.existingFanCfm, { min: 0 }),
    // A negative fan need is allowed: infiltration alone covers the requirement.
    numberProblem('ventilation.fanNeedBeforeCfm', ventilation.fanNeedBeforeCfm, {
      min: -Infinity,
    }),
    numberProblem('ventilation.fanNeedAfterCfm', ventilation.fanNeedAfterCfm, { min: -Infinity }),
  );
  if (leakage.cfm50After > leakage.cfm50Before) {
    problems.push({
      path: 'leakage.cfm50After',
      message: `expected no more than cfm50Before (${leakage.cfm50Before}): sealing cannot add leakage, got ${leakage.cfm50After}`,
    });
  }
  input.plannedMeasures.forEach((measure, index) => {
    if (findMeasureType(measure.type) === undefined) {
      problems.push({
        path: `plannedMeasures[${index}].type`,
        message: `expected a measure type id from the library, got "${measure.type}"`,
      });
    }
    if (!LEAK_LOCATIONS.includes(measure.location)) {
      problems.push({
        path: `plannedMeasures[${index}].location`,
        message: `expected one of ${LEAK_LOCATIONS.join(', ')}, got "${String(measure.location)}"`,
      });
    }
  });
  return problems.filter((problem): problem is InputProblem => problem !== undefined);
}

function fuelBurners(input: SafetyInput): FuelBurner[] {
  const burners: FuelBurner[] = [];
  const { heating } = input;
  if (isCombustionFuel(heating.fuel)) {
    burners.push({
      kind: 'heating',
      label: `${FUEL_WORDS[heating.fuel]} ${heating.equipment} (${ventingWords(heating.combustionVenting)})`,
      venting: heating.combustionVenting,
      insidePressureBoundary: heating.insidePressureBoundary ?? true,
    });
  }
  for (const appliance of input.combustionAppliances) {
    if (!isCombustionFuel(appliance.fuel)) continue;
    burners.push({
      kind: appliance.kind,
      label: `${FUEL_WORDS[appliance.fuel]} ${KIND_WORDS[appliance.kind]} (${ventingWords(appliance.venting)})`,
      venting: appliance.venting,
      insidePressureBoundary: appliance.insidePressureBoundary ?? true,
    });
  }
  return burners;
}

/**
 * Checks the input and derives the facts the rules share.
 *
 * @param input - house, heating, appliances, planned measures, leakage (CFM50, ft³) and
 *   ventilation (cfm)
 * @returns the derived facts; ACH50 in air changes per hour at 50 Pa
 * @throws InputError naming every field at fault
 *
 * @remarks
 * Notes: ACH50 = CFM50 · 60 / V[ft³].
 */
export function buildSafetyContext(input: SafetyInput): SafetyContext {
  const problems = inputProblems(input);
  if (problems.length > 0) throw new InputError(problems);

  const measures: { id: string; type: MeasureType }[] = [];
  const seenIds = new Set<string>();
  for (const planned of input.plannedMeasures) {
    const type = findMeasureType(planned.type);
    if (type === undefined || seenIds.has(planned.id)) continue;
    seenIds.add(planned.id);
    measures.push({ id: planned.id, type });
  }
  const { cfm50Before, cfm50After, volumeFt3 } = input.leakage;
  return {
    input,
    measures,
    planMeasureIds: measures.map((measure) => measure.id),
    reducesLeakage: cfm50After < cfm50Before,
    ach50Before: (cfm50Before * MINUTES_PER_HOUR) / volumeFt3,
    ach50After: (cfm50After * MINUTES_PER_HOUR) / volumeFt3,
    burners: fuelBurners(input),
  };
}
