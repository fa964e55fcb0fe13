/**
 * fast-check generators of hostile study areas and no-data zones around a fixed, valid set of points: rings with too
 * few positions, unclosed rings, self-intersections (bow-ties, random vertex orders), zero-area rings, repeated
 * vertices, holes outside their shell, zones outside the area or covering it, huge and non-finite coordinates, wrong
 * geometry types and wrappers; in planar metres or in longitude/latitude (the same shapes scaled to a small patch).
 */
import fc from 'fast-check';
import type { HostileCase } from './hostile-outcome.js';

type Position = [number, number];
type RawRing = unknown[];

const NON_FINITE = '__non_finite__';
const unit = (min: number, max: number): fc.Arbitrary<number> => fc.double({ min, max, noNaN: true });

const close = (ring: Position[]): Position[] => [...ring, ring[0]];

const rectangle = fc
  .tuple(unit(-50, 150), unit(-50, 150), unit(0, 150), unit(0, 150))
  .map(([x, y, w, h]): RawRing => close([[x, y], [x + w, y], [x + w, y + h], [x, y + h]]));

const randomOrder = fc
  .array(fc.tuple(unit(-20, 120), unit(-20, 120)), { minLength: 3, maxLength: 12 })
  .map((corners): RawRing => close(corners as Position[]));

const star = fc
  .tuple(unit(10, 90), unit(10, 90), fc.array(unit(5, 60), { minLength: 3, maxLength: 60 }))
  .map(([cx, cy, radii]): RawRing => {
    const corners = radii.map((r, k): Position => {
      const angle = (2 * Math.PI * k) / radii.length;
      return [cx + r * Math.cos(angle), cy + r * Math.sin(angle)];
    });
    return close(corners);
  });

const broken: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(
    [[0, 0], [10, 10], [10, 0], [0, 10], [0, 0]],
    [[0, 0], [100, 0], [0, 100]],
    [[0, 0], [50, 50], [100, 100], [0, 0]],
    [[0, 0], [100, 0], [100, 0], [100, 100], [0, 100], [0, 0]],
    [[0, 0], [100, 0], [100, 100], [0, 100]],
    [[0, 0], [1e308, 0], [1e308, 1e308], [0, 1e308], [0, 0]],
    [[-1e300, -1e300], [1e300, -1e300], [1e300, 1e300], [-1e300, 1e300], [-1e300, -1e300]],
    [[0, 0], [NON_FINITE, 0], [100, 100], [0, 100], [0, 0]],
    [[0, 0], ['100', 0], [100, 100], [0, 100], [0, 0]],
    [[0, 0], [100], [100, 100], [0, 100], [0, 0]],
    [],
    [[0, 0]],
    'ring',
  ),
  randomOrder.map((ring) => ring.slice(0, -1)),
);

const ring: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: rectangle },
  { weight: 3, arbitrary: star },
  { weight: 2, arbitrary: randomOrder },
  { weight: 2, arbitrary: broken },
);

const polygon = fc.tuple(ring, fc.array(ring, { maxLength: 2 })).map(([shell, holes]) => [shell, ...holes]);

const geometry: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 6, arbitrary: polygon.map((coordinates) => ({ type: 'Polygon', coordinates })) },
  { weight: 2, arbitrary: fc.array(polygon, { maxLength: 3 }).map((coordinates) => ({ type: 'MultiPolygon', coordinates })) },
  { weight: 1, arbitrary: fc.constantFrom({ type: 'Point', coordinates: [1, 2] }, { type: 'Polygon' }, { type: 'Polygon', coordinates: [] }, null) },
);

const wrapped: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: geometry },
  { weight: 3, arbitrary: geometry.map((g) => ({ type: 'Feature', id: 'zone', properties: {}, geometry: g })) },
  {
    weight: 3,
    arbitrary: fc.array(geometry, { maxLength: 3 }).map((gs) => ({
      type: 'FeatureCollection',
      features: gs.map((g, k) => ({ type: 'Feature', id: k, properties: {}, geometry: g })),
    })),
  },
);

/** Map unit-square shapes (0..100) to longitude/latitude near an invented site at (10 E, 45 N), 1 km across. */
function toLonLat(value: unknown): unknown {
  if (typeof value === 'number') return value;
  if (!Array.isArray(value)) {
    if (value !== null && typeof value === 'object') {
      return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, k === 'coordinates' ? toLonLatCoordinates(v) : toLonLat(v)]));
    }
    return value;
  }
  return value.map(toLonLat);
}

function toLonLatCoordinates(value: unknown): unknown {
  if (!Array.isArray(value)) return value;
  if (value.length === 2 && typeof value[0] === 'number' && typeof value[1] === 'number') {
    return [10 + value[0] * 1.27e-4, 45 + value[1] * 0.9e-4];
  }
  return value.map(toLonLatCoordinates);
}

const render = (value: unknown): string => (JSON.stringify(value) ?? 'null').split(`"${NON_FINITE}"`).join('NaN');

/** Fixed, valid points in the unit square (0..100): a 6 x 6 lattice with a little jitter. */
function latticePoints(lonLat: boolean): string {
  const rows: string[] = [];
  for (let k = 0; k < 36; k += 1) {
    const x = 5 + 16 * (k % 6) + (k % 5);
    const y = 5 + 16 * Math.floor(k / 6) + (k % 3);
    rows.push(lonLat ? `${10 + x * 1.27e-4},${45 + y * 0.9e-4}` : `${x},${y}`);
  }
  return `${lonLat ? 'lon,lat' : 'x,y'}\n${rows.join('\n')}\n`;
}

/** Hostile polygon cases: an optional study area and 0..3 no-data zones around valid points. */
export const hostilePolygonCase: fc.Arbitrary<HostileCase> = fc
  .record({ area: fc.option(wrapped, { nil: undefined, freq: 6 }), zones: fc.array(wrapped, { maxLength: 3 }), lonLat: fc.boolean() })
  .map(({ area, zones, lonLat }) => {
    const shape = (value: unknown): string => render(lonLat ? toLonLat(value) : value);
    const areaText = area === undefined ? undefined : shape(area);
    return {
      label: `polygons ${lonLat ? 'lonlat' : 'planar'} area ${String(areaText).slice(0, 120)} zones ${zones.length}`,
      input: {
        points: { name: 'pts.csv', content: latticePoints(lonLat) },
        area: areaText === undefined ? undefined : { name: 'area.geojson', content: areaText },
        noData: zones.map((zone, k) => ({ name: `zone-${k + 1}.geojson`, content: shape(zone) })),
      },
      options: lonLat ? {} : { crs: 'planar' },
    };
  });

/** A closed circular ring of `vertices` corners centred at (cx, cy) with radius r. */
export function circleRing(vertices: number, cx: number, cy: number, r: number): Position[] {
  const corners: Position[] = [];
  for (let k = 0; k < vertices; k += 1) {
    const angle = (2 * Math.PI * k) / vertices;
    corners.push([cx + r * Math.cos(angle), cy + r * Math.sin(angle)]);
  }
  return close(corners);
}
