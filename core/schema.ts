/**
 * The home file, `sealwork-home/1`: one house, its leak test, its measures and the
 * assumptions, as JSON. This zod schema is the single definition of that format; the CLI,
 * export and import, and the tests all read it through `parseHomeFile`.
 *
 * Field names carry their units. Unknown fields are errors. Every error names the field's
 * path and what was expected there.
 */
import { z } from 'zod';
import { InputError, type InputProblem } from './errors.ts';
import { rangeSchema } from './_lib/range-schema.ts';
import { formatPath, problemsFromZod } from './_lib/zod-problems.ts';
import { crossFieldProblems } from './schema-rules.ts';
import { homeWeatherYearSchema } from './weather/weather-year-file.ts';

export const HOME_FILE_FORMAT = 'sealwork-home/1';

export const FUELS = [
  'naturalGas',
  'propane',
  'heatingOil',
  'kerosene',
  'electricity',
  'wood',
  'pellets',
] as const;
export type Fuel = (typeof FUELS)[number];

export const HEATING_EQUIPMENT = [
  'furnace',
  'boiler',
  'heatPump',
  'electricResistance',
  'stove',
] as const;
export type HeatingEquipment = (typeof HEATING_EQUIPMENT)[number];

export const COMBUSTION_VENTING = ['naturalDraft', 'inducedDraft', 'sealed', 'none'] as const;
export type CombustionVenting = (typeof COMBUSTION_VENTING)[number];

export const FOUNDATIONS = ['basement', 'crawlspace', 'slab'] as const;
export type Foundation = (typeof FOUNDATIONS)[number];

export const LEAK_LOCATIONS = ['ceiling', 'wall', 'floor', 'flue'] as const;
export type LeakLocation = (typeof LEAK_LOCATIONS)[number];

export const RANKINGS = ['sir', 'npv', 'payback', 'cce'] as const;
export type Ranking = (typeof RANKINGS)[number];

export const INFILTRATION_METHODS = ['nFactor', 'lblBasic', 'aim2', 'ashrae622'] as const;
export type InfiltrationMethod = (typeof INFILTRATION_METHODS)[number];

export const MEASURE_STATUSES = ['planned', 'done', 'declined'] as const;
export type MeasureStatus = (typeof MEASURE_STATUSES)[number];

export const APPLIANCE_KINDS = [
  'waterHeater',
  'furnace',
  'boiler',
  'spaceHeater',
  'range',
  'dryer',
  'fireplace',
  'stove',
] as const;
export type ApplianceKind = (typeof APPLIANCE_KINDS)[number];

export const FAN_TYPES = ['exhaust', 'supply', 'balanced'] as const;
export type FanType = (typeof FAN_TYPES)[number];

/** Fuels that burn in the house; electricity is the only one that does not. */
export const COMBUSTION_FUELS: readonly Fuel[] = FUELS.filter((fuel) => fuel !== 'electricity');

export { rangeSchema, type Range } from './_lib/range-schema.ts';

export const houseSchema = z.strictObject({
  conditionedFloorAreaFt2: z.number().positive().max(100_000),
  conditionedVolumeFt3: z.number().positive().max(2_000_000),
  stories: z.number().min(1).max(4),
  /** Height of the pressure boundary above grade, lowest to highest leak (stack height). */
  heightFt: z.number().positive().max(100),
  bedrooms: z.int().min(0).max(30),
  shelterClass: z.literal([1, 2, 3, 4, 5]),
  foundation: z.enum(FOUNDATIONS),
  yearBuilt: z.int().min(1600).max(2100),
  envelopeAreaFt2: z.number().positive().max(500_000).optional(),
  /** Height of the top of the chimney or flue above grade (enhanced model), ft. */
  flueHeightFt: z.number().positive().max(200).optional(),
  /** The land around the house, for the wind at its eaves (enhanced model). */
  siteTerrain: z.enum(['open', 'suburban']).optional(),
  knobAndTubeWiring: z.boolean().optional(),
  vermiculiteSuspected: z.boolean().optional(),
});

const seasonSchema = z.strictObject({
  /** Mean indoor − outdoor temperature difference over the season, °F (absolute). */
  meanDeltaTF: z.number().min(0).max(120),
  /** Mean wind speed at the weather station (10 m) over the season, mph. */
  meanWindSpeedMph: z.number().min(0).max(60),
  indoorTempF: z.number().min(40).max(90).optional(),
  /** Σ over cooling hours of (outdoor − indoor humidity ratio)⁺, grain/lb · h, for latent load. */
  latentGrainHours: z.number().min(0).max(10_000_000).optional(),
});

