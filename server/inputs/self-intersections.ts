/**
 * Self-intersections of a polygon (crossing edges, or a vertex lying on another edge), found with an R-tree of the
 * edges by geojson-polygon-self-intersections (the finder @turf/boolean-valid uses): cost about O(n log n) for n
 * edges plus the intersections, where turf.kinks compares every pair of edges (O(n^2): minutes at 1e5 vertices).
 * Edges that share an end point (neighbours, or rings touching at a vertex) are not reported.
 */
import { createRequire } from 'node:module';

type Position = number[];
interface PolygonFeature {
  type: 'Feature';
  geometry: { type: 'Polygon'; coordinates: Position[][] };
}
type Finder = (
  feature: PolygonFeature,
  filter: (intersection: Position) => Position,
  options: { useSpatialIndex: boolean; reportVertexOnVertex: boolean; reportVertexOnEdge: boolean; epsilon: number },
) => Position[];

const require = createRequire(import.meta.url);
const findIntersections = require('geojson-polygon-self-intersections') as Finder;

/** The distinct points where the polygon's rings (closed, GeoJSON order) intersect themselves or each other. */
export function selfIntersections(rings: Position[][]): Position[] {
  const found = findIntersections(
    { type: 'Feature', geometry: { type: 'Polygon', coordinates: rings } },
    (intersection) => intersection,
    { useSpatialIndex: true, reportVertexOnVertex: false, reportVertexOnEdge: true, epsilon: 0 },
  );
  const seen = new Set<string>();
  return found.filter((point) => {
    const key = point.join(',');
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
