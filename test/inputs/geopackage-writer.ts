/**
 * A minimal GeoPackage writer for tests, written from the standard (OGC 12-128r18, GeoPackage Encoding Standard):
 * the required tables gpkg_spatial_ref_sys, gpkg_contents and gpkg_geometry_columns (clauses 1.1.2, 1.1.3, 2.1.5),
 * one feature table, and geometries as GeoPackageBinary (clause 2.1.3: "GP", version 0, flags, srs_id, envelope)
 * around WKB. Point WKB is written by hand (OGC 06-103r4: byte order, uint32 type 1, x, y); other geometries with
 * the wkx library's WKB writer.
 */
import Database from 'better-sqlite3';
import wkx from 'wkx';

export interface GeoPackageLayer {
  table: string;
  geometryType: string;
  /** EPSG code of the layer, or undefined for the standard's "undefined Cartesian" system (srs_id -1) */
  epsg?: number;
  geometries: ({ type: string; coordinates: unknown } | null)[];
  /** extra attribute columns: one record per geometry (column names from the first record) */
  properties?: Record<string, number | string | null>[];
}

function pointWkb(x: number, y: number): Buffer {
  const wkb = Buffer.alloc(21);
  wkb.writeUInt8(1, 0);
  wkb.writeUInt32LE(1, 1);
  wkb.writeDoubleLE(x, 5);
  wkb.writeDoubleLE(y, 13);
  return wkb;
}

/** GeoPackageBinary: little-endian header, envelope type 1 ([minx, maxx, miny, maxy]) when the bbox is given. */
export function geoPackageBlob(geometry: { type: string; coordinates: unknown }, srsId: number): Buffer {
  const wkb =
    geometry.type === 'Point'
      ? pointWkb(...(geometry.coordinates as [number, number]))
      : (wkx.Geometry.parseGeoJSON(geometry).toWkb() as Buffer);
  const flat = JSON.stringify(geometry.coordinates).match(/-?[\d.e+-]+/g)!.map(Number);
  const xs = flat.filter((_, k) => k % 2 === 0);
  const ys = flat.filter((_, k) => k % 2 === 1);
  const header = Buffer.alloc(8 + 32);
  header.write('GP', 0, 'latin1');
  header.writeUInt8(0, 2);
  header.writeUInt8(0b0000_0011, 3);
  header.writeInt32LE(srsId, 4);
  [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)].forEach((v, k) => header.writeDoubleLE(v, 8 + 8 * k));
  return Buffer.concat([header, wkb]);
}

export function writeGeoPackage(layers: GeoPackageLayer[]): Buffer {
  const db = new Database(':memory:');
  db.exec(`
    CREATE TABLE gpkg_spatial_ref_sys (srs_name TEXT NOT NULL, srs_id INTEGER PRIMARY KEY, organization TEXT NOT NULL,
      organization_coordsys_id INTEGER NOT NULL, definition TEXT NOT NULL, description TEXT);
    CREATE TABLE gpkg_contents (table_name TEXT PRIMARY KEY, data_type TEXT NOT NULL, identifier TEXT UNIQUE,
      description TEXT DEFAULT '', last_change DATETIME, min_x DOUBLE, min_y DOUBLE, max_x DOUBLE, max_y DOUBLE, srs_id INTEGER);
    CREATE TABLE gpkg_geometry_columns (table_name TEXT NOT NULL, column_name TEXT NOT NULL, geometry_type_name TEXT NOT NULL,
      srs_id INTEGER NOT NULL, z TINYINT NOT NULL, m TINYINT NOT NULL, PRIMARY KEY (table_name, column_name));
    INSERT INTO gpkg_spatial_ref_sys VALUES ('Undefined cartesian SRS', -1, 'NONE', -1, 'undefined', NULL);
    INSERT INTO gpkg_spatial_ref_sys VALUES ('Undefined geographic SRS', 0, 'NONE', 0, 'undefined', NULL);
  `);
  for (const layer of layers) {
    const srsId = layer.epsg ?? -1;
    if (layer.epsg !== undefined) {
      db.prepare('INSERT OR IGNORE INTO gpkg_spatial_ref_sys VALUES (?, ?, ?, ?, ?, NULL)').run(`EPSG ${srsId}`, srsId, 'EPSG', srsId, 'see EPSG');
    }
    db.prepare("INSERT INTO gpkg_contents (table_name, data_type, identifier, srs_id) VALUES (?, 'features', ?, ?)").run(layer.table, layer.table, srsId);
    db.prepare('INSERT INTO gpkg_geometry_columns VALUES (?, ?, ?, ?, 0, 0)').run(layer.table, 'geom', layer.geometryType, srsId);
    const columns = Object.keys(layer.properties?.[0] ?? {});
    const extra = columns.map((name) => `, "${name}"`).join('');
    db.exec(`CREATE TABLE "${layer.table}" (fid INTEGER PRIMARY KEY AUTOINCREMENT, geom BLOB, name TEXT${extra})`);
    const insert = db.prepare(`INSERT INTO "${layer.table}" (geom, name${extra}) VALUES (?, ?${columns.map(() => ', ?').join('')})`);
    layer.geometries.forEach((geometry, k) =>
      insert.run(geometry === null ? null : geoPackageBlob(geometry, srsId), `record ${k + 1}`, ...columns.map((name) => layer.properties?.[k]?.[name] ?? null)),
    );
  }
  const bytes = db.serialize();
  db.close();
  return bytes;
}
