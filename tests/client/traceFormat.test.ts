// @vitest-environment happy-dom
/**
 * Trace text on screen and in the calculation package: residue prints as 0 (never 3.642e-16
 * ft), and the rigid-section Σx² prints in ft² on US decks and m² on SI, the square of the
 * unit of X_ext and Σe. 640 ft² = 59.4579456 m² (1 ft = 0.3048 m exactly, NIST SP 811).
 * The 1e-9 residue threshold is this product's choice (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { assertDeck, computeCodeFactors, deckFromDisplay, fromUs, type TraceStep } from '@shared/index';
import TraceView from '@/components/factors/TraceView.vue';
import { formulaValueText, traceStepText, traceValueText } from '@/components/factors/traceFormat';

/** Type a, 5 girders at 8 ft, 3 ft overhangs, steel cross-frames (US display units). */
const DECK_US = {
  name: 'Trace text deck',
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
  diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 2 },
};

const leverStep: TraceStep = {
  label: 'Lever rule, girder 1',
  formula: 'R = Σ P·(S − x)/S',
  inputs: [
    { symbol: 'S', value: fromUs.ft(8), kind: 'length', formulaValue: 8, formulaUnit: 'ft' },
    { symbol: 'x1.1', value: fromUs.ft(3.642e-16), kind: 'length', formulaValue: 3.642e-16, formulaUnit: 'ft' },
  ],
  value: 0.6,
  kind: 'none',
  article: 'AASHTO LRFD Art. 4.6.2.2.1',
};

describe('trace value text', () => {
  it('prints residue as 0 in the reader units and in the formula value', () => {
    const us = traceStepText(leverStep, 'US');
    expect(us.inputs[1].value).toBe('0.00 ft');
    const si = traceStepText(leverStep, 'SI');
    expect(si.inputs[1].value).toBe('0.000 m');
    expect(si.inputs[1].formula).toBe('(0.000 ft in the formula)');
    expect(si.inputs[0].formula).toBe('(8.000 ft in the formula)');
  });
  it('prints a value below the decimals shown as 0, and keeps real small values', () => {
    expect(traceValueText(fromUs.ft(0.001), 'length', 'US')).toBe('0.00 ft');
    expect(traceValueText(fromUs.ft(0.25), 'length', 'US')).toBe('0.25 ft');
    expect(traceValueText(-1e-17, 'none', 'US')).toBe('0');
    expect(traceValueText(0.615, 'none', 'US')).toBe('0.6150');
    expect(formulaValueText(-4e-16)).toBe('0.000');
  });
});

describe('rigid-section Σx² in the units of X_ext and Σe', () => {
  // 5 girders at 8 ft: Σx² = 2·(16² + 8²) = 640 ft² (Eq. C4.6.2.2.2d-1).
  const r = computeCodeFactors(assertDeck(deckFromDisplay(DECK_US, 'US')));
  const row = r.factors.find((x) => x.girderKind === 'exterior' && x.effect === 'moment' && x.lanes === 'one' && x.method === 'rigid-section')!;
  const step = row.trace.find((t) => t.label.startsWith('Rigid-section check, girder'))!;
  const line = (units: 'US' | 'SI', symbol: string) => traceStepText(step, units).inputs.find((i) => i.symbol === symbol)!;
  it('US: ft and ft², no in²', () => {
    expect(line('US', 'X_ext').value).toBe('-16.00 ft');
    expect(line('US', 'Σx²').value).toBe('640.0 ft²');
    expect(line('US', 'Σx²').formula).toBeUndefined();
  });
  it('SI: m and m², with the ft² the formula takes', () => {
    expect(line('SI', 'X_ext').value).toBe('-4.877 m');
    expect(line('SI', 'Σx²').value).toBe('59.458 m²');
    expect(line('SI', 'Σx²').formula).toBe('(640.0 ft² in the formula)');
  });
  it('the trace view renders the same text', () => {
    const w = mount(TraceView, { props: { steps: [step, leverStep], units: 'US' } });
    const text = w.text();
    expect(text).toContain('Σx² = 640.0 ft²');
    expect(text).not.toContain('in²');
    expect(text).toContain('x1.1 = 0.00 ft');
    expect(text).not.toMatch(/e-1\d/);
  });
});
