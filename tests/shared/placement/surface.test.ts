/**
 * Governing placement on influence surfaces against brute-force enumeration and random
 * dragged placements. Rules: AASHTO LRFD Art. 3.6.1.3.1 (lanes, wheels; axles that do not
 * contribute are neglected, in the search and the brute force alike), Art. 3.6.1.2.2
 * (design truck, 14–30 ft rear spacing), Table 3.6.1.1.2-1 (m).
 * Surfaces are synthetic: random bilinear grids (where the search is exact) and a smooth
 * analytic surface (where the search is within its stated bound; the bilinear interpolation
 * error bound h²/8·max|f''| per direction is a standard result of numerical analysis).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DESIGN_TANDEM, DESIGN_TRUCK, FATIGUE_TRUCK, vehicleWeight, type Vehicle } from '../../../shared/loads/vehicles.js';
import { evaluateSurface } from '../../../shared/placement/evaluate.js';
import { clampPlacement, frontAxleRange, placementRules, wheelOffsetRange, type PlacementRules } from '../../../shared/placement/rules.js';
import { sampleSurface, type SurfaceLike } from '../../../shared/placement/sampledSurface.js';
import { governingSurfacePlacement } from '../../../shared/placement/search.js';
import { fromUs } from '../../../shared/units.js';

const ft = fromUs.ft;

/** An independent bilinear surface on a table (test's own implementation), zero off the grid. */
function gridSurface(xs: number[], ys: number[], table: number[][]): SurfaceLike {
  const find = (s: number[], v: number) => {
    let i = 0;
    while (i < s.length - 2 && s[i + 1] <= v) i++;
    return i;
  };
  return {
    extent: { xMin: xs[0], xMax: xs[xs.length - 1], yMin: ys[0], yMax: ys[ys.length - 1] },
    at(x, y) {
      if (x < xs[0] || x > xs[xs.length - 1] || y < ys[0] || y > ys[ys.length - 1]) return 0;
      const i = find(xs, x);
      const j = find(ys, y);
      const tx = (x - xs[i]) / (xs[i + 1] - xs[i]);
      const ty = (y - ys[j]) / (ys[j + 1] - ys[j]);
      return (
        (1 - tx) * (1 - ty) * table[j][i] + tx * (1 - ty) * table[j][i + 1] + (1 - tx) * ty * table[j + 1][i] + tx * ty * table[j + 1][i + 1]
      );
    },
  };
}

/** Best single-lane effect by brute force: lane edges every `h`, three wheel offsets, front axle every `hx`, 5 spacings. */
function bruteSingleLane(surface: SurfaceLike, rules: PlacementRules, v: Vehicle, sgn: number, h: number, hx: number, m: number): number {
  let best = -Infinity;
  const spacings = v.variableSpacing ? [0, 0.25, 0.5, 0.75, 1].map((t) => v.variableSpacing!.min + t * (v.variableSpacing!.max - v.variableSpacing!.min)) : [undefined];
  const hi = rules.curbRight - rules.laneWidth;
  for (let p = rules.curbLeft; p <= hi + 1e-9; p = p + h > hi && p < hi ? hi : p + h) {
    const r = wheelOffsetRange(rules, p);
    for (const o of [r.min, (r.min + r.max) / 2, r.max]) {
      for (const d of [1, -1] as const) {
        for (const s of spacings) {
          const fr = frontAxleRange(v, d, s, surface.extent);
          for (let xf = fr.min; xf <= fr.max + 1e-9; xf += hx) {
            const lane = { left: p, wheelOffset: o, frontAxleAt: xf, direction: d, axleSpacing: s };
            const e = evaluateSurface(surface, { lanes: [lane] }, rules, v, { check: false, multiplePresence: false, sense: sgn > 0 ? 'positive' : 'negative' }).value;
            if (sgn * e > best) best = sgn * e;
          }
        }
      }
    }
    if (p === hi) break;
  }
  return sgn * m * best;
}

