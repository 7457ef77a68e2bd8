/**
 * Which test-in a home's plan is built on. Without a mark the latest dated test-in is used;
 * a home file's own `leakageTest` is marked on import, so a re-import plans on the same test.
 */
import type { Migration } from './index.ts';

export const migration0004: Migration = {
  version: 4,
  name: 'plan-basis',
  sql: `
    ALTER TABLE leakage_tests ADD COLUMN plan_basis INTEGER NOT NULL DEFAULT 0
      CHECK (plan_basis IN (0, 1));
  `,
};
