import { describe, expect, it } from 'vitest';
import {
  analyseLoads,
  assembleGrid,
  buildGrillage,
  influenceSurfaces,
  memberEndForces,
  solveGrid,
  type GridDefinition,
  type GrillageModel,
} from '../../../shared/grillage/index.js';
import { steelDeck } from './fixtures.js';

/** EI of the first girder member of girder g, N·m². */
function girderEI(model: GrillageModel, g: number): number {
  const line = model.mesh.girderLine[g];
  return model.mesh.members.find((m) => m.kind === 'girder' && m.line === line)!.EI;
}

/** Node of girder g at station x (exact match). */
function girderNodeAt(model: GrillageModel, g: number, x: number): number {
  const line = model.mesh.lines[model.mesh.girderLine[g]];
  const p = line.xs.findIndex((v) => Math.abs(v - x) < 1e-9);
  return line.nodes[p];
}

describe('one simply supported girder (generic grid)', () => {
  // Beam theory: simply supported beam with a central load, M = PL/4, δ = PL³/48EI
  // (Gere & Timoshenko, Mechanics of Materials; AISC Manual beam diagrams; from memory)
  const L = 24;
  const n = 12;
  const EI = 5.1e8;
  const def: GridDefinition = {
    nodes: Array.from({ length: n + 1 }, (_, k) => ({ x: (k * L) / n, y: 0 })),
    members: Array.from({ length: n }, (_, k) => ({ i: k, j: k + 1, EI, GJ: 2e8 })),
    restraints: [
      { node: 0, direction: 'w' },
      { node: n, direction: 'w' },
      { node: 0, direction: 'rx' }, // twist held at one end, else the line spins about its axis
    ],
  };
  const grid = assembleGrid(def);
  const P = 100e3;

  it('gives PL/4 at midspan and PL³/48EI deflection', () => {
    const F = new Float64Array(3 * (n + 1));
    F[3 * (n / 2)] = P; // downward
    const { u, restraintForces } = solveGrid(grid, F);
    expect(u[3 * (n / 2)]).toBeRelativelyClose((P * L ** 3) / (48 * EI), 1e-11);
    // sagging moment at the midspan node: M_sag(j) of the member ending there = +f[θy_j]
    const f = memberEndForces(grid, n / 2 - 1, u);
    expect(f[5]).toBeRelativelyClose((P * L) / 4, 1e-11);
    // reactions upward P/2 (restraint forces are down-positive)
    expect(-restraintForces[0]).toBeRelativelyClose(P / 2, 1e-12);
    expect(-restraintForces[1]).toBeRelativelyClose(P / 2, 1e-12);
  });

  it('numbers its nodes for a small bandwidth (a line: 3 unknowns per node)', () => {
    expect(grid.nodeBandwidth).toBe(1);
    expect(grid.halfBandwidth).toBeLessThanOrEqual(5);
  });
});

