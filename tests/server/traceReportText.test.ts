/**
 * Trace inputs as the calculation package prints them: residue prints as 0 and the
 * rigid-section Σx² in ft² (US) or m² (SI), like X_ext in ft or m. 640 ft² = 59.4579456 m²
 * (1 ft = 0.3048 m exactly, NIST SP 811). Threshold 1e-9: common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, stepForDisplay } from '../../shared/index.js';
import { traceInputsText } from '../../server/reports/calculationPackage.js';
import { pickRow, usDeck } from '../shared/lrfd/decks.js';
import { leverResidueStep } from '../shared/traceFixtures.js';

describe('calculation package trace inputs', () => {
  it('prints a wheel-over-girder residue as 0', () => {
    const s = leverResidueStep();
    expect(traceInputsText(stepForDisplay(s), 'US')).toBe('S = 8.000 ft;  x1.1 = 0.000 ft');
    expect(traceInputsText(stepForDisplay(s), 'SI')).toContain('x1.1 = 0.000 m (0.000 ft in the formula)');
  });
  it('prints Σx² of the rigid-section check in ft² or m²', () => {
    const r = computeCodeFactors(usDeck({ diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 2 } }));
    const step = pickRow(r, 'exterior', 'moment', 'one', 'rigid-section').trace.find((t) => t.label.startsWith('Rigid-section check, girder'))!;
    const us = traceInputsText(step, 'US');
    expect(us).toContain('X_ext = -16.000 ft');
    expect(us).toContain('Σx² = 640.0 ft²');
    expect(us).not.toContain('in²');
    expect(traceInputsText(step, 'SI')).toContain('Σx² = 59.5 m² (640.000 ft² in the formula)');
  });
});
