import { describe, expect, it } from 'vitest';
import type { PlacementRow } from '../../shared/contracts.js';
import { overallConclusion } from '../../server/summary/conclusion.js';
import { shapeSentence } from '../../shared/shape-sentence.js';
import { summarizeSize } from '../../server/summary/size-summary.js';
import type { CellShape } from '../../workers/lattice/cell-shape.js';
import type { Verdict } from '../../workers/types.js';
import { placementRow } from './placement-row-fixture.js';

// The report's one sentence on whether the conclusion depends on the cells' shape (issue 16): at each cell side,
// the most common verdict with squares against that with hexagons.

function size(sizeIndex: number, cellSize: number, shape: CellShape, verdicts: Verdict[]) {
  const rows: PlacementRow[] = verdicts.map((verdict, k) => ({ ...placementRow(k, 1 + k / 10, verdict, sizeIndex, cellSize), shape }));
  return summarizeSize(rows, null);
}

describe('shapeSentence', () => {
  it('says the conclusion does not depend on the shape when squares and hexagons agree at every size', () => {
    const sizes = [
      size(0, 80, 'square', ['clustered', 'clustered', 'csr']),
      size(1, 120, 'square', ['csr', 'csr', 'csr']),
      size(2, 80, 'hex', ['clustered', 'clustered', 'clustered']),
      size(3, 120, 'hex', ['csr', 'clustered', 'csr']),
    ];
    expect(shapeSentence(sizes)).toBe('The conclusion does not depend on the cell shape: at all 2 cell sizes squares and hexagons give the same most common verdict');
    const text = overallConclusion(sizes, 0.05, null);
    // 80 m: clustered with both shapes; 120 m: no departure with both
    expect(text).toContain('most placements say clustered at 2 of 4 cell sizes and shapes, no departure from CSR at 2 of 4 cell sizes and shapes at alpha 0.05');
    expect(text).toMatch(/The conclusion does not depend on the cell shape: .*verdict\.$/);
    expect(sizes[2].conclusion).toMatch(/^80 m hexagonal cells: clustered in 100 % of 3 placements/);
  });

  it('names the sizes where the shapes disagree and what each shape says', () => {
    const sizes = [
      size(0, 80, 'square', ['clustered', 'clustered', 'csr']),
      size(1, 120, 'square', ['csr', 'csr', 'csr']),
      size(2, 80, 'hex', ['csr', 'csr', 'clustered']),
      size(3, 120, 'hex', ['csr', 'csr', 'csr']),
    ];
    expect(shapeSentence(sizes)).toBe(
      'The conclusion depends on the cell shape at 1 of 2 cell sizes, where squares and hexagons give different most common verdicts ' +
        '(80 m: squares clustered, hexagons no departure from CSR)',
    );
  });

  it('adds no shape sentence to a squares-only conclusion', () => {
    const sizes = [size(0, 80, 'square', ['clustered', 'clustered', 'csr'])];
    expect(overallConclusion(sizes, 0.05, null)).not.toContain('shape');
  });
});
