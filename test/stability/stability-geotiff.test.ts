/**
 * The stability GeoTIFF read back by the registry library geotiff (its reader, fromArrayBuffer): size, bands,
 * georeferencing (ModelTiepoint / ModelPixelScale as origin and resolution), GeoKeys per the OGC GeoTIFF standard
 * (OGC 19-008r4: GTModelTypeGeoKey 1 = projected, GTRasterTypeGeoKey 1 = pixel is area, ProjectedCSTypeGeoKey,
 * ProjCoordTransGeoKey 10 = Lambert azimuthal equal area), values and NaN outside the valid region.
 */
import { fromArrayBuffer } from 'geotiff';
import { describe, expect, it } from 'vitest';
import type { ProjectionInfo } from '../../shared/contracts.js';
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import { stabilityGeoTiff } from '../../server/stability/stability-geotiff.js';

const raster = { x0: 1000, y0: 5000, side: 12.5, width: 3, height: 2 };
const excess = new Float32Array([0, 0.5, Number.NaN, 1, 0.25, 0.125]);
const deficit = new Float32Array([0.1, 0, Number.NaN, 0, 0.75, 0]);
const surface = { raster, excessShare: excess, deficitShare: deficit } as unknown as StabilitySurface;

async function readBack(projection: ProjectionInfo) {
  const bytes = stabilityGeoTiff(surface, projection);
  const tiff = await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
  const image = await tiff.getImage();
  const bands = (await image.readRasters()) as unknown as Float32Array[];
  return { image, bands };
}

function same(actual: ArrayLike<number>, expected: Float32Array): void {
  expect(actual.length).toBe(expected.length);
  for (let k = 0; k < expected.length; k++) {
    if (Number.isNaN(expected[k])) expect(Number.isNaN(actual[k])).toBe(true);
    else expect(actual[k]).toBe(expected[k]);
  }
}

describe('stability GeoTIFF', () => {
  it('planar: size, two float32 bands, corner and pixel size, NaN outside, nodata nan', async () => {
    const { image, bands } = await readBack({ kind: 'planar' });
    expect([image.getWidth(), image.getHeight(), image.getSamplesPerPixel()]).toEqual([3, 2, 2]);
    expect(image.getBitsPerSample()).toBe(32);
    expect(image.getSampleFormat()).toBe(3); // TIFF 6.0 SampleFormat 3 = IEEE floating point
    expect(image.getOrigin()).toEqual([1000, 5000, 0]);
    expect(image.getResolution()).toEqual([12.5, -12.5, 0]);
    expect(image.getBoundingBox()).toEqual([1000, 5000 - 25, 1000 + 37.5, 5000]);
    expect(image.getGDALNoData()).toBeNaN();
    same(bands[0]!, excess);
    same(bands[1]!, deficit);
    const keys = image.getGeoKeys() as Record<string, unknown>;
    expect(keys.GTModelTypeGeoKey).toBe(1);
    expect(keys.GTRasterTypeGeoKey).toBe(1);
    expect(keys.ProjectedCSTypeGeoKey).toBe(32767);
    expect(String(keys.GTCitationGeoKey)).toMatch(/unknown/);
  });

  it('EPSG: ProjectedCSTypeGeoKey carries the code', async () => {
    const { image, bands } = await readBack({ kind: 'epsg', code: 32633, proj4: '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs' });
    expect((image.getGeoKeys() as Record<string, unknown>).ProjectedCSTypeGeoKey).toBe(32633);
    expect(image.getOrigin()).toEqual([1000, 5000, 0]);
    same(bands[0]!, excess);
  });

  it('EPSG in US survey feet: corner and pixel size in the system unit', async () => {
    // EPSG:2263 (NAD83 / New York Long Island, ftUS); 1 ftUS = 1200/3937 m (NIST Handbook 44, from memory)
    const proj4 = '+proj=lcc +lat_0=40.1666666666667 +lon_0=-74 +lat_1=41.0333333333333 +lat_2=40.6666666666667 +x_0=300000 +y_0=0 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=us-ft +no_defs';
    const { image } = await readBack({ kind: 'epsg', code: 2263, proj4 });
    const foot = 1200 / 3937;
    const [x, y] = image.getOrigin();
    expect(x).toBeCloseTo(1000 / foot, 6);
    expect(y).toBeCloseTo(5000 / foot, 6);
    expect(image.getResolution()[0]).toBeCloseTo(12.5 / foot, 9);
  });

  it('longitude/latitude input: the local equal-area projection as GeoKeys and its proj4 definition', async () => {
    const proj4 = '+proj=laea +lat_0=50.25 +lon_0=10.5 +x_0=0 +y_0=0 +datum=WGS84 +units=m +no_defs';
    const { image } = await readBack({ kind: 'laea', lon0: 10.5, lat0: 50.25, proj4 });
    const keys = image.getGeoKeys() as Record<string, unknown>;
    expect(keys.ProjectedCSTypeGeoKey).toBe(32767);
    expect(keys.ProjCoordTransGeoKey).toBe(10);
    expect(keys.GeographicTypeGeoKey).toBe(4326);
    expect(keys.ProjLinearUnitsGeoKey).toBe(9001);
    expect(keys.ProjCenterLongGeoKey).toBe(10.5);
    expect(keys.ProjCenterLatGeoKey).toBe(50.25);
    expect(String(keys.PCSCitationGeoKey)).toBe(proj4);
  });
});
