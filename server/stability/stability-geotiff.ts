/**
 * `stability-<side>m.tif`: the stability surface of one cell size as a GeoTIFF (OGC GeoTIFF 1.1 / GeoTIFF 1.0 keys),
 * written by tiff-encoder.ts (the registry library geotiff reads it back in the tests): float32, two bands
 * interleaved per pixel (band 1 excess share, band 2 deficit share), NaN outside the valid region (and where no
 * placement keeps the pixel), GDAL_NODATA "nan".
 *
 * Georeferencing in the working coordinates: ModelTiepoint (raster corner (0, 0) = the upper-left corner) and
 * ModelPixelScale, pixels as areas (GTRasterTypeGeoKey = 1). The coordinate system:
 * - an EPSG code: ProjectedCSTypeGeoKey = the code (coordinates in the system's own unit, e.g. US feet);
 * - longitude/latitude input (worked in the local Lambert azimuthal equal-area projection): a user-defined projected
 *   system with the projection's keys (ProjCoordTransGeoKey = 10, CT_LambertAzimEqualArea; centre longitude/latitude;
 *   WGS 84 datum; metres), and its proj4 definition in PCSCitationGeoKey;
 * - `crs planar`: a user-defined projected system in metres, the citation saying the system is unknown.
 */
import type { ProjectionInfo } from '../../shared/contracts.js';
import { workingSystem } from '../grid-export/working-system.js';
import type { StabilitySurface } from './stability-accumulator.js';
import { encodeFloat32Tiff, TIFF_ASCII, TIFF_DOUBLE, TIFF_SHORT, type TiffField } from './tiff-encoder.js';

/** GeoTIFF 1.0 codes (OGC 19-008r4, tables of the GeoKeys). */
const MODEL_TYPE_PROJECTED = 1;
const RASTER_PIXEL_IS_AREA = 1;
const USER_DEFINED = 32767;
const LINEAR_METRE = 9001;
const CT_LAMBERT_AZIMUTHAL_EQUAL_AREA = 10;
const GCS_WGS_84 = 4326;

/** GeoKey ids (OGC 19-008r4, section 7.1, GeoKey index). */
const KEY_IDS: Readonly<Record<string, number>> = {
  GTModelTypeGeoKey: 1024,
  GTRasterTypeGeoKey: 1025,
  GTCitationGeoKey: 1026,
  GeographicTypeGeoKey: 2048,
  ProjectedCSTypeGeoKey: 3072,
  PCSCitationGeoKey: 3073,
  ProjectionGeoKey: 3074,
  ProjCoordTransGeoKey: 3075,
  ProjLinearUnitsGeoKey: 3076,
  ProjFalseEastingGeoKey: 3082,
  ProjFalseNorthingGeoKey: 3083,
  ProjCenterLongGeoKey: 3088,
  ProjCenterLatGeoKey: 3089,
};
/** GeoTIFF tags (OGC 19-008r4, section 7.1) and GDAL's no-data tag (42113, GDAL's TIFF documentation, from memory). */
const MODEL_PIXEL_SCALE = 33550;
const MODEL_TIEPOINT = 33922;
const GEO_KEY_DIRECTORY = 34735;
const GEO_DOUBLE_PARAMS = 34736;
const GEO_ASCII_PARAMS = 34737;
const GDAL_NODATA = 42113;

/** A GeoKey's value: a SHORT (number), a DOUBLE ([number]) or an ASCII text (string). */
type GeoKeyValue = number | [number] | string;

