/**
 * Hand computations for the section types not written out in handCalcs.test.ts: c (open
 * boxes, the same equations as b in Tables 4.6.2.2.2b-1 and 4.6.2.2.3a-1), j (precast tees:
 * S/D of Art. 4.6.2.2.2b with K = 2.0 for tee beams when connected only by shear keys, the
 * beam-slab equations with Kg when acting as a unit) and k (precast I beams, the beam-slab
 * equations of Table 4.6.2.2.2b-1 and 4.6.2.2.3a-1). US customary values as the code prints
 * them; each expected number is derived beside its check.
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors } from '../../../shared/index.js';
import { pickRow, usDeck } from './decks.js';

const pick = pickRow;

describe('type c: open boxes, 4 @ 10 ft, L = 100 ft, d = 48 in, right deck', () => {
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'c',
      girders: { kind: 'uniform', count: 4, spacing: 10 },
      overhangLeft: 3.5,
      overhangRight: 3.5,
      slab: { thickness: 7.5 },
      section: { depth: 48 },
      spans: [{ length: 100 }],
    }),
  );
  // S·d/(12·L²) = 10·48/(12·100²) = 0.004; d/(12·L) = 48/1200 = 0.04.
  it('interior moment and shear by the spread-box equations', () => {
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose((10 / 3.0) ** 0.35 * 0.004 ** 0.25, 1e-12); // 0.3833
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose((10 / 6.3) ** 0.6 * 0.004 ** 0.125, 1e-12); // 0.6617
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose((10 / 10) ** 0.6 * 0.04 ** 0.1, 1e-12); // 0.7248
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose((10 / 7.4) ** 0.8 * 0.04 ** 0.1, 1e-12); // 0.9222
  });
  it('exterior, two or more lanes: e = 0.97 + de/28.5 for moment, 0.8 + de/10 for shear (de = 2.0 ft)', () => {
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose((0.97 + 2 / 28.5) * (10 / 6.3) ** 0.6 * 0.004 ** 0.125, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose((0.8 + 2 / 10) * (10 / 7.4) ** 0.8 * 0.04 ** 0.1, 1e-12);
  });
});

describe('type j: precast tees, 6 @ 6 ft (b = 72 in), L = 50 ft', () => {
  const base = {
    sectionType: 'j',
    girders: { kind: 'uniform', count: 6, spacing: 6 },
    overhangLeft: 3,
    overhangRight: 3,
    section: { area: 500, inertia: 30000, eg: 20, width: 72, beamShape: 'tee', actsAsUnit: false },
    spans: [{ length: 50 }],
  };
  it('connected only by shear keys: g = S/D with K = 2.0 for tee beams', () => {
    const r = computeCodeFactors(usDeck(base));
    // W = 5·6 + 2·3 = 36 ft; roadway 36 − 2·1.5 = 33 ft → NL = INT(33/12) = 2.
    // C = K·W/L = 2.0·36/50 = 1.44 ≤ K; D = 11.5 − 2 + 1.4·2·(1 − 0.2·1.44)² = 9.5 + 2.8·0.712² = 10.91944 ft.
    const D = 11.5 - 2 + 1.4 * 2 * (1 - 0.2 * 1.44) ** 2;
    expect(D).toBeRelativelyClose(10.91944, 1e-6);
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(6 / D, 1e-12); // 0.5495
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(6 / D, 1e-12);
  });
  it('acting as a unit: the beam-slab equation with Kg = n(I + A·eg²)', () => {
    const r = computeCodeFactors(usDeck({ ...base, section: { ...base.section, actsAsUnit: true } }));
    // n = 8 (base deck), Kg = 8·(30,000 + 500·20²) = 1,840,000 in⁴; ts = 8 in, L = 50 ft, S = 6 ft.
    const stiff = (8 * (30000 + 500 * 20 ** 2)) / (12 * 50 * 8 ** 3);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(0.075 + (6 / 9.5) ** 0.6 * (6 / 50) ** 0.2 * stiff ** 0.1, 1e-12);
  });
});

describe('type k: precast I beams, 5 @ 8 ft, L = 80 ft, ts = 8 in, Kg = 8·(20,000 + 50·30²) = 520,000 in⁴', () => {
  const r = computeCodeFactors(usDeck({ sectionType: 'k' }));
  const stiff = 520000 / (12 * 80 * 8 ** 3); // Kg/(12·L·ts³) = 1.0579
  it('interior moment, both lane cases', () => {
    expect(r.derived.Kg).toBeDefined();
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(0.06 + (8 / 14) ** 0.4 * (8 / 80) ** 0.3 * stiff ** 0.1, 1e-12); // 0.4629
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(0.075 + (8 / 9.5) ** 0.6 * (8 / 80) ** 0.2 * stiff ** 0.1, 1e-12); // 0.6474
  });
  it('interior shear, and the exterior e = 0.77 + de/9.1 with de = 1.5 ft', () => {
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose(0.36 + 8 / 25, 1e-12); // 0.68
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose(0.2 + 8 / 12 - (8 / 35) ** 2, 1e-12); // 0.8144
    const gInt = 0.075 + (8 / 9.5) ** 0.6 * (8 / 80) ** 0.2 * stiff ** 0.1;
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose((0.77 + 1.5 / 9.1) * gInt, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose((0.6 + 1.5 / 10) * (0.2 + 8 / 12 - (8 / 35) ** 2), 1e-12);
  });
});
