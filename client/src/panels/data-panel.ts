/** Step 1: choose a demo scenario or an earlier upload, or upload new files; then see the summary and warnings. */
import { api, type StoredDataset } from '../api/api-client.js';
import type { Store } from '../app-state.js';
import { clear, confirmButton, el, field, message } from '../ui/dom.js';
import { datasetSummaryView } from './dataset-summary-view.js';
import { initEarlierSweeps } from './earlier-sweeps.js';
import { uploadForm } from './upload-form.js';

export function initDataPanel(container: HTMLElement, store: Store): void {
  const select = el('select', { id: 'dataset-select' });
  const useButton = el('button', { type: 'button', class: 'button', id: 'use-dataset' }, 'Use this dataset');
  const status = el('div', { 'aria-live': 'polite' });
  const summary = el('div', { id: 'dataset-summary' });
  const earlier = el('div', { id: 'earlier-sweeps' });
  initEarlierSweeps(earlier, store);
  const upload = el('details', { class: 'upload' }, el('summary', {}, 'Upload your own data'), uploadForm((dataset) => {
    upload.open = false;
    void choose(dataset);
  }));

  async function choose(dataset: StoredDataset): Promise<void> {
    clear(status, message('info', `Loading ${dataset.name}...`));
    try {
      const geometry = await api.geometry(dataset.id);
      store.update({ dataset, geometry, sweepId: null, summary: null, rows: [], sizeIndex: null, placement: null });
      clear(status);
      await refreshList(dataset.id);
    } catch (error) {
      clear(status, message('error', error instanceof Error ? error.message : String(error)));
    }
  }

  async function refreshList(selectedId?: string): Promise<void> {
    const datasets = await api.datasets();
    const demos = datasets.filter((dataset) => dataset.sample);
    const uploads = datasets.filter((dataset) => !dataset.sample);
    const option = (dataset: StoredDataset) =>
      el('option', { value: dataset.id, selected: dataset.id === selectedId }, `${dataset.name} (${dataset.n} points)`);
    clear(
      select,
      demos.length > 0 ? el('optgroup', { label: 'Demo scenarios' }, ...demos.map(option)) : null,
      uploads.length > 0 ? el('optgroup', { label: 'Your uploads' }, ...uploads.map(option)) : null,
    );
    useButton.disabled = datasets.length === 0;
    renderDelete();
    if (datasets.length === 0) clear(status, message('info', 'No datasets yet: upload your own files below.'));
  }

  const deleteBox = el('span', {});
  /** the delete button of the dataset selected in the list (its name in the question) */
  const renderDelete = () => {
    const id = select.value;
    const option = select.selectedOptions[0];
    if (!id || !option) {
      clear(deleteBox);
      return;
    }
    clear(deleteBox, confirmButton('Delete this dataset', `Delete ${option.textContent ?? 'this dataset'} and every sweep run on it?`, async () => {
      await api.deleteDataset(id);
      if (store.state.dataset?.id === id) {
        store.update({ dataset: null, geometry: null, sweepId: null, summary: null, rows: [], sizeIndex: null, placement: null });
      }
      await refreshList();
      clear(status, message('info', 'The dataset and its sweeps were deleted.'));
    }, { id: 'delete-dataset' }));
  };
  select.addEventListener('change', renderDelete);

  useButton.addEventListener('click', async () => {
    if (!select.value) return;
    try {
      await choose(await api.dataset(select.value));
    } catch (error) {
      clear(status, message('error', error instanceof Error ? error.message : String(error)));
    }
  });

  store.subscribe((state, changed) => {
    if (changed.has('dataset')) clear(summary, state.dataset ? datasetSummaryView(state.dataset) : null);
  });

  clear(
    container,
    el('p', {}, 'Start from an invented demo scenario, or bring your own points with a study area and no-data zones.'),
    el('div', { class: 'field-row' }, field('Dataset', select), useButton, deleteBox),
    status,
    upload,
    summary,
    earlier,
  );
  refreshList().catch((error: unknown) => clear(status, message('error', error instanceof Error ? error.message : String(error))));
}
