/** A home's blower-door tests: test-ins and test-outs, each one point or several, dated. */
import { otherLeakageTestSchema, type OtherLeakageTest } from '../../core/schema.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { DbError } from '../errors.ts';
import { found, validated } from './_rows.ts';
import { touchHome } from './homes.ts';

export interface LeakageTestRecord {
  id: number;
  homeId: number;
  position: number;
  test: OtherLeakageTest;
  /** The test-in the home's plan is built on, when marked (see `planTestOf`). */
  planBasis: boolean;
  createdAt: string;
  updatedAt: string;
}

interface TestRow {
  id: number;
  home_id: number;
  position: number;
  kind: OtherLeakageTest['kind'];
  tested_on: string | null;
  cfm50: number | null;
  exponent_n: number | null;
  note: string | null;
  plan_basis: number;
  created_at: string;
  updated_at: string;
}

function testOf(row: TestRow, points: { pa: number; cfm: number }[]): OtherLeakageTest {
  const test: OtherLeakageTest = { kind: row.kind };
  if (row.cfm50 !== null) test.cfm50 = row.cfm50;
  if (row.exponent_n !== null) test.exponentN = row.exponent_n;
  if (points.length > 0) test.points = points;
  if (row.tested_on !== null) test.testedOn = row.tested_on;
  if (row.note !== null) test.note = row.note;
  return test;
}

function writePoints(write: WriteAccess, testId: number, test: OtherLeakageTest): void {
  write.statement('DELETE FROM leakage_test_points WHERE test_id = ?').run(testId);
  const insert = write.statement(
    'INSERT INTO leakage_test_points (test_id, position, pressure_pa, flow_cfm) VALUES (?, ?, ?, ?)',
  );
  (test.points ?? []).forEach((point, index) => insert.run(testId, index, point.pa, point.cfm));
}

/**
 * Adds a test to a home, after its other tests; returns the test's id.
 *
 * @param options.planBasis - mark this test-in as the one the plan is built on
 */
export function addLeakageTest(
  write: WriteAccess,
  homeId: number,
  input: unknown,
  options: { planBasis?: boolean } = {},
): number {
  const test = validated(otherLeakageTestSchema, input);
  touchHome(write, homeId);
  const { next } = write
    .statement('SELECT coalesce(max(position) + 1, 0) AS next FROM leakage_tests WHERE home_id = ?')
    .get(homeId) as { next: number };
  const result = write
    .statement(
      `INSERT INTO leakage_tests (home_id, position, kind, tested_on, cfm50, exponent_n, note, created_at, updated_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    )
    .run(
      homeId,
      next,
      test.kind,
      test.testedOn ?? null,
      test.cfm50 ?? null,
      test.exponentN ?? null,
      test.note ?? null,
      write.now,
      write.now,
    );
  const id = Number(result.lastInsertRowid);
  writePoints(write, id, test);
  if (options.planBasis) setPlanBasis(write, id);
  return id;
}

/** Marks a test-in as the one its home's plan is built on (and no other). */
export function setPlanBasis(write: WriteAccess, id: number): void {
  const row = found(
    write.statement('SELECT home_id, kind FROM leakage_tests WHERE id = ?').get(id) as
      { home_id: number; kind: string } | undefined,
    `leakage test ${id}`,
    'testId',
  );
  if (row.kind !== 'testIn')
    throw new DbError('invalid', 'only a test-in can be the basis of a plan', { field: 'testId' });
  touchHome(write, row.home_id);
  write
    .statement('UPDATE leakage_tests SET plan_basis = (id = ?) WHERE home_id = ?')
    .run(id, row.home_id);
}

/** Replaces a test's readings, date and note. */
export function updateLeakageTest(write: WriteAccess, id: number, input: unknown): void {
  const test = validated(otherLeakageTestSchema, input);
  const row = found(
    write.statement('SELECT home_id FROM leakage_tests WHERE id = ?').get(id) as
      { home_id: number } | undefined,
    `leakage test ${id}`,
    'testId',
  );
  touchHome(write, row.home_id);
  write
    .statement(
      `UPDATE leakage_tests SET kind = ?, tested_on = ?, cfm50 = ?, exponent_n = ?, note = ?, updated_at = ?
       WHERE id = ?`,
    )
    .run(
      test.kind,
      test.testedOn ?? null,
      test.cfm50 ?? null,
      test.exponentN ?? null,
      test.note ?? null,
      write.now,
      id,
    );
  writePoints(write, id, test);
}

export function deleteLeakageTest(write: WriteAccess, id: number): void {
  const row = found(
    write.statement('SELECT home_id FROM leakage_tests WHERE id = ?').get(id) as
      { home_id: number } | undefined,
    `leakage test ${id}`,
    'testId',
  );
  touchHome(write, row.home_id);
  write.statement('DELETE FROM leakage_tests WHERE id = ?').run(id);
}

/** A home's tests in the order they were added. */
export function listLeakageTests(read: ReadAccess, homeId: number): LeakageTestRecord[] {
  const rows = read
    .statement('SELECT * FROM leakage_tests WHERE home_id = ? ORDER BY position')
    .all(homeId) as TestRow[];
  const pointsOf = read.statement(
    'SELECT pressure_pa AS pa, flow_cfm AS cfm FROM leakage_test_points WHERE test_id = ? ORDER BY position',
  );
  return rows.map((row) => ({
    id: row.id,
    homeId: row.home_id,
    position: row.position,
    test: testOf(row, pointsOf.all(row.id) as { pa: number; cfm: number }[]),
    planBasis: row.plan_basis === 1,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  }));
}
