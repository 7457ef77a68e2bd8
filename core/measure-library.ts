/**
 * The library of air-sealing measure types: where each leak is, how big one unit of it
 * typically is before sealing (ELA at 4 Pa), how much of it the work removes, how long the
 * work lasts, a demo cost, and the cautions the work may call for. Every number carries a
 * source note saying where it comes from and how sure we are of it.
 *
 * Marks: "published" (the named source states the value), "from memory" (recalled, not
 * checked against the source), "common practice" (a trade judgement with no single source),
 * "demo default" (the invented demo scenario's numbers; never a fact).
 *
 * Sizes are ELA at 4 Pa (C_D = 1), the area the ASHRAE Handbook of Fundamentals uses for
 * component leakage; CFM50 ≈ 18 × ELA in² for a whole house (see REFERENCES.md).
 */
import { METERS_PER_FOOT, SQUARE_CM_PER_SQUARE_INCH } from './constants.ts';
import type { LeakLocation, Range } from './schema.ts';
import type { CautionCode } from './safety/types.ts';

export interface SourceNote {
  mark: 'published' | 'from memory' | 'common practice' | 'demo default';
  citation: string;
}

export interface MeasureType {
  /** kebab-case id used in home files. */
  id: string;
  name: string;
  group: 'atticBypass' | 'rimAndSill' | 'penetration' | 'doorsAndWindows' | 'other';
  /** Where the leak is, for the AIM-2 leak distribution. */
  location: LeakLocation;
  unit: 'each' | 'linearFt' | 'ft2' | 'job';
  defaultLifeYears: number;
  /** ELA at 4 Pa of one unit before sealing, in² (per ft for linearFt, per ft² for ft2). */
  leakageAreaIn2PerUnit: Range;
  /** Fraction of that leakage the work removes, 0..1. */
  sealingEffectiveness: Range;
  /** Invented demo defaults (see sources.cost). */
  defaultCost: { materialsUsdPerUnit: number; laborHoursPerUnit: number };
  cautionCodes: readonly CautionCode[];
  sources: {
    leakageArea: SourceNote;
    effectiveness: SourceNote;
    life: SourceNote;
    cost: SourceNote;
  };
  /** What the crew does, in one or two sentences. */
  description: string;
}

function range(low: number, likely: number, high: number): Range {
  return { low, likely, high };
}

/** cm² (per item) → in². Exact conversion (NIST SP 811). */
function in2FromCm2(areaCm2: number): number {
  return areaCm2 / SQUARE_CM_PER_SQUARE_INCH;
}

/** cm² per metre of joint → in² per foot. Exact conversion (NIST SP 811). */
function in2PerFtFromCm2PerM(areaCm2PerM: number): number {
  return (areaCm2PerM * METERS_PER_FOOT) / SQUARE_CM_PER_SQUARE_INCH;
}

const NIST_LIBRARY =
  'NIST multizone modeling website, CONTAM libraries, Appendix C2 "Miscellaneous Residential Leakage Data" (RESMISC.lb3), ELA at 4 Pa';

/** A size taken from the NIST residential library: low = its tight value, likely = typical. */
function nistNote(element: string, tight: string, typical: string): SourceNote {
  return {
    mark: 'published',
    citation: `${NIST_LIBRARY}: ${element}, tight ${tight}, typical ${typical}; low = tight, likely = typical, converted to inches; the high value is our allowance for poor condition (from memory, not in the source)`,
  };
}

function memory(citation: string): SourceNote {
  return { mark: 'from memory', citation };
}

function practice(citation: string): SourceNote {
  return { mark: 'common practice', citation };
}

function lifeFromMemory(years: string): SourceNote {
  return memory(
    `Weatherization and efficiency-program measure-life tables list air sealing at about 10–20 years; ${years} for this work (recalled, not checked against a table)`,
  );
}

