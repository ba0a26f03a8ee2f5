/** Deckshare's solver: the public API. Import from here only. */
export * from './units.js';
export * from './trace.js';
export * from './deck/schema.js';
export * from './deck/units.js';
export * from './deck/geometry.js';
export * from './deck/section.js';
export * from './version.js';
export * from './lrfd/index.js';
export * from './loads/index.js';
export * from './placement/index.js';
export * from './grillage/index.js';
export * from './grillage/refinedFactors.js';
export * from './grillage/compare.js';
