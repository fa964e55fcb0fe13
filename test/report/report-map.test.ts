/**
 * The report's map figure (issue 9 item 6): study area, no-data zones, points and the reference grid with kept and
 * left-out cells, and the projection. Checked against the dataset as loaded, the engine's own count of kept cells
 * for the reference placement, and an XML parse of the SVG (the report is served as text/html, so the figure must
 * be well-formed on its own).
 */
import { describe, it, expect } from 'vitest';
import { loadDataset } from '../../server/inputs/load-dataset.js';
import { reportMap, reportMapSvg, scaleBarMetres, MAP_MAX_CELLS } from '../../server/report/report-map.js';
import { renderReport } from '../../server/report/render-report.js';
import { summarizeDataset } from '../../server/inputs/summarize-dataset.js';
import { createCellCounter, evaluatePlacement } from '../../workers/placement/index.js';
import { insideCoordinates } from '../../server/inputs/inside-coordinates.js';
import { sampleFile } from '../server/server-helpers.js';
import { makeSize, makeSummary } from '../client/summary-fixture.js';

const dataset = loadDataset(
  {
    points: { name: 'points.csv', content: sampleFile('brannock-heath', 'points.csv') },
    area: { name: 'area.geojson', content: sampleFile('brannock-heath', 'area.geojson') },
    noData: [{ name: 'no-data.geojson', content: sampleFile('brannock-heath', 'no-data.geojson') }],
  },
  { crs: 'planar' },
);

function summaryFor(cellSizes: number[]) {
  const summary = makeSummary(cellSizes.map((cellSize, sizeIndex) => makeSize({ sizeIndex, cellSize })));
  summary.dataset = summarizeDataset(dataset);
  summary.plan = { ...summary.plan, minCoverage: 0.5 };
  return summary;
}

describe('report map', () => {
  it('draws the smallest size with a readable grid, kept and left-out cells as the engine counts them', () => {
    const map = reportMap(dataset, summaryFor([10, 80, 200]));
    // 10 m cells over about 2 km give far more than MAP_MAX_CELLS: the 80 m grid is drawn
    expect(map.grid?.cellSize).toBe(80);
    const engine = evaluatePlacement({
      counter: createCellCounter(insideCoordinates(dataset), dataset.origin),
      region: dataset.region,
      origin: dataset.origin,
      cellSize: 80,
      placement: { u: 0, v: 0, angle: 0 },
      minCoverage: 0.5,
      alpha: 0.05,
    });
    const kept = map.grid!.cells.filter((cell) => cell.kept).length;
    expect(kept).toBe(engine.stats.cells);
    expect(map.grid!.cells.length).toBeGreaterThan(kept);
    expect(map.points.length / 2).toBe(dataset.ids.length);
    expect(map.gridNote).toContain(`${kept} kept (solid)`);
  });

  it('is well-formed SVG with the study area, hatched zones, every point, both kinds of cells and the projection', () => {
    const map = reportMap(dataset, summaryFor([80]));
    const svg = reportMapSvg(map);
    const body = svg.slice(svg.indexOf('<svg'), svg.indexOf('</svg>') + 6);
    expect(new DOMParserLike(body).ok).toBe(true);
    expect((svg.match(/<circle /g) ?? []).length).toBe(dataset.ids.length);
    const kept = map.grid!.cells.filter((cell) => cell.kept).length;
    const keptPath = /class="kept" d="([^"]+)"/.exec(svg)![1]!;
    expect((keptPath.match(/M/g) ?? []).length).toBe(kept);
    expect(svg).toMatch(/class="left-out" d="M[^"]+" fill="none" stroke="#9a9a9a" stroke-width="0.7" stroke-dasharray="3 2"/);
    expect(svg).toContain('fill="url(#map-hatch)"');
    expect(svg).toContain('coordinates: planar');
  });

  it('says so when every size has too many cells', () => {
    const map = reportMap(dataset, summaryFor([5]));
    expect(map.grid).toBeNull();
    expect(map.gridNote).toBe(`no reference grid drawn: every cell size of this sweep has more than ${MAP_MAX_CELLS} cells`);
  });

  it('goes into the report under its own heading', () => {
    const summary = summaryFor([80]);
    const html = renderReport(summary, [], reportMap(dataset, summary));
    expect(html).toContain('<section><h2>Map</h2><figure class="map"><svg');
  });

  it('scale bar of 1, 2 or 5 times a power of ten, at most a fifth of the width', () => {
    expect(scaleBarMetres(2000)).toBe(200);
    expect(scaleBarMetres(3000)).toBe(500);
    expect(scaleBarMetres(80)).toBe(10);
  });
});

/** A minimal well-formedness check: every tag closes in order (the SVG uses no comments, CDATA or entities but &amp;). */
class DOMParserLike {
  ok: boolean;
  constructor(xml: string) {
    const stack: string[] = [];
    let ok = true;
    for (const match of xml.matchAll(/<(\/?)([a-zA-Z][\w-]*)([^>]*?)(\/?)>/g)) {
      const [, closing, name, , selfClosing] = match;
      if (selfClosing) continue;
      if (closing) ok = ok && stack.pop() === name;
      else stack.push(name!);
    }
    this.ok = ok && stack.length === 0;
  }
}
