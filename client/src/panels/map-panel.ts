/**
 * The map aside: draws the dataset, and the chosen placement's grid with its caption and colour key. Also the
 * `pick` action the charts call: fetch GET /api/sweeps/:id/grid.geojson?size=K&placement=J and show it.
 */
import { verdictWords } from '../../../shared/verdict-words.js';
import { api } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { formatMetres, formatNumber } from '../../../shared/format.js';
import { NEUTRAL, OKABE_ITO, sequentialGradientCss } from '../../../shared/charts/palette.js';
import { MapCanvas } from '../map/map-canvas.js';
import { clear, el } from '../ui/dom.js';

export function initMapPanel(canvas: HTMLCanvasElement, caption: HTMLElement, legend: HTMLElement, store: Store): (sizeIndex: number, placementIndex: number) => Promise<void> {
  const map = new MapCanvas(canvas);
  const swatch = (style: string, text: string) => {
    const box = el('span', { class: 'swatch', 'aria-hidden': 'true' });
    box.style.background = style;
    return el('span', { class: 'legend-item' }, box, text);
  };

  store.subscribe((state, changed) => {
    if (changed.has('geometry')) {
      map.showDataset(state.geometry);
      const geometry = state.geometry;
      caption.textContent = geometry && state.dataset
        ? `${state.dataset.name}: study area, no-data zones (hatched) and ${geometry.points.length / 2} of ${geometry.totalPoints} points${geometry.stride > 1 ? ` (every ${geometry.stride}th drawn)` : ''}.`
        : 'No dataset yet.';
      clear(legend, swatch('#eef3f7', 'study area'), swatch(`repeating-linear-gradient(45deg, ${NEUTRAL.grey} 0 2px, #fff 2px 6px)`, 'no-data zone'), swatch(NEUTRAL.ink, 'point'), swatch(OKABE_ITO.reddishPurple, 'point outside (not counted)'));
    }
    if (changed.has('placement') && !changed.has('geometry')) {
      const placement = state.placement;
      map.showGrid(placement?.grid ?? null);
      canvas.dataset.gridCells = String(placement?.grid.features.length ?? 0);
      if (placement && state.summary) {
        const size = state.summary.sizes.find((candidate) => candidate.sizeIndex === placement.sizeIndex);
        const row = state.rows.find((candidate) => candidate.sizeIndex === placement.sizeIndex && candidate.placementIndex === placement.placementIndex);
        const kept = placement.grid.features.filter((cell) => cell.properties.kept).length;
        const leftOut = placement.grid.features.length - kept;
        caption.textContent =
          `Placement ${placement.placementIndex} at ${size ? formatMetres(size.cellSize) : '?'}: ` +
          (row ? `offset (${formatNumber(row.u)}, ${formatNumber(row.v)}), angle ${formatNumber(row.angle)} degrees, VMR ${formatNumber(row.vmr)}, ${verdictWords(row.verdict)}; ` : '') +
          `${kept} cells kept, ${leftOut} left out (hatched); counts 0 to ${map.maxCount()}.`;
        const ramp = el('span', { class: 'ramp', 'aria-hidden': 'true' });
        ramp.style.background = sequentialGradientCss();
        clear(legend, el('span', { class: 'legend-item' }, 'count 0', ramp, String(map.maxCount())), swatch(`repeating-linear-gradient(45deg, ${OKABE_ITO.vermillion} 0 2px, #fff 2px 6px)`, 'cell left out (coverage below minCoverage)'), swatch(`repeating-linear-gradient(45deg, ${NEUTRAL.grey} 0 2px, #fff 2px 6px)`, 'no-data zone'));
      }
    }
  });

  return async (sizeIndex, placementIndex) => {
    const sweepId = store.state.sweepId;
    if (!sweepId) return;
    caption.textContent = `Loading the grid of placement ${placementIndex}...`;
    try {
      const grid = await api.grid(sweepId, sizeIndex, placementIndex);
      store.update({ placement: { sizeIndex, placementIndex, grid } });
    } catch (error) {
      caption.textContent = `Could not load the grid: ${error instanceof Error ? error.message : String(error)}`;
    }
  };
}
