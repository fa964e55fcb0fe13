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

export { seededRandom } from '../fixtures/seeded-random.js';

export function polygonGeoJson(...polygons: number[][][][]): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: polygons.map((rings, k) => ({ type: 'Feature', id: `p${k + 1}`, properties: {}, geometry: { type: 'Polygon', coordinates: rings } })),
  });
}
