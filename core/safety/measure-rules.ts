/**
 * Hazards of the work itself. Each measure type in the library lists the caution codes its
 * work may call for; a small table here says, per code, what in the house makes it apply.
 * A code is raised once, naming every planned measure that carries it.
 */
import type { SafetyContext } from './context.ts';
import { makeCaution } from './definitions.ts';
import type { Caution, CautionCode } from './types.ts';

/**
 * Houses built before this year are "target housing" for lead-based paint rules.
 * Published: TSCA § 401 (15 U.S.C. 2681(17)) and 40 CFR 745.103, "housing constructed prior
 * to 1978"; the renovation rule (40 CFR 745 subpart E) applies to it.
 */
export const LEAD_PAINT_CUTOFF_YEAR = 1978;

interface MeasureHazard {
  code: CautionCode;
  /** Whether the house makes the code apply to measures that carry it. */
  housePresents: (context: SafetyContext) => boolean;
  /** What was found, for the message. */
  facts?: (context: SafetyContext) => string;
  /** Raise the code even with no tagged measure, when the house alone calls for it. */
  withoutMeasures?: (context: SafetyContext) => boolean;
}

function always(): boolean {
  return true;
}

const MEASURE_HAZARDS: readonly MeasureHazard[] = [
  { code: 'flue-clearance', housePresents: always },
  { code: 'recessed-light-rating', housePresents: always },
  {
    code: 'knob-and-tube-wiring',
    housePresents: (context) => context.input.house.knobAndTubeWiring === true,
    facts: () => 'The house has knob-and-tube wiring and the plan works where it may run.',
  },
  {
    code: 'vermiculite',
    housePresents: (context) => context.input.house.vermiculiteSuspected === true,
    facts: () => 'Vermiculite insulation is suspected where the plan works.',
  },
  {
    code: 'lead-safe-work',
    housePresents: (context) => context.input.house.yearBuilt < LEAD_PAINT_CUTOFF_YEAR,
    facts: (context) => `The house was built in ${context.input.house.yearBuilt}.`,
  },
  { code: 'spray-foam-handling', housePresents: always },
  { code: 'dryer-vent', housePresents: always },
  { code: 'exhaust-termination', housePresents: always },
  {
    code: 'fireplace',
    housePresents: always,
    withoutMeasures: (context) =>
      context.reducesLeakage && context.burners.some((burner) => burner.kind === 'fireplace'),
  },
  { code: 'attached-garage', housePresents: always },
];

function hazardCaution(context: SafetyContext, hazard: MeasureHazard): Caution | undefined {
  if (!hazard.housePresents(context)) return undefined;
  const concerned = context.measures.filter((measure) =>
    measure.type.cautionCodes.includes(hazard.code),
  );
  if (concerned.length === 0 && !(hazard.withoutMeasures?.(context) ?? false)) return undefined;
  const names = [...new Set(concerned.map((measure) => measure.type.name))];
  const facts = [
    hazard.facts?.(context),
    names.length > 0 ? `Work concerned: ${names.join('; ')}.` : undefined,
  ]
    .filter((part): part is string => part !== undefined)
    .join(' ');
  return makeCaution(hazard.code, {
    measureIds: concerned.map((measure) => measure.id),
    facts,
  });
}

/**
 * Cautions the planned work calls for in this house: flue clearances, recessed lights,
 * knob-and-tube wiring, suspect vermiculite, lead-safe practice, spray foam, dryer and fan
 * ducts, fireplaces and garage walls.
 *
 * @param context - derived safety facts (planned measures with their library types, house)
 * @returns one caution per code that applies, each naming its measures
 *
 * @remarks
 * Notes: a code applies when a planned measure's type lists it and the house condition in
 * the table holds (e.g. lead-safe work when yearBuilt < 1978).
 *
 * References: US EPA RRP rule, 40 CFR 745 (lead); US EPA and ATSDR, "Current Best Practices
 * for Vermiculite Attic Insulation" (2003); the rest common practice.
 */
export function measureHazardRules(context: SafetyContext): Caution[] {
  return MEASURE_HAZARDS.map((hazard) => hazardCaution(context, hazard)).filter(
    (caution): caution is Caution => caution !== undefined,
  );
}
