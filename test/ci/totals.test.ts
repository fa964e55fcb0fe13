import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
// @ts-expect-error plain JavaScript module without types (the CI script itself)
import { totals } from '../../.ci/totals.mjs';

const exec = promisify(execFile);

type Totals = { passed: number; failed: number; notes: string[] };
const count = totals as (files: string[]) => Totals;

function folder(): (name: string, value: unknown) => string {
  const dir = mkdtempSync(join(tmpdir(), 'gridshake-totals-'));
  return (name, value) => {
    const path = join(dir, name);
    writeFileSync(path, JSON.stringify(value));
    return path;
  };
}

const CLEAN_END = { reason: 'passed', modules: 2, unhandledErrors: 0, unhandledErrorMessages: [], unfinished: [], failedModules: [] };
const REPORT = { numTotalTests: 420, numPassedTests: 420, numFailedTests: 0, numPendingTests: 0, numTodoTests: 0, testResults: [] };

describe('.ci/totals.mjs', () => {
  it('passes a clean run', () => {
    const file = folder();
    const report = file('vitest.json', REPORT);
    file('vitest.run-end.json', CLEAN_END);
    expect(count([report])).toMatchObject({ passed: 420, failed: 0 });
  });

  // the failure of issue 9: vitest printed "Errors 1 error" and 14 tests never ran, while the JSON said 420 passed
  it('counts runner errors, unfinished files and tests without a result as failures', () => {
    const file = folder();
    const report = file('vitest.json', { ...REPORT, numTotalTests: 434 });
    file('vitest.run-end.json', { ...CLEAN_END, reason: 'failed', unhandledErrors: 1, unhandledErrorMessages: ['FATAL ERROR: v8::Module::IsGraphAsync'], unfinished: ['test/x.test.ts'] });
    const result = count([report]);
    expect(result.passed).toBe(420);
    expect(result.failed).toBe(14 + 1 + 1);
  });

  it('counts a missing report or a missing run-end file as a failure', () => {
    const file = folder();
    const report = file('vitest.json', REPORT);
    expect(count([report]).failed).toBe(1);
    expect(count([report.replace('vitest.json', 'absent.json')]).failed).toBe(1);
    expect(count([]).failed).toBe(1);
  });

  // A real vitest run whose worker is killed mid-file: the totals line must not say "0 failed".
  it('reports a failure when a test worker dies (real vitest run)', async () => {
    const out = mkdtempSync(join(tmpdir(), 'gridshake-crash-'));
    await exec(process.execPath, ['node_modules/vitest/vitest.mjs', 'run', '--config', 'test/ci/fixtures/crash.vitest.config.mjs'], {
      env: { ...process.env, GS_TOTALS_OUT: out },
    }).catch((error: unknown) => error); // vitest exits 1 here, as it should
    const result = count([join(out, 'vitest.json')]);
    expect(result.passed).toBe(1);
    expect(result.failed).toBeGreaterThanOrEqual(1);
    const cli = await exec(process.execPath, ['.ci/totals.mjs', join(out, 'vitest.json')]).catch((error: { code: number; stdout: string }) => error);
    expect((cli as { code: number }).code).toBe(1);
    expect((cli as { stdout: string }).stdout).toMatch(/^1 passed, [1-9]\d* failed$/m);
  }, 120_000);
});
