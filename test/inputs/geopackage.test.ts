/**
 * GeoPackage input (OGC 12-128r18): the same points, study area and no-data zone read from GeoPackage files and
 * from GeoJSON/CSV give the same dataset; the layer's EPSG code is taken as the coordinate system; bad files get a
 * message naming the file, the layer and the feature.
 */
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { csvFile, polygonFile, square, thrown } from './input-helpers.js';
import { geoPackageBlob, writeGeoPackage } from './geopackage-writer.js';

// UTM zone 33N (EPSG:32633) eastings/northings in metres: an invented survey plot.
const EAST = 500_000;
const NORTH = 6_100_000;
const points: [number, number][] = Array.from({ length: 40 }, (_, k) => [EAST + 25 * (k % 8) + 7.5, NORTH + 40 * Math.floor(k / 8) + 3.25]);
const areaRing = square(EAST, NORTH, 200);
const zoneRing = square(EAST + 150, NORTH + 150, 50);

const gpkg = (name: string, bytes: Buffer) => ({ name, content: new Uint8Array(bytes) });
const pointLayer = (epsg?: number) =>
  writeGeoPackage([{ table: 'nests', geometryType: 'POINT', epsg, geometries: points.map((p) => ({ type: 'Point', coordinates: p })) }]);
const polygonLayer = (table: string, ring: [number, number][], epsg = 32633) =>
  writeGeoPackage([{ table, geometryType: 'POLYGON', epsg, geometries: [{ type: 'Polygon', coordinates: [ring] }] }]);

describe('GeoPackage input', () => {
  it('reads points, study area and no-data zone exactly as the same data in CSV and GeoJSON', () => {
    const fromGeoPackage = loadDataset({
      points: gpkg('nests.gpkg', pointLayer(32633)),
      area: gpkg('plot.gpkg', polygonLayer('plot', areaRing)),
      noData: [gpkg('pond.gpkg', polygonLayer('pond', zoneRing))],
    });
    const fromText = loadDataset(
      {
        points: csvFile('nests.csv', 'x,y', points),
        area: polygonFile('plot.geojson', [areaRing]),
        noData: [polygonFile('pond.geojson', [zoneRing])],
      },
      { crs: 'EPSG:32633' },
    );
    expect(fromGeoPackage.crs).toBe('EPSG:32633');
    expect(Array.from(fromGeoPackage.xy)).toEqual(Array.from(fromText.xy));
    expect(Array.from(fromGeoPackage.inside)).toEqual(Array.from(fromText.inside));
    // 200 m x 200 m minus a 50 m x 50 m pond: 37 500 m^2 (planar shoelace area)
    expect(fromGeoPackage.region.area).toBeCloseTo(37_500, 6);
    expect(fromGeoPackage.region.area).toBeCloseTo(fromText.region.area, 9);
    expect(fromGeoPackage.ids[0]).toBe('1');
  });

  it('lets --crs override a layer without an EPSG code', () => {
    const dataset = loadDataset({ points: gpkg('nests.gpkg', pointLayer(undefined)) }, { crs: 'planar' });
    expect(dataset.crs).toBe('planar');
    expect(dataset.xy[0]).toBe(points[0][0]);
  });

  it('asks for --crs when the layer declares no coordinate system', () => {
    const error = thrown(() => loadDataset({ points: gpkg('nests.gpkg', pointLayer(undefined)) }));
    expect(error.code).toBe('GS_ERR_INPUT');
    expect(error.cliMessage).toBe('nests.gpkg: the GeoPackage layer declares no EPSG coordinate system; give --crs planar or --crs EPSG:n');
  });

  it('refuses a file with two feature layers, naming them', () => {
    const bytes = writeGeoPackage([
      { table: 'a', geometryType: 'POINT', epsg: 32633, geometries: [{ type: 'Point', coordinates: [1, 2] }] },
      { table: 'b', geometryType: 'POINT', epsg: 32633, geometries: [{ type: 'Point', coordinates: [3, 4] }] },
    ]);
    const error = thrown(() => loadDataset({ points: gpkg('two.gpkg', bytes) }));
    expect(error.message).toBe("two.gpkg: the GeoPackage holds 2 feature layers ('a', 'b'); give a file with one layer");
  });

  it('names the layer and feature of a geometry that is not GeoPackage binary', () => {
    const bytes = pointLayer(32633);
    const db = new Database(bytes);
    db.prepare('UPDATE nests SET geom = ? WHERE fid = 3').run(Buffer.from('not a geometry'));
    const broken = db.serialize();
    db.close();
    const error = thrown(() => loadDataset({ points: gpkg('nests.gpkg', broken) }));
    expect(error.message).toBe("nests.gpkg: layer 'nests', feature 3: the geometry is not a GeoPackage binary geometry (no \"GP\" header)");
  });

  it('names the feature that has no geometry', () => {
    const bytes = writeGeoPackage([{ table: 'nests', geometryType: 'POINT', epsg: 32633, geometries: [{ type: 'Point', coordinates: [1, 2] }, null] }]);
    const error = thrown(() => loadDataset({ points: gpkg('nests.gpkg', bytes) }));
    expect(error.message).toBe("nests.gpkg: layer 'nests', feature 2: the feature has no geometry");
  });

  it('refuses a study area in another coordinate system than the points', () => {
    const error = thrown(() =>
      loadDataset({ points: gpkg('nests.gpkg', pointLayer(32633)), area: gpkg('plot.gpkg', polygonLayer('plot', areaRing, 32632)) }),
    );
    expect(error.message).toBe('plot.gpkg: the layer is in EPSG:32632 but the points are in EPSG:32633; give every file in one coordinate system');
  });

  it('refuses an SQLite file that is not a GeoPackage', () => {
    const db = new Database(':memory:');
    db.exec('CREATE TABLE t (x)');
    const bytes = db.serialize();
    db.close();
    const error = thrown(() => loadDataset({ points: gpkg('plain.sqlite', bytes) }));
    expect(error.message).toBe('plain.sqlite: an SQLite file without the GeoPackage tables gpkg_contents and gpkg_geometry_columns');
  });

  it('writes the header the standard describes (envelope flag, srs id)', () => {
    const blob = geoPackageBlob({ type: 'Point', coordinates: [1, 2] }, 4326);
    expect(blob.toString('latin1', 0, 2)).toBe('GP');
    expect(blob.readInt32LE(4)).toBe(4326);
    expect(blob.length).toBe(8 + 32 + 21);
  });
});
