/**
 * Wrong-system mistakes (issue 9 item 5), each refused or warned with a message that says what to do. The data is
 * the brannock-heath scenario placed in WGS 84 / UTM zone 33N and in longitude/latitude (test/grid-export); areas
 * of use are those of the EPSG dataset as the epsg-index package carries them (EPSG:2056, Switzerland:
 * longitude 5.96 to 10.49, latitude 45.82 to 47.81; EPSG:4258, ETRS89: Europe).
 */
import { describe, it, expect } from 'vitest';
import { loadDataset } from '../../server/inputs/load-dataset.js';
import { isGridshakeError } from '../../server/errors.js';
import { degreesOutside } from '../../server/inputs/coordinate-sanity.js';
import { lonLatScenario, utmScenario } from '../grid-export/geo-scenarios.js';

const lonLat = lonLatScenario();
const utm = utmScenario();
const file = (name: string, content: string) => ({ name, content });
const relabel = (csv: string, header: string) => [header, ...csv.split('\n').slice(1)].join('\n');
const swapColumns = (csv: string, header: string) =>
  [header, ...csv.split('\n').slice(1).map((line) => { const [id, a, b] = line.split(','); return `${id},${b},${a}`; })].join('\n');

function refusal(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    if (isGridshakeError(error)) {
      expect(error.code).toBe('GS_ERR_INPUT');
      return error.message;
    }
    throw error;
  }
  throw new Error('expected a refusal');
}

describe('coordinate sanity', () => {
  it('degree values under --crs planar: refused, naming the span and how to say degrees', () => {
    const points = file('pts.csv', relabel(lonLat.points, 'id,x,y'));
    const message = refusal(() => loadDataset({ points }, { crs: 'planar' }));
    expect(message).toMatch(/^pts\.csv: the coordinates \(x 15\.0\d+ to 15\.0\d+, y 62\.\d+ to 62\.\d+\) look like longitude\/latitude degrees/);
    expect(message).toContain('name the columns lon and lat');
  });

  it('degree values under a projected EPSG code: refused', () => {
    const points = file('pts.csv', relabel(lonLat.points, 'id,x,y'));
    expect(refusal(() => loadDataset({ points }, { crs: 'EPSG:32633' }))).toContain('look like longitude/latitude degrees');
  });

  it('degree-like values spanning a few units under planar: a warning, not a refusal', () => {
    const csv = ['id,x,y', 'a,8.12345,47.23456', 'b,10.54321,49.65432', 'c,9.11111,48.22222', 'd,11.98765,50.01234'].join('\n');
    const dataset = loadDataset({ points: file('pts.csv', csv) }, { crs: 'planar' });
    expect(dataset.warnings.map((w) => w.code)).toContain('degree-sized-coordinates');
  });

  it('metre values labelled as longitude/latitude: refused, asking for --crs', () => {
    const points = file('pts.csv', relabel(utm.points, 'id,lon,lat'));
    const message = refusal(() => loadDataset({ points }));
    expect(message).toMatch(/^pts\.csv: line 2: latitude 69\d+\.?\d* is beyond \+-90 degrees/);
    expect(message).toContain('look like metres of a projected system: give --crs planar');
  });

  it('small metre values labelled as longitude/latitude (spanning tens of degrees): a warning', () => {
    const csv = ['id,lon,lat', 'a,0,0', 'b,150,80', 'c,90,20', 'd,30,60'].join('\n');
    const dataset = loadDataset({ points: file('pts.csv', csv) });
    expect(dataset.warnings.find((w) => w.code === 'wide-longitude-latitude')?.message).toContain('--crs planar');
  });

  it('swapped longitude/latitude against the study area: refused as swapped', () => {
    const points = file('pts.csv', swapColumns(lonLat.points, 'id,lon,lat'));
    const message = refusal(() => loadDataset({ points, area: file('area.geojson', lonLat.area) }));
    expect(message).toContain('look swapped relative to the study area');
  });

  it('swapped longitude/latitude against the area of use of a regional EPSG code (ETRS89, EPSG:4258): refused as swapped', () => {
    const csv = ['id,lon,lat', 'a,62.2,15.0', 'b,62.21,15.01', 'c,62.22,15.03'].join('\n');
    const message = refusal(() => loadDataset({ points: file('pts.csv', csv) }, { crs: 'EPSG:4258' }));
    expect(message).toContain('outside the area of use of EPSG:4258');
    expect(message).toContain('look swapped');
  });

  it('points far outside the EPSG area of use: refused naming the area and the place', () => {
    const message = refusal(() => loadDataset({ points: file('pts.csv', utm.points) }, { crs: 'EPSG:2056' }));
    expect(message).toMatch(/outside the area of use of EPSG:2056 .*longitude 5\.96 to 10\.49, latitude 45\.82 to 47\.81/);
    expect(message).toContain('check --crs');
  });

  it('the right code passes without a warning', () => {
    const dataset = loadDataset({ points: file('pts.csv', utm.points), area: file('a.geojson', utm.area) }, { crs: 'EPSG:32633' });
    expect(dataset.warnings.filter((w) => /area-of-use|degree|wide/.test(w.code))).toEqual([]);
  });

  it('a study area in another system than its points: refused either way round', () => {
    const metreArea = refusal(() => loadDataset({ points: file('pts.csv', lonLat.points), area: file('area.geojson', utm.area) }));
    expect(metreArea).toMatch(/^area\.geojson: feature 1: the study area \(x 49\d+.*\) is not in longitude\/latitude, but the points of pts\.csv are/);
    const degreeArea = refusal(() => loadDataset({ points: file('pts.csv', utm.points), area: file('area.geojson', lonLat.area) }, { crs: 'EPSG:32633' }));
    expect(degreeArea).toContain('does not overlap the points of pts.csv');
    expect(degreeArea).toContain('the study area look like longitude/latitude and the other like projected metres');
  });

  it('degreesOutside measures the distance to the area of use (0 inside, wraps the antimeridian)', () => {
    expect(degreesOutside([12, 0, 18, 84], 15, 40)).toBe(0);
    expect(degreesOutside([12, 0, 18, 84], 15, -3)).toBeCloseTo(3, 12);
    expect(degreesOutside([170, -50, -170, -30], 179, -40)).toBe(0);
    expect(degreesOutside([170, -50, -170, -30], -160, -40)).toBeCloseTo(10 * Math.cos((40 * Math.PI) / 180), 9);
  });
});
