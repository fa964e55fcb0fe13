/**
 * The map aside: the dataset and the chosen placement's grid on the map (client/src/map/), its caption, legend,
 * layer switches, the cell under the pointer (or under the view's centre, by keyboard: Enter), the PNG export of the
 * view and the privacy caution. Also the `pick` action the charts call: fetch the placement's compact grid
 * (GET /api/sweeps/:id/grid-frame?size=K&placement=J, client/src/map/grid-from-frame.ts) and show it.
 */
import { verdictWords } from '../../../shared/verdict-words.js';
import { api, type GridFeature } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { CAUTIONS, SURFACE_PRIVACY } from '../../../shared/charts/cautions.js';
import { formatMetres, formatNumber } from '../../../shared/format.js';
import { downloadName, fileSlug } from '../../../shared/messages/download-names.js';
import { cellLines } from '../map/cell-readout.js';
import { BASELINE_LAYER_ID, baselineLayerEntry } from '../map/baseline-layer.js';
import { BASEMAP_LAYER_ID, basemapLayerEntry } from '../map/basemap-layer.js';
import { CONTROLS_LAYER_ID, controlsLayerEntry } from '../map/controls-layer.js';
import { GridshakeMap } from '../map/gridshake-map.js';
import { layerList } from '../map/layer-list.js';
import { legendElement } from '../map/map-legend.js';
import { clear, el, message } from '../ui/dom.js';
import { stabilityLines } from '../map/stability-readout.js';
import { gridFromFrame } from '../map/grid-from-frame.js';
import { stabilityLayers } from './stability-layers.js';

/** The privacy caution, shown again beside the map (fine maps and surfaces can single out households). */
const PRIVACY = CAUTIONS.find((caution) => caution.startsWith('Protect the privacy')) ?? CAUTIONS[CAUTIONS.length - 1];

