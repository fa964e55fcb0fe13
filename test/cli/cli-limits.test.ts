import { mkdirSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { DEFAULT_BODY_LIMIT, DEFAULT_MAX_POINTS } from '../../server/limits.js';
import { MAX_CSV_LINE_BYTES } from '../../server/inputs/input-file.js';
import { PLAN_LIMITS } from '../../server/sweeps/plan.js';
import { runCli } from '../../server/cli/main.js';
import { writeGeoPackage } from '../inputs/geopackage-writer.js';
import { PROJECT_ROOT, runCliChild } from '../reliability/cli-child.js';
import { polygonGeoJson, run, seededRandom, tempFolder } from './run-cli.js';

// The limits the command line shares with the server (issue 10, items 13 to 15, and the catch-all): input size and
// point count (--body-limit, --max-points), one CSV line, cells per placement and the work budget for `count`, the
// --out folder checked before any work, and one line for any error nobody foresaw.
const write = tempFolder();
const folder = dirname(write('.keep', ''));
const points = write('pts.csv', 'id,x,y\na,100,100\nb,900,300\nc,400,800\nd,700,650\n');
const area = write('area.geojson', polygonGeoJson([[[0, 0], [1000, 0], [1000, 1000], [0, 1000], [0, 0]]]));
const base = ['count', '--points', points, '--area', area, '--crs', 'planar'];
const SAMPLE = join(PROJECT_ROOT, 'samples', 'ostrevan-reservoir');

afterEach(() => {
  delete process.env.GRIDSHAKE_WORK_BUDGET;
  delete process.env.GRIDSHAKE_DEBUG;
});

describe('input limits shared with the server', () => {
  it('uses the server upload limit and point limit by default', () => {
    expect(DEFAULT_BODY_LIMIT).toBe(64 * 1024 * 1024);
    expect(DEFAULT_MAX_POINTS).toBe(2_000_000);
  });

  it('--body-limit lowers the file size limit; the message names the file and the option', async () => {
    // 47 bytes against 0.00001 MB = 10 bytes (the limit is rounded to whole bytes)
    const result = await run([...base, '--cell', '100', '--body-limit', '0.00001']);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`gridshake: ${points}: the file is 0.0000448 MB, larger than the limit of 0.00000954 MB (--body-limit)\n`);
  });

  it('--max-points refuses a dataset with more points, as the server does', async () => {
    const result = await run([...base, '--cell', '100', '--max-points', '3']);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`gridshake: ${points}: 4 points, more than the limit of 3\n`);
  });

  it('refuses a CSV line longer than 1 MB at that line, counting \\r, \\n and \\r\\n line breaks', async () => {
    const long = 'y'.repeat(MAX_CSV_LINE_BYTES + 1);
    for (const [name, text, line] of [
      ['long-lf.csv', `x,y\n1,2\n\n3,${long}\n`, 4],
      ['long-cr.csv', `x,y\r1,2\r3,${long}\r`, 3],
      ['long-crlf.csv', `x,y\r\n1,2\r\n3,4\r\n5,${long}\r\n`, 4],
    ] as const) {
      const path = write(name, text);
      const result = await run(['count', '--points', path, '--crs', 'planar', '--cell', '1']);
      expect(result.code).toBe(1);
      expect(result.stderr).toBe(`gridshake: ${path}: line ${line}: longer than 1 MB, the limit for one line of a CSV file of points\n`);
    }
  });

  it('a CSV line of exactly 1 MB is read', async () => {
    const path = write('wide.csv', `x,y,note\n100,100,a\n900,300,${'n'.repeat(MAX_CSV_LINE_BYTES - 8)}\n400,800,c\n`);
    const result = await run(['count', '--points', path, '--area', area, '--crs', 'planar', '--cell', '500']);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
  });

  it('GeoJSON is not held to the CSV line limit: a 2 MB study area on one line is read', async () => {
    // a circle of 40,000 vertices, written on one line as GeoJSON usually is
    const ring = Array.from({ length: 40_000 }, (_, k) => {
      const t = (2 * Math.PI * k) / 40_000;
      return [500 + 499.123456 * Math.cos(t), 500 + 499.123456 * Math.sin(t)];
    });
    ring.push(ring[0]);
    const path = write('circle.geojson', polygonGeoJson([ring]));
    expect(statSync(path).size).toBeGreaterThan(MAX_CSV_LINE_BYTES);
    const result = await run(['count', '--points', points, '--area', path, '--crs', 'planar', '--cell', '400']);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(0);
  });
});

describe('binary inputs', () => {
  it('a GeoPackage of 40,000 points (over 1 MB) is read whole, without the CSV line check', async () => {
    const random = seededRandom(10);
    const geometries = Array.from({ length: 40_000 }, () => ({ type: 'Point', coordinates: [500_000 + 2000 * random(), 6_000_000 + 2000 * random()] }));
    const path = join(folder, 'nests.gpkg');
    writeFileSync(path, writeGeoPackage([{ table: 'nests', geometryType: 'POINT', epsg: 32633, geometries }]));
    expect(statSync(path).size).toBeGreaterThan(MAX_CSV_LINE_BYTES);
    const result = await run(['count', '--points', path, '--cell', '100', '--json']);
    expect(result.code, result.stderr).toBe(0);
    expect(JSON.parse(result.stdout).pointsTotal).toBe(40_000);
  });
});

