/**
 * The page's typed frames (issue 17): GET /api/sweeps/:id/stability-surface?size=K carries exactly the bands and
 * georeferencing of stability-<side>m.tif as the registry library geotiff reads them; GET .../grid-frame?size=K&
 * placement=J carries the cells of grid.geojson (indices, counts, coverage, expected counts, kept flags), and the
 * polygons the page rebuilds from the lattice parameters are the GeoJSON's rings. The page's per-cell stability
 * flags (client/src/map/grid-from-frame.ts, the engine's test in workers/stability/cell-flags.ts) agree with the
 * surface: with one placement the excess share is 1 exactly on the pixels of that placement's excess cells and 0
 * on the other kept cells' pixels. Data: the invented demo scenario port-calverin, and a seeded planted cluster.
 */
import type { FastifyInstance } from 'fastify';
import { fromArrayBuffer } from 'geotiff';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SweepSummary } from '../../shared/contracts.js';
import { decodeTypedFrame, encodeTypedFrame } from '../../shared/binary/typed-frame.js';
import type { GridFrameMeta, SurfaceFrameMeta } from '../../shared/binary/page-frames.js';
import { gridFromFrame } from '../../client/src/map/grid-from-frame.js';
import { latticeOf } from '../../workers/lattice/registry.js';
import { multipartBody, testApp, uploadScenario, waitForSweep } from '../server/server-helpers.js';

let app: FastifyInstance;
let close: () => Promise<void>;
let sweepId: string;
let plantedSweepId: string;
let summary: SweepSummary;

interface GridFile { features: { properties: { i: number; j: number; count: number; coverage: number; expected: number | null; kept: boolean }; geometry: { coordinates: number[][][] } }[] }

const asArrayBuffer = (bytes: Buffer): ArrayBuffer => bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;

beforeAll(async () => {
  ({ app, close } = await testApp());
  const scenario = await uploadScenario(app, 'port-calverin');
  const started = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: scenario.id, plan: { cells: [140], placements: 1, sims: 0, seed: 5 } } });
  sweepId = (started.json() as { id: string }).id;
  const finished = await waitForSweep(app, sweepId);
  expect(finished.status).toBe('done');
  summary = finished.summary as SweepSummary;
  // a planted cluster (seeded): 360 points over a 2 km square, 160 in a 120 m square near (1400, 1300)
  let seed = 2024;
  const random = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const rows = ['id,x,y'];
  for (let k = 0; k < 360; k += 1) rows.push(`${k + 1},${random() * 2000},${random() * 2000}`);
  for (let k = 0; k < 160; k += 1) rows.push(`${k + 361},${1400 + (random() - 0.5) * 120},${1300 + (random() - 0.5) * 120}`);
  const body = await multipartBody([{ field: 'points', value: `${rows.join('\n')}\n`, filename: 'points.csv' }, { field: 'crs', value: 'planar' }, { field: 'name', value: 'Planted cluster' }]);
  const planted = (await app.inject({ method: 'POST', url: '/api/datasets', ...body })).json() as { id: string };
  const second = await app.inject({ method: 'POST', url: '/api/sweeps', payload: { datasetId: planted.id, plan: { cells: [200], placements: 1, sims: 0, seed: 5 } } });
  plantedSweepId = (second.json() as { id: string }).id;
  expect((await waitForSweep(app, plantedSweepId)).status).toBe('done');
}, 120_000);
afterAll(async () => close());

describe('typed frames', () => {
  it('round-trip named typed arrays with their header, aligned, and refuse other bytes', () => {
    const bytes = encodeTypedFrame({ a: 1 }, { small: Uint8Array.of(1, 2, 3), wide: Float64Array.of(0.1, Number.NaN, -2), whole: Int32Array.of(-7) });
    const { meta, arrays } = decodeTypedFrame<{ a: number }>(bytes.buffer as ArrayBuffer);
    expect(meta).toEqual({ a: 1 });
    expect([...arrays.small!]).toEqual([1, 2, 3]);
    expect([...arrays.wide!]).toEqual([0.1, Number.NaN, -2]);
    expect([...arrays.whole!]).toEqual([-7]);
    expect(arrays.wide!.byteOffset % 8).toBe(0);
    expect(() => decodeTypedFrame(new Uint8Array(16).buffer)).toThrow(/not a gridshake typed frame/);
  });
});

