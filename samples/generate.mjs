#!/usr/bin/env node
/**
 * Generates the invented demo scenarios of gridshake (every place, species and record is made up):
 *   ostrevan-reservoir  nests of the (invented) Ostrevan reed-piper: small colonies spaced evenly around a reservoir
 *                       (clustered at small cell sizes, close to CSR at large ones)
 *   port-calverin       reported bicycle thefts in an (invented) harbour town: uniform on land (consistent with CSR)
 *   brannock-heath      mounds of an (invented) heath ant with exclusion zones (regular at the mound spacing)
 * Seeded (mulberry32), so running it again writes identical files: `node samples/generate.mjs`.
 * Coordinates are planar metres on an invented local site grid (crs planar), not longitude/latitude.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const HERE = dirname(fileURLToPath(import.meta.url));

/** mulberry32: a small 32-bit seeded generator (Tommy Ettinger, 2017, public domain), uniform in [0, 1). */
// Also in test/fixtures/seeded-random.ts, apart on purpose: this script runs alone with plain node, outside the build.
function mulberry32(seed) {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate by the Box-Muller transform (Box and Muller, 1958). */
function gaussian(random) {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

/** Even-odd ray casting point-in-polygon test on a closed ring [[x, y], ...]. */
function inRing(ring, x, y) {
  let inside = false;
  for (let a = 0, b = ring.length - 1; a < ring.length; b = a++) {
    const [xa, ya] = ring[a];
    const [xb, yb] = ring[b];
    if (ya > y !== yb > y && x < ((xb - xa) * (y - ya)) / (yb - ya) + xa) inside = !inside;
  }
  return inside;
}

/** A closed, counter-clockwise wobbly ring around (cx, cy) with radii rx, ry and a few harmonics. */
function blob(cx, cy, rx, ry, vertices, harmonics) {
  const ring = [];
  for (let k = 0; k < vertices; k++) {
    const t = (2 * Math.PI * k) / vertices;
    const wobble = 1 + harmonics.reduce((sum, [order, amplitude, phase]) => sum + amplitude * Math.sin(order * t + phase), 0);
    ring.push([round(cx + rx * wobble * Math.cos(t)), round(cy + ry * wobble * Math.sin(t))]);
  }
  ring.push(ring[0]);
  return ring;
}

function round(value) {
  return Math.round(value * 10) / 10;
}

function polygonCollection(rings, name) {
  return {
    type: 'FeatureCollection',
    name,
    features: rings.map((ring, index) => ({
      type: 'Feature',
      properties: { name: `${name} ${index + 1}` },
      geometry: { type: 'Polygon', coordinates: [ring] },
    })),
  };
}

function writeScenario(folder, { points, area, zones, zoneName, card }) {
  const target = join(HERE, folder);
  mkdirSync(target, { recursive: true });
  const lines = ['id,x,y', ...points.map((point) => `${point.id},${round(point.x)},${round(point.y)}`)];
  writeFileSync(join(target, 'points.csv'), `${lines.join('\n')}\n`);
  writeFileSync(join(target, 'area.geojson'), `${JSON.stringify(polygonCollection([area], 'study area'), null, 1)}\n`);
  writeFileSync(join(target, 'no-data.geojson'), `${JSON.stringify(polygonCollection(zones, zoneName), null, 1)}\n`);
  writeFileSync(join(target, 'README.md'), card);
  return points.length;
}

const isValid = (area, zones) => (x, y) => inRing(area, x, y) && !zones.some((zone) => inRing(zone, x, y));

/** Records placed on no-data ground on purpose (geocoding slips): reported by gridshake, never counted. */
function slips(random, zone, count, prefix, start) {
  const xs = zone.map((p) => p[0]);
  const ys = zone.map((p) => p[1]);
  const found = [];
  while (found.length < count) {
    const x = Math.min(...xs) + random() * (Math.max(...xs) - Math.min(...xs));
    const y = Math.min(...ys) + random() * (Math.max(...ys) - Math.min(...ys));
    if (inRing(zone, x, y)) found.push({ id: `${prefix}${String(start + found.length).padStart(4, '0')}`, x, y });
  }
  return found;
}

/**
 * Ostrevan reservoir: a cluster process whose parents (colonies) sit on a jittered 300 m lattice, 4 nests per
 * colony with a Gaussian spread of 25 m (a Thomas-type process, Thomas 1949, with regular parents jittered by 60 m):
 * counts are over-dispersed in cells up to about 200 m and close to Poisson in cells of 400 to 600 m.
 */
function reservoir() {
  const random = mulberry32(20240611);
  const area = blob(2600, 1900, 2500, 1800, 40, [[2, 0.05, 0.3], [3, 0.04, 1.1], [5, 0.02, 2.0]]);
  const water = blob(2450, 1850, 820, 520, 48, [[2, 0.12, 0.8], [3, 0.08, 0.2], [4, 0.05, 1.7]]);
  const valid = isValid(area, [water]);
  const points = [];
  const spacing = 300;
  for (let gx = 0; gx < 5200; gx += spacing) {
    for (let gy = 0; gy < 3800; gy += spacing) {
      const cx = gx + spacing / 2 + 60 * gaussian(random);
      const cy = gy + spacing / 2 + 60 * gaussian(random);
      if (!valid(cx, cy)) continue;
      for (let k = 0; k < 4; k++) {
        const x = cx + 25 * gaussian(random);
        const y = cy + 25 * gaussian(random);
        if (valid(x, y)) points.push({ id: `N${String(points.length + 1).padStart(4, '0')}`, x, y });
      }
    }
  }
  points.push(...slips(random, water, 3, 'N', points.length + 1));
  return { points, area, zones: [water], zoneName: 'reservoir water' };
}

/** Port Calverin: a binomial (uniform) process on the town's land: CSR by construction. */
function harbourTown() {
  const random = mulberry32(1871);
  const area = [[0, 0], [3200, 0], [3400, 900], [3300, 2600], [200, 2700], [-150, 1400], [0, 0]];
  const harbour = [[1200, 1500], [1500, 1150], [2100, 1100], [2550, 1300], [2700, 1800], [2750, 2550],
    [1500, 2600], [1250, 2100], [1200, 1500]];
  const valid = isValid(area, [harbour]);
  const points = [];
  while (points.length < 900) {
    const x = -150 + random() * 3550;
    const y = random() * 2700;
    if (valid(x, y)) points.push({ id: `T${String(points.length + 1).padStart(4, '0')}`, x, y });
  }
  points.push(...slips(random, harbour, 4, 'T', points.length + 1));
  return { points, area, zones: [harbour], zoneName: 'harbour water' };
}

/**
 * Brannock Heath: simple sequential inhibition (Diggle, Besag and Gleaves, 1976) with inhibition distance 55 m:
 * mounds never closer than 55 m, so counts are under-dispersed at cell sizes near the spacing.
 */
function heath() {
  const random = mulberry32(5150);
  const area = blob(1000, 750, 1000, 740, 36, [[3, 0.03, 0.4], [4, 0.03, 1.2]]);
  const quarry = [[1250, 350], [1600, 420], [1560, 780], [1220, 700], [1250, 350]];
  const valid = isValid(area, [quarry]);
  const points = [];
  const distance = 55;
  for (let attempt = 0; attempt < 40000 && points.length < 360; attempt++) {
    const x = random() * 2000;
    const y = random() * 1500;
    if (!valid(x, y)) continue;
    if (points.every((p) => (p.x - x) ** 2 + (p.y - y) ** 2 >= distance ** 2)) {
      points.push({ id: `M${String(points.length + 1).padStart(3, '0')}`, x, y });
    }
  }
  return { points, area, zones: [quarry], zoneName: 'fenced quarry' };
}

const INVENTED = 'All places, species, people and records in this scenario are invented for demonstration; no real data.';

const SCENARIOS = [
  {
    folder: 'ostrevan-reservoir',
    name: 'Reed-piper nests, Ostrevan Reservoir (invented)',
    build: reservoir,
    demoPlan: { cells: [100, 150, 200, 300, 400, 600], placements: 64, rotation: true, sims: 19, seed: 1 },
    card: (n) => `# Reed-piper nests around Ostrevan Reservoir (invented data)

${INVENTED}

**Story.** A volunteer survey mapped ${n} nests of the Ostrevan reed-piper, a small marsh bird, in the reed beds and
meadows around Ostrevan Reservoir. The birds nest in small colonies of three to five nests within about 50 m;
the colonies themselves keep their distance from each other, roughly every 300 m. The open water of the reservoir
is a **no-data zone**: no nest can be there. Three records fall on the water; they are slips of the survey's
geocoding, and gridshake reports them and leaves them out of every count.

**Files.** \`points.csv\` (id, x, y in planar metres on an invented local site grid), \`area.geojson\` (the
survey boundary), \`no-data.geojson\` (the reservoir water). Load with crs \`planar\`.

**What an analyst should find.** Counts are strongly over-dispersed (clustered) in cells of 100 to 200 m, at
every grid placement: the colonies show. At 400 to 600 m the verdict turns to "consistent with CSR" for most
placements, because each large cell holds several evenly spaced colonies (and at still larger cells there are
too few cells for the test to say much). The scale of the question decides
the answer; a single grid at one cell size would hide that. The reservoir must be excluded: counting it as
empty cells would make any pattern look clustered.

Generated by \`node samples/generate.mjs\` (seeded; rerunning gives the same files).
`,
  },
  {
    folder: 'port-calverin',
    name: 'Bicycle thefts, Port Calverin (invented)',
    build: harbourTown,
    demoPlan: { perCell: [1.6, 2, 5], placements: 64, rotation: true, sims: 19, seed: 1 },
    card: (n) => `# Reported bicycle thefts in Port Calverin (invented data)

${INVENTED}

**Story.** Port Calverin is a small harbour town. The town's records list ${n} reported bicycle thefts over one
year, each with a street location. The harbour basin is a **no-data zone**: nothing can be stolen on the water.
Four records were geocoded into the harbour by mistake; gridshake reports them and does not count them.

**Files.** \`points.csv\` (id, x, y in planar metres on an invented local grid), \`area.geojson\` (the town
boundary), \`no-data.geojson\` (the harbour water). Load with crs \`planar\`.

**What an analyst should find.** The pattern is consistent with complete spatial randomness at every suggested
cell size (1.6, 2 and 5 expected points per cell): most placements say "csr", a few say "clustered" or "regular"
by chance, about as often as alpha predicts, and the placement-robust Monte Carlo p-values are not small. A
hurried analyst who tried many grids and kept the most "significant" one would report a cluster that is not
there; the Monte Carlo test of the maximum guards against that.

**Cautions.** A statistically significant cluster is not a cause, and a non-significant result does not mean
there is no problem. Results depend on the quality of the records (under-reporting, geocoding). Defer to local
policing guidance and to licensed professionals before acting, and protect the privacy of the people behind
point records: do not publish exact locations.

Generated by \`node samples/generate.mjs\` (seeded; rerunning gives the same files).
`,
  },
  {
    folder: 'brannock-heath',
    name: 'Heath-ant mounds, Brannock Heath (invented)',
    build: heath,
    demoPlan: { cells: [60, 80, 120, 200], placements: 64, rotation: true, sims: 19, seed: 1 },
    card: (n) => `# Heath-ant mounds on Brannock Heath (invented data)

${INVENTED}

**Story.** A heathland survey team mapped ${n} mounds of the Brannock heath ant on an invented heath. Colonies defend the
ground around their mound, so no two mounds lie closer than about 55 m. A fenced quarry in the middle of the
heath could not be surveyed and is a **no-data zone**.

**Files.** \`points.csv\` (id, x, y in planar metres on an invented local grid), \`area.geojson\` (the heath),
\`no-data.geojson\` (the quarry). Load with crs \`planar\`.

**What an analyst should find.** Counts are under-dispersed (VMR below 1, verdict "regular") in cells of about
60 to 200 m, a few times the mound spacing, across nearly all placements; the Monte Carlo p-value for
regularity is at its smallest possible value. Partial cells along the heath edge and the quarry matter here:
keeping them as if whole would add spurious low counts.

Generated by \`node samples/generate.mjs\` (seeded; rerunning gives the same files).
`,
  },
];

const index = SCENARIOS.map((scenario) => {
  const built = scenario.build();
  const n = writeScenario(scenario.folder, { ...built, card: scenario.card(built.points.length) });
  process.stdout.write(`${scenario.folder}: ${n} points\n`);
  return { folder: scenario.folder, name: scenario.name, crs: 'planar', points: n, demoPlan: scenario.demoPlan };
});
writeFileSync(join(HERE, 'scenarios.json'), `${JSON.stringify(index, null, 2)}\n`);