const COST_DEMO: SourceNote = {
  mark: 'demo default',
  citation:
    'Invented Alder Creek demo scenario prices and crew hours; replace with the program’s own',
};

const EFFECT_RIGID = practice(
  'Holes blocked with rigid material and sealed edges close nearly all of the opening; the range allows for hidden paths left open',
);
const EFFECT_SEALANT = practice(
  'Caulk, foam or gaskets on a visible crack or hole remove most of it; the range allows for missed lengths and poor access',
);
const EFFECT_MOVING = practice(
  'Weatherstripping and seals at moving parts remove part of the leak; fit and wear limit it',
);

export const MEASURE_LIBRARY: readonly MeasureType[] = [
  {
    id: 'attic-top-plates',
    name: 'Top plates from the attic',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(in2PerFtFromCm2PerM(0.5), in2PerFtFromCm2PerM(1.5), 0.25),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 0.35, laborHoursPerUnit: 0.04 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: nistNote('ceiling-wall joint (per metre)', '0.5 cm²/m', '1.5 cm²/m'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years, sealant protected in the attic'),
      cost: COST_DEMO,
    },
    description:
      'From the attic, the crew pulls back insulation and seals the joint between wall top plates and the ceiling below with caulk or foam.',
  },
  {
    id: 'attic-chases',
    name: 'Open chases and wall cavities to the attic',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(4, 12, 40),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 1.5 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of an open duct chase or balloon-frame bay seen from the attic; sizes vary widely',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years for rigid blocking'),
      cost: COST_DEMO,
    },
    description:
      'Caps open chases and wall cavities at the attic floor with rigid board or drywall cut to fit, sealing the edges with foam or caulk.',
  },
  {
    id: 'attic-hatch',
    name: 'Attic hatch',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(18), in2FromCm2(30), 10),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 30, laborHoursPerUnit: 1 },
    cautionCodes: ['lead-safe-work', 'vermiculite'],
    sources: {
      leakageArea: nistNote('attic door', '18 cm² per item', '30 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years; the gasket wears'),
      cost: COST_DEMO,
    },
    description:
      'Weatherstrips the hatch frame, adds latches or weight so the panel presses on the gasket, and insulates the back of the panel.',
  },
  {
    id: 'attic-pull-down-stair',
    name: 'Attic pull-down stair',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(4, 10, 25),
    sealingEffectiveness: range(0.5, 0.75, 0.9),
    defaultCost: { materialsUsdPerUnit: 150, laborHoursPerUnit: 2 },
    cautionCodes: ['lead-safe-work', 'vermiculite'],
    sources: {
      leakageArea: memory(
        'Folding stairs leak more than a flat hatch: gaps at the frame, hinges and rough opening; sizes recalled from field tests',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the stair frame to the ceiling and fits an insulated, gasketed cover over the stair on the attic side.',
  },
  {
    id: 'recessed-lights',
    name: 'Recessed lights',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.25, 0.6, 3),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 0.5 },
    cautionCodes: ['recessed-light-rating', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: memory(
        'ASHRAE Handbook of Fundamentals component leakage table, recessed light about 4 cm² (0.6 in²) each as best estimate; the high value reflects field reports of 2–3 in² for old non-IC cans',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Covers each non-airtight fixture from the attic with a cover rated for the purpose and seals it to the ceiling, or has it replaced with an IC-AT fixture.',
  },
  {
    id: 'plumbing-chase',
    name: 'Plumbing chase',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(3, 10, 30),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 20, laborHoursPerUnit: 1 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of the open wall or vent-stack chase above a bathroom or kitchen',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Blocks the plumbing wall or vent-stack chase at the attic floor with rigid board and seals around the pipes.',
  },
  {
    id: 'flue-chase',
    name: 'Flue and chimney chase',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(6, 20, 60),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 40, laborHoursPerUnit: 2 },
    cautionCodes: ['flue-clearance', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate of the gap around a chimney or flue where it passes the attic floor',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years for sheet metal'),
      cost: COST_DEMO,
    },
    description:
      'Closes the gap around the flue or chimney with sheet metal and high-temperature sealant, keeping the required clearance to anything combustible.',
  },
  {
    id: 'kneewalls',
    name: 'Kneewalls and the floor behind them',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.2, 0.6, 2),
    sealingEffectiveness: range(0.6, 0.8, 0.9),
    defaultCost: { materialsUsdPerUnit: 2.5, laborHoursPerUnit: 0.15 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite', 'lead-safe-work'],
    sources: {
      leakageArea: memory(
        'Open joist bays under kneewalls; per-foot sizes recalled from zonal pressure tests of storey-and-a-half houses',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Blocks the floor joist bays beneath the kneewall with rigid material and seals the kneewall itself, including its access door.',
  },
  {
    id: 'dropped-soffit',
    name: 'Dropped soffit',
    group: 'atticBypass',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(4, 12, 40),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 35, laborHoursPerUnit: 2 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate for a kitchen or bath soffit open to the attic along its length',
      ),
      effectiveness: EFFECT_RIGID,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Covers the top of the soffit from the attic with rigid board and seals its edges to the framing.',
  },
  {
    id: 'rim-joist',
    name: 'Rim joist above the foundation',
    group: 'rimAndSill',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.04, 0.15, 0.5),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 1.5, laborHoursPerUnit: 0.05 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring'],
    sources: {
      leakageArea: memory(
        'Joints of sill, rim and subfloor per foot of perimeter; recalled from component tables and basement tests',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the rim joist bays from the basement or crawlspace with spray foam, or with rigid board cut to fit and sealed at its edges.',
  },
  {
    id: 'band-joist',
    name: 'Band joist between storeys',
    group: 'rimAndSill',
    location: 'wall',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.04, 0.15, 0.5),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 2, laborHoursPerUnit: 0.1 },
    cautionCodes: ['spray-foam-handling', 'knob-and-tube-wiring', 'lead-safe-work'],
    sources: {
      leakageArea: memory('Taken as the rim joist per foot; not separately measured'),
      effectiveness: practice(
        'Reached only through openings or from outside, so less of the joint is sealed than at a basement rim',
      ),
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the band joist between floors where it can be reached, through small openings or during siding work.',
  },
  {
    id: 'sill-plate',
    name: 'Sill plate on the foundation',
    group: 'rimAndSill',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(0.03, 0.1, 0.4),
    sealingEffectiveness: range(0.6, 0.8, 0.9),
    defaultCost: { materialsUsdPerUnit: 0.5, laborHoursPerUnit: 0.03 },
    cautionCodes: ['spray-foam-handling'],
    sources: {
      leakageArea: memory(
        'Sill-to-foundation joint per foot, uncaulked; recalled component values',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description: 'Caulks or foams the joint between the sill plate and the foundation wall.',
  },
  {
    id: 'plumbing-penetrations',
    name: 'Pipe penetrations',
    group: 'penetration',
    location: 'floor',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.1, 0.5, 2),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 4, laborHoursPerUnit: 0.25 },
    cautionCodes: ['spray-foam-handling', 'lead-safe-work'],
    sources: {
      leakageArea: practice(
        'Oversized holes around supply and drain pipes through floors and walls',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description: 'Seals around pipes where they pass through floors and walls with foam or caulk.',
  },
  {
    id: 'wiring-penetrations',
    name: 'Wiring penetrations',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.05, 0.2, 0.6),
    sealingEffectiveness: range(0.7, 0.85, 0.95),
    defaultCost: { materialsUsdPerUnit: 2, laborHoursPerUnit: 0.15 },
    cautionCodes: ['knob-and-tube-wiring', 'spray-foam-handling', 'lead-safe-work'],
    sources: {
      leakageArea: memory('Drilled holes for cables through plates and walls; recalled sizes'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description: 'Seals holes drilled for cables through top plates, floors and exterior walls.',
  },
  {
    id: 'electrical-box-gaskets',
    name: 'Outlet and switch gaskets on exterior walls',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.05, 0.15, 0.4),
    sealingEffectiveness: range(0.3, 0.5, 0.7),
    defaultCost: { materialsUsdPerUnit: 0.5, laborHoursPerUnit: 0.05 },
    cautionCodes: ['knob-and-tube-wiring'],
    sources: {
      leakageArea: memory('ASHRAE component leakage table, outlets and switches without gaskets'),
      effectiveness: practice('Gaskets under cover plates stop the leak at the plate only'),
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Fits foam gaskets under outlet and switch cover plates on exterior walls and seals gaps around the boxes.',
  },
  {
    id: 'duct-boots',
    name: 'Duct boots to ceiling and floor',
    group: 'penetration',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(1), in2FromCm2(5), 3),
    sealingEffectiveness: range(0.6, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 5, laborHoursPerUnit: 0.3 },
    cautionCodes: ['lead-safe-work'],
    sources: {
      leakageArea: nistNote('HVAC ceiling penetration', '1 cm² per item', '5 cm² per item'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Removes each register and seals the gap between the duct boot and the drywall or floor with caulk or mastic.',
  },
  {
    id: 'exhaust-fan-vents',
    name: 'Bath and exhaust fan housings',
    group: 'penetration',
    location: 'ceiling',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(10), in2FromCm2(20), 6),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 15, laborHoursPerUnit: 0.75 },
    cautionCodes: ['exhaust-termination', 'knob-and-tube-wiring', 'vermiculite'],
    sources: {
      leakageArea: nistNote('bathroom exhaust vent', '10 cm² per item', '20 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals the fan housing to the ceiling, repairs or adds the backdraft damper, and makes sure the duct ends outdoors.',
  },
  {
    id: 'range-hood-damper',
    name: 'Kitchen exhaust damper',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2FromCm2(5), in2FromCm2(40), 10),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 25, laborHoursPerUnit: 0.75 },
    cautionCodes: ['exhaust-termination'],
    sources: {
      leakageArea: nistNote('kitchen exhaust vent', '5 cm² per item', '40 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Replaces a stuck or missing backdraft damper on the kitchen exhaust and seals the duct where it passes the wall.',
  },
  {
    id: 'dryer-vent',
    name: 'Dryer vent',
    group: 'penetration',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(0.5, 1.5, 5),
    sealingEffectiveness: range(0.4, 0.6, 0.8),
    defaultCost: { materialsUsdPerUnit: 30, laborHoursPerUnit: 1 },
    cautionCodes: ['dryer-vent'],
    sources: {
      leakageArea: memory(
        'ASHRAE component leakage table, dryer vent with and without a working damper; recalled',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Replaces a torn or plastic dryer duct with metal duct, fits a hood with a working damper outside, and seals the wall opening around the duct.',
  },
  {
    id: 'door-weatherstrip',
    name: 'Exterior door weatherstripping',
    group: 'doorsAndWindows',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(in2FromCm2(12), in2FromCm2(21), 8),
    sealingEffectiveness: range(0.3, 0.5, 0.7),
    defaultCost: { materialsUsdPerUnit: 40, laborHoursPerUnit: 1 },
    cautionCodes: ['lead-safe-work'],
    sources: {
      leakageArea: nistNote('exterior single door', '12 cm² per item', '21 cm² per item'),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('10 years; weatherstrip wears with use'),
      cost: COST_DEMO,
    },
    description:
      'Adjusts the door and strike, replaces the weatherstripping and door sweep, and caulks the frame to the wall.',
  },
  {
    id: 'window-sealing',
    name: 'Window sealing',
    group: 'doorsAndWindows',
    location: 'wall',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(0.3, 1, 3),
    sealingEffectiveness: range(0.2, 0.4, 0.6),
    defaultCost: { materialsUsdPerUnit: 8, laborHoursPerUnit: 0.5 },
    cautionCodes: ['lead-safe-work'],
    sources: {
      leakageArea: memory(
        'ASHRAE component leakage table, operable windows by type and weatherstripping; per-window sizes recalled',
      ),
      effectiveness: EFFECT_MOVING,
      life: lifeFromMemory('10 years'),
      cost: COST_DEMO,
    },
    description:
      'Caulks the window trim and frame, adds weatherstripping to the sashes, and repairs locks so the sashes close tight.',
  },
  {
    id: 'garage-house-wall',
    name: 'Wall and ceiling between garage and house',
    group: 'other',
    location: 'wall',
    unit: 'job',
    defaultLifeYears: 20,
    leakageAreaIn2PerUnit: range(5, 15, 40),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 60, laborHoursPerUnit: 3 },
    cautionCodes: [
      'attached-garage',
      'spray-foam-handling',
      'lead-safe-work',
      'knob-and-tube-wiring',
    ],
    sources: {
      leakageArea: practice(
        'Auditors’ estimate for penetrations, the rim and the door between an attached garage and the house',
      ),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('20 years'),
      cost: COST_DEMO,
    },
    description:
      'Seals penetrations, the rim and the door frame between garage and house with fire-rated sealant and weatherstrips the house door.',
  },
  {
    id: 'fireplace-damper',
    name: 'Fireplace damper',
    group: 'other',
    location: 'flue',
    unit: 'each',
    defaultLifeYears: 10,
    leakageAreaIn2PerUnit: range(10, 30, 60),
    sealingEffectiveness: range(0.5, 0.8, 0.95),
    defaultCost: { materialsUsdPerUnit: 180, laborHoursPerUnit: 1.5 },
    cautionCodes: ['fireplace'],
    sources: {
      leakageArea: {
        mark: 'published',
        citation:
          'Energy Options Northwest (1990) field study: ELA of closed fireplace dampers averaged about 30 in²; as reported by Battic Door, "Seal Fireplace Dampers With Weatherstripping to Conserve Energy" (environmental-expert.com); secondary source, low and high are our allowance',
      },
      effectiveness: practice(
        'A top-sealing damper or a chimney plug closes most of a leaky damper; the range allows for poor fit',
      ),
      life: lifeFromMemory('10 years; gaskets and plugs wear'),
      cost: COST_DEMO,
    },
    description:
      'Fits a top-sealing damper or a removable chimney plug and seals the fireplace surround to the wall.',
  },
  {
    id: 'baseboard-sealing',
    name: 'Baseboards and floor-wall joints',
    group: 'other',
    location: 'floor',
    unit: 'linearFt',
    defaultLifeYears: 15,
    leakageAreaIn2PerUnit: range(in2PerFtFromCm2PerM(0.8), in2PerFtFromCm2PerM(4), 0.4),
    sealingEffectiveness: range(0.5, 0.7, 0.9),
    defaultCost: { materialsUsdPerUnit: 0.25, laborHoursPerUnit: 0.03 },
    cautionCodes: ['lead-safe-work'],
    sources: {
      leakageArea: nistNote('floor-wall joint (per metre)', '0.8 cm²/m', '4 cm²/m'),
      effectiveness: EFFECT_SEALANT,
      life: lifeFromMemory('15 years'),
      cost: COST_DEMO,
    },
    description:
      'Caulks the joint between floor and wall along exterior walls, behind or under the baseboard.',
  },
];

const BY_ID: ReadonlyMap<string, MeasureType> = new Map(
  MEASURE_LIBRARY.map((type) => [type.id, type]),
);

/**
 * Looks up a measure type by id.
 *
 * @param id - a kebab-case measure type id, e.g. "attic-top-plates"
 * @returns the type, or undefined when the library has no such id
 */
export function findMeasureType(id: string): MeasureType | undefined {
  return BY_ID.get(id);
}
