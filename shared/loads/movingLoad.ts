/**
 * Moving-load search: the extreme effect of a train of axle loads on an influence line.
 *
 * Units: positions and spacings in m, axle weights in N; the effect has the unit of the
 * line's ordinate times N (N·m for a moment line, N for a shear or reaction line).
 *
 * Rules applied (AASHTO LRFD Art. 3.6.1.3.1): the vehicle may stand anywhere along the
 * line and travel either way; axles that do not contribute to the extreme effect sought are
 * neglected (so an axle on an adverse part of the line counts zero). A variable axle
 * spacing (the design truck's 14–30 ft rear spacing, Art. 3.6.1.2.2; the headway of two
 * trucks, Art. 3.6.1.3.1) is chosen to give the extreme.
 *
 * The search is exact for a piecewise-cubic line. With the axle spacing fixed, the effect
 * f(p) = Σ Wᵢ·η⁺(p − d·oᵢ) is a cubic in the front-axle position p between the positions
 * where some axle crosses a piece boundary; each such interval is maximised in closed form
 * (end values and the roots of f′). With a variable gap between a front group and a rear
 * group of axles, the extreme has the gap at a limit (two fixed-spacing searches) or the
 * rear group at a local maximum of its own effect with the front group at its best within
 * the reachable window (exact window maxima over the front group's candidate list).
 * At a jump of the line (a shear line at its section) the supremum is taken: a load
 * "just past" the section, as design practice does.
 *
 * Direction +1: travelling towards +x, the front axle at the largest x; −1 the reverse.
 */
import { DeckInputError } from '../deck/schema.js';
import type { Vehicle } from './vehicles.js';
import { PiecewiseCubic, stationaryPoints, type HasPiecewise } from './piecewiseCubic.js';

/** One axle of a placed vehicle. */
export interface AxlePlacement {
  /** Position along the beam, m. */
  position: number;
  /** Axle weight, N. */
  weight: number;
  /** Influence ordinate used (the favourable one-sided limit at a jump). */
  ordinate: number;
  /** false when the axle is neglected (off the beam, or on the adverse part of the line). */
  counted: boolean;
}

export interface VehicleEffect {
  /** Extreme effect, signed (≥ 0 for 'positive', ≤ 0 for 'negative'); ordinate unit × N. */
  value: number;
  /** Position of the front axle, m from support 0 (may lie off the beam). */
  frontAxleAt: number;
  /** +1: travelling towards +x; −1: towards −x. */
  direction: 1 | -1;
  /** The variable spacing used, m, when the vehicle has one. */
  axleSpacing?: number;
  /** Where each axle stands, front first. */
  axles: AxlePlacement[];
}

interface LineLike {
  xs: ArrayLike<number>;
  values: ArrayLike<number>;
}

interface RigidResult {
  best: number;
  p: number;
  /** With `collect`: the local maxima of the effect as runs [pa, pb] of constant value v, increasing p. */
  runs?: Runs;
}

interface Runs {
  pa: number[];
  pb: number[];
  v: number[];
}

/** The exact piecewise form of a line: the engine's own, or piecewise linear through its stations. */
export function piecewiseOf(line: LineLike | HasPiecewise): PiecewiseCubic {
  const maybe = line as Partial<HasPiecewise>;
  if (typeof maybe.piecewise === 'function') return maybe.piecewise();
  const l = line as LineLike;
  if (!l || !l.xs || !l.values || l.xs.length !== l.values.length) {
    throw new DeckInputError(['line'], 'an influence line needs stations xs and ordinates values of equal length');
  }
  for (let i = 0; i < l.xs.length; i++) {
    if (!Number.isFinite(l.xs[i]) || !Number.isFinite(l.values[i])) {
      throw new DeckInputError(['line', i], 'influence-line stations and ordinates must be finite numbers');
    }
    if (i > 0 && l.xs[i] < l.xs[i - 1]) throw new DeckInputError(['line', i], 'influence-line stations must not decrease');
  }
  return PiecewiseCubic.fromStations(l.xs, l.values);
}

