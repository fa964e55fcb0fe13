import { defineConfig } from 'vitest/config';

// The kill loop (`npm run test:soak`): at least 100 SIGKILLs of a real server process with a restart after each,
// bounded in time by the test itself. CI runs it after the stress suite.
export default defineConfig({
  test: {
    include: ['test/soak/**/*.test.ts'],
    testTimeout: 1_500_000,
    hookTimeout: 120_000,
    pool: 'forks',
    fileParallelism: false,
    reporters: ['default', 'json'],
    outputFile: { json: '.test-results/vitest-soak.json' },
  },
});
