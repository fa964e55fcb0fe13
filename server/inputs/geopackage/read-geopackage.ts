/**
 * Features of a GeoPackage file (OGC 12-128r18): the one feature layer it holds, its geometries as GeoJSON
 * geometry objects, and the coordinate system its gpkg_spatial_ref_sys row declares.
 * The file is opened from its bytes as an in-memory SQLite database (better-sqlite3); nothing is written.
 */
import Database from 'better-sqlite3';
import { inputError } from '../../errors.js';
import type { LabelledFeature } from '../geojson-features.js';
import type { InputFile } from '../input-file.js';
import { decodeGeoPackageGeometry } from './geopackage-binary.js';

export interface GeoPackageFeatures {
  features: LabelledFeature[];
  /** 'EPSG:n' from the layer's spatial reference system, or undefined when the file leaves it undefined */
  crs: string | undefined;
  /**
   * the layer's INTEGER PRIMARY KEY column (the feature id the GeoPackage standard requires of a feature table,
   * OGC 12-128r18 requirement 29), which is in each feature's properties but is never a count; undefined if none
   */
  idColumn?: string;
}

interface LayerRow {
  table_name: string;
  column_name: string;
  srs_id: number;
  organization: string | null;
  organization_coordsys_id: number | null;
}

const SQLITE_MAGIC = 'SQLite format 3\u0000';

/** True when the file's bytes start like an SQLite database (a GeoPackage is one). */
export function isSqliteFile(file: InputFile): boolean {
  const head = typeof file.content === 'string' ? file.content.slice(0, 16) : Buffer.from(file.content.slice(0, 16)).toString('latin1');
  return head === SQLITE_MAGIC;
}

function openDatabase(file: InputFile): Database.Database {
  const bytes = typeof file.content === 'string' ? Buffer.from(file.content, 'latin1') : Buffer.from(file.content);
  try {
    return new Database(bytes);
  } catch (error) {
    throw inputError(`${file.name}: the SQLite file cannot be opened (${(error as Error).message})`);
  }
}

function declaredCrs(layer: LayerRow): string | undefined {
  if (layer.organization !== null && layer.organization.toUpperCase() === 'EPSG' && layer.organization_coordsys_id !== null) {
    return `EPSG:${layer.organization_coordsys_id}`;
  }
  // srs_id 0 and -1 are the standard's "undefined geographic" and "undefined Cartesian" systems
  return undefined;
}

function featureLayer(db: Database.Database, fileName: string): LayerRow {
  let layers: LayerRow[];
  try {
    layers = db
      .prepare(
        `SELECT g.table_name, g.column_name, g.srs_id, s.organization, s.organization_coordsys_id
         FROM gpkg_contents c JOIN gpkg_geometry_columns g ON g.table_name = c.table_name
         LEFT JOIN gpkg_spatial_ref_sys s ON s.srs_id = g.srs_id
         WHERE c.data_type = 'features' ORDER BY g.table_name`,
      )
      .all() as LayerRow[];
  } catch {
    throw inputError(`${fileName}: an SQLite file without the GeoPackage tables gpkg_contents and gpkg_geometry_columns`);
  }
  if (layers.length === 0) throw inputError(`${fileName}: the GeoPackage holds no feature layer`);
  if (layers.length > 1) {
    const names = layers.map((layer) => `'${layer.table_name}'`).join(', ');
    throw inputError(`${fileName}: the GeoPackage holds ${layers.length} feature layers (${names}); give a file with one layer`);
  }
  return layers[0];
}

/** The alias of the row id in the feature query (a name no GeoPackage column is expected to have). */
const FID_COLUMN = '__gridshake_fid__';

const quoteIdentifier = (name: string): string => `"${name.replace(/"/g, '""')}"`;

export function readGeoPackageFeatures(file: InputFile): GeoPackageFeatures {
  const db = openDatabase(file);
  try {
    const layer = featureLayer(db, file.name);
    const statement = db.prepare(
      `SELECT rowid AS ${quoteIdentifier(FID_COLUMN)}, * FROM ${quoteIdentifier(layer.table_name)} ORDER BY rowid`,
    );
    const rows = statement.all() as Record<string, unknown>[];
    const features = rows.map((row): LabelledFeature => {
      const fid = Number(row[FID_COLUMN]);
      const blob = row[layer.column_name] as Uint8Array | null;
      const properties: Record<string, unknown> = {};
      for (const [name, value] of Object.entries(row)) {
        if (name !== FID_COLUMN && name !== layer.column_name) properties[name] = value;
      }
      const label = `${file.name}: layer '${layer.table_name}', feature ${fid}`;
      if (blob === null || blob === undefined) return { label, id: String(fid), geometry: null, properties };
      if (!(blob instanceof Uint8Array)) throw inputError(`${label}: the geometry column does not hold a BLOB`);
      try {
        return { label, id: String(fid), geometry: decodeGeoPackageGeometry(blob), properties };
      } catch (error) {
        throw inputError(`${label}: ${(error as Error).message}`);
      }
    });
    const keys = (db.prepare(`PRAGMA table_info(${quoteIdentifier(layer.table_name)})`).all() as { name: string; type: string; pk: number }[])
      .filter((column) => column.pk > 0);
    const idColumn = keys.length === 1 && keys[0]!.type.toUpperCase() === 'INTEGER' ? keys[0]!.name : undefined;
    return { features, crs: declaredCrs(layer), ...(idColumn === undefined ? {} : { idColumn }) };
  } finally {
    db.close();
  }
}
