/**
 * Golden files for the formats users keep: placements.csv, summary.json, grid.geojson (square and hexagonal cells)
 * and the grid GeoPackage, made from fixed inputs (test/golden/golden-inputs.ts) and compared with the files in
 * test/golden/files/. What changes from run to run is normalised first: timings, versions and the GeoPackage's
 * last_change timestamp; the GeoPackage is compared by its tables and rows, not its bytes.
 * Regenerate after an intended change of a format: REGEN=1 npx vitest run test/golden
 * (then read the diff: every changed line is a change users see).
 * Starts piscina workers from dist/: run `npm run build:server` first.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Dataset, PlacementRow, SweepSummary } from '../../shared/contracts.js';
import { boundedCellGrid, type GridRequest } from '../../server/grid-export/grid-cells.js';
import { effectiveCoordinates, gridGeoJsonText } from '../../server/grid-export/grid-geojson.js';
import { writeGridGeoPackage } from '../../server/grid-export/grid-geopackage.js';
import { placementsToCsv } from '../../server/sweeps/placements-csv.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { goldenDataset, goldenPlan } from './golden-inputs.js';

const FILES = join(import.meta.dirname, 'files');
const REGEN = process.env.REGEN === '1';

let dataset: Dataset;
let rows: PlacementRow[];
let summary: SweepSummary;
const scratch = mkdtempSync(join(tmpdir(), 'gridshake-golden-'));

beforeAll(async () => {
  dataset = goldenDataset();
  const pool = new SweepPool({ threads: 1 });
  try {
    ({ rows, summary } = await pool.runSweep(dataset, goldenPlan(), {}));
  } finally {
    await pool.destroy();
  }
}, 120_000);

afterAll(() => rmSync(scratch, { recursive: true, force: true }));

/** Entries of summary.versions that are not version numbers: the executor's name and the thread count (fixed here). */
const NOT_VERSIONS = new Set(['executor', 'threads']);

/** summary.json as written, with the timings and the version numbers (which change from run to run) fixed. */
function normalizedSummary(): string {
  const versions = Object.fromEntries(Object.entries(summary.versions).map(([name, value]) => [name, NOT_VERSIONS.has(name) ? value : '<version>']));
  const timings = { startedAt: '<time>', finishedAt: '<time>', seconds: 0 };
  return `${JSON.stringify({ ...summary, versions, timings }, null, 2)}\n`;
}

/** The request for placement `placementIndex` of size `sizeIndex`, as the export routes build it. */
function gridRequest(sizeIndex: number, placementIndex: number): GridRequest {
  const row = rows.find((candidate) => candidate.sizeIndex === sizeIndex && candidate.placementIndex === placementIndex)!;
  return {
    cellSize: row.cellSize,
    shape: row.shape ?? 'square',
    placement: { u: row.u, v: row.v, angle: row.angle },
    minCoverage: summary.plan.minCoverage,
    sizeIndex,
    placementIndex,
  };
}

async function gridGeoJson(sizeIndex: number, placementIndex: number): Promise<string> {
  const request = gridRequest(sizeIndex, placementIndex);
  const text = await gridGeoJsonText({
    datasetName: dataset.name,
    projection: dataset.projection,
    origin: dataset.origin,
    request,
    cells: boundedCellGrid(dataset, request, 'geojson'),
    coordinates: effectiveCoordinates(dataset.projection, undefined),
  });
  return `${JSON.stringify(JSON.parse(text), null, 1)}\n`;
}

/** The GeoPackage's header pragmas, table definitions and rows (blobs as hex), without the last_change timestamp. */
async function gridGeoPackageRows(sizeIndex: number, placementIndex: number): Promise<string> {
  const request = gridRequest(sizeIndex, placementIndex);
  const path = join(scratch, `grid-${sizeIndex}-${placementIndex}.gpkg`);
  await writeGridGeoPackage({ path, datasetName: dataset.name, projection: dataset.projection, request, cells: boundedCellGrid(dataset, request, 'gpkg') });
  const db = new Database(path, { readonly: true });
  try {
    const tables = db.prepare("SELECT name, sql FROM sqlite_master WHERE type = 'table' ORDER BY name").all() as { name: string; sql: string }[];
    const dump = {
      application_id: db.pragma('application_id', { simple: true }),
      user_version: db.pragma('user_version', { simple: true }),
      tables: tables.map(({ name, sql }) => ({
        name,
        sql,
        rows: (db.prepare(`SELECT * FROM "${name}" ORDER BY rowid`).all() as Record<string, unknown>[]).map((row) =>
          Object.fromEntries(
            Object.entries(row)
              .filter(([column]) => !(name === 'gpkg_contents' && column === 'last_change'))
              .map(([column, value]) => [column, Buffer.isBuffer(value) ? value.toString('hex') : value]),
          ),
        ),
      })),
    };
    return `${JSON.stringify(dump, null, 1)}\n`;
  } finally {
    db.close();
  }
}

const GOLDEN: { file: string; make: () => string | Promise<string> }[] = [
  { file: 'placements.csv', make: () => placementsToCsv(rows, { summary }) },
  { file: 'summary.json', make: normalizedSummary },
  // size 0: 150 m squares; size 2: 150 m hexagons (every side of the first shape, then the next)
  { file: 'grid-square.geojson', make: () => gridGeoJson(0, 3) },
  { file: 'grid-hex.geojson', make: () => gridGeoJson(2, 3) },
  { file: 'grid-square.gpkg.json', make: () => gridGeoPackageRows(1, 4) },
];

describe('golden files', () => {
  it.each(GOLDEN)('$file matches test/golden/files/$file', async ({ file, make }) => {
    const actual = await make();
    const path = join(FILES, file);
    if (REGEN) {
      mkdirSync(FILES, { recursive: true });
      writeFileSync(path, actual);
    }
    expect(actual).toBe(readFileSync(path, 'utf8'));
  });
});