const caseArb = fc.record({
  lengthFt: fc.double({ min: 20, max: 90, noNaN: true }),
  gaps: fc.array(fc.double({ min: 0.2, max: 1, noNaN: true }), { minLength: 2, maxLength: 9 }),
  roadwayFt: fc.double({ min: 14, max: 38, noNaN: true }),
  extraYs: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 0, maxLength: 5 }),
  values: fc.array(fc.double({ min: -0.4, max: 1, noNaN: true }), { minLength: 120, maxLength: 120 }),
  overhang: fc.boolean(),
  negative: fc.boolean(),
  vehicle: fc.constantFrom(DESIGN_TRUCK, DESIGN_TANDEM, FATIGUE_TRUCK),
  drags: fc.array(
    fc.record({
      lefts: fc.array(fc.double({ min: -3, max: 40, noNaN: true }), { minLength: 3, maxLength: 3 }),
      offs: fc.array(fc.double({ min: 0, max: 5, noNaN: true }), { minLength: 3, maxLength: 3 }),
      xf: fc.array(fc.double({ min: -0.3, max: 1.3, noNaN: true }), { minLength: 3, maxLength: 3 }),
      dir: fc.array(fc.constantFrom(1 as const, -1 as const), { minLength: 3, maxLength: 3 }),
      s: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 3, maxLength: 3 }),
    }),
    { minLength: 40, maxLength: 40 },
  ),
});

describe('surface search against brute force (fast-check, random bilinear surfaces)', () => {
  it('no enumerated single-lane placement and no dragged placement of 1..NL lanes beats the search', () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        const L = ft(c.lengthFt);
        const w = ft(c.roadwayFt);
        const total = c.gaps.reduce((a, b) => a + b, 0);
        const xs = [0];
        for (const gap of c.gaps) xs.push(xs[xs.length - 1] + (gap / total) * L);
        xs[xs.length - 1] = L;
        const yMin = -ft(1.5);
        const yMax = w + ft(1.5);
        const ys = [yMin, yMax];
        for (const t of c.extraYs) {
          const y = yMin + t * (yMax - yMin);
          if (ys.every((q) => Math.abs(q - y) > 0.05)) ys.push(y);
        }
        ys.sort((a, b) => a - b);
        const table = ys.map((_, j) => xs.map((_, i) => c.values[(j * xs.length + i) % c.values.length]));
        const src = gridSurface(xs, ys, table);
        const sampled = sampleSurface(src, { xs, ys }, { measure: true });
        expect(sampled.representationError).toBeLessThan(1e-10);
        const rules = placementRules({ curbLeft: 0, curbRight: w }, { overhang: c.overhang });
        const sense = c.negative ? 'negative' : 'positive';
        const sgn = c.negative ? -1 : 1;
        const g = governingSurfacePlacement(sampled, rules, c.vehicle, { sense });
        // Reported placement is legal (evaluateSurface checks) and has the reported value.
        expect(evaluateSurface(src, g.placement, rules, c.vehicle, { sense }).value).toBeRelativelyClose(g.value, 1e-9);
        const W = vehicleWeight(c.vehicle);
        const slack = 1e-9 * W;
        const one = g.byLaneCount[0];
        const brute = bruteSingleLane(src, rules, c.vehicle, sgn, ft(2), L / 60, 1.2);
        expect(sgn * one.value).toBeGreaterThanOrEqual(sgn * brute - slack);
        for (const d of c.drags) {
          for (const r of g.byLaneCount) {
            const k = r.loadedLanes;
            const raw = {
              lanes: Array.from({ length: k }, (_, i) => ({
                left: ft(d.lefts[i]),
                wheelOffset: ft(d.offs[i]),
                frontAxleAt: d.xf[i] * L,
                direction: d.dir[i],
                axleSpacing: c.vehicle.variableSpacing ? c.vehicle.variableSpacing.min + d.s[i] * (c.vehicle.variableSpacing.max - c.vehicle.variableSpacing.min) : undefined,
              })),
            };
            const p = clampPlacement(raw, rules, { vehicle: c.vehicle, extent: src.extent });
            const e = evaluateSurface(src, p, rules, c.vehicle, { sense }).value;
            expect(sgn * e).toBeLessThanOrEqual(sgn * r.value + slack);
            expect(sgn * e).toBeLessThanOrEqual(sgn * g.value + slack);
          }
        }
      }),
      { numRuns: 15 },
    );
  }, 120000);

  it('two lanes: no grid placement with both vehicles at a common position beats the two-lane result', () => {
    const L = ft(60);
    const xs = [0, ft(12), ft(30), ft(41), L];
    const ys = [-ft(2), ft(3), ft(10), ft(20), ft(28), ft(34)];
    const table = ys.map((_y, j) => xs.map((_x, i) => (i === 0 || i === xs.length - 1 ? 0 : Math.sin(1.3 * i + 0.7 * j) + 0.4)));
    const src = gridSurface(xs, ys, table);
    const rules = placementRules({ curbLeft: 0, curbRight: ft(32) });
    const g = governingSurfacePlacement(sampleSurface(src, { xs, ys }), rules, DESIGN_TRUCK, { laneCounts: [2] });
    let best = -Infinity;
    for (let p1 = 0; p1 <= ft(8) + 1e-9; p1 += ft(0.5)) {
      for (let p2 = p1 + ft(12); p2 <= ft(20) + 1e-9; p2 += ft(0.5)) {
        for (const o of [ft(2), ft(3), ft(4)]) {
          for (let xf = 0; xf <= L + ft(28); xf += ft(1)) {
            for (const d of [1, -1] as const) {
              const lanes = [p1, p2].map((p) => ({ left: p, wheelOffset: o, frontAxleAt: xf, direction: d, axleSpacing: ft(14) }));
              const e = evaluateSurface(src, { lanes }, rules, DESIGN_TRUCK, { check: false }).value;
              if (e > best) best = e;
            }
          }
        }
      }
    }
    expect(g.value).toBeGreaterThanOrEqual(best - 1e-9);
  }, 60000);
});

