/**
 * The report's section on the placement-stable areas: a methods paragraph (per-placement excess / deficit cells by
 * exact Poisson tails and Benjamini-Hochberg, the share over placements, calibration by the simulated maximum), the
 * privacy caution for the surface, a table per cell size, a table of the areas and, with the report's map data, one
 * map figure per cell size that has areas (study area outline, excess areas red, deficit areas blue; colour-blind
 * safe pair of the Okabe-Ito palette).
 */
import type { StabilitySizeSummary, SweepSummary } from '../../shared/contracts.js';
import { formatMetres, formatNumber } from '../../shared/format.js';
import { escapeHtml } from './html-escape.js';
import { htmlTable } from './html-table.js';
import type { ReportMap } from './report-map.js';

/** Most area rows listed in the report (the GeoJSON files hold all). */
const MAX_AREA_ROWS = 60;
const WIDTH = 560;

export const STABILITY_METHODS =
  'Placement-stable areas. In every placement, each kept cell is tested one-sided against its expected count ' +
  '(E = N a / sum a, N the points in kept cells, a the coverage) with exact Poisson tails, P(X >= O) for excess and ' +
  'P(X <= O) for deficit, and the multiplicity across the placement\'s cells is controlled by the Benjamini-Hochberg ' +
  'procedure at alpha, separately for excess and deficit cells. A raster over the valid region (pixel side about an ' +
  'eighth of the cell side, at most about 4 million pixels) records at each pixel centre the share of placements in ' +
  'which its cell is an excess cell, among the placements in which it lies in a kept cell (likewise for deficit). ' +
  'Pixels kept in at least half of the placements are assessed. Each simulated null pattern of the Monte Carlo test, ' +
  'evaluated at the same placements, gives the largest share anywhere on its map; an assessed pixel belongs to a ' +
  'stable area when its share exceeds the (1 - alpha/2) quantile of these maxima (the k-th largest of R, ' +
  'k = floor(alpha/2 (R + 1)); ties count against the pixel), separately for excess and deficit, so that on null data ' +
  'a map shows any stable area in at most alpha of data sets. Pixels sharing a side are merged into areas. Without ' +
  'simulations the share surface is written but no area is calibrated. Expected counts share the observed points ' +
  'among the cells, so a strong excess in one place lowers the other cells relative to their expectation: deficit ' +
  'areas beside a strong cluster are read together with it.';

export const STABILITY_REFERENCES = [
  'Y. Benjamini and Y. Hochberg (1995). Controlling the false discovery rate: a practical and powerful approach to multiple testing. Journal of the Royal Statistical Society B 57:289-300.',
  'J. Besag and P. J. Diggle (1977). Simple Monte Carlo tests for spatial pattern. Applied Statistics 26:327-333.',
];

export const STABILITY_PRIVACY =
  'The stability surface and its areas are fine maps: with pixels an eighth of a cell wide, a small area can single ' +
  'out a household or a few addresses. Share stability-*.tif, the area files and this report only as you would share ' +
  'the point records; coarsen or withhold them where the records are sensitive. A stable area marks where counts ' +
  'were high (or low) under almost every grid placement: it is not a cause, and it is only as good as the records.';

function sideOf(entry: StabilitySizeSummary): string {
  return `${formatMetres(entry.cellSize)}${entry.shape === 'hex' ? ' (hexagons)' : ''}`;
}

