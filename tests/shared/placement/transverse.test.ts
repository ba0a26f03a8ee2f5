/**
 * Governing placement on transverse lines (lever rule, rigid section) against published
 * values, hand computations and brute-force enumeration of legal placements.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluateTransverse } from '../../../shared/placement/evaluate.js';
import { clampPlacement, placementRules, wheelOffsetRange, type Placement, type PlacementRules } from '../../../shared/placement/rules.js';
import { governingTransversePlacement } from '../../../shared/placement/search.js';
import { leverRuleLine, rigidSectionLine, transverseLine, type TransverseLine } from '../../../shared/placement/transverseLines.js';
import { PlacementError } from '../../../shared/placement/rules.js';
import { fromUs, toUs } from '../../../shared/units.js';

const ft = fromUs.ft;

// FHWA, LRFD Design Example for Prestressed Concrete Girder Superstructure Bridge, Design Step 5.1:
// six girders at 9'-8", de = 1.83 ft (curb face 1.83 ft outboard of the exterior girder).
const S = ft(9 + 8 / 12);
const offsets = Array.from({ length: 6 }, (_, i) => i * S);
const curbLeft = -ft(1.83);
const curbRight = offsets[5] + ft(1.83);
const fhwaRules = placementRules({ curbLeft, curbRight });

describe('lever rule and rigid section through the search', () => {
  it('exterior girder, lever rule: 0.672 lanes before m and 0.806 after m = 1.2 (FHWA PS example, Design Step 5.1)', () => {
    const g = governingTransversePlacement(leverRuleLine(offsets, 0, curbLeft, curbRight), fhwaRules);
    expect(g.loadedLanes).toBe(1);
    expect(Number((g.value / 1.2).toFixed(3))).toBe(0.672);
    expect(Number(g.value.toFixed(3))).toBe(0.806);
    // wheel 2 ft from the curb face (Art. 3.6.1.3.1): lane at the curb, offset 2 ft
    expect(g.placement.lanes[0].left).toBeRelativelyClose(curbLeft, 1e-9);
    expect(toUs.ft(g.placement.lanes[0].wheelOffset)).toBeRelativelyClose(2, 1e-9);
    expect(g.tolerance.kind).toBe('exact');
  });

  it('exterior girder, rigid section (Eq. C4.6.2.2.2d-1): equals the hand computation with lanes packed from the curb', () => {
    // Hand computation: x_ext = 2.5 S, Σx² = 2·(0.5² + 1.5² + 2.5²)·S² = 17.5 S²; lane i's truck centre is
    // 2 + 3 + 12 i ft from the curb face; e_i its distance from the girders' centre toward girder 1.
    // R = NL/Nb + x_ext·Σe/Σx² (Eq. C4.6.2.2.2d-1), times m (Table 3.6.1.1.2-1).
    const xExt = 2.5 * S;
    const sumX2 = 17.5 * S * S;
    const expected = [1, 2, 3, 4].map((k) => {
      // centre of truck i, from girder 1: curbLeft + 5 ft + 12 i ft; e_i = centre of girders − that position
      let sumE = 0;
      for (let i = 0; i < k; i++) sumE += offsets[5] / 2 - (curbLeft + ft(5 + 12 * i));
      const m = [1.2, 1.0, 0.85, 0.65][k - 1];
      return m * (k / 6 + (xExt * sumE) / sumX2);
    });
    const g = governingTransversePlacement(rigidSectionLine(offsets, 0, curbLeft, curbRight), fhwaRules);
    g.byLaneCount.forEach((r, i) => expect(r.value).toBeRelativelyClose(expected[i], 1e-12));
    expect(g.loadedLanes).toBe(2);
  });

  it('interior girder, lever rule, one lane: wheels straddle the girder, 1.2·(1 − 3/S) … by statics', () => {
    // Hand computation: a wheel pair 6 ft apart centred on girder 3 gives 2·(S − 3 ft)/S per two wheels, /2 per lane.
    const g = governingTransversePlacement(leverRuleLine(offsets, 2, curbLeft, curbRight), fhwaRules, { laneCounts: [1] });
    const share = (S - ft(3)) / S;
    expect(g.value).toBeRelativelyClose(1.2 * share, 1e-12);
  });

  it('negative sense: rigid-section uplift of girder 1 with the trucks packed against the far curb (Eq. C4.6.2.2.2d-1)', () => {
    // Hand computation, mirror of the case above: trucks packed from the right curb face, e_i measured toward
    // girder 6, so R_1 = NL/Nb − x_ext·Σe/Σx², times m; the search must find the most negative of these.
    const xExt = 2.5 * S;
    const sumX2 = 17.5 * S * S;
    const expected = [1, 2, 3, 4].map((k) => {
      let sumE = 0;
      for (let i = 0; i < k; i++) sumE += curbRight - ft(5 + 12 * i) - offsets[5] / 2;
      return [1.2, 1.0, 0.85, 0.65][k - 1] * (k / 6 - (xExt * sumE) / sumX2);
    });
    const line = rigidSectionLine(offsets, 0, curbLeft, curbRight);
    const g = governingTransversePlacement(line, fhwaRules, { sense: 'negative' });
    g.byLaneCount.forEach((r, i) => expect(r.value).toBeRelativelyClose(expected[i], 1e-12));
    expect(g.value).toBeRelativelyClose(Math.min(...expected), 1e-12);
    expect(g.value).toBeLessThan(0);
    const brute = bruteForce(line, fhwaRules, [1, 2], -1, ft(0.5));
    expect(g.value).toBeLessThanOrEqual(brute + 1e-12);
  });

  it('refuses a line that does not cover the roadway', () => {
    const short = transverseLine([0, 1], [1, 1]);
    expect(() => governingTransversePlacement(short, fhwaRules)).toThrow(PlacementError);
  });
});

/** Brute force: every placement on a grid of lane edges (step h) and wheel offsets (ends and middle). */
function bruteForce(line: TransverseLine, rules: PlacementRules, counts: number[], sgn: 1 | -1, h: number): number {
  const lo = rules.curbLeft;
  const hi = rules.curbRight - rules.laneWidth;
  const edges: number[] = [];
  for (let p = lo; p <= hi + 1e-12; p += h) edges.push(p);
  edges.push(hi);
  let best = -Infinity;
  const rec = (k: number, start: number, lanes: Placement['lanes']) => {
    if (lanes.length === k) {
      const v = sgn * evaluateTransverse(line, { lanes }, rules).value;
      if (v > best) best = v;
      return;
    }
    for (let e = start; e < edges.length; e++) {
      const p = edges[e];
      if (lanes.length && p < lanes[lanes.length - 1].left + rules.laneWidth - 1e-12) continue;
      const r = wheelOffsetRange(rules, p);
      for (const o of [r.min, (r.min + r.max) / 2, r.max]) rec(k, e + 1, [...lanes, { left: p, wheelOffset: o }]);
    }
  };
  for (const k of counts) rec(k, 0, []);
  return sgn * best;
}

