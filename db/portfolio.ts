/**
 * The portfolio at a glance: how many homes, by heating fuel, town and decade built; the
 * spread of their test-in leakage; their measures by status and type with the planned cost.
 * Counts, groupings, each home's ACH50 and each measure's cost are computed by SQLite over the
 * stored rows (the homes table's generated columns), so the summary of 10,000 homes opens in
 * a fraction of a second; only tests given as several readings are fitted here, by the core.
 */
import { InputError } from '../core/errors.ts';
import { fitMultipointTest } from '../core/leakage.ts';
import { MEASURE_STATUSES } from '../core/schema.ts';
import type { ReadAccess } from './store.ts';

/** A spread of values: the extremes, the 10th, 50th and 90th percentiles and the mean. */
export interface Distribution {
  count: number;
  min: number;
  p10: number;
  median: number;
  p90: number;
  max: number;
  mean: number;
}

export interface PortfolioSummary {
  /** Live (not deleted) homes, the invented demo homes among them counted apart. */
  homes: number;
  demoHomes: number;
  /** Homes still missing a part a plan needs (house, climate, heating, prices, …, a test-in). */
  incompleteHomes: number;
  byFuel: { fuel: string | null; homes: number }[];
  byTown: { town: string | null; homes: number }[];
  /** By the decade of `yearBuilt` (1950 for 1950–1959); null for homes without one. */
  byDecade: { decade: number | null; homes: number }[];
  byJobStatus: { status: string; homes: number }[];
  leakage: {
    /** Homes whose latest test-in gives a CFM50 and whose volume is known. */
    homesCounted: number;
    /** Of those, homes whose test was several readings, fitted by the core. */
    fittedMultipoint: number;
    leftOut: { noTestIn: number; noVolume: number; readingsUnfit: number };
    /** Sum of the counted homes' test-in CFM50. */
    cfm50Total: number;
    /** ACH50 = CFM50 × 60 / volume, over the counted homes; null when there are none. */
    ach50: Distribution | null;
  };
  measures: {
    count: number;
    costUsd: number;
    byStatus: { status: string; count: number; costUsd: number }[];
    /** Per measure type: how many, how many still planned and the cost of those. */
    byType: { type: string; count: number; plannedCount: number; plannedCostUsd: number }[];
  };
}

/**
 * Quantile of sorted values by linear interpolation between closest ranks.
 *
 * Notes: h = (n − 1)·p; Q = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌊h⌋ + 1] − x[⌊h⌋]) (0-based).
 *
 * References: Hyndman & Fan (1996), "Sample Quantiles in Statistical Packages", The American
 * Statistician 50(4), definition 7; the same as a spreadsheet's PERCENTILE.INC.
 */
function quantileSorted(sorted: readonly number[], fraction: number): number {
  const rank = (sorted.length - 1) * fraction;
  const below = Math.floor(rank);
  const low = sorted[below] ?? 0;
  const high = sorted[Math.min(below + 1, sorted.length - 1)] ?? low;
  return low + (rank - below) * (high - low);
}

function distributionOf(values: number[]): Distribution | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((first, second) => first - second);
  return {
    count: sorted.length,
    min: sorted[0] ?? 0,
    p10: quantileSorted(sorted, 0.1),
    median: quantileSorted(sorted, 0.5),
    p90: quantileSorted(sorted, 0.9),
    max: sorted[sorted.length - 1] ?? 0,
    mean: sorted.reduce((sum, value) => sum + value, 0) / sorted.length,
  };
}

/** Homes a plan cannot be made for yet: a part missing, or no test-in. */
const INCOMPLETE = `
  (json_type(data, '$.house') IS NULL OR json_type(data, '$.heating') IS NULL
   OR json_type(data, '$.economics') IS NULL OR json_type(data, '$.infiltrationMethod') IS NULL
   OR (climate_id IS NULL AND json_type(data, '$.climate') IS NULL)
   OR (price_set_id IS NULL AND json_type(data, '$.prices') IS NULL)
   OR NOT EXISTS (SELECT 1 FROM leakage_tests t WHERE t.home_id = homes.id AND t.kind = 'testIn'))`;

