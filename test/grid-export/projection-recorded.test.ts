/**
 * Issue 9 item 5: the projection used, with its full proj4 definition, is recorded in the count text and JSON, in
 * summary.json, in the dataset summary the page and the report show, and in the report; and it reproduces the
 * run: projecting the input longitude/latitude with the recorded definition (proj4, independently of gridshake)
 * gives the same study-area size as gridshake reports.
 */
import { describe, it, expect } from 'vitest';
import proj4 from 'proj4';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run, tempFolder } from '../cli/run-cli.js';
import { datasetSummaryEntries } from '../../shared/charts/dataset-entries.js';
import { lonLatScenario, utmScenario } from './geo-scenarios.js';

const write = tempFolder();
const lonLat = lonLatScenario();
const files = { points: write('ll-points.csv', lonLat.points), area: write('ll-area.geojson', lonLat.area), noData: write('ll-zones.geojson', lonLat.noData) };

/** Shoelace area (m^2) of the first study-area ring projected with `definition`. */
function projectedArea(definition: string): number {
  const ring = (JSON.parse(lonLat.area) as { features: { geometry: { coordinates: [number, number][][] } }[] }).features[0]!.geometry.coordinates[0]!;
  const forward = proj4('+proj=longlat +datum=WGS84 +no_defs', definition);
  const xy = ring.map((p) => forward.forward(p) as [number, number]);
  let twice = 0;
  for (let k = 0; k + 1 < xy.length; k++) twice += xy[k]![0] * xy[k + 1]![1] - xy[k + 1]![0] * xy[k]![1];
  return Math.abs(twice) / 2;
}

describe('the projection used is recorded', () => {
  it('count --json carries the full definition, and it reproduces the study area', async () => {
    const result = await run(['count', '--points', files.points, '--area', files.area, '--cell', '150', '--json']);
    expect(result.code, result.stderr).toBe(0);
    const json = JSON.parse(result.stdout);
    expect(json.dataset.projection.kind).toBe('laea');
    const definition = json.dataset.projection.proj4 as string;
    expect(definition).toMatch(/^\+proj=laea \+lat_0=62\.\d+ \+lon_0=1[45]\.\d+ \+x_0=0 \+y_0=0 \+datum=WGS84 \+units=m \+no_defs$/);
    expect(json.dataset.projectionUsed).toContain(definition);
    expect(projectedArea(definition)).toBeCloseTo(json.dataset.studyAreaArea, 3);
  });

  it('count text prints the projection line', async () => {
    const result = await run(['count', '--points', files.points, '--area', files.area, '--cell', '150']);
    expect(result.code, result.stderr).toBe(0);
    expect(result.stdout).toMatch(/Projection used: longitude\/latitude projected to a local Lambert azimuthal equal-area system centred at .*: \+proj=laea /);
    const utm = utmScenario();
    const utmRun = await run(['count', '--points', write('utm.csv', utm.points), '--crs', 'EPSG:32633', '--cell', '150']);
    expect(utmRun.stdout).toContain('Projection used: EPSG:32633: +proj=utm +zone=33 +datum=WGS84 +units=m +no_defs');
    const planar = await run(['count', '--points', write('planar.csv', 'id,x,y\na,1,1\nb,50,80\nc,90,20\nd,30,60\n'), '--crs', 'planar', '--cell', '30']);
    expect(planar.stdout).toContain('Projection used: planar');
  });

  it('summary.json, the report and the dataset summary rows carry it', async () => {
    const out = join(mkdtempSync(join(tmpdir(), 'gridshake-proj-')), 'run');
    const result = await run([
      'sweep', '--points', files.points, '--area', files.area, '--no-data', files.noData,
      '--cells', '150', '--placements', '8', '--sims', '19', '--seed', '2', '--out', out, '--threads', '1',
    ]);
    expect(result.code, result.stderr).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
    const definition = summary.dataset.projection.proj4 as string;
    expect(definition).toMatch(/^\+proj=laea /);
    expect(summary.dataset.projectionUsed).toContain(definition);
    const report = readFileSync(join(out, 'report.html'), 'utf8');
    expect(report).toContain('Projection used');
    expect(report).toContain(definition);
    const rows = datasetSummaryEntries(summary.dataset);
    expect(rows).toContainEqual(['Projection used', summary.dataset.projectionUsed]);
  });
});
