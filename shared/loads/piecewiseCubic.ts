/**
 * A piecewise-cubic function of position along a beam, used for influence lines.
 *
 * Units: positions in m; ordinates in whatever the influence line gives (N·m per N for a
 * moment, N per N for a shear or reaction). Each piece is a cubic c0 + c1·u + c2·u² + c3·u³
 * in the local coordinate u = x − a (m) over [a, b]. Pieces are contiguous; between two
 * pieces the function may jump (the shear influence line does, at its section).
 *
 * Pieces are split at the zeros of each cubic, so every piece has one sign (+1, −1, or 0
 * where it vanishes). That lets the positive and negative portions of an influence line be
 * loaded separately — the design lane load only where it adds to the effect sought, and
 * axles that would reduce it neglected (AASHTO LRFD Art. 3.6.1.3.1).
 *
 * Between the stations of a beam of prismatic elements loaded only at its nodes, the
 * deflected shape — and so, by Müller-Breslau, the influence line — is exactly the cubic
 * Hermite interpolation of the nodal displacements and rotations (common practice, no
 * source: it is the exact solution of EI·w'''' = 0 on each element).
 */

export type Sign = -1 | 0 | 1;

/** Cubic Hermite data of one element: values and slopes at both ends (slope in ordinate per m). */
export interface HermiteElement {
  x0: number;
  x1: number;
  v0: number;
  s0: number;
  v1: number;
  s1: number;
}

/** Anything that can give its exact piecewise-cubic form (the engine's influence lines). */
export interface HasPiecewise {
  piecewise(): PiecewiseCubic;
}

const ROOT_ITERATIONS = 200;

function evalPoly(c0: number, c1: number, c2: number, c3: number, u: number): number {
  return c0 + u * (c1 + u * (c2 + u * c3));
}

/**
 * Real roots of c1 + 2·c2·u + 3·c3·u² (the derivative of the cubic) inside (lo, hi),
 * sorted. Uses the numerically stable quadratic formula.
 */
export function derivativeRoots(c1: number, c2: number, c3: number, lo: number, hi: number): number[] {
  const A = 3 * c3;
  const B = 2 * c2;
  const C = c1;
  const roots: number[] = [];
  const scale = Math.max(Math.abs(A) * Math.max(Math.abs(lo), Math.abs(hi)) ** 2, Math.abs(B) * Math.max(Math.abs(lo), Math.abs(hi)), Math.abs(C));
  if (scale === 0) return roots;
  if (Math.abs(A) * Math.max(hi - lo, 1e-300) ** 2 <= 1e-14 * scale) {
    if (B !== 0) roots.push(-C / B);
  } else {
    const disc = B * B - 4 * A * C;
    if (disc < 0) return roots;
    const sq = Math.sqrt(disc);
    const q = -0.5 * (B + (B >= 0 ? sq : -sq));
    if (q !== 0) {
      roots.push(q / A);
      roots.push(C / q);
    } else {
      roots.push(0);
    }
  }
  return roots.filter((r) => r > lo && r < hi).sort((a, b) => a - b);
}

/**
 * Allocation-free form of `derivativeRoots`: writes the roots of c1 + 2·c2·u + 3·c3·u² in
 * (lo, hi), sorted, into `out` and returns how many (0, 1 or 2).
 */
export function stationaryPoints(c1: number, c2: number, c3: number, lo: number, hi: number, out: Float64Array): number {
  const A = 3 * c3;
  const B = 2 * c2;
  const C = c1;
  const m = Math.max(Math.abs(lo), Math.abs(hi));
  const scale = Math.max(Math.abs(A) * m * m, Math.abs(B) * m, Math.abs(C));
  if (scale === 0) return 0;
  let r1 = NaN;
  let r2 = NaN;
  const w = Math.max(hi - lo, 1e-300);
  if (Math.abs(A) * w * w <= 1e-14 * scale) {
    if (B !== 0) r1 = -C / B;
  } else {
    const disc = B * B - 4 * A * C;
    if (disc < 0) return 0;
    const sq = Math.sqrt(disc);
    const q = -0.5 * (B + (B >= 0 ? sq : -sq));
    if (q !== 0) {
      r1 = q / A;
      r2 = C / q;
    } else r1 = 0;
  }
  let n = 0;
  if (r1 > lo && r1 < hi) out[n++] = r1;
  if (r2 > lo && r2 < hi) out[n++] = r2;
  if (n === 2 && out[0] > out[1]) {
    const t = out[0];
    out[0] = out[1];
    out[1] = t;
  }
  return n;
}

