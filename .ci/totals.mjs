// Adds up vitest JSON reports and prints the one line CI reads: "N passed, N failed".
import { existsSync, readFileSync } from 'node:fs';

let passed = 0;
let failed = 0;
let reports = 0;
for (const file of process.argv.slice(2)) {
  if (!existsSync(file)) continue;
  const report = JSON.parse(readFileSync(file, 'utf8'));
  reports += 1;
  passed += report.numPassedTests ?? 0;
  failed += (report.numFailedTests ?? 0) + (report.numRuntimeErrorTestSuites ?? 0);
  for (const suite of report.testResults ?? []) {
    if (suite.status === 'failed' && (suite.assertionResults ?? []).length === 0) failed += 1;
  }
}
if (reports === 0) failed += 1;
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