/** Results of one sweep, for σ = +1 and σ = −1. */
type SweepResult = [RigidResult, RigidResult];

interface CachedSweep {
  d: 1 | -1;
  o: Float64Array;
  w: Float64Array;
  collect: boolean;
  result: SweepResult;
}


function sameLayout(c: CachedSweep, o: ArrayLike<number>, w: ArrayLike<number>, d: 1 | -1): boolean {
  if (c.d !== d || c.o.length !== o.length) return false;
  const tol = 1e-12 * Math.max(1, Math.abs(c.o[c.o.length - 1]));
  for (let i = 0; i < o.length; i++) {
    if (Math.abs(c.o[i] - o[i]) > tol || c.w[i] !== w[i]) return false;
  }
  return true;
}

/**
 * Maximise σ·Σ Wᵢ·η(p − d·oᵢ) over p, with η restricted to the pieces of sign σ (others
 * neglected). `o` are distances behind the lead axle (m), `w` the weights (N).
 * With `collect`, also returns the local maxima of the effect as a function of p (every
 * interval end limit and stationary point is a candidate; runs of equal value are merged
 * into plateaus), so that window maxima can be taken exactly afterwards.
 */
function searchRigid(ws: Workspace, pw: PiecewiseCubic, o: ArrayLike<number>, w: ArrayLike<number>, d: 1 | -1, sigma: 1 | -1, collect: boolean): RigidResult {
  // Sweeps already made on this line are kept on it, so both senses share one pass.
  const list = pw.memo as CachedSweep[];
  let hit: CachedSweep | undefined;
  for (const c of list) {
    if (sameLayout(c, o, w, d)) {
      hit = c;
      break;
    }
  }
  if (!hit || (collect && !hit.collect)) {
    const entry: CachedSweep = { d, o: Float64Array.from(o), w: Float64Array.from(w), collect, result: sweep(ws, pw, o, w, d, collect) };
    if (hit) list[list.indexOf(hit)] = entry;
    else list.push(entry);
    hit = entry;
  }
  return hit.result[sigma > 0 ? 0 : 1];
}

/** Growable list of (p, value) candidates. */
class CandidateList {
  p = new Float64Array(256);
  v = new Float64Array(256);
  n = 0;
  push(p: number, v: number): void {
    if (this.n === this.p.length) {
      const p2 = new Float64Array(this.n * 2);
      const v2 = new Float64Array(this.n * 2);
      p2.set(this.p);
      v2.set(this.v);
      this.p = p2;
      this.v = v2;
    }
    this.p[this.n] = p;
    this.v[this.n] = v;
    this.n++;
  }
}

/** Work arrays of one search, made once per call and reused by its sweeps. */
class Workspace {
  delta = new Float64Array(8);
  head = new Int32Array(8);
  ptr = new Int32Array(8);
  bps = new Float64Array(256);
  readonly roots = new Float64Array(2);
  readonly pos = new CandidateList();
  readonly neg = new CandidateList();
  ensure(nA: number, nBp: number): void {
    if (this.delta.length < nA) {
      this.delta = new Float64Array(nA);
      this.head = new Int32Array(nA);
      this.ptr = new Int32Array(nA);
    }
    if (this.bps.length < nBp) this.bps = new Float64Array(nBp);
  }
}

