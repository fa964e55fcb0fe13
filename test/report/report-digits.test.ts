import { describe, expect, it } from 'vitest';
import { renderReport } from '../../server/report/render-report.js';
import { makeMonteCarlo, makeRow, makeSize, makeSummary } from '../client/summary-fixture.js';

// Issue 9 item 6: the report's numbers keep sensible significant digits. Full-precision doubles go in, and no number
// a reader sees (outside the projection's definition, which must stay exact so that a run can be reproduced) carries
// more than 6 significant digits (common practice: a statistic's last digits beyond that are noise for a reader).
const UGLY = 1 / 3;

function visibleText(html: string): string {
  return html
    .replace(/<script>[\s\S]*?<\/script>/g, '')
    .replace(/<style>[\s\S]*?<\/style>/g, '')
    .replace(/<svg[\s\S]*?<\/svg>/g, '')
    .replace(/<[^>]+>/g, ' ')
    .replace(/\s+/g, ' ');
}

function significantDigits(token: string): number {
  const mantissa = token.replace(/^[-+]/, '').split(/e/i)[0]!.replace('.', '').replace(/^0+/, '');
  return mantissa.length;
}

describe('report number formatting', () => {
  it('prints no number with more than 6 significant digits from full-precision inputs', () => {
    const sizes = [0, 1].map((sizeIndex) =>
      makeSize({ sizeIndex, cellSize: 144.123456789 + sizeIndex * 110.987654321, expectedPerCell: 5 + UGLY, monteCarlo: makeMonteCarlo({ sims: 19 }) }),
    );
    const summary = makeSummary(sizes);
    const rows = [0, 1].flatMap((sizeIndex) =>
      [0, 1, 2, 3].map((placementIndex) =>
        makeRow({ sizeIndex, placementIndex, u: placementIndex / 7, v: placementIndex / 9, angle: placementIndex * 13.123456789, vmr: 1 + placementIndex * UGLY }),
      ),
    );
    const text = visibleText(renderReport(summary, rows));
    const projection = summary.dataset.projectionUsed ?? '';
    const readable = projection === '' ? text : text.split(projection).join(' ');
    const numbers = readable.match(/[-+]?\d+(?:\.\d+)?(?:e[-+]?\d+)?/gi) ?? [];
    expect(numbers.length).toBeGreaterThan(20);
    const tooLong = numbers.filter((token) => token.includes('.') && significantDigits(token) > 6);
    expect(tooLong).toEqual([]);
  });
});
