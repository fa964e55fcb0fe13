/**
 * The methods paragraphs of the report, written from the actual run: what was varied, how no-data and partial
 * cells were handled, how the p-values were calibrated, with the references. Plain text; the renderer escapes it.
 */
import type { SweepSummary } from '../../shared/contracts.js';
import { OVERALL_TEST_METHOD } from '../summary/overall-test.js';
import { nullName } from '../../shared/null-hypothesis.js';
import { formatMetres, formatNumber } from '../../shared/format.js';

export interface Reference {
  key: string;
  text: string;
}

export const REFERENCES: Record<string, Reference> = {
  besagDiggle: { key: 'Besag and Diggle 1977', text: 'Besag, J. and Diggle, P. J. (1977). Simple Monte Carlo tests for spatial pattern. Applied Statistics 26(3), 327-333.' },
  fisher: { key: 'Fisher, Thornton and Mackenzie 1922', text: 'Fisher, R. A., Thornton, H. G. and Mackenzie, W. A. (1922). The accuracy of the plating method of estimating the density of bacterial populations. Annals of Applied Biology 9, 325-359.' },
  halton: { key: 'Halton 1960', text: 'Halton, J. H. (1960). On the efficiency of certain quasi-random sequences of points in evaluating multi-dimensional integrals. Numerische Mathematik 2, 84-90.' },
  goodchildLam: { key: 'Goodchild and Lam 1980', text: 'Goodchild, M. F. and Lam, N. S.-N. (1980). Areal interpolation: a variant of the traditional spatial problem. Geo-Processing 1, 297-312.' },
  diggle: { key: 'Diggle 2003', text: 'Diggle, P. J. (2003). Statistical Analysis of Spatial Point Patterns, 2nd ed. London: Arnold; and Diggle, P. J. (2014). Statistical Analysis of Spatial and Spatio-Temporal Point Patterns, 3rd ed. Boca Raton: CRC Press.' },
  openshaw: { key: 'Openshaw 1984', text: 'Openshaw, S. (1984). The Modifiable Areal Unit Problem. Concepts and Techniques in Modern Geography 38. Norwich: Geo Books.' },
};

function list(values: readonly string[]): string {
  if (values.length <= 1) return values.join('');
  return `${values.slice(0, -1).join(', ')} and ${values[values.length - 1]}`;
}

function variedText(summary: SweepSummary): string {
  const { plan } = summary;
  const sides = list([...new Set(summary.sizes.map((size) => formatMetres(size.cellSize)))]);
  const sideCount = new Set(summary.sizes.map((size) => size.cellSize)).size;
  const hasHex = summary.sizes.some((size) => size.shape === 'hex');
  const hasSquare = summary.sizes.some((size) => (size.shape ?? 'square') === 'square');
  const cellWords = hasHex
    ? `${hasSquare ? 'square cells and, on the same placement design, ' : ''}pointy-top hexagonal cells of area side² (angles over 0 to 60 degrees, their period), of side`
    : 'square cells of side';
  const sizeSource = plan.perCell
    ? ` (from ${list(plan.perCell.map((k) => formatNumber(k)))} expected points per cell, side = sqrt(k A / n))`
    : '';
  const design = plan.design === 'halton'
    ? `offsets (u, v) in cell units taken from a Halton low-discrepancy sequence in bases 2, 3 and 5 (${REFERENCES.halton.key})`
    : 'offsets (u, v) in cell units taken on a regular lattice';
  const rotation = plan.rotation
    ? `${design}, and grid angles spread over ${
        !hasHex ? '0 to 90 degrees (the period of square cells)'
          : hasSquare ? 'each shape\'s period at the same fractions (0 to 90 degrees for squares, 0 to 60 for hexagons)'
            : '0 to 60 degrees (the period of hexagonal cells)'}`
    : `${design}; rotation was off, so every grid kept angle 0`;
  return (
    `The quadrat test was repeated over ${plan.placements} grid placements for each of ${hasHex ? sideCount : summary.sizes.length} cell ` +
    `size${(hasHex ? sideCount : summary.sizes.length) === 1 ? '' : 's'}: ${cellWords} ${sides}${sizeSource}. Placements used ${rotation}. ` +
    'The reference placement (angle 0, offset (0, 0), origin at the lower-left corner of the study area\'s bounding box) ' +
    'is the grid a default analysis would use; its rank among the placements shows how typical that choice is ' +
    `(the modifiable areal unit problem, ${REFERENCES.openshaw.key}).`
  );
}

function cellsText(summary: SweepSummary): string {
  const { plan, dataset } = summary;
  const threshold = plan.minCoverage >= 1
    ? 'only whole cells (coverage 1) were kept'
    : `cells with coverage below ${formatNumber(plan.minCoverage)} were left out and the partial cells kept were weighted by their valid area`;
  const outside = dataset.nOutside > 0
    ? ` ${dataset.nOutside} of the ${dataset.n} points lie outside the valid region and were never counted.`
    : ' Every point lies inside the valid region.';
  const area = dataset.areaIsDefault ? ' No study area was supplied, so the points\' bounding box was used.' : '';
  return (
    'The valid region is the study area minus the no-data zones. The coverage of each cell, the share of its area ' +
    `inside the valid region, was computed exactly from the polygons, not by sampling; ${threshold}. Each kept cell ` +
    'c has the expected count E_c = N a_c / (sum of a), with a_c its valid area and N the points in kept cells, and ' +
    'the index-of-dispersion chi-square sum (O_c - E_c)^2 / E_c on m - 1 degrees of freedom ' +
    `(${REFERENCES.fisher.key}) gives each placement a verdict at alpha = ${formatNumber(plan.alpha)}, two-sided ` +
    `(each tail alpha / 2).${outside}${area}`
  );
}

