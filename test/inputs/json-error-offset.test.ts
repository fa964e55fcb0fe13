import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../server/inputs/index.js';
import { jsonErrorOffset } from '../../server/inputs/json-error-offset.js';
import { file } from './input-helpers.js';

// The error locator agrees with the platform's JSON.parse (ECMA-404 / RFC 8259) on what is valid JSON.
function parses(text: string): boolean {
  try {
    JSON.parse(text);
    return true;
  } catch {
    return false;
  }
}

describe('jsonErrorOffset', () => {
  it('finds no error in valid JSON and an error exactly when JSON.parse fails after one character is cut', () => {
    fc.assert(
      fc.property(fc.json(), fc.nat(), (text, cut) => {
        expect(jsonErrorOffset(text)).toBeNull();
        const position = cut % (text.length + 1);
        const broken = text.slice(0, position) + text.slice(position + 1);
        expect(jsonErrorOffset(broken) === null).toBe(parses(broken));
      }),
      { seed: 7, numRuns: 2000 },
    );
  });

  it('points at the offending character', () => {
    expect(jsonErrorOffset('{"a": [1, 2,, 3]}')).toBe(12);
    expect(jsonErrorOffset('{"a": 1} x')).toBe(9);
  });

  it('reports a truncated file as ending too early', () => {
    const points = file('pts.geojson', '{"type": "FeatureCollection", "features": [');
    expect(() => loadDataset({ points }, { crs: 'planar' })).toThrow(/^pts\.geojson: invalid JSON at end of file/);
  });
});
