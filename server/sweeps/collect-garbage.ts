/**
 * A full garbage collection on demand, for the moments after large temporary arrays (hundreds of MB of sorted
 * coordinates) are dropped: an idle main thread would otherwise keep them while the workers run.
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

/** Points from which the sweep collects garbage after building large temporaries. */
export const COLLECT_FROM_POINTS = 2e6;

export function collectGarbage(): void {
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}
