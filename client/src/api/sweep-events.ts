/**
 * Follows a sweep's progress over server-sent events (GET /api/sweeps/:id/events): `progress` events with
 * { status, progress }, then one `end` event with the final status. Closes itself after the end.
 */
import type { SweepProgress, SweepStatus } from '../../../shared/contracts.js';

export interface SweepEventHandlers {
  onProgress: (status: SweepStatus, progress: SweepProgress) => void;
  onEnd: (status: SweepStatus, progress: SweepProgress | null, error: string | null) => void;
}

export function followSweep(id: string, handlers: SweepEventHandlers): () => void {
  const source = new EventSource(`/api/sweeps/${id}/events`);
  let ended = false;
  source.addEventListener('progress', (event) => {
    const data = JSON.parse((event as MessageEvent<string>).data) as { status: SweepStatus; progress: SweepProgress };
    handlers.onProgress(data.status, data.progress);
  });
  source.addEventListener('end', (event) => {
    ended = true;
    source.close();
    const data = JSON.parse((event as MessageEvent<string>).data) as { status: SweepStatus; progress: SweepProgress | null; error: string | null };
    handlers.onEnd(data.status, data.progress, data.error);
  });
  source.addEventListener('error', () => {
    // EventSource reconnects on its own; a stream that ended normally is already closed.
    if (ended) source.close();
  });
  return () => source.close();
}
