import { describe, it, expect } from 'vitest';
import { StabilityAccumulator, MIN_KEPT_FRACTION } from '../../server/stability/stability-accumulator.js';

const raster = { x0: 0, y0: 400, side: 10, width: 40, height: 40 };
const pixels = Uint32Array.from({ length: 1200 }, (_, k) => 3 * k);
const SIMS = 7;

/** A chunk's stability part: HEAD (placements, k, x, d, e), then the not-kept (q, n) pairs and the simulated (code, q) pairs. */
function part(placements: number, notKept: [number, number][], simulated: [number, number][]): Float64Array {
  return Float64Array.from([placements, notKept.length, 0, 0, simulated.length, ...notKept.flat(), ...simulated.flat()]);
}

describe('StabilityAccumulator: the simulated patterns\' largest shares', () => {
  it('equal the definition computed pixel by pixel (flagged placements / kept placements over pixels kept in at least half of them)', () => {
    // a seeded linear congruential stream (Knuth, TAOCP vol. 2, MMIX constants) for the pairs
    let state = 12345n;
    const next = (n: number): number => {
      state = (state * 6364136223846793005n + 1442695040888963407n) & 0xffffffffffffffffn;
      return Number(state >> 33n) % n;
    };
    const accumulator = new StabilityAccumulator(raster, pixels, SIMS);
    const notKeptTotal = new Float64Array(pixels.length);
    const flagged = Array.from({ length: 2 * SIMS }, () => new Map<number, number>());
    let placements = 0;
    for (let chunk = 0; chunk < 6; chunk++) {
      const inChunk = 4;
      placements += inChunk;
      const notKept = new Map<number, number>();
      for (let k = 0; k < 300; k++) {
        const q = next(pixels.length);
        if ((notKept.get(q) ?? 0) < inChunk) notKept.set(q, (notKept.get(q) ?? 0) + 1);
      }
      const simulated: [number, number][] = [];
      for (let k = 0; k < 900; k++) simulated.push([next(2 * SIMS), next(pixels.length)]);
      for (const [q, n] of notKept) notKeptTotal[q] += n;
      for (const [code, q] of simulated) flagged[code]!.set(q, (flagged[code]!.get(q) ?? 0) + 1);
      accumulator.addChunk(part(inChunk, [...notKept], simulated), 0);
    }
    const surface = accumulator.finish('square', 100, placements, 0.05);
    const least = MIN_KEPT_FRACTION * placements;
    for (let code = 0; code < 2 * SIMS; code++) {
      let expected = 0;
      for (const [q, count] of flagged[code]!) {
        const kept = placements - notKeptTotal[q]!;
        if (kept >= least && kept > 0) expected = Math.max(expected, count / kept);
      }
      const maxima = code % 2 === 0 ? surface.calibration!.excessMaxima : surface.calibration!.deficitMaxima;
      expect(maxima[code >> 1]).toBe(expected);
      expect(expected).toBeGreaterThan(0);
    }
  });

  it('refuses a simulated pair outside the patterns or the valid pixels', () => {
    const accumulator = new StabilityAccumulator(raster, pixels, SIMS);
    expect(() => accumulator.addChunk(part(1, [], [[2 * SIMS, 0]]), 0)).toThrow(/simulated pair \(14, 0\) outside 14 patterns x kinds and 1200 pixels/);
    expect(() => accumulator.addChunk(part(1, [], [[0, 1200]]), 0)).toThrow(/outside/);
  });
});
