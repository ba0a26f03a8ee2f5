/**
 * A sampled influence surface: the surface's ordinates on a grid of stations, bilinear in
 * between. The placement search works on this representation; evaluation may use either it
 * (fast, for dragging) or the surface itself.
 *
 * Units: x, y in m (x along girder 1's axis from support line 0, y from girder 1, positive
 * right); ordinates in response units per unit downward force (N·m/N for a moment, N/N for a
 * shear or reaction). Zero off the deck, i.e. outside [xMin, xMax] × [yMin, yMax].
 *
 * The sample's frame. The grid is rectangular in the coordinates (s, y), s = x − c·y, with
 * c = `shear` (dimensionless, dx/dy; 0: the plan axes). With c = tan θ of a skewed support
 * line (x = A + tan θ·y), that line is the grid line s = A, so a jump or a kink of the
 * surface along it never crosses a cell. A vehicle at fixed y moves along s as along x, and
 * a vehicle moved along the direction (c, 1) keeps its wheels' s: the search's exactness
 * (search.ts) holds in the frame. `xs` are stations of s; `at(x, y)` takes plan points.
 *
 * Representation error. If the surface is itself bilinear on every cell of the station grid
 * (for a grillage that shares a wheel load among the corner nodes of its panel, when the
 * stations include every node line), the representation is the surface and the search is
 * exact. Otherwise let ε = sup |η − η̃| over the deck. `representationError` is ε as measured
 * at the midpoints of every cell and cell edge, where a bilinear interpolant's error of a
 * smooth surface is largest to leading order (for a C² surface ε ≤ hx²/8·max|η_xx| +
 * hy²/8·max|η_yy|, the standard bilinear interpolation bound).
 */
import { PlacementError } from './rules.js';

export interface SurfaceLike {
  /** Response per unit downward point force at plan point (x, y), m; zero off the deck. */
  at(x: number, y: number): number;
  extent: { xMin: number; xMax: number; yMin: number; yMax: number };
}

export interface SampledSurface extends SurfaceLike {
  /** Longitudinal stations of the frame coordinate s = x − shear·y, m, strictly increasing. */
  xs: Float64Array;
  /** The frame's shear c (s = x − c·y, dimensionless); 0 for the plan axes. */
  shear: number;
  /** Transverse stations, m, strictly increasing, from yMin to yMax. */
  ys: Float64Array;
  /** rows[j][i] = ordinate at s = xs[i], y = ys[j] (plan x = xs[i] + shear·ys[j]). */
  rows: Float64Array[];
  /** Largest |surface − representation| found at cell and edge midpoints (0 when not measured). */
  representationError: number;
  /** Whether representationError was measured. */
  representationMeasured: boolean;
  /** Largest |ordinate| on the grid, for scale. */
  maxOrdinate: number;
  /** The surface sampled (results are evaluated on it). */
  source: SurfaceLike;
  /**
   * Per station xs[i], a bound of |surface − representation| over the cells next to it, as
   * measured (absent when not measured). The search uses it, linear between stations, to
   * bound what a placement could gain on the surface itself (search.ts).
   */
  errorEnvelope?: Float64Array;
  /**
   * Per cell (index j·(xs.length − 1) + i for [xs[i], xs[i+1]] × [ys[j], ys[j+1]]), as
   * measured: `error` the largest |surface − representation| at the points checked in or on
   * it, `lo`/`hi` the smallest/largest surface ordinate there (corners included). Absent
   * when not measured. `raisedRows` builds the upper (or lower) sample from them.
   */
  cells?: { error: Float64Array; lo: Float64Array; hi: Float64Array };
  /**
   * Largest |surface − representation| at the points checked on the rows between stations
   * (the error of interpolating along s), and at those on the columns between rows (across y);
   * absent when not measured. Tells a refinement which way to sample denser.
   */
  errorAlong?: number;
  errorAcross?: number;
}

function sortedUnique(values: ArrayLike<number>, lo: number, hi: number, what: string): Float64Array {
  const arr: number[] = [];
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) throw new PlacementError([{ path: ['stations', what, i], message: `every ${what} station must be a finite number of metres` }]);
    if (v >= lo && v <= hi) arr.push(v);
  }
  arr.push(lo, hi);
  arr.sort((a, b) => a - b);
  const out: number[] = [];
  const tol = 1e-9 * Math.max(1, Math.abs(hi - lo));
  for (const v of arr) if (!out.length || v - out[out.length - 1] > tol) out.push(v);
  if (out[out.length - 1] !== hi) out[out.length - 1] = hi;
  return Float64Array.from(out);
}