export function initMapPanel(target: HTMLElement, caption: HTMLElement, legend: HTMLElement, tools: HTMLElement, store: Store): (sizeIndex: number, placementIndex: number) => Promise<void> {
  const map = new GridshakeMap(target);
  const layersBox = el('div', { class: 'map-layer-list' });
  const exportButton = el('button', { type: 'button', class: 'button button-small', id: 'map-export' }, 'Download the view (PNG)');
  const exportStatus = el('span', { class: 'field-hint', role: 'status', id: 'map-export-status' });
  const pointer = el('p', { class: 'map-pointer', id: 'map-pointer', 'aria-live': 'off' }, '');
  const cellInfo = el('div', { class: 'map-cell-info', id: 'map-cell-info', 'aria-live': 'polite' }, el('p', { class: 'hint' }, 'Point at a cell of the grid (or focus the map and press Enter for the cell at its centre) to read its numbers.'));
  clear(
    tools,
    layersBox,
    el('div', { class: 'map-actions' }, exportButton, exportStatus),
    cellInfo,
    pointer,
    el('p', { class: 'map-privacy', id: 'map-privacy' }, el('strong', {}, 'Privacy: '), PRIVACY, ' This holds for this map, its PNG and any surface drawn on it. ', SURFACE_PRIVACY),
  );
  const stability = stabilityLayers(map, store, (text) => {
    caption.textContent = text;
  });
  const refreshLayers = layerList(map, layersBox);
  const refreshLegend = () => clear(legend, ...map.legend().map(legendElement));
  map.onLayersChange(() => {
    refreshLayers();
    refreshLegend();
  });
  map.map.on('postrender', () => {
    target.dataset.frameMs = map.lastFrameMs.toFixed(1);
  });

  const placementVerdict = () => {
    const placement = store.state.placement;
    if (!placement) return null;
    return store.state.rows.find((row) => row.sizeIndex === placement.sizeIndex && row.placementIndex === placement.placementIndex)?.verdict ?? null;
  };
  const cellFlag = (cell: GridFeature | null) => {
    const alpha = store.state.placement?.grid.gridshake?.alpha;
    return cell?.properties.stability !== undefined && alpha !== undefined ? { flag: cell.properties.stability, alpha } : null;
  };
  const showCell = (cell: GridFeature | null, at: number[] | null = null) => {
    const lines = [
      ...(cell ? cellLines(cell, placementVerdict()) : []),
      ...(at ? stabilityLines(cellFlag(cell), stability.surface(), stability.areaAt(at[0], at[1]), at[0], at[1]) : []),
    ];
    if (cell) cellInfo.dataset.cell = `${cell.properties.i},${cell.properties.j}`;
    else cellInfo.removeAttribute('data-cell');
    if (lines.length === 0) return;
    clear(cellInfo, el('dl', { class: 'cell-lines' }, ...lines.flatMap((line) => [el('dt', {}, line.name), el('dd', { 'data-field': line.name }, line.value)])));
  };
  const showPointer = (coordinate: number[]) => {
    const toLonLat = map.projection()?.toLonLat;
    const planar = `x ${coordinate[0].toFixed(2)} m, y ${coordinate[1].toFixed(2)} m`;
    if (toLonLat) {
      const [lon, lat] = toLonLat(coordinate[0], coordinate[1]);
      pointer.textContent = `${planar} (longitude ${lon.toFixed(6)}, latitude ${lat.toFixed(6)})`;
    } else pointer.textContent = planar;
  };
  map.map.on('pointermove', (event) => {
    if (event.dragging) return;
    showPointer(event.coordinate);
    showCell(map.cellAt(event.coordinate), event.coordinate);
  });
  map.map.on('singleclick', (event) => showCell(map.cellAt(event.coordinate), event.coordinate));
  target.addEventListener('keydown', (event) => {
    if (event.key !== 'Enter') return;
    const centre = map.map.getView().getCenter() ?? null;
    if (centre) showPointer(centre);
    showCell(map.cellAt(centre), centre);
  });

  exportButton.addEventListener('click', async () => {
    const { dataset, summary, placement } = store.state;
    if (!dataset) {
      exportStatus.textContent = 'Choose a dataset first.';
      return;
    }
    const size = placement && summary ? summary.sizes.find((candidate) => candidate.sizeIndex === placement.sizeIndex) : undefined;
    const name = size && placement
      ? downloadName(dataset.name, [size.cellSize], `map-placement-${placement.placementIndex}`, 'png')
      : `gridshake-${fileSlug(dataset.name)}-map.png`;
    exportButton.disabled = true;
    exportStatus.textContent = 'Drawing the view...';
    try {
      const blob = await map.exportPng({ title: caption.textContent ?? dataset.name, note: `Privacy: ${PRIVACY} ${SURFACE_PRIVACY}` });
      const url = URL.createObjectURL(blob);
      const link = el('a', { href: url, download: name });
      document.body.append(link);
      link.click();
      link.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      exportStatus.textContent = `Saved ${name}.`;
    } catch (error) {
      exportStatus.replaceChildren(message('error', `Could not export the map: ${error instanceof Error ? error.message : String(error)}`));
    } finally {
      exportButton.disabled = false;
    }
  });

  store.subscribe((state, changed) => {
    if (changed.has('geometry')) {
      map.showDataset(state.geometry, state.dataset);
      // the population at risk (issue 15): a choropleth under the grid and the points, in the layer list and legend
      const baseline = baselineLayerEntry(state.geometry);
      if (baseline) map.setOptionalLayer(baseline);
      else map.removeOptionalLayer(BASELINE_LAYER_ID);
      // control points: their own layer, distinct from the cases
      const controls = controlsLayerEntry(state.geometry);
      if (controls) map.setOptionalLayer(controls);
      else map.removeOptionalLayer(CONTROLS_LAYER_ID);
      target.dataset.gridCells = '0';
      const geometry = state.geometry;
      caption.textContent = geometry && state.dataset
        ? `${state.dataset.name}: study area, ${geometry.baseline ? 'population at risk (density per km²), ' : ''}${geometry.controls ? `${geometry.controls.points.length / 2} control points, ` : ''}no-data zones (hatched) and ${geometry.points.length / 2} of ${geometry.totalPoints} points${geometry.stride > 1 ? ` (every ${geometry.stride}th drawn)` : ''}.`
        : 'No dataset yet.';
      refreshLegend();
    }
    if (changed.has('placement') && !changed.has('geometry')) {
      const placement = state.placement;
      map.setGrid(placement?.grid ?? null);
      map.fit();
      target.dataset.gridCells = String(placement?.grid.features.length ?? 0);
      target.dataset.gridShape = placement ? gridShape(placement.grid) : '';
      showCell(null);
      if (placement && state.summary) {
        const size = state.summary.sizes.find((candidate) => candidate.sizeIndex === placement.sizeIndex);
        const row = state.rows.find((candidate) => candidate.sizeIndex === placement.sizeIndex && candidate.placementIndex === placement.placementIndex);
        const kept = placement.grid.features.filter((cell) => cell.properties.kept).length;
        const leftOut = placement.grid.features.length - kept;
        const shape = size?.shape === 'hex' ? 'hexagons' : 'squares';
        caption.textContent =
          `Placement ${placement.placementIndex} at ${size ? formatMetres(size.cellSize) : '?'} (${shape}): ` +
          (row ? `offset (${formatNumber(row.u)}, ${formatNumber(row.v)}), angle ${formatNumber(row.angle)} degrees, VMR ${formatNumber(row.vmr)}, ${verdictWords(row.verdict)}; ` : '') +
          `${kept} cells kept, ${leftOut} left out (hatched); counts 0 to ${map.maxCount()}.`;
      }
      refreshLegend();
    }
  });

  // the user's own tile server, when the server was started with --basemap and the coordinate system is known
  // (after the dataset is on the map: its projection decides)
  store.subscribe((state, changed) => {
    if (!changed.has('geometry') && !changed.has('health')) return;
    const template = state.health?.basemap;
    if (template && state.geometry && map.projection()?.toLonLat) {
      if (!map.layers().some((entry) => entry.id === BASEMAP_LAYER_ID)) map.setOptionalLayer(basemapLayerEntry(template));
    } else map.removeOptionalLayer(BASEMAP_LAYER_ID);
  });

  return async (sizeIndex, placementIndex) => {
    const sweepId = store.state.sweepId;
    if (!sweepId) return;
    caption.textContent = `Loading the grid of placement ${placementIndex}...`;
    try {
      const grid = gridFromFrame(await api.gridFrame(sweepId, sizeIndex, placementIndex));
      store.update({ placement: { sizeIndex, placementIndex, grid } });
    } catch (error) {
      caption.textContent = `Could not load the grid: ${error instanceof Error ? error.message : String(error)}`;
    }
  };
}

/** "hex" when the cells are hexagons (7-point rings), "square" for 5-point rings. */
function gridShape(grid: { features: GridFeature[] }): string {
  const ring = grid.features[0]?.geometry.coordinates[0];
  if (!ring) return '';
  return ring.length === 7 ? 'hex' : 'square';
}
