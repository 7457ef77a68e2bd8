/** Clients: the households (or landlords) a home's work is for. */
import { z } from 'zod';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { found, validated } from './_rows.ts';

export const clientInputSchema = z.strictObject({
  name: z.string().trim().min(1).max(200),
  phone: z.string().max(50).optional(),
  email: z.string().max(200).optional(),
  notes: z.string().max(10_000).optional(),
});
export type ClientInput = z.input<typeof clientInputSchema>;

export interface Client {
  id: number;
  name: string;
  phone: string | null;
  email: string | null;
  notes: string | null;
  createdAt: string;
  updatedAt: string;
}

interface ClientRow {
  id: number;
  name: string;
  phone: string | null;
  email: string | null;
  notes: string | null;
  created_at: string;
  updated_at: string;
}

function clientOf(row: ClientRow): Client {
  return {
    id: row.id,
    name: row.name,
    phone: row.phone,
    email: row.email,
    notes: row.notes,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  };
}

export function createClient(write: WriteAccess, input: ClientInput): number {
  const client = validated(clientInputSchema, input);
  const result = write
    .statement(
      `INSERT INTO clients (name, phone, email, notes, created_at, updated_at)
       VALUES (@name, @phone, @email, @notes, @now, @now)`,
    )
    .run({
      name: client.name,
      phone: client.phone ?? null,
      email: client.email ?? null,
      notes: client.notes ?? null,
      now: write.now,
    });
  return Number(result.lastInsertRowid);
}

export function getClient(read: ReadAccess, id: number): Client {
  const row = read.statement('SELECT * FROM clients WHERE id = ?').get(id) as ClientRow | undefined;
  return clientOf(found(row, `client ${id}`, 'clientId'));
}

export function listClients(read: ReadAccess): Client[] {
  return (read.statement('SELECT * FROM clients ORDER BY name, id').all() as ClientRow[]).map(
    clientOf,
  );
}

export function updateClient(write: WriteAccess, id: number, input: ClientInput): void {
  const client = validated(clientInputSchema, input);
  const result = write
    .statement(
      `UPDATE clients SET name = @name, phone = @phone, email = @email, notes = @notes, updated_at = @now
       WHERE id = @id`,
    )
    .run({
      id,
      name: client.name,
      phone: client.phone ?? null,
      email: client.email ?? null,
      notes: client.notes ?? null,
      now: write.now,
    });
  found(result.changes > 0 ? true : undefined, `client ${id}`, 'clientId');
}

/** The client with this name (and email, when given), or a new one. */
export function findOrCreateClient(write: WriteAccess, input: ClientInput): number {
  const client = validated(clientInputSchema, input);
  const row = write
    .statement(
      "SELECT id FROM clients WHERE name = ? AND coalesce(email, '') = ? ORDER BY id LIMIT 1",
    )
    .get(client.name, client.email ?? '') as { id: number } | undefined;
  return row ? row.id : createClient(write, client);
}
