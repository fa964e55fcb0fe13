import { defineConfig } from 'vitest/config';

// The long runs (`npm run test:soak`, run by .ci/run after the stress suite): the kill loop (at least 100 SIGKILLs of
// a real server process with a restart after each, bounded in time by the test itself; about 3 minutes on an idle
// 2-core machine) and the upload-latency check (reads p99 < 50 ms and events every 1.5 s during the largest upload).
export default defineConfig({
  test: {
    include: ['test/soak/**/*.test.ts'],
    testTimeout: 1_500_000,
    hookTimeout: 120_000,
    pool: 'forks',
    fileParallelism: false,
    reporters: ['default', 'json', ['./.ci/run-end-reporter.mjs', { outputFile: '.test-results/vitest-soak.run-end.json' }]],
    outputFile: { json: '.test-results/vitest-soak.json' },
  },
});