describe('count applies the sweeps limits', () => {
  it('--cell 1e-300 is refused with one line, not a RangeError', async () => {
    const result = await run([...base, '--cell', '1e-300']);
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(
      new RegExp(`^gridshake: --cell gives cells of 1e-300 m, too many cells in the valid region of 1000000 m(\\^2|²), more than ${PLAN_LIMITS.maxCellsInRegion}; use cells of at least 0\\.488281 m\n$`),
    );
  });

  it('--cell 0.4 on 1 km^2 (6.25 million cells) is refused', async () => {
    const refused = await run([...base, '--cell', '0.4']);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toMatch(/^gridshake: --cell gives cells of 0\.4 m, about 6250000 cells in the valid region of 1000000 m(\^2|²), more than 4194304/);
  });

  it('the work budget (GRIDSHAKE_WORK_BUDGET) holds for count too', async () => {
    process.env.GRIDSHAKE_WORK_BUDGET = '2';
    const result = await run([...base, '--cell', '100']);
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(/^gridshake: the plan needs 4 point-placements \(points x placements x sizes x \(1 \+ sims\)\), 2\.0 times the budget of 2;/);
  });
});

describe('sweep checks --out before any work', () => {
  // the points file does not exist: an --out refusal must come first, before the inputs are read
  const sweep = (out: string): string[] => ['sweep', '--points', join(folder, 'missing.csv'), '--crs', 'planar', '--per-cell', '2', '--out', out];

  it('refuses a file as --out, and a path through a file (ENOTDIR)', async () => {
    const file = write('results.txt', 'keep me\n');
    const existing = await run(sweep(file));
    expect(existing.code).toBe(1);
    expect(existing.stderr).toBe(`gridshake: --out ${file}: it exists and is not a folder\n`);
    const through = await run(sweep(join(file, 'sub')));
    expect(through.code).toBe(1);
    expect(through.stderr).toBe(`gridshake: --out ${join(file, 'sub')}: a part of the path is a file, not a folder\n`);
  });

  it('refuses an output name taken by a folder', async () => {
    const out = join(folder, 'taken');
    mkdirSync(join(out, 'summary.json'), { recursive: true });
    const result = await run(sweep(out));
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`gridshake: --out ${out}: summary.json exists there and is not a regular file\n`);
  });

  it('refuses a device folder', async () => {
    const result = await run(sweep('/dev/gridshake-results'));
    expect(result.code).toBe(1);
    expect(result.stderr).toBe('gridshake: --out /dev/gridshake-results: under /dev, the folder of devices, not a place for results; choose a folder on disk\n');
  });

  it('creates a missing folder and leaves only the results in it', async () => {
    const out = join(folder, 'new', 'deeper');
    const result = await run(['sweep', '--points', join(SAMPLE, 'points.csv'), '--area', join(SAMPLE, 'area.geojson'), '--crs', 'planar',
      '--per-cell', '2', '--placements', '4', '--sims', '0', '--threads', '1', '--out', out]);
    expect(result.code, result.stderr).toBe(0);
    // the three files and the stability surface of the one cell size (issue 17): stability-<side>m.tif and its areas
    const names = readdirSync(out).sort();
    const side = /^stability-([0-9.]+m)\.tif$/.exec(names.find((name) => name.startsWith('stability-')) ?? '')?.[1];
    expect(names).toEqual([`excess-areas-${side}.geojson`, 'placements.csv', 'report.html', `stability-${side}.tif`, 'summary.json']);
    rmSync(join(folder, 'new'), { recursive: true });
  });
});

describe('any other error ends as one line', () => {
  const failingIo = {
    stdout: (): void => {
      throw new TypeError('the output went away');
    },
    stderr: (text: string): void => {
      captured += text;
    },
  };
  let captured = '';

  it('prints one line "gridshake: unexpected error: ..." and exits 1', async () => {
    captured = '';
    const code = await runCli([...base, '--cell', '100'], failingIo);
    expect(code).toBe(1);
    expect(captured).toBe('gridshake: unexpected error: TypeError: the output went away (GRIDSHAKE_DEBUG=1 shows where)\n');
  });

  it('GRIDSHAKE_DEBUG=1 adds the stack after that line', async () => {
    captured = '';
    process.env.GRIDSHAKE_DEBUG = '1';
    const code = await runCli([...base, '--cell', '100'], failingIo);
    expect(code).toBe(1);
    expect(captured).toMatch(/^gridshake: unexpected error: TypeError: the output went away \(GRIDSHAKE_DEBUG=1 shows where\)\nTypeError: the output went away\n\s+at /);
  });

  it('an exception thrown outside the commands (in a timer) ends the program with one line and exit 1', async () => {
    const thrower = 'data:text/javascript,setTimeout(()=>{throw new RangeError("thrown from a timer")},300)';
    const result = await runCliChild(['count', '--points', join(SAMPLE, 'points.csv'), '--crs', 'planar', '--cell', '100'], {
      bin: true,
      nodeOptions: ['--import', thrower],
      timeoutMs: 30_000,
    });
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(/^gridshake: unexpected error: (RangeError: )?thrown from a timer/);
    expect(result.stderr.trimEnd().split('\n')).toHaveLength(1);
  });
});
