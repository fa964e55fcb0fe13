import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { csvFile, file, polygonFile, square, thrown, type Position } from './input-helpers.js';

// Every bad input gets a coded error whose message names the file and the line (CSV, header = line 1) or the
// feature (GeoJSON, 1-based, with its id) and says what is wrong.
const goodPoints = csvFile('pts.csv', 'id,x,y', [['a', 1, 1], ['b', 2, 3], ['c', 4, 2]]);
const planar = { crs: 'planar' };

function inputMessage(run: () => unknown): string {
  const error = thrown(run);
  expect(error.code).toBe('GS_ERR_INPUT');
  expect(error.statusCode).toBe(400);
  return error.message;
}

describe('loadDataset rejects bad point files', () => {
  it.each([
    ['an empty file', file('pts.csv', ''), /^pts\.csv: the file is empty$/],
    ['a blank file', file('pts.csv', ' \n\r\n'), /^pts\.csv: the file is empty$/],
    ['a header without records', file('pts.csv', 'x,y\n'), /^pts\.csv: no point records after the header \(line 1\)$/],
    ['missing coordinate columns', file('pts.csv', 'id,east_m,north_m\n1,2,3\n'), /^pts\.csv: line 1: no coordinate columns found.*columns seen: id, east_m, north_m/],
    ['a non-numeric x', file('pts.csv', 'x,y\n1,2\nabc,3\n'), /^pts\.csv: line 3: the 'x' value 'abc' is not a number$/],
    ['a decimal comma in a comma-separated file', file('pts.csv', 'x,y\n"1,5",2\n'), /^pts\.csv: line 2: the 'x' value '1,5' is not a number \(a decimal comma/],
    ['a non-finite value', file('pts.csv', 'x,y\n1,2\n3,1e999\n'), /^pts\.csv: line 3: the 'y' value '1e999' is not finite$/],
    ['a short record', file('pts.csv', 'id,x,y\n1,2,3\n2,4\n'), /^pts\.csv: line 3: 2 fields where the header \(line 1\) has 3$/],
    ['a GeoJSON without points', file('pts.geojson', '{"type":"FeatureCollection","features":[]}'), /^pts\.geojson: the file holds no point features$/],
    ['a GeoJSON line feature', file('pts.geojson', '{"type":"FeatureCollection","features":[{"type":"Feature","id":"w","properties":{},"geometry":{"type":"LineString","coordinates":[[0,0],[1,1]]}}]}'), /^pts\.geojson: feature 1 \(id 'w'\): a LineString where a Point or MultiPoint was expected$/],
    ['a feature without geometry', file('pts.geojson', '{"type":"FeatureCollection","features":[{"type":"Feature","properties":{},"geometry":null}]}'), /^pts\.geojson: feature 1: the feature has no geometry$/],
  ])('%s', (_, points, expected) => {
    expect(inputMessage(() => loadDataset({ points }, planar))).toMatch(expected);
  });

  it('counts physical lines when a quoted field spans lines', () => {
    const points = file('pts.csv', 'id,note,x,y\n1,"two\nlines",1,2\n2,ok,zz,3\n');
    expect(inputMessage(() => loadDataset({ points }, planar))).toBe("pts.csv: line 4: the 'x' value 'zz' is not a number");
  });

  it('reports invalid JSON with its line and column', () => {
    const points = file('pts.geojson', '{"type": "FeatureCollection",\n  "features": [}\n');
    expect(inputMessage(() => loadDataset({ points }, planar))).toMatch(/^pts\.geojson: invalid JSON at line 2, column 16/);
  });

  it('rejects latitude beyond 90 and longitude beyond 180 with the line', () => {
    const lat = file('pts.csv', 'lon,lat\n10,45\n10,95\n');
    expect(inputMessage(() => loadDataset({ points: lat }))).toMatch(/^pts\.csv: line 3: latitude 95 is beyond \+-90 degrees/);
    const lon = file('pts.csv', 'lon,lat\n190,45\n');
    expect(inputMessage(() => loadDataset({ points: lon }))).toMatch(/^pts\.csv: line 2: longitude 190 is beyond \+-180 degrees/);
    const geo = file('pts.geojson', '{"type":"Feature","id":7,"properties":{},"geometry":{"type":"Point","coordinates":[500000,4100000]}}');
    expect(inputMessage(() => loadDataset({ points: geo }))).toMatch(/^pts\.geojson: feature 1 \(id '7'\): latitude 4100000 is beyond/);
  });

  it('asks for --crs (on the page: the Coordinate system field) when the columns are x/y and no system is given', () => {
    expect(thrown(() => loadDataset({ points: goodPoints })).cliMessage).toMatch(/^pts\.csv: line 1: .*--crs planar .*--crs EPSG:n$/);
    expect(inputMessage(() => loadDataset({ points: goodPoints }))).toMatch(/^pts\.csv: line 1: .*in the "Coordinate system" field, "planar metres" .* or their EPSG code$/);
  });

  it('refuses more points than maxPoints with GS_ERR_TOO_LARGE', () => {
    const error = thrown(() => loadDataset({ points: goodPoints }, { crs: 'planar', maxPoints: 2 }));
    expect(error.code).toBe('GS_ERR_TOO_LARGE');
    expect(error.statusCode).toBe(413);
    expect(error.message).toBe('pts.csv: 3 points, more than the limit of 2');
  });

  it('names an unknown or malformed --crs as a parameter error', () => {
    expect(thrown(() => loadDataset({ points: goodPoints }, { crs: 'EPSG:99999' })).cliMessage).toBe('--crs: EPSG:99999 is not a known coordinate reference system');
    expect(thrown(() => loadDataset({ points: goodPoints }, { crs: 'EPSG:99999' })).message).toBe('the "Coordinate system" field: EPSG:99999 is not a known coordinate reference system');
    const malformed = thrown(() => loadDataset({ points: goodPoints }, { crs: 'wgs84' }));
    expect(malformed.code).toBe('GS_ERR_PARAMETER');
    expect(malformed.cliMessage).toBe("--crs must be 'planar' or 'EPSG:n', got 'wgs84'");
  });
});

describe('loadDataset rejects bad polygons', () => {
  const bowtie: Position[] = [[0, 0], [10, 10], [10, 0], [0, 10], [0, 0]];
  it.each([
    ['an unclosed ring', [[[0, 0], [10, 0], [10, 10], [0, 10]]], /^area\.geojson: feature 1 \(id 'f1'\), outer ring: the ring is not closed \(first position 0,0 differs from last 0,10\)$/],
    ['too few positions', [[[0, 0], [10, 0], [0, 0]]], /^area\.geojson: feature 1 \(id 'f1'\), outer ring: a ring needs at least 4 positions .* got 3$/],
    ['zero area', [[[0, 0], [5, 0], [10, 0], [0, 0]]], /^area\.geojson: feature 1 \(id 'f1'\), outer ring: the ring has zero area$/],
    ['a self-intersection', [bowtie], /^area\.geojson: feature 1 \(id 'f1'\): the polygon intersects itself at \(5, 5\)$/],
    ['a hole outside its shell', [square(0, 0, 10), square(20, 20, 2).reverse()], /^area\.geojson: feature 1 \(id 'f1'\), hole 1: the hole lies outside its outer ring at \(20, 20\)$/],
    ['a non-numeric position', [[[0, 0], [10, 'a'], [10, 10], [0, 0]]], /^area\.geojson: feature 1 \(id 'f1'\), outer ring, position 2: coordinates must be finite numbers$/],
  ])('%s', (_, rings, expected) => {
    const area = polygonFile('area.geojson', rings as Position[][]);
    expect(inputMessage(() => loadDataset({ points: goodPoints, area }, planar))).toMatch(expected);
  });

  it('names the part of a MultiPolygon', () => {
    const multi = { type: 'MultiPolygon', coordinates: [[square(0, 0, 10)], [[[20, 20], [30, 20], [30, 30], [20, 30]]]] };
    const area = file('area.geojson', JSON.stringify(multi));
    expect(inputMessage(() => loadDataset({ points: goodPoints, area }, planar))).toMatch(/^area\.geojson: geometry, polygon 2, outer ring: the ring is not closed/);
  });

  it('rejects a point file given as area', () => {
    const area = file('area.geojson', '{"type":"Point","coordinates":[1,2]}');
    expect(inputMessage(() => loadDataset({ points: goodPoints, area }, planar))).toBe('area.geojson: geometry: a Point where a Polygon or MultiPolygon was expected');
  });

  it('rejects a no-data zone entirely outside the study area, naming the zone', () => {
    const area = polygonFile('area.geojson', [square(0, 0, 10)]);
    const zones = polygonFile('zones.geojson', [square(1, 1, 1)], [square(50, 50, 5)]);
    expect(inputMessage(() => loadDataset({ points: goodPoints, area, noData: [zones] }, planar))).toBe(
      "zones.geojson: feature 2 (id 'f2'): the no-data zone lies entirely outside the study area",
    );
  });

  it('rejects zones covering the whole study area', () => {
    const area = polygonFile('area.geojson', [square(0, 0, 10)]);
    const zones = polygonFile('zones.geojson', [square(-1, -1, 12)]);
    expect(inputMessage(() => loadDataset({ points: goodPoints, area, noData: [zones] }, planar))).toMatch(/cover the whole study area/);
  });

  it('rejects a study area that holds no point', () => {
    const area = polygonFile('area.geojson', [square(100, 100, 10)]);
    expect(inputMessage(() => loadDataset({ points: goodPoints, area }, planar))).toBe('area.geojson: the study area does not contain any point of pts.csv');
  });

  it('rejects a default study area of zero width', () => {
    const points = csvFile('pts.csv', 'x,y', [[1, 1], [1, 5]]);
    expect(inputMessage(() => loadDataset({ points }, planar))).toMatch(/^pts\.csv: the points' bounding box has zero width/);
  });

  it('rejects polygon coordinates beyond +-180/+-90 when they are longitude/latitude', () => {
    const points = file('pts.csv', 'lon,lat\n1,1\n2,2\n');
    const area = polygonFile('area.geojson', [square(0, 0, 100)]);
    expect(inputMessage(() => loadDataset({ points, area }))).toMatch(/^area\.geojson: feature 1 \(id 'f1'\), outer ring, position 3: latitude 100 is beyond/);
  });
});
