/**
 * fast-check arbitraries of valid home files: every infiltration method with what it needs,
 * fuels and equipment that go together, with and without cooling, one-point and multipoint
 * leak tests, and 1–20 measures using all three estimate kinds.
 *
 * Values are drawn on coarse grids (cents, tenths) so a shrunk counterexample reads like a
 * house. Every home also carries an electricity price: the evaluation needs one whenever the
 * tighter house calls for a ventilation fan, which a generator cannot know in advance.
 */
import fc from 'fast-check';
import { MEASURE_LIBRARY } from '../../core/measure-library.ts';
import type { HomeFileInput } from '../../core/schema.ts';

type Measure = HomeFileInput['measures'][number];
type Range = { low: number; likely: number; high: number };

/**
 * Numbers on a grid.
 *
 * @param min - smallest value, in the unit of the field it feeds
 * @param max - largest value, same unit
 * @param step - grid spacing, same unit
 * @returns an arbitrary of min + k·step up to max
 */
export function onGrid(min: number, max: number, step: number): fc.Arbitrary<number> {
  const steps = Math.round((max - min) / step);
  return fc.integer({ min: 0, max: steps }).map((k) => Number((min + k * step).toFixed(10)));
}

/**
 * Estimate ranges low ≤ likely ≤ high, each on the grid.
 *
 * @param min - smallest value, in the unit of the field it feeds
 * @param max - largest value, same unit
 * @param step - grid spacing, same unit
 * @returns an arbitrary of { low, likely, high }
 */
export function rangeOnGrid(min: number, max: number, step: number): fc.Arbitrary<Range> {
  const value = onGrid(min, max, step);
  return fc.tuple(value, value, value).map((values) => {
    const [low, likely, high] = [...values].sort((a, b) => a - b) as [number, number, number];
    return { low, likely, high };
  });
}

const TYPE_IDS = MEASURE_LIBRARY.map((type) => type.id);

/** Heating systems whose fuel, equipment and efficiency go together, with the fuel's price. */
const heatingArbitrary = fc.oneof(
  fc.record({
    fuel: fc.constantFrom('naturalGas', 'propane', 'heatingOil', 'kerosene'),
    equipment: fc.constantFrom('furnace', 'boiler'),
    efficiency: onGrid(0.55, 0.98, 0.01),
    venting: fc.constantFrom('naturalDraft', 'inducedDraft', 'sealed', undefined),
  }),
  fc.record({
    fuel: fc.constantFrom('wood', 'pellets'),
    equipment: fc.constant('stove'),
    efficiency: onGrid(0.4, 0.85, 0.01),
    venting: fc.constantFrom('naturalDraft', undefined),
  }),
  fc.record({
    fuel: fc.constant('electricity'),
    equipment: fc.constant('heatPump'),
    efficiency: onGrid(6, 13, 0.1),
    venting: fc.constantFrom('none', undefined),
  }),
  fc.record({
    fuel: fc.constant('electricity'),
    equipment: fc.constant('electricResistance'),
    efficiency: onGrid(0.95, 1, 0.01),
    venting: fc.constant(undefined),
  }),
);

/** Price per customary unit (therm, gallon, kWh, cord, ton), USD. */
const PRICE_GRID: Record<string, [number, number]> = {
  naturalGas: [0.6, 2.5],
  propane: [1.5, 4.5],
  heatingOil: [2, 5],
  kerosene: [2.5, 5.5],
  electricity: [0.08, 0.4],
  wood: [150, 450],
  pellets: [200, 450],
};

function priceArbitrary(fuel: string) {
  const [min, max] = PRICE_GRID[fuel] ?? [1, 2];
  return fc.record(
    {
      usdPerUnit: onGrid(min, max, fuel === 'electricity' ? 0.001 : 0.01),
      escalationRateReal: onGrid(-0.02, 0.04, 0.005),
    },
    { requiredKeys: ['usdPerUnit'] },
  );
}

