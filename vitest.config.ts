import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['test/bench/**', 'node_modules/**'],
    pool: 'threads',
    testTimeout: 30_000,
    reporters: ['default', './test/_reporters/plain-summary.ts'],
  },
});
