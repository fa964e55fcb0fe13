import { describe, expect, it } from 'vitest';
import { narrowLayout, wrapText } from '../../client/src/charts/narrow-layout.js';
import { baseOptions, axis } from '../../shared/charts/chart-spec.js';

// Charts on a 360 px phone: long titles wrap into lines that fit instead of running into the axis titles.
describe('narrow chart layout', () => {
  it('wraps text at spaces into lines no longer than the width (a longer word kept whole)', () => {
    expect(wrapText('Spread of chi-square / df across grid placements, by cell size', 24)).toEqual([
      'Spread of chi-square /',
      'df across grid',
      'placements, by cell size',
    ]);
    expect(wrapText('internationalisation x', 5)).toEqual(['internationalisation', 'x']);
  });

  it('wraps title, subtitle and axis titles under 640 px and leaves wide charts alone', () => {
    const make = () => baseOptions('Spread of chi-square / df across grid placements, by cell size', ['256 placements per size; the triangle is the reference grid (angle 0, offset 0,0)'], {
      x: axis('cell side (m)'),
      y: axis('variance-to-mean ratio, VMR (ratio)'),
    });
    const wide = make();
    expect(narrowLayout(wide, 900)).toEqual(make());
    const narrow = narrowLayout(make(), 340) as { plugins: { title: { text: string[] }; subtitle: { text: string[] } } };
    const limit = Math.floor((340 - 16) / 7.5);
    expect(narrow.plugins.title.text.length).toBeGreaterThan(1);
    for (const line of narrow.plugins.title.text) expect(line.length).toBeLessThanOrEqual(limit);
    expect(narrow.plugins.subtitle.text.join(' ')).toBe('256 placements per size; the triangle is the reference grid (angle 0, offset 0,0)');
  });
});
