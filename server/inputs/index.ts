export { loadDataset, type DatasetInput, type DatasetOptions } from './load-dataset.js';
export { summarizeDataset, CELL_SIZE_RULES } from './summarize-dataset.js';
export type { InputFile } from './input-file.js';
export { laeaDefinition } from './coordinate-system.js';
export { signedRingArea, polygonArea, multiPolygonArea } from './planar-rings.js';
export { insideCoordinates } from './inside-coordinates.js';
export { insideCount, isEveryPointInside, withEveryPointInside } from './inside-points.js';