/**
 * A home planned hour by hour on the weather year of its climate (stored with the climate
 * when it was made from a weather file). Absent: the climate's degree days and season means.
 */
export const hourlyWeatherSchema = z.strictObject({
  /** Outdoor temperature below which the house needs heat, °F (65 by default). */
  heatingBalancePointF: z.number().min(30).max(80).optional(),
  /** Outdoor temperature above which the house needs cooling, °F (65 by default). */
  coolingBalancePointF: z.number().min(40).max(90).optional(),
});

export const climateSchema = z.strictObject({
  name: z.string().min(1).max(200),
  hdd65F: z.number().min(0).max(20_000),
  cdd65F: z.number().min(0).max(10_000),
  elevationFt: z.number().min(-1500).max(15_000),
  nFactorZone: z.literal([1, 2, 3, 4]).optional(),
  wsf: z.number().positive().max(3).optional(),
  heatingSeason: seasonSchema.optional(),
  coolingSeason: seasonSchema.optional(),
});

export const heatingSchema = z.strictObject({
  fuel: z.enum(FUELS),
  equipment: z.enum(HEATING_EQUIPMENT),
  /** AFUE or COP as a fraction; HSPF (Btu/Wh) for a heat pump. */
  // Bounded loosely here so a percentage typed by mistake (80) reaches the rule that explains it.
  efficiency: z.number().positive().max(1000),
  distributionEfficiency: z.number().min(0.3).max(1).optional(),
  combustionVenting: z.enum(COMBUSTION_VENTING).optional(),
  /** Whether the appliance sits inside the pressure boundary (default: yes). */
  insidePressureBoundary: z.boolean().optional(),
});

export const coolingSchema = z.strictObject({
  seer: z.number().min(5).max(40),
  distributionEfficiency: z.number().min(0.3).max(1).optional(),
});

const priceSchema = z.strictObject({
  usdPerUnit: z.number().min(0).max(10_000),
  escalationRateReal: z.number().min(-0.1).max(0.2).optional(),
});

export const pricesSchema = z.strictObject(
  Object.fromEntries(FUELS.map((fuel) => [fuel, priceSchema.optional()])) as Record<
    Fuel,
    z.ZodOptional<typeof priceSchema>
  >,
);

export const economicsSchema = z.strictObject({
  discountRateReal: z.number().min(-0.05).max(0.2),
  ranking: z.enum(RANKINGS).optional(),
});

/** A calendar date, `YYYY-MM-DD`, that exists. */
const isoDateSchema = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'expected a date as YYYY-MM-DD')
  .refine((text) => {
    const [year, month, day] = text.split('-').map(Number) as [number, number, number];
    const date = new Date(Date.UTC(year, month - 1, day));
    return (
      date.getUTCFullYear() === year &&
      date.getUTCMonth() === month - 1 &&
      date.getUTCDate() === day
    );
  }, 'expected a real calendar date');

export const LEAKAGE_TEST_KINDS = ['testIn', 'testOut'] as const;
export type LeakageTestKind = (typeof LEAKAGE_TEST_KINDS)[number];

const leakageTestFields = {
  cfm50: z.number().positive().max(100_000).optional(),
  exponentN: z.number().min(0.3).max(1.2).optional(),
  points: z
    .array(
      z.strictObject({
        pa: z.number().positive().max(200),
        cfm: z.number().positive().max(200_000),
      }),
    )
    .min(2)
    .max(50)
    .optional(),
  testedOn: isoDateSchema.optional(),
  note: z.string().max(2000).optional(),
};

/** One point or several, never both; a multipoint test fits its own exponent. */
function checkTestShape(ctx: {
  value: { cfm50?: number | undefined; points?: unknown; exponentN?: number | undefined };
  issues: z.core.$ZodRawIssue[];
}): void {
  const test = ctx.value;
  const hasPoint = test.cfm50 !== undefined;
  const hasPoints = test.points !== undefined;
  if (hasPoint === hasPoints) {
    ctx.issues.push({
      code: 'custom',
      input: test,
      message: 'expected either { cfm50 } for a one-point test or { points: [{ pa, cfm }] }',
    });
  }
  if (hasPoints && test.exponentN !== undefined) {
    ctx.issues.push({
      code: 'custom',
      input: test,
      path: ['exponentN'],
      message: 'a multipoint test fits its own exponent; leave exponentN out',
    });
  }
}

/** The test-in the plan is built on. */
export const leakageTestSchema = z.strictObject(leakageTestFields).check(checkTestShape);

/** Any other test of the home: earlier test-ins, test-outs after the work. */
export const otherLeakageTestSchema = z
  .strictObject({ kind: z.enum(LEAKAGE_TEST_KINDS), ...leakageTestFields })
  .check(checkTestShape);

