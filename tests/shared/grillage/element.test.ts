import { describe, expect, it } from 'vitest';
import {
  consistentLoads,
  gridMemberStiffness,
  localGridStiffness,
  simpleSpanMoment,
  denseMemberMatrix,
  assembleGrid,
  solveGrid,
  type GridDefinition,
} from '../../../shared/grillage/index.js';

// Deterministic pseudo-random numbers for repeatable property checks.
function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const EI = 3.2e8; // N·m²
const GJ = 7.5e7; // N·m²

describe('grid element stiffness', () => {
  it('is symmetric and equals Tᵀ·k·T formed with ml-matrix, for any member direction', () => {
    // Matrix stiffness method: K = Tᵀ k T (transformation of a grid member; common practice, no source)
    const r = rng(3);
    for (let k = 0; k < 12; k++) {
      const dx = (r() - 0.5) * 20;
      const dy = (r() - 0.5) * 20;
      const K = gridMemberStiffness(EI, GJ, dx, dy);
      const D = denseMemberMatrix(EI, GJ, dx, dy);
      const scale = Math.max(...Array.from(K, Math.abs));
      for (let p = 0; p < 6; p++) {
        for (let q = 0; q < 6; q++) {
          expect(Math.abs(K[p * 6 + q] - K[q * 6 + p])).toBeLessThanOrEqual(1e-12 * scale);
          expect(Math.abs(K[p * 6 + q] - D.get(p, q))).toBeLessThanOrEqual(1e-12 * scale);
        }
      }
    }
  });

  it('gives no member forces under rigid-body motion (translation, rotation about x, about y)', () => {
    // Equilibrium: a rigid-body displacement strains nothing (common practice, no source).
    // With z down: rotation φ about +x moves a point at +y down, w = φ·y; about +y, w = −φ·x.
    const xi = 1.3, yi = -0.4, xj = 4.1, yj = 2.9;
    const K = gridMemberStiffness(EI, GJ, xj - xi, yj - yi);
    const phi = 1e-3;
    const modes = [
      [1, 0, 0, 1, 0, 0],
      [phi * yi, phi, 0, phi * yj, phi, 0],
      [-phi * xi, 0, phi, -phi * xj, 0, phi],
    ];
    const scale = Math.max(...Array.from(K, Math.abs));
    for (const u of modes) {
      for (let p = 0; p < 6; p++) {
        let f = 0;
        for (let q = 0; q < 6; q++) f += K[p * 6 + q] * u[q];
        expect(Math.abs(f)).toBeLessThanOrEqual(1e-12 * scale);
      }
    }
  });

  it('reproduces the cantilever tip deflection PL³/3EI, slope PL²/2EI and twist TL/GJ', () => {
    // Beam theory (cantilever with a tip load; uniform torsion): Gere & Timoshenko, Mechanics of Materials (from memory)
    const L = 6;
    const def: GridDefinition = {
      nodes: [{ x: 0, y: 0 }, { x: L, y: 0 }],
      members: [{ i: 0, j: 1, EI, GJ }],
      restraints: [
        { node: 0, direction: 'w' },
        { node: 0, direction: 'rx' },
        { node: 0, direction: 'ry' },
      ],
    };
    const grid = assembleGrid(def);
    const P = 12e3;
    const T = 4e3;
    const { u } = solveGrid(grid, [0, 0, 0, P, T, 0]);
    expect(u[3]).toBeRelativelyClose((P * L ** 3) / (3 * EI), 1e-12);
    // θy = −dw/dx along +x
    expect(u[5]).toBeRelativelyClose((-P * L ** 2) / (2 * EI), 1e-12);
    expect(u[4]).toBeRelativelyClose((T * L) / GJ, 1e-12);
  });

  it('has the textbook local entries 12EI/L³, 6EI/L², 4EI/L, 2EI/L, GJ/L', () => {
    // Standard beam element (Weaver & Gere, Matrix Analysis of Framed Structures; from memory)
    const L = 2.5;
    const k = localGridStiffness(EI, GJ, L);
    expect(k[0]).toBeRelativelyClose((12 * EI) / L ** 3, 1e-14);
    expect(Math.abs(k[2])).toBeRelativelyClose((6 * EI) / L ** 2, 1e-14);
    expect(k[14]).toBeRelativelyClose((4 * EI) / L, 1e-14);
    expect(k[17]).toBeRelativelyClose((2 * EI) / L, 1e-14);
    expect(k[7]).toBeRelativelyClose(GJ / L, 1e-14);
  });
});