const seasonArbitrary = (deltaMaxF: number) =>
  fc.record(
    {
      meanDeltaTF: onGrid(2, deltaMaxF, 0.5),
      meanWindSpeedMph: onGrid(1, 15, 0.5),
      indoorTempF: onGrid(62, 78, 1),
      latentGrainHours: onGrid(0, 40_000, 100),
    },
    { requiredKeys: ['meanDeltaTF', 'meanWindSpeedMph'] },
  );

const leakageTestArbitrary = fc.oneof(
  fc.record(
    { cfm50: onGrid(400, 9000, 10), exponentN: onGrid(0.5, 0.8, 0.01) },
    { requiredKeys: ['cfm50'] },
  ),
  // A multipoint test: readings on a power law with a little scatter, pressures at least 4 Pa
  // apart over a span of 20 Pa or more, so the fitted n stays within 0.3–1.2.
  fc
    .record({
      cfm50: onGrid(400, 9000, 10),
      exponentN: onGrid(0.5, 0.8, 0.01),
      pressuresPa: fc.uniqueArray(fc.integer({ min: 2, max: 15 }), { minLength: 2, maxLength: 8 }),
      scatter: fc.array(onGrid(-0.02, 0.02, 0.001), { minLength: 8, maxLength: 8 }),
    })
    .filter(({ pressuresPa }) => Math.max(...pressuresPa) - Math.min(...pressuresPa) >= 5)
    .map(({ cfm50, exponentN, pressuresPa, scatter }) => ({
      points: pressuresPa.map((k, index) => {
        const pa = 4 * k;
        const cfm = cfm50 * (pa / 50) ** exponentN * (1 + (scatter[index] ?? 0));
        return { pa, cfm: Math.round(cfm * 10) / 10 };
      }),
    })),
);

const costArbitrary = fc.record(
  {
    materialsUsd: onGrid(0, 1500, 0.01),
    laborHours: onGrid(0, 40, 0.25),
    laborRateUsdPerHour: onGrid(20, 120, 0.5),
    markupFraction: onGrid(0, 0.5, 0.005),
    healthAndSafety: fc.boolean(),
  },
  { requiredKeys: ['materialsUsd', 'laborHours', 'laborRateUsdPerHour'] },
);

const estimateArbitrary = fc.oneof(
  fc.record({ reductionCfm50: rangeOnGrid(0, 900, 1) }),
  fc.record({
    byUnits: fc.record(
      {
        units: onGrid(1, 60, 1),
        leakageAreaIn2PerUnit: rangeOnGrid(0, 6, 0.05),
        sealingEffectiveness: rangeOnGrid(0.3, 1, 0.01),
      },
      { requiredKeys: ['units'] },
    ),
  }),
  fc.record({ shareOfLocation: fc.record({ share: rangeOnGrid(0, 0.8, 0.01) }) }),
);

const measureBodyArbitrary = fc
  .record(
    {
      type: fc.constantFrom(...TYPE_IDS),
      location: fc.constantFrom('ceiling', 'wall', 'floor', 'flue'),
      estimate: estimateArbitrary,
      cost: costArbitrary,
      lifeYears: fc.integer({ min: 5, max: 30 }),
      status: fc.constantFrom('planned', 'done', 'declined'),
    },
    { requiredKeys: ['type', 'estimate', 'cost'] },
  )
  .map(({ estimate, ...rest }) => ({ ...rest, ...estimate }));

/**
 * Measures with unique ids m1…mN, of any library type and any estimate kind.
 *
 * @param count - how many, at least and at most
 * @returns an arbitrary of measure lists
 */
export function measuresArbitrary(count: { min: number; max: number }): fc.Arbitrary<Measure[]> {
  return fc
    .array(measureBodyArbitrary, { minLength: count.min, maxLength: count.max })
    .map((bodies) => bodies.map((body, index) => ({ id: `m${index + 1}`, ...body }) as Measure));
}