/**
 * Realization factors applied to this home's estimates (from the program's test-outs): each
 * measure of a listed type that is not done yet has its estimated CFM50 range scaled by the
 * factor. Removing this restores the estimates exactly.
 */
export const calibrationSchema = z.strictObject({
  basis: z.strictObject({ label: z.string().min(1).max(200), date: isoDateSchema }),
  factors: z
    .array(
      z.strictObject({
        type: z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'expected a kebab-case measure type id'),
        factor: z.number().min(0).max(5),
        /** Tested homes behind the factor. */
        homes: z.int().min(1).max(1_000_000),
        intervalLow: z.number().min(0).max(10).optional(),
        intervalHigh: z.number().min(0).max(10).optional(),
      }),
    )
    .min(1)
    .max(100)
    .refine(
      (factors) => new Set(factors.map((entry) => entry.type)).size === factors.length,
      'expected each measure type once',
    ),
});
export type Calibration = z.output<typeof calibrationSchema>;

export const costSchema = z.strictObject({
  materialsUsd: z.number().min(0).max(1_000_000),
  laborHours: z.number().min(0).max(10_000),
  laborRateUsdPerHour: z.number().min(0).max(1_000),
  markupFraction: z.number().min(0).max(5).optional(),
  healthAndSafety: z.boolean().optional(),
});

export const measureSchema = z.strictObject({
  id: z.string().min(1).max(64),
  type: z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'expected a kebab-case measure type id'),
  location: z.enum(LEAK_LOCATIONS).optional(),
  /** Direct estimate of the CFM50 this measure removes. */
  reductionCfm50: rangeSchema({ min: 0, max: 100_000 }).optional(),
  /** Units × component leakage area × sealing effectiveness (defaults from the library). */
  byUnits: z
    .strictObject({
      units: z.number().positive().max(100_000),
      leakageAreaIn2PerUnit: rangeSchema({ min: 0, max: 10_000 }).optional(),
      sealingEffectiveness: rangeSchema({ min: 0, max: 1 }).optional(),
    })
    .optional(),
  /** A share of the leakage found at the measure's location at test-in. */
  shareOfLocation: z.strictObject({ share: rangeSchema({ min: 0, max: 1 }) }).optional(),
  cost: costSchema,
  lifeYears: z.int().min(1).max(100).optional(),
  status: z.enum(MEASURE_STATUSES).optional(),
  note: z.string().max(2000).optional(),
});

export const applianceSchema = z.strictObject({
  kind: z.enum(APPLIANCE_KINDS),
  fuel: z.enum(FUELS),
  venting: z.enum(COMBUSTION_VENTING),
  insidePressureBoundary: z.boolean().optional(),
});

export const ventilationSchema = z.strictObject({
  existingFanCfm: z.number().min(0).max(2_000).optional(),
  fanType: z.enum(FAN_TYPES).optional(),
  fanCostUsd: z.number().min(0).max(50_000).optional(),
  fanWattsPerCfm: z.number().min(0).max(5).optional(),
  fanLifeYears: z.int().min(1).max(50).optional(),
});

export const emissionsSchema = z.strictObject({
  electricityKgCo2PerKwh: z.number().min(0).max(2),
});

export const financingSchema = z.strictObject({
  aprNominal: z.number().min(0).max(0.5),
  months: z.int().min(1).max(480),
});

export const leakSharesSchema = z.strictObject({
  ceiling: z.number().min(0).max(1),
  wall: z.number().min(0).max(1),
  floor: z.number().min(0).max(1),
  flue: z.number().min(0).max(1),
});