function coordinateKeys(projection: ProjectionInfo): Record<string, GeoKeyValue> {
  const base = { GTModelTypeGeoKey: MODEL_TYPE_PROJECTED, GTRasterTypeGeoKey: RASTER_PIXEL_IS_AREA };
  if (projection.kind === 'epsg') {
    return { ...base, ProjectedCSTypeGeoKey: projection.code, GTCitationGeoKey: `EPSG:${projection.code} (gridshake stability surface)` };
  }
  if (projection.kind === 'laea') {
    return {
      ...base,
      GTCitationGeoKey: 'gridshake local equal-area projection (Lambert azimuthal equal area on WGS 84)',
      GeographicTypeGeoKey: GCS_WGS_84,
      ProjectedCSTypeGeoKey: USER_DEFINED,
      PCSCitationGeoKey: projection.proj4,
      ProjectionGeoKey: USER_DEFINED,
      ProjCoordTransGeoKey: CT_LAMBERT_AZIMUTHAL_EQUAL_AREA,
      ProjLinearUnitsGeoKey: LINEAR_METRE,
      ProjFalseEastingGeoKey: [0],
      ProjFalseNorthingGeoKey: [0],
      ProjCenterLongGeoKey: [projection.lon0],
      ProjCenterLatGeoKey: [projection.lat0],
    };
  }
  return {
    ...base,
    GTCitationGeoKey: 'gridshake planar coordinates in metres; coordinate system unknown (input given as crs planar)',
    ProjectedCSTypeGeoKey: USER_DEFINED,
    ProjLinearUnitsGeoKey: LINEAR_METRE,
  };
}

/**
 * The GeoKeyDirectoryTag (header 1, 1, 0, N, then id, location, count, value per key in increasing id),
 * GeoDoubleParamsTag and GeoAsciiParamsTag (texts ended by '|'), as OGC 19-008r4 section 7.1 lays them out.
 */
function geoKeyTags(keys: Record<string, GeoKeyValue>): { GeoKeyDirectory: number[]; GeoDoubleParams?: number[]; GeoAsciiParams?: string } {
  const entries = Object.entries(keys).sort(([a], [b]) => KEY_IDS[a]! - KEY_IDS[b]!);
  const directory = [1, 1, 0, entries.length];
  const doubles: number[] = [];
  let ascii = '';
  for (const [name, value] of entries) {
    const id = KEY_IDS[name]!;
    if (typeof value === 'number') directory.push(id, 0, 1, value);
    else if (typeof value === 'string') {
      const text = `${value.replace(/\|/g, '/')}|`;
      directory.push(id, GEO_ASCII_PARAMS, text.length, ascii.length);
      ascii += text;
    } else {
      directory.push(id, GEO_DOUBLE_PARAMS, 1, doubles.length);
      doubles.push(value[0]);
    }
  }
  return { GeoKeyDirectory: directory, ...(doubles.length > 0 ? { GeoDoubleParams: doubles } : {}), ...(ascii !== '' ? { GeoAsciiParams: ascii } : {}) };
}

/** The GeoTIFF bytes of a stability surface. Cost O(pixels). */
export function stabilityGeoTiff(surface: StabilitySurface, projection: ProjectionInfo): Uint8Array {
  const { raster } = surface;
  const pixels = raster.width * raster.height;
  const values = new Float32Array(2 * pixels);
  for (let p = 0; p < pixels; p++) {
    values[2 * p] = surface.excessShare[p]!;
    values[2 * p + 1] = surface.deficitShare[p]!;
  }
  const system = workingSystem(projection);
  const [cornerX, cornerY] = system.toStored(raster.x0, raster.y0);
  const [unitX] = system.toStored(raster.x0 + raster.side, raster.y0);
  const scale = unitX - cornerX;
  const geoKeys = geoKeyTags(coordinateKeys(projection));
  const fields: TiffField[] = [
    { tag: MODEL_PIXEL_SCALE, type: TIFF_DOUBLE, values: [scale, scale, 0] },
    { tag: MODEL_TIEPOINT, type: TIFF_DOUBLE, values: [0, 0, 0, cornerX, cornerY, 0] },
    { tag: GEO_KEY_DIRECTORY, type: TIFF_SHORT, values: geoKeys.GeoKeyDirectory },
    ...(geoKeys.GeoDoubleParams === undefined ? [] : [{ tag: GEO_DOUBLE_PARAMS, type: TIFF_DOUBLE, values: geoKeys.GeoDoubleParams } as TiffField]),
    ...(geoKeys.GeoAsciiParams === undefined ? [] : [{ tag: GEO_ASCII_PARAMS, type: TIFF_ASCII, values: geoKeys.GeoAsciiParams } as TiffField]),
    { tag: GDAL_NODATA, type: TIFF_ASCII, values: 'nan' },
  ];
  return encodeFloat32Tiff(raster.width, raster.height, 2, values, fields);
}
