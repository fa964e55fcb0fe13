/**
 * Fixed inputs of the golden files: an invented district (planar metres) with an invented pond as a no-data zone and
 * 160 seeded points clustered around four invented sites, swept with square and hexagonal cells. Demo data only.
 */
import type { Dataset, Plan } from '../../shared/contracts.js';
import { loadDataset } from '../../server/inputs/index.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { seededRandom } from '../fixtures/seeded-random.js';

const DISTRICT: number[][] = [
  [300000, 5200000],
  [300900, 5200000],
  [301000, 5200600],
  [300400, 5200800],
  [299950, 5200450],
  [300000, 5200000],
];

const POND: number[][] = [
  [300300, 5200200],
  [300500, 5200200],
  [300500, 5200380],
  [300300, 5200380],
  [300300, 5200200],
];

function polygon(ring: number[][]): string {
  return JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } }] });
}

function points(): string {
  const random = seededRandom(11);
  const sites = [
    [300150, 5200150],
    [300700, 5200250],
    [300600, 5200600],
    [300250, 5200550],
  ];
  const lines = ['id,x,y'];
  for (let k = 0; k < 160; k++) {
    const [sx, sy] = sites[k % sites.length];
    const radius = 40 * Math.sqrt(-2 * Math.log(1 - random()));
    const turn = 2 * Math.PI * random();
    lines.push(`p${k + 1},${(sx + radius * Math.cos(turn)).toFixed(2)},${(sy + radius * Math.sin(turn)).toFixed(2)}`);
  }
  return `${lines.join('\n')}\n`;
}

export function goldenDataset(): Dataset {
  return loadDataset(
    {
      points: { name: 'meadow-sightings.csv', content: points() },
      area: { name: 'meadow-district.geojson', content: polygon(DISTRICT) },
      noData: [{ name: 'meadow-pond.geojson', content: polygon(POND) }],
    },
    // UTM zone 33N (metres): the grid exports go out as longitude/latitude and the GeoPackage names the EPSG system
    { crs: 'EPSG:32633' },
  );
}

export function goldenPlan(): Plan {
  return normalizePlan({ cells: [150, 250], placements: 6, sims: 19, seed: 5, shape: ['square', 'hex'] });
}