export const homeFileSchema = z
  .strictObject({
    format: z.literal(HOME_FILE_FORMAT),
    name: z.string().max(200).regex(/\S/, 'expected a name with at least one letter or digit'),
    /** True for the invented demo scenario, so it is never mistaken for a client's home. */
    demo: z.boolean().optional(),
    address: z
      .strictObject({
        street: z.string().min(1).max(200).optional(),
        town: z.string().max(100).optional(),
        region: z.string().max(100).optional(),
        postalCode: z.string().max(20).optional(),
      })
      .optional(),
    client: z
      .strictObject({
        name: z.string().min(1).max(200),
        phone: z.string().max(50).optional(),
        email: z.string().max(200).optional(),
      })
      .optional(),
    notes: z.string().max(10_000).optional(),
    house: houseSchema,
    climate: climateSchema,
    hourlyWeather: hourlyWeatherSchema.optional(),
    heating: heatingSchema,
    cooling: coolingSchema.nullable().optional(),
    prices: pricesSchema,
    economics: economicsSchema,
    infiltrationMethod: z.enum(INFILTRATION_METHODS),
    nFactorOverride: z.number().min(5).max(40).optional(),
    leakShares: leakSharesSchema.optional(),
    leakageTest: leakageTestSchema,
    otherLeakageTests: z.array(otherLeakageTestSchema).max(50).optional(),
    leakageFloorCfm50: z.number().min(0).max(100_000).optional(),
    combustionAppliances: z.array(applianceSchema).max(20).optional(),
    ventilation: ventilationSchema.optional(),
    emissions: emissionsSchema.optional(),
    financing: financingSchema.optional(),
    calibration: calibrationSchema.optional(),
    measures: z.array(measureSchema).max(200),
    /**
     * The weather year an hourly home is planned on (core/weather/weather-year-file.ts),
     * written by export so the file stands on its own; last, after the home itself.
     */
    weatherYear: homeWeatherYearSchema.optional(),
  })
  .superRefine(
    (home, ctx) => {
      for (const problem of crossFieldProblems(home, refusedPaths(ctx.issues))) {
        ctx.addIssue({ code: 'custom', input: home, path: problem.path, message: problem.message });
      }
      // This runs even on input that is no object at all (refused above), so it checks first.
      const given = typeof home === 'object' && home !== null ? home : undefined;
      if (given?.weatherYear !== undefined && given.hourlyWeather === undefined) {
        ctx.addIssue({
          code: 'custom',
          input: home,
          path: ['weatherYear'],
          message:
            'is the year of a home planned hour by hour: add hourlyWeather ({} for balance points of 65 °F), or leave weatherYear out',
        });
      }
    },
    // Run even when some fields were refused: each rule skips the fields that were.
    { when: () => true },
  );

/** Paths zod has refused so far, unknown keys included as their own paths. */
function refusedPaths(issues: readonly z.core.$ZodRawIssue[]): string[] {
  return issues.flatMap((issue) => {
    const path = formatPath(issue.path ?? []);
    if (issue.code === 'unrecognized_keys') {
      return (issue.keys as string[]).map((key) => (path === '' ? key : `${path}.${key}`));
    }
    return [path];
  });
}

export type HomeFile = z.output<typeof homeFileSchema>;

/**
 * The parts of a home that describe the house and its assumptions, each optional so a home
 * can be saved while the auditor is still filling it in; each part present must be whole.
 * A draft becomes a home file (and can be evaluated) once every required part is there.
 */
export const homeDataSchema = z.strictObject({
  house: houseSchema.optional(),
  climate: climateSchema.optional(),
  hourlyWeather: hourlyWeatherSchema.optional(),
  heating: heatingSchema.optional(),
  cooling: coolingSchema.nullable().optional(),
  prices: pricesSchema.optional(),
  economics: economicsSchema.optional(),
  infiltrationMethod: z.enum(INFILTRATION_METHODS).optional(),
  nFactorOverride: z.number().min(5).max(40).optional(),
  leakShares: leakSharesSchema.optional(),
  leakageFloorCfm50: z.number().min(0).max(100_000).optional(),
  combustionAppliances: z.array(applianceSchema).max(20).optional(),
  ventilation: ventilationSchema.optional(),
  emissions: emissionsSchema.optional(),
  financing: financingSchema.optional(),
  calibration: calibrationSchema.optional(),
});
export type HomeData = z.output<typeof homeDataSchema>;
export type Measure = HomeFile['measures'][number];
export type House = HomeFile['house'];
export type Climate = HomeFile['climate'];
export type Heating = HomeFile['heating'];
export type Cooling = NonNullable<HomeFile['cooling']>;
export type CombustionAppliance = NonNullable<HomeFile['combustionAppliances']>[number];
export type LeakShares = NonNullable<HomeFile['leakShares']>;
export type LeakageTest = HomeFile['leakageTest'];
export type OtherLeakageTest = NonNullable<HomeFile['otherLeakageTests']>[number];

/** Parses and checks a home file; throws `InputError` listing every problem found. */
export function parseHomeFile(input: unknown): HomeFile {
  const result = homeFileSchema.safeParse(input);
  if (result.success) return result.data;
  throw new InputError(problemsFromZod(result.error, input));
}

/** Like `parseHomeFile`, but returns the problems instead of throwing. */
export function checkHomeFile(
  input: unknown,
): { ok: true; home: HomeFile } | { ok: false; problems: readonly InputProblem[] } {
  const result = homeFileSchema.safeParse(input);
  if (result.success) return { ok: true, home: result.data };
  return { ok: false, problems: problemsFromZod(result.error, input) };
}

/** A home file as written, before defaults: what demo data and tests construct. */
export type HomeFileInput = z.input<typeof homeFileSchema>;
