/**
 * Node-free test fixtures shared by the shared, server and client tests (the client tests may
 * not import node modules): the plain type-a deck in US display units, and a lever-rule trace
 * step whose wheel distance is a rounding residue (3.642e-16 ft, a wheel over the girder).
 */
import { fromUs, type TraceStep } from '../../shared/index.js';

/** A plain type-a deck, 5 girders at 8 ft, 80 ft simple span, in US display units. */
export const BASE_US: Record<string, unknown> = {
  name: 'Test deck',
  sectionType: 'a',
  girders: { kind: 'uniform', count: 5, spacing: 8 },
  overhangLeft: 3,
  overhangRight: 3,
  barrierLeft: { width: 1.5, height: 32 },
  barrierRight: { width: 1.5, height: 32 },
  slab: { thickness: 8, haunch: 0 },
  section: { area: 50, inertia: 20000, eg: 30 },
  materials: { deck: { kind: 'modulus', modulus: 3600 }, girder: { kind: 'modulus', modulus: 29000 }, modularRatio: 8 },
  spans: [{ length: 80 }],
  continuous: false,
  supports: [{ skew: 0 }, { skew: 0 }],
  diaphragms: { type: 'none' },
};

/** A lever-rule step with S = 8 ft and a wheel 3.642e-16 ft from the girder (zero within rounding). */
export function leverResidueStep(label = 'Lever rule'): TraceStep {
  return {
    label,
    formula: 'R = Σ P·(S − x)/S',
    inputs: [
      { symbol: 'S', value: fromUs.ft(8), kind: 'length', formulaValue: 8, formulaUnit: 'ft' },
      { symbol: 'x1.1', value: fromUs.ft(3.642e-16), kind: 'length', formulaValue: 3.642e-16, formulaUnit: 'ft' },
    ],
    value: 0.6,
    kind: 'none',
    article: 'AASHTO LRFD Art. 4.6.2.2.1',
  };
}
