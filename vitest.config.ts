import { defineConfig } from 'vitest/config';

// The normal test run: engine, reference checks, inputs, server API, browser end-to-end.
// Long load and soak parts live under test/stress and run with `npm run test:stress`.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['test/stress/**', 'test/soak/**', 'node_modules/**', 'dist/**'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
    reporters: ['default', 'json', ['./.ci/run-end-reporter.mjs', { outputFile: '.test-results/vitest.run-end.json' }]],
    outputFile: { json: '.test-results/vitest.json' },
  },
});
