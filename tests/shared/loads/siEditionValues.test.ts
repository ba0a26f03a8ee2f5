/**
 * The SI edition's design values (deck field `designValues: 'si-edition'`,
 * shared/loads/designValues.ts) against closed forms derived here.
 *
 * Sources: AASHTO LRFD (SI) Art. 3.6.1.2.2 (design truck 35, 145, 145 kN; 4300 mm, then
 * 4300–9000 mm; gauge 1800 mm), Art. 3.6.1.2.3 (tandem 2 × 110 kN at 1200 mm), Art. 3.6.1.2.4
 * (9.3 N/mm), Art. 3.6.1.4.1 (fatigue truck, constant 9000 mm rear spacing), Art. 3.6.1.1.1
 * (INT(w/3600 mm); two lanes of w/2 from 6000 to 7200 mm), Art. 3.6.1.3.1 (wheel centres 600 mm
 * from the lane edge), Table 3.6.1.1.2-1 (m = 1.2 for one lane), Table 3.6.2.1-1 (IM 33 %, 15 %
 * fatigue). From memory of the 4th edition 2007 SI and earlier; the truck, tandem, lane load,
 * gauge and 600 mm agree with a scanned page of that edition; the lane-count rule and the
 * fatigue truck's 9000 mm are from memory only.
 *
 * Closed forms (statics of a simple span L, hand derivations):
 * - Moment influence line at x: y(s) = s(L − x)/L for s ≤ x, x(L − s)/L for s ≥ x.
 * - Truck, L = 30 m: R = 325 kN, resultant 145·(4.3 + 8.6)/325 m behind the front axle, so
 *   d = 1.4553846… m behind the middle axle. Largest moment anywhere (Barré's rule): the middle
 *   axle and the resultant symmetric about midspan, the middle axle at a = L/2 − d/2:
 *   M = R·(L/2 − d/2)²/L − 35·4.3. At midspan: the middle axle over midspan,
 *   M = 35·y(10.7) + 145·y(15) + 145·y(19.3) = 35·5.35 + 145·7.5 + 145·5.35 = 2050.5 kN·m.
 * - Tandem at midspan: one axle over it, the other 1.2 m away: 110·(7.5 + 6.9) = 1584 kN·m.
 * - Lane load: M = wL²/8 at midspan, w·a(L − a)/2 at a; end shear wL/2.
 * - Fatigue truck at midspan, middle axle over it: 35·5.35 + 145·7.5 + 145·(30 − 24)/2.
 * - End shear: 145·1 + 145·(L − 4.3)/L + 35·(L − 8.6)/L.
 */
import { describe, expect, it } from 'vitest';
import {
  assertDeck,
  computeCodeFactors,
  designLanes,
  designValuesOf,
  hl93BeamLineEffects,
  IM_FATIGUE,
  IM_STRENGTH_SERVICE,
  leverRule,
  placementRulesForDeck,
  rigidSection,
  SI_EDITION_VALUES,
  US_CUSTOMARY_VALUES,
  DeckInputError,
  type Deck,
} from '../../../shared/index.js';
import { pickRow, usDeck } from '../lrfd/decks.js';

const RTOL = 1e-9;
const kN = 1000;
const L = 30;

describe('SI edition vehicles and lane load', () => {
  it('are the SI edition values, not conversions of the US customary ones', () => {
    const v = SI_EDITION_VALUES;
    expect(v.truck.axles.map((a) => a.weight)).toEqual([35 * kN, 145 * kN, 145 * kN]);
    expect(v.truck.axles.map((a) => a.position)).toEqual([0, 4.3, 8.6]);
    expect(v.truck.variableSpacing).toEqual({ axleIndex: 2, min: 4.3, max: 9.0 });
    expect(v.tandem.axles.map((a) => [a.weight, a.position])).toEqual([[110 * kN, 0], [110 * kN, 1.2]]);
    expect(v.fatigueTruck.axles[2].position - v.fatigueTruck.axles[1].position).toBeRelativelyClose(9.0, RTOL);
    expect(v.laneLoad).toBe(9300);
    expect(v.laneLoadWidth).toBe(3.0);
    expect([v.laneWidth, v.gauge, v.wheelToLaneEdge, v.wheelToCurbForOverhang]).toEqual([3.6, 1.8, 0.6, 0.3]);
    // 8 kip = 35.59 kN and 12 ft = 3.6576 m: the SI edition's values are its own
    expect(US_CUSTOMARY_VALUES.truck.axles[0].weight).not.toBeCloseTo(35 * kN, 0);
    expect(US_CUSTOMARY_VALUES.laneWidth).not.toBeCloseTo(3.6, 3);
  });
});