describe('smooth surface: within the stated bound', () => {
  it('search ≥ brute force − 2·m·k·ΣW·ε with ε from the interpolation error bound', () => {
    // η = sin(πx/L)·(0.6 + 0.4·cos(π(y − yc)/B)): |η_xx| ≤ (π/L)², |η_yy| ≤ 0.4·(π/B)².
    const L = ft(70);
    const B = ft(40);
    const yc = ft(12);
    const surface: SurfaceLike = {
      extent: { xMin: 0, xMax: L, yMin: -ft(2), yMax: ft(38) },
      at: (x, y) => (x < 0 || x > L || y < -ft(2) || y > ft(38) ? 0 : Math.sin((Math.PI * x) / L) * (0.6 + 0.4 * Math.cos((Math.PI * (y - yc)) / B))),
    };
    const hx = L / 28;
    const hy = ft(40) / 16;
    const xs = Array.from({ length: 29 }, (_, i) => i * hx);
    const ys = Array.from({ length: 17 }, (_, j) => -ft(2) + j * hy);
    const sampled = sampleSurface(surface, { xs, ys }, { measure: true });
    const epsBound = (hx * hx) / 8 * (Math.PI / L) ** 2 + (hy * hy) / 8 * 0.4 * (Math.PI / B) ** 2;
    expect(sampled.representationError).toBeLessThanOrEqual(epsBound);
    expect(sampled.representationError).toBeGreaterThan(0);
    const rules = placementRules({ curbLeft: 0, curbRight: ft(36) });
    const g = governingSurfacePlacement(sampled, rules, DESIGN_TRUCK, { laneCounts: [1] });
    const W = vehicleWeight(DESIGN_TRUCK);
    const bound = 2 * 1.2 * 1 * W * epsBound;
    expect(g.tolerance.absolute).toBeLessThanOrEqual(bound);
    const brute = bruteSingleLane(surface, rules, DESIGN_TRUCK, 1, ft(0.5), L / 400, 1.2);
    expect(g.value).toBeGreaterThanOrEqual(brute - bound);
    // the stated tolerance (tightened by the search of the sample raised by its error envelope) holds too
    expect(brute).toBeLessThanOrEqual(g.value + g.tolerance.absolute + 1e-9 * g.value);
    expect(g.tolerance.absolute).toBeLessThan(bound);
    // and the bound is small: under 1 % of the effect here
    expect(bound / g.value).toBeLessThan(0.01);
  }, 60000);
});

describe('jumps of the surface at the deck end', () => {
  it('an axle the search puts on the end station stays on the deck, so the surface gives what the sample gives', () => {
    // Only the far corner ordinate is non-zero: the best is a 32 kip axle exactly at x = L (hand reasoning).
    const L = ft(42.2);
    const xs = [0, L / 5, (2 * L) / 5, (3 * L) / 5, (4 * L) / 5, L];
    const ys = [-ft(1.5), ft(15.5)];
    const table = [xs.map(() => 0), xs.map((_, i) => (i === 5 ? 1 : 0))];
    const src = gridSurface(xs, ys, table);
    const rules = placementRules({ curbLeft: 0, curbRight: ft(14) });
    const g = governingSurfacePlacement(sampleSurface(src, { xs, ys }), rules, DESIGN_TRUCK, { laneCounts: [1] });
    // wheels as far right as allowed: lane at 2 ft to 14 ft, left wheel 4 ft into it (y = 6 ft), right wheel at 12 ft;
    // only that one 32 kip axle sees a non-zero ordinate (the others are 14 ft away, beyond the last cell).
    const yl = ft(6);
    const yr = ft(12);
    const ty = (y: number) => (y - ys[0]) / (ys[1] - ys[0]);
    const expected = 1.2 * fromUs.kip(32) * 0.5 * (ty(yl) + ty(yr));
    expect(g.value).toBeRelativelyClose(expected, 1e-6);
  });
});


