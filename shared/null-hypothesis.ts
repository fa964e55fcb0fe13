/**
 * The null hypothesis a sweep or a count tests, named in words (issue 15): complete spatial randomness (expected
 * counts proportional to area) or the population at risk (a baseline: polygons with a count field, or control points).
 * Every sentence that claims clustering names its null through these phrases.
 */
import type { BaselineInfo } from './contracts.js';

/** "the population at risk (baseline: FILE, field NAME)", "… (controls: FILE)" or "complete spatial randomness". */
export function nullName(baseline: BaselineInfo | undefined): string {
  if (baseline === undefined) return 'complete spatial randomness';
  return baseline.kind === 'polygons'
    ? `the population at risk (baseline: ${baseline.file}, field ${baseline.field ?? ''})`
    : `the population at risk (controls: ${baseline.file})`;
}

/** "beyond the population at risk (baseline: FILE, field NAME)" or "beyond complete spatial randomness". */
export function beyondNull(baseline: BaselineInfo | undefined): string {
  return `beyond ${nullName(baseline)}`;
}

/**
 * The one sentence that says which null a sweep tested, shown above the conclusion on the page and in the report:
 * "Tested: clustering beyond the population at risk (baseline: FILE, field NAME)." or "Tested: clustering beyond
 * complete spatial randomness (expected counts proportional to area)."
 */
export function nullStatement(baseline: BaselineInfo | undefined): string {
  const detail = baseline === undefined
    ? ' (expected counts proportional to area)'
    : baseline.kind === 'polygons'
      ? ' (expected counts proportional to the population spread evenly over each polygon)'
      : ' (cases against controls by random labelling)';
  return `Tested: clustering ${beyondNull(baseline)}${detail}.`;
}
