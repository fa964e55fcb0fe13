import { describe, expect, it } from 'vitest';
import { GridshakeError } from '../../server/errors.js';
import { loadDataset } from '../../server/inputs/index.js';
import { circleRing } from './hostile-polygons.js';


// Regression tests for bugs the hostile-input generators found, one test per bug, named after it.
const csv = (content: string) => ({ name: 'pts.csv', content });

function refusal(run: () => unknown): GridshakeError {
  try {
    run();
  } catch (error) {
    if (error instanceof GridshakeError) return error;
    throw error;
  }
  throw new Error('expected a GridshakeError, nothing was thrown');
}

describe('input regressions', () => {
  it('huge coordinates gave a dataset with an infinite valid area', () => {
    const points = csv('x,y\n1e300,1e300\n1.0000001e300,1.0000001e300\n1.00000005e300,1.00000002e300\n');
    const error = refusal(() => loadDataset({ points }, { crs: 'planar' }));
    expect(error.code).toBe('GS_ERR_INPUT');
    expect(error.message).toMatch(/^pts\.csv: the coordinates are too large: the study area's size overflows/);
  });
});

describe('input regressions: message length', () => {
  it('a 24 MB field was echoed whole in the error message', () => {
    const points = csv(`x,y\n1,2\n3,${'4'.repeat(24_000_000)}\n`);
    const error = refusal(() => loadDataset({ points }, { crs: 'planar' }));
    expect(error.code).toBe('GS_ERR_INPUT');
    expect(error.message.length).toBeLessThanOrEqual(2000);
    expect(error.message).toMatch(/^pts\.csv: line 3: the 'y' value '4444/);
    expect(error.message).toMatch(/characters left out/);
  });

  it('a 2 MB column name was echoed whole in the missing-columns message', () => {
    const points = csv(`${'q'.repeat(2_000_000)},b\n1,2\n`);
    const error = refusal(() => loadDataset({ points }, { crs: 'planar' }));
    expect(error.message.length).toBeLessThanOrEqual(2000);
    expect(error.message).toMatch(/^pts\.csv: line 1: no coordinate columns found/);
    expect(error.cliMessage).toMatch(/name them with --x COL --y COL$/);
    expect(error.message).toMatch(/name them in the "x \/ longitude column" and "y \/ latitude column" fields$/);
  });
});

describe('input regressions: polygons with many vertices', () => {
  const points = csv('x,y\n500,500\n300,520\n700,480\n');
  const area = (vertices: number) => ({
    name: 'area.geojson',
    content: JSON.stringify({ type: 'Polygon', coordinates: [circleRing(vertices, 500, 500, 400)] }),
  });

  it('a study area of 200000 vertices crashed with a RangeError after minutes of pairwise kink search', () => {
    const started = performance.now();
    const error = refusal(() => loadDataset({ points, area: area(200_000) }, { crs: 'planar' }));
    const seconds = (performance.now() - started) / 1000;
    expect(error.code).toBe('GS_ERR_TOO_LARGE');
    expect(error.statusCode).toBe(413);
    expect(error.message).toMatch(/^area\.geojson: geometry: the polygon has 200001 vertices, more than the limit of 100000; simplify it/);
    expect(seconds).toBeLessThan(20);
  });

  it('a study area of 30000 vertices (pairwise kink search: about 4.5e8 edge pairs) loads with its exact area', () => {
    const dataset = loadDataset({ points, area: area(30_000) }, { crs: 'planar' });
    // Area of a regular n-gon with circumradius r: (n/2) r^2 sin(2 pi / n) (elementary geometry).
    const expected = (30_000 / 2) * 400 * 400 * Math.sin((2 * Math.PI) / 30_000);
    expect(dataset.region.area).toBeCloseTo(expected, 3);
  });

  it('the faster self-intersection search still finds a bow-tie and a hole crossing its shell', () => {
    const bowTie = { name: 'area.geojson', content: JSON.stringify({ type: 'Polygon', coordinates: [[[0, 0], [10, 10], [10, 0], [0, 10], [0, 0]]] }) };
    expect(refusal(() => loadDataset({ points: csv('x,y\n1,2\n'), area: bowTie }, { crs: 'planar' })).message).toBe(
      'area.geojson: geometry: the polygon intersects itself at (5, 5)',
    );
    const shell = [[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]];
    const crossingHole = [[5, 5], [15, 5], [15, 6], [5, 6], [5, 5]];
    const crossing = { name: 'area.geojson', content: JSON.stringify({ type: 'Polygon', coordinates: [shell, crossingHole] }) };
    expect(refusal(() => loadDataset({ points: csv('x,y\n1,2\n'), area: crossing }, { crs: 'planar' })).message).toMatch(
      /^area\.geojson: geometry: the polygon intersects itself at \(10, 5\), \(10, 6\)$/,
    );
  });
});
