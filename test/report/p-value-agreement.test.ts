import { describe, expect, it } from 'vitest';
import { renderReport } from '../../server/report/render-report.js';
import { sizeConclusion } from '../../server/summary/conclusion.js';
import { formatPValue } from '../../shared/p-value.js';
import { makeMonteCarlo, makeSize, makeSummary } from '../client/summary-fixture.js';

// One p-value formatter (shared/p-value.ts): the conclusion sentence and the report's tables print a Monte Carlo p
// the same way, whatever its size (4 significant digits, scientific below 1e-4).
describe('p-values read the same in the conclusion and the report table', () => {
  // Monte Carlo p-values are (1 + k) / (R + 1): never below 1 / (R + 1)
  it.each([0.0123456789, 0.05, 1 / 10000, 1 / 10001])('p = %s', (p) => {
    const size = makeSize({ monteCarlo: makeMonteCarlo({ sims: 19, pMedianClustered: p, pMedianRegular: 1 }) });
    const conclusion = sizeConclusion(size);
    const html = renderReport(makeSummary([{ ...size, conclusion }]), []);
    const printed = formatPValue(p);
    expect(conclusion).toContain(`Monte Carlo p = ${printed} on the median chi2/df`);
    expect(html).toContain(`<td>${printed}</td>`);
    expect(html).toContain(escapeHtml(conclusion));
  });
});

function escapeHtml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}
