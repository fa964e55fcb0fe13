import { describe, it, expect } from 'vitest';
import { renderReport } from '../../server/report/render-report.js';
import { chartLibrarySource } from '../../server/report/chart-library.js';
import { escapeHtml, jsonForScript } from '../../server/report/html-escape.js';
import { makeMonteCarlo, makeRow, makeSize, makeSummary } from '../client/summary-fixture.js';

function summaryWith(overrides: { sims?: number; rotation?: boolean; minCoverage?: number; design?: 'halton' | 'lattice'; name?: string }) {
  const sizes = [
    makeSize({ sizeIndex: 0, cellSize: 200, monteCarlo: overrides.sims === 0 ? null : makeMonteCarlo({ sims: 19 }) }),
    makeSize({ sizeIndex: 1, cellSize: 400, monteCarlo: overrides.sims === 0 ? null : makeMonteCarlo({ sims: 19 }) }),
  ];
  const summary = makeSummary(sizes);
  summary.plan = { ...summary.plan, placements: 4, sims: overrides.sims ?? 19, seed: 4242, rotation: overrides.rotation ?? true, minCoverage: overrides.minCoverage ?? 0.5, design: overrides.design ?? 'halton' };
  if (overrides.name) summary.dataset.name = overrides.name;
  return summary;
}

const rows = [0, 1].flatMap((sizeIndex) =>
  [0, 1, 2, 3].map((placementIndex) => makeRow({ sizeIndex, placementIndex, u: placementIndex / 4, v: (placementIndex * 3) % 4 / 4, angle: placementIndex * 22.5, vmr: 1 + placementIndex / 10 })),
);

/** Text of the page without tags, entities decoded for & only (enough for the sentences checked). */
function visibleText(html: string): string {
  return html.replace(/<script>[\s\S]*?<\/script>/g, '').replace(/<[^>]+>/g, ' ').replace(/&#39;/g, "'").replace(/\s+/g, ' ');
}

describe('renderReport(summary, rows)', () => {
  it('writes the methods from the plan: sizes, placements, design, rotation, coverage rule, calibration, seed', () => {
    const text = visibleText(renderReport(summaryWith({}), rows));
    expect(text).toContain('repeated over 4 grid placements for each of 2 cell sizes: square cells of side 200 m and 400 m');
    expect(text).toContain('Halton low-discrepancy sequence in bases 2, 3 and 5');
    expect(text).toContain('grid angles spread over 0 to 90 degrees');
    expect(text).toContain('cells with coverage below 0.5 were left out and the partial cells kept were weighted by their valid area');
    expect(text).toContain('computed exactly from the polygons');
    expect(text).toContain('19 patterns of complete spatial randomness, each of 98 points placed uniformly in the valid region');
    expect(text).toContain('The random seed was 4242');
    expect(text).toContain('2 of the 100 points lie outside the valid region and were never counted');
    expect(text).toContain('Besag, J. and Diggle, P. J. (1977). Simple Monte Carlo tests for spatial pattern.');
    expect(text).toContain('Fisher, R. A., Thornton, H. G. and Mackenzie, W. A. (1922)');
  });

  it('changes the methods with the plan: no rotation, whole cells only, lattice, no simulations', () => {
    const text = visibleText(renderReport(summaryWith({ sims: 0, rotation: false, minCoverage: 1, design: 'lattice' }), rows));
    expect(text).toContain('rotation was off, so every grid kept angle 0');
    expect(text).toContain('only whole cells (coverage 1) were kept');
    expect(text).toContain('taken on a regular lattice');
    expect(text).toContain('No CSR simulations were run');
    expect(text).not.toContain('Halton, J. H. (1960)');
    expect(text).not.toContain('Besag, J. and Diggle');
  });

  it('carries the cautions, the per-size table, the Monte Carlo table, versions and one canvas per chart', () => {
    const html = renderReport(summaryWith({}), rows);
    const text = visibleText(html);
    expect(text).toContain('Significance is not cause');
    expect(text).toContain('Results depend on data quality');
    expect(text).toContain('defer to local public-health and policing guidance and to licensed professionals');
    expect(text).toContain('Protect the privacy of point records');
    expect(text).toContain('Results per cell size');
    expect(text).toContain('Placement-robust Monte Carlo p-values');
    expect(text).toContain('gridshake 0.1.0');
    // 2 overview charts + per size: angle, offsets, Monte Carlo
    expect(html.match(/<canvas /g)).toHaveLength(2 + 2 * 3);
    expect(html).toContain('id="chart-monte-carlo-1"');
  });

  it('escapes hostile dataset names and warnings everywhere', () => {
    const hostile = '<img src=x onerror=alert(1)></script><script>alert(2)</script>';
    const summary = summaryWith({ name: hostile });
    summary.dataset.warnings = [{ code: 'GS_WARN_TEST', message: '<b onmouseover=alert(3)>bad</b>', ids: ['"><svg onload=alert(4)>'] }];
    summary.warnings = ['<iframe src="javascript:alert(5)">'];
    summary.sizes[0].conclusion = '<script>alert(6)</script>';
    const html = renderReport(summary, rows);
    expect(html).not.toContain('<img src=x');
    expect(html).not.toContain('<b onmouseover');
    expect(html).not.toContain('<svg onload');
    expect(html).not.toContain('<iframe');
    expect(html).not.toContain('<script>alert');
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;&lt;/script&gt;');
    // exactly the two script elements of the report
    expect(html.match(/<script>/g)).toHaveLength(2);
  });

  it('embeds chart.js and no external URL, link, stylesheet or font', () => {
    const html = renderReport(summaryWith({}), rows);
    expect(html).toContain(chartLibrarySource());
    const withoutLibrary = html.replace(chartLibrarySource(), '');
    expect(withoutLibrary).not.toMatch(/https?:\/\//);
    expect(html).not.toMatch(/<(link|iframe|img)\b/);
    expect(html).not.toMatch(/\bsrc=/);
    expect(html).not.toMatch(/@import|url\(/);
    // the only URLs inside the library are in its licence comments
    const libraryUrls = chartLibrarySource().match(/https?:\/\/[^\s"')]+/g) ?? [];
    expect(libraryUrls.sort()).toEqual(['https://github.com/kurkle/color#readme', 'https://www.chartjs.org']);
  });
});

describe('escapeHtml and jsonForScript', () => {
  it('escape the five HTML specials and defuse script endings in JSON', () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
    const json = jsonForScript({ name: '</script><!-- \u2028' });
    expect(json).not.toContain('</script');
    expect(json).not.toContain('<!--');
    expect(JSON.parse(json)).toEqual({ name: '</script><!-- \u2028' });
  });
});
