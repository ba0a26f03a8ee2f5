/**
 * Statically equivalent transfer of a plan point load to the grillage: the one rule used both
 * for the load vector of a direct solve and for evaluating an influence surface, so that the
 * two agree exactly (Maxwell–Betti). AASHTO LRFD Art. 4.6.3.3.1: nodal loads shall be
 * statically equivalent to the actual loads (quoted from memory).
 *
 * Units: plan coordinates m; the unit force is 1 N downward; couples N·m per N of force.
 * Coordinates as mesh.ts: x along the girders from support line 0 at girder 1, y transverse
 * from girder 1 positive right, z (and the force) downward.
 *
 * The rule
 * 1. Across: a point between two adjacent longitudinal lines (a "strip") is shared between
 *    them in the ratio of its distances (lever rule), each share placed on its line at the
 *    point where a straight line through the load in a chosen direction meets it. Any such
 *    split is statically equivalent (force, and moments about both axes), whatever the
 *    direction. A point on an overhang (beyond the outermost line, no edge member) goes
 *    whole to the outermost line with the couple that keeps it equivalent (rigid cantilever
 *    transfer): Mx = P·(y − y_line) about +x and My = −P·(x − x_line) about +y.
 * 2. The direction: along lines of equal fraction of the span ("fan") in the skew-parallel
 *    layout (which is the direction of its transverse members). In the perpendicular layout
 *    at right angles to the girders, except close to a skewed support line, where the
 *    direction turns linearly to that of the support line over a distance (strip width ×
 *    |tan θ|) so that both shares always fall inside their girders' spans; where the two end
 *    zones of a span would overlap in a strip the fan direction is used there.
 * 3. Along each line: the share is a point force (and couples) on the member that contains it,
 *    carried to the member's nodes by the Hermite (consistent) loads of element.ts.
 *
 * A point exactly on a node belongs to the member that starts there (right-continuous in x);
 * a point exactly on a simple-span joint belongs to the span that starts there.
 * Points off the deck (outside the deck edges or beyond the end support lines) carry nothing.
 */
import type { GrillageMesh } from './mesh.js';

/** One share of a load: a point action on segment `seg` (global segment index) of a line. */
export interface LoadShare {
  line: number;
  /** Position of the segment on its line (nodes[pos] → nodes[pos + 1]). */
  pos: number;
  /** Global segment index (unique over all lines). */
  seg: number;
  member: number;
  xi: number;
  L: number;
  P: number;
  Mx: number;
  My: number;
}

/** Scratch layout of `locate`: per share 6 numbers [seg, xi, L, P, Mx, My]. */
export const SHARE_STRIDE = 6;

const STRIP_INTERIOR = 0;
const STRIP_LEFT = 1;
const STRIP_RIGHT = 2;

export class LoadTransfer {
  readonly spanCount: number;
  readonly lineCount: number;
  readonly segmentCount: number;
  /** Start of each line's segments in the global segment numbering. */
  readonly lineSegOffset: Int32Array;
  /** Member id of each global segment (−1 across simple-span joints). */
  readonly segMember: Int32Array;
  /** Line of each global segment. */
  readonly segLine: Int32Array;
  readonly yMin: number;
  readonly yMax: number;
  readonly xMin: number;
  readonly xMax: number;

  private readonly A: Float64Array;
  private readonly B: Float64Array;
  private readonly lineY: Float64Array;
  private readonly lineXs: Float64Array[];
  private readonly spanFirst: Int32Array[];
  private readonly spanLast: Int32Array[];
  private readonly bucketSeg: Int32Array[];
  private readonly bucketX0: Float64Array;
  private readonly bucketInv: Float64Array;
  // strips: sorted by y; strip s covers [stripY0[s], stripY1[s]]
  private readonly stripKind: Int8Array;
  private readonly stripA: Int32Array;
  private readonly stripB: Int32Array;
  private readonly stripY0: Float64Array;
  private readonly stripW: Float64Array;
  /** Per strip and span: 1 = fan; 0 = taper; with end-zone lengths D0, D1 (m). */
  private readonly stripFan: Uint8Array;
  private readonly stripD0: Float64Array;
  private readonly stripD1: Float64Array;
  private readonly stripCount: number;
  private readonly stripBucket: Int32Array;
  private readonly stripBucketY0: number;
  private readonly stripBucketInv: number;
  /** Scratch for `locate` (two shares). */
  readonly scratch = new Float64Array(2 * SHARE_STRIDE);

