import { describe, expect, it } from 'vitest';
import { downloadName, fileSlug, sidesTag } from '../../shared/messages/download-names.js';

// Ten downloads in one folder stay apart: every file name carries the dataset name and the cell side(s).
describe('download names', () => {
  it('turn the dataset name into a safe ASCII part', () => {
    expect(fileSlug('Harbour burglaries <2025> — Søndre kvarter')).toBe('harbour-burglaries-2025-s-ndre-kvarter');
    expect(fileSlug('Ærø')).toBe('r');
    expect(fileSlug('***')).toBe('dataset');
    expect(fileSlug('x'.repeat(80))).toHaveLength(40);
  });

  it('name the cell sides, sorted, with the unit', () => {
    expect(sidesTag([250])).toBe('250m');
    expect(sidesTag([400, 100, 200])).toBe('100-200-400m');
    expect(sidesTag([111.80339887])).toBe('111.8m');
    expect(sidesTag([10, 20, 30, 40, 50, 60])).toBe('10-to-60m-6-sides');
  });

  it('differ for each dataset, side and kind of download', () => {
    expect(downloadName('Port Calverin', [250], 'placements', 'csv')).toBe('gridshake-port-calverin-250m-placements.csv');
    const names = new Set(
      ['A', 'B'].flatMap((name) => [[100], [200]].flatMap((sides) => ['placements.csv', 'report.html', 'chart-angle.png'].map((kind) => {
        const [what, extension] = kind.split('.');
        return downloadName(name, sides, what, extension);
      }))),
    );
    expect(names.size).toBe(12);
  });
});