/** Shares of ceiling, wall, floor and flue summing to 1. */
const leakSharesArbitrary = fc
  .tuple(onGrid(0, 1, 0.05), onGrid(0.05, 1, 0.05), onGrid(0, 1, 0.05), onGrid(0, 0.3, 0.05))
  .map(([ceiling, wall, floor, flue]) => {
    const total = ceiling + wall + floor + flue;
    const rounded = (share: number) => Math.round((share / total) * 1000) / 1000;
    const [c, f, y] = [rounded(ceiling), rounded(floor), rounded(flue)];
    // The walls take the rounding remainder; their share is never small, so it stays positive.
    return { ceiling: c, wall: Number((1 - c - f - y).toFixed(3)), floor: f, flue: y };
  });

export interface HomeArbitraryOptions {
  /** How many measures (default 1–20). */
  measureCount?: { min: number; max: number };
  /** Restrict the infiltration methods drawn. */
  methods?: readonly HomeFileInput['infiltrationMethod'][];
}

/**
 * Valid home files.
 *
 * @param options - how many measures, and which infiltration methods
 * @returns an arbitrary of home files as plain JSON
 */
export function homeArbitrary(options: HomeArbitraryOptions = {}): fc.Arbitrary<HomeFileInput> {
  const methods = options.methods ?? (['nFactor', 'lblBasic', 'aim2', 'ashrae622'] as const);
  return fc
    .record({
      floorAreaFt2: onGrid(600, 5000, 10),
      meanCeilingFt: onGrid(7, 12, 0.1),
      stories: fc.constantFrom(1, 1.5, 2, 2.5, 3),
      extraHeightFt: onGrid(0, 10, 0.5),
      bedrooms: fc.integer({ min: 0, max: 6 }),
      shelterClass: fc.constantFrom(1, 2, 3, 4, 5),
      foundation: fc.constantFrom('basement', 'crawlspace', 'slab'),
      yearBuilt: fc.integer({ min: 1880, max: 2020 }),
      hdd65F: onGrid(800, 9500, 10),
      cdd65F: onGrid(0, 3000, 10),
      elevationFt: onGrid(-100, 7000, 10),
      nFactorZone: fc.option(fc.constantFrom(1, 2, 3, 4), { nil: undefined }),
      nFactorOverride: fc.option(onGrid(8, 30, 0.1), { nil: undefined }),
      wsf: fc.option(onGrid(0.3, 1, 0.01), { nil: undefined }),
      heatingSeason: seasonArbitrary(60),
      coolingSeason: seasonArbitrary(20),
      heating: heatingArbitrary,
      distributionEfficiency: fc.option(onGrid(0.6, 1, 0.01), { nil: undefined }),
      seer: fc.option(onGrid(10, 24, 0.5), { nil: undefined }),
      electricityPrice: priceArbitrary('electricity'),
      fuelPrices: fc.record({
        naturalGas: priceArbitrary('naturalGas'),
        propane: priceArbitrary('propane'),
        heatingOil: priceArbitrary('heatingOil'),
        kerosene: priceArbitrary('kerosene'),
        wood: priceArbitrary('wood'),
        pellets: priceArbitrary('pellets'),
      }),
      discountRateReal: onGrid(0, 0.07, 0.005),
      ranking: fc.constantFrom('sir', 'npv', 'payback', 'cce', undefined),
      method: fc.constantFrom(...methods),
      leakShares: fc.option(leakSharesArbitrary, { nil: undefined }),
      leakageTest: leakageTestArbitrary,
      floorFraction: fc.option(onGrid(0, 0.9, 0.05), { nil: undefined }),
      ventilation: fc.option(
        fc.record(
          {
            existingFanCfm: onGrid(0, 150, 5),
            fanType: fc.constantFrom('exhaust', 'supply', 'balanced'),
            fanCostUsd: onGrid(0, 1500, 0.01),
            fanWattsPerCfm: onGrid(0.1, 1, 0.01),
          },
          { requiredKeys: [] },
        ),
        { nil: undefined },
      ),
      gridKgCo2PerKwh: fc.option(onGrid(0, 1, 0.01), { nil: undefined }),
      financing: fc.option(
        fc.record({
          aprNominal: onGrid(0, 0.12, 0.0025),
          months: fc.integer({ min: 12, max: 240 }),
        }),
        { nil: undefined },
      ),
      measures: measuresArbitrary(options.measureCount ?? { min: 1, max: 20 }),
    })
    .map((draw) => {
      const { heating, method } = draw;
      const cfm50Test =
        'cfm50' in draw.leakageTest
          ? draw.leakageTest.cfm50
          : (draw.leakageTest.points[0]?.cfm ?? 1000);
      const needsZone = method === 'nFactor' && draw.nFactorOverride === undefined;
      const needsSeasons = method === 'lblBasic' || method === 'aim2';
      const home: HomeFileInput = {
        format: 'sealwork-home/1',
        name: 'Generated house',
        house: {
          conditionedFloorAreaFt2: draw.floorAreaFt2,
          conditionedVolumeFt3: Math.round(draw.floorAreaFt2 * draw.meanCeilingFt),
          stories: draw.stories,
          heightFt: Number((draw.stories * 8.5 + draw.extraHeightFt).toFixed(1)),
          bedrooms: draw.bedrooms,
          shelterClass: draw.shelterClass,
          foundation: draw.foundation,
          yearBuilt: draw.yearBuilt,
        },
        climate: {
          name: 'Generated climate',
          hdd65F: draw.hdd65F,
          cdd65F: draw.cdd65F,
          elevationFt: draw.elevationFt,
          ...(needsZone ? { nFactorZone: draw.nFactorZone ?? 2 } : {}),
          ...(draw.nFactorZone !== undefined ? { nFactorZone: draw.nFactorZone } : {}),
          ...(method === 'ashrae622' || draw.wsf !== undefined ? { wsf: draw.wsf ?? 0.6 } : {}),
          ...(needsSeasons ? { heatingSeason: draw.heatingSeason } : {}),
          ...(needsSeasons && draw.seer !== undefined ? { coolingSeason: draw.coolingSeason } : {}),
        },
        heating: {
          fuel: heating.fuel,
          equipment: heating.equipment,
          efficiency: heating.efficiency,
          ...(draw.distributionEfficiency !== undefined
            ? { distributionEfficiency: draw.distributionEfficiency }
            : {}),
          ...(heating.venting !== undefined ? { combustionVenting: heating.venting } : {}),
        } as HomeFileInput['heating'],
        ...(draw.seer !== undefined ? { cooling: { seer: draw.seer } } : {}),
        prices: {
          electricity: draw.electricityPrice,
          ...(heating.fuel === 'electricity'
            ? {}
            : { [heating.fuel]: draw.fuelPrices[heating.fuel as keyof typeof draw.fuelPrices] }),
        },
        economics: {
          discountRateReal: draw.discountRateReal,
          ...(draw.ranking !== undefined ? { ranking: draw.ranking } : {}),
        },
        infiltrationMethod: method,
        ...(method === 'nFactor' && draw.nFactorOverride !== undefined
          ? { nFactorOverride: draw.nFactorOverride }
          : {}),
        ...(draw.leakShares !== undefined ? { leakShares: draw.leakShares } : {}),
        leakageTest: draw.leakageTest,
        ...(draw.floorFraction !== undefined
          ? { leakageFloorCfm50: Math.round(cfm50Test * draw.floorFraction) }
          : {}),
        ...(draw.ventilation !== undefined ? { ventilation: draw.ventilation } : {}),
        ...(draw.gridKgCo2PerKwh !== undefined
          ? { emissions: { electricityKgCo2PerKwh: draw.gridKgCo2PerKwh } }
          : {}),
        ...(draw.financing !== undefined ? { financing: draw.financing } : {}),
        measures: draw.measures,
      };
      // What a home file read from disk holds: plain objects, no undefined fields.
      return JSON.parse(JSON.stringify(home)) as HomeFileInput;
    });
}