describe('a sample in a sheared frame (s = x − c·y): a jump along a skewed line stays on a grid line', () => {
  // The surface is bilinear in (s, y) on a random table, with a jump of +1 across the skewed
  // line s = s_J (x = s_J + c·y, a skewed support line): in the frame of that line the sample
  // is the surface and the search is exact (search.ts proof, in the frame's coordinates); in
  // the plan frame the jump crosses cells and the sample cannot follow it. Identity checks,
  // common practice, no source.
  it('the frame sample equals the surface, the search beats brute force and random placements, and the plan sample does not follow the jump', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -Math.tan((60 * Math.PI) / 180), max: Math.tan((60 * Math.PI) / 180), noNaN: true }),
        fc.array(fc.double({ min: -0.3, max: 1, noNaN: true }), { minLength: 60, maxLength: 60 }),
        fc.constantFrom(DESIGN_TRUCK, FATIGUE_TRUCK),
        fc.array(fc.tuple(fc.double({ min: 0, max: 20, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 30, maxLength: 30 }),
        (c, values, vehicle, drags) => {
          if (Math.abs(c) < 0.05) c = 0.05;
          const L = ft(60);
          const w = ft(24);
          const yMin = -ft(1.5);
          const yMax = w + ft(1.5);
          const sJ = ft(20);
          const ss = [0, ft(8), sJ - 1e-6, sJ, ft(31), ft(45), L];
          const ys = [yMin, ft(6), ft(13), ft(19), yMax];
          // zero at both ends (support lines), so the surface is continuous where the frame's range adds cells beyond them
          const table = ys.map((_, j) => ss.map((s, i) => (i === 0 || i === ss.length - 1 ? 0 : values[(j * ss.length + i) % values.length] + (s >= sJ ? 1 : 0))));
          const frame = gridSurface(ss, ys, table);
          const src: SurfaceLike = {
            extent: { xMin: Math.min(0, c * yMin, c * yMax), xMax: L + Math.max(0, c * yMin, c * yMax), yMin, yMax },
            at: (x, y) => frame.at(x - c * y, y),
          };
          const sampled = sampleSurface(src, { xs: ss, ys }, { measure: true, shear: c });
          expect(sampled.shear).toBe(c);
          expect(sampled.representationError).toBeLessThan(1e-10);
          for (const [x, y] of [[ft(25) + c * ft(7), ft(7)], [ft(3) + c * ft(20), ft(20)]]) expect(sampled.at(x, y)).toBeCloseTo(src.at(x, y), 12);
          const rules = placementRules({ curbLeft: 0, curbRight: w });
          const g = governingSurfacePlacement(sampled, rules, vehicle, { laneCounts: [1] });
          const W = vehicleWeight(vehicle);
          const slack = 1e-9 * W;
          // the placement found is legal on the surface and worth what the search says
          expect(evaluateSurface(src, g.placement, rules, vehicle, {}).value).toBeRelativelyClose(g.value, 1e-9);
          expect(g.tolerance.absolute).toBeLessThan(1e-9 * W);
          expect(g.value).toBeGreaterThanOrEqual(bruteSingleLane(src, rules, vehicle, 1, ft(2), ft(1), 1.2) - slack);
          for (const [left, off, xf] of drags) {
            const p = clampPlacement({ lanes: [{ left: ft(left) / 2, wheelOffset: off * ft(4), frontAxleAt: src.extent.xMin + xf * (src.extent.xMax - src.extent.xMin + ft(30)), direction: 1, axleSpacing: vehicle.variableSpacing?.min }] }, rules, { vehicle, extent: src.extent });
            expect(evaluateSurface(src, p, rules, vehicle, {}).value).toBeLessThanOrEqual(g.value + slack);
          }
          // the same surface sampled in the plan frame: the jump crosses cells
          const plan = sampleSurface(src, { xs: ss.map((s) => s + c * ft(12)), ys }, { measure: true });
          expect(plan.representationError).toBeGreaterThan(0.2);
        },
      ),
      { numRuns: 12, seed: 20261203 },
    );
  }, 120000);
});