/** One pass over the breakpoints giving the positive and the negative extreme together. */
function sweep(ws: Workspace, pw: PiecewiseCubic, o: ArrayLike<number>, w: ArrayLike<number>, d: 1 | -1, collect: boolean): SweepResult {
  const K = pw.count;
  const nA = o.length;
  if (K === 0 || nA === 0) {
    const empty = (): RigidResult => ({ best: 0, p: pw.xMin - 1, runs: collect ? { pa: [], pb: [], v: [] } : undefined });
    return [empty(), empty()];
  }
  const nB = K + 1;
  ws.ensure(nA, nA * nB);
  const { delta, head, ptr, bps, roots } = ws;
  let dMin = Infinity;
  let dMax = -Infinity;
  for (let i = 0; i < nA; i++) {
    delta[i] = -d * o[i];
    head[i] = 0;
    ptr[i] = 0;
    dMin = Math.min(dMin, delta[i]);
    dMax = Math.max(dMax, delta[i]);
  }
  const span = pw.xMax - pw.xMin;
  const tol = 1e-12 * Math.max(span, 1);
  const { a, b, c0, c1, c2, c3, sign } = pw;
  // Breakpoints: piece boundaries shifted by each axle offset, merged in increasing order.
  const nBp = nA * nB;
  const bEnd = b[K - 1];
  for (let m = 0; m < nBp; m++) {
    let bi = -1;
    let bv = Infinity;
    for (let i = 0; i < nA; i++) {
      if (head[i] < nB) {
        const v = (head[i] < K ? a[head[i]] : bEnd) - delta[i];
        if (v < bv) {
          bv = v;
          bi = i;
        }
      }
    }
    bps[m] = bv;
    head[bi]++;
  }
  const pLo = pw.xMin - dMax;
  const pHi = pw.xMax - dMin;
  let bestP = 0;
  let bestPP = pLo;
  let bestN = 0;
  let bestNP = pLo;
  const cp = ws.pos;
  const cn = ws.neg;
  cp.n = 0;
  cn.n = 0;
  if (collect) {
    cp.push(pLo, 0);
    cn.push(pLo, 0);
  }
  let t0 = pLo;
  for (let j = 0; j <= nBp; j++) {
    const t1 = j < nBp ? Math.min(Math.max(bps[j], pLo), pHi) : pHi;
    if (!(t1 - t0 > tol)) continue;
    const mid = 0.5 * (t0 + t1);
    let P0 = 0;
    let P1 = 0;
    let P2 = 0;
    let P3 = 0;
    let N0 = 0;
    let N1 = 0;
    let N2 = 0;
    let N3 = 0;
    for (let i = 0; i < nA; i++) {
      const X = mid + delta[i];
      if (X <= pw.xMin || X >= pw.xMax) continue;
      let k = ptr[i];
      while (k < K - 1 && b[k] < X) k++;
      ptr[i] = k;
      const sg = sign[k];
      if (sg === 0) continue;
      const e = t0 + delta[i] - a[k];
      const wi = w[i];
      const k3 = c3[k];
      const k2 = c2[k];
      const k1 = c1[k];
      const q0 = wi * (c0[k] + e * (k1 + e * (k2 + e * k3)));
      const q1 = wi * (k1 + e * (2 * k2 + 3 * k3 * e));
      const q2 = wi * (k2 + 3 * k3 * e);
      const q3 = wi * k3;
      if (sg > 0) {
        P0 += q0;
        P1 += q1;
        P2 += q2;
        P3 += q3;
      } else {
        N0 -= q0;
        N1 -= q1;
        N2 -= q2;
        N3 -= q3;
      }
    }
    const h = t1 - t0;
    if (P0 > bestP) {
      bestP = P0;
      bestPP = t0;
    }
    if (N0 > bestN) {
      bestN = N0;
      bestNP = t0;
    }
    if (collect) {
      cp.push(t0, P0);
      cn.push(t0, N0);
    }
    // Interior stationary points (only for the collected lists are they needed at a given p).
    if (P2 !== 0 || P3 !== 0) {
      const nr = stationaryPoints(P1, P2, P3, 0, h, roots);
      for (let q = 0; q < nr; q++) {
        const r = roots[q];
        const v = P0 + r * (P1 + r * (P2 + r * P3));
        if (v > bestP) {
          bestP = v;
          bestPP = t0 + r;
        }
        if (collect) cp.push(t0 + r, v);
      }
    }
    if (N2 !== 0 || N3 !== 0) {
      const nr = stationaryPoints(N1, N2, N3, 0, h, roots);
      for (let q = 0; q < nr; q++) {
        const r = roots[q];
        const v = N0 + r * (N1 + r * (N2 + r * N3));
        if (v > bestN) {
          bestN = v;
          bestNP = t0 + r;
        }
        if (collect) cn.push(t0 + r, v);
      }
    }
    const vp = P0 + h * (P1 + h * (P2 + h * P3));
    const vn = N0 + h * (N1 + h * (N2 + h * N3));
    if (vp > bestP) {
      bestP = vp;
      bestPP = t1;
    }
    if (vn > bestN) {
      bestN = vn;
      bestNP = t1;
    }
    if (collect) {
      cp.push(t1, vp);
      cn.push(t1, vn);
    }
    t0 = t1;
  }
  const pos: RigidResult = { best: bestP, p: bestP > 0 ? bestPP : pLo };
  const neg: RigidResult = { best: bestN, p: bestN > 0 ? bestNP : pLo };
  if (collect) {
    cp.push(pHi, 0);
    cn.push(pHi, 0);
    pos.runs = localMaxima(cp.p, cp.v, cp.n, 1e-12 * Math.max(bestP, 1e-300));
    neg.runs = localMaxima(cn.p, cn.v, cn.n, 1e-12 * Math.max(bestN, 1e-300));
  }
  return [pos, neg];
}

