/**
 * `stability-<side>m.tif`: the stability surface of one cell size as a GeoTIFF (OGC GeoTIFF 1.1 / GeoTIFF 1.0 keys),
 * written with the registry library geotiff: float32, two bands interleaved per pixel (band 1 excess share, band 2
 * deficit share), NaN outside the valid region (and where no placement keeps the pixel), GDAL_NODATA "nan".
 *
 * Georeferencing in the working coordinates: ModelTiepoint (raster corner (0, 0) = the upper-left corner) and
 * ModelPixelScale, pixels as areas (GTRasterTypeGeoKey = 1). The coordinate system:
 * - an EPSG code: ProjectedCSTypeGeoKey = the code (coordinates in the system's own unit, e.g. US feet);
 * - longitude/latitude input (worked in the local Lambert azimuthal equal-area projection): a user-defined projected
 *   system with the projection's keys (ProjCoordTransGeoKey = 10, CT_LambertAzimEqualArea; centre longitude/latitude;
 *   WGS 84 datum; metres), and its proj4 definition in PCSCitationGeoKey;
 * - `crs planar`: a user-defined projected system in metres, the citation saying the system is unknown.
 */
import { writeArrayBuffer, type GeotiffWriterMetadata } from 'geotiff';
import type { ProjectionInfo } from '../../shared/contracts.js';
import { workingSystem } from '../grid-export/working-system.js';
import type { StabilitySurface } from './stability-accumulator.js';

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
const GEO_DOUBLE_PARAMS = 34736;
const GEO_ASCII_PARAMS = 34737;

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
  const keys = coordinateKeys(projection);
  const system = workingSystem(projection);
  const [cornerX, cornerY] = system.toStored(raster.x0, raster.y0);
  const [unitX] = system.toStored(raster.x0 + raster.side, raster.y0);
  const scale = unitX - cornerX;
  const metadata = {
    width: raster.width,
    height: raster.height,
    BitsPerSample: [32, 32],
    SampleFormat: [3, 3],
    SamplesPerPixel: 2,
    PlanarConfiguration: 1,
    PhotometricInterpretation: 1,
    ExtraSamples: [0],
    ModelPixelScale: [scale, scale, 0],
    ModelTiepoint: [0, 0, 0, cornerX, cornerY, 0],
    GDAL_NODATA: 'nan',
    ...geoKeyTags(keys),
    // the library fills in a whole-globe WGS 84 georeferencing unless one of these keys is named; the directory
    // above already holds it
    ProjectedCSTypeGeoKey: keys.ProjectedCSTypeGeoKey as number,
  } as GeotiffWriterMetadata;
  return new Uint8Array(writeArrayBuffer(values, metadata));
}
