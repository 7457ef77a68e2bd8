/**
 * A home's utility bills and daily mean outdoor temperatures, the inputs of its billing
 * analysis (core/billing.ts). Both go with the home: purged with it, copied with it.
 *
 * Bills arrive a file at a time: a file's bills replace the home's bills of the fuels it
 * holds (a gas file leaves the electricity bills alone), all or none. A temperature file
 * replaces the home's whole series.
 */
import {
  billProblems,
  fuelUnit,
  temperatureProblems,
  type DailyTemperature,
  type UtilityBill,
} from '../../core/billing.ts';
import { InputError } from '../../core/errors.ts';
import type { Fuel } from '../../core/schema.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { touchHome } from './homes.ts';

/** A stored bill. */
export interface BillRecord extends UtilityBill {
  id: number;
  homeId: number;
  /** The unit the use was billed in (the fuel's unit when it was stored). */
  unit: string;
  createdAt: string;
}

interface BillRow {
  id: number;
  home_id: number;
  fuel: Fuel;
  period_start: string;
  period_end: string;
  use: number;
  unit: string;
  created_at: string;
}

function billOf(row: BillRow): BillRecord {
  return {
    id: row.id,
    homeId: row.home_id,
    fuel: row.fuel,
    periodStart: row.period_start,
    periodEnd: row.period_end,
    use: row.use,
    unit: row.unit,
    createdAt: row.created_at,
  };
}

/**
 * Replaces the home's bills of the fuels in `bills` with `bills`.
 *
 * @param bills - one file's bills (checked as `billProblems` checks them)
 * @returns the fuels replaced
 * @throws InputError naming `bills[i].field` (nothing is written); DbError notFound naming `homeId`
 */
export function replaceBills(
  write: WriteAccess,
  homeId: number,
  bills: readonly UtilityBill[],
): Fuel[] {
  const problems = billProblems(bills);
  if (problems.length > 0) throw new InputError(problems);
  touchHome(write, homeId);
  const fuels = [...new Set(bills.map((bill) => bill.fuel))];
  const remove = write.statement('DELETE FROM bills WHERE home_id = ? AND fuel = ?');
  for (const fuel of fuels) remove.run(homeId, fuel);
  const insert = write.statement(
    `INSERT INTO bills (home_id, fuel, period_start, period_end, use, unit, created_at)
     VALUES (?, ?, ?, ?, ?, ?, ?)`,
  );
  for (const bill of bills) {
    insert.run(
      homeId,
      bill.fuel,
      bill.periodStart,
      bill.periodEnd,
      bill.use,
      fuelUnit(bill.fuel),
      write.now,
    );
  }
  return fuels;
}

/** A home's bills, by fuel and then by period. */
export function listBills(read: ReadAccess, homeId: number): BillRecord[] {
  return (
    read
      .statement('SELECT * FROM bills WHERE home_id = ? ORDER BY fuel, period_start, id')
      .all(homeId) as BillRow[]
  ).map(billOf);
}

/**
 * Removes a home's bills (of one fuel, or all) and, with `temperatures`, its daily means.
 *
 * @returns how many bills and days were removed
 */
export function clearBills(
  write: WriteAccess,
  homeId: number,
  options: { fuel?: Fuel; temperatures?: boolean } = {},
): { bills: number; days: number } {
  touchHome(write, homeId);
  const bills =
    options.fuel === undefined
      ? write.statement('DELETE FROM bills WHERE home_id = ?').run(homeId).changes
      : write
          .statement('DELETE FROM bills WHERE home_id = ? AND fuel = ?')
          .run(homeId, options.fuel).changes;
  const days = options.temperatures
    ? write.statement('DELETE FROM daily_temperatures WHERE home_id = ?').run(homeId).changes
    : 0;
  return { bills, days };
}

/**
 * Replaces a home's daily mean temperatures.
 *
 * @param temperatures - the days (checked as `temperatureProblems` checks them), °F
 * @returns the number of days stored
 * @throws InputError naming `temperatures[i].field` (nothing is written); DbError notFound naming `homeId`
 */
export function replaceDailyTemperatures(
  write: WriteAccess,
  homeId: number,
  temperatures: readonly DailyTemperature[],
): number {
  const problems = temperatureProblems(temperatures);
  if (problems.length > 0) throw new InputError(problems);
  touchHome(write, homeId);
  write.statement('DELETE FROM daily_temperatures WHERE home_id = ?').run(homeId);
  const insert = write.statement(
    'INSERT INTO daily_temperatures (home_id, date, mean_temp_f) VALUES (?, ?, ?)',
  );
  for (const day of temperatures) insert.run(homeId, day.date, day.meanTempF);
  return temperatures.length;
}

/** A home's daily mean temperatures (°F), by date. */
export function listDailyTemperatures(read: ReadAccess, homeId: number): DailyTemperature[] {
  return read
    .statement(
      'SELECT date, mean_temp_f AS meanTempF FROM daily_temperatures WHERE home_id = ? ORDER BY date',
    )
    .all(homeId) as DailyTemperature[];
}

/** The first and last day of a home's temperatures and their count. */
export function temperatureSpan(
  read: ReadAccess,
  homeId: number,
): { days: number; first: string | null; last: string | null } {
  return read
    .statement(
      'SELECT count(*) AS days, min(date) AS first, max(date) AS last FROM daily_temperatures WHERE home_id = ?',
    )
    .get(homeId) as { days: number; first: string | null; last: string | null };
}

/** Copies one home's bills and temperatures to another (a duplicated home keeps them). */
export function copyBills(write: WriteAccess, fromHomeId: number, toHomeId: number): void {
  touchHome(write, toHomeId);
  write
    .statement(
      `INSERT INTO bills (home_id, fuel, period_start, period_end, use, unit, created_at)
       SELECT ?, fuel, period_start, period_end, use, unit, ? FROM bills WHERE home_id = ? ORDER BY id`,
    )
    .run(toHomeId, write.now, fromHomeId);
  write
    .statement(
      `INSERT INTO daily_temperatures (home_id, date, mean_temp_f)
       SELECT ?, date, mean_temp_f FROM daily_temperatures WHERE home_id = ? ORDER BY date`,
    )
    .run(toHomeId, fromHomeId);
}
