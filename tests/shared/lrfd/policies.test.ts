/**
 * Owner-policy switches (each off by default) and the governing selection:
 * - exterior girder not less than an interior girder: AASHTO LRFD Art. 2.5.2.7.1;
 * - lever rule with m = 1.0 instead of 1.2 (checked in fhwaExample.test.ts);
 * - no factor below m·NL/Nb (all lanes loaded, girders sharing equally; Art. 2.5.2.6.2 and
 *   Table 3.6.1.1.2-1 give the value).
 * Plus an unsymmetric deck (each exterior girder computed, numbered) and the unequal
 * spacing rule (average of the two adjacent spacings, common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, multiplePresenceFactor } from '../../../shared/index.js';
import { usDeck } from './decks.js';

const gov = (r: ReturnType<typeof computeCodeFactors>, girder: 'interior' | 'exterior', effect: string, key = 'span1') =>
  r.governing.find((g) => g.girder === girder && g.effect === effect && g.location.key === key)!;

describe('owner policies', () => {
  // Curb face 1 ft inboard of girder 1 (de = −1 ft): the exterior girder gets less than the interior.
  const inboard = { overhangLeft: 1, overhangRight: 1, barrierLeft: { width: 2 }, barrierRight: { width: 2 }, girders: { kind: 'uniform', count: 6, spacing: 8 } };
  it('off by default: the exterior girder may carry less than the interior one', () => {
    const r = computeCodeFactors(usDeck(inboard));
    expect(gov(r, 'exterior', 'moment').value).toBeLessThan(gov(r, 'interior', 'moment').value);
    expect(r.factors.some((x) => x.method === 'interior-minimum')).toBe(false);
  });
  it('exterior not less than interior (Art. 2.5.2.7.1)', () => {
    const r = computeCodeFactors(usDeck({ ...inboard, policy: { exteriorNotLessThanInterior: true } }));
    for (const effect of ['moment', 'shear', 'fatigue-moment']) {
      expect(gov(r, 'exterior', effect).value).toBeGreaterThanOrEqual(gov(r, 'interior', effect).value - 1e-12);
    }
    expect(gov(r, 'exterior', 'moment').method).toBe('interior-minimum');
    expect(r.findings.some((f) => f.code === 'policy' && f.article.includes('2.5.2.7.1'))).toBe(true);
  });
  it('floor at m·NL/Nb', () => {
    // 8 girders at 3.5 ft on a 200 ft span with a small Kg: the formulas give less than the equal share.
    const over = {
      girders: { kind: 'uniform', count: 8, spacing: 3.5 },
      spans: [{ length: 200 }],
      section: { area: 5, inertia: 800, eg: 20 },
    };
    const plain = computeCodeFactors(usDeck(over));
    const NL = plain.derived.designLanes;
    const eq = (multiplePresenceFactor(NL) * NL) / 8;
    expect(gov(plain, 'interior', 'moment').value).toBeLessThan(eq);
    const r = computeCodeFactors(usDeck({ ...over, policy: { floorAtEqualShare: true } }));
    const g = gov(r, 'interior', 'moment');
    expect(g.method).toBe('equal-share');
    expect(g.value).toBeRelativelyClose(eq, 1e-12);
    for (const x of r.governing.filter((x) => ['moment', 'shear', 'reaction'].includes(x.effect))) expect(x.value).toBeGreaterThanOrEqual(eq - 1e-12);
  });
});

describe('unsymmetric decks and unequal spacing', () => {
  it('computes both exterior girders and names them', () => {
    const r = computeCodeFactors(usDeck({ overhangLeft: 3, overhangRight: 4.5 }));
    expect(r.derived.symmetric).toBe(false);
    const ext = r.factors.filter((x) => x.girderKind === 'exterior' && x.effect === 'moment' && x.lanes === 'one');
    expect(new Set(ext.map((x) => x.girder))).toEqual(new Set([1, 5]));
    // The right side (de = 3 ft) carries more on the lever rule than the left (de = 1.5 ft).
    const right = ext.find((x) => x.girder === 5)!;
    const left = ext.find((x) => x.girder === 1)!;
    expect(right.value).toBeGreaterThan(left.value);
    expect(gov(r, 'exterior', 'moment').girderNumber).toBe(5);
    // Right lever rule by statics: curb 3 ft outside girder 5, wheels 1 ft outside and 5 ft inside: (9/8 + 3/8)/2·1.2.
    expect(right.baseValue).toBeRelativelyClose(((9 / 8 + 3 / 8) / 2) * 1.2, 1e-12);
  });
  it('uses the largest average of adjacent spacings for interior girders and says so', () => {
    const r = computeCodeFactors(usDeck({ girders: { kind: 'offsets', offsets: [0, 8, 17, 25, 33] } }));
    // Interior averages: (8+9)/2, (9+8)/2, (8+8)/2 → S = 8.5 ft (girder 2).
    expect(r.derived.interiorSpacing! / 0.3048).toBeRelativelyClose(8.5, 1e-12);
    expect(r.findings.some((f) => f.code === 'assumption' && /S = 8\.50 ft/.test(f.message))).toBe(true);
  });
});

describe('skew reduction far outside the ranges', () => {
  it('takes no reduction when 1 − c1·(tanθ)^1.5 would not be positive (Table 4.6.2.2.2e-1)', () => {
    // Kg/(12·L·ts³) = 8·(2e6 + 2000·80²)/(12·20·4.5³) ≈ 2.2e3, S/L = 15/20: c1 ≈ 1.42; tan 60°^1.5 = 2.28.
    const r = computeCodeFactors(
      usDeck({ girders: { kind: 'uniform', count: 5, spacing: 15 }, slab: { thickness: 4.5 }, section: { area: 2000, inertia: 2e6, eg: 80 }, spans: [{ length: 20 }], supports: [{ skew: 60 }, { skew: 60 }] }),
    );
    const row = r.factors.find((x) => x.girderKind === 'interior' && x.effect === 'moment' && x.method === 'formula')!;
    expect(row.skewFactor).toBe(1);
    expect(row.findings.some((f) => f.parameter === 'c1' && f.code === 'not-applicable')).toBe(true);
  });
});
