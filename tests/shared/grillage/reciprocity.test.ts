import { describe, expect, it } from 'vitest';
import {
  DenseCholesky,
  analyseLoads,
  buildGrillage,
  denseStiffness,
  evaluateSurfaces,
  freeLoadVector,
  influenceSurfaces,
  type GrillageModel,
  type GrillageOptions,
  type GrillageResponse,
} from '../../../shared/grillage/index.js';
import { steelDeck, type DeckSpec } from './fixtures.js';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

function allResponses(model: GrillageModel): GrillageResponse[] {
  const out: GrillageResponse[] = [];
  const N = model.spanCount;
  for (let g = 0; g < model.girderCount; g++) {
    for (let j = 0; j < N; j++) for (const f of [0, 0.1, 0.43, 0.5, 0.9, 1]) out.push({ kind: 'girder-moment', girder: g, span: j, fraction: f });
    for (let s = 0; s <= N; s++) {
      if (s > 0) out.push({ kind: 'girder-shear', girder: g, support: s, side: 'left' });
      if (s < N) out.push({ kind: 'girder-shear', girder: g, support: s, side: 'right' });
      out.push({ kind: 'reaction', girder: g, support: s });
    }
  }
  return out;
}

function randomPoints(model: GrillageModel, count: number, seed: number): { x: number; y: number }[] {
  const r = rng(seed);
  const e = model.extent;
  return Array.from({ length: count }, () => {
    const y = e.yMin + r() * (e.yMax - e.yMin);
    const x0 = model.supportLineX(0, y);
    const x1 = model.supportLineX(model.spanCount, y);
    return { x: x0 + r() * (x1 - x0), y };
  });
}

const CASES: { name: string; spec: DeckSpec; options?: GrillageOptions }[] = [
  { name: 'right simple span', spec: { girders: 5 } },
  { name: 'skew +18° (skew-parallel)', spec: { girders: 5, skew: 18 } },
  { name: 'skew −18° (skew-parallel)', spec: { girders: 5, skew: -18 } },
  { name: 'skew +45° (perpendicular)', spec: { girders: 6, skew: 45 } },
  { name: 'skew −45° (perpendicular)', spec: { girders: 6, skew: -45 } },
  { name: 'three continuous spans, skew 30°', spec: { girders: 4, spansFt: [60, 80, 60], continuous: true, skew: 30 } },
  { name: 'two simple spans, non-parallel supports', spec: { girders: 4, spansFt: [70, 90], skew: [10, 35, -15] } },
  { name: 'two simple spans, skew-parallel fan', spec: { girders: 4, spansFt: [70, 90], skew: [5, 15, -10] } },
  {
    name: 'edge members, diaphragms, skew 40°',
    spec: { girders: 5, skew: 40, diaphragms: { type: 'concrete-diaphragms', intermediatePerSpan: 2, inertia: 5e-3 } },
    options: { edgeMembers: true },
  },
];