describe('the page frames of a server sweep', () => {
  it('stability-surface carries the GeoTIFF bands and georeferencing', async () => {
    const entry = summary.stability![0]!;
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/stability-surface?size=${entry.sizeIndex}` });
    expect(response.statusCode).toBe(200);
    expect(response.headers['content-type']).toBe('application/octet-stream');
    const { meta, arrays } = decodeTypedFrame<SurfaceFrameMeta>(asArrayBuffer(response.rawPayload));
    const tif = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/${entry.files.tif}` });
    const image = await (await fromArrayBuffer(asArrayBuffer(tif.rawPayload))).getImage();
    const [excess, deficit] = (await image.readRasters()) as unknown as Float32Array[];
    expect([meta.x0, meta.y0]).toEqual(image.getOrigin().slice(0, 2));
    expect(meta.side).toBe(image.getResolution()[0]);
    expect([meta.width, meta.height]).toEqual([entry.raster.width, entry.raster.height]);
    expect(meta.placements).toBe(1);
    expect(Buffer.from((arrays.excess as Float32Array).buffer, arrays.excess!.byteOffset, arrays.excess!.byteLength)).toEqual(Buffer.from(excess!.buffer, excess!.byteOffset, excess!.byteLength));
    expect(Buffer.from((arrays.deficit as Float32Array).buffer, arrays.deficit!.byteOffset, arrays.deficit!.byteLength)).toEqual(Buffer.from(deficit!.buffer, deficit!.byteOffset, deficit!.byteLength));
  });

  it('grid-frame carries the cells of grid.geojson, and the lattice rebuilds their rings', async () => {
    const response = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/grid-frame?size=0&placement=0` });
    expect(response.statusCode).toBe(200);
    const frame = decodeTypedFrame<GridFrameMeta>(asArrayBuffer(response.rawPayload));
    const grid = gridFromFrame(frame);
    const geojson = (await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/grid.geojson?size=0&placement=0&coordinates=planar` })).json() as GridFile;
    expect(grid.features.length).toBe(geojson.features.length);
    expect(response.rawPayload.length).toBeLessThan(JSON.stringify(geojson).length / 4);
    grid.features.forEach((feature, k) => {
      const expected = geojson.features[k]!;
      const { i, j, count, coverage, kept } = expected.properties;
      expect({ i: feature.properties.i, j: feature.properties.j, count: feature.properties.count, coverage: feature.properties.coverage, kept: feature.properties.kept }).toEqual({ i, j, count, coverage, kept });
      if (expected.properties.expected === null) expect(feature.properties.expected).toBeNaN();
      else expect(feature.properties.expected).toBe(expected.properties.expected);
      const ring = feature.geometry.coordinates[0]!;
      expected.geometry.coordinates[0]!.forEach(([x, y], v) => {
        expect(Math.abs(ring[v]![0]! - x!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(x!)));
        expect(Math.abs(ring[v]![1]! - y!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(y!)));
      });
    });
    expect(frame.meta.alpha).toBe(summary.plan.alpha);
  });

  it("the page's per-cell flags agree with the one-placement surface: excess share 1 exactly on excess cells", async () => {
        const frame = decodeTypedFrame<GridFrameMeta>(asArrayBuffer((await app.inject({ method: 'GET', url: `/api/sweeps/${plantedSweepId}/grid-frame?size=0&placement=0` })).rawPayload));
    const grid = gridFromFrame(frame);
    const byCell = new Map(grid.features.map((feature) => [`${feature.properties.i},${feature.properties.j}`, feature]));
    const surface = decodeTypedFrame<SurfaceFrameMeta>(asArrayBuffer((await app.inject({ method: 'GET', url: `/api/sweeps/${plantedSweepId}/stability-surface?size=0` })).rawPayload));
    const excess = surface.arrays.excess as Float32Array;
    const { meta } = surface;
    const lattice = latticeOf(frame.meta.shape).frame(frame.meta.origin, frame.meta.cellSize, frame.meta.placement);
    let excessPixels = 0;
    let keptPixels = 0;
    for (let row = 0; row < meta.height; row++) {
      for (let col = 0; col < meta.width; col++) {
        const share = excess[row * meta.width + col]!;
        if (!Number.isFinite(share)) continue;
        const [i, j] = lattice.cellOfPoint(meta.x0 + (col + 0.5) * meta.side, meta.y0 - (row + 0.5) * meta.side);
        const feature = byCell.get(`${i},${j}`);
        expect(feature?.properties.kept).toBe(true);
        keptPixels += 1;
        if (feature!.properties.stability === 'excess') {
          excessPixels += 1;
          expect(share).toBe(1);
        } else expect(share).toBe(0);
      }
    }
    expect(keptPixels).toBeGreaterThan(1000);
    // the planted cluster's cell is among the excess cells
    expect(excessPixels).toBeGreaterThan(0);
  });

  it('404 for a size without a surface and for a placement that does not exist', async () => {
    const size = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/stability-surface?size=3` });
    expect(size.statusCode).toBe(404);
    expect(size.json()).toMatchObject({ code: 'GS_ERR_NOT_FOUND' });
    const placement = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/grid-frame?size=0&placement=5` });
    expect(placement.statusCode).toBe(404);
    const bad = await app.inject({ method: 'GET', url: `/api/sweeps/${sweepId}/grid-frame?size=x&placement=0` });
    expect(bad.statusCode).toBe(400);
  });
});
