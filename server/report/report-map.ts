/**
 * The report's map figure as inline SVG (no script, no network): the study area, the no-data zones (hatched), the
 * points (at most MAP_MAX_POINTS, an even subsample, drawn small) and the reference grid (angle 0, offset 0,0) of
 * one cell size with kept cells outlined and left-out cells dashed. North is up; planar metres of the working
 * system, with a scale bar. The cell size drawn is the smallest of the sweep whose grid has at most MAP_MAX_CELLS
 * cells (a readable map); with none, the map says so and draws no grid.
 */
import { describeCellGrid, createCellCounter, cellAt } from '../../workers/placement/index.js';
import { createBaselineWeigher } from '../../workers/baseline/baseline-weights.js';
import { gridExtent } from '../../workers/geometry/coverage.js';
import type { Dataset, SweepSummary } from '../../shared/contracts.js';
import { formatMetres } from '../../shared/format.js';
import { insideCoordinates } from '../inputs/inside-coordinates.js';
import { escapeHtml } from './html-escape.js';

export const MAP_MAX_CELLS = 5000;
export const MAP_MAX_POINTS = 5000;
const WIDTH = 720;

export interface ReportMap {
  /** [minX, minY, maxX, maxY] of the study area, planar metres */
  bbox: [number, number, number, number];
  studyArea: number[][][][];
  noDataZones: number[][][][];
  /** interleaved x, y of the points drawn */
  points: number[];
  pointsTotal: number;
  /** the reference grid drawn, or null with the reason */
  grid: { cellSize: number; cells: { corners: [number, number][]; kept: boolean }[] } | null;
  gridNote: string;
  projectionUsed: string;
}

/** The map's content from the dataset and the sweep's summary. Cost O(n + cells of the chosen size). */
export function reportMap(dataset: Dataset, summary: SweepSummary): ReportMap {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const polygon of dataset.studyArea) for (const ring of polygon) for (const [x, y] of ring) {
    minX = Math.min(minX, x!);
    maxX = Math.max(maxX, x!);
    minY = Math.min(minY, y!);
    maxY = Math.max(maxY, y!);
  }
  const n = dataset.xy.length / 2;
  const step = Math.max(1, Math.ceil(n / MAP_MAX_POINTS));
  const points: number[] = [];
  for (let k = 0; k < n; k += step) points.push(dataset.xy[2 * k]!, dataset.xy[2 * k + 1]!);
  const reference = { u: 0, v: 0, angle: 0 };
  const candidates = [...summary.sizes].sort((a, b) => a.cellSize - b.cellSize);
  const chosen = candidates.find((size) => {
    const box = gridExtent(dataset.region, dataset.origin, size.cellSize, reference);
    return box.nx * box.ny <= MAP_MAX_CELLS;
  });
  let grid: ReportMap['grid'] = null;
  let gridNote: string;
  if (chosen === undefined) {
    gridNote = `no reference grid drawn: every cell size of this sweep has more than ${MAP_MAX_CELLS} cells`;
  } else {
    const described = describeCellGrid({
      counter: createCellCounter(insideCoordinates(dataset), dataset.origin),
      region: dataset.region,
      origin: dataset.origin,
      cellSize: chosen.cellSize,
      placement: reference,
      minCoverage: summary.plan.minCoverage,
      shape: chosen.shape,
      baseline: dataset.baseline === undefined ? undefined : createBaselineWeigher(dataset.baseline.engine, dataset.origin),
    });
    const cells: { corners: [number, number][]; kept: boolean }[] = [];
    for (let k = 0; k < described.grid.coverage.length; k++) {
      const cell = cellAt(described, k);
      if (cell !== null) cells.push({ corners: cell.corners, kept: cell.kept });
    }
    grid = { cellSize: chosen.cellSize, cells };
    const kept = cells.filter((cell) => cell.kept).length;
    gridNote =
      `reference grid of ${formatMetres(chosen.cellSize)} ${chosen.shape === 'hex' ? 'hexagonal ' : ''}cells (angle 0, offset 0,0): ${kept} kept (solid), ` +
      `${cells.length - kept} left out with coverage below ${summary.plan.minCoverage} (dashed)`;
  }
  return {
    bbox: [minX, minY, maxX, maxY],
    studyArea: dataset.studyArea,
    noDataZones: dataset.noDataZones,
    points,
    pointsTotal: n,
    grid,
    gridNote,
    projectionUsed: summary.dataset.projectionUsed ?? dataset.crs,
  };
}

