/** The map's layer switches: one labelled checkbox per layer, optional layers included once they exist. */
import { el } from '../ui/dom.js';
import type { GridshakeMap } from './gridshake-map.js';

export function layerList(map: GridshakeMap, container: HTMLElement): () => void {
  const render = () => {
    const boxes = map.layers().map((entry) => {
      const box = el('input', { type: 'checkbox', id: `layer-toggle-${entry.id}`, 'data-layer': entry.id });
      box.checked = entry.layer.getVisible();
      box.addEventListener('change', () => map.setVisible(entry.id, box.checked));
      return el('label', { class: 'layer-toggle', for: box.id }, box, ` ${entry.label}`);
    });
    const focused = document.activeElement instanceof HTMLInputElement ? document.activeElement.id : null;
    container.replaceChildren(el('fieldset', { class: 'map-layers' }, el('legend', {}, 'Layers'), ...boxes));
    if (focused) document.getElementById(focused)?.focus();
  };
  render();
  return render;
}
