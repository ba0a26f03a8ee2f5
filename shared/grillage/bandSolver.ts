/**
 * Symmetric banded storage and a banded LDLᵀ (root-free Cholesky) factorisation with
 * forward/back substitution, reusable for any number of right-hand sides. No units of its
 * own (the grillage feeds stiffness in N/m, N, N·m and loads in N, N·m).
 *
 * Storage: the lower band of an n×n symmetric matrix with half-bandwidth b (A[i][j] = 0 for
 * |i − j| > b) kept row by row: A[i][j] for j ∈ [i − b, i] at data[i·(b + 1) + (j − i + b)].
 * Rows are contiguous, so the inner products of the factorisation run over contiguous memory.
 * Each row's first structurally non-zero column (its envelope) is honoured, so leading zeros
 * inside the band cost nothing; fill-in of LDLᵀ stays inside the envelope.
 *
 * Factorisation (row-oriented Crout form of LDLᵀ, e.g. G. Golub & C. Van Loan, Matrix
 * Computations, §4.1 and §4.3 on band matrices; from memory):
 *   g_ij = A_ij − Σ_k g_ik·L_jk,  L_ij = g_ij / d_j,  d_i = A_ii − Σ_j g_ij·L_ij.
 * Cost ≈ n·b²/2 multiply-adds; each solve ≈ 2·n·b.
 * Speed: the factorisation forms two columns g_ij, g_i,j+1 per pass over row i (each L_ik is
 * loaded once for both; the sums keep the one-column order, so the rounding is unchanged);
 * the many-right-hand-side solve gathers four source rows per pass in both substitutions.
 * `npm run bench -- bandSolver` compares both with LAPACK's dpbtrf/dpbtrs.
 *
 * Mechanism detection: a pivot d_i that is not finite, ≤ 0, or ≤ tol·A_ii (its own
 * diagonal before elimination) means the matrix is singular or not positive definite in
 * that unknown: a `SingularPivotError` names the unknown so that callers can name the node.
 */

export class SymmetricBandMatrix {
  readonly n: number;
  /** Half-bandwidth b. */
  readonly bandwidth: number;
  /** Row-major lower band, n·(b + 1) entries. */
  readonly data: Float64Array;

  constructor(n: number, bandwidth: number) {
    if (!Number.isInteger(n) || n < 0) throw new RangeError(`band matrix order must be a whole number ≥ 0, not ${n}`);
    if (!Number.isInteger(bandwidth) || bandwidth < 0) throw new RangeError(`half-bandwidth must be a whole number ≥ 0, not ${bandwidth}`);
    this.n = n;
    this.bandwidth = Math.min(bandwidth, Math.max(0, n - 1));
    this.data = new Float64Array(n * (this.bandwidth + 1));
  }

  private index(i: number, j: number): number {
    if (j > i) {
      const t = i;
      i = j;
      j = t;
    }
    const off = j - i + this.bandwidth;
    if (off < 0) throw new RangeError(`entry (${i}, ${j}) lies outside the half-bandwidth ${this.bandwidth}`);
    return i * (this.bandwidth + 1) + off;
  }

  /** Adds v to A[i][j] (and, by symmetry, A[j][i]). */
  add(i: number, j: number, v: number): void {
    this.data[this.index(i, j)] += v;
  }

  get(i: number, j: number): number {
    const lo = Math.min(i, j);
    const hi = Math.max(i, j);
    if (hi - lo > this.bandwidth) return 0;
    return this.data[this.index(hi, lo)];
  }

  /** y = A·x. */
  multiply(x: ArrayLike<number>, y: Float64Array = new Float64Array(this.n)): Float64Array {
    const b = this.bandwidth;
    const w = b + 1;
    const a = this.data;
    y.fill(0);
    for (let i = 0; i < this.n; i++) {
      const base = i * w - i + b;
      const j0 = Math.max(0, i - b);
      let s = a[base + i] * x[i];
      for (let j = j0; j < i; j++) {
        const v = a[base + j];
        s += v * x[j];
        y[j] += v * x[i];
      }
      y[i] += s;
    }
    return y;
  }

