export * from './cell-counter.js';
export * from './morton-sort.js';
export * from './select-cells.js';
export * from './evaluate-placement.js';
export * from './describe-cells.js';