describe('HL-93 beam line with the SI edition values, 30 m simple span', () => {
  const R = 325 * kN;
  const d = (145 * kN * (4.3 + 8.6)) / R - 4.3; // middle axle to resultant, m
  const a = L / 2 - d / 2; // section of the largest truck moment
  const y = (x: number, s: number) => (s <= x ? (s * (L - x)) / L : (x * (L - s)) / L);
  const truckMid = 35 * kN * y(15, 10.7) + 145 * kN * y(15, 15) + 145 * kN * y(15, 19.3);
  const truckMax = (R * (L / 2 - d / 2) ** 2) / L - 35 * kN * 4.3;
  const tandemMid = 110 * kN * (y(15, 15) + y(15, 13.8));
  const laneMid = (9300 * L * L) / 8;
  const fatigueMid = 35 * kN * y(15, 10.7) + 145 * kN * y(15, 15) + 145 * kN * y(15, 24);

  const effects = hl93BeamLineEffects({ spans: [L], continuous: false }, { fractions: [0, a / L, 0.5], values: SI_EDITION_VALUES });
  const at = (f: number) => effects.points.find((p) => Math.abs(p.fraction - f) < 1e-12)!;

  it('midspan: the truck with its middle axle over midspan, 2050.5 kN·m, and the lane load wL²/8', () => {
    expect(truckMid).toBeRelativelyClose(2050.5 * kN, 1e-12); // the hand sum of the header
    const m = at(0.5).moment.max;
    expect(m.governing).toBe('design truck');
    expect(m.vehicleEffect).toBeRelativelyClose(truckMid, RTOL);
    expect(m.laneEffect).toBeRelativelyClose(laneMid, RTOL);
    expect(m.value).toBeRelativelyClose((1 + IM_STRENGTH_SERVICE) * truckMid + laneMid, RTOL);
    const tandem = m.candidates.find((c) => c.loading === 'design tandem')!;
    expect(tandem.value).toBeRelativelyClose((1 + IM_STRENGTH_SERVICE) * tandemMid + laneMid, RTOL);
  });

  it('the largest truck moment: middle axle and resultant symmetric about midspan, above the midspan value', () => {
    const m = at(a / L).moment.max;
    expect(m.vehicleEffect).toBeRelativelyClose(truckMax, RTOL);
    expect(m.laneEffect).toBeRelativelyClose((9300 * a * (L - a)) / 2, RTOL);
    // the middle axle stands at the section, the rear spacing at its least 4.3 m
    expect(m.position!.axleSpacing).toBeRelativelyClose(4.3, RTOL);
    const middle = m.position!.axles.find((p) => p.weight === 145 * kN && Math.abs(p.position - a) < 1e-9);
    expect(middle).toBeDefined();
    expect(truckMax).toBeGreaterThan(truckMid);
    expect(truckMax - truckMid).toBeRelativelyClose((R * d * d) / (4 * L), RTOL); // (R/L)[(L/2 − d/2)² − L/2·(L/2 − d)] = R·d²/(4L)
  });

  it('fatigue truck at midspan with its 9.0 m rear spacing, IM 15 %', () => {
    const f = at(0.5).fatigueMoment!.max;
    expect(f.vehicleEffect).toBeRelativelyClose(fatigueMid, RTOL);
    expect(f.value).toBeRelativelyClose((1 + IM_FATIGUE) * fatigueMid, RTOL);
  });

  it('end shear: the rear axles over the support and the lane load wL/2', () => {
    const v = at(0).shear.max;
    const truck = 145 * kN + (145 * kN * (L - 4.3)) / L + (35 * kN * (L - 8.6)) / L;
    expect(v.governing).toBe('design truck');
    expect(v.vehicleEffect).toBeRelativelyClose(truck, RTOL);
    expect(v.laneEffect).toBeRelativelyClose((9300 * L) / 2, RTOL);
  });

  it('the trace names the SI edition as the source of the truck', () => {
    const truck = effects.trace.find((s) => s.label === 'Design truck')!;
    expect(truck.article).toBe('AASHTO LRFD (SI) Art. 3.6.1.2.2');
    expect(truck.value).toBeRelativelyClose(R, RTOL);
    expect(effects.trace[0].label).toBe('Design values: SI edition values');
    expect(effects.trace[0].article.startsWith('AASHTO LRFD (SI) Art. 3.6.1.1.1')).toBe(true);
  });
});

