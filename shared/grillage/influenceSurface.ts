/**
 * Influence surfaces of girder responses by the adjoint (Maxwell–Betti) solve: one solve
 * with the factorised stiffness per response, not one per load position.
 *
 * Units: plan coordinates x, y in m; ordinates per unit downward force: m for a moment
 * (N·m per N), dimensionless for a shear or a reaction (N per N).
 * Coordinates: x along girder 1's axis from support line 0 at girder 1, y transverse from
 * girder 1 positive right (as shared/deck/geometry.ts). Signs: sagging moment positive,
 * shear = upward resultant on the lower-x side of the cut, reaction upward positive; a
 * positive ordinate means a downward load raises the response.
 *
 * Method. A response is r = a·u + c·f_eq (+ a simple-span term for a moment between nodes),
 * see responses.ts; u = K⁻¹·F(x, y) with F the statically equivalent nodal loads of a unit
 * force at (x, y) (loadTransfer.ts). Then r(x, y) = (K⁻¹a)·F(x, y) + c·f_eq(x, y): the single
 * adjoint solve v = K⁻¹a gives every ordinate. v is gathered once per girder or edge member
 * into six weights W (one per end DOF, plus the local coefficients c), so that an ordinate is
 *   at(x, y) = Σ over the (at most two) load shares of W_seg · f_eq(ξ, L, P, Mx, My).
 * Because the same transfer defines the load vector of a direct solve, the ordinates equal
 * direct unit-load solves to rounding (tests check 1e-9 relative).
 *
 * Using the surfaces in a search (measured on a busy 2-core machine, Node 20, 8 girders ×
 * 40 segments; see tests/bench/grillage.bench.ts):
 * - `at(x, y)`: ~100–150 ns a call, no allocation: a span lookup over the support lines, a
 *   bucket lookup of the strip across the deck and of the member on each of at most two
 *   lines, and ~40 flops. Call it as a method (`s.at(x, y)`), not detached.
 * - Many surfaces at the same points: locate the points once with
 *   `model.transfer.tabulate(xs, ys)` or `tabulateGrid(xs, ys)` (~100–250 ns a point), then
 *   `evaluateSurfaces(surfaces, table)` or `surface.evaluate(table)`: 6–12 multiply-adds per
 *   ordinate (~30 ns). The table depends only on the model, never on the response.
 * - `atMany` / `sampleGrid`: loops of `at` into a caller's array.
 * - `breaks`: the stations (lines, nodes) where the interpolation changes piece, to build
 *   sampling grids that follow the surface's kinks.
 * Shape: along a line the surface is the cubic Hermite interpolation between nodes; across,
 * linear between adjacent lines along the split direction of loadTransfer.ts (at right angles
 * to the girders on right decks; overhangs: the cantilever transfer). It is continuous, with the kinks and jumps of the response (a moment's
 * kink at its point, a shear's unit jump at its support), right-continuous in x at nodes.
 */
import { simpleSpanMoment } from './element.js';
import { GrillageInputError } from './errors.js';
import { SHARE_STRIDE, type LoadShareTable, type LoadTransfer } from './loadTransfer.js';
import type { GrillageModel } from './model.js';
import { compileResponse, responseLabel, validateResponse, type GrillageResponse } from './responses.js';

export interface InfluenceSurface {
  readonly response: GrillageResponse;
  /** Plain label, e.g. "girder 2 moment at 0.500 of span 1". */
  readonly label: string;
  /** Unit of the ordinates: 'm' (moment per unit force) or '1' (shear, reaction per unit force). */
  readonly unit: 'm' | '1';
  /**
   * Response per unit downward point force at plan point (x m along girder 1's axis from
   * support line 0 at girder 1, y m transverse from girder 1, positive right). Zero off the
   * deck. Same interpolation the load vector uses (statically equivalent). Throws a
   * RangeError for a coordinate that is not a finite number.
   */
  at(x: number, y: number): number;
  /** Ordinates at points (xs[k], ys[k]), m, into `out` (allocated when absent). */
  atMany(xs: ArrayLike<number>, ys: ArrayLike<number>, out?: Float64Array): Float64Array;
  /** Ordinates on the grid xs × ys, m, row-major by x: out[ix·ys.length + iy]. */
  sampleGrid(xs: ArrayLike<number>, ys: ArrayLike<number>, out?: Float64Array): Float64Array;
  /**
   * Ordinates at the points of a table from `model.transfer.tabulate` / `tabulateGrid`
   * (located once, reused by every surface of the model): ~6–12 multiply-adds per point.
   * The fastest way to evaluate many surfaces at the same points.
   */
  evaluate(table: LoadShareTable, out?: Float64Array): Float64Array;
  /** Plan extent of the deck this surface covers, m. */
  readonly extent: { xMin: number; xMax: number; yMin: number; yMax: number };
  /**
   * Stations where the interpolation changes piece (m, sorted): ys = deck edges and every
   * longitudinal line, xs = every node station and the end support lines at the deck edges.
   * Sampling grids that include them follow the surface's kinks; see LoadTransfer.breakpoints.
   */
  readonly breaks: { xs: Float64Array; ys: Float64Array };
  /** The adjoint solution K⁻¹a on the free unknowns (diagnostics, tests). */
  readonly adjoint: Float64Array;
}

