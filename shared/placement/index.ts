/** Governing placement of lanes and wheels: rules, evaluation of one placement, search. */
export * from './rules.js';
export * from './transverseLines.js';
export * from './longitudinal.js';
export * from './sampledSurface.js';
export * from './evaluate.js';
export * from './search.js';
