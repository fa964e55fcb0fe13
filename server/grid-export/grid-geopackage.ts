/**
 * One placement's grid as an OGC GeoPackage 1.3 file (OGC 12-128r18), written with better-sqlite3: the required
 * tables gpkg_spatial_ref_sys (with the three rows the standard requires, plus the working system's row),
 * gpkg_contents and gpkg_geometry_columns, and one feature table `grid_cells` whose geometry column holds
 * GeoPackageBinary blobs (header "GP", version 0, flags 0x03 = little-endian with a [minx, maxx, miny, maxy]
 * envelope, srs_id) followed by little-endian ISO WKB polygons (OGC 06-103r4).
 * Coordinates are the working coordinates (in the unit of the EPSG system when it is not metres); the spatial
 * reference is the EPSG code, the local equal-area projection (WKT, srs_id 100001) or the undefined Cartesian
 * system (-1) for input given as crs planar. Rows go in in transactions of a few thousand, yielding to the event
 * loop between them, so that the server keeps answering while a large grid is written.
 */
import Database from 'better-sqlite3';
import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { cellAt, type CellGrid } from '../../workers/placement/index.js';
import type { ProjectionInfo } from '../../shared/contracts.js';
import type { GridRequest } from './grid-cells.js';
import { workingSystem } from './working-system.js';

/** 'GPKG' as a 32-bit big-endian integer: the SQLite application_id of a GeoPackage (clause 1.1.1.1.1). */
export const GPKG_APPLICATION_ID = 0x47504b47;
/** 10300 for version 1.3.0 (clause 1.1.1.1.1). */
export const GPKG_USER_VERSION = 10300;
export const GRID_TABLE = 'grid_cells';

/** Rows per transaction: about 20 ms of writing, after which other requests are served. */
const ROWS_PER_TRANSACTION = 2000;

const WGS84_WKT =
  'GEOGCS["WGS 84",DATUM["WGS_1984",SPHEROID["WGS 84",6378137,298.257223563,AUTHORITY["EPSG","7030"]],' +
  'AUTHORITY["EPSG","6326"]],PRIMEM["Greenwich",0,AUTHORITY["EPSG","8901"]],' +
  'UNIT["degree",0.0174532925199433,AUTHORITY["EPSG","9122"]],AUTHORITY["EPSG","4326"]]';

/** Table definitions as given in the standard's annex C (table definition SQL). */
const SCHEMA = `
CREATE TABLE gpkg_spatial_ref_sys (
  srs_name TEXT NOT NULL,
  srs_id INTEGER NOT NULL PRIMARY KEY,
  organization TEXT NOT NULL,
  organization_coordsys_id INTEGER NOT NULL,
  definition TEXT NOT NULL,
  description TEXT
);
CREATE TABLE gpkg_contents (
  table_name TEXT NOT NULL PRIMARY KEY,
  data_type TEXT NOT NULL,
  identifier TEXT UNIQUE,
  description TEXT DEFAULT '',
  last_change DATETIME NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')),
  min_x DOUBLE,
  min_y DOUBLE,
  max_x DOUBLE,
  max_y DOUBLE,
  srs_id INTEGER,
  CONSTRAINT fk_gc_r_srs_id FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys(srs_id)
);
CREATE TABLE gpkg_geometry_columns (
  table_name TEXT NOT NULL,
  column_name TEXT NOT NULL,
  geometry_type_name TEXT NOT NULL,
  srs_id INTEGER NOT NULL,
  z TINYINT NOT NULL,
  m TINYINT NOT NULL,
  CONSTRAINT pk_geom_cols PRIMARY KEY (table_name, column_name),
  CONSTRAINT uk_gc_table_name UNIQUE (table_name),
  CONSTRAINT fk_gc_tn FOREIGN KEY (table_name) REFERENCES gpkg_contents(table_name),
  CONSTRAINT fk_gc_srs FOREIGN KEY (srs_id) REFERENCES gpkg_spatial_ref_sys (srs_id)
);
CREATE TABLE ${GRID_TABLE} (
  fid INTEGER PRIMARY KEY AUTOINCREMENT NOT NULL,
  geom POLYGON,
  i INTEGER NOT NULL,
  j INTEGER NOT NULL,
  count INTEGER NOT NULL,
  coverage REAL NOT NULL,
  expected REAL,
  kept INTEGER NOT NULL
);`;

