/** Builders of the InputWarning objects the inputs attach to a dataset (never silent: the CLI prints them all). */
import type { InputWarning } from '../../shared/contracts.js';
import { fieldRef, renderMessage } from '../messages/field-names.js';

/** A warning worded for the page (message) and for the command line (cliMessage) from one text. */
function worded(code: string, text: string, ids?: string[]): InputWarning {
  const warning: InputWarning = { code, message: renderMessage(text, 'page') };
  const cli = renderMessage(text, 'cli');
  if (cli !== warning.message) warning.cliMessage = cli;
  if (ids) warning.ids = ids;
  return warning;
}

/** How many record ids a warning carries at most; the message gives the full count. */
export const WARNING_ID_LIMIT = 50;

export function defaultAreaWarning(width: number, height: number): InputWarning {
  return worded(
    'default-study-area',
    `no study area given: the points' bounding box (${width.toFixed(1)} m x ${height.toFixed(1)} m) is used, ` +
      `which leaves out any empty margin of the real study area (and so can understate clustering); give it with ${fieldRef('area')}`,
  );
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

/** CSV rows left out at the user's request because their coordinates were blank or n/a; ids are line numbers. */
export function skippedRowsWarning(fileName: string, lines: number[]): InputWarning {
  const listed = lines.length > WARNING_ID_LIMIT ? ` (first ${WARNING_ID_LIMIT} lines listed)` : '';
  return worded(
    'skipped-rows',
    `${fileName}: ${lines.length} row(s) without coordinates (blank or n/a) were left out as asked and are not counted${listed}`,
    lines.slice(0, WARNING_ID_LIMIT).map((line) => `line ${line}`),
  );
}

export function projectionWarning(message: string): InputWarning {
  return { code: 'projection', message };
}