export class PiecewiseCubic {
  /** Piece starts and ends, m. */
  readonly a: Float64Array;
  readonly b: Float64Array;
  /** Power-basis coefficients in u = x − a. */
  readonly c0: Float64Array;
  readonly c1: Float64Array;
  readonly c2: Float64Array;
  readonly c3: Float64Array;
  /** Sign of each piece (0 where the piece vanishes). */
  readonly sign: Int8Array;
  readonly xMin: number;
  readonly xMax: number;
  /** Largest |ordinate| found at piece ends and stationary points. */
  readonly maxAbs: number;
  /** Results of moving-load searches already made on this (immutable) function. */
  readonly memo: unknown[] = [];

  private constructor(
    a: number[],
    b: number[],
    c0: number[],
    c1: number[],
    c2: number[],
    c3: number[],
    sign: number[],
    maxAbs: number,
  ) {
    this.a = Float64Array.from(a);
    this.b = Float64Array.from(b);
    this.c0 = Float64Array.from(c0);
    this.c1 = Float64Array.from(c1);
    this.c2 = Float64Array.from(c2);
    this.c3 = Float64Array.from(c3);
    this.sign = Int8Array.from(sign);
    this.xMin = a.length ? a[0] : 0;
    this.xMax = b.length ? b[b.length - 1] : 0;
    this.maxAbs = maxAbs;
  }

  get count(): number {
    return this.a.length;
  }

  /**
   * Build from cubic Hermite elements (contiguous, increasing). Splits pieces at their zeros.
   * @param scale natural size of the ordinates (m for a moment line, 1 for a shear or
   *   reaction line): ordinates below 1e-12 of it count as zero (round-off, not load effect)
   */
  static fromHermite(elements: readonly HermiteElement[], scale = 0): PiecewiseCubic {
    let maxAbs = 0;
    const raw: { x0: number; h: number; c: [number, number, number, number] }[] = [];
    for (const e of elements) {
      const h = e.x1 - e.x0;
      if (!(h > 0)) continue;
      const b0 = e.v0;
      const b1 = h * e.s0;
      const b2 = -3 * e.v0 - 2 * h * e.s0 + 3 * e.v1 - h * e.s1;
      const b3 = 2 * e.v0 + h * e.s0 - 2 * e.v1 + h * e.s1;
      const c: [number, number, number, number] = [b0, b1 / h, b2 / (h * h), b3 / (h * h * h)];
      raw.push({ x0: e.x0, h, c });
      maxAbs = Math.max(maxAbs, Math.abs(e.v0), Math.abs(e.v1));
      for (const r of derivativeRoots(c[1], c[2], c[3], 0, h)) maxAbs = Math.max(maxAbs, Math.abs(evalPoly(c[0], c[1], c[2], c[3], r)));
    }
    return PiecewiseCubic.split(raw, maxAbs, scale);
  }

  /**
   * Build a piecewise-linear function from stations and ordinates (as any `InfluenceLine`
   * gives them). A repeated station marks a jump: the first value is the limit from the
   * left, the second the limit from the right.
   */
  static fromStations(xs: ArrayLike<number>, values: ArrayLike<number>): PiecewiseCubic {
    let maxAbs = 0;
    const raw: { x0: number; h: number; c: [number, number, number, number] }[] = [];
    for (let i = 0; i < xs.length; i++) maxAbs = Math.max(maxAbs, Math.abs(values[i]));
    for (let i = 0; i + 1 < xs.length; i++) {
      const h = xs[i + 1] - xs[i];
      if (!(h > 0)) continue;
      raw.push({ x0: xs[i], h, c: [values[i], (values[i + 1] - values[i]) / h, 0, 0] });
    }
    return PiecewiseCubic.split(raw, maxAbs);
  }

