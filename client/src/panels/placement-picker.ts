/**
 * Keyboard-operable ways to show a placement's grid on the map: the reference grid, the lowest and highest VMR
 * placements of the chosen size, or any placement by number.
 */
import type { SizeSummary } from '../../../shared/contracts.js';
import { formatNumber } from '../../../shared/format.js';
import { el } from '../ui/dom.js';

export function placementPicker(size: SizeSummary, onPick: (placementIndex: number) => void): HTMLElement {
  const button = (text: string, placementIndex: number, id: string) => {
    const element = el('button', { type: 'button', class: 'button button-small', id, 'data-placement': placementIndex }, text);
    element.addEventListener('click', () => onPick(placementIndex));
    return element;
  };
  const number = el('input', { type: 'number', id: 'placement-number', min: 0, max: size.placements - 1, step: 1, value: 0, class: 'narrow' });
  const show = el('button', { type: 'button', class: 'button button-small', id: 'show-placement' }, 'Show');
  show.addEventListener('click', () => {
    const value = Number(number.value);
    if (Number.isInteger(value) && value >= 0 && value < size.placements) onPick(value);
  });
  return el(
    'div',
    { class: 'placement-picker', role: 'group', 'aria-label': 'Show a placement on the map' },
    el('span', {}, 'Show on the map:'),
    button(`reference grid (VMR ${formatNumber(size.reference.vmr)})`, size.reference.placementIndex, 'pick-reference'),
    button(`lowest VMR (${formatNumber(size.lowestVmr.vmr)})`, size.lowestVmr.placementIndex, 'pick-lowest'),
    button(`highest VMR (${formatNumber(size.highestVmr.vmr)})`, size.highestVmr.placementIndex, 'pick-highest'),
    el('label', { for: number.id }, 'placement number'),
    number,
    show,
  );
}