function mapFigure(entry: StabilitySizeSummary, map: ReportMap): string {
  const [minX, minY, maxX, maxY] = map.bbox;
  const scale = WIDTH / (maxX - minX || 1);
  const height = Math.max(1, Math.round((maxY - minY) * scale));
  const px = (x: number): string => ((x - minX) * scale).toFixed(1);
  const py = (y: number): string => ((maxY - y) * scale).toFixed(1);
  const ringPath = (ring: number[][]): string => `M${ring.map(([x, y]) => `${px(x!)} ${py(y!)}`).join('L')}Z`;
  const outline = map.studyArea.map((polygon) => polygon.map(ringPath).join('')).join('');
  const zones = map.noDataZones.map((polygon) => polygon.map(ringPath).join('')).join('');
  const paths = (kind: 'excess' | 'deficit'): string => entry.areas.filter((area) => area.kind === kind).map((area) => area.rings.map(ringPath).join('')).join('');
  const excess = paths('excess');
  const deficit = paths('deficit');
  return (
    `<figure class="map"><svg xmlns="http://www.w3.org/2000/svg" role="img" aria-label="Stable areas, cell side ${escapeHtml(sideOf(entry))}" ` +
    `viewBox="-10 -10 ${WIDTH + 20} ${height + 20}" width="100%" style="max-width:${WIDTH + 20}px">` +
    `<path d="${outline}" fill="#f4f1e8" stroke="#222" stroke-width="1.2" fill-rule="evenodd"/>` +
    (zones ? `<path d="${zones}" fill="#d9d9d9" stroke="#666" stroke-width="0.8" fill-rule="evenodd"/>` : '') +
    (excess ? `<path class="excess" d="${excess}" fill="#d55e00" fill-opacity="0.75" stroke="#8a3c00" stroke-width="0.8" fill-rule="evenodd"/>` : '') +
    (deficit ? `<path class="deficit" d="${deficit}" fill="#0072b2" fill-opacity="0.75" stroke="#004a75" stroke-width="0.8" fill-rule="evenodd"/>` : '') +
    `</svg><figcaption>${escapeHtml(`Placement-stable areas, cell side ${sideOf(entry)}: excess (orange), deficit (blue), no-data zones (grey). North is up.`)}</figcaption></figure>`
  );
}

export function stabilitySection(summary: SweepSummary, map?: ReportMap): string {
  const entries = [...(summary.stability ?? [])].sort((a, b) => a.cellSize - b.cellSize);
  if (entries.length === 0) return '';
  const total = (entry: StabilitySizeSummary, kind: 'excess' | 'deficit'): string => {
    const areas = entry.areas.filter((area) => area.kind === kind);
    return areas.length === 0 ? 'none' : `${areas.length} (${formatNumber(areas.reduce((sum, area) => sum + area.areaKm2, 0))} km2)`;
  };
  const sizeRows = entries.map((entry) => [
    sideOf(entry),
    `${formatMetres(entry.raster.side)} (${entry.raster.width} x ${entry.raster.height})`,
    String(entry.sims),
    entry.excessThreshold === null ? 'n/a' : formatNumber(entry.excessThreshold),
    formatNumber(entry.maxExcessShare),
    total(entry, 'excess'),
    entry.deficitThreshold === null ? 'n/a' : formatNumber(entry.deficitThreshold),
    formatNumber(entry.maxDeficitShare),
    total(entry, 'deficit'),
  ]);
  const sizeHead = ['cell side', 'pixel', 'sims', 'excess threshold', 'largest excess share', 'excess areas', 'deficit threshold', 'largest deficit share', 'deficit areas'];
  const areaRows = entries.flatMap((entry) => entry.areas.map((area) => [sideOf(entry), area.kind, formatNumber(area.maxShare), formatNumber(area.areaKm2)]));
  const areaTable = areaRows.length === 0
    ? '<p>No placement-stable area at any cell size.</p>'
    : htmlTable(
        areaRows.length > MAX_AREA_ROWS ? `Stable areas (the first ${MAX_AREA_ROWS} of ${areaRows.length}; the GeoJSON files hold all)` : 'Stable areas',
        ['cell side', 'kind', 'largest share', 'area (km2)'],
        areaRows.slice(0, MAX_AREA_ROWS),
      );
  const notes = entries.map((entry) => `<li>${escapeHtml(`${sideOf(entry)}: ${entry.note} Files: ${entry.files.tif}, ${entry.files.geojson}.`)}</li>`).join('');
  const figures = map ? entries.filter((entry) => entry.areas.length > 0).map((entry) => mapFigure(entry, map)).join('\n') : '';
  return (
    '<section class="stability"><h2>Where: placement-stable areas</h2>' +
    `<div class="cautions"><p>${escapeHtml(STABILITY_PRIVACY)}</p></div>` +
    `<p>${escapeHtml(STABILITY_METHODS)}</p>` +
    htmlTable('Stability surface per cell size', sizeHead, sizeRows) +
    areaTable +
    figures +
    `<ul class="notes">${notes}</ul>` +
    `<h3>References</h3><ol>${STABILITY_REFERENCES.map((reference) => `<li>${escapeHtml(reference)}</li>`).join('')}</ol></section>`
  );
}
