/**
 * Runnel's hydraulic engine: plain functions over numbers in SI base units. No editor, parser or file-system
 * imports belong here (checked by test/architecture/import-boundaries.test.ts).
 */
export * from './constants.js';
export * from './sections/index.js';
export * from './depth-solver.js';
export * from './uniform-flow.js';
export * from './critical-flow.js';
export * from './hydraulic-state.js';
export * from './boundary-shear.js';
export * from './profile/index.js';
