/** Live loads: HL-93 vehicles, influence lines, beam-line envelopes, girder effects, load combinations. */
export * from './vehicles.js';
export * from './influenceLine.js';
export { uniformLoadEffect, piecewiseOf, type AxlePlacement, type VehicleEffect } from './movingLoad.js';
export { PiecewiseCubic, type HermiteElement, type HasPiecewise } from './piecewiseCubic.js';
export * from './beamLine.js';
export * from './girderEffects.js';
export * from './combinations.js';
export * from './deckEffects.js';
export * from './designValues.js';