describe('two girders under equal loads act as two independent beams', () => {
  // Under a load repeated on both girders of a symmetric two-girder deck no shear crosses the
  // slab (symmetry), so each girder is a statically determinate simple beam:
  // M(L/2) = PL/4, δ = PL³/48EI, and for a load at a: M(x) = P·a·(L − x)/L for a ≤ x, R = P(L − a)/L, V = R.
  const deck = steelDeck({ girders: 2, spacingFt: 9, spansFt: [90], overhangLeftFt: 3, overhangRightFt: 3 });
  const L = deck.spans[0].length;
  const s = deck.girders.kind === 'uniform' ? deck.girders.spacing : 0;
  const P = 80e3;

  for (const layout of ['skew-parallel', 'perpendicular'] as const) {
    it(`midspan moment PL/4 and deflection PL³/48EI (${layout})`, () => {
      const model = buildGrillage(deck, { layout });
      const res = analyseLoads(model, [
        { x: L / 2, y: 0, P },
        { x: L / 2, y: s, P },
      ]);
      for (let g = 0; g < 2; g++) {
        expect(res.girderMoments[g][0][5]).toBeRelativelyClose((P * L) / 4, 1e-9);
        const node = girderNodeAt(model, g, L / 2);
        expect(res.displacements[3 * node]).toBeRelativelyClose((P * L ** 3) / (48 * girderEI(model, g)), 1e-9);
      }
    });
  }

  it('moments, shears and reactions of an off-node load follow beam statics exactly', () => {
    const model = buildGrillage(deck, { segmentsPerSpan: 10 });
    const a = 0.337 * L; // between nodes
    const res = analyseLoads(model, [
      { x: a, y: 0, P },
      { x: a, y: s, P },
    ]);
    for (let g = 0; g < 2; g++) {
      for (let k = 0; k <= 10; k++) {
        const x = (k * L) / 10;
        const M = x <= a ? (P * x * (L - a)) / L : (P * a * (L - x)) / L;
        expect(Math.abs(res.girderMoments[g][0][k] - M)).toBeLessThanOrEqual(1e-9 * P * L);
      }
      // moment at a point inside the loaded member (between nodes), exact by member statics
      const xm = 0.35 * L;
      expect(res.response({ kind: 'girder-moment', girder: g, span: 0, fraction: 0.35 })).toBeRelativelyClose((P * a * (L - xm)) / L, 1e-9);
      expect(res.response({ kind: 'girder-moment', girder: g, span: 0, fraction: 0.33 })).toBeRelativelyClose((P * 0.33 * L * (L - a)) / L, 1e-9);
      expect(res.girderShears[g][0].right!).toBeRelativelyClose((P * (L - a)) / L, 1e-9);
      expect(res.girderShears[g][1].left!).toBeRelativelyClose((-P * a) / L, 1e-9);
      expect(res.reactions[g][0]!).toBeRelativelyClose((P * (L - a)) / L, 1e-9);
      expect(res.reactions[g][1]!).toBeRelativelyClose((P * a) / L, 1e-9);
    }
  });

  it('the midspan-moment influence surface along the girders equals the beam influence line', () => {
    // Influence line of the midspan moment of a simple beam: x/2 for x ≤ L/2, (L − x)/2 beyond
    // (Müller-Breslau; beam theory). For a unit load on both girders the sum of the two
    // surfaces equals it at every x, between nodes included (Hermite loads are exact).
    const model = buildGrillage(deck, { segmentsPerSpan: 10 });
    const [m0, m1] = influenceSurfaces(model, [
      { kind: 'girder-moment', girder: 0, span: 0, fraction: 0.5 },
      { kind: 'girder-moment', girder: 1, span: 0, fraction: 0.5 },
    ]);
    for (const f of [0.013, 0.2, 0.37, 0.5, 0.61, 0.88, 1]) {
      const x = f * L;
      const exact = x <= L / 2 ? x / 2 : (L - x) / 2;
      const both = m0.at(x, 0) + m0.at(x, s); // girder 1's moment under a unit load on each girder
      expect(Math.abs(both - exact)).toBeLessThanOrEqual(1e-9 * L);
      expect(Math.abs(m1.at(x, 0) + m1.at(x, s) - exact)).toBeLessThanOrEqual(1e-9 * L);
    }
  });
});

describe('two-span continuous girders', () => {
  // Continuous beam of two equal spans, load P at the centre of one span:
  // R_A = 13P/32, R_B = 11P/16, R_C = −3P/32, M_B = −3PL/32
  // (AISC Manual, beam diagrams, "continuous beam – two equal spans – concentrated load at
  // center of one span"; from memory). Symmetric load on a two-girder deck: each girder alone.
  const deck = steelDeck({ girders: 2, spacingFt: 9, spansFt: [80, 80], continuous: true });
  const L = deck.spans[0].length;
  const s = deck.girders.kind === 'uniform' ? deck.girders.spacing : 0;
  const P = 50e3;

  for (const layout of ['skew-parallel', 'perpendicular'] as const) {
    it(`reactions 13/32, 11/16, −3/32 and support moment −3PL/32 (${layout})`, () => {
      const model = buildGrillage(deck, { layout });
      const res = analyseLoads(model, [
        { x: L / 2, y: 0, P },
        { x: L / 2, y: s, P },
      ]);
      for (let g = 0; g < 2; g++) {
        expect(res.reactions[g][0]!).toBeRelativelyClose((13 * P) / 32, 1e-9);
        expect(res.reactions[g][1]!).toBeRelativelyClose((11 * P) / 16, 1e-9);
        expect(res.reactions[g][2]!).toBeRelativelyClose((-3 * P) / 32, 1e-9);
        expect(res.girderMoments[g][0][10]).toBeRelativelyClose((-3 * P * L) / 32, 1e-9);
        expect(res.girderMoments[g][1][0]).toBeRelativelyClose((-3 * P * L) / 32, 1e-9);
        // shears either side of the middle support: −(P − R_A) and R_C-side 3P/32
        expect(res.girderShears[g][1].left!).toBeRelativelyClose((13 * P) / 32 - P, 1e-9);
        expect(res.girderShears[g][1].right!).toBeRelativelyClose((3 * P) / 32, 1e-9);
      }
    });
  }
});
