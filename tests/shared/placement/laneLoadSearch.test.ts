/**
 * The design lane load in the exact surface search (shared/placement/laneStrip.ts, search.ts):
 * 0.64 klf over a 10 ft width (AASHTO LRFD Art. 3.6.1.2.4), centred on each lane's vehicle,
 * on the lengths that add to the effect (Art. 3.6.1.3.1), with the vehicle of each lane and
 * the multiple presence factor (Table 3.6.1.1.2-1).
 * Checks: closed forms of the strip integral on surfaces whose value is known (a constant and
 * a plane: the integral of a constant over a rectangle, and of a linear function, whose
 * interpolation between knots is exact); brute force over lane positions on random bilinear
 * surfaces (no legal placement beats the reported effect by more than its stated bound); and
 * the lane load adds exactly its own effect to a surface that has no truck effect at all.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DESIGN_LANE_LOAD, DESIGN_TRUCK, LANE_LOAD_WIDTH } from '../../../shared/loads/vehicles.js';
import { evaluateSurface } from '../../../shared/placement/evaluate.js';
import { laneStripTable } from '../../../shared/placement/laneStrip.js';
import { frontAxleRange, placementRules, wheelOffsetRange } from '../../../shared/placement/rules.js';
import { sampleSurface, type SurfaceLike } from '../../../shared/placement/sampledSurface.js';
import { governingSurfacePlacement } from '../../../shared/placement/search.js';
import { fromUs } from '../../../shared/units.js';

const ft = fromUs.ft;
const q = DESIGN_LANE_LOAD;

function plane(L: number, W: number, f: (x: number, y: number) => number): SurfaceLike {
  return { extent: { xMin: 0, xMax: L, yMin: 0, yMax: W }, at: (x, y) => (x < 0 || x > L || y < 0 || y > W ? 0 : f(x, y)) };
}

describe('the lane strip on surfaces of known integral', () => {
  it('a constant surface: q · (length) whatever the position, and no interpolation error', () => {
    const L = ft(80);
    const W = ft(40);
    const xs = Float64Array.from({ length: 21 }, (_, i) => (L * i) / 20);
    const ys = Float64Array.from({ length: 9 }, (_, j) => (W * j) / 8);
    const rows = [...ys].map(() => new Float64Array(xs.length).fill(0.5));
    const t = laneStripTable(xs, ys, rows, 1, ft(6), ft(2), W - ft(8));
    // ∫∫ q/w · 0.5 over the 10 ft strip and the length = 0.5·q·L (the strip lies inside the surface)
    for (const u of [ft(2), ft(7.3), ft(20), W - ft(8)]) expect(t.exact(u)).toBeRelativelyClose(0.5 * q * L, 1e-12);
    expect(t.deviation).toBeLessThan(1e-9 * 0.5 * q * L);
    // sought negative, a positive surface gives nothing (each portion of one sign only)
    expect(laneStripTable(xs, ys, rows, -1, ft(6), ft(2), W - ft(8)).exact(ft(10))).toBe(0);
  });

  it('a plane rising across the deck: the strip integral is linear in its centre, exact between knots', () => {
    const L = ft(60);
    const W = ft(36);
    const xs = Float64Array.from({ length: 13 }, (_, i) => (L * i) / 12);
    const ys = Float64Array.from({ length: 13 }, (_, j) => (W * j) / 12);
    const f = (y: number) => 0.1 + 0.02 * y; // per N, y in m
    const rows = [...ys].map((y) => new Float64Array(xs.length).fill(f(y)));
    const G = ft(6);
    const t = laneStripTable(xs, ys, rows, 1, G, ft(2), W - ft(8));
    for (const u of [ft(2), ft(9.1), ft(20)]) {
      const c = u + G / 2;
      // (q/w)·L·∫_{c−w/2}^{c+w/2} f = q·L·f(c) for a linear f
      expect(t.exact(u)).toBeRelativelyClose(q * L * f(c), 1e-12);
      expect(t.at(u)).toBeRelativelyClose(q * L * f(c), 1e-12);
    }
    expect(t.deviation).toBeLessThan(1e-9 * q * L);
  });
});

describe('the search with the lane load', () => {
  it('on a surface that only the lane load reaches, the result is m · Σ lanes of q·L·η (closed form)', () => {
    // η = 1e-3 per N everywhere on a 90 ft × 40 ft deck; the truck adds ΣW·η and the lane q·L·η per lane
    const L = ft(90);
    const W = ft(40);
    const src = plane(L, W, () => 1e-3);
    const sampled = sampleSurface(src, { xs: Array.from({ length: 31 }, (_, i) => (L * i) / 30), ys: Array.from({ length: 11 }, (_, j) => (W * j) / 10) }, { measure: true });
    const rules = placementRules({ curbLeft: 0, curbRight: W });
    const g = governingSurfacePlacement(sampled, rules, DESIGN_TRUCK, { laneLoad: {} });
    const truck = fromUs.kip(72) * 1e-3;
    const lane = q * L * 1e-3;
    // three 12 ft lanes on 40 ft; m = 0.85 for three (Table 3.6.1.1.2-1): 0.85·3 = 2.55 > 2·1.0 = 2 > 1.2
    expect(g.loadedLanes).toBe(3);
    expect(g.value).toBeRelativelyClose(0.85 * 3 * (truck + lane), 1e-9);
    for (const l of g.effect.lanes) expect(l.laneLoadValue).toBeRelativelyClose(lane, 1e-9);
    expect(g.tolerance.absolute).toBeLessThan(1e-9 * g.value);
    expect(g.tolerance.text).toContain('lane load (Art. 3.6.1.2.4)');
  });

  it('the lane load moves the governing lane: a broad strip the lane load fills beats a narrow peak only the truck reaches (closed form)', () => {
    // 200 ft long, 30 ft roadway. η = 1e-3 per N over y ≤ 14 ft along the whole length; a peak of
    // 3e-3 at x = 100 ft (zero 10 ft either side) over y ≥ 18 ft. On the broad strip one lane gives
    // 72 kip·1e-3 + q·200 ft·1e-3; on the peak one 32 kip axle gives 96 kip·1e-3 and the lane load
    // little, so the truck alone prefers the peak and the truck with the lane load the broad strip.
    const L = ft(200);
    const W = ft(30);
    const xs = Array.from({ length: 21 }, (_, i) => (L * i) / 20);
    const ys = [0, ft(14), ft(16), ft(18), W];
    const peak = (x: number) => Math.max(0, 1 - Math.abs(x - ft(100)) / ft(10));
    const rowsAt = (y: number) => xs.map((x) => (y <= ft(14) ? 1e-3 : y >= ft(18) ? 3e-3 * peak(x) : 0));
    const table = ys.map(rowsAt);
    const src: SurfaceLike = {
      extent: { xMin: 0, xMax: L, yMin: 0, yMax: W },
      at(x, y) {
        if (x < 0 || x > L || y < 0 || y > W) return 0;
        let j = 0;
        while (j < ys.length - 2 && ys[j + 1] <= y) j++;
        const i = Math.min(19, Math.floor((x / L) * 20));
        const tx = (x - xs[i]) / (xs[i + 1] - xs[i]);
        const ty = (y - ys[j]) / (ys[j + 1] - ys[j]);
        return (1 - tx) * (1 - ty) * table[j][i] + tx * (1 - ty) * table[j][i + 1] + (1 - tx) * ty * table[j + 1][i] + tx * ty * table[j + 1][i + 1];
      },
    };
    const sampled = sampleSurface(src, { xs, ys }, { measure: true });
    const rules = placementRules({ curbLeft: 0, curbRight: W });
    const alone = governingSurfacePlacement(sampled, rules, DESIGN_TRUCK, { laneCounts: [1] });
    expect(alone.placement.lanes[0].left + alone.placement.lanes[0].wheelOffset).toBeGreaterThan(ft(12));
    expect(alone.value).toBeRelativelyClose(1.2 * fromUs.kip(96) * 1e-3, 1e-9);
    const withLane = governingSurfacePlacement(sampled, rules, DESIGN_TRUCK, { laneCounts: [1], laneLoad: {} });
    const wheel = withLane.placement.lanes[0].left + withLane.placement.lanes[0].wheelOffset;
    expect(wheel + rules.gauge).toBeLessThanOrEqual(ft(14) + 1e-9);
    expect(withLane.value).toBeRelativelyClose(1.2 * (fromUs.kip(72) + q * L) * 1e-3, 1e-9);
  });

  it('random bilinear surfaces (fast-check): no legal one- or two-lane placement beats the result by more than its bound', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 7 * 6, maxLength: 7 * 6 }),
        fc.constantFrom<1 | -1>(1, -1),
        (values, sgn) => {
          const L = ft(72);
          const W = ft(30);
          const xs = Array.from({ length: 7 }, (_, i) => (L * i) / 6);
          const ys = Array.from({ length: 6 }, (_, j) => (W * j) / 5);
          const table = ys.map((_, j) => xs.map((_, i) => 1e-4 * values[j * 7 + i]));
          const src: SurfaceLike = {
            extent: { xMin: 0, xMax: L, yMin: 0, yMax: W },
            at(x, y) {
              if (x < 0 || x > L || y < 0 || y > W) return 0;
              const i = Math.min(5, Math.floor((x / L) * 6));
              const j = Math.min(4, Math.floor((y / W) * 5));
              const tx = (x - xs[i]) / (xs[i + 1] - xs[i]);
              const ty = (y - ys[j]) / (ys[j + 1] - ys[j]);
              return (1 - tx) * (1 - ty) * table[j][i] + tx * (1 - ty) * table[j][i + 1] + (1 - tx) * ty * table[j + 1][i] + tx * ty * table[j + 1][i + 1];
            },
          };
          const sampled = sampleSurface(src, { xs, ys }, { measure: true });
          const rules = placementRules({ curbLeft: 0, curbRight: W });
          const sense = sgn > 0 ? 'positive' : 'negative';
          const g = governingSurfacePlacement(sampled, rules, DESIGN_TRUCK, { laneLoad: {}, sense, laneCounts: [1, 2] });
          const limit = sgn * g.value + g.tolerance.absolute + 1e-9 * Math.abs(g.value) + 1e-12;
          // brute force: one lane at edges every 1.5 ft, three wheel offsets, front axle every 3 ft, both directions, 3 spacings
          const spacings = [ft(14), ft(22), ft(30)];
          for (let p = 0; p <= W - rules.laneWidth + 1e-9; p += ft(1.5)) {
            const r = wheelOffsetRange(rules, p);
            for (const o of [r.min, (r.min + r.max) / 2, r.max]) {
              for (const d of [1, -1] as const) {
                for (const s of spacings) {
                  const fr = frontAxleRange(DESIGN_TRUCK, d, s, src.extent);
                  for (let xf = fr.min; xf <= fr.max + 1e-9; xf += ft(3)) {
                    const lane = { left: p, wheelOffset: o, frontAxleAt: xf, direction: d, axleSpacing: s };
                    const e = evaluateSurface(sampled, { lanes: [lane] }, rules, DESIGN_TRUCK, { check: false, sense, laneLoad: {} }).value;
                    expect(sgn * e).toBeLessThanOrEqual(limit);
                  }
                }
              }
            }
          }
          // the lane width and load stay the code's
          expect(LANE_LOAD_WIDTH).toBeRelativelyClose(ft(10), 1e-12);
        },
      ),
      { numRuns: 12, seed: 7 },
    );
  });
});