  constructor(mesh: GrillageMesh) {
    const N = mesh.spanCount;
    this.spanCount = N;
    this.A = mesh.supportA;
    this.B = mesh.supportB;
    const lines = mesh.lines;
    const nL = lines.length;
    this.lineCount = nL;
    this.lineY = Float64Array.from(lines, (l) => l.y);
    this.lineXs = lines.map((l) => l.xs);
    this.spanFirst = lines.map((l) => l.spanFirst);
    this.spanLast = lines.map((l) => l.spanLast);
    this.lineSegOffset = new Int32Array(nL + 1);
    for (let l = 0; l < nL; l++) this.lineSegOffset[l + 1] = this.lineSegOffset[l] + lines[l].segMember.length;
    this.segmentCount = this.lineSegOffset[nL];
    this.segMember = new Int32Array(this.segmentCount);
    this.segLine = new Int32Array(this.segmentCount);
    lines.forEach((l, k) => {
      this.segMember.set(l.segMember, this.lineSegOffset[k]);
      this.segLine.fill(k, this.lineSegOffset[k], this.lineSegOffset[k + 1]);
    });
    // bucket lookup of segments along each line
    this.bucketSeg = [];
    this.bucketX0 = new Float64Array(nL);
    this.bucketInv = new Float64Array(nL);
    lines.forEach((l, k) => {
      const xs = l.xs;
      const nseg = Math.max(1, xs.length - 1);
      const nb = 2 * nseg;
      const x0 = xs[0];
      const span = xs[xs.length - 1] - x0;
      const inv = span > 0 ? nb / span : 0;
      const table = new Int32Array(nb + 1);
      let p = 0;
      for (let b = 0; b <= nb; b++) {
        const xb = x0 + b / inv;
        while (p + 1 < xs.length - 1 && xs[p + 1] <= xb) p++;
        table[b] = p;
      }
      this.bucketSeg.push(table);
      this.bucketX0[k] = x0;
      this.bucketInv[k] = inv;
    });

    // strips
    const kinds: number[] = [];
    const sa: number[] = [];
    const sb: number[] = [];
    const y0s: number[] = [];
    const ws: number[] = [];
    const eps = 1e-9 * Math.max(1, mesh.deckRight - mesh.deckLeft);
    if (this.lineY[0] - mesh.deckLeft > eps) {
      kinds.push(STRIP_LEFT); sa.push(0); sb.push(-1); y0s.push(mesh.deckLeft); ws.push(this.lineY[0] - mesh.deckLeft);
    }
    for (let l = 0; l + 1 < nL; l++) {
      kinds.push(STRIP_INTERIOR); sa.push(l); sb.push(l + 1); y0s.push(this.lineY[l]); ws.push(this.lineY[l + 1] - this.lineY[l]);
    }
    if (mesh.deckRight - this.lineY[nL - 1] > eps) {
      kinds.push(STRIP_RIGHT); sa.push(nL - 1); sb.push(-1); y0s.push(this.lineY[nL - 1]); ws.push(mesh.deckRight - this.lineY[nL - 1]);
    }
    this.stripCount = kinds.length;
    this.stripKind = Int8Array.from(kinds);
    this.stripA = Int32Array.from(sa);
    this.stripB = Int32Array.from(sb);
    this.stripY0 = Float64Array.from(y0s);
    this.stripW = Float64Array.from(ws);
    this.yMin = mesh.deckLeft;
    this.yMax = mesh.deckRight;
    const S = this.stripCount;
    this.stripFan = new Uint8Array(S * N);
    this.stripD0 = new Float64Array(S * N);
    this.stripD1 = new Float64Array(S * N);
    for (let s = 0; s < S; s++) {
      const ya = this.stripY0[s];
      const yb = ya + this.stripW[s];
      for (let j = 0; j < N; j++) {
        const k = s * N + j;
        if (mesh.layout === 'skew-parallel') {
          this.stripFan[k] = 1;
          continue;
        }
        const D0 = this.stripW[s] * Math.abs(this.B[j]);
        const D1 = this.stripW[s] * Math.abs(this.B[j + 1]);
        const lenA = this.A[j + 1] + this.B[j + 1] * ya - (this.A[j] + this.B[j] * ya);
        const lenB = this.A[j + 1] + this.B[j + 1] * yb - (this.A[j] + this.B[j] * yb);
        if (D0 + D1 > Math.min(lenA, lenB)) this.stripFan[k] = 1;
        this.stripD0[k] = D0;
        this.stripD1[k] = D1;
      }
    }
    // strip lookup by y
    const nb = 4 * S;
    this.stripBucketY0 = this.yMin;
    const widthY = this.yMax - this.yMin;
    this.stripBucketInv = widthY > 0 ? nb / widthY : 0;
    this.stripBucket = new Int32Array(nb + 1);
    let p = 0;
    for (let b = 0; b <= nb; b++) {
      const yb = this.yMin + b / this.stripBucketInv;
      while (p + 1 < S && this.stripY0[p + 1] <= yb) p++;
      this.stripBucket[b] = p;
    }
    let xMin = Infinity;
    let xMax = -Infinity;
    for (const y of [this.yMin, this.yMax]) {
      xMin = Math.min(xMin, this.A[0] + this.B[0] * y);
      xMax = Math.max(xMax, this.A[N] + this.B[N] * y);
    }
    this.xMin = xMin;
    this.xMax = xMax;
  }

