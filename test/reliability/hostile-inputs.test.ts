import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { hostileCsvCase } from './hostile-csv.js';
import { hostileGeoJsonCase } from './hostile-geojson.js';
import { runHostileBatch, runHostileCase, type HostileCase, type HostileTally } from './hostile-outcome.js';
import { circleRing, hostilePolygonCase } from './hostile-polygons.js';

// Every hostile input gets a valid Dataset or a coded 4xx GridshakeError with a short message; never another
// exception, never a run past its bound. Seeds are fixed so that a failure can be replayed.
const SEED = 20240611;
const SMALL_CASE_BOUND_MS = 2_000;
const LARGE_CASE_BOUND_MS = 30_000;

function report(name: string, tally: HostileTally): void {
  const codes = [...tally.codes.entries()].map(([code, count]) => `${code} ${count}`).join(', ');
  console.log(
    `hostile inputs (${name}): ${tally.cases} cases, ${tally.failures.length} failures ` +
      `(${tally.datasets} datasets, ${tally.refused} refused: ${codes})`,
  );
  for (const failure of tally.failures.slice(0, 10)) console.log(`  failure: ${failure.replace(/\s+/g, ' ')}`);
}

function generated(name: string, arbitrary: fc.Arbitrary<HostileCase>, numRuns: number): HostileTally {
  const tally = runHostileBatch(fc.sample(arbitrary, { seed: SEED, numRuns }), SMALL_CASE_BOUND_MS);
  report(name, tally);
  return tally;
}

const csv = (content: string): HostileCase['input'] => ({ points: { name: 'pts.csv', content } });
const planar = { crs: 'planar' };

describe('hostile inputs: generated cases', () => {
  it('CSV point files: 900 cases, each a dataset or a coded 4xx', () => {
    const tally = generated('CSV', hostileCsvCase, 900);
    expect(tally.failures).toEqual([]);
    expect(tally.datasets).toBeGreaterThan(20);
    expect(tally.refused).toBeGreaterThan(200);
  });

  it('GeoJSON point files: 800 cases, each a dataset or a coded 4xx', () => {
    const tally = generated('GeoJSON points', hostileGeoJsonCase, 800);
    expect(tally.failures).toEqual([]);
    expect(tally.datasets).toBeGreaterThan(20);
    expect(tally.refused).toBeGreaterThan(200);
  });

  it('study areas and no-data zones: 700 cases, each a dataset or a coded 4xx', () => {
    const tally = generated('polygons', hostilePolygonCase, 700);
    expect(tally.failures).toEqual([]);
    expect(tally.datasets).toBeGreaterThan(20);
    expect(tally.refused).toBeGreaterThan(100);
  });
});

