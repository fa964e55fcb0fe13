export * from './seeded-random.js';
export * from './halton.js';
export * from './lattice.js';
export * from './boundary-cells.js';
export * from './csr-sampler.js';