  /** Dense copy as an array of rows (tests and the dense oracle). */
  toDense(): number[][] {
    const out = Array.from({ length: this.n }, () => new Array<number>(this.n).fill(0));
    for (let i = 0; i < this.n; i++) {
      for (let j = Math.max(0, i - this.bandwidth); j <= i; j++) {
        const v = this.get(i, j);
        out[i][j] = v;
        out[j][i] = v;
      }
    }
    return out;
  }
}

/** A pivot that shows the matrix singular or not positive definite at unknown `index`. */
export class SingularPivotError extends Error {
  readonly index: number;
  readonly pivot: number;
  readonly diagonal: number;
  constructor(index: number, pivot: number, diagonal: number) {
    super(`pivot ${index} is ${pivot} against a diagonal of ${diagonal}: the matrix is singular or not positive definite`);
    this.name = 'SingularPivotError';
    this.index = index;
    this.pivot = pivot;
    this.diagonal = diagonal;
  }
}

export interface BandFactorOptions {
  /** A pivot ≤ tol·(its diagonal) is a mechanism; default 1e-10. */
  pivotTolerance?: number;
}

/** The LDLᵀ factors of a symmetric positive definite band matrix. */
export class BandLDLT {
  readonly n: number;
  readonly bandwidth: number;
  /** Unit lower factor L (strictly lower band), same layout as the matrix. */
  private readonly L: Float64Array;
  private readonly d: Float64Array;
  /** First structurally non-zero column of each row. */
  private readonly rowStart: Int32Array;

  private constructor(n: number, bandwidth: number, L: Float64Array, d: Float64Array, rowStart: Int32Array) {
    this.n = n;
    this.bandwidth = bandwidth;
    this.L = L;
    this.d = d;
    this.rowStart = rowStart;
  }

