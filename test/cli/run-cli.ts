/** Running the CLI in-process with captured output, and writing fixture files to a temporary folder. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../../server/cli/main.js';

export interface CliRun {
  code: number;
  stdout: string;
  stderr: string;
}

export async function run(argv: string[]): Promise<CliRun> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(argv, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

export function tempFolder(): (name: string, content: string) => string {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-cli-'));
  return (name, content) => {
    const path = join(folder, name);
    writeFileSync(path, content);
    return path;
  };
}

/** Mulberry32, a small seeded generator (T. Ettinger, public domain), so fixtures are the same on every run. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function polygonGeoJson(...polygons: number[][][][]): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: polygons.map((rings, k) => ({ type: 'Feature', id: `p${k + 1}`, properties: {}, geometry: { type: 'Polygon', coordinates: rings } })),
  });
}
