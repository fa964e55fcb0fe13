import proj4 from 'proj4';
import { describe, expect, it } from 'vitest';
import { loadDataset, summarizeDataset } from '../../server/inputs/index.js';
import { csvFile, file, polygonFile, square } from './input-helpers.js';

/**
 * Area of the ellipsoid zone between latitudes phi1 and phi2 over dLambda radians of longitude:
 * A = (a^2 * dLambda / 2) * (q(phi2) - q(phi1)), with
 * q(phi) = (1 - e^2) * (sin(phi) / (1 - e^2 sin^2(phi)) - ln((1 - e sin(phi)) / (1 + e sin(phi))) / (2e)).
 * J. P. Snyder (1987), "Map Projections: A Working Manual", USGS Professional Paper 1395, eq. (3-12) and the
 * authalic-sphere relations of chapter 3. WGS 84: a = 6378137 m, f = 1/298.257223563.
 */
function ellipsoidCellArea(lat1: number, lat2: number, dLon: number): number {
  const a = 6378137;
  const f = 1 / 298.257223563;
  const e2 = f * (2 - f);
  const e = Math.sqrt(e2);
  const q = (phi: number): number => {
    const s = Math.sin(phi);
    return (1 - e2) * (s / (1 - e2 * s * s) - Math.log((1 - e * s) / (1 + e * s)) / (2 * e));
  };
  const rad = Math.PI / 180;
  return ((a * a * dLon * rad) / 2) * (q(lat2 * rad) - q(lat1 * rad));
}

describe('longitude/latitude input is projected to a local Lambert azimuthal equal-area plane', () => {
  it('matches proj4 used directly with the LAEA centred on the bounding box centre', () => {
    const points = csvFile('pts.csv', 'id,lon,lat', [['a', 10.2, 45.1], ['b', 10.8, 45.9], ['c', 10.5, 45.3]]);
    const dataset = loadDataset({ points });
    // centre of the bbox: lon (10.2 + 10.8)/2 = 10.5, lat (45.1 + 45.9)/2 = 45.5
    const reference = proj4('EPSG:4326', '+proj=laea +lat_0=45.5 +lon_0=10.5 +x_0=0 +y_0=0 +ellps=WGS84 +units=m +no_defs');
    const expected = [[10.2, 45.1], [10.8, 45.9], [10.5, 45.3]].flatMap((p) => reference.forward(p));
    Array.from(dataset.xy).forEach((value, k) => expect(value).toBeCloseTo(expected[k], 6));
    expect(dataset.projection).toMatchObject({ kind: 'laea', lon0: 10.5, lat0: 45.5 });
    expect(dataset.crs).toBe('EPSG:4326');
  });

  it('gives a 1 x 1 degree box at the equator its ellipsoidal area, about 12308 km^2', () => {
    const points = file('pts.csv', 'lon,lat\n0.2,0.3\n0.7,0.8\n');
    const area = polygonFile('area.geojson', [square(0, 0, 1)]);
    const summary = summarizeDataset(loadDataset({ points, area }));
    const expected = ellipsoidCellArea(0, 1, 1);
    expect(expected / 1e6).toBeCloseTo(12308, 0);
    // straight edges in the projected plane differ from the parallels by far less than 0.01 %
    expect(Math.abs(summary.studyAreaArea - expected) / expected).toBeLessThan(1e-4);
  });

  it('projects a 1 x 1 degree box at 60 N to its ellipsoidal area (where planar lon/lat would be off by half)', () => {
    const points = file('pts.csv', 'lon,lat\n20.2,60.3\n20.7,60.8\n');
    const area = polygonFile('area.geojson', [square(20, 60, 1)]);
    const summary = summarizeDataset(loadDataset({ points, area }));
    const expected = ellipsoidCellArea(60, 61, 1);
    expect(Math.abs(summary.studyAreaArea - expected) / expected).toBeLessThan(1e-4);
  });

  it('treats an explicit geographic EPSG code (4326) as longitude/latitude', () => {
    const points = csvFile('pts.csv', 'x,y', [[5, 5], [5.5, 5.5], [5.2, 5.9]]);
    const dataset = loadDataset({ points }, { crs: 'EPSG:4326' });
    expect(dataset.projection.kind).toBe('laea');
  });
});

describe('projected input', () => {
  it('keeps metre coordinates of a projected EPSG system (UTM zone 33N) as they are', () => {
    const points = csvFile('pts.csv', 'easting,northing', [[500000, 5000000], [501000, 5002000], [500500, 5001000]]);
    const dataset = loadDataset({ points }, { crs: 'EPSG:32633' });
    expect(Array.from(dataset.xy)).toEqual([500000, 5000000, 501000, 5002000, 500500, 5001000]);
    expect(dataset.projection).toMatchObject({ kind: 'epsg', code: 32633 });
  });

  it('converts US survey feet to metres (EPSG:2227; 1 US survey foot = 1200/3937 m, NIST SP 811)', () => {
    const points = csvFile('pts.csv', 'x,y', [[6000000, 2000000], [6003937, 2003937], [6001000, 2002000]]);
    const dataset = loadDataset({ points }, { crs: 'EPSG:2227' });
    expect(dataset.xy[2] - dataset.xy[0]).toBeCloseTo(1200, 6);
    expect(dataset.xy[3] - dataset.xy[1]).toBeCloseTo(1200, 6);
  });

  it('warns that Web Mercator (EPSG:3857) does not preserve areas', () => {
    const points = csvFile('pts.csv', 'x,y', [[0, 0], [1000, 1000], [500, 200]]);
    const dataset = loadDataset({ points }, { crs: 'EPSG:3857' });
    expect(dataset.warnings.map((w) => w.code)).toContain('projection');
  });
});
