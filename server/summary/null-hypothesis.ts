/**
 * The null hypothesis a sweep or a count tests, named in words (issue 15): complete spatial randomness (expected
 * counts proportional to area) or the population at risk (a baseline: polygons with a count field, or control points).
 * Every sentence that claims clustering names its null through these phrases.
 */
import type { BaselineInfo } from '../../shared/contracts.js';

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
