import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { file } from './input-helpers.js';

// Reading CSV points: the formats analysts' exports come in (RFC 4180 quoting, other delimiters, BOM, CRLF).
describe('loadDataset reads CSV points', () => {
  const planar = { crs: 'planar' };

  it.each([
    [',', 'comma'],
    [';', 'semicolon'],
    ['\t', 'tab'],
    ['|', 'vertical bar'],
  ])('detects the %s delimiter (%s)', (delimiter) => {
    const text = ['id', 'x', 'y'].join(delimiter) + '\n' + ['a', '1', '2'].join(delimiter) + '\n' + ['b', '3.5', '4e1'].join(delimiter);
    const dataset = loadDataset({ points: file('pts.csv', text) }, planar);
    expect(Array.from(dataset.xy)).toEqual([1, 2, 3.5, 40]);
    expect(dataset.ids).toEqual(['a', 'b']);
  });

  it('strips a byte-order mark, reads quoted fields and mixed line endings from bytes', () => {
    const text = '\uFEFF"Record","Easting","Northing","note"\r\n"r1",10,20,"a, b"\n"r2",30,40,"said ""hi"""\r50,60,70,plain\n';
    const dataset = loadDataset({ points: { name: 'pts.csv', content: new TextEncoder().encode(text) } }, planar);
    expect(dataset.ids).toEqual(['r1', 'r2', '50']);
    expect(Array.from(dataset.xy)).toEqual([10, 20, 30, 40, 60, 70]);
  });

  it('finds lon/lat columns by any of their usual names, case-insensitively, and treats them as longitude/latitude', () => {
    const text = 'LNG,Latitude\n0.1,0.2\n0.3,0.4\n0.5,0.1\n';
    const dataset = loadDataset({ points: file('pts.csv', text) });
    expect(dataset.crs).toBe('EPSG:4326');
    expect(dataset.projection.kind).toBe('laea');
  });

  it('uses the 1-based record number as id when there is no id column, and the columns given with --x/--y', () => {
    const text = 'px,py,other\n1,2,9\n3,4,9\n5,1,9\n';
    const dataset = loadDataset({ points: file('pts.csv', text) }, { crs: 'planar', x: 'PX', y: 'py' });
    expect(dataset.ids).toEqual(['1', '2', '3']);
    expect(Array.from(dataset.xy)).toEqual([1, 2, 3, 4, 5, 1]);
  });

  it('reads GeoJSON Point and MultiPoint features, each point a record', () => {
    const text = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', id: 'a', properties: {}, geometry: { type: 'Point', coordinates: [0, 0] } },
        { type: 'Feature', properties: {}, geometry: { type: 'MultiPoint', coordinates: [[1, 0], [0, 1]] } },
      ],
    });
    const dataset = loadDataset({ points: file('pts.geojson', text) }, planar);
    expect(dataset.ids).toEqual(['a', '2.1', '2.2']);
    expect(Array.from(dataset.xy)).toEqual([0, 0, 1, 0, 0, 1]);
  });
});
