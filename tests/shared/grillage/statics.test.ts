import { describe, expect, it } from 'vitest';
import { analyseLoads, buildGrillage, type GrillageModel, type GrillageOptions, type PointLoad } from '../../../shared/grillage/index.js';
import { fromUs } from '../../../shared/units.js';
import { steelDeck, type DeckSpec } from './fixtures.js';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** Random point loads anywhere on the deck (overhangs and skewed ends included). */
function randomLoads(model: GrillageModel, count: number, seed: number): PointLoad[] {
  const r = rng(seed);
  const e = model.extent;
  return Array.from({ length: count }, () => {
    const y = e.yMin + r() * (e.yMax - e.yMin);
    const x0 = model.supportLineX(0, y);
    const x1 = model.supportLineX(model.spanCount, y);
    return { x: x0 + r() * (x1 - x0), y, P: 10e3 + 90e3 * r() };
  });
}

const CASES: { name: string; spec: DeckSpec; options?: GrillageOptions }[] = [
  { name: 'right simple span', spec: { girders: 5 } },
  { name: 'skew +15°', spec: { girders: 5, skew: 15 } },
  { name: 'skew −35° (perpendicular)', spec: { girders: 6, skew: -35 } },
  { name: 'skew +50° forced skew-parallel', spec: { girders: 4, skew: 50 }, options: { layout: 'skew-parallel' } },
  { name: 'three-span continuous, skew 45°', spec: { girders: 5, spansFt: [70, 90, 70], continuous: true, skew: 45 } },
  { name: 'non-parallel supports, two simple spans', spec: { girders: 4, spansFt: [70, 90], skew: [10, 35, -15] } },
  {
    name: 'edge members and diaphragms, skew 30°',
    spec: { girders: 5, skew: 30, diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3, inertia: 2e-4 } },
    options: { edgeMembers: true },
  },
  { name: 'uneven offsets and overhangs', spec: { offsetsFt: [0, 7, 15.5, 22, 31], overhangLeftFt: 1.5, overhangRightFt: 4.5, spansFt: [110] } },
];

describe('equilibrium: reactions sum to the applied load', () => {
  // Statics (ΣFz = 0); the statically equivalent load transfer keeps the resultant exact.
  for (const c of CASES) {
    it(c.name, () => {
      const model = buildGrillage(steelDeck(c.spec), c.options);
      for (let trial = 0; trial < 3; trial++) {
        const loads = randomLoads(model, 7, 17 + trial);
        const res = analyseLoads(model, loads);
        expect(res.totalReaction).toBeRelativelyClose(res.totalLoad, 1e-10);
        const sum = res.reactions.flat().reduce<number>((a, b) => a + (b ?? 0), 0);
        expect(sum).toBeRelativelyClose(res.totalLoad, 1e-10);
        for (const v of [...res.girderMoments.flat(2), ...res.displacements]) expect(Number.isFinite(v)).toBe(true);
      }
    });
  }
});

