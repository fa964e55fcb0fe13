/**
 * Step 3: the run. A progress bar fed by the sweep's server-sent events (done of total, elapsed and remaining
 * time) and a cancel button; when the sweep is done, its summary and placement rows are loaded for the results.
 */
import type { SweepProgress, SweepStatus } from '../../../shared/contracts.js';
import { api } from '../api/api-client.js';
import { followSweep } from '../api/sweep-events.js';
import type { Store } from '../app-state.js';
import { formatDuration } from '../../../shared/format.js';
import { clear, el, message } from '../ui/dom.js';

const STATUS_WORDS: Record<SweepStatus, string> = {
  queued: 'Waiting for the workers',
  running: 'Running',
  done: 'Finished',
  failed: 'Failed',
  cancelled: 'Cancelled',
  interrupted: 'Interrupted (the server stopped)',
};

export function initRunPanel(container: HTMLElement, store: Store): void {
  let stopFollowing: (() => void) | null = null;
  store.subscribe((state, changed) => {
    if (!changed.has('sweepId')) return;
    stopFollowing?.();
    stopFollowing = null;
    if (state.sweepId) stopFollowing = follow(container, store, state.sweepId);
    else clear(container, el('p', { class: 'hint' }, 'Start a sweep from the plan.'));
  });
}

function follow(container: HTMLElement, store: Store, sweepId: string): () => void {
  const bar = el('progress', { id: 'run-progress', max: 1, value: 0, 'aria-labelledby': 'run-progress-label' });
  const label = el('p', { id: 'run-progress-label', class: 'progress-label' }, 'Starting...');
  const times = el('p', { id: 'run-times', class: 'progress-times' }, '');
  const cancel = el('button', { type: 'button', class: 'button', id: 'cancel-sweep' }, 'Cancel the sweep');
  const outcome = el('div', { id: 'run-outcome', 'aria-live': 'polite' });
  clear(container, el('div', { class: 'run-box', 'data-sweep': sweepId }, label, bar, times, cancel, outcome));

  const show = (status: SweepStatus, progress: SweepProgress | null) => {
    if (progress) {
      bar.max = Math.max(1, progress.total);
      bar.value = progress.done;
      bar.setAttribute('aria-valuetext', `${progress.done} of ${progress.total} done`);
      label.textContent = `${STATUS_WORDS[status]}: ${progress.done} of ${progress.total} placements done (all cell sides together)`;
      times.textContent = `Elapsed ${formatDuration(progress.elapsedSeconds)}, remaining ${progress.remainingSeconds === null ? 'unknown' : formatDuration(progress.remainingSeconds)}`;
    } else {
      label.textContent = STATUS_WORDS[status];
    }
  };

  cancel.addEventListener('click', async () => {
    cancel.disabled = true;
    try {
      await api.cancelSweep(sweepId);
    } catch (error) {
      clear(outcome, message('error', error instanceof Error ? error.message : String(error)));
      cancel.disabled = false;
    }
  });

  return followSweep(sweepId, {
    onProgress: (status, progress) => show(status, progress),
    onEnd: async (status, progress, error) => {
      show(status, progress);
      cancel.disabled = true;
      container.querySelector('.run-box')?.setAttribute('data-status', status);
      if (status !== 'done') {
        clear(outcome, message(status === 'cancelled' ? 'info' : 'error', status === 'cancelled' ? 'The sweep was cancelled; it has no results.' : `The sweep ended: ${STATUS_WORDS[status]}${error ? `: ${error}` : ''}`));
        return;
      }
      bar.value = bar.max;
      try {
        const [record, rows] = await Promise.all([api.sweep(sweepId), api.placements(sweepId)]);
        if (!record.summary) throw new Error('the finished sweep has no summary');
        const first = [...record.summary.sizes].sort((a, b) => a.cellSize - b.cellSize)[0];
        store.update({ summary: record.summary, rows, sizeIndex: first?.sizeIndex ?? null, placement: null });
        clear(outcome, message('info', 'Done: the results are below.'));
      } catch (loadError) {
        clear(outcome, message('error', loadError instanceof Error ? loadError.message : String(loadError)));
      }
    },
  });
}