/** GeoPackageBinary header plus little-endian WKB of a one-ring polygon (closed ring of [x, y]). */
export function polygonBlob(srsId: number, ring: [number, number][]): Buffer {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of ring) {
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  const blob = Buffer.alloc(8 + 32 + 13 + 16 * ring.length);
  blob.write('GP', 0, 'latin1');
  blob.writeUInt8(0, 2); // version 1 of the binary format is written as 0
  blob.writeUInt8(0b0000_0011, 3); // little-endian, envelope [minx, maxx, miny, maxy]
  blob.writeInt32LE(srsId, 4);
  blob.writeDoubleLE(minX, 8);
  blob.writeDoubleLE(maxX, 16);
  blob.writeDoubleLE(minY, 24);
  blob.writeDoubleLE(maxY, 32);
  let at = 40;
  blob.writeUInt8(1, at); // WKB little-endian
  blob.writeUInt32LE(3, at + 1); // Polygon
  blob.writeUInt32LE(1, at + 5); // one ring
  blob.writeUInt32LE(ring.length, at + 9);
  at += 13;
  for (const [x, y] of ring) {
    blob.writeDoubleLE(x, at);
    blob.writeDoubleLE(y, at + 8);
    at += 16;
  }
  return blob;
}

export interface GridGeoPackageInput {
  path: string;
  datasetName: string;
  projection: ProjectionInfo;
  request: GridRequest;
  cells: CellGrid;
}

/** Writes the GeoPackage at `path` (which must not exist yet). */
export async function writeGridGeoPackage(input: GridGeoPackageInput): Promise<void> {
  const system = workingSystem(input.projection);
  const { srs } = system;
  const db = new Database(input.path);
  try {
    db.pragma('journal_mode = OFF');
    db.pragma('synchronous = OFF');
    db.pragma(`application_id = ${GPKG_APPLICATION_ID}`);
    db.pragma(`user_version = ${GPKG_USER_VERSION}`);
    db.exec(SCHEMA);
    const insertSrs = db.prepare(
      'INSERT INTO gpkg_spatial_ref_sys (srs_name, srs_id, organization, organization_coordsys_id, definition, description) VALUES (?, ?, ?, ?, ?, ?)',
    );
    insertSrs.run('WGS 84 geodetic', 4326, 'EPSG', 4326, WGS84_WKT, 'longitude/latitude coordinates in decimal degrees on the WGS 84 spheroid');
    insertSrs.run('Undefined Cartesian SRS', -1, 'NONE', -1, 'undefined', 'undefined Cartesian coordinate reference system');
    insertSrs.run('Undefined geographic SRS', 0, 'NONE', 0, 'undefined', 'undefined geographic coordinate reference system');
    if (![4326, -1, 0].includes(srs.srsId)) {
      insertSrs.run(srs.name, srs.srsId, srs.organization, srs.organizationId, srs.definition, srs.description);
    }
    const { request } = input;
    const identifier = `grid ${input.datasetName} size ${request.sizeIndex} placement ${request.placementIndex}`;
    const description =
      `${request.cellSize} m ${request.shape === 'hex' ? 'hexagonal ' : ''}cells, offset (${request.placement.u}, ${request.placement.v}), angle ${request.placement.angle} deg, ` +
      `minCoverage ${request.minCoverage}; ${system.description}`;
    db.prepare('INSERT INTO gpkg_contents (table_name, data_type, identifier, description, srs_id) VALUES (?, ?, ?, ?, ?)').run(
      GRID_TABLE,
      'features',
      identifier,
      description,
      srs.srsId,
    );
    db.prepare('INSERT INTO gpkg_geometry_columns VALUES (?, ?, ?, ?, 0, 0)').run(GRID_TABLE, 'geom', 'POLYGON', srs.srsId);

    const insert = db.prepare(`INSERT INTO ${GRID_TABLE} (geom, i, j, count, coverage, expected, kept) VALUES (?, ?, ?, ?, ?, ?, ?)`);
    const box = [Infinity, Infinity, -Infinity, -Infinity];
    const total = input.cells.grid.coverage.length;
    let k = 0;
    const batch = db.transaction(() => {
      let rows = 0;
      for (; k < total && rows < ROWS_PER_TRANSACTION; k++) {
        const cell = cellAt(input.cells, k);
        if (cell === null) continue;
        const ring = cell.corners.map(([x, y]) => system.toStored(x, y));
        for (const [x, y] of ring) {
          box[0] = Math.min(box[0]!, x);
          box[1] = Math.min(box[1]!, y);
          box[2] = Math.max(box[2]!, x);
          box[3] = Math.max(box[3]!, y);
        }
        insert.run(polygonBlob(srs.srsId, ring), cell.i, cell.j, cell.count, cell.coverage, cell.expected, cell.kept ? 1 : 0);
        rows++;
      }
    });
    while (k < total) {
      batch();
      await yieldToEventLoop();
    }
    if (Number.isFinite(box[0])) {
      db.prepare('UPDATE gpkg_contents SET min_x = ?, min_y = ?, max_x = ?, max_y = ? WHERE table_name = ?').run(
        box[0],
        box[1],
        box[2],
        box[3],
        GRID_TABLE,
      );
    }
  } finally {
    db.close();
  }
}