describe('transverse search against brute force (fast-check)', () => {
  const caseArb = fc.record({
    width: fc.double({ min: 12.5, max: 40, noNaN: true }),
    overhang: fc.boolean(),
    stations: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 0, maxLength: 8 }),
    values: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 10, maxLength: 10 }),
    negative: fc.boolean(),
    drags: fc.array(
      fc.record({ lefts: fc.array(fc.double({ min: -5, max: 45, noNaN: true }), { minLength: 3, maxLength: 3 }), offs: fc.array(fc.double({ min: 0, max: 5, noNaN: true }), { minLength: 3, maxLength: 3 }) }),
      { minLength: 20, maxLength: 20 },
    ),
  });

  it('no enumerated or dragged legal placement beats the search (random piecewise-linear lines)', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        const w = ft(c.width);
        const rules = placementRules({ curbLeft: 0, curbRight: w }, { overhang: c.overhang });
        const inner = [...new Set(c.stations.map((s) => s * w))].filter((y) => y > 0 && y < w).sort((a, b) => a - b);
        const ys = [0, ...inner, w];
        const line = transverseLine(ys, ys.map((_, i) => c.values[i % c.values.length]));
        const sgn = c.negative ? -1 : 1;
        const g = governingTransversePlacement(line, rules, { sense: c.negative ? 'negative' : 'positive' });
        // The reported placement is legal and its value is what the search says.
        expect(evaluateTransverse(line, g.placement, rules).value).toBeRelativelyClose(g.value, 1e-12);
        const counts = Array.from({ length: rules.laneCount }, (_, i) => i + 1);
        const brute = bruteForce(line, rules, counts, sgn, ft(1));
        expect(sgn * g.value).toBeGreaterThanOrEqual(sgn * brute - 1e-12);
        // Random drags (clamped into legality) never beat it either.
        for (const d of c.drags) {
          for (const k of counts) {
            const p = clampPlacement({ lanes: Array.from({ length: k }, (_, i) => ({ left: ft(d.lefts[i]), wheelOffset: ft(d.offs[i]) })) }, rules);
            expect(sgn * evaluateTransverse(line, p, rules).value).toBeLessThanOrEqual(sgn * g.value + 1e-12);
          }
        }
        // Per lane count, too.
        for (const r of g.byLaneCount) {
          const b = bruteForce(line, rules, [r.loadedLanes], sgn, ft(1));
          expect(sgn * r.value).toBeGreaterThanOrEqual(sgn * b - 1e-12);
        }
      }),
      { numRuns: 60 },
    );
  }, 60000);
});
