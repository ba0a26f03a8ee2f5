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
      for (let j = si; j < i; j++) {
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
    for (let i = 0; i < n; i++) {
      const bi = i * w - i + b;
      const oi = i * m;
      for (let k = rowStart[i]; k < i; k++) {
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
    for (let i = n - 1; i >= 0; i--) {
      const bi = i * w - i + b;
      const oi = i * m;
      for (let k = rowStart[i]; k < i; k++) {
        const l = L[bi + k];
        if (l === 0) continue;
        const ok = k * m;
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
