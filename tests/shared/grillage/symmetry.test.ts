import { describe, expect, it } from 'vitest';
import {
  analyseLoads,
  buildGrillage,
  influenceSurfaces,
  type GrillageModel,
  type GrillageOptions,
  type GrillageResponse,
} from '../../../shared/grillage/index.js';
import { fromUs } from '../../../shared/units.js';
import { steelDeck, type DeckSpec } from './fixtures.js';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function responses(model: GrillageModel): GrillageResponse[] {
  const out: GrillageResponse[] = [];
  const N = model.spanCount;
  for (let g = 0; g < model.girderCount; g++) {
    for (let j = 0; j < N; j++) for (const f of [0.2, 0.5, 0.7]) out.push({ kind: 'girder-moment', girder: g, span: j, fraction: f });
    for (let s = 0; s <= N; s++) {
      if (s > 0) out.push({ kind: 'girder-shear', girder: g, support: s, side: 'left' });
      if (s < N) out.push({ kind: 'girder-shear', girder: g, support: s, side: 'right' });
      out.push({ kind: 'reaction', girder: g, support: s });
    }
  }
  return out;
}

/** The same deck seen from the other side (y → W − y): girders renumbered, skews change sign. */
function mirrored(spec: DeckSpec & { offsetsFt: number[]; skew: number[] }): DeckSpec & { offsetsFt: number[]; skew: number[] } {
  const W = spec.offsetsFt[spec.offsetsFt.length - 1];
  return {
    ...spec,
    offsetsFt: spec.offsetsFt.map((o) => W - o).reverse(),
    overhangLeftFt: spec.overhangRightFt,
    overhangRightFt: spec.overhangLeftFt,
    skew: spec.skew.map((s) => -s),
  };
}

/** The same deck turned through 180° in plan (travelled the other way). */
function rotated(spec: DeckSpec & { offsetsFt: number[]; skew: number[] }): DeckSpec & { offsetsFt: number[]; skew: number[] } {
  const m = mirrored(spec);
  return { ...m, skew: [...spec.skew].reverse(), spansFt: [...(spec.spansFt ?? [100])].reverse() };
}

function mirrorResponse(r: GrillageResponse, Nb: number): { r: GrillageResponse; sign: number } {
  return { r: { ...r, girder: Nb - 1 - r.girder }, sign: 1 };
}

function rotateResponse(r: GrillageResponse, Nb: number, N: number): { r: GrillageResponse; sign: number } {
  const girder = Nb - 1 - r.girder;
  if (r.kind === 'girder-moment') return { r: { kind: 'girder-moment', girder, span: N - 1 - r.span, fraction: 1 - r.fraction }, sign: 1 };
  if (r.kind === 'reaction') return { r: { kind: 'reaction', girder, support: N - r.support }, sign: 1 };
  // the lower-x side becomes the upper-x side: V changes sign
  return { r: { kind: 'girder-shear', girder, support: N - r.support, side: r.side === 'left' ? 'right' : 'left' }, sign: -1 };
}

const BASE = {
  offsetsFt: [0, 7, 15.5, 22, 31],
  overhangLeftFt: 1.5,
  overhangRightFt: 4.5,
  spansFt: [70, 95],
  continuous: true,
  diaphragms: { type: 'steel-cross-frames' as const, intermediatePerSpan: 2, inertia: 3e-4 },
};

const COPIES: { name: string; spec: DeckSpec & { offsetsFt: number[]; skew: number[] }; options?: GrillageOptions }[] = [
  { name: 'skew 12°, skew-parallel members', spec: { ...BASE, skew: [12, 12, 12] } },
  { name: 'skew 35°, perpendicular members', spec: { ...BASE, skew: [35, 35, 35] } },
  { name: 'skews 25°/40°/30°, perpendicular members, simple spans', spec: { ...BASE, continuous: false, skew: [25, 40, 30] } },
  { name: 'skews 5°/15°/−8°, skew-parallel fan, edge members', spec: { ...BASE, skew: [5, 15, -8] }, options: { edgeMembers: true } },
];

