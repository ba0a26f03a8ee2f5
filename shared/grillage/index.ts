/** The grillage refined analysis: mesh, banded solver, responses and influence surfaces. */
export * from './errors.js';
export * from './element.js';
export * from './numbering.js';
export * from './bandSolver.js';
export * from './assemble.js';
export * from './stiffness.js';
export * from './quality.js';
export * from './mesh.js';
export * from './loadTransfer.js';
export * from './model.js';
export * from './responses.js';
export * from './influenceSurface.js';
export * from './denseSolver.js';