  /** Factorises A (left untouched). Throws `SingularPivotError` at the first failing pivot. */
  static factor(A: SymmetricBandMatrix, options: BandFactorOptions = {}): BandLDLT {
    const tol = options.pivotTolerance ?? 1e-10;
    const n = A.n;
    const b = A.bandwidth;
    const w = b + 1;
    const L = new Float64Array(A.data);
    const d = new Float64Array(n);
    const rowStart = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const base = i * w - i + b; // L[base + j] is entry (i, j)
      let s = Math.max(0, i - b);
      while (s < i && L[base + s] === 0) s++;
      rowStart[i] = s;
    }
    for (let i = 0; i < n; i++) {
      const bi = i * w - i + b;
      const si = rowStart[i];
      // g_ij for two columns j, j + 1 at a time: each L_ik is loaded once for both dot products.
      let j = si;
      for (; j + 1 < i; j += 2) {
        const bj = j * w - j + b;
        const bj1 = bj + b; // row j + 1
        const rj = rowStart[j] < rowStart[j + 1] ? rowStart[j] : rowStart[j + 1];
        // entries of row j before its own start are zeros inside the band, so a common start is exact
        const k0 = si > rj ? si : rj;
        // the sums run in the same order as one column at a time (same rounding as before)
        let sj = L[bi + j];
        let sj1 = L[bi + j + 1];
        for (let k = k0; k < j; k++) {
          const a = L[bi + k];
          sj -= a * L[bj + k];
          sj1 -= a * L[bj1 + k];
        }
        L[bi + j] = sj;
        L[bi + j + 1] = sj1 - sj * L[bj1 + j];
      }
      if (j < i) {
        const bj = j * w - j + b;
        const k0 = si > rowStart[j] ? si : rowStart[j];
        let sum = L[bi + j];
        for (let k = k0; k < j; k++) sum -= L[bi + k] * L[bj + k];
        L[bi + j] = sum; // g_ij
      }
      const diag = L[bi + i];
      let di = diag;
      for (let j = si; j < i; j++) {
        const g = L[bi + j];
        const l = g / d[j];
        L[bi + j] = l;
        di -= g * l;
      }
      if (!(Number.isFinite(di) && diag > 0 && di > tol * diag)) throw new SingularPivotError(i, di, diag);
      d[i] = di;
      L[bi + i] = 1;
    }
    return new BandLDLT(n, b, L, d, rowStart);
  }

  /** Solves A·x = rhs in place (rhs becomes x). */
  solveInPlace(x: Float64Array): Float64Array {
    const { n, L, d, rowStart } = this;
    const b = this.bandwidth;
    const w = b + 1;
    // forward: L z = rhs
    for (let i = 0; i < n; i++) {
      const bi = i * w - i + b;
      let s = x[i];
      for (let k = rowStart[i]; k < i; k++) s -= L[bi + k] * x[k];
      x[i] = s;
    }
    for (let i = 0; i < n; i++) x[i] /= d[i];
    // back: Lᵀ x = y, row-oriented (scatter)
    for (let i = n - 1; i >= 0; i--) {
      const bi = i * w - i + b;
      const xi = x[i];
      if (xi !== 0) for (let k = rowStart[i]; k < i; k++) x[k] -= L[bi + k] * xi;
    }
    return x;
  }

  /** Solves A·x = rhs into a new array (rhs untouched). */
  solve(rhs: ArrayLike<number>): Float64Array {
    if (rhs.length !== this.n) throw new RangeError(`right-hand side has ${rhs.length} entries, the matrix ${this.n}`);
    return this.solveInPlace(Float64Array.from(rhs));
  }

  /**
   * Solves for m right-hand sides stored column-interleaved: B[i·m + r] is entry i of
   * right-hand side r. Overwritten with the solutions. Interleaving keeps each factor entry
   * in a register while it updates all m right-hand sides.
   */
  solveManyInPlace(B: Float64Array, m: number): Float64Array {
    const { n, L, d, rowStart } = this;
    const b = this.bandwidth;
    const w = b + 1;
    if (B.length !== n * m) throw new RangeError(`block of right-hand sides has ${B.length} entries, expected ${n * m}`);
    // Both passes gather: row o of B takes Σ_t l_t·(row o_t) over four source rows at a time,
    // so each entry of row o is loaded and stored once per four multiply-adds.
    // forward, L z = B: row i gathers from rows k < i with l = L_ik
    for (let i = 0; i < n; i++) {
      const bi = i * w - i + b;
      const oi = i * m;
      let k = rowStart[i];
      for (; k + 3 < i; k += 4) {
        const l0 = L[bi + k];
        const l1 = L[bi + k + 1];
        const l2 = L[bi + k + 2];
        const l3 = L[bi + k + 3];
        const o0 = k * m;
        const o1 = o0 + m;
        const o2 = o1 + m;
        const o3 = o2 + m;
        for (let r = 0; r < m; r++) B[oi + r] -= l0 * B[o0 + r] + l1 * B[o1 + r] + l2 * B[o2 + r] + l3 * B[o3 + r];
      }
      for (; k < i; k++) {
        const l = L[bi + k];
        if (l === 0) continue;
        const ok = k * m;
        for (let r = 0; r < m; r++) B[oi + r] -= l * B[ok + r];
      }
    }
    for (let i = 0; i < n; i++) {
      const inv = 1 / d[i];
      const oi = i * m;
      for (let r = 0; r < m; r++) B[oi + r] *= inv;
    }
    // back, Lᵀ x = y: row k gathers from rows i > k with l = L_ik (column k of L, stride b in
    // the row-major band; zero where row i starts after k)
    const at = (i: number, k: number) => (rowStart[i] <= k ? L[i * w - i + b + k] : 0);
    for (let k = n - 1; k >= 0; k--) {
      const ok = k * m;
      const iEnd = k + b < n - 1 ? k + b : n - 1;
      let i = k + 1;
      for (; i + 3 <= iEnd; i += 4) {
        const l0 = at(i, k);
        const l1 = at(i + 1, k);
        const l2 = at(i + 2, k);
        const l3 = at(i + 3, k);
        const o0 = i * m;
        const o1 = o0 + m;
        const o2 = o1 + m;
        const o3 = o2 + m;
        for (let r = 0; r < m; r++) B[ok + r] -= l0 * B[o0 + r] + l1 * B[o1 + r] + l2 * B[o2 + r] + l3 * B[o3 + r];
      }
      for (; i <= iEnd; i++) {
        const l = at(i, k);
        if (l === 0) continue;
        const oi = i * m;
        for (let r = 0; r < m; r++) B[ok + r] -= l * B[oi + r];
      }
    }
    return B;
  }

  /** The pivots d (diagnostics). */
  pivots(): Float64Array {
    return Float64Array.from(this.d);
  }
}
