/** The cautions the page and the report carry wherever results can be read as disease or crime clusters. */
export const CAUTIONS: readonly string[] = [
  'Significance is not cause: a departure from complete spatial randomness (CSR) says the points are not spread at random over the valid region, not why. Population, land use, how records were collected and the grid itself all shape the counts.',
  'Results depend on data quality: missing, duplicated or misplaced records, and the study area and no-data zones you supply, change every number here.',
  'Before acting on an apparent cluster of disease or crime, defer to local public-health and policing guidance and to licensed professionals.',
  'Protect the privacy of point records: do not publish point maps, or grids fine enough to single out people or households.',
];

/**
 * The privacy caution for the stability surface (issue 17), shown on the page beside the map, in its cautions and in
 * the note of an exported map image: the surface's pixels are an eighth of a cell side, so at fine cell sizes it
 * draws where records are.
 */
export const SURFACE_PRIVACY =
  'A fine stability surface can single out households too: its pixels are an eighth of a cell, so small cells draw where the records are. Share the surface, its GeoTIFF, the areas and any map image of them only as you would share the points.';