describe('design lanes with the SI edition values (Art. 3.6.1.1.1)', () => {
  it('INT(w / 3.6 m): 7.3 m gives 2 lanes of 3.6 m, 10.9 m gives 3, 5.9 m gives 1', () => {
    for (const [w, n] of [[7.3, 2], [10.9, 3], [5.9, 1], [14.4, 4]] as const) {
      const r = designLanes(w, SI_EDITION_VALUES);
      expect(r.count).toBe(Math.floor(w / 3.6 + 1e-9));
      expect(r.count).toBe(n);
      expect(r.width).toBe(3.6);
      expect(r.trace.article).toBe('AASHTO LRFD (SI) Art. 3.6.1.1.1');
    }
  });
  it('6.0 m to 7.2 m: two lanes of w/2, both ends included', () => {
    for (const w of [6.0, 6.5, 7.2]) {
      const r = designLanes(w, SI_EDITION_VALUES);
      expect(r.count).toBe(2);
      expect(r.width).toBeRelativelyClose(w / 2, RTOL);
    }
  });
  it('differ from the converted US rule where the editions part (7.3 m: 23.95 ft, in the 20–24 ft two-lane range; 10.9 m: INT(35.76/12) = 2)', () => {
    expect(designLanes(7.3, US_CUSTOMARY_VALUES).width).toBeRelativelyClose(7.3 / 2, RTOL);
    expect(designLanes(10.9, US_CUSTOMARY_VALUES).count).toBe(2);
  });
  it('refuse a roadway narrower than one 3600 mm lane, naming the field', () => {
    expect(() => designLanes(3.5, SI_EDITION_VALUES)).toThrow(DeckInputError);
    expect(() => designLanes(3.5, SI_EDITION_VALUES)).toThrow(/narrower than one 3600 mm design lane \(AASHTO LRFD \(SI\) Art\. 3\.6\.1\.1\.1\)/);
  });
});

/** Four girders at 2.4 m, overhangs 0.9 m, barriers 0.85 m: a 7.3 m roadway, curb faces at −0.05 m and 7.25 m. */
function siDeck(designValues?: 'si-edition' | 'us-customary'): Deck {
  const base = usDeck();
  return assertDeck({
    ...base,
    girders: { kind: 'uniform', count: 4, spacing: 2.4 },
    overhangLeft: 0.9,
    overhangRight: 0.9,
    barrierLeft: { width: 0.85, height: 0.8 },
    barrierRight: { width: 0.85, height: 0.8 },
    spans: [{ length: L }],
    ...(designValues ? { designValues } : {}),
  });
}

