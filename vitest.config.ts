import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    // Object.groupBy for chevrotain 13 on Node 20: see language/polyfills/object-group-by.cjs.
    setupFiles: ['./test/setup/polyfills.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
  },
});