/** Every count of homes in one pass over the table (its JSON read once per home). */
const HOME_COUNTS = `
  WITH live AS MATERIALIZED (
    SELECT town, heating_fuel, year_built, job_stage, is_demo, ${INCOMPLETE} AS incomplete
    FROM homes WHERE deleted_at IS NULL)
  SELECT 'all' AS dimension, NULL AS value, count(*) AS homes,
         coalesce(sum(is_demo), 0) AS demo, coalesce(sum(incomplete), 0) AS incomplete FROM live
  UNION ALL SELECT 'fuel', heating_fuel, count(*), 0, 0 FROM live GROUP BY heating_fuel
  UNION ALL SELECT 'town', town, count(*), 0, 0 FROM live GROUP BY town
  UNION ALL SELECT 'decade', (year_built / 10) * 10, count(*), 0, 0 FROM live GROUP BY 2
  UNION ALL SELECT 'jobStatus', job_stage, count(*), 0, 0 FROM live GROUP BY job_stage`;

/**
 * Each live home's test-in a plan would use (`planTestOf`): the one marked as its basis, else
 * the latest dated, the first listed among equals.
 */
const LATEST_TEST_IN = `
  SELECT t.id AS test_id, t.cfm50, l.volume_ft3
  FROM (SELECT volume_ft3,
               (SELECT t.id FROM leakage_tests t WHERE t.home_id = homes.id AND t.kind = 'testIn'
                ORDER BY t.plan_basis DESC, coalesce(t.tested_on, '') DESC, t.position LIMIT 1) AS test_id
        FROM homes WHERE deleted_at IS NULL) l
  JOIN leakage_tests t ON t.id = l.test_id`;

/**
 * A measure's cost in cents as the core reckons it: materials and labour each rounded to the
 * cent, markup on their sum rounded to the cent, half away from zero. The 1e-7 cent nudge
 * makes an amount typed as an exact half cent (1.005) round up, as it does in decimal.
 */
const MEASURE_COST_CENTS = `
  (m.materials_cents + m.labor_cents
   + CAST(round((m.materials_cents + m.labor_cents) * coalesce(m.markup_fraction, 0) + 1e-7) AS INTEGER))`;
const MEASURES_BY_TYPE_AND_STATUS = `
  SELECT m.type_id AS type, m.status AS status, count(*) AS count,
         sum(${MEASURE_COST_CENTS}) AS cost_cents
  FROM (SELECT home_id, type_id, status, markup_fraction,
               CAST(round(materials_usd * 100 + 1e-7) AS INTEGER) AS materials_cents,
               CAST(round(labor_hours * labor_rate_usd_per_hour * 100 + 1e-7) AS INTEGER) AS labor_cents
        FROM measures) m
  JOIN homes h ON h.id = m.home_id
  WHERE h.deleted_at IS NULL
  GROUP BY m.type_id, m.status
  ORDER BY m.type_id, m.status`;

function leakageOf(read: ReadAccess, homes: number): PortfolioSummary['leakage'] {
  const tests = read.statement(LATEST_TEST_IN).all() as {
    test_id: number;
    cfm50: number | null;
    volume_ft3: number | null;
  }[];
  const pointsOf = read.statement(
    'SELECT pressure_pa, flow_cfm FROM leakage_test_points WHERE test_id = ? ORDER BY position',
  );
  const ach50s: number[] = [];
  const leftOut = { noTestIn: homes - tests.length, noVolume: 0, readingsUnfit: 0 };
  let fittedMultipoint = 0;
  let cfm50Total = 0;
  for (const test of tests) {
    if (test.volume_ft3 === null || test.volume_ft3 <= 0) {
      leftOut.noVolume += 1;
      continue;
    }
    let cfm50 = test.cfm50;
    if (cfm50 === null) {
      const points = pointsOf.all(test.test_id) as { pressure_pa: number; flow_cfm: number }[];
      try {
        cfm50 = fitMultipointTest(
          points.map((point) => ({ pressurePa: point.pressure_pa, flowCfm: point.flow_cfm })),
        ).cfm50;
        fittedMultipoint += 1;
      } catch (error) {
        if (!(error instanceof InputError)) throw error;
        leftOut.readingsUnfit += 1;
        continue;
      }
    }
    cfm50Total += cfm50;
    ach50s.push((cfm50 * 60) / test.volume_ft3);
  }
  return {
    homesCounted: ach50s.length,
    fittedMultipoint,
    leftOut,
    cfm50Total,
    ach50: distributionOf(ach50s),
  };
}

