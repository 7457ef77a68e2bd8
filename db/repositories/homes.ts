/**
 * Homes: the house, its climate and equipment, fuels and prices, and the plan's assumptions.
 * A home may be a draft (parts still missing) while it is being filled in; every part it has
 * is whole and valid. Deleting is soft: a deleted home is hidden, recoverable, until purged.
 */
import { z } from 'zod';
import { homeDataSchema, type HomeData } from '../../core/schema.ts';
import { classifySqliteError, DbError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { flag, found, readJson, validated } from './_rows.ts';

export const JOB_STATUSES = ['assessed', 'scheduled', 'inProgress', 'done', 'closed'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

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
  job_status: JobStatus;
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
    jobStatus: row.job_status,
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
    job_status: home.jobStatus ?? 'assessed',
    data: JSON.stringify(storedData(home)),
    now: write.now,
  };
}

/** Creates a home; returns its id. */
export function createHome(write: WriteAccess, input: HomeInput): number {
  const home = validated(homeInputSchema, input);
  checkLinks(write, home);
  try {
    const result = write
      .statement(
        `INSERT INTO homes (name, client_id, climate_id, price_set_id, street, town, region, postal_code,
                            is_demo, notes, job_status, data, created_at, updated_at)
         VALUES (@name, @client_id, @climate_id, @price_set_id, @street, @town, @region, @postal_code,
                 @is_demo, @notes, @job_status, @data, @now, @now)`,
      )
      .run(rowValues(write, home));
    return Number(result.lastInsertRowid);
  } catch (error) {
    throw classifySqliteError(error, { foreignKey: 'clientId' }) ?? error;
  }
}

/** Replaces a home's fields (not its tests or measures); keeps `createdAt`, moves `updatedAt`. */
export function updateHome(write: WriteAccess, id: number, input: HomeInput): void {
  const home = validated(homeInputSchema, input);
  checkLinks(write, home);
  const result = write
    .statement(
      `UPDATE homes SET name = @name, client_id = @client_id, climate_id = @climate_id,
              price_set_id = @price_set_id, street = @street, town = @town, region = @region,
              postal_code = @postal_code, is_demo = @is_demo, notes = @notes, job_status = @job_status,
              data = @data, updated_at = @now
       WHERE id = @id AND deleted_at IS NULL`,
    )
    .run({ ...rowValues(write, home), id });
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

/** One line of the Homes list. */
export interface HomeSummary {
  id: number;
  name: string;
  town: string | null;
  clientName: string | null;
  yearBuilt: number | null;
  floorAreaFt2: number | null;
  heatingFuel: string | null;
  /** CFM50 of the plan's test-in when given as one point, or null (multipoint tests need a fit). */
  latestTestInCfm50: number | null;
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

/** The homes matching a filter, by name. */
export function listHomes(read: ReadAccess, filter: HomeFilter = {}): HomeSummary[] {
  const rows = read
    .statement(
      `SELECT h.id, h.name, h.town, c.name AS client_name, h.year_built, h.floor_area_ft2, h.heating_fuel,
              h.job_status, h.is_demo, h.updated_at, h.deleted_at,
              (SELECT count(*) FROM measures m WHERE m.home_id = h.id) AS measure_count,
              h.name || ' ' || coalesce(h.street, '') || ' ' || coalesce(h.town, '') || ' ' ||
                coalesce(c.name, '') AS haystack,
              (SELECT t.cfm50 FROM leakage_tests t WHERE t.home_id = h.id AND t.kind = 'testIn'
                ORDER BY t.plan_basis DESC, coalesce(t.tested_on, '') DESC, t.position ASC LIMIT 1) AS latest_cfm50
       FROM homes h LEFT JOIN clients c ON c.id = h.client_id
       WHERE (h.deleted_at IS NOT NULL) = @deleted
         AND (@town IS NULL OR h.town = @town)
         AND (@fuel IS NULL OR h.heating_fuel = @fuel)
         AND (@client IS NULL OR h.client_id = @client)
         AND (@w1 IS NULL OR haystack LIKE '%' || @w1 || '%' ESCAPE '\\')
         AND (@w2 IS NULL OR haystack LIKE '%' || @w2 || '%' ESCAPE '\\')
         AND (@w3 IS NULL OR haystack LIKE '%' || @w3 || '%' ESCAPE '\\')
         AND (@w4 IS NULL OR haystack LIKE '%' || @w4 || '%' ESCAPE '\\')
         AND (@w5 IS NULL OR haystack LIKE '%' || @w5 || '%' ESCAPE '\\')
       ORDER BY h.name, h.id
       LIMIT @limit OFFSET @offset`,
    )
    .all({
      deleted: filter.deleted ? 1 : 0,
      town: filter.town ?? null,
      fuel: filter.heatingFuel ?? null,
      client: filter.clientId ?? null,
      ...searchWords(filter.search),
      limit: filter.limit ?? -1,
      offset: filter.offset ?? 0,
    }) as {
    id: number;
    name: string;
    town: string | null;
    client_name: string | null;
    year_built: number | null;
    floor_area_ft2: number | null;
    heating_fuel: string | null;
    job_status: JobStatus;
    is_demo: number;
    updated_at: string;
    deleted_at: string | null;
    measure_count: number;
    latest_cfm50: number | null;
  }[];
  return rows.map((row) => ({
    id: row.id,
    name: row.name,
    town: row.town,
    clientName: row.client_name,
    yearBuilt: row.year_built,
    floorAreaFt2: row.floor_area_ft2,
    heatingFuel: row.heating_fuel,
    latestTestInCfm50: row.latest_cfm50,
    measureCount: row.measure_count,
    jobStatus: row.job_status,
    isDemo: row.is_demo === 1,
    updatedAt: row.updated_at,
    deletedAt: row.deleted_at,
  }));
}
