/** The sweeps already run on the chosen dataset (the demo scenarios come with one), to open their results. */
import { api, type SweepRecord } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { formatMetres } from '../../../shared/format.js';
import { clear, confirmButton, el } from '../ui/dom.js';

function describePlan(record: SweepRecord): string {
  const sides = record.plan.cells ? record.plan.cells.map((side) => formatMetres(side)).join(', ') : `${record.plan.perCell?.join(', ')} points per cell`;
  return `${sides}; ${record.plan.placements} placements; ${record.plan.sims} simulations; seed ${record.plan.seed}`;
}

export function initEarlierSweeps(container: HTMLElement, store: Store): void {
  const render = async (datasetId: string) => {
    const records = (await api.sweeps(datasetId)).filter((record) => record.status !== 'running' && record.status !== 'queued');
    if (records.length === 0) {
      clear(container);
      return;
    }
    clear(
      container,
      el('h3', {}, 'Sweeps already run on this dataset'),
      el(
        'ul',
        { class: 'sweep-list' },
        ...records.map((record) => {
          const open = record.status === 'done' ? el('button', { type: 'button', class: 'button button-small', 'data-open-sweep': record.id }, 'Open the results') : null;
          open?.addEventListener('click', () => store.update({ sweepId: record.id, summary: null, rows: [], sizeIndex: null, placement: null }));
          const remove = confirmButton('Delete', 'Delete this sweep and its results?', async () => {
            await api.deleteSweep(record.id);
            if (store.state.sweepId === record.id) store.update({ sweepId: null, summary: null, rows: [], sizeIndex: null, placement: null });
            await render(datasetId);
          }, { 'data-delete-sweep': record.id });
          const status = record.status === 'done' ? '' : ` (${record.status})`;
          return el('li', {}, open, ' ', `${describePlan(record)}${status} `, remove);
        }),
      ),
    );
  };
  store.subscribe((state, changed) => {
    if (changed.has('dataset') && !state.dataset) clear(container);
    if (changed.has('dataset') && state.dataset) render(state.dataset.id).catch(() => clear(container));
    if (changed.has('summary') && state.summary && state.dataset) render(state.dataset.id).catch(() => clear(container));
  });
}