/** Merge consecutive equal values into runs and keep the runs not lower than their neighbours. */
function localMaxima(p: Float64Array, v: Float64Array, n: number, tiny: number): Runs {
  const ra: number[] = [];
  const rb: number[] = [];
  const rv: number[] = [];
  for (let i = 0; i < n; i++) {
    const last = rv.length - 1;
    if (last >= 0 && Math.abs(v[i] - rv[last]) <= tiny) {
      rb[last] = p[i];
      rv[last] = Math.max(rv[last], v[i]);
    } else {
      ra.push(p[i]);
      rb.push(p[i]);
      rv.push(v[i]);
    }
  }
  const out: Runs = { pa: [], pb: [], v: [] };
  for (let i = 0; i < rv.length; i++) {
    if ((i === 0 || rv[i] >= rv[i - 1]) && (i === rv.length - 1 || rv[i] >= rv[i + 1])) {
      out.pa.push(ra[i]);
      out.pb.push(rb[i]);
      out.v.push(rv[i]);
    }
  }
  return out;
}

/** σ·Σ Wᵢ·η(p − d·oᵢ) with one-sided ordinates (side −1/+1 as p moves), adverse axles neglected. */
function evaluateGroup(pw: PiecewiseCubic, p: number, o: ArrayLike<number>, w: ArrayLike<number>, d: 1 | -1, sigma: 1 | -1, side: -1 | 1): number {
  let s = 0;
  for (let i = 0; i < o.length; i++) {
    const X = p - d * o[i];
    const k = pw.pieceAt(X, side);
    if (k < 0 || pw.sign[k] !== sigma) continue;
    s += w[i] * sigma * pw.pieceValue(k, X);
  }
  return s;
}

