/**
 * GeoJSON point ids are the record ids in warnings and exports, as a CSV's id column is: Feature.id (RFC 7946,
 * section 3.2: "a commonly used identifier"), else an id-like property, else the property named with --id, else the
 * feature's 1-based number.
 */
import { describe, it, expect } from 'vitest';
import { loadDataset } from '../../server/inputs/load-dataset.js';
import { run, tempFolder } from '../cli/run-cli.js';

const point = (x: number, y: number, extra: Record<string, unknown>) => ({ type: 'Feature', ...extra, geometry: { type: 'Point', coordinates: [x, y] } });
const collection = (...features: unknown[]) => JSON.stringify({ type: 'FeatureCollection', features });
const area = JSON.stringify({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[0, 0], [100, 0], [100, 100], [0, 100], [0, 0]]] } });

const points = collection(
  point(10, 10, { id: 'nest-a', properties: { site_id: 'ignored' } }),
  point(20, 30, { properties: { SITE_ID: 'W-07' } }),
  point(20, 30, { properties: { ObjectID: 4411 } }),
  point(150, 40, { properties: { record: 'far-1', tag: 'T9' } }),
  point(60, 70, { properties: { tag: 'T3' } }),
  point(70, 80, { properties: {} }),
);

describe('GeoJSON point ids', () => {
  it('Feature.id first, then an id-like property, then the feature number', () => {
    const dataset = loadDataset({ points: { name: 'pts.geojson', content: points }, area: { name: 'area.geojson', content: area } }, { crs: 'planar' });
    expect(dataset.ids).toEqual(['nest-a', 'W-07', '4411', 'far-1', '5', '6']);
    expect(dataset.outsideIds).toEqual(['far-1']);
    expect(dataset.warnings.find((w) => w.code === 'duplicate-points')?.ids).toEqual(['4411']);
    expect(dataset.warnings.find((w) => w.code === 'points-outside')?.ids).toEqual(['far-1']);
  });

  it('--id names the property to use', () => {
    const dataset = loadDataset({ points: { name: 'pts.geojson', content: points } }, { crs: 'planar', id: 'tag' });
    expect(dataset.ids).toEqual(['nest-a', '2', '3', 'T9', 'T3', '6']);
  });

  it('count --json reports warnings with the GeoJSON ids', async () => {
    const write = tempFolder();
    const result = await run(['count', '--points', write('pts.geojson', points), '--area', write('area.geojson', area), '--crs', 'planar', '--cell', '40', '--json']);
    expect(result.code, result.stderr).toBe(0);
    const warnings = JSON.parse(result.stdout).warnings as { code: string; ids?: string[] }[];
    expect(warnings.find((w) => w.code === 'points-outside')?.ids).toEqual(['far-1']);
    expect(warnings.find((w) => w.code === 'duplicate-points')?.ids).toEqual(['4411']);
  });
});