describe('a 7.3 m roadway deck with the SI edition values', () => {
  const deck = siDeck('si-edition');

  it('has 2 design lanes of 3.6 m and the SI placement rules', () => {
    const code = computeCodeFactors(deck);
    expect(code.derived.roadwayWidth).toBeRelativelyClose(7.3, RTOL);
    expect(code.derived.designLanes).toBe(2);
    expect(code.derived.designLaneWidth).toBe(3.6);
    const rules = placementRulesForDeck(deck);
    expect([rules.laneWidth, rules.laneCount, rules.gauge, rules.wheelToLaneEdge]).toEqual([3.6, 2, 1.8, 0.6]);
    expect(placementRulesForDeck(deck, { overhang: true }).wheelToCurb).toBe(0.3);
  });

  it('lever rule, exterior girder, one lane: wheels 0.6 m and 2.4 m from the barrier face, g = 1.2·Σηᵢ/2 = 0.475', () => {
    // curb face at −0.05 m; wheels at 0.55 m and 2.35 m; hinge at girder 2 (2.4 m): η = (2.4 − x)/2.4
    const sumEta = (2.4 - 0.55) / 2.4 + (2.4 - 2.35) / 2.4;
    const hand = (1.2 * sumEta) / 2;
    expect(hand).toBeRelativelyClose(0.475, 1e-12);
    const r = leverRule([0, 2.4, 4.8, 7.2], 0, -0.05, 7.25, 3.6, 2, { loadedLanes: [1], values: SI_EDITION_VALUES });
    expect(r.value).toBeRelativelyClose(hand, RTOL);
    expect(r.worksheet.cases[0].trucks[0].wheels.map((w) => w.offset)).toEqual([expect.closeTo(0.55, 12), expect.closeTo(2.35, 12)]);
    expect(r.trace[0].article.startsWith('AASHTO LRFD (SI) Art. 4.6.2.2.1')).toBe(true);
    // the deck's own code factors use the same rule
    const row = pickRow(computeCodeFactors(deck), 'exterior', 'moment', 'one', 'lever-rule');
    expect(row.baseValue).toBeRelativelyClose(hand, RTOL);
  });

  it('rigid section: each truck centre 0.6 m + 0.9 m from its lane edge toward the exterior girder', () => {
    const r = rigidSection([0, 2.4, 4.8, 7.2], 'left', -0.05, 7.25, 3.6, 2, SI_EDITION_VALUES);
    // centroid 3.6 m; truck centres at −0.05 + 1.5 = 1.45 m and 1.45 + 3.6 = 5.05 m
    expect(r.worksheet.cases[1].eccentricities[0]).toBeRelativelyClose(1.45 - 3.6, RTOL);
    expect(r.worksheet.cases[1].eccentricities[1]).toBeRelativelyClose(5.05 - 3.6, RTOL);
    const x = [-3.6, -1.2, 1.2, 3.6];
    const sumX2 = x.reduce((s, v) => s + v * v, 0);
    expect(r.one.value).toBeRelativelyClose(1.2 * (1 / 4 + (-3.6 * (1.45 - 3.6)) / sumX2), RTOL);
  });
});

describe('switching a deck to the converted US customary values', () => {
  it('gives exactly the results of the deck without the field (a stored deck from before)', () => {
    const si = siDeck('si-edition');
    const switched = assertDeck({ ...si, designValues: 'us-customary' });
    const { designValues: _dropped, ...older } = si;
    const before = assertDeck(older);
    expect(before.designValues).toBe('us-customary');
    expect(designValuesOf(switched)).toBe(US_CUSTOMARY_VALUES);
    expect(computeCodeFactors(switched)).toEqual(computeCodeFactors(before));
    expect(placementRulesForDeck(switched)).toEqual(placementRulesForDeck(before));
    const beam = { spans: [L], continuous: false };
    expect(hl93BeamLineEffects(beam, { values: designValuesOf(switched) })).toEqual(hl93BeamLineEffects(beam));
    // and the SI edition's values do change them (the check above could fail)
    expect(computeCodeFactors(si).derived.designLaneWidth).not.toBe(computeCodeFactors(switched).derived.designLaneWidth);
  });

  it('a US customary example deck computes as before the field existed', () => {
    const us = usDeck();
    expect(us.designValues).toBe('us-customary');
    const r = computeCodeFactors(us);
    expect(r.derived.designLaneWidth).toBeRelativelyClose(12 * 0.3048, 1e-12);
    expect(r.trace.some((s) => s.label.startsWith('Design values'))).toBe(false);
  });
});
