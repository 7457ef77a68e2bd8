/** The user's settings, each with a default until changed. */
import { z } from 'zod';
import { RANKINGS } from '../../core/schema.ts';
import { JOB_STATUSES, LEAKINESS_BANDS, LEGACY_JOB_STATUSES } from './homes.ts';
import type { ReadAccess, WriteAccess } from '../store.ts';
import { readJson, validated } from './_rows.ts';

export const settingsSchema = z.strictObject({
  units: z.enum(['IP', 'SI']),
  discountRateReal: z.number().min(-0.05).max(0.2),
  ranking: z.enum(RANKINGS),
  laborRateUsdPerHour: z.number().min(0).max(1000),
  markupFraction: z.number().min(0).max(5),
  electricityKgCo2PerKwh: z.number().min(0).max(2).nullable(),
  /** Who is using Sealwork, as job changes are signed ("By"); empty until given. */
  userName: z.string().trim().max(100),
  /** The Portfolio's saved choices of homes, each a name and the filters it stands for. */
  portfolioSelections: z
    .array(
      z.strictObject({
        name: z.string().trim().min(1).max(100),
        filter: z.strictObject({
          town: z.string().max(100).optional(),
          heatingFuel: z.string().max(40).optional(),
          jobStatus: z.enum(JOB_STATUSES).optional(),
          leakiness: z.enum(LEAKINESS_BANDS).optional(),
        }),
      }),
    )
    .max(50)
    .refine(
      (selections) => new Set(selections.map((entry) => entry.name)).size === selections.length,
      'expected each selection to have a name of its own',
    ),
});
export type Settings = z.output<typeof settingsSchema>;

/**
 * Defaults before the user sets anything. The 3 % real discount rate is the order of the
 * DOE/FEMP rate published with NIST Handbook 135's annual supplement (from memory; set your
 * program's rate). Labour rate and markup are demo defaults; the grid factor and the user's
 * name are unknown until given (a project from before the name was kept reads as no name).
 */
export const DEFAULT_SETTINGS: Settings = {
  units: 'IP',
  discountRateReal: 0.03,
  ranking: 'sir',
  laborRateUsdPerHour: 58,
  markupFraction: 0.15,
  electricityKgCo2PerKwh: null,
  userName: '',
  portfolioSelections: [],
};

/**
 * Saved selections as written before the job stages (schema version 5 and earlier): a
 * selection of "scheduled" jobs now selects "approved" ones, and so on (LEGACY_JOB_STATUSES),
 * so an upgraded project keeps its selections instead of falling back to none.
 */
function withStagesOfToday(selections: unknown): unknown {
  if (!Array.isArray(selections)) return selections;
  return selections.map((selection: unknown) => {
    if (typeof selection !== 'object' || selection === null) return selection;
    const { filter } = selection as { filter?: unknown };
    if (typeof filter !== 'object' || filter === null) return selection;
    const { jobStatus } = filter as { jobStatus?: unknown };
    if (typeof jobStatus !== 'string' || !Object.hasOwn(LEGACY_JOB_STATUSES, jobStatus)) {
      return selection;
    }
    return { ...selection, filter: { ...filter, jobStatus: LEGACY_JOB_STATUSES[jobStatus] } };
  });
}

export function getSettings(read: ReadAccess): Settings {
  const rows = read.statement('SELECT key, value FROM settings').all() as {
    key: string;
    value: string;
  }[];
  // Keys this version does not know (a newer Sealwork's) are left in the file, unread.
  const known = new Set(Object.keys(DEFAULT_SETTINGS));
  const stored = Object.fromEntries(
    rows.filter((row) => known.has(row.key)).map((row) => [row.key, readJson<unknown>(row.value)]),
  );
  if ('portfolioSelections' in stored) {
    stored.portfolioSelections = withStagesOfToday(stored.portfolioSelections);
  }
  const merged = { ...DEFAULT_SETTINGS, ...stored };
  // A setting from a newer version, or one hand-edited out of range, falls back to its default.
  const result = settingsSchema.safeParse(merged);
  if (result.success) return result.data;
  const repaired: Record<string, unknown> = { ...merged };
  for (const issue of result.error.issues) {
    const key = issue.path[0];
    if (typeof key === 'string') repaired[key] = DEFAULT_SETTINGS[key as keyof Settings];
  }
  return settingsSchema.parse(repaired);
}

/** Changes some settings; the others keep their values. */
export function updateSettings(write: WriteAccess, patch: Partial<Settings>): Settings {
  const next = validated(settingsSchema, { ...getSettings(write), ...patch });
  const upsert = write.statement(
    `INSERT INTO settings (key, value, updated_at) VALUES (?, ?, ?)
     ON CONFLICT (key) DO UPDATE SET value = excluded.value, updated_at = excluded.updated_at`,
  );
  for (const key of Object.keys(patch) as (keyof Settings)[]) {
    upsert.run(key, JSON.stringify(next[key]), write.now);
  }
  return next;
}
