import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/stress/**/*.test.ts'],
    testTimeout: 300_000,
    hookTimeout: 120_000,
    pool: 'forks',
    fileParallelism: false,
    reporters: ['default', 'json'],
    outputFile: { json: '.test-results/vitest-stress.json' },
  },
});
