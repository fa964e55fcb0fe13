/**
 * `gridshake sweep --out` writes the stability files per cell size (issue 17): stability-<side>m.tif read back by
 * the registry library geotiff (size, georeferencing, values), excess-areas-<side>m.geojson with the planted cluster's
 * centre inside the excess area (RFC 7946 longitude/latitude for an EPSG input, @turf/turf booleanPointInPolygon),
 * the report's section, and with sims = 0 the surface without areas. Invented data (a planted cluster in CSR) in
 * WGS 84 / UTM zone 33N (EPSG:32633) coordinates of an invented place.
 */
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { booleanPointInPolygon, point, polygon } from '@turf/turf';
import { fromArrayBuffer } from 'geotiff';
import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../server/cli/main.js';
import type { SweepSummary } from '../../shared/contracts.js';
import { createRandom } from '../../workers/random/index.js';

const UTM33 = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
const X0 = 400_000;
const Y0 = 5_300_000;
const CENTRE = [X0 + 1300, Y0 + 700];

function scenario(): { folder: string; points: string; area: string } {
  const folder = mkdtempSync(join(tmpdir(), 'gridshake-stability-'));
  const random = createRandom(1717);
  const lines = ['id,x,y'];
  for (let k = 0; k < 400; k++) lines.push(`B${k},${(X0 + 2000 * random()).toFixed(2)},${(Y0 + 2000 * random()).toFixed(2)}`);
  for (let k = 0; k < 120; ) {
    const dx = (2 * random() - 1) * 80;
    const dy = (2 * random() - 1) * 80;
    if (dx * dx + dy * dy > 6400) continue;
    lines.push(`C${k},${(CENTRE[0]! + dx).toFixed(2)},${(CENTRE[1]! + dy).toFixed(2)}`);
    k += 1;
  }
  const points = join(folder, 'points.csv');
  writeFileSync(points, `${lines.join('\n')}\n`);
  const area = join(folder, 'area.geojson');
  const ring = [[X0, Y0], [X0 + 2000, Y0], [X0 + 2000, Y0 + 2000], [X0, Y0 + 2000], [X0, Y0]];
  writeFileSync(area, JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }] }));
  return { folder, points, area };
}