/** A scale bar length: 1, 2 or 5 times a power of ten, about a fifth of the width. */
export function scaleBarMetres(width: number): number {
  const target = width / 5;
  const power = 10 ** Math.floor(Math.log10(target));
  return [5, 2, 1].map((m) => m * power).find((length) => length <= target) ?? power;
}

/** The map as an SVG element (a string), sized WIDTH pixels wide. */
export function reportMapSvg(map: ReportMap): string {
  const [minX, minY, maxX, maxY] = map.bbox;
  const width = maxX - minX || 1;
  const height = maxY - minY || 1;
  const scale = WIDTH / width;
  const pixelHeight = Math.max(1, Math.round(height * scale));
  const margin = 30;
  const px = (x: number): string => ((x - minX) * scale).toFixed(1);
  const py = (y: number): string => ((maxY - y) * scale).toFixed(1);
  const ringPath = (ring: number[][]): string => `M${ring.map(([x, y]) => `${px(x!)} ${py(y!)}`).join('L')}Z`;
  const polygonPath = (polygon: number[][][]): string => polygon.map(ringPath).join('');
  const area = map.studyArea.map(polygonPath).join('');
  const zones = map.noDataZones.map(polygonPath).join('');
  const keptCells = (map.grid?.cells ?? []).filter((cell) => cell.kept).map((cell) => ringPath(cell.corners)).join('');
  const leftOut = (map.grid?.cells ?? []).filter((cell) => !cell.kept).map((cell) => ringPath(cell.corners)).join('');
  const radius = map.points.length / 2 > 1000 ? 1 : 1.8;
  const dots: string[] = [];
  for (let k = 0; k < map.points.length; k += 2) dots.push(`<circle cx="${px(map.points[k]!)}" cy="${py(map.points[k + 1]!)}" r="${radius}"/>`);
  const bar = scaleBarMetres(width);
  const barPixels = bar * scale;
  const drawn = map.points.length / 2;
  const caption =
    `Study area (outline), no-data zones (hatched), ${drawn === map.pointsTotal ? `all ${drawn} points` : `${drawn} of ${map.pointsTotal} points (an even subsample)`}` +
    `; ${map.gridNote}. North is up; coordinates: ${map.projectionUsed}. ` +
    'The points are drawn where they were recorded: share this report only as you would share the point records.';
  return (
    `<figure class="map"><svg xmlns="http://www.w3.org/2000/svg" role="img" aria-label="Map of the study area, no-data zones, points and reference grid" ` +
    `viewBox="${-margin} ${-margin} ${WIDTH + 2 * margin} ${pixelHeight + 2 * margin + 20}" width="100%" style="max-width:${WIDTH + 2 * margin}px">` +
    `<defs><pattern id="map-hatch" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">` +
    `<line x1="0" y1="0" x2="0" y2="6" stroke="#6b6b6b" stroke-width="1.5"/></pattern></defs>` +
    `<path d="${area}" fill="#f4f1e8" stroke="#222" stroke-width="1.5" fill-rule="evenodd"/>` +
    (leftOut ? `<path class="left-out" d="${leftOut}" fill="none" stroke="#9a9a9a" stroke-width="0.7" stroke-dasharray="3 2"/>` : '') +
    (keptCells ? `<path class="kept" d="${keptCells}" fill="none" stroke="#0072b2" stroke-width="0.8"/>` : '') +
    (zones ? `<path class="zones" d="${zones}" fill="url(#map-hatch)" stroke="#444" stroke-width="1" fill-rule="evenodd"/>` : '') +
    `<g class="points" fill="#d55e00">${dots.join('')}</g>` +
    `<g class="scale-bar" transform="translate(0 ${pixelHeight + 14})"><rect width="${barPixels.toFixed(1)}" height="4" fill="#222"/>` +
    `<text x="${(barPixels + 6).toFixed(1)}" y="5" font-size="11" font-family="system-ui, sans-serif">${escapeHtml(formatMetres(bar))}</text></g>` +
    `</svg><figcaption>${escapeHtml(caption)}</figcaption></figure>`
  );
}
