import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // Object.groupBy for chevrotain 13 on Node 20: see language/polyfills/object-group-by.cjs. Properties stop
    // within a time limit and report their seed: see test/setup/property-time-limit.ts.
    setupFiles: ['./test/setup/polyfills.ts', './test/setup/property-time-limit.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
