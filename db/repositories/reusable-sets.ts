/**
 * Climates and price sets: named, reusable across homes. A home linked to one uses its
 * values; editing the set changes every home linked to it.
 */
import { z } from 'zod';
import { climateSchema, pricesSchema, type Climate, type HomeFile } from '../../core/schema.ts';
import { classifySqliteError, DbError } from '../errors.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { found, readJson, validated } from './_rows.ts';
import { removeWeatherYearIfUnlinked } from './weather-years.ts';

type Prices = HomeFile['prices'];

export interface NamedSet<T> {
  id: number;
  name: string;
  data: T;
  createdAt: string;
  updatedAt: string;
}

interface SetRow {
  id: number;
  name: string;
  data: string;
  created_at: string;
  updated_at: string;
}

const nameSchema = z.string().trim().min(1).max(200);

function repository<T>(
  table: 'climates' | 'price_sets',
  schema: z.ZodType<T>,
  what: string,
  idField: string,
) {
  const setOf = (row: SetRow): NamedSet<T> => ({
    id: row.id,
    name: row.name,
    data: readJson<T>(row.data),
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  });
  return {
    create(write: WriteAccess, name: string, data: unknown): number {
      const values = {
        name: validated(nameSchema, name, 'name'),
        data: validated(schema, data, 'data'),
      };
      try {
        const result = write
          .statement(
            `INSERT INTO ${table} (name, data, created_at, updated_at) VALUES (?, ?, ?, ?)`,
          )
          .run(values.name, JSON.stringify(values.data), write.now, write.now);
        return Number(result.lastInsertRowid);
      } catch (error) {
        throw classifySqliteError(error, { unique: 'name' }) ?? error;
      }
    },
    get(read: ReadAccess, id: number): NamedSet<T> {
      const row = read.statement(`SELECT * FROM ${table} WHERE id = ?`).get(id) as
        SetRow | undefined;
      return setOf(found(row, `${what} ${id}`, idField));
    },
    findByName(read: ReadAccess, name: string): NamedSet<T> | undefined {
      const row = read.statement(`SELECT * FROM ${table} WHERE name = ?`).get(name) as
        SetRow | undefined;
      return row ? setOf(row) : undefined;
    },
    list(read: ReadAccess): NamedSet<T>[] {
      return (read.statement(`SELECT * FROM ${table} ORDER BY name`).all() as SetRow[]).map(setOf);
    },
    update(write: WriteAccess, id: number, name: string, data: unknown): void {
      const values = {
        name: validated(nameSchema, name, 'name'),
        data: validated(schema, data, 'data'),
      };
      try {
        const result = write
          .statement(`UPDATE ${table} SET name = ?, data = ?, updated_at = ? WHERE id = ?`)
          .run(values.name, JSON.stringify(values.data), write.now, id);
        found(result.changes > 0 ? true : undefined, `${what} ${id}`, idField);
      } catch (error) {
        throw classifySqliteError(error, { unique: 'name' }) ?? error;
      }
    },
    /** Deletes a set no home uses; one in use is refused with the homes named by count. */
    remove(write: WriteAccess, id: number): void {
      const column = table === 'climates' ? 'climate_id' : 'price_set_id';
      const { homes } = write
        .statement(`SELECT count(*) AS homes FROM homes WHERE ${column} = ?`)
        .get(id) as {
        homes: number;
      };
      if (homes > 0) {
        throw new DbError(
          'foreignKey',
          `${what} ${id} is used by ${homes} home${homes === 1 ? '' : 's'}; unlink them first`,
          {
            field: idField,
          },
        );
      }
      // A climate made from a weather file takes its stored year with it.
      const year =
        table === 'climates'
          ? (write.statement('SELECT weather_year_id AS id FROM climates WHERE id = ?').get(id) as
              { id: number | null } | undefined)
          : undefined;
      const result = write.statement(`DELETE FROM ${table} WHERE id = ?`).run(id);
      found(result.changes > 0 ? true : undefined, `${what} ${id}`, idField);
      if (year !== undefined && year.id !== null) removeWeatherYearIfUnlinked(write, year.id);
    },
  };
}

export const climates = repository<Climate>('climates', climateSchema, 'climate', 'climateId');
export const priceSets = repository<Prices>('price_sets', pricesSchema, 'price set', 'priceSetId');
