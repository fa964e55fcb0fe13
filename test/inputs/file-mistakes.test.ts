import { describe, expect, it, afterAll, beforeAll } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { loadDataset } from '../../server/inputs/index.js';
import { file, thrown } from './input-helpers.js';
import { run } from '../cli/run-cli.js';
import { multipartBody, testApp } from '../server/server-helpers.js';

// The files people actually have (issue 12): spreadsheets with decimal commas, workbooks and archives renamed,
// shapefiles renamed, legacy GeoJSON crs members, rows with blank or n/a coordinates. Each mistake has its message.

/** A ZIP local file header (PKWARE APPNOTE.TXT 4.3.7: signature 50 4B 03 04, 26 bytes of fields, then the name). */
function zipWith(names: string[]): Uint8Array {
  const parts: Buffer[] = [];
  for (const name of names) {
    const header = Buffer.alloc(30);
    header.writeUInt32LE(0x04034b50, 0);
    header.writeUInt16LE(20, 4);
    header.writeUInt16LE(name.length, 26);
    parts.push(header, Buffer.from(name, 'ascii'));
  }
  return new Uint8Array(Buffer.concat(parts));
}

/** A shapefile main-file header (ESRI Shapefile Technical Description, 1998, table 1): file code 9994 big-endian, 100 bytes. */
function shapefileHeader(): Uint8Array {
  const header = Buffer.alloc(100);
  header.writeInt32BE(9994, 0);
  header.writeInt32BE(50, 24);
  header.writeInt32LE(1000, 28);
  header.writeInt32LE(1, 32);
  return new Uint8Array(header);
}

describe('decimal commas', () => {
  it('reads a semicolon-separated file with decimal commas (as spreadsheets in many locales save it)', () => {
    const dataset = loadDataset({ points: file('pts.csv', 'id;x;y\na;12,5;3,25\nb;40;7,75\nc;-1,5;9\n') }, { crs: 'planar' });
    expect(Array.from(dataset.xy)).toEqual([12.5, 3.25, 40, 7.75, -1.5, 9]);
  });

  it('refuses a decimal comma in a comma-separated file with the exact fix', () => {
    const error = thrown(() => loadDataset({ points: file('pts.csv', 'x,y\n"1,5",2\n') }, { crs: 'planar' }));
    expect(error.message).toBe("pts.csv: line 2: the 'x' value '1,5' is not a number (a decimal comma in a comma-separated file: save it with ; as the delimiter, or with points as decimal separators)");
  });
});

describe('files that are not what their name says', () => {
  it.each([
    ['an xlsx workbook renamed .csv', 'points.csv', zipWith(['[Content_Types].xml', 'xl/workbook.xml', 'xl/worksheets/sheet1.xml']), /^points\.csv: this is an Excel workbook \(\.xlsx\), not CSV or GeoJSON; in the spreadsheet, save the sheet as CSV \(UTF-8\); or .*GeoPackage \(also accepted\)$/],
    ['a zip archive renamed .csv', 'points.csv', zipWith(['export/points.csv']), /^points\.csv: this is a ZIP archive, not CSV or GeoJSON; unzip it and give the CSV, GeoJSON or GeoPackage inside/],
    ['a zipped shapefile renamed .geojson', 'area.geojson', zipWith(['area.shp', 'area.shx', 'area.dbf']), /^area\.geojson: this is a ZIP archive holding a shapefile, .*as a GeoPackage \(also accepted\)$/],
    ['a shapefile renamed .geojson', 'points.geojson', shapefileHeader(), /^points\.geojson: this is a shapefile \(\.shp\), not CSV or GeoJSON; open it in a GIS and export .*GeoJSON, or the layer as a GeoPackage \(also accepted\)$/],
    ['a legacy xls workbook renamed .csv', 'points.csv', new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0, 0]), /^points\.csv: this is a legacy Excel workbook \(\.xls\)/],
  ])('%s', (_, name, bytes, expected) => {
    const error = thrown(() => loadDataset({ points: { name, content: bytes } }, { crs: 'planar' }));
    expect(error.code).toBe('GS_ERR_INPUT');
    expect(error.message).toMatch(expected);
  });

  it('says the same for a study area file', () => {
    const points = file('pts.csv', 'x,y\n1,1\n5,5\n');
    const error = thrown(() => loadDataset({ points, area: { name: 'area.geojson', content: shapefileHeader() } }, { crs: 'planar' }));
    expect(error.message).toMatch(/^area\.geojson: this is a shapefile \(\.shp\)/);
  });
});

