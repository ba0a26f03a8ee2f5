/**
 * Display of trace values (shared/trace.ts) and of the rigid-section Σx² (shared/units.ts):
 * round-off residue reads 0 (below 1e-9 of the step's largest value of the same kind, or
 * below the decimals shown), and Σx² is a length squared, ft² or m², like X and e in ft or m.
 * Conversion: 1 ft = 0.3048 m exactly, so 1 ft² = 0.09290304 m² (NIST SP 811, Appendix B).
 * The residue threshold 1e-9 is a choice of this product (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { fromUs, stepForDisplay, stepScale, toDisplay, unitSymbol, zeroIfNegligible, type TraceStep } from '../../shared/index.js';
import { computeCodeFactors } from '../../shared/index.js';
import { pickRow, usDeck } from './lrfd/decks.js';

const leverStep: TraceStep = {
  label: 'Lever rule',
  formula: 'R = Σ P·(S − x)/S',
  inputs: [
    { symbol: 'S', value: fromUs.ft(8), kind: 'length', formulaValue: 8, formulaUnit: 'ft' },
    { symbol: 'x1.1', value: fromUs.ft(3.642e-16), kind: 'length', formulaValue: 3.642e-16, formulaUnit: 'ft' },
    { symbol: 'x1.2', value: fromUs.ft(-6), kind: 'length', formulaValue: -6, formulaUnit: 'ft' },
    { symbol: 'm', value: 1.2, kind: 'none' },
  ],
  value: 0.6,
  kind: 'none',
  article: 'AASHTO LRFD Art. 4.6.2.2.1',
};

describe('zeroIfNegligible', () => {
  it('zeroes values below 1e-9 of the scale and keeps the rest exactly', () => {
    expect(zeroIfNegligible(3.642e-16, 8)).toBe(0);
    expect(zeroIfNegligible(-2e-12, 1000)).toBe(0);
    expect(zeroIfNegligible(1e-8, 8)).toBe(1e-8);
    expect(zeroIfNegligible(-6, 8)).toBe(-6);
    expect(Object.is(zeroIfNegligible(-0, 8), 0)).toBe(true);
  });
  it('zeroes values that round to zero at the decimals shown', () => {
    expect(zeroIfNegligible(0.004, 0, 2)).toBe(0);
    expect(zeroIfNegligible(-0.0049, 0, 2)).toBe(0);
    expect(zeroIfNegligible(0.005, 0, 2)).toBe(0.005);
    // A lone value with no scale and no precision stays as it is.
    expect(zeroIfNegligible(1e-20, 0)).toBe(1e-20);
    expect(zeroIfNegligible(Number.NaN, 1)).toBeNaN();
  });
});

describe('stepForDisplay', () => {
  it('takes the scale from the values of the same kind in the step', () => {
    expect(stepScale(leverStep, 'length')).toBeRelativelyClose(fromUs.ft(8), 1e-15);
    expect(stepScale(leverStep, 'none')).toBe(1.2);
  });
  it('shows the residue of a wheel over a girder as 0, in the display and the formula value', () => {
    const d = stepForDisplay(leverStep);
    const x11 = d.inputs.find((i) => i.symbol === 'x1.1')!;
    expect(x11.value).toBe(0);
    expect(x11.formulaValue).toBe(0);
    // Everything else untouched, and the stored step unchanged.
    expect(d.inputs.filter((i) => i.symbol !== 'x1.1')).toEqual(leverStep.inputs.filter((i) => i.symbol !== 'x1.1'));
    expect(leverStep.inputs[1].value).not.toBe(0);
  });
});

describe('Σx² of the rigid-section check is a length squared', () => {
  // 5 girders at 8 ft: x = −16, −8, 0, 8, 16 ft, Σx² = 2·(16² + 8²) = 640 ft² (Eq. C4.6.2.2.2d-1 notation).
  const r = computeCodeFactors(usDeck({ diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 2 } }));
  const step = pickRow(r, 'exterior', 'moment', 'one', 'rigid-section').trace.find((t) => t.label.startsWith('Rigid-section check, girder'))!;
  const sumX2 = step.inputs.find((i) => i.symbol === 'Σx²')!;
  const xExt = step.inputs.find((i) => i.symbol === 'X_ext')!;
  it('in ft² on US decks and m² on SI, the squares of the unit of X_ext', () => {
    expect(sumX2.kind).toBe('lengthSquared');
    expect(unitSymbol('lengthSquared', 'US')).toBe(`${unitSymbol(xExt.kind, 'US')}²`);
    expect(unitSymbol('lengthSquared', 'SI')).toBe(`${unitSymbol(xExt.kind, 'SI')}²`);
    expect(toDisplay(sumX2.value, sumX2.kind, 'US')).toBeRelativelyClose(640, 1e-12);
    expect(toDisplay(sumX2.value, sumX2.kind, 'SI')).toBeRelativelyClose(640 * 0.09290304, 1e-12);
    // Identity: Σx² in display units equals the sum of the squares of X in display units.
    const xs = [-16, -8, 0, 8, 16].map((v) => toDisplay(fromUs.ft(v), 'length', 'SI'));
    expect(toDisplay(sumX2.value, sumX2.kind, 'SI')).toBeRelativelyClose(xs.reduce((s, v) => s + v * v, 0), 1e-12);
    expect(sumX2.formulaValue).toBeRelativelyClose(640, 1e-12);
  });
});
