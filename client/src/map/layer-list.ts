/**
 * The map's layer switches: one labelled checkbox per layer, optional layers included once they exist. Layers of a
 * group (the stability surface and areas of the chosen cell size) get their own fieldset under the main list.
 */
import { el } from '../ui/dom.js';
import type { GridshakeMap, MapLayerEntry } from './gridshake-map.js';

export function layerList(map: GridshakeMap, container: HTMLElement): () => void {
  const render = () => {
    const toggle = (entry: MapLayerEntry) => {
      const box = el('input', { type: 'checkbox', id: `layer-toggle-${entry.id}`, 'data-layer': entry.id });
      box.checked = entry.layer.getVisible();
      box.addEventListener('change', () => map.setVisible(entry.id, box.checked));
      return el('label', { class: 'layer-toggle', for: box.id }, box, ` ${entry.label}`);
    };
    const entries = map.layers();
    const groups = [...new Set(entries.flatMap((entry) => (entry.group === undefined ? [] : [entry.group])))];
    const focused = document.activeElement instanceof HTMLInputElement ? document.activeElement.id : null;
    container.replaceChildren(
      el('fieldset', { class: 'map-layers' }, el('legend', {}, 'Layers'), ...entries.filter((entry) => entry.group === undefined).map(toggle)),
      ...groups.map((group) => el('fieldset', { class: 'map-layer-group' }, el('legend', {}, group), ...entries.filter((entry) => entry.group === group).map(toggle))),
    );
    if (focused) document.getElementById(focused)?.focus();
  };
  render();
  return render;
}