/** The baseline paragraph (issue 15): what the expected counts follow instead of area, and the null simulated. */
function baselineText(summary: SweepSummary): string | null {
  const baseline = summary.baseline ?? summary.dataset.baseline;
  if (baseline === undefined) return null;
  const named = nullName(baseline);
  const common =
    ' The null hypothesis is therefore the population at risk, not complete spatial randomness: a verdict of clustering ' +
    `means clustering beyond ${named}. A cell that passes the coverage rule but holds no population at risk (w_c = 0) ` +
    'is left out, and the points in such cells are reported. VMR, Morisita\'s index and the other aggregation indices ' +
    'keep their usual equal-area definitions and describe the counts, not the test.';
  if (baseline.kind === 'polygons') {
    return (
      `Expected counts follow a baseline instead of area: ${baseline.features} polygons of ${baseline.file} with the count ` +
      `${baseline.field ?? ''} (${formatNumber(baseline.totalInside)} inside the valid region). Each polygon's count was spread ` +
      'evenly over its part inside the valid region (areal weighting, ' + REFERENCES.goodchildLam.key + '): ' +
      'w_c = sum over polygons p of P_p |c ∩ p ∩ V| / |p ∩ V|, with the areas computed exactly from the polygons, and ' +
      'E_c = N w_c / (sum of w over the kept cells). Areal weighting assumes the population is spread evenly within each ' +
      'polygon; where it is not, the expected counts are wrong at scales finer than the polygons. The cell tests of the ' +
      'placement-stable areas use the same E_c, for the data and for the simulated patterns.' + common
    );
  }
  return (
    `Expected counts follow ${baseline.totalInside} control points of ${baseline.file} inside the valid region: w_c is ` +
    'the number of controls in cell c (located by the same rule as the cases) and E_c = N w_c / (sum of w over the kept ' +
    'cells). The per-placement chi-square p-values treat the control counts as exact; only the Monte Carlo test by ' +
    `random labelling (${REFERENCES.diggle.key}) accounts for their own randomness. The cell tests of the ` +
    'placement-stable areas use E_c = N w_c / (sum of w) as well; each random labelling uses its own controls (the ' +
    'pooled cases and controls of a cell minus its simulated cases), over the cells where it has controls.' + common
  );
}

/** How the simulated patterns were drawn: CSR, or the baseline's null. */
function simulatedPatternsText(summary: SweepSummary): string {
  const baseline = summary.baseline ?? summary.dataset.baseline;
  const n = summary.dataset.nInside;
  if (baseline === undefined) {
    return `${summary.plan.sims} patterns of complete spatial randomness, each of ${n} points placed uniformly in the valid region,`;
  }
  if (baseline.kind === 'polygons') {
    return (
      `${summary.plan.sims} patterns drawn under the baseline, each of ${n} points placed in polygon p with probability ` +
      'proportional to its count P_p (among the polygons with area inside the valid region) and uniformly within its part ' +
      'inside the valid region,'
    );
  }
  return (
    `${summary.plan.sims} random labellings (${REFERENCES.diggle.key}): from the pooled cases and controls inside the ` +
    `valid region, ${n} drawn without replacement were the simulated cases and the rest the simulated controls, scored ` +
    'against their own controls,'
  );
}

function calibrationText(summary: SweepSummary): string {
  const { plan } = summary;
  if (plan.sims <= 0) {
    return (
      'No CSR simulations were run, so no test of the sweep as a whole was made: the results are per-placement evidence. ' +
      'The per-placement p-values come from the chi-square distribution and are not ' +
      'corrected for the choice among placements, so a significant result on some grids does not make the pattern ' +
      'significant.'
    );
  }
  return (
    `The p-values were calibrated by Monte Carlo (${REFERENCES.besagDiggle.key}): ${simulatedPatternsText(summary)} were counted on ` +
    'the same placements as the data. The placement-robust p-value for clustering is (1 + number of simulated ' +
    'medians of chi-square / df at or above the observed median) / (R + 1), with R the number of simulations, and ' +
    'likewise at or below for regularity; the same test on the maximum across placements answers the worst case ' +
    'of picking the most striking grid. These per-size p-values each test one size. ' + OVERALL_TEST_METHOD + ' ' +
    'The CSR envelope is the 2.5 to 97.5 % range of the simulated medians. ' +
    `The random seed was ${plan.seed}, so the run can be repeated exactly.`
  );
}

/** The methods paragraphs and the references they cite, in order of first use. */
export function methodsText(summary: SweepSummary): { paragraphs: string[]; references: string[] } {
  const baseline = baselineText(summary);
  const paragraphs = [variedText(summary), cellsText(summary), ...(baseline === null ? [] : [baseline]), calibrationText(summary)];
  const cited = [REFERENCES.halton, REFERENCES.openshaw, REFERENCES.fisher, REFERENCES.goodchildLam, REFERENCES.diggle, REFERENCES.besagDiggle].filter((reference) =>
    paragraphs.some((paragraph) => paragraph.includes(reference.key)),
  );
  return { paragraphs, references: cited.map((reference) => reference.text) };
}
