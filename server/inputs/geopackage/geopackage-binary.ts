/**
 * The geometry BLOB of a GeoPackage feature table: a GeoPackageBinary header followed by ISO WKB.
 *
 * Header (OGC 12-128r18, GeoPackage Encoding Standard, clause 2.1.3): magic "GP" (0x47 0x50), a version byte, a
 * flags byte, the srs_id as int32, then an optional envelope. Flags: bit 0 the byte order of the header's own
 * numbers (1 little-endian), bits 1-3 the envelope (0 none, 1 [minx,maxx,miny,maxy] 32 bytes, 2 and 3 with z or m
 * 48 bytes, 4 with z and m 64 bytes), bit 4 an empty geometry, bit 5 an extended (non-standard) geometry type.
 * The WKB that follows is decoded by the wkx library (OGC 06-103r4 Simple Features well-known binary).
 */
import wkx from 'wkx';
import type { GeoJsonGeometry } from '../geojson-features.js';

const ENVELOPE_BYTES = [0, 32, 48, 48, 64];

/** The geometry as a GeoJSON geometry object, or null for an empty geometry; throws Error with a reason otherwise. */
export function decodeGeoPackageGeometry(blob: Uint8Array): GeoJsonGeometry | null {
  if (blob.length < 8 || blob[0] !== 0x47 || blob[1] !== 0x50) {
    throw new Error('the geometry is not a GeoPackage binary geometry (no "GP" header)');
  }
  const flags = blob[3];
  const envelope = (flags >> 1) & 0b111;
  if (envelope >= ENVELOPE_BYTES.length) throw new Error(`the geometry header names an unknown envelope type ${envelope}`);
  if ((flags >> 5) & 1) throw new Error('the geometry uses an extended (non-standard) GeoPackage geometry type');
  if ((flags >> 4) & 1) return null;
  const wkb = Buffer.from(blob.buffer, blob.byteOffset + 8 + ENVELOPE_BYTES[envelope], blob.length - 8 - ENVELOPE_BYTES[envelope]);
  const geometry = wkx.Geometry.parse(wkb).toGeoJSON() as GeoJsonGeometry;
  return geometry;
}
