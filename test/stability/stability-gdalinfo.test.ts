/**
 * The stability GeoTIFF read by GDAL, the reference reader of GIS software: `gdalinfo -json -stats` (Debian gdal-bin,
 * GDAL 3.6; installed by .ci/run, a missing gdalinfo fails this test) on a `stability-<side>m.tif` written by the
 * writer of `sweep --out` (server/stability/stability-files.ts). Checked: size, two Float32 bands with nodata NaN
 * and their statistics over the valid pixels, the geotransform (upper-left corner, pixel side, north up; GDAL data
 * model), and the coordinate system: the EPSG code for EPSG input, and for longitude/latitude input the local
 * Lambert azimuthal equal-area projection (EPSG method 9820) with its centre, on WGS 84.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { ProjectionInfo } from '../../shared/contracts.js';
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import { stabilityFiles } from '../../server/stability/stability-files.js';
import { stabilitySummary } from '../../server/stability/stability-summary.js';

const raster = { x0: 1000, y0: 5000, side: 12.5, width: 3, height: 2 };
const excess = new Float32Array([0, 0.5, Number.NaN, 1, 0.25, 0.125]);
const deficit = new Float32Array([0.1, 0, Number.NaN, 0, 0.75, 0]);
const assessed = Uint8Array.from(excess, (value) => (Number.isNaN(value) ? 0 : 1));
const surface: StabilitySurface = {
  shape: 'square',
  cellSize: 100,
  placements: 16,
  raster,
  excessShare: excess,
  deficitShare: deficit,
  assessed,
  calibration: null,
  stableExcess: new Uint8Array(6),
  stableDeficit: new Uint8Array(6),
} as unknown as StabilitySurface;

const folder = mkdtempSync(join(tmpdir(), 'gridshake-gdalinfo-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

interface GdalBand {
  type: string;
  noDataValue: unknown;
  minimum: number;
  maximum: number;
  mean: number;
  metadata: Record<string, Record<string, string>>;
}
interface GdalInfo {
  size: number[];
  geoTransform: number[];
  coordinateSystem: { wkt: string };
  bands: GdalBand[];
  stac?: Record<string, unknown>;
}

/** Writes the surface's GeoTIFF under the name `sweep --out` gives it (prefixed by the case) and reads it with gdalinfo. */
function gdalinfo(projection: ProjectionInfo, tag: string): { name: string; info: GdalInfo } {
  const summary = stabilitySummary(surface, 0, false);
  const [tif] = stabilityFiles([surface], [summary], projection, 'invented');
  const [name, bytes] = tif as [string, Uint8Array];
  const path = join(folder, `${tag}-${name}`);
  writeFileSync(path, bytes);
  const run = spawnSync('gdalinfo', ['-json', '-stats', path], { encoding: 'utf8' });
  expect(run.error, 'gdalinfo (Debian gdal-bin) must be installed: .ci/run installs it').toBeUndefined();
  expect(run.status, run.stderr).toBe(0);
  return { name, info: JSON.parse(run.stdout) as GdalInfo };
}

function expectRaster(info: GdalInfo): void {
  expect(info.size).toEqual([3, 2]);
  // GDAL geotransform: x0, pixel width, row rotation, y0, column rotation, pixel height (negative: north up)
  expect(info.geoTransform).toEqual([1000, 12.5, 0, 5000, 0, -12.5]);
  expect(info.bands.map((band) => band.type)).toEqual(['Float32', 'Float32']);
  expect(info.bands.map((band) => band.noDataValue)).toEqual(['NaN', 'NaN']);
  // band 1 excess share, band 2 deficit share; statistics over the 5 valid pixels (the NaN one is nodata)
  const [first, second] = info.bands as [GdalBand, GdalBand];
  expect([first.minimum, first.maximum, first.mean]).toEqual([0, 1, 0.375]);
  expect([second.minimum, second.maximum]).toEqual([0, 0.75]);
  expect(Number(second.metadata['']!.STATISTICS_MEAN)).toBeCloseTo(0.17, 6);
  expect(first.metadata['']!.STATISTICS_VALID_PERCENT).toBe('83.33');
}

describe('stability GeoTIFF read by gdalinfo -json', () => {
  it('EPSG input: size, two Float32 bands, geotransform, and the EPSG code as the coordinate system', () => {
    const { name, info } = gdalinfo({ kind: 'epsg', code: 32633, proj4: '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs' }, 'epsg');
    expect(name).toBe('stability-100m.tif');
    expectRaster(info);
    expect(info.coordinateSystem.wkt).toMatch(/^PROJCRS\["WGS 84 \/ UTM zone 33N"/);
    expect(info.coordinateSystem.wkt).toMatch(/ID\["EPSG",32633\]\]$/);
    expect(info.stac?.['proj:epsg']).toBe(32633);
  });

  it('longitude/latitude input: the local Lambert azimuthal equal-area projection with its centre, on WGS 84', () => {
    const proj4 = '+proj=laea +lat_0=50.25 +lon_0=10.5 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs';
    const { info } = gdalinfo({ kind: 'laea', lon0: 10.5, lat0: 50.25, proj4 }, 'laea');
    expectRaster(info);
    const wkt = info.coordinateSystem.wkt;
    expect(wkt).toMatch(/^PROJCRS\[/);
    expect(wkt).toContain('METHOD["Lambert Azimuthal Equal Area",\n            ID["EPSG",9820]]');
    expect(wkt).toMatch(/PARAMETER\["Latitude of natural origin",50\.25,/);
    expect(wkt).toMatch(/PARAMETER\["Longitude of natural origin",10\.5,/);
    expect(wkt).toMatch(/PARAMETER\["False easting",0,/);
    expect(wkt).toContain('DATUM["World Geodetic System 1984"');
    expect(wkt).toMatch(/LENGTHUNIT\["metre",1\]\]\]$/);
    // no EPSG code for the projected system: it is the data's own
    expect(info.stac?.['proj:epsg'] ?? null).toBeNull();
  });
});
