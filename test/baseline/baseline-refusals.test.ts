import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { GridshakeError } from '../../server/errors.js';
import { writeGeoPackage } from '../inputs/geopackage-writer.js';
import { run } from '../cli/run-cli.js';
import { featuresGeoJson, OBSERVED, pointsCsv, polygonFile, rect, STUDY, write } from './baseline-fixtures.js';

/** Bad baselines are refused with GS_ERR_BASELINE (400) naming the file and the 1-based feature (issue 15). */
function load(baseline: string, field = 'pop', crs = 'planar') {
  return () =>
    loadDataset(
      {
        points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
        area: { name: 'area.geojson', content: polygonFile([STUDY]) },
        baseline: { name: 'pop.geojson', content: baseline },
      },
      { crs, baselineField: field },
    );
}

function refusal(fn: () => unknown): GridshakeError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(GridshakeError);
    expect((error as GridshakeError).code).toBe('GS_ERR_BASELINE');
    expect((error as GridshakeError).statusCode).toBe(400);
    return error as GridshakeError;
  }
  throw new Error('expected a refusal');
}

const two = [rect(0, 0, 200, 200), rect(200, 0, 400, 200)];

describe('baseline refusals', () => {
  it('a missing field names the feature', () => {
    expect(refusal(load(featuresGeoJson(two, [{ pop: 1 }, { other: 2 }]))).message).toMatch(/pop\.geojson: feature 2: no value in the baseline field 'pop'/);
  });
  it('a negative count names the feature', () => {
    expect(refusal(load(featuresGeoJson(two, [{ pop: -3 }, { pop: 2 }]))).message).toMatch(/feature 1: the baseline field 'pop' is negative/);
  });
  it('a non-numeric count names the feature; numeric text is read as a number', () => {
    expect(refusal(load(featuresGeoJson(two, [{ pop: 4 }, { pop: 'many' }]))).message).toMatch(/feature 2: the baseline field 'pop' holds "many", not a number/);
    expect(load(featuresGeoJson(two, [{ pop: '4' }, { pop: ' 6 ' }]))().baseline?.info.totalInside).toBe(10);
  });
  it('overlapping polygons name both feature numbers', () => {
    const rings = [rect(0, 0, 200, 200), rect(300, 0, 400, 200), rect(150, 0, 300, 200)];
    expect(refusal(load(featuresGeoJson(rings, [{ pop: 1 }, { pop: 1 }, { pop: 1 }]))).message).toMatch(/features 1 and 3 overlap/);
  });
  it('polygons sharing an edge do not overlap', () => {
    expect(load(featuresGeoJson(two, [{ pop: 1 }, { pop: 1 }]))().baseline?.info.features).toBe(2);
  });
  it('no baseline weight anywhere in V: all zero inside, or every polygon outside', () => {
    expect(refusal(load(featuresGeoJson(two, [{ pop: 0 }, { pop: 0 }]))).message).toMatch(/no baseline weight anywhere in the valid region/);
    expect(refusal(load(featuresGeoJson([rect(1000, 1000, 1100, 1100)], [{ pop: 9 }]))).message).toMatch(/no baseline weight anywhere/);
  });
  it('a baseline declaring another coordinate system than the points', () => {
    const declared = JSON.parse(featuresGeoJson(two, [{ pop: 1 }, { pop: 1 }]));
    declared.crs = { type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::32633' } };
    const error = refusal(() =>
      loadDataset(
        {
          points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
          area: { name: 'area.geojson', content: polygonFile([STUDY]) },
          baseline: { name: 'pop.geojson', content: JSON.stringify(declared) },
        },
        { crs: 'EPSG:32634', baselineField: 'pop' },
      ),
    );
    expect(error.message).toMatch(/pop\.geojson: .*EPSG:32633 but the points are in EPSG:32634/);
  });
  it('a baseline in projected metres beside longitude/latitude points', () => {
    const lonLat = 'id,lon,lat\n1,10.1,50.1\n2,10.2,50.2\n3,10.15,50.12\n';
    expect(() =>
      loadDataset(
        { points: { name: 'points.csv', content: lonLat }, baseline: { name: 'pop.geojson', content: featuresGeoJson([rect(500000, 5500000, 510000, 5510000)], [{ pop: 1 }]) } },
        { baselineField: 'pop' },
      ),
    ).toThrow(/pop\.geojson/);
  });
  it('controls that miss the valid region; both kinds at once; a field without polygons', () => {
    const controls = () =>
      loadDataset(
        {
          points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
          area: { name: 'area.geojson', content: polygonFile([STUDY]) },
          controls: { name: 'controls.csv', content: 'id,x,y\n1,5000,5000\n' },
        },
        { crs: 'planar' },
      );
    expect(refusal(controls).message).toMatch(/controls\.csv: no control point lies in the valid region/);
    expect(refusal(() =>
      loadDataset(
        {
          points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
          baseline: { name: 'pop.geojson', content: featuresGeoJson(two, [{ pop: 1 }, { pop: 1 }]) },
          controls: { name: 'controls.csv', content: pointsCsv(OBSERVED) },
        },
        { crs: 'planar', baselineField: 'pop' },
      )).message).toMatch(/not both/);
    expect(refusal(() => loadDataset({ points: { name: 'points.csv', content: pointsCsv(OBSERVED) } }, { crs: 'planar', baselineField: 'pop' })).message).toMatch(/without baseline polygons/);
  });
  it('the CLI prints one line naming file and feature and exits non-zero', async () => {
    const file = write();
    const result = await run([
      'count', '--crs', 'planar', '--cell', '100',
      '--points', file('points.csv', pointsCsv(OBSERVED)),
      '--area', file('area.geojson', polygonFile([STUDY])),
      '--baseline', file('pop.geojson', featuresGeoJson(two, [{ pop: 1 }, { pop: -1 }])),
      '--baseline-field', 'pop',
    ]);
    expect(result.code).not.toBe(0);
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(/^gridshake: .*pop\.geojson: feature 2: the baseline field 'pop' is negative/);
  });
});

describe('baseline polygons from a GeoPackage', () => {
  const layer = (epsg: number | undefined, residents: (number | string | null)[]) =>
    writeGeoPackage([{ table: 'blocks', geometryType: 'POLYGON', epsg, geometries: two.map((ring) => ({ type: 'Polygon', coordinates: [ring] })), properties: residents.map((r) => ({ residents: r })) }]);
  const loadPackage = (bytes: Buffer, crs = 'planar') => () =>
    loadDataset(
      {
        points: { name: 'points.csv', content: pointsCsv(OBSERVED) },
        area: { name: 'area.geojson', content: polygonFile([STUDY]) },
        baseline: { name: 'blocks.gpkg', content: new Uint8Array(bytes) },
      },
      { crs, baselineField: 'residents' },
    );

  it('reads the count column of each feature', () => {
    expect(loadPackage(layer(undefined, [100, 300]))().baseline?.info).toMatchObject({ totalInside: 400, features: 2 });
  });
  it('a NULL count names the feature', () => {
    expect(refusal(loadPackage(layer(undefined, [100, null]))).message).toMatch(/blocks\.gpkg: feature 2: no value in the baseline field 'residents'/);
  });
  it('a layer in another EPSG system than the points', () => {
    expect(refusal(loadPackage(layer(32633, [1, 2]), 'EPSG:32634')).message).toMatch(/blocks\.gpkg: the layer is in EPSG:32633 but the points are in EPSG:32634/);
  });
});

describe('the projection centre', () => {
  it('is chosen from the points and the study area only: a far-reaching baseline does not move it', () => {
    const points = 'id,lon,lat\n1,10.10,50.10\n2,10.20,50.20\n3,10.15,50.12\n4,10.12,50.18\n';
    const area = polygonFile([[[10.05, 50.05], [10.25, 50.05], [10.25, 50.25], [10.05, 50.25], [10.05, 50.05]]]);
    // one block over the study area and one far to the north-east (outside the valid region: reported, ignored)
    const baseline = featuresGeoJson(
      [[[10.0, 50.0], [10.3, 50.0], [10.3, 50.3], [10.0, 50.3], [10.0, 50.0]], [[12.0, 52.0], [12.5, 52.0], [12.5, 52.5], [12.0, 52.5], [12.0, 52.0]]],
      [{ pop: 100 }, { pop: 50 }],
    );
    const without = loadDataset({ points: { name: 'points.csv', content: points }, area: { name: 'area.geojson', content: area } });
    const withBaseline = loadDataset(
      { points: { name: 'points.csv', content: points }, area: { name: 'area.geojson', content: area }, baseline: { name: 'pop.geojson', content: baseline } },
      { baselineField: 'pop' },
    );
    expect(withBaseline.projection).toEqual(without.projection);
    expect(withBaseline.origin).toEqual(without.origin);
    expect(withBaseline.baseline?.info.outsideFeatures).toEqual([2]);
    const withControls = loadDataset({
      points: { name: 'points.csv', content: points },
      area: { name: 'area.geojson', content: area },
      controls: { name: 'controls.csv', content: 'id,lon,lat\n1,10.11,50.11\n2,14.0,54.0\n' },
    });
    expect(withControls.projection).toEqual(without.projection);
    expect(withControls.baseline?.info).toMatchObject({ totalInside: 1, controlsOutside: 1 });
  });
});
