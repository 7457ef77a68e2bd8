/**
 * Saved plans: an evaluation kept with the exact inputs it was made from and the engine
 * version that made it, so an old proposal can be reproduced and checked.
 */
import { createHash } from 'node:crypto';
import { z } from 'zod';
import type { EvaluationReport } from '../../core/report.ts';
import type { HomeFile } from '../../core/schema.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { found, readJson, validated } from './_rows.ts';

export interface SavedPlan {
  id: number;
  homeId: number;
  name: string;
  engineVersion: string;
  inputs: HomeFile;
  inputsSha256: string;
  result: EvaluationReport;
  createdAt: string;
}

interface PlanRow {
  id: number;
  home_id: number;
  name: string;
  engine_version: string;
  inputs: string;
  inputs_sha256: string;
  result: string;
  created_at: string;
}

function planOf(row: PlanRow): SavedPlan {
  return {
    id: row.id,
    homeId: row.home_id,
    name: row.name,
    engineVersion: row.engine_version,
    inputs: readJson<HomeFile>(row.inputs),
    inputsSha256: row.inputs_sha256,
    result: readJson<EvaluationReport>(row.result),
    createdAt: row.created_at,
  };
}

/** SHA-256 of the inputs as stored, so a changed copy is noticed. */
export function inputsDigest(inputsJson: string): string {
  return createHash('sha256').update(inputsJson).digest('hex');
}

const nameSchema = z.string().trim().min(1).max(200);

export function savePlan(
  write: WriteAccess,
  plan: {
    homeId: number;
    name: string;
    engineVersion: string;
    inputs: HomeFile;
    result: EvaluationReport;
  },
): number {
  const name = validated(nameSchema, plan.name, 'name');
  found(
    write.statement('SELECT 1 FROM homes WHERE id = ?').get(plan.homeId) as unknown,
    `home ${plan.homeId}`,
    'homeId',
  );
  const inputs = JSON.stringify(plan.inputs);
  const result = write
    .statement(
      `INSERT INTO plans (home_id, name, engine_version, inputs, inputs_sha256, result, created_at)
       VALUES (?, ?, ?, ?, ?, ?, ?)`,
    )
    .run(
      plan.homeId,
      name,
      plan.engineVersion,
      inputs,
      inputsDigest(inputs),
      JSON.stringify(plan.result),
      write.now,
    );
  return Number(result.lastInsertRowid);
}

export function getPlan(read: ReadAccess, id: number): SavedPlan {
  const row = read.statement('SELECT * FROM plans WHERE id = ?').get(id) as PlanRow | undefined;
  return planOf(found(row, `plan ${id}`, 'planId'));
}

/** A home's saved plans, newest first. */
export function listPlans(read: ReadAccess, homeId: number): SavedPlan[] {
  return (
    read
      .statement('SELECT * FROM plans WHERE home_id = ? ORDER BY created_at DESC, id DESC')
      .all(homeId) as PlanRow[]
  ).map(planOf);
}