describe('hostile inputs: fixed edge cases', () => {
  const fixed: HostileCase[] = [
    { label: 'empty', input: csv(''), options: planar },
    { label: 'BOM only', input: csv('\uFEFF'), options: planar },
    { label: 'line breaks only', input: csv('\r\n\n\r'), options: planar },
    { label: 'header only with BOM', input: csv('\uFEFFx,y\r\n'), options: planar },
    { label: 'mixed line endings', input: csv('x,y\r\n1,2\n3,4\r5,6\r\n'), options: planar },
    { label: 'quoted delimiters', input: csv('id,x,y\n"a,b",1,2\n"c;d",3,4\n"e""f",5,6\n'), options: planar },
    { label: 'duplicated ids and points', input: csv('id,x,y\na,1,2\na,1,2\nb,3,4\n'), options: planar },
    { label: 'extra column', input: csv('x,y\n1,2,3\n'), options: planar },
    { label: 'all points identical', input: csv('x,y\n1,2\n1,2\n'), options: planar },
    { label: 'coordinates near the double limit', input: csv('x,y\n-1.7e308,-1.7e308\n1.7e308,1.7e308\n0,0\n'), options: planar },
    { label: 'huge but close coordinates', input: csv('x,y\n1e300,1e300\n1.0000001e300,1.0000001e300\n1.00000005e300,1.00000002e300\n'), options: planar },
    { label: 'denormal coordinates', input: csv('x,y\n1e-310,1e-310\n3e-310,4e-310\n2e-310,1e-310\n'), options: planar },
    { label: 'binary bytes', input: { points: { name: 'pts.csv', content: new Uint8Array([0, 1, 2, 255, 254, 0, 10]) } }, options: planar },
    { label: 'invalid UTF-8', input: { points: { name: 'pts.csv', content: new Uint8Array([120, 44, 121, 10, 0xc3, 0x28, 44, 50, 10]) } }, options: planar },
  ];

  it('small fixed cases: each a dataset or a coded 4xx', () => {
    const tally = runHostileBatch(fixed, SMALL_CASE_BOUND_MS);
    report('fixed', tally);
    expect(tally.failures).toEqual([]);
  });

  it('one 24 MB line (a single field) is refused with a short message', () => {
    const result = runHostileCase({ label: 'long field', input: csv(`x,y\n1,2\n3,${'4'.repeat(24_000_000)}\n`), options: planar }, LARGE_CASE_BOUND_MS);
    console.log(`hostile inputs (24 MB line): ${result.milliseconds.toFixed(0)} ms, failure: ${result.failure ?? 'none'}`);
    expect(result.failure).toBeNull();
    expect(result.outcome?.kind).toBe('refused');
  });

  it('a 16 MB header line without a line break is refused', () => {
    const result = runHostileCase({ label: 'long header', input: csv(`x,y,${'z'.repeat(16_000_000)}`), options: planar }, LARGE_CASE_BOUND_MS);
    console.log(`hostile inputs (16 MB header): ${result.milliseconds.toFixed(0)} ms, failure: ${result.failure ?? 'none'}`);
    expect(result.failure).toBeNull();
  });

  it('GeoJSON nested 100000 arrays deep, as points and as study area, is refused', () => {
    const deep = '['.repeat(100_000) + ']'.repeat(100_000);
    const points = { name: 'pts.geojson', content: `{"type":"Point","coordinates":${deep}}` };
    const area = { name: 'area.geojson', content: `{"type":"Polygon","coordinates":${deep}}` };
    const cases: HostileCase[] = [
      { label: 'deep points', input: { points }, options: planar },
      { label: 'deep area', input: { points: csv('x,y\n1,2\n3,4\n').points, area }, options: planar },
    ];
    const tally = runHostileBatch(cases, LARGE_CASE_BOUND_MS);
    report('deep nesting', tally);
    expect(tally.failures).toEqual([]);
    expect(tally.refused).toBe(2);
  });

  it('an enormous GeoJSON FeatureCollection (150000 points, about 12 MB) loads', () => {
    const features = Array.from({ length: 150_000 }, (_, k) => ({
      type: 'Feature',
      id: k,
      properties: {},
      geometry: { type: 'Point', coordinates: [(k % 400) + 0.5, Math.floor(k / 400) + 0.5] },
    }));
    const content = JSON.stringify({ type: 'FeatureCollection', features });
    const result = runHostileCase({ label: 'enormous', input: { points: { name: 'pts.geojson', content } }, options: planar }, LARGE_CASE_BOUND_MS);
    console.log(`hostile inputs (${(content.length / 1e6).toFixed(1)} MB GeoJSON): ${result.milliseconds.toFixed(0)} ms`);
    expect(result.failure).toBeNull();
    expect(result.outcome?.kind === 'dataset' && result.outcome.dataset.inside.length).toBe(150_000);
  });

  it('a study area of 20000 vertices loads; one of 150000 is refused quickly with GS_ERR_TOO_LARGE', () => {
    const points = csv('x,y\n500,500\n300,520\n700,480\n').points;
    const area = (vertices: number) => ({ name: 'area.geojson', content: JSON.stringify({ type: 'Polygon', coordinates: [circleRing(vertices, 500, 500, 400)] }) });
    const fine = runHostileCase({ label: '20000 vertices', input: { points, area: area(20_000) }, options: planar }, LARGE_CASE_BOUND_MS);
    const huge = runHostileCase({ label: '150000 vertices', input: { points, area: area(150_000) }, options: planar }, LARGE_CASE_BOUND_MS);
    console.log(`hostile inputs (many vertices): 20000 in ${fine.milliseconds.toFixed(0)} ms, 150000 in ${huge.milliseconds.toFixed(0)} ms`);
    expect(fine.failure).toBeNull();
    expect(fine.outcome?.kind === 'dataset' && fine.outcome.dataset.region.area).toBeCloseTo(Math.PI * 400 * 400, -3);
    expect(huge.failure).toBeNull();
    expect(huge.outcome?.kind === 'refused' && huge.outcome.error.code).toBe('GS_ERR_TOO_LARGE');
  });
});
