import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { BandLDLT, SingularPivotError, SymmetricBandMatrix, adjacencyFromEdges, nodeBandwidth, reverseCuthillMcKee } from '../../../shared/grillage/index.js';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** A random symmetric positive definite band matrix (diagonally dominant), with some leading zeros in rows. */
function randomSpd(n: number, bw: number, seed: number): SymmetricBandMatrix {
  const r = rng(seed);
  const A = new SymmetricBandMatrix(n, bw);
  for (let i = 0; i < n; i++) {
    let rowSum = 0;
    for (let j = Math.max(0, i - bw); j < i; j++) {
      if (r() < 0.3) continue; // structural zeros inside the band
      const v = (r() - 0.5) * 2;
      A.add(i, j, v);
      rowSum += Math.abs(v);
    }
    A.add(i, i, 1 + rowSum * 2 + 2 * bw);
  }
  return A;
}

describe('banded LDLᵀ solver', () => {
  it('solves like the dense ml-matrix solver (relative 1e-12)', () => {
    // Oracle: ml-matrix dense LU solve of the same matrix
    for (const [n, bw, seed] of [[1, 0, 1], [7, 3, 2], [60, 7, 3], [200, 25, 4]] as const) {
      const A = randomSpd(n, bw, seed);
      const r = rng(seed + 100);
      const b = Float64Array.from({ length: n }, () => r() - 0.5);
      const x = BandLDLT.factor(A).solve(b);
      const xd = solve(new Matrix(A.toDense()), Matrix.columnVector(Array.from(b))).getColumn(0);
      const scale = Math.max(...xd.map(Math.abs));
      for (let i = 0; i < n; i++) expect(Math.abs(x[i] - xd[i])).toBeLessThanOrEqual(1e-12 * scale);
      // residual check
      const Ax = A.multiply(x);
      for (let i = 0; i < n; i++) expect(Math.abs(Ax[i] - b[i])).toBeLessThanOrEqual(1e-12 * (1 + Math.abs(b[i])) * 10);
    }
  });

  it('solves many right-hand sides at once exactly as one at a time', () => {
    const n = 80, m = 5;
    const A = randomSpd(n, 9, 7);
    const F = BandLDLT.factor(A);
    const r = rng(8);
    const B = Float64Array.from({ length: n * m }, () => r() - 0.5);
    const cols = Array.from({ length: m }, (_, c) => Float64Array.from({ length: n }, (_, i) => B[i * m + c]));
    F.solveManyInPlace(B, m);
    cols.forEach((col, c) => {
      const x = F.solve(col);
      for (let i = 0; i < n; i++) expect(B[i * m + c]).toBeRelativelyClose(x[i], 1e-12);
    });
  });

  it('reports a singular matrix at the dependent unknown (free–free chain: a zero pivot)', () => {
    // Stiffness of a chain of springs with no support: the last pivot vanishes (rigid-body mode)
    const n = 6;
    const A = new SymmetricBandMatrix(n, 1);
    for (let e = 0; e + 1 < n; e++) {
      A.add(e, e, 1e6);
      A.add(e + 1, e + 1, 1e6);
      A.add(e + 1, e, -1e6);
    }
    let err: unknown;
    try {
      BandLDLT.factor(A);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SingularPivotError);
    expect((err as SingularPivotError).index).toBe(n - 1);
    expect(Math.abs((err as SingularPivotError).pivot)).toBeLessThan(1e-6);
  });

  it('reports an indefinite matrix and a zero diagonal', () => {
    const A = new SymmetricBandMatrix(3, 1);
    A.add(0, 0, 1);
    A.add(1, 1, 1);
    A.add(1, 0, 2); // 1 − 4 < 0
    A.add(2, 2, 1);
    expect(() => BandLDLT.factor(A)).toThrow(SingularPivotError);
    const Z = new SymmetricBandMatrix(2, 1);
    Z.add(0, 0, 1);
    expect(() => BandLDLT.factor(Z)).toThrow(/pivot 1/);
  });

  it('rejects entries outside the band and bad sizes', () => {
    const A = new SymmetricBandMatrix(5, 1);
    expect(() => A.add(4, 0, 1)).toThrow(RangeError);
    expect(() => new SymmetricBandMatrix(-1, 0)).toThrow(RangeError);
    expect(() => new SymmetricBandMatrix(3, 1.5)).toThrow(RangeError);
  });
});

describe('reverse Cuthill–McKee numbering', () => {
  /** A rows × cols grid graph with shuffled node labels. */
  function shuffledGrid(rows: number, cols: number, seed: number) {
    const r = rng(seed);
    const label = Array.from({ length: rows * cols }, (_, k) => k);
    for (let k = label.length - 1; k > 0; k--) {
      const j = Math.floor(r() * (k + 1));
      [label[k], label[j]] = [label[j], label[k]];
    }
    const ei: number[] = [];
    const ej: number[] = [];
    for (let a = 0; a < rows; a++) {
      for (let b = 0; b < cols; b++) {
        const v = label[a * cols + b];
        if (b + 1 < cols) { ei.push(v); ej.push(label[a * cols + b + 1]); }
        if (a + 1 < rows) { ei.push(v); ej.push(label[(a + 1) * cols + b]); }
      }
    }
    return { n: rows * cols, ei, ej };
  }

  it('returns a permutation and brings a shuffled 8 × 41 grid to a bandwidth near its short side', () => {
    // RCM on a grid graph numbers it across the short side: bandwidth of the order of 8
    // (Cuthill & McKee 1969; George & Liu 1981; from memory)
    const { n, ei, ej } = shuffledGrid(41, 8, 5);
    const { order, position } = reverseCuthillMcKee(adjacencyFromEdges(n, ei, ej));
    expect(Array.from(order).sort((a, b) => a - b)).toEqual(Array.from({ length: n }, (_, k) => k));
    for (let k = 0; k < n; k++) expect(position[order[k]]).toBe(k);
    const identity = Int32Array.from({ length: n }, (_, k) => k);
    const before = nodeBandwidth(identity, ei, ej);
    const after = nodeBandwidth(position, ei, ej);
    expect(before).toBeGreaterThan(100);
    expect(after).toBeLessThanOrEqual(9);
  });

  it('numbers every component of a disconnected graph (simple spans)', () => {
    const a = shuffledGrid(10, 4, 9);
    const ei = [...a.ei, ...a.ei.map((v) => v + a.n)];
    const ej = [...a.ej, ...a.ej.map((v) => v + a.n)];
    const { order, position } = reverseCuthillMcKee(adjacencyFromEdges(2 * a.n, ei, ej));
    expect(new Set(order).size).toBe(2 * a.n);
    expect(nodeBandwidth(position, ei, ej)).toBeLessThanOrEqual(5);
  });
});