export class GrillageInfluenceSurface implements InfluenceSurface {
  readonly response: GrillageResponse;
  readonly label: string;
  readonly unit: 'm' | '1';
  readonly extent: { xMin: number; xMax: number; yMin: number; yMax: number };
  readonly adjoint: Float64Array;
  /** @internal The load transfer of the model. */
  readonly t: LoadTransfer;
  /** @internal Six weights per global segment (adjoint at the member's end DOFs + local coefficients). */
  readonly W: Float64Array;
  /** @internal Segment and position of a moment point between nodes (−1 when at a node). */
  readonly iSeg: number;
  readonly iXi0: number;
  private readonly sc = new Float64Array(2 * SHARE_STRIDE);

  constructor(model: GrillageModel, response: GrillageResponse, W: Float64Array, adjoint: Float64Array, interior?: { seg: number; xi0: number }) {
    this.response = response;
    this.label = responseLabel(response);
    this.unit = response.kind === 'girder-moment' ? 'm' : '1';
    this.extent = { ...model.extent };
    this.t = model.transfer;
    this.W = W;
    this.adjoint = adjoint;
    this.iSeg = interior ? interior.seg : -1;
    this.iXi0 = interior ? interior.xi0 : 0;
  }

  get breaks(): { xs: Float64Array; ys: Float64Array } {
    return this.t.breakpoints();
  }

  at(x: number, y: number): number {
    const sc = this.sc;
    const n = this.t.locate(x, y, sc);
    const W = this.W;
    let v = 0;
    for (let k = 0; k < n; k++) {
      const o = k * SHARE_STRIDE;
      const seg = sc[o];
      const xi = sc[o + 1];
      const L = sc[o + 2];
      const P = sc[o + 3];
      const Mx = sc[o + 4];
      const My = sc[o + 5];
      const x2 = xi * xi;
      const x3 = x2 * xi;
      const b = seg * 6;
      // consistent loads (element.ts consistentLoads), inlined
      let s =
        W[b] * P * (1 - 3 * x2 + 2 * x3) +
        W[b + 2] * -P * L * (xi - 2 * x2 + x3) +
        W[b + 3] * P * (3 * x2 - 2 * x3) +
        W[b + 5] * -P * L * (x3 - x2);
      if (Mx !== 0 || My !== 0) {
        s +=
          W[b] * -My * ((-6 * xi + 6 * x2) / L) +
          W[b + 1] * Mx * (1 - xi) +
          W[b + 2] * My * (1 - 4 * xi + 3 * x2) +
          W[b + 3] * -My * ((6 * xi - 6 * x2) / L) +
          W[b + 4] * Mx * xi +
          W[b + 5] * My * (3 * x2 - 2 * xi);
      }
      if (seg === this.iSeg) s += simpleSpanMoment(L, this.iXi0, xi, P, My);
      v += s;
    }
    return v;
  }

  atMany(xs: ArrayLike<number>, ys: ArrayLike<number>, out?: Float64Array): Float64Array {
    if (xs.length !== ys.length) throw new RangeError(`atMany needs as many x as y values (${xs.length} and ${ys.length})`);
    const res = out ?? new Float64Array(xs.length);
    for (let k = 0; k < xs.length; k++) res[k] = this.at(xs[k], ys[k]);
    return res;
  }

  sampleGrid(xs: ArrayLike<number>, ys: ArrayLike<number>, out?: Float64Array): Float64Array {
    const ny = ys.length;
    const res = out ?? new Float64Array(xs.length * ny);
    if (res.length < xs.length * ny) throw new RangeError(`sampleGrid output needs ${xs.length * ny} entries, has ${res.length}`);
    for (let i = 0; i < xs.length; i++) {
      const x = xs[i];
      for (let k = 0; k < ny; k++) res[i * ny + k] = this.at(x, ys[k]);
    }
    return res;
  }

  evaluate(table: LoadShareTable, out?: Float64Array): Float64Array {
    const res = out ?? new Float64Array(table.count);
    if (res.length < table.count) throw new RangeError(`evaluate output needs ${table.count} entries, has ${res.length}`);
    const { seg, feq, raw } = table;
    const W = this.W;
    const iSeg = this.iSeg;
    if (table.source !== this.t) throw new RangeError('the load-share table was located on another grillage model');
    for (let k = 0; k < table.count; k++) {
      let v = 0;
      for (let s = 0; s < 2; s++) {
        const slot = 2 * k + s;
        const g = seg[slot];
        if (g < 0) continue;
        const b = g * 6;
        const f = 6 * slot;
        v += W[b] * feq[f] + W[b + 1] * feq[f + 1] + W[b + 2] * feq[f + 2] + W[b + 3] * feq[f + 3] + W[b + 4] * feq[f + 4] + W[b + 5] * feq[f + 5];
        if (g === iSeg) {
          const r = 4 * slot;
          v += simpleSpanMoment(raw[r + 1], this.iXi0, raw[r], raw[r + 2], raw[r + 3]);
        }
      }
      res[k] = v;
    }
    return res;
  }
}