  private static split(raw: { x0: number; h: number; c: [number, number, number, number] }[], maxAbs: number, scale = 0): PiecewiseCubic {
    const a: number[] = [];
    const b: number[] = [];
    const c0: number[] = [];
    const c1: number[] = [];
    const c2: number[] = [];
    const c3: number[] = [];
    const sign: number[] = [];
    const tiny = 1e-12 * Math.max(maxAbs, scale);
    for (const { x0, h, c } of raw) {
      const f = (u: number) => evalPoly(c[0], c[1], c[2], c[3], u);
      // Monotone segments between stationary points; a sign change in one is a single root.
      const cuts = [0, ...derivativeRoots(c[1], c[2], c[3], 0, h), h];
      const zeros: number[] = [];
      for (let i = 0; i + 1 < cuts.length; i++) {
        let lo = cuts[i];
        let hi = cuts[i + 1];
        let flo = f(lo);
        const fhi = f(hi);
        if (Math.abs(flo) <= tiny || Math.abs(fhi) <= tiny) continue;
        if (flo > 0 === fhi > 0) continue;
        for (let it = 0; it < ROOT_ITERATIONS && hi - lo > 1e-15 * h; it++) {
          const mid = 0.5 * (lo + hi);
          const fm = f(mid);
          if (fm > 0 === flo > 0) {
            lo = mid;
            flo = fm;
          } else hi = mid;
        }
        zeros.push(0.5 * (lo + hi));
      }
      const ends = [0, ...zeros, h];
      for (let i = 0; i + 1 < ends.length; i++) {
        const u0 = ends[i];
        const u1 = ends[i + 1];
        if (!(u1 - u0 > 1e-13 * h)) continue;
        // Shift the cubic to the sub-piece's own origin.
        const k0 = f(u0);
        const k1 = c[1] + 2 * c[2] * u0 + 3 * c[3] * u0 * u0;
        const k2 = c[2] + 3 * c[3] * u0;
        const k3 = c[3];
        // Sign from the largest |value| over the sub-piece (ends, midpoint, stationary points).
        let probe = evalPoly(k0, k1, k2, k3, 0.5 * (u1 - u0));
        for (const r of derivativeRoots(k1, k2, k3, 0, u1 - u0)) {
          const v = evalPoly(k0, k1, k2, k3, r);
          if (Math.abs(v) > Math.abs(probe)) probe = v;
        }
        const s = Math.abs(probe) <= tiny ? 0 : probe > 0 ? 1 : -1;
        a.push(x0 + u0);
        b.push(i + 2 === ends.length ? x0 + h : x0 + u1);
        c0.push(k0);
        c1.push(k1);
        c2.push(k2);
        c3.push(k3);
        sign.push(s);
      }
    }
    return new PiecewiseCubic(a, b, c0, c1, c2, c3, sign, maxAbs);
  }

  /** Index of the piece containing x, preferring the piece to the left (side −1) or right (side +1) at a boundary; −1 off the function. */
  pieceAt(x: number, side: -1 | 1): number {
    const n = this.a.length;
    if (n === 0 || x < this.xMin || x > this.xMax) return -1;
    if (side < 0 && x === this.xMin) return -1;
    if (side > 0 && x === this.xMax) return -1;
    // First piece whose end is >= x (side −1) or > x (side +1).
    let lo = 0;
    let hi = n - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      const cond = side < 0 ? this.b[mid] >= x : this.b[mid] > x;
      if (cond) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  }

  /** Value of piece k at x (no range check). */
  pieceValue(k: number, x: number): number {
    return evalPoly(this.c0[k], this.c1[k], this.c2[k], this.c3[k], x - this.a[k]);
  }

  /** One-sided limit at x: side −1 from the left, +1 from the right. 0 off the function. */
  limit(x: number, side: -1 | 1): number {
    const k = this.pieceAt(x, side);
    return k < 0 ? 0 : this.pieceValue(k, x);
  }

  /** Slope (ordinate per m) at x, one-sided. */
  slope(x: number, side: -1 | 1): number {
    const k = this.pieceAt(x, side);
    if (k < 0) return 0;
    const u = x - this.a[k];
    return this.c1[k] + u * (2 * this.c2[k] + 3 * this.c3[k] * u);
  }

  /** ∫ f dx over the pieces of sign σ (so ≥ 0 for σ = +1, ≤ 0 for σ = −1); exact for cubics. */
  signedArea(sigma: 1 | -1): number {
    let s = 0;
    for (let k = 0; k < this.a.length; k++) {
      if (this.sign[k] !== sigma) continue;
      const h = this.b[k] - this.a[k];
      s += h * (this.c0[k] + h * (this.c1[k] / 2 + h * (this.c2[k] / 3 + h * (this.c3[k] / 4))));
    }
    return s;
  }

  /** ∫ f dx over [x0, x1] ⊂ [xMin, xMax] (exact). */
  integral(x0: number, x1: number): number {
    let s = 0;
    for (let k = 0; k < this.a.length; k++) {
      const lo = Math.max(x0, this.a[k]);
      const hi = Math.min(x1, this.b[k]);
      if (!(hi > lo)) continue;
      const F = (u: number) => u * (this.c0[k] + u * (this.c1[k] / 2 + u * (this.c2[k] / 3 + u * (this.c3[k] / 4))));
      s += F(hi - this.a[k]) - F(lo - this.a[k]);
    }
    return s;
  }
}