describe('a legacy GeoJSON crs member (GeoJSON 2008 specification, section 3)', () => {
  const collection = (crs: unknown, coordinates: number[][]) =>
    JSON.stringify({
      type: 'FeatureCollection',
      crs,
      features: coordinates.map((position, k) => ({ type: 'Feature', id: k + 1, properties: {}, geometry: { type: 'Point', coordinates: position } })),
    });
  const utm = [[500000, 4649776], [501000, 4650776], [500500, 4651000]];

  it('honours a named EPSG code (urn:ogc:def:crs:EPSG::32633) instead of reading metres as degrees', () => {
    const dataset = loadDataset({ points: file('pts.geojson', collection({ type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::32633' } }, utm)) });
    expect(dataset.crs).toBe('EPSG:32633');
    // UTM is conformal, not equal-area: planar x differences stay metres up to the scale factor (0.9996 on the central meridian)
    expect(dataset.xy[2] - dataset.xy[0]).toBeCloseTo(1000, -1);
  });

  it('reads OGC CRS84 as longitude/latitude', () => {
    const dataset = loadDataset({ points: file('pts.geojson', collection({ type: 'name', properties: { name: 'urn:ogc:def:crs:OGC:1.3:CRS84' } }, [[10, 45], [10.01, 45.01], [10.02, 45]])) });
    expect(dataset.crs).toBe('EPSG:4326');
  });

  it('refuses a crs member that names no code, saying how to declare the system', () => {
    const points = file('pts.geojson', collection({ type: 'link', properties: { href: 'http://example.org/crs', type: 'proj4' } }, utm));
    const error = thrown(() => loadDataset({ points }));
    expect(error.message).toMatch(/^pts\.geojson: the GeoJSON "crs" member .* names no EPSG code, so the coordinate system is unknown; remove the member and choose the system in the "Coordinate system" field/);
    expect(error.cliMessage).toMatch(/remove the member and give --crs EPSG:n \(or --crs planar\)/);
  });

  it('refuses a study area whose crs member disagrees with the points', () => {
    const points = file('pts.geojson', collection({ type: 'name', properties: { name: 'EPSG:32633' } }, utm));
    const area = file('area.geojson', JSON.stringify({ type: 'Feature', crs: { type: 'name', properties: { name: 'EPSG:32632' } }, properties: {}, geometry: { type: 'Polygon', coordinates: [[[499000, 4649000], [502000, 4649000], [502000, 4652000], [499000, 4652000], [499000, 4649000]]] } }));
    expect(thrown(() => loadDataset({ points, area })).message).toBe('area.geojson: the GeoJSON "crs" member says EPSG:32632 but the points are in EPSG:32633; give every file in one coordinate system');
  });
});

describe('rows with blank or n/a coordinates', () => {
  const text = 'id,x,y\n1,1,1\n2,,3\n3,n/a,4\n4,5,NA\n5,2,2\n6,3,7\n';

  it('are all reported, with their lines and a count, under GS_ERR_BAD_ROWS', () => {
    const error = thrown(() => loadDataset({ points: file('pts.csv', text) }, { crs: 'planar' }));
    expect(error.code).toBe('GS_ERR_BAD_ROWS');
    expect(error.statusCode).toBe(400);
    expect(error.message).toBe(
      "pts.csv: 3 rows have no coordinates (blank or n/a): line 3 ('x' blank), line 4 ('x' 'n/a'), line 5 ('y' 'NA'); " +
        'fill them in, or tick "Skip rows without coordinates" to leave them out (they are then listed in a warning)',
    );
    expect(error.cliMessage).toContain('or add --skip-bad-rows to leave them out');
  });

  it('are left out on request, listed in a warning, and the other records keep their ids', () => {
    const dataset = loadDataset({ points: file('pts.csv', text) }, { crs: 'planar', skipBadRows: true });
    expect(dataset.ids).toEqual(['1', '5', '6']);
    expect(Array.from(dataset.xy)).toEqual([1, 1, 2, 2, 3, 7]);
    const warning = dataset.warnings.find((candidate) => candidate.code === 'skipped-rows');
    expect(warning?.ids).toEqual(['line 3', 'line 4', 'line 5']);
    expect(warning?.message).toMatch(/^pts\.csv: 3 row\(s\) without coordinates \(blank or n\/a\) were left out/);
  });

  describe('through the command line and the HTTP API', () => {
    let folder = '';
    let app: FastifyInstance;
    let close: () => Promise<void>;
    beforeAll(async () => {
      folder = mkdtempSync(join(tmpdir(), 'gridshake-bad-rows-'));
      writeFileSync(join(folder, 'pts.csv'), 'id,x,y\n1,100,100\n2,,300\n3,900,900\n4,500,n/a\n5,300,700\n6,700,300\n');
      ({ app, close } = await testApp());
    });
    afterAll(async () => close?.());

    it('count refuses them naming --skip-bad-rows, and counts without them given the flag', async () => {
      const args = ['count', '--points', join(folder, 'pts.csv'), '--crs', 'planar', '--cell', '400', '--json'];
      const refused = await run(args);
      expect(refused.code).toBe(1);
      expect(refused.stderr).toBe(`gridshake: ${join(folder, 'pts.csv')}: 2 rows have no coordinates (blank or n/a): line 3 ('x' blank), line 5 ('y' 'n/a'); fill them in, or add --skip-bad-rows to leave them out (they are then listed in a warning)\n`);
      const counted = await run([...args, '--skip-bad-rows']);
      expect(counted.code).toBe(0);
      const result = JSON.parse(counted.stdout);
      // 4 records left: 3 in the 4 kept cells, 1 in a cell left out at the bounding box edge
      expect(result.points + result.pointsInLeftOutCells + result.pointsOutside).toBe(4);
    });

    it('POST /api/datasets answers GS_ERR_BAD_ROWS in the page words, and skipBadRows=true loads the rest', async () => {
      const csv = 'id,x,y\n1,100,100\n2,,300\n3,900,900\n4,500,n/a\n5,300,700\n';
      const parts = [{ field: 'points', value: csv, filename: 'pts.csv' }, { field: 'crs', value: 'planar' }];
      const refused = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody(parts)) });
      expect(refused.statusCode).toBe(400);
      expect(refused.json().code).toBe('GS_ERR_BAD_ROWS');
      expect(refused.json().message).toContain('tick "Skip rows without coordinates"');
      expect(refused.json().message).not.toMatch(/--/);
      const loaded = await app.inject({ method: 'POST', url: '/api/datasets', ...(await multipartBody([...parts, { field: 'skipBadRows', value: 'true' }])) });
      expect(loaded.statusCode).toBe(201);
      expect(loaded.json().n).toBe(3);
      expect(loaded.json().warnings.map((warning: { code: string }) => warning.code)).toContain('skipped-rows');
    });
  });
});