function lowerBound(arr: number[], x: number): number {
  let lo = 0;
  let hi = arr.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (arr[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

interface Found {
  best: number;
  p: number;
  d: 1 | -1;
  spacing?: number;
}

/** Offsets with the variable gap (between axles k−1 and k) set to s. */
function offsetsWithGap(o: number[], k: number, s: number): number[] {
  const shift = s - (o[k] - o[k - 1]);
  return o.map((v, i) => (i >= k ? v + shift : v));
}

function searchVariable(ws: Workspace, pw: PiecewiseCubic, o: number[], w: number[], k: number, sMin: number, sMax: number, d: 1 | -1, sigma: 1 | -1): Found {
  const base = o[k - 1];
  const oMin = offsetsWithGap(o, k, sMin);
  const oMax = offsetsWithGap(o, k, sMax);
  // Front group (axles before the gap) and rear group (from axle k), each rigid.
  const oF = o.slice(0, k);
  const wF = w.slice(0, k);
  const oR = o.slice(k).map((v) => v - o[k]);
  const wR = w.slice(k);
  const F = searchRigid(ws, pw, oF, wF, d, sigma, true);
  const G = searchRigid(ws, pw, oR, wR, d, sigma, true);
  const rMin = searchRigid(ws, pw, oMin, w, d, sigma, false);
  // With a gap as long as the line, the two groups are never on it together.
  const rMax = sMax >= pw.xMax - pw.xMin ? (F.best >= G.best ? { best: F.best, p: F.p } : { best: G.best, p: G.p + d * (base + sMax) }) : searchRigid(ws, pw, oMax, w, d, sigma, false);
  let found: Found = rMin.best >= rMax.best ? { best: rMin.best, p: rMin.p, d, spacing: sMin } : { best: rMax.best, p: rMax.p, d, spacing: sMax };
  if (sMax - sMin <= 1e-12 * Math.max(1, sMax)) return found;
  const fr = F.runs!;
  const gr = G.runs!;
  const order = Array.from(gr.v.keys()).sort((i, j) => gr.v[j] - gr.v[i]);
  const tiny = 1e-12 * Math.max(found.best, 1e-300);
  for (const gi of order) {
    const vG = gr.v[gi];
    if (vG + F.best <= found.best + tiny) break;
    // Rear group's lead axle at q ∈ [qa, qb]; front axle p = q + d·(o[k−1] + s), s ∈ [sMin, sMax].
    const qa = gr.pa[gi];
    const qb = gr.pb[gi];
    const lo = d > 0 ? qa + base + sMin : qa - base - sMax;
    const hi = d > 0 ? qb + base + sMax : qb - base - sMin;
    let vBest = evaluateGroup(pw, lo, oF, wF, d, sigma, 1);
    let pBest = lo;
    const vHi = evaluateGroup(pw, hi, oF, wF, d, sigma, -1);
    if (vHi > vBest) {
      vBest = vHi;
      pBest = hi;
    }
    for (let j = lowerBound(fr.pb, lo); j < fr.pa.length && fr.pa[j] <= hi; j++) {
      if (fr.v[j] > vBest) {
        vBest = fr.v[j];
        pBest = Math.min(Math.max(fr.pa[j], lo), hi);
      }
    }
    if (vG + vBest > found.best) {
      // A spacing that puts the rear group in [qa, qb] with the front axle at pBest.
      const sLo = d * (pBest - qb) - base;
      const sHi = d * (pBest - qa) - base;
      const s = Math.min(Math.max(Math.max(sLo, Math.min(sHi, sMin)), sMin), sMax);
      found = { best: vG + vBest, p: pBest, d, spacing: s };
    }
  }
  return found;
}

function validateVehicle(v: Vehicle): { o: number[]; w: number[] } {
  if (!v || !Array.isArray(v.axles) || v.axles.length === 0) throw new DeckInputError(['vehicle', 'axles'], 'a vehicle needs at least one axle');
  const o: number[] = [];
  const w: number[] = [];
  v.axles.forEach((ax, i) => {
    if (!Number.isFinite(ax.weight) || ax.weight < 0) throw new DeckInputError(['vehicle', 'axles', i, 'weight'], 'axle weight must be a finite number of newtons, 0 or more');
    if (!Number.isFinite(ax.position)) throw new DeckInputError(['vehicle', 'axles', i, 'position'], 'axle position must be a finite number of metres');
    if (i > 0 && ax.position < v.axles[i - 1].position) {
      throw new DeckInputError(['vehicle', 'axles', i, 'position'], 'axles must be listed front first, positions not decreasing');
    }
    o.push(ax.position - v.axles[0].position);
    w.push(ax.weight);
  });
  const vs = v.variableSpacing;
  if (vs) {
    if (!Number.isInteger(vs.axleIndex) || vs.axleIndex < 1 || vs.axleIndex >= v.axles.length) {
      throw new DeckInputError(['vehicle', 'variableSpacing', 'axleIndex'], `the variable spacing's axle index must be a whole number from 1 to ${v.axles.length - 1}`);
    }
    if (!Number.isFinite(vs.min) || !Number.isFinite(vs.max) || vs.min < 0 || vs.max < vs.min) {
      throw new DeckInputError(['vehicle', 'variableSpacing'], 'the variable spacing needs finite limits with 0 ≤ min ≤ max (m)');
    }
  }
  return { o, w };
}

function isSymmetric(o: number[], w: number[]): boolean {
  const n = o.length;
  const len = o[n - 1];
  const tol = 1e-12 * Math.max(len, 1);
  for (let i = 0; i < n; i++) {
    if (Math.abs(o[i] + o[n - 1 - i] - len) > tol || w[i] !== w[n - 1 - i]) return false;
  }
  return true;
}

/** Place the vehicle and report each axle. */
function placement(pw: PiecewiseCubic, o: number[], w: number[], p: number, d: 1 | -1, sigma: 1 | -1): AxlePlacement[] {
  // Report the favourable one-sided ordinate at a jump.
  return o.map((oi, i) => {
    const X = p - d * oi;
    const left = pw.pieceAt(X, -1);
    const right = pw.pieceAt(X, 1);
    const vl = left >= 0 && pw.sign[left] === sigma ? pw.pieceValue(left, X) : 0;
    const vr = right >= 0 && pw.sign[right] === sigma ? pw.pieceValue(right, X) : 0;
    const ord = sigma * vl >= sigma * vr ? vl : vr;
    return { position: X, weight: w[i], ordinate: ord, counted: ord !== 0 && w[i] > 0 };
  });
}

/**
 * Largest effect of a vehicle moving along the line, both directions of travel, variable
 * spacing searched, adverse axles neglected (Art. 3.6.1.3.1).
 * @param line influence line (ordinate per unit downward force; m for moments)
 * @param vehicle axles in N and m behind the front axle
 * @param sense 'positive' for the maximum, 'negative' for the minimum
 */
export function maxVehicleEffect(line: LineLike | HasPiecewise, vehicle: Vehicle, sense: 'positive' | 'negative'): VehicleEffect {
  if (sense !== 'positive' && sense !== 'negative') throw new DeckInputError(['sense'], `sense must be 'positive' or 'negative' (got ${String(sense)})`);
  const pw = piecewiseOf(line);
  const { o, w } = validateVehicle(vehicle);
  const sigma: 1 | -1 = sense === 'positive' ? 1 : -1;
  const vs = vehicle.variableSpacing;
  const dirs: (1 | -1)[] = !vs && isSymmetric(o, w) ? [1] : [1, -1];
  const ws = new Workspace();
  let found: Found = { best: -1, p: pw.xMin, d: 1 };
  for (const d of dirs) {
    let f: Found;
    if (vs) {
      f = searchVariable(ws, pw, o, w, vs.axleIndex, vs.min, vs.max, d, sigma);
    } else {
      const r = searchRigid(ws, pw, o, w, d, sigma, false);
      f = { best: r.best, p: r.p, d };
    }
    if (f.best > found.best) found = f;
  }
  const oUsed = vs && found.spacing !== undefined ? offsetsWithGap(o, vs.axleIndex, found.spacing) : o;
  const axles = placement(pw, oUsed, w, found.p, found.d, sigma);
  const value = found.best > 0 ? sigma * found.best : 0;
  const result: VehicleEffect = { value, frontAxleAt: found.p, direction: found.d, axles };
  if (vs && found.spacing !== undefined) result.axleSpacing = found.spacing;
  return result;
}

/**
 * Effect of a uniform load over the parts of the line of one sign (each portion loaded
 * separately, Art. 3.6.1.3.1 and 3.6.1.2.4): σ·w·∫max(σ·η, 0) dx. Signed like the sense.
 * @param w line load, N/m
 */
export function uniformLoadEffect(line: LineLike | HasPiecewise, w: number, sense: 'positive' | 'negative'): number {
  if (!Number.isFinite(w) || w < 0) throw new DeckInputError(['laneLoad'], 'a line load must be a finite number of N/m, 0 or more');
  if (sense !== 'positive' && sense !== 'negative') throw new DeckInputError(['sense'], `sense must be 'positive' or 'negative' (got ${String(sense)})`);
  const pw = piecewiseOf(line);
  return w * pw.signedArea(sense === 'positive' ? 1 : -1);
}
