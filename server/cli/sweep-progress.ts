/** The one-line progress bar of `gridshake sweep` (stderr). */
import type { SweepProgress } from '../../shared/contracts.js';

const WIDTH = 30;

/** e.g. "[#########.....................] 30 % 154/512 placements, 12 s left". */
export function progressLine(progress: SweepProgress): string {
  const share = progress.total > 0 ? progress.done / progress.total : 1;
  const filled = Math.round(share * WIDTH);
  const left = progress.remainingSeconds === null ? '' : `, ${Math.ceil(progress.remainingSeconds)} s left`;
  return `[${'#'.repeat(filled)}${'.'.repeat(WIDTH - filled)}] ${Math.floor(share * 100)} % ${progress.done}/${progress.total} placements${left}`;
}
