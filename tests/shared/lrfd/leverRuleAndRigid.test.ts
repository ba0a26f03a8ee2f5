/**
 * Lever rule (AASHTO LRFD Art. 4.6.2.2.1; wheels per Art. 3.6.1.3.1: 6 ft gauge, wheel
 * centres ≥ 2 ft from the lane edge; lanes anywhere in the roadway, Art. 3.6.1.1.1) and the
 * rigid-section check (Eq. C4.6.2.2.2d-1). Checks:
 * - statics identities: the lever ordinates of all girders sum to 1 at any point between
 *   the exterior girders (each hinged panel shares a wheel between its two girders), and the
 *   rigid-section reactions of all girders sum to NL and balance the lanes' moment
 *   (Σ R·x = Σ e) — equilibrium of a rigid body on elastic supports;
 * - the exact lane search against an independent brute-force search over a fine grid of
 *   lane and wheel positions (it can only match or fall short of the exact optimum).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromUs, leverOrdinate, leverRule, multiplePresenceFactor, rigidSection } from '../../../shared/index.js';

const ft = fromUs.ft;

describe('lever-rule ordinates', () => {
  it('sum to 1 over all girders between the exterior girders (statics)', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: 3, max: 20, noNaN: true }), { minLength: 1, maxLength: 8 }), fc.double({ min: 0, max: 1, noNaN: true }), (sp, t) => {
        const offsets = [0];
        for (const s of sp) offsets.push(offsets[offsets.length - 1] + ft(s));
        const x = t * offsets[offsets.length - 1];
        const sum = offsets.reduce((acc, _, i) => acc + leverOrdinate(offsets, i, x), 0);
        expect(sum).toBeRelativelyClose(1, 1e-9);
      }),
    );
  });
  it('grow linearly on the cantilever beyond an exterior girder', () => {
    const offsets = [0, ft(10), ft(20)];
    // 2 ft outside girder 1, hinge at girder 2 10 ft away: (10 + 2)/10.
    expect(leverOrdinate(offsets, 0, -ft(2))).toBeRelativelyClose(1.2, 1e-12);
    expect(leverOrdinate(offsets, 0, ft(12))).toBe(0);
  });
});

/** Brute force: lanes and wheels on a 0.05 ft grid, exhaustive over k ≤ 2 lanes. */
function bruteForce(offsets: number[], girder: number, curbL: number, curbR: number, laneW: number, k: number): number {
  const step = ft(0.05);
  const g = ft(6);
  const e2 = ft(2);
  const laneBest: { L: number; r: number }[] = [];
  for (let L = curbL; L <= curbR - laneW + 1e-9; L += step) {
    let best = -Infinity;
    for (let a = L + e2; a + g <= L + laneW - e2 + 1e-9; a += step) {
      best = Math.max(best, leverOrdinate(offsets, girder, a) + leverOrdinate(offsets, girder, a + g));
    }
    laneBest.push({ L, r: best });
  }
  if (k === 1) return (1.2 * Math.max(...laneBest.map((l) => l.r))) / 2;
  let best = -Infinity;
  for (const a of laneBest) for (const b of laneBest) if (b.L >= a.L + laneW - 1e-9) best = Math.max(best, a.r + b.r);
  return (multiplePresenceFactor(2) * best) / 2;
}

describe('lever rule: exact lane search', () => {
  it('matches a brute-force grid search (never below it, within the grid step above it)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 3, max: 6 }),
        fc.double({ min: 4, max: 18, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 1, max: 2 }),
        (nb, s, de, which, k) => {
          const offsets = Array.from({ length: nb }, (_, i) => i * ft(s));
          const curbL = -ft(de);
          const curbR = offsets[nb - 1] + ft(de);
          const laneW = ft(12);
          const lanes = Math.floor((curbR - curbL) / laneW + 1e-9);
          if (lanes < k) return;
          const girder = which === 0 ? 0 : which === 1 ? 1 : Math.floor(nb / 2);
          const exact = leverRule(offsets, girder, curbL, curbR, laneW, lanes, { loadedLanes: [k] }).value;
          const brute = bruteForce(offsets, girder, curbL, curbR, laneW, k);
          expect(exact).toBeGreaterThanOrEqual(brute - 1e-9);
          // Each wheel ordinate changes by at most step/S per grid step.
          expect(exact - brute).toBeLessThanOrEqual((2 * k * 0.05) / Math.min(s, 4) + 1e-9);
        },
      ),
      { numRuns: 60 },
    );
  });
  it('keeps a worksheet that re-adds to the value (wheels inside their lanes, lanes inside the roadway)', () => {
    const offsets = [0, ft(9), ft(18), ft(27)];
    const r = leverRule(offsets, 1, -ft(1.5), ft(28.5), ft(12), 2, { loadedLanes: [2] });
    const cs = r.worksheet.cases[0];
    const sum = cs.trucks.reduce((s, t) => s + t.wheels[0].ordinate + t.wheels[1].ordinate, 0);
    expect(cs.value).toBeRelativelyClose((cs.multiplePresence * sum) / 2, 1e-12);
    for (const t of cs.trucks) {
      expect(t.laneLeft).toBeGreaterThanOrEqual(-ft(1.5) - 1e-9);
      expect(t.laneRight).toBeLessThanOrEqual(ft(28.5) + 1e-9);
      expect(t.wheels[0].offset - t.laneLeft).toBeGreaterThanOrEqual(ft(2) - 1e-9);
      expect(t.laneRight - t.wheels[1].offset).toBeGreaterThanOrEqual(ft(2) - 1e-9);
    }
    expect(cs.trucks[1].laneLeft).toBeGreaterThanOrEqual(cs.trucks[0].laneRight - 1e-9);
  });
});

describe('rigid-section check', () => {
  it('reactions of all girders sum to NL and balance the moment of the lanes (equilibrium)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 9 }), fc.double({ min: 4, max: 14, noNaN: true }), fc.double({ min: 0, max: 4, noNaN: true }), (nb, s, de) => {
        const offsets = Array.from({ length: nb }, (_, i) => i * ft(s));
        const curbL = -ft(de);
        const curbR = offsets[nb - 1] + ft(de);
        const lanes = Math.floor((curbR - curbL) / ft(12) + 1e-9);
        if (lanes < 1) return;
        const r = rigidSection(offsets, 'left', curbL, curbR, ft(12), lanes);
        const { x, sumX2, centroid } = r.worksheet;
        for (const cs of r.worksheet.cases) {
          // Reaction of each girder i under the same lanes: NL/Nb + x_i·Σe/Σx².
          const R = x.map((xi) => cs.loadedLanes / nb + (xi * cs.sumE) / sumX2);
          expect(R.reduce((a, b) => a + b, 0)).toBeRelativelyClose(cs.loadedLanes, 1e-9);
          const moment = R.reduce((a, Ri, i) => a + Ri * x[i], 0);
          expect(Math.abs(moment - cs.sumE)).toBeLessThan(1e-9 * Math.max(1, Math.abs(cs.sumE)));
          expect(cs.value).toBeRelativelyClose(cs.multiplePresence * R[0], 1e-9);
        }
        expect(centroid).toBeRelativelyClose(offsets[nb - 1] / 2, 1e-12);
      }),
    );
  });
});
