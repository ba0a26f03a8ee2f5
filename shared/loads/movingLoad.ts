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
import { PiecewiseCubic, derivativeRoots, type HasPiecewise } from './piecewiseCubic.js';

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
  candP?: number[];
  candV?: number[];
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

/**
 * Maximise σ·Σ Wᵢ·η(p − d·oᵢ) over p, with η restricted to the pieces of sign σ (others
 * neglected). `o` are distances behind the lead axle (m), `w` the weights (N).
 * With `collect`, returns every candidate (interval end limits and stationary points), in
 * increasing p, so that window maxima can be taken exactly afterwards.
 */
function searchRigid(pw: PiecewiseCubic, o: ArrayLike<number>, w: ArrayLike<number>, d: 1 | -1, sigma: 1 | -1, collect: boolean): RigidResult {
  const K = pw.count;
  const nA = o.length;
  const out: RigidResult = { best: 0, p: pw.xMin - 1, candP: collect ? [] : undefined, candV: collect ? [] : undefined };
  if (K === 0 || nA === 0) return out;
  const delta = new Float64Array(nA);
  let dMin = Infinity;
  let dMax = -Infinity;
  for (let i = 0; i < nA; i++) {
    delta[i] = -d * o[i];
    dMin = Math.min(dMin, delta[i]);
    dMax = Math.max(dMax, delta[i]);
  }
  const span = pw.xMax - pw.xMin;
  const tol = 1e-12 * Math.max(span, 1);
  const bps = new Float64Array(nA * (K + 1));
  let m = 0;
  for (let i = 0; i < nA; i++) {
    for (let k = 0; k < K; k++) bps[m++] = pw.a[k] - delta[i];
    bps[m++] = pw.b[K - 1] - delta[i];
  }
  bps.sort();
  const pLo = pw.xMin - dMax;
  const pHi = pw.xMax - dMin;
  const ptr = new Int32Array(nA);
  const { a, b, c0, c1, c2, c3, sign } = pw;
  let best = 0;
  let bestP = pLo;
  let first = true;
  const push = (p: number, v: number) => {
    if (collect) {
      out.candP!.push(p);
      out.candV!.push(v);
    }
    if (v > best || first) {
      best = v;
      bestP = p;
      first = false;
    }
  };
  push(pLo, 0);
  let t0 = pLo;
  for (let j = 0; j <= m; j++) {
    const t1 = j < m ? Math.min(Math.max(bps[j], pLo), pHi) : pHi;
    if (!(t1 - t0 > tol)) continue;
    const mid = 0.5 * (t0 + t1);
    let A0 = 0;
    let A1 = 0;
    let A2 = 0;
    let A3 = 0;
    for (let i = 0; i < nA; i++) {
      const X = mid + delta[i];
      if (X <= pw.xMin || X >= pw.xMax) continue;
      let k = ptr[i];
      while (k < K - 1 && b[k] < X) k++;
      ptr[i] = k;
      if (sign[k] !== sigma) continue;
      const e = t0 + delta[i] - a[k];
      const ws = w[i] * sigma;
      const k3 = c3[k];
      const k2 = c2[k];
      const k1 = c1[k];
      A0 += ws * (c0[k] + e * (k1 + e * (k2 + e * k3)));
      A1 += ws * (k1 + e * (2 * k2 + 3 * k3 * e));
      A2 += ws * (k2 + 3 * k3 * e);
      A3 += ws * k3;
    }
    const h = t1 - t0;
    push(t0, A0);
    if (A2 !== 0 || A3 !== 0) {
      for (const r of derivativeRoots(A1, A2, A3, 0, h)) push(t0 + r, A0 + r * (A1 + r * (A2 + r * A3)));
    }
    push(t1, A0 + h * (A1 + h * (A2 + h * A3)));
    t0 = t1;
  }
  out.best = Math.max(best, 0);
  out.p = best > 0 ? bestP : pLo;
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

function searchVariable(pw: PiecewiseCubic, o: number[], w: number[], k: number, sMin: number, sMax: number, d: 1 | -1, sigma: 1 | -1): Found {
  const oMin = offsetsWithGap(o, k, sMin);
  const oMax = offsetsWithGap(o, k, sMax);
  const rMin = searchRigid(pw, oMin, w, d, sigma, false);
  const rMax = searchRigid(pw, oMax, w, d, sigma, false);
  let found: Found = rMin.best >= rMax.best ? { best: rMin.best, p: rMin.p, d, spacing: sMin } : { best: rMax.best, p: rMax.p, d, spacing: sMax };
  if (sMax - sMin <= 1e-12 * Math.max(1, sMax)) return found;
  const oF = o.slice(0, k);
  const wF = w.slice(0, k);
  const oR = o.slice(k).map((v) => v - o[k]);
  const wR = w.slice(k);
  const F = searchRigid(pw, oF, wF, d, sigma, true);
  const G = searchRigid(pw, oR, wR, d, sigma, true);
  const fP = F.candP!;
  const fV = F.candV!;
  const gP = G.candP!;
  const gV = G.candV!;
  const order = Array.from(gV.keys()).sort((i, j) => gV[j] - gV[i]);
  const base = o[k - 1];
  const tiny = 1e-12 * Math.max(found.best, 1e-300);
  for (const gi of order) {
    const vG = gV[gi];
    if (vG + F.best <= found.best + tiny) break;
    const q = gP[gi];
    // Front axle p = q + d·(o[k−1] + s), s in (sMin, sMax).
    const e1 = q + d * (base + sMin);
    const e2 = q + d * (base + sMax);
    const lo = Math.min(e1, e2);
    const hi = Math.max(e1, e2);
    let vBest = evaluateGroup(pw, lo, oF, wF, d, sigma, 1);
    let pBest = lo;
    const vHi = evaluateGroup(pw, hi, oF, wF, d, sigma, -1);
    if (vHi > vBest) {
      vBest = vHi;
      pBest = hi;
    }
    for (let j = lowerBound(fP, lo); j < fP.length && fP[j] <= hi; j++) {
      if (fV[j] > vBest) {
        vBest = fV[j];
        pBest = fP[j];
      }
    }
    if (vG + vBest > found.best) {
      const s = Math.min(Math.max(d * (pBest - q) - base, sMin), sMax);
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
  let found: Found = { best: -1, p: pw.xMin, d: 1 };
  for (const d of dirs) {
    let f: Found;
    if (vs) {
      f = searchVariable(pw, o, w, vs.axleIndex, vs.min, vs.max, d, sigma);
    } else {
      const r = searchRigid(pw, o, w, d, sigma, false);
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
