// Adds up vitest runs and prints the one line CI reads: "N passed, N failed".
// Usage: node .ci/totals.mjs REPORT.json [REPORT.json ...]. Each REPORT.json is vitest's JSON report; beside it,
// REPORT.run-end.json is written by .ci/run-end-reporter.mjs. Every report named here must exist: a missing JSON
// report or a missing run-end file (the run died before its end) counts as a failure, and so do the runner's
// unhandled errors (vitest's "Errors"), test files that did not finish, files that failed outside any test, tests
// that never reached a result, and an interrupted run.
import { existsSync, readFileSync } from 'node:fs';

export function totals(files) {
  let passed = 0;
  let failed = 0;
  const notes = [];
  for (const file of files) {
    if (!existsSync(file)) {
      failed += 1;
      notes.push(`${file}: missing (the run did not write its report)`);
      continue;
    }
    const report = JSON.parse(readFileSync(file, 'utf8'));
    passed += report.numPassedTests ?? 0;
    failed += report.numFailedTests ?? 0;
    for (const suite of report.testResults ?? []) {
      if (suite.status === 'failed' && (suite.assertionResults ?? []).every((test) => test.status !== 'failed')) {
        failed += 1;
        notes.push(`${file}: ${suite.name} failed outside any test`);
      }
    }
    const accounted = (report.numPassedTests ?? 0) + (report.numFailedTests ?? 0) + (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
    if ((report.numTotalTests ?? 0) > accounted) {
      failed += report.numTotalTests - accounted;
      notes.push(`${file}: ${report.numTotalTests - accounted} tests never reached a result`);
    }
    const endFile = file.replace(/\.json$/, '.run-end.json');
    if (!existsSync(endFile)) {
      failed += 1;
      notes.push(`${endFile}: missing (the run did not reach its end)`);
      continue;
    }
    const end = JSON.parse(readFileSync(endFile, 'utf8'));
    if (end.unhandledErrors > 0) {
      failed += end.unhandledErrors;
      notes.push(`${endFile}: ${end.unhandledErrors} runner errors: ${end.unhandledErrorMessages.join(' | ')}`);
    }
    if (end.unfinished.length > 0) {
      failed += end.unfinished.length;
      notes.push(`${endFile}: files that did not finish: ${end.unfinished.join(', ')}`);
    }
    if (end.reason === 'interrupted') {
      failed += 1;
      notes.push(`${endFile}: the run was interrupted`);
    }
  }
  if (files.length === 0) {
    failed += 1;
    notes.push('no report named');
  }
  return { passed, failed, notes };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { passed, failed, notes } = totals(process.argv.slice(2));
  for (const note of notes) console.log(`totals: ${note}`);
  console.log(`${passed} passed, ${failed} failed`);
  process.exit(failed === 0 && passed > 0 ? 0 : 1);
}
