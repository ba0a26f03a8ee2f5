/**
 * Hand computations of each equation for one deck of every formula family, written out in
 * US customary units exactly as AASHTO LRFD prints them (9th edition tables):
 *   moment  Table 4.6.2.2.2b-1 (interior), 4.6.2.2.2d-1 (exterior), skew Table 4.6.2.2.2e-1
 *   shear   Table 4.6.2.2.3a-1 (interior), 4.6.2.2.3b-1 (exterior), skew Table 4.6.2.2.3c-1
 *   lever rule Art. 4.6.2.2.1 with Art. 3.6.1.3.1 wheel placement; rigid section Eq. C4.6.2.2.2d-1
 *   multiple presence Table 3.6.1.1.2-1; lanes Art. 3.6.1.1.1.
 * The expected numbers are derived by hand in the comments beside each check (statics for
 * the lever rule and the rigid section); the engine gets the deck in display units and goes
 * through the unit conversions, the range checks, the fallbacks and the selection.
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, type CodeFactorResult, type FactorRow } from '../../../shared/index.js';
import { pickRow, usDeck } from './decks.js';

const tan = (deg: number) => Math.tan((deg * Math.PI) / 180);

const pick = pickRow;
const gov = (r: CodeFactorResult, girder: 'interior' | 'exterior', effect: FactorRow['effect'], key = 'span1') =>
  r.governing.find((g) => g.girder === girder && g.effect === effect && g.location.key === key)!;

describe('type a: steel beams, 5 @ 8 ft, L = 80 ft, ts = 8 in, Kg = 520,000 in⁴, skew 40°, cross-frames', () => {
  // Kg = n(I + A·eg²) = 8·(20,000 + 50·30²) = 520,000 in⁴ (Eq. 4.6.2.2.1-1).
  // Kg/(12·L·ts³) = 520,000/(12·80·512) = 1.0579427.
  // Roadway = 4·8 + 2·3 − 2·1.5 = 35 ft → NL = INT(35/12) = 2. de = 3 − 1.5 = 1.5 ft.
  const r = computeCodeFactors(
    usDeck({ supports: [{ skew: 40 }, { skew: 40 }], diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3 } }),
  );
  const stiff = 520000 / (12 * 80 * 8 ** 3);
  const gm1 = 0.06 + (8 / 14) ** 0.4 * (8 / 80) ** 0.3 * stiff ** 0.1; // ≈ 0.4714
  const gm2 = 0.075 + (8 / 9.5) ** 0.6 * (8 / 80) ** 0.2 * stiff ** 0.1; // ≈ 0.6474
  const c1 = 0.25 * stiff ** 0.25 * (8 / 80) ** 0.5; // ≈ 0.08018
  const skewM = 1 - c1 * tan(40) ** 1.5; // ≈ 0.9384
  const skewV = 1 + 0.2 * (1 / stiff) ** 0.3 * tan(40); // ≈ 1.1652

  it('derived values', () => {
    expect(r.derived.designLanes).toBe(2);
    expect(r.derived.Kg! / 0.0254 ** 4).toBeRelativelyClose(520000, 1e-12);
  });
  it('interior moment, both lane cases, with the skew reduction', () => {
    expect(pick(r, 'interior', 'moment', 'one', 'formula').baseValue).toBeRelativelyClose(gm1, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').baseValue).toBeRelativelyClose(gm2, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').skewFactor).toBeRelativelyClose(skewM, 1e-12);
    expect(gov(r, 'interior', 'moment').value).toBeRelativelyClose(gm2 * skewM, 1e-12);
  });
  it('interior shear with the obtuse-corner correction', () => {
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose((0.36 + 8 / 25) * skewV, 1e-12);
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose((0.2 + 8 / 12 - (8 / 35) ** 2) * skewV, 1e-12);
  });
  it('exterior: lever rule, e·g_interior and the rigid-section check', () => {
    // Lever rule: curb face 1.5 ft outside girder 1; wheels at 0.5 ft and 6.5 ft inside it;
    // hinge at girder 2 (8 ft): R = (7.5 + 1.5)/8 / 2 = 0.5625 lanes; × 1.2 = 0.675.
    expect(pick(r, 'exterior', 'moment', 'one', 'lever-rule').baseValue).toBeRelativelyClose(0.675, 1e-12);
    // e = 0.77 + 1.5/9.1; g = e · g_interior(two lanes).
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').baseValue).toBeRelativelyClose((0.77 + 1.5 / 9.1) * gm2, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').baseValue).toBeRelativelyClose((0.6 + 1.5 / 10) * (0.2 + 8 / 12 - (8 / 35) ** 2), 1e-12);
    // Rigid section: x = −16, −8, 0, 8, 16 ft; Σx² = 640 ft². Curb at −17.5 ft; truck centres
    // 5 ft from each lane's outer edge: e1 = −12.5 ft, e2 = −0.5 ft.
    // One lane: 1.2·(1/5 + 16·12.5/640) = 1.2·0.5125 = 0.615. Two: 1.0·(2/5 + 16·13/640) = 0.725.
    const one = pick(r, 'exterior', 'moment', 'one', 'rigid-section');
    const two = pick(r, 'exterior', 'moment', 'multiple', 'rigid-section');
    expect(one.baseValue).toBeRelativelyClose(0.615, 1e-12);
    expect(two.baseValue).toBeRelativelyClose(0.725, 1e-12);
    expect(two.rigidSection!.sumX2 / 0.3048 ** 2).toBeRelativelyClose(640, 1e-12);
    // Governing exterior moment: the rigid section with two lanes, reduced for skew.
    const g = gov(r, 'exterior', 'moment');
    expect(g.method).toBe('rigid-section');
    expect(g.value).toBeRelativelyClose(0.725 * skewM, 1e-12);
    // Fatigue: the adopted one-lane value without m: max(0.675, 0.615)·skew / 1.2.
    expect(gov(r, 'exterior', 'fatigue-moment').value).toBeRelativelyClose((0.675 * skewM) / 1.2, 1e-12);
    // Deflection: m·NL/Nb = 1.0·2/5.
    expect(gov(r, 'interior', 'deflection', 'deck').value).toBeRelativelyClose(0.4, 1e-12);
  });
});

describe('type e: tee beams, Nb = 3 @ 9 ft, L = 50 ft, roadway 23 ft (two 11.5 ft lanes)', () => {
  // Kg = 1·(40,000 + 600·20²) = 280,000 in⁴; Kg/(12·50·7³) = 280,000/205,800 = 1.3605442.
  // Roadway = 18 + 2·4 − 2·1.5 = 23 ft: 20–24 ft rule, two lanes of 11.5 ft.
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'e',
      girders: { kind: 'uniform', count: 3, spacing: 9 },
      overhangLeft: 4,
      overhangRight: 4,
      slab: { thickness: 7 },
      section: { area: 600, inertia: 40000, eg: 20 },
      materials: { deck: { kind: 'modulus', modulus: 3600 }, girder: { kind: 'modulus', modulus: 3600 } },
      spans: [{ length: 50 }],
    }),
  );
  const stiff = 280000 / (12 * 50 * 7 ** 3);
  const f1 = 0.06 + (9 / 14) ** 0.4 * (9 / 50) ** 0.3 * stiff ** 0.1; // ≈ 0.577
  const f2 = 0.075 + (9 / 9.5) ** 0.6 * (9 / 50) ** 0.2 * stiff ** 0.1; // ≈ 0.784
  it('two design lanes of w/2 by the 20–24 ft rule', () => {
    expect(r.derived.designLanes).toBe(2);
    expect(r.derived.designLaneWidth / 0.3048).toBeRelativelyClose(11.5, 1e-12);
  });
  it('interior moment: the lesser of the formula and the lever rule (Nb = 3)', () => {
    // Lever rule, girder 2, one lane: a wheel over girder 2 (ordinate 1) and one 6 ft away
    // (1 − 6/9): R = (1 + 1/3)/2 = 0.6667; × 1.2 = 0.800.
    const lv1 = pick(r, 'interior', 'moment', 'one', 'lever-rule');
    expect(lv1.baseValue).toBeRelativelyClose(0.8, 1e-12);
    // Two lanes: the lanes fill the roadway, [−2.5, 9] and [9, 20.5] ft; each truck's inner
    // wheel 2 ft from the common lane line (7 ft and 11 ft: ordinates 7/9), outer wheels at
    // 1 ft and 17 ft (1/9): R = (16/9)/2 = 0.8889; m = 1.0.
    const lv2 = pick(r, 'interior', 'moment', 'multiple', 'lever-rule');
    expect(lv2.baseValue).toBeRelativelyClose(8 / 9, 1e-12);
    expect(pick(r, 'interior', 'moment', 'one', 'formula').baseValue).toBeRelativelyClose(f1, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').baseValue).toBeRelativelyClose(f2, 1e-12);
    expect(gov(r, 'interior', 'moment').value).toBeRelativelyClose(Math.max(Math.min(f1, 0.8), Math.min(f2, 8 / 9)), 1e-12);
    expect(r.findings.some((f) => f.parameter === 'Nb' && f.code === 'fallback')).toBe(true);
  });
  it('interior shear: lever rule for Nb = 3', () => {
    expect(gov(r, 'interior', 'shear').method).toBe('lever-rule');
    expect(gov(r, 'interior', 'shear').value).toBeRelativelyClose(8 / 9, 1e-12);
  });
  it('exterior moment, two lanes: the lesser of e·g_interior and the lever rule (Nb = 3)', () => {
    // e = 0.77 + 2.5/9.1; g_interior = min(f2, 8/9) = f2.
    const f = pick(r, 'exterior', 'moment', 'multiple', 'formula');
    expect(f.baseValue).toBeRelativelyClose((0.77 + 2.5 / 9.1) * f2, 1e-12);
    // Lever rule, two lanes, girder 1: lanes fill the roadway; truck 1 wheels at −0.5 and 5.5
    // ft (ordinates 9.5/9, 3.5/9), truck 2 left wheel at 11 ft is past the hinge at 9 ft:
    // R = (13/9)/2 = 0.7222, m = 1.0. One lane: the same first truck, × 1.2 = 0.8667.
    const lv = pick(r, 'exterior', 'moment', 'multiple', 'lever-rule');
    expect(lv.baseValue).toBeRelativelyClose(13 / 18, 1e-12);
    expect(pick(r, 'exterior', 'moment', 'one', 'lever-rule').baseValue).toBeRelativelyClose((13 / 18) * 1.2, 1e-12);
    expect(lv.combine).toBe('lesser-of');
    expect(gov(r, 'exterior', 'moment').value).toBeRelativelyClose(Math.max((13 / 18) * 1.2, Math.min((0.77 + 2.5 / 9.1) * f2, 13 / 18)), 1e-12);
  });
});

describe('type b: spread concrete boxes, 4 @ 10 ft, L = 100 ft, d = 48 in, skew 25°', () => {
  // Roadway = 30 + 7 − 3 = 34 ft → 2 lanes; de = 3.5 − 1.5 = 2.0 ft.
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'b',
      girders: { kind: 'uniform', count: 4, spacing: 10 },
      overhangLeft: 3.5,
      overhangRight: 3.5,
      slab: { thickness: 7.5 },
      section: { depth: 48 },
      spans: [{ length: 100 }],
      supports: [{ skew: 25 }, { skew: 25 }],
    }),
  );
  const sd = (10 * 48) / (12 * 100 ** 2); // S·d/(12·L²) = 0.004
  const m1 = (10 / 3) ** 0.35 * sd ** 0.25;
  const m2 = (10 / 6.3) ** 0.6 * sd ** 0.125;
  const v1 = (10 / 10) ** 0.6 * (48 / (12 * 100)) ** 0.1;
  const v2 = (10 / 7.4) ** 0.8 * (48 / (12 * 100)) ** 0.1;
  const skewM = Math.min(1.05 - 0.25 * tan(25), 1); // 0.9334
  const skewV = 1 + (Math.sqrt((12 * 100) / 48) / (6 * 10)) * tan(25); // 1 + (5/60)·tan25 = 1.0389
  it('interior moment and shear', () => {
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(m1 * skewM, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(m2 * skewM, 1e-12);
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose(v1 * skewV, 1e-12);
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose(v2 * skewV, 1e-12);
  });
  it('exterior: e = 0.97 + de/28.5 (moment), 0.8 + de/10 (shear); lever rule for one lane', () => {
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').baseValue).toBeRelativelyClose((0.97 + 2 / 28.5) * m2, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').baseValue).toBeRelativelyClose((0.8 + 2 / 10) * v2, 1e-12);
    // Lever rule: wheels 0 ft and 6 ft from girder 1 (curb 2 ft outside it): R = (1 + 4/10)/2 = 0.7; × 1.2.
    expect(pick(r, 'exterior', 'moment', 'one', 'lever-rule').baseValue).toBeRelativelyClose(0.84, 1e-12);
    // No diaphragms: no rigid-section rows.
    expect(r.factors.some((x) => x.method === 'rigid-section')).toBe(false);
  });
});

describe('type d: cast-in-place multicell box, 5 webs @ 9 ft, Nc = 4, L = 100 ft, d = 60 in', () => {
  // Roadway = 36 + 8 − 3 = 41 ft → 3 lanes. de = 4 − 1.5 = 2.5 ft. We = 9/2 + 4 = 8.5 ft.
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'd',
      girders: { kind: 'uniform', count: 5, spacing: 9 },
      overhangLeft: 4,
      overhangRight: 4,
      section: { cells: 4, depth: 60 },
      spans: [{ length: 100 }],
    }),
  );
  const m1 = (1.75 + 9 / 3.6) * (1 / 100) ** 0.35 * (1 / 4) ** 0.45;
  const m2 = (13 / 4) ** 0.3 * (9 / 5.8) * (1 / 100) ** 0.25;
  const v2 = (9 / 7.3) ** 0.9 * (60 / (12 * 100)) ** 0.1;
  it('interior moment and shear', () => {
    expect(r.derived.designLanes).toBe(3);
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(m1, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(m2, 1e-12);
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose((9 / 9.5) ** 0.6 * (60 / 1200) ** 0.1, 1e-12);
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose(v2, 1e-12);
  });
  it('exterior: We/14 for moment; e = 0.64 + de/12.5 and the lever rule for shear', () => {
    expect(pick(r, 'exterior', 'moment', 'one', 'formula').value).toBeRelativelyClose(8.5 / 14, 1e-12);
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(8.5 / 14, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose((0.64 + 2.5 / 12.5) * v2, 1e-12);
    // Lever rule: curb 2.5 ft outside web 1; wheels at −0.5 ft and 5.5 ft: R = (9.5/9 + 3.5/9)/2 = 13/18; × 1.2.
    expect(pick(r, 'exterior', 'shear', 'one', 'lever-rule').value).toBeRelativelyClose((13 / 18) * 1.2, 1e-12);
  });
});

describe('type f: adjacent boxes, 8 × 48 in, L = 60 ft, I = 100,000 in⁴, J = 150,000 in⁴, d = 33 in, skew 30°', () => {
  // Roadway = 28 + 4 − 3 = 29 ft → 2 lanes; de = 2 − 1.5 = 0.5 ft.
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'f',
      girders: { kind: 'uniform', count: 8, spacing: 4 },
      overhangLeft: 2,
      overhangRight: 2,
      section: { inertia: 100000, torsion: 150000, width: 48, depth: 33 },
      spans: [{ length: 60 }],
      supports: [{ skew: 30 }, { skew: 30 }],
    }),
  );
  const k = 2.5 * 8 ** -0.2; // 1.6494 ≥ 1.5
  const IJ = 100000 / 150000;
  const m1 = k * (48 / (33.3 * 60)) ** 0.5 * IJ ** 0.25;
  const m2 = k * (48 / 305) ** 0.6 * (48 / (12 * 60)) ** 0.2 * IJ ** 0.06;
  const v1 = (48 / (130 * 60)) ** 0.15 * IJ ** 0.05;
  const v2 = (48 / 156) ** 0.4 * (48 / (12 * 60)) ** 0.1 * IJ ** 0.05 * (48 / 48);
  const skewM = 1.05 - 0.25 * tan(30); // 0.9057
  const skewV = 1 + ((12 * 60) / (90 * 33)) * Math.sqrt(tan(30)); // 1.1842
  it('interior', () => {
    expect(pick(r, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(m1 * skewM, 1e-12);
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(m2 * skewM, 1e-12);
    expect(pick(r, 'interior', 'shear', 'one', 'formula').value).toBeRelativelyClose(v1 * skewV, 1e-12);
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula').value).toBeRelativelyClose(v2 * skewV, 1e-12);
  });
  it('exterior: e factors of Tables 4.6.2.2.2d-1 and 4.6.2.2.3b-1', () => {
    expect(pick(r, 'exterior', 'moment', 'one', 'formula').baseValue).toBeRelativelyClose((1.125 + 0.5 / 30) * m1, 1e-12);
    expect(pick(r, 'exterior', 'moment', 'multiple', 'formula').baseValue).toBeRelativelyClose((1.04 + 0.5 / 25) * m2, 1e-12);
    expect(pick(r, 'exterior', 'shear', 'one', 'formula').baseValue).toBeRelativelyClose((1.25 + 0.5 / 20) * v1, 1e-12);
    // e = 1 + ((0.5 + 48/12 − 2.0)/40)^0.5 = 1.25; 48/b = 1.
    expect(pick(r, 'exterior', 'shear', 'multiple', 'formula').baseValue).toBeRelativelyClose(1.25 * v2, 1e-12);
  });
});

describe('types h, g, i connected only by shear keys: S/D method and the lever rule', () => {
  // Channels 6 @ 5 ft, overhang 2.5 ft: W = 25 + 5 = 30 ft, roadway 27 ft → NL = 2; L = 40 ft.
  // C = K·W/L = 2.2·30/40 = 1.65 ≤ K; D = 11.5 − 2 + 1.4·2·(1 − 0.2·1.65)² = 10.75692 ft.
  const h = computeCodeFactors(
    usDeck({
      sectionType: 'h',
      girders: { kind: 'uniform', count: 6, spacing: 5 },
      overhangLeft: 2.5,
      overhangRight: 2.5,
      section: { width: 60, beamShape: 'channel' },
      spans: [{ length: 40 }],
    }),
  );
  const D = 11.5 - 2 + 1.4 * 2 * (1 - 0.2 * 1.65) ** 2;
  it('interior moment S/D, regardless of the number of loaded lanes', () => {
    expect(D).toBeRelativelyClose(10.75692, 1e-6);
    expect(pick(h, 'interior', 'moment', 'one', 'formula').value).toBeRelativelyClose(5 / D, 1e-12);
    expect(pick(h, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(5 / D, 1e-12);
  });
  it('interior shear and exterior: lever rule', () => {
    // Interior, 5 ft spacing: only one wheel of a truck can stand within ±5 ft of the girder
    // (gauge 6 ft): R = 1/2 per truck; one lane 1.2·0.5 = 0.6; two trucks with wheels 4 ft
    // apart straddling the girder: (2 − 4/5)/2 = 0.6, m = 1.0.
    expect(gov(h, 'interior', 'shear').value).toBeRelativelyClose(0.6, 1e-12);
    // Exterior, curb 1 ft outside girder 1, wheel 1 ft inside: R = (4/5)/2 = 0.4; × 1.2 = 0.48.
    expect(pick(h, 'exterior', 'moment', 'one', 'lever-rule').value).toBeRelativelyClose(0.48, 1e-12);
  });
  it('type g not acting as a unit uses K = 1.0 for boxes; acting as a unit uses the f, g formulas', () => {
    const base = {
      sectionType: 'g',
      girders: { kind: 'uniform', count: 8, spacing: 4 },
      overhangLeft: 2,
      overhangRight: 2,
      section: { inertia: 100000, torsion: 150000, width: 48, beamShape: 'box', actsAsUnit: false },
      spans: [{ length: 60 }],
    };
    const g = computeCodeFactors(usDeck(base));
    // W = 32 ft, C = 1.0·32/60 = 0.5333, NL = INT(29/12) = 2: D = 9.5 + 2.8·(1 − 0.10667)².
    const Dg = 9.5 + 2.8 * (1 - 0.2 * (32 / 60)) ** 2;
    expect(pick(g, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(4 / Dg, 1e-12);
    const gu = computeCodeFactors(usDeck({ ...base, section: { ...base.section, actsAsUnit: true } }));
    expect(gu.derived.family).toBe('adjacent-box');
  });
  it('type i acting as a unit uses the beam-slab formulas with Kg', () => {
    const i = computeCodeFactors(usDeck({ sectionType: 'i', section: { area: 50, inertia: 20000, eg: 30, width: 96, actsAsUnit: true } }));
    const stiff = 520000 / (12 * 80 * 8 ** 3);
    expect(pick(i, 'interior', 'moment', 'multiple', 'formula').value).toBeRelativelyClose(0.075 + (8 / 9.5) ** 0.6 * 0.1 ** 0.2 * stiff ** 0.1, 1e-12);
  });
});

describe('continuous spans: L per force effect (Table C4.6.2.2.1-1)', () => {
  // Type b, spans 80–100–80 ft continuous: shear depends on L through (d/(12.0·L))^0.1.
  const r = computeCodeFactors(
    usDeck({
      sectionType: 'b',
      girders: { kind: 'uniform', count: 4, spacing: 10 },
      overhangLeft: 3.5,
      overhangRight: 3.5,
      section: { depth: 48 },
      spans: [{ length: 80 }, { length: 100 }, { length: 80 }],
      continuous: true,
      supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }, { skew: 0 }],
    }),
  );
  const v2 = (L: number) => (10 / 7.4) ** 0.8 * (48 / (12 * L)) ** 0.1;
  const m2 = (L: number) => (10 / 6.3) ** 0.6 * ((10 * 48) / (12 * L * L)) ** 0.125;
  it('positive moment uses its span; negative moment the average of the adjacent spans', () => {
    expect(pick(r, 'interior', 'moment', 'multiple', 'formula', 'span2').value).toBeRelativelyClose(m2(100), 1e-12);
    expect(pick(r, 'interior', 'negative-moment', 'multiple', 'formula', 'support2').value).toBeRelativelyClose(m2(90), 1e-12);
  });
  it('exterior reaction uses the exterior span; interior reaction the average', () => {
    expect(pick(r, 'interior', 'reaction', 'multiple', 'formula', 'support1').value).toBeRelativelyClose(v2(80), 1e-12);
    expect(pick(r, 'interior', 'reaction', 'multiple', 'formula', 'support2').value).toBeRelativelyClose(v2(90), 1e-12);
    expect(pick(r, 'interior', 'shear', 'multiple', 'formula', 'span2').value).toBeRelativelyClose(v2(100), 1e-12);
  });
});
