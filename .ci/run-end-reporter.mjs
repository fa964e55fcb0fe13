// A vitest reporter that writes how the run ended: its end reason, the runner's unhandled errors (what vitest prints
// under "Errors") and the test files that never finished. .ci/totals.mjs counts each of them as a failure, so a
// crashed worker cannot hide behind a JSON report that lists only the tests that did run. A run that dies before
// its end writes no file at all, which .ci/totals.mjs also counts as a failure.
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, relative } from 'node:path';

export default class RunEndReporter {
  constructor(options = {}) {
    this.outputFile = options.outputFile ?? '.test-results/run-end.json';
  }

  onTestRunEnd(testModules, unhandledErrors, reason) {
    const unfinished = [];
    const failedModules = [];
    for (const module of testModules) {
      const state = module.state();
      const name = relative(process.cwd(), module.moduleId);
      if (state === 'queued' || state === 'pending') unfinished.push(name);
      else if (state === 'failed') failedModules.push({ name, moduleErrors: module.errors().length });
    }
    const report = {
      reason,
      modules: testModules.length,
      unhandledErrors: unhandledErrors.length,
      unhandledErrorMessages: unhandledErrors.map((error) => String(error?.message ?? error).slice(0, 500)),
      unfinished,
      failedModules,
      finishedAt: new Date().toISOString(),
    };
    mkdirSync(dirname(this.outputFile), { recursive: true });
    writeFileSync(this.outputFile, `${JSON.stringify(report, null, 2)}\n`);
  }
}