describe('consistent (statically equivalent) member loads', () => {
  it('equal the fixed-end reactions of a central point load: P/2 and PL/8', () => {
    // Fixed-end moments of a central load PL/8 (beam theory; AISC Manual beam diagrams, from memory)
    const L = 4, P = 10e3;
    const f = new Float64Array(6);
    consistentLoads(L, 0.5, P, 0, 0, f);
    expect(f[0]).toBeRelativelyClose(P / 2, 1e-14);
    expect(f[3]).toBeRelativelyClose(P / 2, 1e-14);
    // about +y: hogging fixed-end moments; θy = −dw/dx flips the textbook signs
    expect(f[2]).toBeRelativelyClose(-(P * L) / 8, 1e-14);
    expect(f[5]).toBeRelativelyClose((P * L) / 8, 1e-14);
  });

  it('equal the fixed-end moments Pab²/L² and Pa²b/L² of an off-centre load', () => {
    // Beam theory, fixed-fixed beam with a point load (AISC Manual beam diagrams, from memory)
    const L = 5, P = 7e3, a = 1.5, b = L - a;
    const f = new Float64Array(6);
    consistentLoads(L, a / L, P, 0, 0, f);
    expect(-f[2]).toBeRelativelyClose((P * a * b * b) / (L * L), 1e-13);
    expect(f[5]).toBeRelativelyClose((P * a * a * b) / (L * L), 1e-13);
    expect(f[0]).toBeRelativelyClose((P * b * b * (3 * a + b)) / L ** 3, 1e-13);
  });

  it('are statically equivalent for any position, force and couples', () => {
    // Statics: same resultant force and same moments about the x and y axes through node i.
    // A down force P at distance d along +x has moment −P·d about +y.
    const r = rng(11);
    const f = new Float64Array(6);
    for (let k = 0; k < 20; k++) {
      const L = 0.5 + 5 * r();
      const xi = r();
      const P = (r() - 0.3) * 1e4;
      const Mx = (r() - 0.5) * 3e3;
      const My = (r() - 0.5) * 3e3;
      consistentLoads(L, xi, P, Mx, My, f);
      const scale = Math.abs(P) * L + Math.abs(Mx) + Math.abs(My);
      expect(Math.abs(f[0] + f[3] - P)).toBeLessThanOrEqual(1e-12 * Math.abs(P) + 1e-9);
      expect(Math.abs(f[1] + f[4] - Mx)).toBeLessThanOrEqual(1e-12 * scale);
      expect(Math.abs(f[2] + f[5] - L * f[3] - (My - P * xi * L))).toBeLessThanOrEqual(1e-12 * scale);
    }
  });

  it('give the simple-span moment Pab/L and the couple jump within a member', () => {
    // Beam theory, simply supported beam: M = P·a·b/L under the load; a couple C gives
    // M = C·x/L left of it and C·x/L − C right of it (statics of the free body)
    const L = 8, P = 3e3, C = 2e3;
    expect(simpleSpanMoment(L, 0.25, 0.25, P, 0)).toBeRelativelyClose((P * 2 * 6) / 8, 1e-14);
    expect(simpleSpanMoment(L, 0.5, 0.25, P, 0)).toBeRelativelyClose(P * 2 * (4 / 8), 1e-14);
    expect(simpleSpanMoment(L, 0.25, 0.75, 0, C)).toBeRelativelyClose(C * 0.25, 1e-14);
    expect(simpleSpanMoment(L, 0.8, 0.75, 0, C)).toBeRelativelyClose(C * 0.8 - C, 1e-14);
  });
});