/** Index j of the cell [s[j], s[j+1]] holding v (clamped), binary search. */
export function cellIndex(s: Float64Array, v: number): number {
  const n = s.length;
  if (v <= s[0]) return 0;
  if (v >= s[n - 1]) return n - 2;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (s[mid] <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * The range of the frame coordinate s = x − shear·y over the rectangle [xMin, xMax] × [yMin, yMax]
 * (its corners), m.
 */
export function frameRange(extent: SurfaceLike['extent'], shear: number): { sMin: number; sMax: number } {
  const a = -shear * extent.yMin;
  const b = -shear * extent.yMax;
  return { sMin: extent.xMin + Math.min(a, b), sMax: extent.xMax + Math.max(a, b) };
}

/**
 * Sample a surface on the stations given (m; stations of s = x − shear·y, those outside the
 * frame's range are dropped and its ends are added). `measure`: also measure the
 * representation error (3 more evaluations of the surface per grid point). `shear`: the
 * frame (see the header; default 0).
 */
export function sampleSurface(
  surface: SurfaceLike,
  stations: { xs: ArrayLike<number>; ys: ArrayLike<number> },
  options: { measure?: boolean; shear?: number } = {},
): SampledSurface {
  const e = surface.extent;
  if (!(Number.isFinite(e.xMin) && Number.isFinite(e.xMax) && e.xMax > e.xMin)) {
    throw new PlacementError([{ path: ['surface', 'extent'], message: 'the surface needs a finite length xMax > xMin' }]);
  }
  if (!(Number.isFinite(e.yMin) && Number.isFinite(e.yMax) && e.yMax > e.yMin)) {
    throw new PlacementError([{ path: ['surface', 'extent'], message: 'the surface needs a finite width yMax > yMin' }]);
  }
  const c = options.shear ?? 0;
  if (!Number.isFinite(c)) throw new PlacementError([{ path: ['surface', 'shear'], message: 'the sample frame\'s shear must be a finite number' }]);
  const range = frameRange(e, c);
  const xs = sortedUnique(stations.xs, range.sMin, range.sMax, 'x');
  const ys = sortedUnique(stations.ys, e.yMin, e.yMax, 'y');
  const ny = ys.length;
  const values = new Float64Array(xs.length * ny);
  for (let i = 0; i < xs.length; i++) for (let j = 0; j < ny; j++) values[i * ny + j] = surface.at(xs[i] + c * ys[j], ys[j]);
  if (!options.measure) return sampledFromGrid(surface, xs, ys, values, undefined, c);
  const points = checkPoints(xs, ys);
  const truth = new Float64Array(points.x.length);
  for (let k = 0; k < truth.length; k++) truth[k] = surface.at(points.x[k] + c * points.y[k], points.y[k]);
  return sampledFromGrid(surface, xs, ys, values, { points, values: truth }, c);
}

/** Cells narrower than this (m) are the steps of a jump (see refinedFactors.ts) and are not checked. */
export const JUMP_CELL = 1e-5;

/** Points where the representation is checked: cell midpoints and edge midpoints of the grid. */
export interface CheckPoints {
  /** The frame coordinate s of each point (plan x = s + shear·y). */
  x: Float64Array;
  y: Float64Array;
  /** Station index i whose envelope each point feeds (its x-cell's left station, or its own column). */
  column: Int32Array;
  /** Whether the point is inside an x-cell (feeds stations i and i+1) or on column i. */
  inCell: Uint8Array;
  /** Cell of each point on the grid and its bilinear weights (the same for every surface). */
  cellX: Int32Array;
  cellY: Int32Array;
  tx: Float64Array;
  ty: Float64Array;
}

export function checkPoints(xs: Float64Array, ys: Float64Array): CheckPoints {
  const px: number[] = [];
  const py: number[] = [];
  const col: number[] = [];
  const inc: number[] = [];
  const nx = xs.length;
  const ny = ys.length;
  for (let i = 0; i < nx; i++) {
    const cellOk = i < nx - 1 && xs[i + 1] - xs[i] > JUMP_CELL;
    const xm = cellOk ? (xs[i] + xs[i + 1]) / 2 : NaN;
    for (let j = 0; j < ny; j++) {
      const ym = j < ny - 1 ? (ys[j] + ys[j + 1]) / 2 : NaN;
      if (cellOk) {
        px.push(xm), py.push(ys[j]), col.push(i), inc.push(1);
        if (j < ny - 1) px.push(xm), py.push(ym), col.push(i), inc.push(1);
      }
      if (j < ny - 1) px.push(xs[i]), py.push(ym), col.push(i), inc.push(0);
    }
  }
  const x = Float64Array.from(px);
  const y = Float64Array.from(py);
  const n = x.length;
  const cellX = new Int32Array(n);
  const cellY = new Int32Array(n);
  const tx = new Float64Array(n);
  const ty = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const i = cellIndex(xs, x[k]);
    const j = cellIndex(ys, y[k]);
    cellX[k] = i;
    cellY[k] = j;
    tx[k] = (x[k] - xs[i]) / (xs[i + 1] - xs[i]);
    ty[k] = (y[k] - ys[j]) / (ys[j + 1] - ys[j]);
  }
  return { x, y, column: Int32Array.from(col), inCell: Uint8Array.from(inc), cellX, cellY, tx, ty };
}

/** Per-cell statistics started from the grid values: no error yet, lo/hi over the four corners. */
function cellCorners(rows: Float64Array[], nx: number, ny: number): NonNullable<SampledSurface['cells']> {
  const n = (nx - 1) * (ny - 1);
  const error = new Float64Array(n);
  const lo = new Float64Array(n);
  const hi = new Float64Array(n);
  for (let j = 0; j + 1 < ny; j++) {
    for (let i = 0; i + 1 < nx; i++) {
      const a = rows[j][i];
      const b = rows[j][i + 1];
      const d = rows[j + 1][i];
      const e = rows[j + 1][i + 1];
      const c = j * (nx - 1) + i;
      lo[c] = Math.min(a, b, d, e);
      hi[c] = Math.max(a, b, d, e);
    }
  }
  return { error, lo, hi };
}

/**
 * Record check point k (error d, surface ordinate v) on every cell it lies in or on: a point
 * on a row edge belongs to the cells above and below it, a point on a column to the cells
 * left and right of it.
 */
function markCells(cells: NonNullable<SampledSurface['cells']>, nx: number, ny: number, p: CheckPoints, k: number, d: number, v: number): void {
  const i = p.cellX[k];
  const j = p.cellY[k];
  const a0 = p.inCell[k] ? i : p.column[k] - 1;
  const a1 = p.inCell[k] ? i : p.column[k];
  const ty = p.ty[k];
  const b0 = ty === 0 ? j - 1 : j;
  const b1 = ty === 1 ? j + 1 : j;
  for (let a = a0 < 0 ? 0 : a0; a <= a1 && a < nx - 1; a++) {
    for (let b = b0 < 0 ? 0 : b0; b <= b1 && b < ny - 1; b++) {
      const c = b * (nx - 1) + a;
      if (d > cells.error[c]) cells.error[c] = d;
      if (v < cells.lo[c]) cells.lo[c] = v;
      if (v > cells.hi[c]) cells.hi[c] = v;
    }
  }
}

/**
 * The sample raised (sgn = 1) or lowered (sgn = −1) so that, bilinear between nodes, it is
 * beyond the surface at every point checked: each cell asks of its four corners either
 * "sample + the cell's error" or "at least the cell's largest ordinate" (sgn = −1: the
 * mirror), whichever suits it (the second where the error is a large part of the cell's
 * range, as where a jump crosses the cell), and each node takes the most any of its cells
 * asks. A bilinear function is at least its smallest corner, so every cell's demand holds
 * inside it. The upper search of search.ts runs on it. Null when the sample was not measured.
 */
export function raisedRows(surface: SampledSurface, sgn: 1 | -1): Float64Array[] | null {
  const cells = surface.cells;
  if (!cells) return null;
  const { rows } = surface;
  const nx = surface.xs.length;
  const ny = surface.ys.length;
  const out = rows.map((r) => Float64Array.from(r));
  for (let j = 0; j + 1 < ny; j++) {
    for (let i = 0; i + 1 < nx; i++) {
      const c = j * (nx - 1) + i;
      const e = cells.error[c];
      if (e === 0) continue;
      const top = sgn > 0 ? cells.hi[c] : cells.lo[c];
      const byLevel = e > 0.25 * (cells.hi[c] - cells.lo[c]);
      for (let q = 0; q < 4; q++) {
        const b = j + (q >> 1);
        const a = i + (q & 1);
        const want = byLevel ? top : rows[b][a] + sgn * e;
        if (sgn * (want - out[b][a]) > 0) out[b][a] = want;
      }
    }
  }
  return out;
}

/**
 * A sampled surface from ordinates already computed on the grid (values[i·ys.length + j] at
 * s = xs[i], y = ys[j], row-major by s), and, when given, the surface's ordinates at `check`
 * points to measure the representation error and its envelope. `shear`: the frame (header).
 */
export function sampledFromGrid(
  source: SurfaceLike,
  xs: Float64Array,
  ys: Float64Array,
  values: Float64Array,
  check?: { points: CheckPoints; values: Float64Array },
  shear = 0,
): SampledSurface {
  const nx = xs.length;
  const ny = ys.length;
  const rows: Float64Array[] = [];
  let maxOrd = 0;
  for (let j = 0; j < ny; j++) {
    const r = new Float64Array(nx);
    for (let i = 0; i < nx; i++) {
      const v = values[i * ny + j];
      if (!Number.isFinite(v)) throw new PlacementError([{ path: ['surface'], message: `the surface's ordinate at x = ${xs[i] + shear * ys[j]} m, y = ${ys[j]} m is not finite` }]);
      r[i] = v;
      if (Math.abs(v) > maxOrd) maxOrd = Math.abs(v);
    }
    rows.push(r);
  }
  const interp = (xPlan: number, y: number): number => {
    const x = xPlan - shear * y;
    if (x < xs[0] || x > xs[nx - 1] || y < ys[0] || y > ys[ny - 1]) return 0;
    const i = cellIndex(xs, x);
    const j = cellIndex(ys, y);
    const tx = (x - xs[i]) / (xs[i + 1] - xs[i]);
    const ty = (y - ys[j]) / (ys[j + 1] - ys[j]);
    const a = rows[j][i] + tx * (rows[j][i + 1] - rows[j][i]);
    const b = rows[j + 1][i] + tx * (rows[j + 1][i + 1] - rows[j + 1][i]);
    return a + ty * (b - a);
  };
  let err = 0;
  let along = 0;
  let across = 0;
  let envelope: Float64Array | undefined;
  let cells: SampledSurface['cells'];
  if (check) {
    envelope = new Float64Array(nx);
    cells = cellCorners(rows, nx, ny);
    const p = check.points;
    for (let k = 0; k < p.x.length; k++) {
      const i0 = p.cellX[k];
      const r0 = rows[p.cellY[k]];
      const r1 = rows[p.cellY[k] + 1];
      const a = r0[i0] + p.tx[k] * (r0[i0 + 1] - r0[i0]);
      const b = r1[i0] + p.tx[k] * (r1[i0 + 1] - r1[i0]);
      const d = Math.abs(check.values[k] - (a + p.ty[k] * (b - a)));
      if (d > err) err = d;
      if (!p.inCell[k]) {
        if (d > across) across = d;
      } else if ((p.ty[k] === 0 || p.ty[k] === 1) && d > along) along = d;
      const i = p.column[k];
      if (d > envelope[i]) envelope[i] = d;
      if (p.inCell[k] && d > envelope[i + 1]) envelope[i + 1] = d;
      markCells(cells, nx, ny, p, k, d, check.values[k]);
    }
  }
  const out: SampledSurface = {
    at: interp,
    extent: { ...source.extent },
    xs,
    ys,
    shear,
    rows,
    representationError: err,
    representationMeasured: !!check,
    maxOrdinate: maxOrd,
    source,
  };
  if (envelope) out.errorEnvelope = envelope;
  if (cells) {
    out.cells = cells;
    out.errorAlong = along;
    out.errorAcross = across;
  }
  return out;
}
