/**
 * The dense path, kept as the oracle of the banded solver: the same grid assembled into a
 * full ml-matrix `Matrix` from element matrices formed independently (Tᵀ·k·T with ml-matrix
 * products) and solved with ml-matrix's Cholesky decomposition. O(n³); for tests and the
 * benchmark ratio, not for production.
 *
 * Units and signs as assemble.ts (N/m, N, N·m; w down, right-hand rotations about +x, +y).
 * Unknowns are numbered as in the banded model (free DOFs, RCM order), so vectors compare
 * entry by entry.
 */
import { CholeskyDecomposition, Matrix } from 'ml-matrix';
import type { AssembledGrid } from './assemble.js';
import { localGridStiffness } from './element.js';

/** Element matrix K = Tᵀ·k·T formed with ml-matrix (independent of element.ts's loops). */
export function denseMemberMatrix(EI: number, GJ: number, dx: number, dy: number): Matrix {
  const L = Math.hypot(dx, dy);
  const c = dx / L;
  const s = dy / L;
  const k = new Matrix(6, 6);
  const kl = localGridStiffness(EI, GJ, L);
  for (let p = 0; p < 6; p++) for (let q = 0; q < 6; q++) k.set(p, q, kl[p * 6 + q]);
  const T = Matrix.zeros(6, 6);
  for (const o of [0, 3]) {
    T.set(o, o, 1);
    T.set(o + 1, o + 1, c);
    T.set(o + 1, o + 2, s);
    T.set(o + 2, o + 1, -s);
    T.set(o + 2, o + 2, c);
  }
  return T.transpose().mmul(k).mmul(T);
}

/** Dense stiffness on the free unknowns of an assembled grid. */
export function denseStiffness(grid: AssembledGrid): Matrix {
  const K = Matrix.zeros(grid.n, grid.n);
  const def = grid.definition;
  def.members.forEach((m) => {
    const a = def.nodes[m.i];
    const b = def.nodes[m.j];
    const ke = denseMemberMatrix(m.EI, m.GJ, b.x - a.x, b.y - a.y);
    const dofs = [m.i * 3, m.i * 3 + 1, m.i * 3 + 2, m.j * 3, m.j * 3 + 1, m.j * 3 + 2].map((g) => grid.dofIndex[g]);
    for (let p = 0; p < 6; p++) {
      if (dofs[p] < 0) continue;
      for (let q = 0; q < 6; q++) {
        if (dofs[q] < 0) continue;
        K.set(dofs[p], dofs[q], K.get(dofs[p], dofs[q]) + ke.get(p, q));
      }
    }
  });
  return K;
}

/** Dense Cholesky factors with the banded factor's block-solve signature. */
export class DenseCholesky {
  readonly n: number;
  private readonly chol: CholeskyDecomposition;

  /** K is symmetrised as (K + Kᵀ)/2 first: ml-matrix demands exact symmetry, and skew member products differ in the last bit. */
  constructor(K: Matrix) {
    this.n = K.rows;
    const S = K.clone().add(K.transpose()).mul(0.5);
    this.chol = new CholeskyDecomposition(S);
    if (!this.chol.isPositiveDefinite()) throw new RangeError('dense stiffness is not positive definite');
  }

  solve(rhs: ArrayLike<number>): Float64Array {
    const b = Matrix.columnVector(Array.from(rhs));
    return Float64Array.from(this.chol.solve(b).getColumn(0));
  }

  /** Same layout as BandLDLT.solveManyInPlace: B[i·m + r] is entry i of right-hand side r. */
  solveManyInPlace(B: Float64Array, m: number): Float64Array {
    const M = new Matrix(this.n, m);
    for (let i = 0; i < this.n; i++) for (let r = 0; r < m; r++) M.set(i, r, B[i * m + r]);
    const X = this.chol.solve(M);
    for (let i = 0; i < this.n; i++) for (let r = 0; r < m; r++) B[i * m + r] = X.get(i, r);
    return B;
  }
}
