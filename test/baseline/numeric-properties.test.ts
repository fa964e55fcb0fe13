import { describe, expect, it } from 'vitest';
import { numericProperties } from '../../client/src/panels/numeric-properties.js';

/** The page's field picker lists the properties that are numbers in every feature (RFC 7946 features). */
describe('numericProperties', () => {
  const collection = (properties: unknown[]) =>
    JSON.stringify({ type: 'FeatureCollection', features: properties.map((p) => ({ type: 'Feature', properties: p, geometry: null })) });

  it('keeps numbers and numeric texts present in every feature, in first-seen order', () => {
    expect(numericProperties(collection([{ name: 'a', residents: 10, homes: '4' }, { name: 'b', residents: 0, homes: 3.5 }]))).toEqual(['residents', 'homes']);
  });
  it('drops a property missing, blank or non-numeric in some feature', () => {
    expect(numericProperties(collection([{ a: 1, b: 2, c: 3 }, { a: 1, b: '', c: 'x' }]))).toEqual(['a']);
    expect(numericProperties(collection([{ a: 1, b: 2 }, { a: 1 }]))).toEqual(['a']);
  });
  it('nothing for text that is not GeoJSON or features without properties', () => {
    expect(numericProperties('not json')).toEqual([]);
    expect(numericProperties(collection([null]))).toEqual([]);
    expect(numericProperties(JSON.stringify({ type: 'FeatureCollection', features: [] }))).toEqual([]);
  });
});
