/** Builders of the InputWarning objects the inputs attach to a dataset (never silent: the CLI prints them all). */
import type { InputWarning } from '../contracts.js';

/** How many record ids a warning carries at most; the message gives the full count. */
export const WARNING_ID_LIMIT = 50;

export function defaultAreaWarning(width: number, height: number): InputWarning {
  return {
    code: 'default-study-area',
    message:
      `no study area given: the points' bounding box (${width.toFixed(1)} m x ${height.toFixed(1)} m) is used, ` +
      'which leaves out any empty margin of the real study area (and so can understate clustering); give it with --area',
  };
}

export function duplicateWarning(duplicates: number, ids: string[]): InputWarning {
  return {
    code: 'duplicate-points',
    message: `${duplicates} point(s) repeat the coordinates of an earlier point; they are kept and counted`,
    ids: ids.slice(0, WARNING_ID_LIMIT),
  };
}

export function outsideWarning(outside: number, total: number, ids: string[]): InputWarning {
  const shown = ids.length > WARNING_ID_LIMIT ? ` (first ${WARNING_ID_LIMIT} ids listed)` : '';
  return {
    code: 'points-outside',
    message:
      `${outside} of ${total} point(s) lie outside the valid region (outside the study area or inside a no-data ` +
      `zone) and are never counted${shown}`,
    ids: ids.slice(0, WARNING_ID_LIMIT),
  };
}

export function projectionWarning(message: string): InputWarning {
  return { code: 'projection', message };
}