function measuresOf(read: ReadAccess): PortfolioSummary['measures'] {
  const rows = read.statement(MEASURES_BY_TYPE_AND_STATUS).all() as {
    type: string;
    status: string;
    count: number;
    cost_cents: number;
  }[];
  const byStatus = new Map<string, { status: string; count: number; costCents: number }>();
  const byType = new Map<
    string,
    { type: string; count: number; plannedCount: number; cents: number }
  >();
  for (const row of rows) {
    const status = byStatus.get(row.status) ?? { status: row.status, count: 0, costCents: 0 };
    status.count += row.count;
    status.costCents += row.cost_cents;
    byStatus.set(row.status, status);
    const type = byType.get(row.type) ?? { type: row.type, count: 0, plannedCount: 0, cents: 0 };
    type.count += row.count;
    if (row.status === 'planned') {
      type.plannedCount += row.count;
      type.cents += row.cost_cents;
    }
    byType.set(row.type, type);
  }
  const order = (status: string) => MEASURE_STATUSES.indexOf(status as never);
  const statuses = [...byStatus.values()].sort(
    (first, second) => order(first.status) - order(second.status),
  );
  return {
    count: statuses.reduce((sum, status) => sum + status.count, 0),
    costUsd: statuses.reduce((sum, status) => sum + status.costCents, 0) / 100,
    byStatus: statuses.map(({ status, count, costCents }) => ({
      status,
      count,
      costUsd: costCents / 100,
    })),
    byType: [...byType.values()].map(({ type, count, plannedCount, cents }) => ({
      type,
      count,
      plannedCount,
      plannedCostUsd: cents / 100,
    })),
  };
}

/** Values in order, the homes that have none last. */
function byValue(first: string | number | null, second: string | number | null): number {
  if (first === null || second === null)
    return (first === null ? 1 : 0) - (second === null ? 1 : 0);
  return typeof first === 'number' && typeof second === 'number'
    ? first - second
    : String(first).localeCompare(String(second));
}

/**
 * The portfolio summary of every live home in the project.
 *
 * @param read - the project
 * @returns counts by fuel, town and job status (most homes first) and by decade built (oldest
 *   first); test-in leakage (CFM50 total, ACH50 spread, what was left out and why); measures by
 *   status and type, costs in dollars to the cent
 *
 * Notes: ACH50 = CFM50 × 60 / conditioned volume [ft³], from each home's latest test-in (the one
 * a plan uses). Percentiles interpolate between closest ranks. A measure's cost is materials +
 * labour hours × rate + markup × (materials + labour), each part rounded to the cent.
 *
 * References: ACH50 as in ASTM E779 reporting practice (common practice); percentiles: Hyndman
 * & Fan (1996), definition 7.
 */
export function portfolioSummary(read: ReadAccess): PortfolioSummary {
  const rows = read.statement(HOME_COUNTS).all() as {
    dimension: 'all' | 'fuel' | 'town' | 'decade' | 'jobStatus';
    value: string | number | null;
    homes: number;
    demo: number;
    incomplete: number;
  }[];
  const all = rows.find((row) => row.dimension === 'all');
  const homes = all?.homes ?? 0;
  const groups = <T extends string | number | null>(dimension: string) =>
    rows
      .filter((row) => row.dimension === dimension)
      .map((row) => ({ value: row.value as T, homes: row.homes }))
      .sort((first, second) => second.homes - first.homes || byValue(first.value, second.value));
  return {
    homes,
    demoHomes: all?.demo ?? 0,
    incompleteHomes: all?.incomplete ?? 0,
    byFuel: groups<string | null>('fuel').map(({ value, homes }) => ({ fuel: value, homes })),
    byTown: groups<string | null>('town').map(({ value, homes }) => ({ town: value, homes })),
    byDecade: groups<number | null>('decade')
      .sort((first, second) => byValue(first.value, second.value))
      .map(({ value, homes }) => ({ decade: value, homes })),
    byJobStatus: groups<string>('jobStatus').map(({ value, homes }) => ({ status: value, homes })),
    leakage: leakageOf(read, homes),
    measures: measuresOf(read),
  };
}
