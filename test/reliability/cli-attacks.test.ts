import { execFileSync } from 'node:child_process';
import { chmodSync, closeSync, mkdirSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_PLAN } from '../../shared/plan-rules.js';
import { loadDataset } from '../../server/inputs/index.js';
import { resolveCellSizes } from '../../server/sweeps/plan.js';
import { PROJECT_ROOT, runCliChild, type ChildRun } from './cli-child.js';

// Attacks on the command line (issue 10, items 12 to 15), each run in a child process killed at a time bound:
// special files as inputs, inputs past the server's size limits, an --out that cannot take the results, cell sizes
// past the sweeps' limits, and an error nobody caught. Each must end in bounded time as one line "gridshake: ..."
// naming the file or option, exit code 1, no stack trace.

/** Time runCli may take to refuse (module loading excluded): the bound for these refusals. */
const REFUSAL_MS = 2000;

const folder = mkdtempSync(join(tmpdir(), 'gridshake-cli-attacks-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

const sample = (name: string): string => join(PROJECT_ROOT, 'samples', 'ostrevan-reservoir', name);
const POINTS = sample('points.csv');
const AREA = sample('area.geojson');

function fifo(name: string): string {
  const path = join(folder, name);
  execFileSync('mkfifo', [path]);
  return path;
}

/** One line on stderr, exit 1, within the bound. */
function expectOneLineRefusal(result: ChildRun, message: RegExp): void {
  expect(result.code, result.stderr).toBe(1);
  expect(result.stderr).toMatch(message);
  expect(result.stderr.trimEnd().split('\n')).toHaveLength(1);
  expect(result.stderr).not.toMatch(/\n\s+at /);
  expect(result.cliMs).not.toBeNull();
  expect(result.cliMs as number).toBeLessThan(REFUSAL_MS);
  console.log(`cli attacks: refused in ${result.cliMs} ms: ${result.stderr.trim().slice(0, 110)}`);
}

describe('special files as inputs (item 12)', () => {
  it('/dev/zero, /dev/urandom and a named pipe as --points, --area or --no-data are refused without reading or blocking', async () => {
    const pipe = fifo('points-pipe.csv');
    const cases: Array<[string[], RegExp]> = [
      [['count', '--points', '/dev/zero'], /^gridshake: \/dev\/zero: cannot read the file \(a character device, not a regular file\)\n$/],
      [['count', '--points', pipe], /^gridshake: .*points-pipe\.csv: cannot read the file \(a named pipe, not a regular file\)\n$/],
      [['count', '--points', POINTS, '--area', '/dev/urandom'], /^gridshake: \/dev\/urandom: cannot read the file \(a character device, not a regular file\)\n$/],
      [['count', '--points', POINTS, '--area', AREA, '--no-data', pipe], /^gridshake: .*points-pipe\.csv: cannot read the file \(a named pipe/],
      [['sweep', '--points', pipe, '--per-cell', '2', '--out', join(folder, 'out-pipe')], /^gridshake: .*points-pipe\.csv: cannot read the file \(a named pipe/],
    ];
    // at most two children at a time: each is killed at 20 s should it block
    for (let k = 0; k < cases.length; k += 2) {
      const batch = cases.slice(k, k + 2);
      const results = await Promise.all(batch.map(([argv]) => runCliChild([...argv, '--crs', 'planar', ...(argv[0] === 'count' ? ['--cell', '200'] : [])], { timeoutMs: 20_000 })));
      results.forEach((result, index) => expectOneLineRefusal(result, batch[index][1]));
    }
  });
});

describe('inputs past the size limits (item 13)', () => {
  it('a sparse 1.5 GB file is refused by its size without being read', async () => {
    const path = join(folder, 'huge.csv');
    closeSync(openSync(path, 'w'));
    truncateSync(path, 1.5 * 1024 ** 3);
    const result = await runCliChild(['count', '--points', path, '--crs', 'planar', '--cell', '10'], { timeoutMs: 20_000 });
    expectOneLineRefusal(result, /^gridshake: .*huge\.csv: the file is 1540 MB, larger than the limit of 64 MB \(--body-limit\)\n$/);
    rmSync(path);
  });

  it('a 100 MB single-line CSV is refused by its size before it is read', async () => {
    const path = join(folder, 'long.csv');
    writeFileSync(path, `x,y\n1,2\n3,${'7'.repeat(100_000_000)}\n`);
    const result = await runCliChild(['count', '--points', path, '--crs', 'planar', '--cell', '1'], { timeoutMs: 20_000 });
    expectOneLineRefusal(result, /^gridshake: .*long\.csv: the file is 95\.4 MB, larger than the limit of 64 MB \(--body-limit\)\n$/);
    rmSync(path);
  });

  it('a 60 MB line within the size limit is refused at that line', async () => {
    const path = join(folder, 'line.csv');
    writeFileSync(path, `x,y\r\n1,2\r\n3,4\r\n${'5'.repeat(60_000_000)},6\r\n`);
    const result = await runCliChild(['count', '--points', path, '--crs', 'planar', '--cell', '1'], { timeoutMs: 20_000 });
    expectOneLineRefusal(result, /^gridshake: .*line\.csv: line 4: longer than 1 MB/);
    rmSync(path);
  });
});

describe('an --out that cannot take the results (item 14)', () => {
  // a sweep of several seconds: today's code computed it before looking at --out
  const sweep = (out: string): string[] => ['sweep', '--points', POINTS, '--area', AREA, '--crs', 'planar', '--per-cell', '2,5', '--placements', '256', '--sims', '99', '--out', out];

  it('/proc/... is refused before any work', async () => {
    const result = await runCliChild(sweep('/proc/self/gridshake-results'), { timeoutMs: 20_000 });
    expectOneLineRefusal(result, /^gridshake: --out \/proc\/self\/gridshake-results: on the kernel's proc filesystem, not a place for results; choose a folder on disk\n$/);
  });

  it('an output name taken by a named pipe is refused before any work (writing it would block)', async () => {
    const out = join(folder, 'out-with-pipe');
    mkdirSync(out);
    execFileSync('mkfifo', [join(out, 'report.html')]);
    const result = await runCliChild(sweep(out), { timeoutMs: 20_000 });
    expectOneLineRefusal(result, /^gridshake: --out .*out-with-pipe: report\.html exists there and is not a regular file\n$/);
  });

  it('a folder the user may not write to is refused before any work (EACCES)', async () => {
    const out = mkdtempSync(join(tmpdir(), 'gridshake-cli-readonly-'));
    chmodSync(out, 0o555);
    // root may write anywhere: the refusal is checked as the unprivileged user 'nobody' (uid 65534) then
    const uid = process.getuid?.() === 0 ? 65534 : undefined;
    try {
      const existing = await runCliChild(sweep(out), { timeoutMs: 20_000, uid });
      expectOneLineRefusal(existing, /^gridshake: --out .*: cannot write there \(permission denied\)\n$/);
      const below = await runCliChild(sweep(join(out, 'new')), { timeoutMs: 20_000, uid });
      expectOneLineRefusal(below, /^gridshake: --out .*new: cannot create the folder \(permission denied\)\n$/);
      expect(readdirSync(out)).toEqual([]);
    } finally {
      chmodSync(out, 0o755);
      rmSync(out, { recursive: true, force: true });
    }
  });
});

describe('cell sizes past the sweeps limits (item 15)', () => {
  it('count --cell 0.5 on the 14 km^2 sample is refused at once with the message a sweep plan gets', async () => {
    const result = await runCliChild(['count', '--points', POINTS, '--area', AREA, '--crs', 'planar', '--cell', '0.5'], { timeoutMs: 20_000 });
    // the server's message for the same cell size on the same dataset, with the option named as on the command line
    const dataset = loadDataset({ points: { name: POINTS, content: readFileSync(POINTS) }, area: { name: AREA, content: readFileSync(AREA) } }, { crs: 'planar' });
    const serverMessage = (() => {
      try {
        resolveCellSizes({ ...DEFAULT_PLAN, cells: [0.5] }, dataset.region.area, dataset.inside.length);
      } catch (error) {
        return (error as Error).message;
      }
      return 'accepted';
    })();
    // the field is named in each audience's words (plan.cells[0] or a page label; --cell on the command line)
    const rest = (message: string): string => message.slice(message.indexOf(' gives cells of '));
    expect(rest(serverMessage)).toMatch(/^ gives cells of 0\.5 m, about 564\d+ cells in the valid region of 1410\d+ m(\^2|²), more than 4194304; use cells of at least 1\.83\d* m$/);
    expectOneLineRefusal(result, /^gridshake: --cell gives cells of 0\.5 m/);
    expect(rest(result.stderr)).toBe(`${rest(serverMessage)}\n`);
  });
});
