export * from './grid-frame.js';
export * from './ring-area.js';
export * from './point-in-region.js';
export * from './edge-accumulation.js';
export * from './coverage.js';
