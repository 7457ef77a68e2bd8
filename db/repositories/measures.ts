/** A home's measures, in the order the auditor listed them. */
import { measureSchema, type Measure } from '../../core/schema.ts';
import { SHIPPED_LIBRARY } from '../../core/measure-library.ts';
import { InputError } from '../../core/errors.ts';
import { classifySqliteError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { flag, found, readJson, validated } from './_rows.ts';
import { touchHome } from './homes.ts';

export interface MeasureRecord {
  id: number;
  homeId: number;
  position: number;
  measure: Measure;
  createdAt: string;
  updatedAt: string;
}

interface MeasureRow {
  id: number;
  home_id: number;
  position: number;
  key: string;
  type_id: string;
  location: Measure['location'] | null;
  estimate: string;
  materials_usd: number;
  labor_hours: number;
  labor_rate_usd_per_hour: number;
  markup_fraction: number | null;
  health_and_safety: number;
  life_years: number | null;
  status: NonNullable<Measure['status']>;
  note: string | null;
  created_at: string;
  updated_at: string;
}

type Estimate = Pick<Measure, 'reductionCfm50' | 'byUnits' | 'shareOfLocation'>;

function measureOf(row: MeasureRow): Measure {
  const measure: Measure = {
    id: row.key,
    type: row.type_id,
    ...readJson<Estimate>(row.estimate),
    cost: {
      materialsUsd: row.materials_usd,
      laborHours: row.labor_hours,
      laborRateUsdPerHour: row.labor_rate_usd_per_hour,
    },
  };
  if (row.location !== null) measure.location = row.location;
  if (row.markup_fraction !== null) measure.cost.markupFraction = row.markup_fraction;
  if (row.health_and_safety === 1) measure.cost.healthAndSafety = true;
  if (row.life_years !== null) measure.lifeYears = row.life_years;
  if (row.status !== 'planned') measure.status = row.status;
  if (row.note !== null) measure.note = row.note;
  return measure;
}

function checked(input: unknown): Measure {
  const measure = validated(measureSchema, input);
  if (!SHIPPED_LIBRARY.find(measure.type)) {
    throw InputError.at('type', `expected a measure type from the library, got "${measure.type}"`);
  }
  const estimates = [measure.reductionCfm50, measure.byUnits, measure.shareOfLocation].filter(
    Boolean,
  );
  if (estimates.length !== 1) {
    throw InputError.at(
      '',
      'expected exactly one estimate: reductionCfm50, byUnits or shareOfLocation',
    );
  }
  return measure;
}

function rowValues(write: WriteAccess, measure: Measure) {
  const estimate: Estimate = {};
  if (measure.reductionCfm50) estimate.reductionCfm50 = measure.reductionCfm50;
  if (measure.byUnits) estimate.byUnits = measure.byUnits;
  if (measure.shareOfLocation) estimate.shareOfLocation = measure.shareOfLocation;
  return {
    key: measure.id,
    type_id: measure.type,
    location: measure.location ?? null,
    estimate: JSON.stringify(estimate),
    materials_usd: measure.cost.materialsUsd,
    labor_hours: measure.cost.laborHours,
    labor_rate_usd_per_hour: measure.cost.laborRateUsdPerHour,
    markup_fraction: measure.cost.markupFraction ?? null,
    health_and_safety: flag(measure.cost.healthAndSafety),
    life_years: measure.lifeYears ?? null,
    status: measure.status ?? 'planned',
    note: measure.note ?? null,
    now: write.now,
  };
}

/** Adds a measure at the end of a home's list; returns its id. */
export function addMeasure(write: WriteAccess, homeId: number, input: unknown): number {
  const measure = checked(input);
  touchHome(write, homeId);
  const { next } = write
    .statement('SELECT coalesce(max(position) + 1, 0) AS next FROM measures WHERE home_id = ?')
    .get(homeId) as { next: number };
  try {
    const result = write
      .statement(
        `INSERT INTO measures (home_id, position, key, type_id, location, estimate, materials_usd, labor_hours,
                               labor_rate_usd_per_hour, markup_fraction, health_and_safety, life_years, status,
                               note, created_at, updated_at)
         VALUES (@home_id, @position, @key, @type_id, @location, @estimate, @materials_usd, @labor_hours,
                 @labor_rate_usd_per_hour, @markup_fraction, @health_and_safety, @life_years, @status,
                 @note, @now, @now)`,
      )
      .run({ ...rowValues(write, measure), home_id: homeId, position: next });
    return Number(result.lastInsertRowid);
  } catch (error) {
    throw classifySqliteError(error, { unique: 'id', foreignKey: 'homeId' }) ?? error;
  }
}

/** Replaces a measure's content, keeping its place in the list. */
export function updateMeasure(write: WriteAccess, id: number, input: unknown): void {
  const measure = checked(input);
  const row = found(
    write.statement('SELECT home_id FROM measures WHERE id = ?').get(id) as
      { home_id: number } | undefined,
    `measure ${id}`,
    'measureId',
  );
  touchHome(write, row.home_id);
  try {
    write
      .statement(
        `UPDATE measures SET key = @key, type_id = @type_id, location = @location, estimate = @estimate,
                materials_usd = @materials_usd, labor_hours = @labor_hours,
                labor_rate_usd_per_hour = @labor_rate_usd_per_hour, markup_fraction = @markup_fraction,
                health_and_safety = @health_and_safety, life_years = @life_years, status = @status,
                note = @note, updated_at = @now
         WHERE id = @id`,
      )
      .run({ ...rowValues(write, measure), id });
  } catch (error) {
    throw classifySqliteError(error, { unique: 'id' }) ?? error;
  }
}

export function deleteMeasure(write: WriteAccess, id: number): void {
  const row = found(
    write.statement('SELECT home_id FROM measures WHERE id = ?').get(id) as
      { home_id: number } | undefined,
    `measure ${id}`,
    'measureId',
  );
  touchHome(write, row.home_id);
  write.statement('DELETE FROM measures WHERE id = ?').run(id);
}

/** A home's measures in their listed order. */
export function listMeasures(read: ReadAccess, homeId: number): MeasureRecord[] {
  const rows = read
    .statement('SELECT * FROM measures WHERE home_id = ? ORDER BY position')
    .all(homeId) as MeasureRow[];
  return rows.map((row) => ({
    id: row.id,
    homeId: row.home_id,
    position: row.position,
    measure: measureOf(row),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  }));
}
