/**
 * fast-check generators of hostile GeoJSON point files: every root shape (FeatureCollection, Feature, bare geometry,
 * any JSON value), wrong geometry types, positions of the wrong length or type, strings and nulls for numbers,
 * huge, denormal and (as raw text) NaN/Infinity coordinates, odd ids, BOMs, CRLF layout and truncated text.
 */
import fc from 'fast-check';
import type { HostileCase } from './hostile-outcome.js';

const NON_FINITE_TOKEN = '"__non_finite__"';

const coordinate: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 8, arbitrary: fc.double({ min: -170, max: 170, noNaN: true }) },
  { weight: 2, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }) },
  { weight: 1, arbitrary: fc.constantFrom('12.5', 'NaN', 'abc', '', '1e999', null, true, [], {}, 1e308, -1e308, 5e-324) },
  { weight: 1, arbitrary: fc.constant('__non_finite__') },
);

const position: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 8, arbitrary: fc.tuple(coordinate, coordinate) },
  { weight: 1, arbitrary: fc.array(coordinate, { minLength: 0, maxLength: 4 }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
);

const geometry: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: fc.record({ type: fc.constant('Point'), coordinates: position }) },
  { weight: 2, arbitrary: fc.record({ type: fc.constant('MultiPoint'), coordinates: fc.array(position, { maxLength: 5 }) }) },
  {
    weight: 1,
    arbitrary: fc.record({
      type: fc.constantFrom('LineString', 'Polygon', 'point', 'GeometryCollection', 'Circle'),
      coordinates: fc.array(position, { maxLength: 4 }),
    }),
  },
  { weight: 1, arbitrary: fc.constantFrom(null, undefined, 'Point', 7, []) },
  { weight: 1, arbitrary: fc.record({ type: fc.constant('Point') }) },
);

const feature: fc.Arbitrary<unknown> = fc.oneof(
  {
    weight: 8,
    arbitrary: fc.record(
      {
        type: fc.constant('Feature'),
        id: fc.oneof(fc.constantFrom('a', 'b', 'a'), fc.integer({ min: 0, max: 3 }), fc.constantFrom(null, {}, [1])),
        properties: fc.oneof(fc.constant({}), fc.constant(null), fc.jsonValue({ maxDepth: 2 })),
        geometry,
      },
      { requiredKeys: ['type', 'geometry'] },
    ),
  },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
);

const goodFeature = fc
  .record({ id: fc.constantFrom('a', 'b', 'c', 'a', 1, 2), lon: fc.double({ min: 9.99, max: 10.01, noNaN: true }), lat: fc.double({ min: 44.99, max: 45.01, noNaN: true }) })
  .map(({ id, lon, lat }) => ({ type: 'Feature', id, properties: { note: 'survey' }, geometry: { type: 'Point', coordinates: [lon, lat] } }));

/** A valid collection of points near an invented site, with 0..3 of its features replaced by hostile ones. */
const mutatedCollection = fc
  .tuple(fc.array(goodFeature, { minLength: 0, maxLength: 20 }), fc.array(fc.tuple(fc.nat({ max: 40 }), feature), { maxLength: 3 }))
  .map(([features, changes]) => {
    const copy: unknown[] = [...features];
    for (const [at, replacement] of changes) {
      if (copy.length === 0) copy.push(replacement);
      else copy[at % copy.length] = replacement;
    }
    return { type: 'FeatureCollection', features: copy };
  });

const root: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 8, arbitrary: mutatedCollection },
  { weight: 2, arbitrary: fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(feature, { maxLength: 20 }) }) },
  { weight: 1, arbitrary: fc.record({ type: fc.constant('FeatureCollection'), features: fc.jsonValue({ maxDepth: 2 }) }) },
  { weight: 2, arbitrary: feature },
  { weight: 1, arbitrary: geometry },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
);

interface TextVariant {
  bom: boolean;
  pretty: boolean;
  crlf: boolean;
  /** cut the text at this share of its length (1 = whole text) */
  cut: number;
  nonFinite: 'NaN' | 'Infinity' | '-Infinity';
}

const textVariant: fc.Arbitrary<TextVariant> = fc.record({
  bom: fc.boolean(),
  pretty: fc.boolean(),
  crlf: fc.boolean(),
  cut: fc.oneof({ weight: 9, arbitrary: fc.constant(1) }, { weight: 1, arbitrary: fc.double({ min: 0, max: 1, noNaN: true }) }),
  nonFinite: fc.constantFrom('NaN', 'Infinity', '-Infinity'),
});

function renderJson(value: unknown, variant: TextVariant): string {
  let text = JSON.stringify(value, null, variant.pretty ? 2 : undefined) ?? 'undefined';
  text = text.split(NON_FINITE_TOKEN).join(variant.nonFinite);
  if (variant.crlf) text = text.replace(/\n/g, '\r\n');
  if (variant.cut < 1) text = text.slice(0, Math.floor(text.length * variant.cut));
  return (variant.bom ? '\uFEFF' : '') + text;
}

/** Hostile GeoJSON point files with their options. */
export const hostileGeoJsonCase: fc.Arbitrary<HostileCase> = fc
  .record({
    value: root,
    variant: textVariant,
    fileName: fc.constantFrom('pts.geojson', 'pts.json', 'pts'),
    crs: fc.constantFrom(undefined, undefined, undefined, 'planar', 'EPSG:4326', 'EPSG:3857'),
  })
  .map(({ value, variant, fileName, crs }) => {
    const content = renderJson(value, variant);
    return {
      label: `geojson ${fileName} crs ${String(crs)} ${content.slice(0, 160)}`,
      input: { points: { name: fileName, content } },
      options: { crs },
    };
  });