/** Anything that solves K·X = B for a column-interleaved block (the banded factors by default; the dense oracle in tests). */
export interface BlockSolver {
  solveManyInPlace(B: Float64Array, m: number): Float64Array;
}

/**
 * Influence surfaces of `responses` on a built grillage: one adjoint solve each (done as
 * one block solve with the banded factors). Throws GrillageInputError for a response that
 * does not exist (girder, span, fraction, support or side out of range, omitted bearing).
 */
export function influenceSurfaces(
  model: GrillageModel,
  responses: GrillageResponse[],
  options: { solver?: BlockSolver } = {},
): InfluenceSurface[] {
  if (!Array.isArray(responses)) throw new GrillageInputError('invalid-response', ['responses'], 'responses must be a list');
  responses.forEach((r, k) => validateResponse(model, r, k));
  const m = responses.length;
  if (m === 0) return [];
  const grid = model.grid;
  const n = grid.n;
  const compiled = responses.map((r) => compileResponse(model, r));
  const block = new Float64Array(n * m);
  compiled.forEach((c, r) => {
    const a = c.a;
    for (let i = 0; i < n; i++) block[i * m + r] = a[i];
  });
  (options.solver ?? grid.factor).solveManyInPlace(block, m);
  const t = model.transfer;
  const members = model.mesh.members;
  const dofIndex = grid.dofIndex;
  return compiled.map((c, r) => {
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = block[i * m + r];
    const W = new Float64Array(t.segmentCount * 6);
    for (let seg = 0; seg < t.segmentCount; seg++) {
      const member = t.segMember[seg];
      if (member < 0) continue;
      const mm = members[member];
      for (let q = 0; q < 6; q++) {
        const node = q < 3 ? mm.i : mm.j;
        const f = dofIndex[node * 3 + (q % 3)];
        if (f >= 0) W[seg * 6 + q] = v[f];
      }
    }
    for (const l of c.local) for (let q = 0; q < 6; q++) W[l.seg * 6 + q] += l.coef[q];
    return new GrillageInfluenceSurface(model, c.response, W, v, c.interior);
  });
}

/**
 * Ordinates of several surfaces of one model at the points of one table, point by point
 * (each point's shares are read once for all surfaces: the fastest bulk path).
 * Returns one Float64Array per surface (or fills `outs`).
 */
export function evaluateSurfaces(surfaces: InfluenceSurface[], table: LoadShareTable, outs?: Float64Array[]): Float64Array[] {
  const ss = surfaces.map((s) => {
    if (!(s instanceof GrillageInfluenceSurface)) throw new RangeError('evaluateSurfaces needs surfaces made by influenceSurfaces');
    if (table.source !== s.t) throw new RangeError('the load-share table was located on another grillage model');
    return s;
  });
  const m = ss.length;
  const res = outs ?? ss.map(() => new Float64Array(table.count));
  if (res.length !== m || res.some((o) => o.length < table.count)) throw new RangeError(`evaluateSurfaces needs ${m} outputs of ${table.count} entries`);
  const Ws = ss.map((s) => s.W);
  const { seg, feq, raw } = table;
  for (let k = 0; k < table.count; k++) {
    const g0 = seg[2 * k];
    const g1 = seg[2 * k + 1];
    for (let r = 0; r < m; r++) {
      const W = Ws[r];
      let v = 0;
      if (g0 >= 0) {
        const b = g0 * 6;
        const f = 12 * k;
        v = W[b] * feq[f] + W[b + 1] * feq[f + 1] + W[b + 2] * feq[f + 2] + W[b + 3] * feq[f + 3] + W[b + 4] * feq[f + 4] + W[b + 5] * feq[f + 5];
        if (g0 === ss[r].iSeg) v += simpleSpanMoment(raw[8 * k + 1], ss[r].iXi0, raw[8 * k], raw[8 * k + 2], raw[8 * k + 3]);
      }
      if (g1 >= 0) {
        const b = g1 * 6;
        const f = 12 * k + 6;
        v += W[b] * feq[f] + W[b + 1] * feq[f + 1] + W[b + 2] * feq[f + 2] + W[b + 3] * feq[f + 3] + W[b + 4] * feq[f + 4] + W[b + 5] * feq[f + 5];
        if (g1 === ss[r].iSeg) v += simpleSpanMoment(raw[8 * k + 5], ss[r].iXi0, raw[8 * k + 4], raw[8 * k + 6], raw[8 * k + 7]);
      }
      res[r][k] = v;
    }
  }
  return res;
}
