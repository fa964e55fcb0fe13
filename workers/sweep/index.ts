export * from './statistics-codec.js';
export * from './region-buffer.js';
export * from './sweep-task.js';
export * from './evaluate-chunk.js';
export * from './simulate-patterns.js';
export * from './task-cache.js';
