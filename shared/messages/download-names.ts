/**
 * File names of downloads and exports, shared by the page, the HTTP API and the report: each carries the dataset
 * name and the cell side(s), so that ten downloads in one folder stay apart, e.g.
 * `gridshake-harbour-burglaries-250m-placements.csv`. ASCII only (safe in Content-Disposition and on any disk).
 */
import { significant } from '../format.js';

/** The dataset name as a file-name part: lower case ASCII letters, digits and hyphens, at most 40 characters. */
export function fileSlug(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40)
    .replace(/-+$/, '');
  return slug === '' ? 'dataset' : slug;
}

/** A cell side for a file name: 250 -> "250m", 111.8034 -> "111.8m", 0.25 -> "0.25m". */
export function sideTag(side: number): string {
  return `${significant(side, 4)}m`;
}

/** All cell sides of a run: "250m", "100-200-400m", or "100-to-800m-6-sides" when there are more than four. */
export function sidesTag(sides: readonly number[]): string {
  const sorted = [...sides].sort((a, b) => a - b);
  if (sorted.length === 0) return 'no-sides';
  if (sorted.length === 1) return sideTag(sorted[0]);
  if (sorted.length <= 4) return `${sorted.map((side) => significant(side, 4)).join('-')}m`;
  return `${significant(sorted[0], 4)}-to-${sideTag(sorted[sorted.length - 1])}-${sorted.length}-sides`;
}

/** `gridshake-<dataset>-<sides>-<what>.<extension>`. */
export function downloadName(datasetName: string, sides: readonly number[], what: string, extension: string): string {
  return `gridshake-${fileSlug(datasetName)}-${sidesTag(sides)}-${what}.${extension}`;
}
