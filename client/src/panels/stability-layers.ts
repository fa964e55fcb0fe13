/**
 * Keeps the map's stability layers (issue 17) in step with the page: for the chosen cell size (the placement on the
 * map, else the size of the detail charts, else the first size with a surface) the excess-share and deficit-share
 * surfaces (GET /api/sweeps/:id/stability-surface?size=K) and the stable areas (summary.stability, planar rings).
 * A layer the user switched on or off stays so when the size changes. The surfaces start off (they cover the grid's
 * shading; the user turns one on), the areas on.
 */
import type { StableAreaSummary } from '../../../shared/contracts.js';
import { api } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import type { GridshakeMap } from '../map/gridshake-map.js';
import { AREAS_LAYER_ID, stableAreasEntry, type StableAreasEntry } from '../map/stable-areas-layer.js';
import { SURFACE_LAYER_IDS, surfaceLayerEntry, type StabilitySurfaceData } from '../map/surface-layer.js';

export interface StabilityLayers {
  surface: () => StabilitySurfaceData | null;
  areaAt: (x: number, y: number) => StableAreaSummary | null;
}

export function stabilityLayers(map: GridshakeMap, store: Store, onError: (message: string) => void): StabilityLayers {
  let shown: string | null = null;
  let surface: StabilitySurfaceData | null = null;
  let areas: StableAreasEntry | null = null;
  const visible = new Map<string, boolean>([[SURFACE_LAYER_IDS.excess, false], [SURFACE_LAYER_IDS.deficit, false]]);
  const ids = [SURFACE_LAYER_IDS.excess, SURFACE_LAYER_IDS.deficit, AREAS_LAYER_ID];
  const remember = () => {
    for (const entry of map.layers()) if (ids.includes(entry.id)) visible.set(entry.id, entry.layer.getVisible());
  };
  const add = (entry: Parameters<GridshakeMap['setOptionalLayer']>[0]) => {
    entry.layer.setVisible(visible.get(entry.id) ?? true);
    map.setOptionalLayer(entry);
  };

  const update = async (): Promise<void> => {
    const { summary, sweepId, placement, sizeIndex } = store.state;
    const entries = summary?.stability ?? [];
    const wanted = placement?.sizeIndex ?? sizeIndex ?? entries[0]?.sizeIndex;
    const entry = entries.find((candidate) => candidate.sizeIndex === wanted) ?? null;
    const key = entry !== null && sweepId !== null ? `${sweepId}:${entry.sizeIndex}` : null;
    if (key === shown) return;
    remember();
    shown = key;
    surface = null;
    areas = null;
    for (const id of ids) map.removeOptionalLayer(id);
    if (key === null || entry === null || sweepId === null) return;
    areas = stableAreasEntry(entry);
    add(areas);
    try {
      const data = await api.stabilitySurface(sweepId, entry.sizeIndex);
      if (shown !== key) return;
      surface = data;
      add(surfaceLayerEntry(data, 'excess'));
      add(surfaceLayerEntry(data, 'deficit'));
      map.element.dataset.surfaceSize = String(entry.sizeIndex);
    } catch (error) {
      onError(`Could not load the stability surface: ${error instanceof Error ? error.message : String(error)}`);
    }
  };

  store.subscribe((_, changed) => {
    if (changed.has('summary') || changed.has('sweepId') || changed.has('placement') || changed.has('sizeIndex')) void update();
  });

  return { surface: () => surface, areaAt: (x, y) => areas?.areaAt(x, y) ?? null };
}
