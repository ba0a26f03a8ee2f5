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
import { consistentLoads } from './element.js';
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

/**
 * Pre-located load shares of many plan points, shared by every influence surface of one model
 * (the geometry of a point does not depend on the response). Two slots per point; a slot
 * with seg −1 is empty (off the deck, or a point on a line, which has one share).
 */
export interface LoadShareTable {
  /** Number of points. */
  readonly count: number;
  /** Global segment index of slot s of point k at 2k + s, −1 when empty. */
  readonly seg: Int32Array;
  /** The 6 consistent nodal loads of each slot (per unit force), at 6·(2k + s). */
  readonly feq: Float64Array;
  /** [xi, L, P, My] of each slot at 4·(2k + s) (for the moment between nodes). */
  readonly raw: Float64Array;
  /** The load transfer (model) that located the points. */
  readonly source: LoadTransfer;
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
  /** All lines' node x, line l from lineNodeOffset[l]. */
  private readonly xsFlat: Float64Array;
  private readonly lineNodeOffset: Int32Array;
  /** spanFirst/spanLast of line l, span j at l·N + j (positions on the line). */
  private readonly spanFirstFlat: Int32Array;
  private readonly spanLastFlat: Int32Array;
  /** Bucket tables of all lines (segment position at each bucket start), line l from bucketOffset[l]. */
  private readonly bucketFlat: Int32Array;
  private readonly bucketOffset: Int32Array;
  private readonly bucketCount: Int32Array;
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
    this.lineNodeOffset = new Int32Array(nL + 1);
    for (let l = 0; l < nL; l++) this.lineNodeOffset[l + 1] = this.lineNodeOffset[l] + lines[l].xs.length;
    this.xsFlat = new Float64Array(this.lineNodeOffset[nL]);
    lines.forEach((l, k) => this.xsFlat.set(l.xs, this.lineNodeOffset[k]));
    this.spanFirstFlat = new Int32Array(nL * N);
    this.spanLastFlat = new Int32Array(nL * N);
    lines.forEach((l, k) => {
      this.spanFirstFlat.set(l.spanFirst, k * N);
      this.spanLastFlat.set(l.spanLast, k * N);
    });
    this.lineSegOffset = new Int32Array(nL + 1);
    for (let l = 0; l < nL; l++) this.lineSegOffset[l + 1] = this.lineSegOffset[l] + lines[l].segMember.length;
    this.segmentCount = this.lineSegOffset[nL];
    this.segMember = new Int32Array(this.segmentCount);
    this.segLine = new Int32Array(this.segmentCount);
    lines.forEach((l, k) => {
      this.segMember.set(l.segMember, this.lineSegOffset[k]);
      this.segLine.fill(k, this.lineSegOffset[k], this.lineSegOffset[k + 1]);
    });
    // bucket lookup of segments along each line: 2 buckets per segment
    this.bucketOffset = new Int32Array(nL + 1);
    this.bucketCount = new Int32Array(nL);
    this.bucketX0 = new Float64Array(nL);
    this.bucketInv = new Float64Array(nL);
    lines.forEach((l, k) => {
      const nb = 2 * Math.max(1, l.xs.length - 1);
      this.bucketCount[k] = nb;
      this.bucketOffset[k + 1] = this.bucketOffset[k] + nb + 1;
    });
    this.bucketFlat = new Int32Array(this.bucketOffset[nL]);
    lines.forEach((l, k) => {
      const xs = l.xs;
      const nb = this.bucketCount[k];
      const x0 = xs[0];
      const extent = xs[xs.length - 1] - x0;
      const inv = extent > 0 ? nb / extent : 0;
      let p = 0;
      for (let b = 0; b <= nb; b++) {
        const xb = x0 + (b * extent) / nb;
        while (p + 1 < xs.length - 1 && xs[p + 1] <= xb) p++;
        this.bucketFlat[this.bucketOffset[k] + b] = p;
      }
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
    const S = this.stripCount;
    let bs = Math.floor((y - this.stripBucketY0) * this.stripBucketInv);
    if (bs < 0) bs = 0;
    else if (bs >= this.stripBucket.length) bs = this.stripBucket.length - 1;
    let s = this.stripBucket[bs];
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
    const xs = this.xsFlat;
    const base = this.lineNodeOffset[l];
    const first = this.spanFirstFlat[l * this.spanCount + j];
    const lastSeg = this.spanLastFlat[l * this.spanCount + j] - 1;
    let b = Math.floor((x - this.bucketX0[l]) * this.bucketInv[l]);
    if (b < 0) b = 0;
    else if (b > this.bucketCount[l]) b = this.bucketCount[l];
    let p = this.bucketFlat[this.bucketOffset[l] + b];
    if (p < first) p = first;
    else if (p > lastSeg) p = lastSeg;
    while (p < lastSeg && x >= xs[base + p + 1]) p++;
    while (p > first && x < xs[base + p]) p--;
    const xa = xs[base + p];
    const L = xs[base + p + 1] - xa;
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

  /** Locates the points (xs[k], ys[k]), m, once for every surface of the model. */
  tabulate(xs: ArrayLike<number>, ys: ArrayLike<number>): LoadShareTable {
    if (xs.length !== ys.length) throw new RangeError(`tabulate needs as many x as y values (${xs.length} and ${ys.length})`);
    const table = this.emptyTable(xs.length);
    for (let k = 0; k < xs.length; k++) this.fillSlot(table, k, xs[k], ys[k]);
    return table;
  }

  /**
   * Locates the grid points xs × ys, m; point k = ix·ys.length + iy (row-major by x). With
   * `shear` c the grid is of a sheared frame: point (ix, iy) is at plan x = xs[ix] + c·ys[iy].
   */
  tabulateGrid(xs: ArrayLike<number>, ys: ArrayLike<number>, shear = 0): LoadShareTable {
    const ny = ys.length;
    const table = this.emptyTable(xs.length * ny);
    for (let i = 0; i < xs.length; i++) {
      const x = xs[i];
      for (let k = 0; k < ny; k++) this.fillSlot(table, i * ny + k, x + shear * ys[k], ys[k]);
    }
    return table;
  }

  private emptyTable(count: number): LoadShareTable {
    return { count, seg: new Int32Array(2 * count).fill(-1), feq: new Float64Array(12 * count), raw: new Float64Array(8 * count), source: this };
  }

  private fillSlot(table: LoadShareTable, k: number, x: number, y: number): void {
    const sc = this.scratch;
    const n = this.locate(x, y, sc);
    for (let s = 0; s < n; s++) {
      const o = s * SHARE_STRIDE;
      const slot = 2 * k + s;
      table.seg[slot] = sc[o];
      const xi = sc[o + 1];
      const L = sc[o + 2];
      const P = sc[o + 3];
      const My = sc[o + 5];
      consistentLoads(L, xi, P, sc[o + 4], My, table.feq, 6 * slot);
      const r = 4 * slot;
      table.raw[r] = xi;
      table.raw[r + 1] = L;
      table.raw[r + 2] = P;
      table.raw[r + 3] = My;
    }
  }

  private breaksCache?: { xs: Float64Array; ys: Float64Array };

  /**
   * Where the transfer changes piece, for callers that sample surfaces on a grid: ys = the
   * deck edges and every longitudinal line (across, ordinates are linear between lines when
   * the split runs at right angles to the girders: right decks, and the perpendicular layout
   * away from skewed supports); xs = every node station on any line and the end support
   * lines at the deck edges (along a line, ordinates are cubic between its nodes, with the
   * kinks and jumps of the responses at nodes). Sorted, duplicates (1e-9 m) removed.
   */
  breakpoints(): { xs: Float64Array; ys: Float64Array } {
    if (this.breaksCache) return this.breaksCache;
    const uniq = (v: number[]) => {
      v.sort((a, b) => a - b);
      const out: number[] = [];
      for (const x of v) if (!out.length || x - out[out.length - 1] > 1e-9) out.push(x);
      return Float64Array.from(out);
    };
    const xs = Array.from(this.xsFlat);
    const N = this.spanCount;
    for (const y of [this.yMin, this.yMax]) for (let j = 0; j <= N; j++) xs.push(this.A[j] + this.B[j] * y);
    this.breaksCache = { xs: uniq(xs), ys: uniq([this.yMin, this.yMax, ...this.lineY]) };
    return this.breaksCache;
  }

  /** Whether (x, y) lies on the deck (between its edges and its end support lines). */
  onDeck(x: number, y: number): boolean {
    if (!(y >= this.yMin && y <= this.yMax)) return false;
    const N = this.spanCount;
    return x >= this.A[0] + this.B[0] * y && x <= this.A[N] + this.B[N] * y;
  }
}