async function sweep(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(['sweep', ...args, '--threads', '1'], { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

describe('sweep --out: stability files', () => {
  it('writes the GeoTIFF and the areas per cell size; the excess area holds the cluster centre', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const result = await sweep(['--points', files.points, '--area', files.area, '--crs', 'EPSG:32633', '--cells', '250,500', '--placements', '16', '--sims', '39', '--out', out]);
    expect(result.code, result.stderr).toBe(0);
    expect(result.stdout).toMatch(/^Stable areas, cells of 250 m: excess [0-9.]+ km2/m);
    for (const side of ['250m', '500m']) {
      const bytes = readFileSync(join(out, `stability-${side}.tif`));
      const image = await (await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer)).getImage();
      const pixel = Number.parseInt(side, 10) / 8;
      expect(image.getWidth()).toBe(2000 / pixel);
      expect(image.getHeight()).toBe(2000 / pixel);
      expect(image.getOrigin()).toEqual([X0, Y0 + 2000, 0]);
      expect(image.getResolution()).toEqual([pixel, -pixel, 0]);
      expect((image.getGeoKeys() as Record<string, unknown>).ProjectedCSTypeGeoKey).toBe(32633);
      const [excess, deficit] = (await image.readRasters()) as unknown as Float32Array[];
      const col = Math.floor((CENTRE[0]! - X0) / pixel);
      const row = Math.floor((Y0 + 2000 - CENTRE[1]!) / pixel);
      expect(excess![row * image.getWidth() + col]).toBeGreaterThan(0.9);
      expect(deficit![row * image.getWidth() + col]).toBe(0);
      for (const value of [...excess!, ...deficit!]) expect(value >= 0 && value <= 1).toBe(true);

      const geojson = JSON.parse(readFileSync(join(out, `excess-areas-${side}.geojson`), 'utf8')) as {
        features: { properties: { kind: string; maxShare: number; areaKm2: number }; geometry: { coordinates: number[][][] } }[];
      };
      const excessAreas = geojson.features.filter((f) => f.properties.kind === 'excess');
      expect(excessAreas).toHaveLength(1);
      const lonlat = proj4(UTM33, 'WGS84', CENTRE) as [number, number];
      expect(booleanPointInPolygon(point(lonlat), polygon(excessAreas[0]!.geometry.coordinates))).toBe(true);
      expect(excessAreas[0]!.geometry.coordinates[0]![0]![0]).toBeGreaterThan(13); // longitude, not metres
    }
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8')) as SweepSummary;
    expect(summary.stability?.map((entry) => entry.files.tif)).toEqual(['stability-250m.tif', 'stability-500m.tif']);
    const report = readFileSync(join(out, 'report.html'), 'utf8');
    expect(report).toContain('Where: placement-stable areas');
    expect(report).toContain('Benjamini-Hochberg');
    expect(report).toMatch(/single\s+out a household/);
    expect(report).toContain('class="excess"');
  }, 120_000);

  it('longitude/latitude input: areas in RFC 7946 longitude/latitude, the GeoTIFF in the local equal-area projection', async () => {
    const files = scenario();
    const toLonLat = (x: number, y: number): [number, number] => proj4(UTM33, 'WGS84', [x, y]) as [number, number];
    const rows = readFileSync(files.points, 'utf8').trim().split('\n').slice(1).map((line) => line.split(','));
    const points = join(files.folder, 'lonlat.csv');
    writeFileSync(points, `id,lon,lat\n${rows.map(([id, x, y]) => `${id},${toLonLat(Number(x), Number(y)).map((v) => v.toFixed(8)).join(',')}`).join('\n')}\n`);
    const corners: [number, number][] = [[X0, Y0], [X0 + 2000, Y0], [X0 + 2000, Y0 + 2000], [X0, Y0 + 2000], [X0, Y0]];
    const area = join(files.folder, 'lonlat-area.geojson');
    writeFileSync(area, JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [corners.map(([x, y]) => toLonLat(x, y))] } }] }));
    const out = join(files.folder, 'out-lonlat');
    const result = await sweep(['--points', points, '--area', area, '--cells', '250', '--placements', '16', '--sims', '39', '--out', out]);
    expect(result.code, result.stderr).toBe(0);
    const geojson = JSON.parse(readFileSync(join(out, 'excess-areas-250m.geojson'), 'utf8')) as {
      gridshake: { coordinates: string };
      features: { properties: { kind: string; areaKm2: number }; geometry: { coordinates: number[][][] } }[];
    };
    expect(geojson.gridshake.coordinates).toMatch(/^longitude\/latitude/);
    const excessAreas = geojson.features.filter((f) => f.properties.kind === 'excess');
    expect(excessAreas).toHaveLength(1);
    expect(booleanPointInPolygon(point(toLonLat(CENTRE[0]!, CENTRE[1]!)), polygon(excessAreas[0]!.geometry.coordinates))).toBe(true);
    const bytes = readFileSync(join(out, 'stability-250m.tif'));
    const image = await (await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer)).getImage();
    const keys = image.getGeoKeys() as Record<string, unknown>;
    expect(keys.ProjCoordTransGeoKey).toBe(10); // Lambert azimuthal equal area (OGC 19-008r4)
    expect(String(keys.PCSCitationGeoKey)).toMatch(/^\+proj=laea /);
  }, 120_000);

  it('sims = 0: the share surface is written, no area, and the output says why', async () => {
    const files = scenario();
    const out = join(files.folder, 'out');
    const result = await sweep(['--points', files.points, '--area', files.area, '--crs', 'planar', '--cells', '500', '--placements', '8', '--sims', '0', '--out', out]);
    expect(result.code, result.stderr).toBe(0);
    expect(existsSync(join(out, 'stability-500m.tif'))).toBe(true);
    const geojson = JSON.parse(readFileSync(join(out, 'excess-areas-500m.geojson'), 'utf8')) as { features: unknown[]; gridshake: { note: string; coordinates: string } };
    expect(geojson.features).toEqual([]);
    expect(geojson.gridshake.note).toMatch(/sims = 0/);
    expect(geojson.gridshake.coordinates).toMatch(/not longitude\/latitude/);
    expect(result.stdout).toMatch(/Stable areas, cells of 500 m: No simulations/);
  }, 120_000);
});