describe('right decks: girder moments across a section sum to the beam-line moment', () => {
  it('simple span, uneven girders and overhangs (any girder stiffness)', () => {
    // Statics of the free body left of a section through the girders: Σ M_g = static moment
    // of the whole load on a simple beam, M(x) = Σ P·a(L − x)/L (a ≤ x) + P·x(L − a)/L (a > x).
    const deck = steelDeck({ offsetsFt: [0, 7, 15.5, 22, 31], overhangLeftFt: 1.5, overhangRightFt: 4.5, spansFt: [110] });
    const model = buildGrillage(deck);
    const L = deck.spans[0].length;
    const loads = randomLoads(model, 9, 5);
    const res = analyseLoads(model, loads);
    for (let k = 1; k < 10; k++) {
      const x = (k * L) / 10;
      const exact = loads.reduce((m, ld) => m + (ld.x <= x ? (ld.P * ld.x * (L - x)) / L : (ld.P * x * (L - ld.x)) / L), 0);
      const sum = res.girderMoments.reduce((m, g) => m + g[0][k], 0);
      expect(sum).toBeRelativelyClose(exact, 1e-9);
    }
  });

  it('two equal continuous spans, equal girders: the continuous beam moment (three-moment equation)', () => {
    // Two equal spans L, load P at a from the end support A in span AB:
    // M_B = −P·a·(L² − a²)/(4L²) (Clapeyron's three-moment equation; from memory). With equal
    // girders the sum of the girder deflections obeys the beam equation with the total load,
    // so Σ M_g is the continuous-beam moment.
    const deck = steelDeck({ girders: 4, spacingFt: 8, overhangLeftFt: 4, overhangRightFt: 4, spansFt: [85, 85], continuous: true });
    const model = buildGrillage(deck);
    const L = deck.spans[0].length;
    const loads = randomLoads(model, 8, 23);
    const res = analyseLoads(model, loads);
    let MB = 0;
    for (const ld of loads) {
      const a = ld.x <= L ? ld.x : 2 * L - ld.x; // from the nearer end support
      MB += (-ld.P * a * (L * L - a * a)) / (4 * L * L);
    }
    const beamMoment = (x: number): number => {
      // span AB from A, reactions from statics with M_B
      if (x <= L) {
        const inSpan = loads.filter((ld) => ld.x < L);
        const RA = inSpan.reduce((r, ld) => r + (ld.P * (L - ld.x)) / L, 0) + MB / L;
        return RA * x - inSpan.reduce((m, ld) => m + (ld.x < x ? ld.P * (x - ld.x) : 0), 0);
      }
      const xr = 2 * L - x;
      const inSpan = loads.filter((ld) => ld.x >= L);
      const RC = inSpan.reduce((r, ld) => r + (ld.P * (ld.x - L)) / L, 0) + MB / L;
      return RC * xr - inSpan.reduce((m, ld) => m + (2 * L - ld.x < xr ? ld.P * (xr - (2 * L - ld.x)) : 0), 0);
    };
    const scale = loads.reduce((m, ld) => m + ld.P, 0) * L;
    for (let span = 0; span < 2; span++) {
      for (let k = 0; k <= 10; k++) {
        const x = span * L + (k * L) / 10;
        const sum = res.girderMoments.reduce((m, g) => m + g[span][k], 0);
        expect(Math.abs(sum - beamMoment(x))).toBeLessThanOrEqual(1e-9 * scale);
      }
    }
  });
});

describe('rigid limit: very stiff transverse members and no torsion', () => {
  // Rigid-section method: R = NL/Nb + X_ext·Σe / Σx² (AASHTO LRFD commentary to
  // Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1); for one load: share_g = 1/Nb + e·x_g/Σx².
  // Equal girders (overhang = s/2), transverse EI × 10⁶, torsion removed.
  const s = fromUs.ft(8);
  const deck = steelDeck({ girders: 5, spacingFt: 8, overhangLeftFt: 4, overhangRightFt: 4 });
  const model = buildGrillage(deck, { transverseStiffnessFactor: 1e6, torsionFactor: 0 });
  const L = deck.spans[0].length;
  const xs = [-2, -1, 0, 1, 2].map((k) => k * s);
  const sumX2 = xs.reduce((a, b) => a + b * b, 0);

  for (const e of [0, 0.6 * s, 1.3 * s, -2.4 * s]) {
    it(`one load at eccentricity ${(e / s).toFixed(1)}·S`, () => {
      const res = analyseLoads(model, [{ x: L / 2, y: 2 * s + e, P: 1e5 }]);
      for (const k of [3, 5, 8]) {
        const M = res.girderMoments.map((g) => g[0][k]);
        const total = M.reduce((a, b) => a + b, 0);
        M.forEach((m, g) => expect(Math.abs(m / total - (1 / 5 + (e * xs[g]) / sumX2))).toBeLessThan(1e-3));
      }
    });
  }

  it('two wheel lines 6 ft apart: shares 1/Nb + x_g·Σe/Σx²', () => {
    const y1 = 2 * s + 1.1 * s;
    const y2 = y1 - fromUs.ft(6);
    const res = analyseLoads(model, [
      { x: L / 2, y: y1, P: 1e5 },
      { x: L / 2, y: y2, P: 1e5 },
    ]);
    const M = res.girderMoments.map((g) => g[0][5]);
    const total = M.reduce((a, b) => a + b, 0);
    const sumE = y1 - 2 * s + (y2 - 2 * s);
    M.forEach((m, g) => expect(Math.abs(m / total - (2 / 5 + (xs[g] * sumE) / sumX2) / 2)).toBeLessThan(1e-3));
  });
});
