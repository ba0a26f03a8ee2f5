/**
 * A refined factor's bound is stated in lanes and as a percentage of the factor, never in the
 * response's internal unit: bound in lanes = bound on the girder effect / |one lane's beam-line
 * effect|, since the factor itself is g = E_girder / E_beam (AASHTO LRFD Art. 4.6.2.2 defines
 * its factors as such ratios; the refined run forms them alike, Art. 4.6.3.3). The checks are
 * that identity and the wording; the size of the bound is checked in surface.test.ts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { assertDeck } from '../../../shared/deck/schema.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { computeRefinedFactors } from '../../../shared/grillage/refinedFactors.js';
import { boundInLanes } from '../../../shared/placement/search.js';

describe('the bound of a refined factor, in lanes and percent', () => {
  it('restates an effect bound as lanes of the beam-line effect and a percentage of the factor', () => {
    // 1,270 N·m on a beam-line effect of 1.334e6 N·m, factor 0.75: 9.520e-4 lanes, 0.127 %.
    const b = boundInLanes({ kind: 'sampled', absolute: 1270, text: 'exact for the sampled representation' }, 1.334e6, 0.75);
    expect(b.lanes).toBeRelativelyClose(1270 / 1.334e6, 1e-12);
    expect(b.percent).toBeRelativelyClose((1270 / 1.334e6 / 0.75) * 100, 1e-12);
    expect(b.text).toContain('0.0010 lanes (0.13 % of 0.7500)');
    expect(b.text).not.toMatch(/1\.27e\+3|1270/);
    // a negative beam-line effect (a shear sought negative) gives the same positive bound
    expect(boundInLanes({ kind: 'sampled', absolute: 1270, text: '' }, -1.334e6, 0.75).lanes).toBeRelativelyClose(b.lanes, 1e-12);
    expect(boundInLanes({ kind: 'exact', absolute: 0, text: 'exact' }, 1, 0.5).text).toBe('no legal placement exceeds this factor (exact)');
  });

  it('every refined factor of the prestressed example deck states its bound that way', { timeout: 60_000 }, () => {
    const f = JSON.parse(readFileSync('public/examples/fhwa-psc-step-5-1.deck.json', 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
    const result = computeRefinedFactors(assertDeck(deckFromDisplay(f.deck, f.units)), { effects: ['moment', 'shear'] });
    expect(result.factors.length).toBeGreaterThan(0);
    for (const r of result.factors) {
      expect(r.tolerance.factor).toBeRelativelyClose(r.tolerance.absolute / Math.abs(r.beamLineEffect), 1e-12);
      expect(r.tolerance.percent).toBeRelativelyClose((r.tolerance.factor / r.value) * 100, 1e-12);
      expect(r.tolerance.text).toMatch(/^no legal placement exceeds this factor( by more than (< )?\d+\.\d{4} lanes \((< )?\d+(\.\d+)? % of \d\.\d{4}\))?/);
      expect(r.tolerance.text).not.toMatch(/N·m|\de[+-]\d/);
      // the closing step states the lane count and load, then the bound
      expect(r.trace.at(-1)!.note!.endsWith(r.tolerance.text)).toBe(true);
    }
  });
});
