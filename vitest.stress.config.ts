import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/stress/**/*.test.ts'],
    testTimeout: 300_000,
    hookTimeout: 120_000,
    pool: 'forks',
    fileParallelism: false,
    reporters: ['default', 'json', ['./.ci/run-end-reporter.mjs', { outputFile: '.test-results/vitest-stress.run-end.json' }]],
    outputFile: { json: '.test-results/vitest-stress.json' },
  },
});
