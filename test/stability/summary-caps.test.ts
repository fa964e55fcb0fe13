/**
 * summary.json keeps the stable areas small (server/stability/stability-summary.ts): at most MAX_SUMMARY_AREAS areas
 * and MAX_SUMMARY_VERTICES ring vertices per cell size, with `truncated` and `areasTotal` when it leaves anything out;
 * the areas' GeoJSON (sweep --out and the server's stored file) keeps every area with its full outline. The outlines
 * are checked closed, counter-clockwise (RFC 7946 section 3.1.6, shoelace sign) and with the pixels' area; a small one
 * with @turf/turf booleanValid (OGC simple features validity; too slow for the 20000-vertex comb).
 */
import { booleanValid, polygon } from '@turf/turf';
import { describe, expect, it } from 'vitest';
import type { StabilitySurface } from '../../server/stability/stability-accumulator.js';
import { stabilityFiles } from '../../server/stability/stability-files.js';
import { MAX_SUMMARY_AREAS, MAX_SUMMARY_VERTICES, stabilitySummary } from '../../server/stability/stability-summary.js';
import { storeStabilityFiles } from '../../server/stability/stored-stability.js';
import type { GridshakeStore } from '../../server/store/store.js';
import { calibratedSurface, shoelace } from './surface-stubs.js';

type Ring = [number, number][];
interface AreasFile {
  features: { properties: { kind: string; maxShare: number; areaKm2: number }; geometry: { coordinates: Ring[] } }[];
}

/** A calibrated surface whose stable excess pixels are `mask`; the share grows with the pixel index. */
function surfaceWith(width: number, height: number, mask: Uint8Array): StabilitySurface {
  return calibratedSurface({ x0: 1000, y0: 9000, side: 10, width, height }, mask, (p) => 0.5 + (0.4 * p) / (width * height));
}

/** Every other pixel of every other row: isolated one-pixel areas (5 ring vertices each). */
function scattered(width: number, height: number): Uint8Array {
  const mask = new Uint8Array(width * height);
  for (let row = 0; row < height; row += 2) for (let col = 0; col < width; col += 2) mask[row * width + col] = 1;
  return mask;
}

/**
 * A comb: a full top row with a tooth under every other pixel (one area of 4 vertices per tooth), and one lone pixel
 * far below it with a smaller share.
 */
function comb(teeth: number): { width: number; height: number; mask: Uint8Array } {
  const width = 2 * teeth;
  const height = 5;
  const mask = new Uint8Array(width * height);
  for (let col = 0; col < width; col++) mask[col] = 1;
  for (let col = 0; col < width; col += 2) mask[width + col] = 1;
  mask[4 * width] = 1;
  return { width, height, mask };
}

const vertices = (rings: Ring[]): number => rings.reduce((sum, ring) => sum + ring.length, 0);

describe('stable areas in summary.json are capped; the areas GeoJSON has them all', () => {
  it('a few areas: listed in full, no truncated flag, the note as without caps', () => {
    const surface = surfaceWith(8, 8, scattered(8, 8));
    const summary = stabilitySummary(surface, 0, false);
    expect(summary.areas).toHaveLength(16);
    expect(summary.areas.every((area) => area.rings.length === 1 && area.rings[0]!.length === 5)).toBe(true);
    expect('truncated' in summary).toBe(false);
    expect('areasTotal' in summary).toBe(false);
    expect(summary.note).not.toMatch(/summary\.json lists/);
  });

  it('more areas than MAX_SUMMARY_AREAS: the first ones listed (largest share first), the rest counted; the file has every one', () => {
    const surface = surfaceWith(80, 60, scattered(80, 60)); // 40 x 30 = 1200 one-pixel areas
    const summary = stabilitySummary(surface, 0, false);
    expect(summary.truncated).toBe(true);
    expect(summary.areasTotal).toBe(1200);
    expect(summary.areas).toHaveLength(MAX_SUMMARY_AREAS);
    const shares = summary.areas.map((area) => area.maxShare);
    expect(shares).toEqual([...shares].sort((a, b) => b - a));
    expect(summary.note).toContain(`summary.json lists ${MAX_SUMMARY_AREAS} of the 1200 areas`);
    expect(summary.note).toContain(summary.files.geojson);
    const [, [name, content]] = stabilityFiles([surface], [summary], { kind: 'planar' }, 'invented') as [unknown, [string, string]];
    expect(name).toBe(summary.files.geojson);
    const file = JSON.parse(content) as AreasFile;
    expect(file.features).toHaveLength(1200);
    expect(file.features.every((feature) => shoelace(feature.geometry.coordinates[0]!) === 100)).toBe(true);
    expect(booleanValid(polygon(file.features[0]!.geometry.coordinates))).toBe(true);
  });

  it('an outline past MAX_SUMMARY_VERTICES: kept without rings, a later small area keeps its ring; the file has the full outline', () => {
    const teeth = Math.ceil(MAX_SUMMARY_VERTICES / 4) + 10;
    const { width, height, mask } = comb(teeth);
    const surface = surfaceWith(width, height, mask);
    const summary = stabilitySummary(surface, 0, false);
    expect(summary.truncated).toBe(true);
    expect(summary.areasTotal).toBe(2);
    expect(summary.areas).toHaveLength(2);
    const [big, lone] = [...summary.areas].sort((a, b) => b.areaKm2 - a.areaKm2) as [(typeof summary.areas)[0], (typeof summary.areas)[0]];
    expect(big.rings).toEqual([]);
    expect(big.areaKm2).toBeCloseTo((3 * teeth * 100) / 1e6, 12);
    expect(lone.rings).toHaveLength(1);
    expect(vertices(summary.areas.flatMap((area) => area.rings))).toBeLessThanOrEqual(MAX_SUMMARY_VERTICES);
    expect(summary.note).toContain('and the outlines of 1 (at most');
    const [, [, content]] = stabilityFiles([surface], [summary], { kind: 'planar' }, 'invented') as [unknown, [string, string]];
    const file = JSON.parse(content) as AreasFile;
    expect(file.features).toHaveLength(2);
    const outline = file.features.map((feature) => feature.geometry.coordinates).sort((a, b) => vertices(b) - vertices(a))[0]!;
    expect(vertices(outline)).toBeGreaterThan(MAX_SUMMARY_VERTICES);
    expect(outline[0]![0]).toEqual(outline[0]![outline[0]!.length - 1]);
    expect(shoelace(outline[0]!)).toBe(3 * teeth * 100);
  });

  it('the server stores the areas GeoJSON with every outline when the sweep is done (summary.json capped)', () => {
    const { width, height, mask } = comb(Math.ceil(MAX_SUMMARY_VERTICES / 4) + 10);
    const surface = surfaceWith(width, height, mask);
    const entry = stabilitySummary(surface, 0, false);
    const written = new Map<string, Uint8Array>();
    const store = { stability: { write: (_id: string, name: string, content: Uint8Array) => written.set(name, content) } } as unknown as GridshakeStore;
    storeStabilityFiles(store, 'sweep-1', { summary: { stability: [entry] } as never, stability: [surface] }, { kind: 'planar' }, 'invented');
    expect([...written.keys()].sort()).toEqual([entry.files.geojson, entry.files.tif].sort());
    const file = JSON.parse(new TextDecoder().decode(written.get(entry.files.geojson))) as AreasFile;
    expect(file.features).toHaveLength(2);
    expect(Math.max(...file.features.map((feature) => vertices(feature.geometry.coordinates)))).toBeGreaterThan(MAX_SUMMARY_VERTICES);
  });
});