  /**
   * Shares of a unit downward point force at plan point (x, y), m, written into `out` as
   * [seg, xi, L, P, Mx, My] per share. Returns the number of shares (0 off the deck, 1 or 2).
   * Throws a RangeError for a coordinate that is not a finite number.
   */
  locate(x: number, y: number, out: Float64Array = this.scratch): number {
    if (!(Number.isFinite(x) && Number.isFinite(y))) throw new RangeError(`load position must be finite numbers (x ${x} m, y ${y} m)`);
    const yMin = this.yMin;
    const yMax = this.yMax;
    if (y < yMin || y > yMax) return 0;
    const A = this.A;
    const B = this.B;
    const N = this.spanCount;
    // span: X_j(y) ≤ x < X_{j+1}(y)
    const x0 = A[0] + B[0] * y;
    if (x < x0) return 0;
    let j = 0;
    let xr = A[1] + B[1] * y;
    while (j < N - 1 && x >= xr) {
      j++;
      xr = A[j + 1] + B[j + 1] * y;
    }
    if (x > xr) return 0;
    const xl = A[j] + B[j] * y;
    // strip
    let s = this.stripBucket[Math.floor((y - this.stripBucketY0) * this.stripBucketInv)] ?? this.stripCount - 1;
    const S = this.stripCount;
    while (s + 1 < S && y >= this.stripY0[s + 1]) s++;
    while (s > 0 && y < this.stripY0[s]) s--;
    const kind = this.stripKind[s];
    const la = this.stripA[s];
    const k = s * N + j;
    let t = 0; // direction: x changes by t per unit y
    let fan = this.stripFan[k] === 1;
    let sigma = 0;
    if (fan) sigma = (x - xl) / (xr - xl);
    else {
      const D0 = this.stripD0[k];
      const D1 = this.stripD1[k];
      const a0 = x - xl;
      const a1 = xr - x;
      if (D0 > 0 && a0 < D0) t = B[j] * (1 - a0 / D0);
      else if (D1 > 0 && a1 < D1) t = B[j + 1] * (1 - a1 / D1);
    }
    if (kind === STRIP_INTERIOR) {
      const lb = this.stripB[s];
      const ya = this.lineY[la];
      const yb = this.lineY[lb];
      const eta = (yb - y) / (yb - ya);
      let n = 0;
      if (eta > 0) n += this.share(la, j, fan ? this.fanX(j, sigma, ya) : x + (ya - y) * t, eta, 0, 0, out, n * SHARE_STRIDE);
      if (eta < 1) n += this.share(lb, j, fan ? this.fanX(j, sigma, yb) : x + (yb - y) * t, 1 - eta, 0, 0, out, n * SHARE_STRIDE);
      return n;
    }
    const yl = this.lineY[la];
    const xp = fan ? this.fanX(j, sigma, yl) : x + (yl - y) * t;
    return this.share(la, j, xp, 1, y - yl, -(x - xp), out, 0);
  }

  private fanX(j: number, sigma: number, y: number): number {
    const x0 = this.A[j] + this.B[j] * y;
    const x1 = this.A[j + 1] + this.B[j + 1] * y;
    return x0 + sigma * (x1 - x0);
  }

  /** Writes one share on line l in span j at x; returns 1. */
  private share(l: number, j: number, x: number, P: number, Mx: number, My: number, out: Float64Array, o: number): number {
    const xs = this.lineXs[l];
    const first = this.spanFirst[l][j];
    const lastSeg = this.spanLast[l][j] - 1;
    let p = this.bucketSeg[l][Math.floor((x - this.bucketX0[l]) * this.bucketInv[l])] ?? lastSeg;
    if (p < first) p = first;
    else if (p > lastSeg) p = lastSeg;
    while (p < lastSeg && x >= xs[p + 1]) p++;
    while (p > first && x < xs[p]) p--;
    const xa = xs[p];
    const L = xs[p + 1] - xa;
    let xi = (x - xa) / L;
    if (xi < 0) xi = 0;
    else if (xi > 1) xi = 1;
    out[o] = this.lineSegOffset[l] + p;
    out[o + 1] = xi;
    out[o + 2] = L;
    out[o + 3] = P;
    out[o + 4] = Mx;
    out[o + 5] = My;
    return 1;
  }

  /** The shares of a point force P (N) at (x, y) as objects (direct solves, tests). */
  shares(x: number, y: number, P = 1): LoadShare[] {
    const buf = new Float64Array(2 * SHARE_STRIDE);
    const n = this.locate(x, y, buf);
    const out: LoadShare[] = [];
    for (let k = 0; k < n; k++) {
      const o = k * SHARE_STRIDE;
      const seg = buf[o];
      const line = this.segLine[seg];
      out.push({
        line,
        pos: seg - this.lineSegOffset[line],
        seg,
        member: this.segMember[seg],
        xi: buf[o + 1],
        L: buf[o + 2],
        P: buf[o + 3] * P,
        Mx: buf[o + 4] * P,
        My: buf[o + 5] * P,
      });
    }
    return out;
  }

  /** Whether (x, y) lies on the deck (between its edges and its end support lines). */
  onDeck(x: number, y: number): boolean {
    if (!(y >= this.yMin && y <= this.yMax)) return false;
    const N = this.spanCount;
    return x >= this.A[0] + this.B[0] * y && x <= this.A[N] + this.B[N] * y;
  }
}