describe('reciprocity: adjoint influence ordinates equal direct unit-load solves', () => {
  // Maxwell–Betti reciprocal theorem: r(x, y) = aᵀK⁻¹F(x, y) = (K⁻¹a)ᵀF(x, y) for symmetric K.
  // Tolerance 1e-9 relative to the largest value of each response over the sample points.
  for (const c of CASES) {
    it(c.name, () => {
      const model = buildGrillage(steelDeck(c.spec), c.options);
      const responses = allResponses(model);
      const surfaces = influenceSurfaces(model, responses);
      const points = randomPoints(model, 25, 99);
      const direct = points.map((p) => analyseLoads(model, [{ ...p, P: 1 }]));
      responses.forEach((r, k) => {
        const d = direct.map((res) => res.response(r));
        const a = points.map((p) => surfaces[k].at(p.x, p.y));
        const scale = Math.max(1e-12, ...d.map(Math.abs));
        d.forEach((v, i) => expect(Math.abs(a[i] - v)).toBeLessThanOrEqual(1e-9 * scale));
      });
    });
  }

  it('load positions exactly on nodes, lines, support lines and deck edges', () => {
    const model = buildGrillage(steelDeck({ girders: 4, skew: 35, spansFt: [60, 70], continuous: true }));
    const responses = allResponses(model);
    const surfaces = influenceSurfaces(model, responses);
    const pts: { x: number; y: number }[] = [];
    for (const line of model.mesh.lines) for (let p = 0; p < line.xs.length; p += 3) pts.push({ x: line.xs[p], y: line.y });
    for (const y of [model.extent.yMin, model.extent.yMax, model.girderOffsets[1]]) {
      for (let j = 0; j <= model.spanCount; j++) pts.push({ x: model.supportLineX(j, y), y });
    }
    for (const p of pts) {
      const res = analyseLoads(model, [{ ...p, P: 1 }]);
      responses.forEach((r, k) => {
        const d = res.response(r);
        expect(Math.abs(surfaces[k].at(p.x, p.y) - d)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(d)) * 30);
      });
    }
  });

  it('ordinates are zero off the deck and tables, grids and batches agree with at()', () => {
    const model = buildGrillage(steelDeck({ girders: 5, skew: 40 }));
    const surfaces = influenceSurfaces(model, allResponses(model).slice(0, 12));
    const e = model.extent;
    const s = surfaces[3];
    expect(s.at(e.xMin - 1, 0)).toBe(0);
    expect(s.at(e.xMax + 1, 0)).toBe(0);
    expect(s.at(model.supportLineX(0, e.yMax) - 0.01, e.yMax)).toBe(0); // beyond the skewed end
    expect(s.at(10, e.yMin - 0.01)).toBe(0);
    expect(s.at(10, e.yMax + 0.01)).toBe(0);
    const xs = Float64Array.from({ length: 23 }, (_, k) => e.xMin - 0.5 + (k * (e.xMax - e.xMin + 1)) / 22);
    const ys = Float64Array.from({ length: 17 }, (_, k) => e.yMin - 0.2 + (k * (e.yMax - e.yMin + 0.4)) / 16);
    const grid = s.sampleGrid(xs, ys);
    const table = model.transfer.tabulateGrid(xs, ys);
    const viaTable = s.evaluate(table);
    const viaMany = evaluateSurfaces(surfaces, table);
    const px = Float64Array.from({ length: xs.length * ys.length }, (_, k) => xs[Math.floor(k / ys.length)]);
    const py = Float64Array.from({ length: xs.length * ys.length }, (_, k) => ys[k % ys.length]);
    const batch = s.atMany(px, py);
    for (let k = 0; k < grid.length; k++) {
      const v = s.at(px[k], py[k]);
      expect(grid[k]).toBe(v);
      expect(batch[k]).toBe(v);
      expect(Math.abs(viaTable[k] - v)).toBeLessThanOrEqual(1e-14 * Math.max(1, Math.abs(v)) * 100);
      surfaces.forEach((sf, r) => expect(Math.abs(viaMany[r][k] - sf.at(px[k], py[k]))).toBeLessThanOrEqual(1e-12));
    }
    expect(grid.some((v) => v !== 0)).toBe(true);
    expect(() => s.at(Number.NaN, 1)).toThrow(RangeError);
    const other = buildGrillage(steelDeck({ girders: 5 }));
    expect(() => s.evaluate(other.transfer.tabulate([1], [1]))).toThrow(/another grillage model/);
  });
});

describe('the banded solver against the dense ml-matrix oracle', () => {
  for (const c of [CASES[0], CASES[4], CASES[5], CASES[8]]) {
    it(`K symmetric, banded = dense entry by entry and in the solve (${c.name})`, () => {
      const model = buildGrillage(steelDeck(c.spec), { ...c.options, segmentsPerSpan: 10 });
      const grid = model.grid;
      const D = denseStiffness(grid);
      const n = grid.n;
      let scale = 0;
      for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(D.get(i, i)));
      let asym = 0;
      let diff = 0;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const v = D.get(i, j);
          asym = Math.max(asym, Math.abs(v - D.get(j, i)));
          diff = Math.max(diff, Math.abs(v - grid.K.get(i, j)));
        }
      }
      // symmetry of the independently assembled dense matrix (Maxwell–Betti: K = Kᵀ)
      expect(asym).toBeLessThanOrEqual(1e-13 * scale);
      expect(diff).toBeLessThanOrEqual(1e-12 * scale);
      const r = rng(4);
      const F = Float64Array.from({ length: model.mesh.nodes.length * 3 }, () => r() - 0.5);
      const f = freeLoadVector(grid, F);
      const xb = grid.factor.solve(f);
      const dense = new DenseCholesky(D);
      const xd = dense.solve(f);
      const xmax = Math.max(...Array.from(xd, Math.abs));
      for (let i = 0; i < n; i++) expect(Math.abs(xb[i] - xd[i])).toBeLessThanOrEqual(1e-9 * xmax);
      // influence surfaces through the dense path are the same
      const rs = allResponses(model).slice(0, 8);
      const sb = influenceSurfaces(model, rs);
      const sd = influenceSurfaces(model, rs, { solver: dense });
      for (const p of randomPoints(model, 10, 3)) {
        sb.forEach((s, k) => expect(Math.abs(s.at(p.x, p.y) - sd[k].at(p.x, p.y))).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(s.at(p.x, p.y)))));
      }
    });
  }

  it('the RCM numbering narrows the band of a deck mesh', () => {
    const model = buildGrillage(steelDeck({ girders: 8, spansFt: [100] }), { segmentsPerSpan: 40 });
    // nodes are created girder by girder (a band of one girder line, 41 nodes); RCM numbers across the deck
    expect(model.stats.nodeBandwidth).toBeLessThanOrEqual(9);
    expect(model.stats.halfBandwidth).toBeLessThanOrEqual(3 * 10);
  });
});