describe('a mirrored or rotated copy of a deck gives the same result', () => {
  // Objectivity of the model: the analysis must not depend on which side or end is called
  // first (common practice, no source). Compared: every influence ordinate at random points.
  for (const c of COPIES) {
    for (const kind of ['mirrored', 'rotated'] as const) {
      it(`${kind}: ${c.name}`, () => {
        const a = buildGrillage(steelDeck(c.spec), c.options);
        const b = buildGrillage(steelDeck(kind === 'mirrored' ? mirrored(c.spec) : rotated(c.spec)), c.options);
        expect(b.layout).toBe(a.layout);
        const W = a.girderOffsets[a.girderCount - 1];
        const N = a.spanCount;
        const ra = responses(a);
        const mapped = ra.map((r) => (kind === 'mirrored' ? mirrorResponse(r, a.girderCount) : rotateResponse(r, a.girderCount, N)));
        const sa = influenceSurfaces(a, ra);
        const sb = influenceSurfaces(b, mapped.map((m) => m.r));
        const r = rng(7);
        const e = a.extent;
        for (let t = 0; t < 30; t++) {
          const y = e.yMin + r() * (e.yMax - e.yMin);
          const x0 = a.supportLineX(0, y);
          const x = x0 + r() * (a.supportLineX(N, y) - x0);
          const xb = kind === 'mirrored' ? x - a.supportLineX(0, W) : a.supportLineX(N, W) - x;
          const yb = W - y;
          sa.forEach((s, k) => {
            const va = s.at(x, y);
            const vb = mapped[k].sign * sb[k].at(xb, yb);
            expect(Math.abs(va - vb)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(va)));
          });
        }
      });
    }
  }

  it('both skew orientations mesh and solve (±40°, each layout)', () => {
    for (const layout of ['skew-parallel', 'perpendicular'] as const) {
      for (const skew of [40, -40]) {
        const model = buildGrillage(steelDeck({ girders: 6, skew }), { layout });
        const W = model.girderOffsets[5];
        const res = analyseLoads(model, [{ x: model.supportLineX(0, W / 2) + 12, y: W / 2, P: 1e5 }]);
        expect(res.totalReaction).toBeRelativelyClose(1e5, 1e-10);
        expect(res.girderMoments.every((g) => g[0].every(Number.isFinite))).toBe(true);
      }
    }
  });
});

describe('a symmetric deck under a symmetric load responds symmetrically', () => {
  // Symmetry (common practice, no source): mirror-image girders carry mirror-image effects.
  it('right deck, loads mirrored about the centreline', () => {
    const deck = steelDeck({ girders: 6, spacingFt: 8.5, spansFt: [90] });
    const model = buildGrillage(deck);
    const W = model.girderOffsets[5];
    const L = deck.spans[0].length;
    const loads = [
      { x: 0.41 * L, y: 1.3, P: 7e4 },
      { x: 0.63 * L, y: -0.4, P: 3e4 },
    ];
    const res = analyseLoads(model, [...loads, ...loads.map((l) => ({ ...l, y: W - l.y }))]);
    for (let g = 0; g < 3; g++) {
      for (let k = 0; k <= 10; k++) {
        expect(res.girderMoments[g][0][k]).toBeRelativelyClose(res.girderMoments[5 - g][0][k], 1e-9);
      }
      expect(res.reactions[g][0]!).toBeRelativelyClose(res.reactions[5 - g][0]!, 1e-9);
    }
  });

  it('skewed parallelogram deck (point symmetric), loads turned through 180°', () => {
    const deck = steelDeck({ girders: 5, spansFt: [75, 75], continuous: true, skew: 38 });
    const model = buildGrillage(deck);
    const W = model.girderOffsets[4];
    const XN = model.supportLineX(2, W);
    const loads = [
      { x: 14, y: 2.1, P: 5e4 },
      { x: 31, y: 8.3, P: 8e4 },
    ];
    const res = analyseLoads(model, [...loads, ...loads.map((l) => ({ x: XN - l.x, y: W - l.y, P: l.P }))]);
    for (let g = 0; g < 5; g++) {
      for (let k = 0; k <= 10; k++) {
        expect(Math.abs(res.girderMoments[g][0][k] - res.girderMoments[4 - g][1][10 - k])).toBeLessThanOrEqual(1e-9 * 1e5 * 30);
      }
      expect(res.reactions[g][1]!).toBeRelativelyClose(res.reactions[4 - g][1]!, 1e-9);
    }
  });
});

describe('mesh convergence: girder moment shares change by less than 1 % from the default density to twice it', () => {
  // Convergence of the discretisation (common practice, no source): a design-truck-like group
  // of four wheels near girder 2 at midspan; shares M_g / Σ M; change relative to the largest share.
  const wheelGroup = (model: GrillageModel, span: number) => {
    const y0 = model.girderOffsets[1] - fromUs.ft(1);
    const yc = model.girderOffsets[1];
    const xm = (model.supportLineX(span, yc) + model.supportLineX(span + 1, yc)) / 2;
    const g = fromUs.ft(6);
    const a = fromUs.ft(14);
    return [
      { x: xm, y: y0, P: 1 },
      { x: xm, y: y0 + g, P: 1 },
      { x: xm - a, y: y0, P: 1 },
      { x: xm - a, y: y0 + g, P: 1 },
    ];
  };
  for (const [name, spec] of [
    ['right simple span', { girders: 6 }],
    ['skew 45°, perpendicular members', { girders: 6, skew: 45 }],
    ['three continuous spans', { girders: 6, spansFt: [80, 100, 80], continuous: true }],
  ] as [string, DeckSpec][]) {
    it(name, () => {
      const deck = steelDeck(spec);
      const span = deck.spans.length > 1 ? 1 : 0;
      const shares = (m?: number) => {
        const model = buildGrillage(deck, m === undefined ? {} : { segmentsPerSpan: m });
        const M = analyseLoads(model, wheelGroup(model, span)).girderMoments.map((gm) => gm[span][5]);
        const total = M.reduce((p, q) => p + q, 0);
        return M.map((v) => v / total);
      };
      const coarse = shares();
      const fine = shares(40);
      const top = Math.max(...fine);
      coarse.forEach((v, k) => expect(Math.abs(fine[k] - v) / top).toBeLessThan(0.01));
    });
  }
});
