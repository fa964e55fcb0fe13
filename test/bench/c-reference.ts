/**
 * The benchmark's yardstick: test/bench/c/count-loop.c, a plain C loop that only counts points into cells
 * (float64, one thread, -O3, -ffp-contract=off so its roundings are the contract's). The benchmark compiles it
 * when a C compiler is present, checks that its counts equal the contract's (plainReferenceCount, by checksum) and
 * reports its time per point-placement; every speed target is a ratio against this time measured in the same run.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { PACKAGE_ROOT } from '../../server/services/project-paths.js';
import type { Placement } from '../../workers/types.js';
import { plainReferenceCount } from './reference-loop.js';

const SOURCE = join(PACKAGE_ROOT, 'test', 'bench', 'c', 'count-loop.c');
const BINARY = join(PACKAGE_ROOT, 'dist', 'test', 'bench', 'count-loop');

export interface CReference {
  /** the compiler command that built it */
  compiler: string;
  /** best seconds per point-placement over the given placements */
  nsPerPointPlacement(xy: Float64Array, origin: { x: number; y: number }, cellSize: number, placements: readonly Placement[]): number;
}

/** Builds the C reference with the first compiler found (cc, gcc, clang); null (and why) when there is none. */
export function buildCReference(): { reference: CReference | null; reason: string } {
  for (const compiler of ['cc', 'gcc', 'clang']) {
    if (spawnSync(compiler, ['--version'], { stdio: 'ignore' }).status !== 0) continue;
    mkdirSync(dirname(BINARY), { recursive: true });
    const flags = ['-O3', '-ffp-contract=off', '-o', BINARY, SOURCE, '-lm'];
    execFileSync(compiler, flags, { stdio: 'inherit' });
    return { reference: makeReference(`${compiler} ${flags.join(' ')}`), reason: '' };
  }
  return { reference: null, reason: 'no C compiler (cc, gcc or clang) found: ratios against the C loop are not available' };
}

/** The counting window of one placement: the grid-frame cells that the points' bounding box can reach. */
function window(xy: Float64Array, origin: { x: number; y: number }, cellSize: number, placement: Placement): number[] {
  const t = (placement.angle * Math.PI) / 180;
  const cos = Math.cos(t);
  const sin = Math.sin(t);
  let iMin = Infinity;
  let iMax = -Infinity;
  let jMin = Infinity;
  let jMax = -Infinity;
  for (let k = 0; k < xy.length; k += 2) {
    const dx = xy[k] - origin.x;
    const dy = xy[k + 1] - origin.y;
    const i = Math.floor((dx * cos + dy * sin) / cellSize - placement.u);
    const j = Math.floor((-dx * sin + dy * cos) / cellSize - placement.v);
    if (i < iMin) iMin = i;
    if (i > iMax) iMax = i;
    if (j < jMin) jMin = j;
    if (j > jMax) jMax = j;
  }
  return [cos, sin, cellSize, placement.u, placement.v, iMin, jMin, iMax - iMin + 1, jMax - jMin + 1];
}

/** The C program's checksum computed with the contract's own counting loop (BigInt, modulo 2^64). */
function contractChecksum(xy: Float64Array, origin: { x: number; y: number }, placements: readonly Placement[], records: number[][]): string {
  let sum = 0n;
  placements.forEach((placement, k) => {
    const [, , cellSize, u, v, i0, j0, nx, ny] = records[k];
    const out = new Int32Array(nx * ny);
    plainReferenceCount(xy, origin.x, origin.y, placement.angle, cellSize, u, v, i0, j0, nx, ny, out);
    for (let cell = 0; cell < out.length; cell++) sum += BigInt(out[cell]) * BigInt((cell % 1000003) + 1);
  });
  return (sum & 0xffffffffffffffffn).toString();
}

function makeReference(compiler: string): CReference {
  return {
    compiler,
    nsPerPointPlacement(xy, origin, cellSize, placements) {
      const folder = mkdtempSync(join(tmpdir(), 'gridshake-c-reference-'));
      try {
        const relative = new Float64Array(xy.length);
        for (let k = 0; k < xy.length; k += 2) {
          relative[k] = xy[k] - origin.x;
          relative[k + 1] = xy[k + 1] - origin.y;
        }
        const records = placements.map((placement) => window(xy, origin, cellSize, placement));
        writeFileSync(join(folder, 'points.f64'), new Uint8Array(relative.buffer));
        writeFileSync(join(folder, 'placements.f64'), new Uint8Array(new Float64Array(records.flat()).buffer));
        const output = execFileSync(BINARY, [join(folder, 'points.f64'), join(folder, 'placements.f64'), '3'], { encoding: 'utf8' });
        const result = JSON.parse(output) as { bestSeconds: number; checksum: string };
        const expected = contractChecksum(xy, origin, placements, records);
        if (result.checksum !== expected) throw new Error(`the C reference's counts differ from the contract's (checksum ${result.checksum}, expected ${expected})`);
        return (result.bestSeconds * 1e9) / ((xy.length / 2) * placements.length);
      } finally {
        rmSync(folder, { recursive: true, force: true });
      }
    },
  };
}
