/**
 * Homes: the house, its climate and equipment, fuels and prices, and the plan's assumptions.
 * A home may be a draft (parts still missing) while it is being filled in; every part it has
 * is whole and valid. Deleting is soft: a deleted home is hidden, recoverable, until purged.
 */
import { z } from 'zod';
import { InputError } from '../../core/errors.ts';
import { ach50, fitMultipointTest, type BlowerDoorPoint } from '../../core/leakage.ts';
import { JOB_STAGES, JOB_STATUSES, type JobStage, type JobStatus } from '../../core/job-status.ts';
import { homeDataSchema, type HomeData } from '../../core/schema.ts';
import { classifySqliteError, DbError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { flag, found, readJson, validated } from './_rows.ts';

export { JOB_STATUSES, type JobStatus } from '../../core/job-status.ts';

/**
 * The job statuses of Sealwork before the stages of core/job-status.ts (schema version 5 and
 * earlier), and the stage each became (db/migrations/0006; also for stored settings).
 */
export const LEGACY_JOB_STATUSES: Readonly<Record<string, JobStage>> = {
  assessed: 'audited',
  scheduled: 'approved',
  inProgress: 'inProgress',
  done: 'testedOut',
  closed: 'closed',
};

const addressSchema = z.strictObject({
  street: z.string().max(200).optional(),
  town: z.string().max(100).optional(),
  region: z.string().max(100).optional(),
  postalCode: z.string().max(20).optional(),
});

export const homeInputSchema = z.strictObject({
  name: z.string().trim().min(1).max(200),
  clientId: z.int().positive().nullable().optional(),
  climateId: z.int().positive().nullable().optional(),
  priceSetId: z.int().positive().nullable().optional(),
  address: addressSchema.optional(),
  isDemo: z.boolean().optional(),
  notes: z.string().max(10_000).nullable().optional(),
  jobStatus: z.enum(JOB_STATUSES).optional(),
  data: homeDataSchema,
});
export type HomeInput = z.input<typeof homeInputSchema>;

export interface Home {
  id: number;
  name: string;
  clientId: number | null;
  climateId: number | null;
  priceSetId: number | null;
  address: z.output<typeof addressSchema>;
  isDemo: boolean;
  notes: string | null;
  jobStatus: JobStatus;
  /** As stored: without climate or prices where the home is linked to a set. */
  data: HomeData;
  createdAt: string;
  updatedAt: string;
  deletedAt: string | null;
}

interface HomeRow {
  id: number;
  name: string;
  client_id: number | null;
  climate_id: number | null;
  price_set_id: number | null;
  street: string | null;
  town: string | null;
  region: string | null;
  postal_code: string | null;
  is_demo: number;
  notes: string | null;
  job_stage: JobStatus;
  data: string;
  created_at: string;
  updated_at: string;
  deleted_at: string | null;
}

function homeOf(row: HomeRow): Home {
  const address: Home['address'] = {};
  if (row.street !== null) address.street = row.street;
  if (row.town !== null) address.town = row.town;
  if (row.region !== null) address.region = row.region;
  if (row.postal_code !== null) address.postalCode = row.postal_code;
  return {
    id: row.id,
    name: row.name,
    clientId: row.client_id,
    climateId: row.climate_id,
    priceSetId: row.price_set_id,
    address,
    isDemo: row.is_demo === 1,
    notes: row.notes,
    jobStatus: row.job_stage,
    data: readJson<HomeData>(row.data),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
    deletedAt: row.deleted_at,
  };
}

/** A linked set replaces the home's own copy, so the stored data never holds both. */
function storedData(home: z.output<typeof homeInputSchema>): HomeData {
  const data: HomeData = { ...home.data };
  if (home.climateId) delete data.climate;
  if (home.priceSetId) delete data.prices;
  return data;
}

/** Names the link at fault before the database does, so the error can say which. */
function checkLinks(write: WriteAccess, home: z.output<typeof homeInputSchema>): void {
  const links = [
    ['clientId', 'clients', home.clientId],
    ['climateId', 'climates', home.climateId],
    ['priceSetId', 'price_sets', home.priceSetId],
  ] as const;
  for (const [field, table, id] of links) {
    if (id === undefined || id === null) continue;
    if (write.statement(`SELECT 1 FROM ${table} WHERE id = ?`).get(id) === undefined) {
      throw new DbError('foreignKey', `${field} ${id} does not exist`, { field });
    }
  }
}

function rowValues(write: WriteAccess, home: z.output<typeof homeInputSchema>) {
  return {
    name: home.name,
    client_id: home.clientId ?? null,
    climate_id: home.climateId ?? null,
    price_set_id: home.priceSetId ?? null,
    street: home.address?.street ?? null,
    town: home.address?.town ?? null,
    region: home.address?.region ?? null,
    postal_code: home.address?.postalCode ?? null,
    is_demo: flag(home.isDemo),
    notes: home.notes ?? null,
    data: JSON.stringify(storedData(home)),
    now: write.now,
  };
}

/** Creates a home; returns its id. */
export function createHome(write: WriteAccess, input: HomeInput): number {
  const home = validated(homeInputSchema, input);
  checkLinks(write, home);
  const stage = home.jobStatus ?? 'audited';
  if (stage === 'onHold' || stage === 'declined') {
    throw InputError.at(
      'jobStatus',
      `a new home's job starts at a stage (${JOB_STAGES.join(', ')}); put it on hold or decline it afterwards, with a reason`,
    );
  }
  try {
    const result = write
      .statement(
        `INSERT INTO homes (name, client_id, climate_id, price_set_id, street, town, region, postal_code,
                            is_demo, notes, job_stage, data, created_at, updated_at)
         VALUES (@name, @client_id, @climate_id, @price_set_id, @street, @town, @region, @postal_code,
                 @is_demo, @notes, @job_stage, @data, @now, @now)`,
      )
      .run({ ...rowValues(write, home), job_stage: stage });
    return Number(result.lastInsertRowid);
  } catch (error) {
    throw classifySqliteError(error, { foreignKey: 'clientId' }) ?? error;
  }
}

/** Replaces a home's fields (not its tests or measures); keeps `createdAt`, moves `updatedAt`. */
export function updateHome(write: WriteAccess, id: number, input: HomeInput): void {
  const home = validated(homeInputSchema, input);
  const current = getHome(write, id).jobStatus;
  if (home.jobStatus !== undefined && home.jobStatus !== current) {
    throw InputError.at(
      'jobStatus',
      `expected the job's status as it stands, "${current}", or none: a job moves on by a status change (jobs.changeStatus), which keeps its history`,
    );
  }
  checkLinks(write, home);
  const result = write
    .statement(
      `UPDATE homes SET name = @name, client_id = @client_id, climate_id = @climate_id,
              price_set_id = @price_set_id, street = @street, town = @town, region = @region,
              postal_code = @postal_code, is_demo = @is_demo, notes = @notes, data = @data, updated_at = @now
       WHERE id = @id AND deleted_at IS NULL`,
    )
    .run({ ...rowValues(write, home), id });
  found(result.changes > 0 ? true : undefined, `home ${id}`, 'homeId');
}

/** Replaces only a home's data (house, climate, …, calibration), checked as any data is. */
export function setHomeData(write: WriteAccess, id: number, data: HomeData): void {
  const checked = validated(homeDataSchema, data, 'data');
  const result = write
    .statement('UPDATE homes SET data = ?, updated_at = ? WHERE id = ? AND deleted_at IS NULL')
    .run(JSON.stringify(checked), write.now, id);
  found(result.changes > 0 ? true : undefined, `home ${id}`, 'homeId');
}

/** Marks the home's `updatedAt` (after a change to one of its tests or measures). */
export function touchHome(write: WriteAccess, id: number): void {
  const result = write
    .statement('UPDATE homes SET updated_at = ? WHERE id = ? AND deleted_at IS NULL')
    .run(write.now, id);
  found(result.changes > 0 ? true : undefined, `home ${id}`, 'homeId');
}

/** A home that is not deleted. */
export function getHome(read: ReadAccess, id: number): Home {
  const row = read.statement('SELECT * FROM homes WHERE id = ? AND deleted_at IS NULL').get(id) as
    HomeRow | undefined;
  return homeOf(found(row, `home ${id}`, 'homeId'));
}

/** Hides a home; `restoreHome` brings it back, `purgeHome` removes it for good. */
export function deleteHome(write: WriteAccess, id: number): void {
  const result = write
    .statement(
      'UPDATE homes SET deleted_at = ?, updated_at = ? WHERE id = ? AND deleted_at IS NULL',
    )
    .run(write.now, write.now, id);
  found(result.changes > 0 ? true : undefined, `home ${id}`, 'homeId');
}

export function restoreHome(write: WriteAccess, id: number): void {
  const result = write
    .statement(
      'UPDATE homes SET deleted_at = NULL, updated_at = ? WHERE id = ? AND deleted_at IS NOT NULL',
    )
    .run(write.now, id);
  found(result.changes > 0 ? true : undefined, `deleted home ${id}`, 'homeId');
}

/** Removes a deleted home with its tests, measures and plans. Only a deleted home can be purged. */
export function purgeHome(write: WriteAccess, id: number): void {
  const result = write
    .statement('DELETE FROM homes WHERE id = ? AND deleted_at IS NOT NULL')
    .run(id);
  found(result.changes > 0 ? true : undefined, `deleted home ${id}`, 'homeId');
}

/**
 * How leaky a house is, in bands of ACH50 (air changes per hour at 50 Pa) of the test-in its
 * plan is built on; `unknown` when it has no test-in, no volume, or readings that cannot be
 * fitted. Each band holds its lower limit and runs up to the next one's.
 */
export const LEAKINESS_BANDS = ['tight', 'moderate', 'leaky', 'veryLeaky', 'unknown'] as const;
export type LeakinessBand = (typeof LEAKINESS_BANDS)[number];

/**
 * The lower ACH50 limit of each band above `tight`, 1/h.
 *
 * - 3: the most a new home may leak in climate zones 3–8 under the IECC (2012 edition on,
 *   R402.4.1.2; from memory). Below it a house is as tight as today's new homes.
 * - 7: the limit of the 2009 IECC's blower-door option (R402.4.2.1; from memory).
 * - 15: common practice for a very leaky house, where sealing pays best.
 */
export const LEAKINESS_LOWER_ACH50 = { moderate: 3, leaky: 7, veryLeaky: 15 } as const;

/**
 * The band of a house's ACH50.
 *
 * @param houseAch50 - ACH50 of its plan's test-in, 1/h; null when not known
 * @returns its band (`unknown` for null or a value that is not a finite number)
 */
export function leakinessBandOf(houseAch50: number | null): LeakinessBand {
  if (houseAch50 === null || !Number.isFinite(houseAch50)) return 'unknown';
  if (houseAch50 >= LEAKINESS_LOWER_ACH50.veryLeaky) return 'veryLeaky';
  if (houseAch50 >= LEAKINESS_LOWER_ACH50.leaky) return 'leaky';
  if (houseAch50 >= LEAKINESS_LOWER_ACH50.moderate) return 'moderate';
  return 'tight';
}

/** What the Homes list can be ordered by. */
export const HOME_SORTS = [
  'name',
  'town',
  'yearBuilt',
  'floorArea',
  'leakiness',
  'measures',
  'updated',
] as const;
export type HomeSort = (typeof HOME_SORTS)[number];

/** One line of the Homes list. */
export interface HomeSummary {
  id: number;
  name: string;
  town: string | null;
  clientId: number | null;
  clientName: string | null;
  yearBuilt: number | null;
  floorAreaFt2: number | null;
  volumeFt3: number | null;
  heatingFuel: string | null;
  /** CFM50 of the plan's test-in when given as one point, or null (multipoint tests need a fit). */
  latestTestInCfm50: number | null;
  /** CFM50 of the plan's test-in: its one point, or the fit of its readings; null without one. */
  planCfm50: number | null;
  /** ACH50 of the plan's test-in (CFM50 × 60 / volume), 1/h; null without a test-in or volume. */
  ach50: number | null;
  leakiness: LeakinessBand;
  measureCount: number;
  jobStatus: JobStatus;
  isDemo: boolean;
  updatedAt: string;
  deletedAt: string | null;
}

export interface HomeFilter {
  /** Words matched against name, street, town and client name. */
  search?: string;
  town?: string;
  heatingFuel?: string;
  clientId?: number;
  jobStatus?: JobStatus;
  leakiness?: LeakinessBand;
  /** What to order by (name when not given); ties go by name, then by id. */
  sort?: HomeSort;
  /** Largest, latest or last first; homes without the figure stay last either way. */
  descending?: boolean;
  /** List deleted homes instead of live ones. */
  deleted?: boolean;
  limit?: number;
  offset?: number;
}

/** Up to five words of a search, each escaped for LIKE; a home must match every one. */
function searchWords(
  search: string | undefined,
): Record<'w1' | 'w2' | 'w3' | 'w4' | 'w5', string | null> {
  const words = (search ?? '')
    .split(/\s+/)
    .filter((word) => word !== '')
    .slice(0, 5)
    .map((word) => word.replace(/[\\%_]/g, (c) => `\\${c}`));
  return {
    w1: words[0] ?? null,
    w2: words[1] ?? null,
    w3: words[2] ?? null,
    w4: words[3] ?? null,
    w5: words[4] ?? null,
  };
}

interface SummaryRow {
  id: number;
  name: string;
  town: string | null;
  client_id: number | null;
  client_name: string | null;
  year_built: number | null;
  floor_area_ft2: number | null;
  volume_ft3: number | null;
  heating_fuel: string | null;
  job_stage: JobStatus;
  is_demo: number;
  updated_at: string;
  deleted_at: string | null;
  measure_count: number;
  plan_test_id: number | null;
  plan_cfm50: number | null;
}

/**
 * The CFM50 of a plan's test-in: its one point, else the power law fitted to its readings.
 * Readings the fit refuses (all at one pressure) give null, so the list still shows the home.
 */
function planCfm50Of(
  read: ReadAccess,
  row: Pick<SummaryRow, 'plan_test_id' | 'plan_cfm50'>,
): number | null {
  if (row.plan_cfm50 !== null) return row.plan_cfm50;
  if (row.plan_test_id === null) return null;
  const points = read
    .statement(
      `SELECT pressure_pa AS pressurePa, flow_cfm AS flowCfm FROM leakage_test_points
       WHERE test_id = ? ORDER BY position`,
    )
    .all(row.plan_test_id) as BlowerDoorPoint[];
  try {
    return fitMultipointTest(points).cfm50;
  } catch (error) {
    if (error instanceof InputError) return null;
    throw error;
  }
}

function summaryOf(read: ReadAccess, row: SummaryRow): HomeSummary {
  const planCfm50 = planCfm50Of(read, row);
  const houseAch50 =
    planCfm50 === null || row.volume_ft3 === null || row.volume_ft3 <= 0
      ? null
      : ach50(planCfm50, row.volume_ft3);
  return {
    id: row.id,
    name: row.name,
    town: row.town,
    clientId: row.client_id,
    clientName: row.client_name,
    yearBuilt: row.year_built,
    floorAreaFt2: row.floor_area_ft2,
    volumeFt3: row.volume_ft3,
    heatingFuel: row.heating_fuel,
    latestTestInCfm50: row.plan_cfm50,
    planCfm50,
    ach50: houseAch50,
    leakiness: leakinessBandOf(houseAch50),
    measureCount: row.measure_count,
    jobStatus: row.job_stage,
    isDemo: row.is_demo === 1,
    updatedAt: row.updated_at,
    deletedAt: row.deleted_at,
  };
}

/** Names and towns in the order people read them: "14 Mill Lane" before "120 Mill Lane". */
const TEXT_ORDER = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** Each sort's figure of a home; null sorts last in either direction. */
const SORT_KEYS: Readonly<Record<HomeSort, (home: HomeSummary) => string | number | null>> = {
  name: (home) => home.name,
  town: (home) => home.town,
  yearBuilt: (home) => home.yearBuilt,
  floorArea: (home) => home.floorAreaFt2,
  leakiness: (home) => home.ach50,
  measures: (home) => home.measureCount,
  updated: (home) => home.updatedAt,
};

function compareValues(first: string | number, second: string | number): number {
  if (typeof first === 'number' && typeof second === 'number') return first - second;
  return TEXT_ORDER.compare(String(first), String(second));
}

/**
 * Orders homes by one figure, the homes without it last, ties by name and then by id.
 *
 * @param homes - the homes (not changed)
 * @param sort - the figure to order by
 * @param descending - largest (or latest, or Z) first
 * @returns a new, ordered list
 */
export function sortHomes(
  homes: readonly HomeSummary[],
  sort: HomeSort,
  descending: boolean,
): HomeSummary[] {
  const key = SORT_KEYS[sort];
  const byName = (first: HomeSummary, second: HomeSummary): number =>
    TEXT_ORDER.compare(first.name, second.name) || first.id - second.id;
  return [...homes].sort((first, second) => {
    const a = key(first);
    const b = key(second);
    if (a === null || b === null) {
      if (a !== b) return a === null ? 1 : -1;
      return byName(first, second);
    }
    const order = compareValues(a, b);
    if (order !== 0) return descending ? -order : order;
    // Sorted by name, the direction applies to the tie-break too.
    return sort === 'name' && descending ? -byName(first, second) : byName(first, second);
  });
}

/**
 * The homes matching a filter, in the order it asks for (by name when it asks for none).
 *
 * Notes: the leakiness of a home is worked out from its plan's test-in (see `planTestOf` in
 * db/home-file.ts for which test that is): ACH50 = CFM50 × 60 / volume [ft³], with the CFM50
 * of a multipoint test from the power-law fit. Filtering by leakiness and sorting happen
 * after the query, and `limit`/`offset` page the ordered result.
 *
 * References: ACH50 as ANSI/RESNET/ICC 380 and ASTM E779 define it; the fit of ASTM E779
 * (core/leakage.ts).
 */
export function listHomes(read: ReadAccess, filter: HomeFilter = {}): HomeSummary[] {
  const rows = read
    .statement(
      `SELECT h.id, h.name, h.town, h.client_id, c.name AS client_name, h.year_built, h.floor_area_ft2,
              h.volume_ft3, h.heating_fuel, h.job_stage, h.is_demo, h.updated_at, h.deleted_at,
              (SELECT count(*) FROM measures m WHERE m.home_id = h.id) AS measure_count,
              h.name || ' ' || coalesce(h.street, '') || ' ' || coalesce(h.town, '') || ' ' ||
                coalesce(c.name, '') AS haystack,
              pt.id AS plan_test_id, pt.cfm50 AS plan_cfm50
       FROM homes h LEFT JOIN clients c ON c.id = h.client_id
       LEFT JOIN leakage_tests pt ON pt.id = (
         SELECT t.id FROM leakage_tests t WHERE t.home_id = h.id AND t.kind = 'testIn'
         ORDER BY t.plan_basis DESC, coalesce(t.tested_on, '') DESC, t.position ASC LIMIT 1)
       WHERE (h.deleted_at IS NOT NULL) = @deleted
         AND (@town IS NULL OR h.town = @town)
         AND (@fuel IS NULL OR h.heating_fuel = @fuel)
         AND (@client IS NULL OR h.client_id = @client)
         AND (@job IS NULL OR h.job_stage = @job)
         AND (@w1 IS NULL OR haystack LIKE '%' || @w1 || '%' ESCAPE '\\')
         AND (@w2 IS NULL OR haystack LIKE '%' || @w2 || '%' ESCAPE '\\')
         AND (@w3 IS NULL OR haystack LIKE '%' || @w3 || '%' ESCAPE '\\')
         AND (@w4 IS NULL OR haystack LIKE '%' || @w4 || '%' ESCAPE '\\')
         AND (@w5 IS NULL OR haystack LIKE '%' || @w5 || '%' ESCAPE '\\')
       ORDER BY h.name, h.id`,
    )
    .all({
      deleted: filter.deleted ? 1 : 0,
      town: filter.town ?? null,
      fuel: filter.heatingFuel ?? null,
      client: filter.clientId ?? null,
      job: filter.jobStatus ?? null,
      ...searchWords(filter.search),
    }) as SummaryRow[];
  const homes = rows
    .map((row) => summaryOf(read, row))
    .filter((home) => filter.leakiness === undefined || home.leakiness === filter.leakiness);
  const ordered = sortHomes(homes, filter.sort ?? 'name', filter.descending ?? false);
  const offset = filter.offset ?? 0;
  return ordered.slice(offset, filter.limit === undefined ? undefined : offset + filter.limit);
}
