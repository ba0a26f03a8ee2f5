/**
 * The governing position of one vehicle along a piecewise-linear line: exact.
 *
 * Units: x in m; line ordinates in response per unit downward force (any response unit);
 * axle weights in N; the result is in response units (ordinate × N).
 *
 * The line is linear between its stations and zero beyond the deck's length [xMin, xMax].
 * Where its end ordinates are not zero, it falls to zero over a ramp of RAMP m just beyond
 * the end, so that the line is continuous everywhere; an axle on the ramp is off the deck and
 * its true share is zero, so the ramp can change the largest effect by at most
 * (axle weight) × (end ordinate) at a position 1 µm from one where the true value is reached.
 *
 * Why the search is exact. Fix the direction of travel. The effect
 *   F(xf, s) = Σ_a W_a · ℓ(xf − d·p_a(s)),
 * with xf the front axle's x, s the variable spacing in [sMin, sMax] and p_a(s) the axle
 * positions behind the front axle, is linear on every cell of the arrangement of the lines
 * "axle a at station x_j" in the (xf, s) plane: for the axles ahead of the variable gap these
 * are lines xf = const, for the axles behind it lines xf − d·s = const. The legal domain
 * (s in [sMin, sMax], at least one axle on the deck) is bounded by lines of the same
 * arrangement (the deck's ends are stations) and by s = sMin, s = sMax. A linear function on
 * a bounded polygon is largest at a vertex, and every vertex lies on
 *  (A) a line xf = x_j + d·p_a (an axle ahead of the gap at a station), or
 *  (B) the intersection of a line of an axle behind the gap with s = sMin or s = sMax.
 * On each line (A) the effect is a function of s alone, maximised exactly: for one axle
 * behind the gap it is that axle's weight times the largest ordinate over the interval its
 * position sweeps (an end of the interval or a station inside it); for several axles behind
 * the gap every s at which one of them meets a station is tried, with both bounds.
 * Every candidate (A) and (B) is evaluated, so the largest of them is the largest effect.
 * A vehicle without a variable spacing is the case of case (A) alone.
 *
 * Axles that do not contribute are neglected (Art. 3.6.1.3.1: "axles that do not contribute
 * to the extreme force effect under consideration shall be neglected"): each axle counts
 * W·max(0, ℓ). The positive part is again piecewise linear, with extra breakpoints where ℓ
 * crosses zero; those crossings join the stations in (A) and (B), and the largest positive
 * part over an interval is the positive part of the largest ordinate, so the argument above
 * holds unchanged. `countAdverse: true` counts every axle as it is instead.
 */
import type { Vehicle } from '../loads/vehicles.js';
import { PlacementError } from './rules.js';
import { bestTwoGroupsOnLine } from './twoGroups.js';

/** Width of the ramp to zero beyond a non-zero end ordinate, m. */
export const RAMP = 1e-6;

/** A line ready for the search: stations (with any end ramps), ordinates, and a fast locator. */
export interface StationLine {
  xs: Float64Array;
  values: Float64Array;
  /** The deck's length, m: legal vehicles have at least one axle in [xMin, xMax]. */
  xMin: number;
  xMax: number;
  /** Bucket index for O(1) location. */
  bucketStart: Int32Array;
  bucketOrigin: number;
  bucketWidth: number;
}

/**
 * Prepare a line from stations xs (m, strictly increasing) and ordinates, zero beyond
 * [xs[0], xs[n−1]] (the deck's length).
 */
export function stationLine(xs: ArrayLike<number>, values: ArrayLike<number>): StationLine {
  const n = xs.length;
  if (n < 2 || values.length !== n) throw new PlacementError([{ path: ['line'], message: 'a line needs at least two stations and one ordinate per station' }]);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(xs[i]) || !Number.isFinite(values[i])) throw new PlacementError([{ path: ['line', i], message: 'stations and ordinates must be finite' }]);
    if (i > 0 && !(xs[i] > xs[i - 1])) throw new PlacementError([{ path: ['line', 'xs', i], message: 'stations must increase strictly' }]);
  }
  const xMin = xs[0];
  const xMax = xs[n - 1];
  const rampL = values[0] !== 0;
  const rampR = values[n - 1] !== 0;
  const m = n + (rampL ? 1 : 0) + (rampR ? 1 : 0);
  const X = new Float64Array(m);
  const V = new Float64Array(m);
  let k = 0;
  if (rampL) {
    X[k] = xMin - RAMP;
    V[k++] = 0;
  }
  for (let i = 0; i < n; i++) {
    X[k] = xs[i];
    V[k++] = values[i];
  }
  if (rampR) {
    X[k] = xMax + RAMP;
    V[k++] = 0;
  }
  return withLocator(X, V, xMin, xMax);
}

/** Same stations, new ordinates (same ramps): for lines rebuilt many times on one grid. */
export function withLocator(X: Float64Array, V: Float64Array, xMin: number, xMax: number): StationLine {
  const m = X.length;
  let hMin = Infinity;
  for (let i = 1; i < m; i++) hMin = Math.min(hMin, X[i] - X[i - 1]);
  const span = X[m - 1] - X[0];
  const buckets = Math.max(1, Math.min(4 * m, Math.ceil(span / Math.max(hMin, span / (4 * m)))));
  const width = span / buckets;
  const start = new Int32Array(buckets + 1);
  let j = 0;
  for (let b = 0; b <= buckets; b++) {
    const x = X[0] + b * width;
    while (j < m - 2 && X[j + 1] <= x) j++;
    start[b] = j;
  }
  return { xs: X, values: V, xMin, xMax, bucketStart: start, bucketOrigin: X[0], bucketWidth: width };
}

/** Ordinate of a prepared line at x (m); zero beyond its stations. */
export function lineAt(line: StationLine, x: number): number {
  const X = line.xs;
  const m = X.length;
  if (x < X[0] || x > X[m - 1]) return 0;
  let b = Math.floor((x - line.bucketOrigin) / line.bucketWidth);
  if (b < 0) b = 0;
  else if (b >= line.bucketStart.length) b = line.bucketStart.length - 1;
  let j = line.bucketStart[b];
  while (j < m - 2 && X[j + 1] <= x) j++;
  while (j > 0 && X[j] > x) j--;
  const x0 = X[j];
  const h = X[j + 1] - x0;
  const t = (x - x0) / h;
  return line.values[j] + t * (line.values[j + 1] - line.values[j]);
}

/** Largest ordinate of a prepared line over [a, b] (m, a ≤ b). */
export function lineMaxOver(line: StationLine, a: number, b: number): number {
  let best = Math.max(lineAt(line, a), lineAt(line, b));
  const X = line.xs;
  const V = line.values;
  const m = X.length;
  if (b < X[0] || a > X[m - 1]) return best;
  // first station strictly greater than a
  let lo = 0;
  let hi = m;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (X[mid] <= a) lo = mid + 1;
    else hi = mid;
  }
  for (let j = lo; j < m && X[j] < b; j++) if (V[j] > best) best = V[j];
  return best;
}

/** A vehicle's geometry ready for the search. */
export interface VehicleShape {
  vehicle: Vehicle;
  weights: Float64Array;
  /** Positions behind the front axle with the variable spacing at sMin, m. */
  basePositions: Float64Array;
  /** First axle behind the variable gap, or the axle count when there is none. */
  gapIndex: number;
  sMin: number;
  sMax: number;
  /** Total weight, N. */
  totalWeight: number;
}

export function vehicleShape(vehicle: Vehicle): VehicleShape {
  const n = vehicle.axles.length;
  if (n < 1) throw new PlacementError([{ path: ['vehicle', 'axles'], message: 'a vehicle needs at least one axle' }]);
  const weights = new Float64Array(n);
  const pos = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = vehicle.axles[i];
    if (!(Number.isFinite(a.weight) && a.weight > 0)) throw new PlacementError([{ path: ['vehicle', 'axles', i, 'weight'], message: 'axle weights must be positive numbers of newtons' }]);
    if (!Number.isFinite(a.position) || (i > 0 && a.position < vehicle.axles[i - 1].position)) {
      throw new PlacementError([{ path: ['vehicle', 'axles', i, 'position'], message: 'axle positions must be finite and not decrease from front to rear' }]);
    }
    weights[i] = a.weight;
    pos[i] = a.position;
  }
  const vs = vehicle.variableSpacing;
  let gapIndex = n;
  let sMin = 0;
  let sMax = 0;
  if (vs) {
    if (!Number.isInteger(vs.axleIndex) || vs.axleIndex < 1 || vs.axleIndex >= n || !(vs.min > 0) || !(vs.max >= vs.min)) {
      throw new PlacementError([{ path: ['vehicle', 'variableSpacing'], message: 'the variable spacing needs an axle index from 1 to the last axle and 0 < min ≤ max' }]);
    }
    gapIndex = vs.axleIndex;
    sMin = vs.min;
    sMax = vs.max;
    const shift = sMin - (pos[gapIndex] - pos[gapIndex - 1]);
    for (let i = gapIndex; i < n; i++) pos[i] += shift;
  }
  let total = 0;
  for (let i = 0; i < n; i++) total += weights[i];
  return { vehicle, weights, basePositions: pos, gapIndex, sMin, sMax, totalWeight: total };
}

export interface LongitudinalPosition {
  /** x of the front axle, m. */
  frontAxleAt: number;
  direction: 1 | -1;
  /** The variable spacing, m (vehicles with one). */
  axleSpacing?: number;
}

export interface LineMaximum extends LongitudinalPosition {
  /** Largest Σ W·ordinate, response units. */
  value: number;
}

const TOL = 1e-9;

/** Stations and zero crossings of a line: the breakpoints of its positive part. */
export function breakpointsOf(line: StationLine, withCrossings: boolean): Float64Array {
  if (!withCrossings) return line.xs;
  const X = line.xs;
  const V = line.values;
  const out: number[] = [X[0]];
  for (let j = 1; j < X.length; j++) {
    const a = V[j - 1];
    const b = V[j];
    if ((a > 0 && b < 0) || (a < 0 && b > 0)) out.push(X[j - 1] + ((X[j] - X[j - 1]) * a) / (a - b));
    out.push(X[j]);
  }
  return Float64Array.from(out);
}

/**
 * The largest Σ W_a·max(0, ℓ(x_a)) (or Σ W_a·ℓ(x_a) with `countAdverse`) over every legal
 * position of the vehicle on the line: both directions of travel unless `directions` says
 * otherwise, variable spacing searched. Exact (see the header). Ties keep the first found.
 *
 * This is the plain form of the search, for any vehicle; `bestVehicleOnLine` evaluates the
 * same candidates by monotone sweeps for vehicles with at most one axle behind the gap.
 */
export function bestVehicleOnLineReference(
  line: StationLine,
  v: VehicleShape,
  directions: readonly (1 | -1)[] = [1, -1],
  options: { countAdverse?: boolean } = {},
): LineMaximum {
  const all = options.countAdverse === true;
  const val = all ? (x: number) => lineAt(line, x) : (x: number) => Math.max(0, lineAt(line, x));
  const X = breakpointsOf(line, !all);
  const m = X.length;
  const W = v.weights;
  const P = v.basePositions;
  const n = W.length;
  const g = v.gapIndex;
  const variable = g < n;
  const xMin = line.xMin - TOL;
  const xMax = line.xMax + TOL;
  /** Σ W·val for a position; −Infinity when no axle is on the deck. */
  const effectAt = (xf: number, d: number, s: number): number => {
    const ds = s - v.sMin;
    let sum = 0;
    let on = false;
    for (let a = 0; a < n; a++) {
      const x = xf - d * (P[a] + (a >= g ? ds : 0));
      if (x >= xMin && x <= xMax) on = true;
      sum += W[a] * val(x);
    }
    return on ? sum : -Infinity;
  };
  let best: LineMaximum = { value: -Infinity, frontAxleAt: NaN, direction: 1 };
  const consider = (value: number, xf: number, d: 1 | -1, s: number) => {
    if (value > best.value) best = variable ? { value, frontAxleAt: xf, direction: d, axleSpacing: s } : { value, frontAxleAt: xf, direction: d };
  };
  const singleBehind = variable && n - g === 1;
  for (const d of directions) {
    // (A) an axle ahead of the gap (every axle when there is none) at a breakpoint.
    for (let a = 0; a < g; a++) {
      for (let j = 0; j < m; j++) {
        const xf = X[j] + d * P[a];
        if (!variable) {
          consider(effectAt(xf, d, 0), xf, d, 0);
          continue;
        }
        if (singleBehind) {
          let ahead = 0;
          let on = false;
          for (let b = 0; b < g; b++) {
            const x = xf - d * P[b];
            if (x >= xMin && x <= xMax) on = true;
            ahead += W[b] * val(x);
          }
          // The rear axle sweeps [xf − d·(P + sMax − sMin), xf − d·P]; its best ordinate:
          const x1 = xf - d * P[g];
          const x2 = xf - d * (P[g] + v.sMax - v.sMin);
          const sBest = bestSpacingSingle(line, Math.min(x1, x2), Math.max(x1, x2), x1, d, v, !all);
          const xr = xf - d * (P[g] + sBest - v.sMin);
          const rearOn = xr >= xMin && xr <= xMax;
          consider(on || rearOn ? ahead + W[g] * val(xr) : -Infinity, xf, d, sBest);
        } else {
          for (const s of spacingCandidates(X, v, xf, d)) consider(effectAt(xf, d, s), xf, d, s);
        }
      }
    }
    // (B) an axle behind the gap at a breakpoint, with the spacing at a bound.
    if (variable) {
      for (let a = g; a < n; a++) {
        for (const s of [v.sMin, v.sMax]) {
          for (let j = 0; j < m; j++) {
            const xf = X[j] + d * (P[a] + s - v.sMin);
            consider(effectAt(xf, d, s), xf, d, s);
          }
        }
      }
    }
  }
  if (!Number.isFinite(best.value)) {
    throw new PlacementError([{ path: ['line'], message: 'no legal position of the vehicle was found on the line' }]);
  }
  return best;
}

/** For one axle behind the gap: the spacing (m) at which it sits on the best ordinate of [lo, hi] (positive part when `positive`). */
function bestSpacingSingle(line: StationLine, lo: number, hi: number, xAtMin: number, d: number, v: VehicleShape, positive: boolean): number {
  const X = line.xs;
  const V = line.values;
  let bestX = lo;
  let bestV = lineAt(line, lo);
  const vh = lineAt(line, hi);
  if (vh > bestV) {
    bestV = vh;
    bestX = hi;
  }
  const m = X.length;
  if (!(hi < X[0] || lo > X[m - 1])) {
    let a = 0;
    let b = m;
    while (a < b) {
      const mid = (a + b) >> 1;
      if (X[mid] <= lo) a = mid + 1;
      else b = mid;
    }
    for (let j = a; j < m && X[j] < hi; j++) {
      if (V[j] > bestV) {
        bestV = V[j];
        bestX = X[j];
      }
    }
  }
  // With the positive part, a non-positive best means any position is as good: keep the first.
  if (positive && bestV <= 0) bestX = lo;
  // position x = xAtMin − d·(s − sMin)  ⇒  s = sMin + d·(xAtMin − x)
  const s = v.sMin + d * (xAtMin - bestX);
  return Math.min(v.sMax, Math.max(v.sMin, s));
}

/** Spacings to try when several axles ride behind the gap: both bounds and each axle at each breakpoint. */
function spacingCandidates(X: Float64Array, v: VehicleShape, xf: number, d: number): number[] {
  const out = [v.sMin, v.sMax];
  for (let a = v.gapIndex; a < v.weights.length; a++) {
    const xAtMin = xf - d * v.basePositions[a];
    for (let j = 0; j < X.length; j++) {
      const s = v.sMin + d * (xAtMin - X[j]);
      if (s > v.sMin && s < v.sMax) out.push(s);
    }
  }
  return out;
}

/** Scratch arrays for `bestVehicleOnLine`, reused between calls (grown as needed). */
export interface LineWorkspace {
  capacity: number;
  X: Float64Array;
  acc: Float64Array;
  tmp: Float64Array;
  argX: Float64Array;
  deque: Int32Array;
  /** Sweeps of the current call by their shift (sweepOnce), `shifts.length` of them in use. */
  sweeps: Float64Array[];
  shifts: number[];
}

export function lineWorkspace(capacity = 64): LineWorkspace {
  return {
    capacity,
    X: new Float64Array(capacity),
    acc: new Float64Array(capacity),
    tmp: new Float64Array(capacity),
    argX: new Float64Array(capacity),
    deque: new Int32Array(capacity),
    sweeps: [],
    shifts: [],
  };
}

/**
 * `sweep` of the line at X[j] + c, computed once per shift c within one call of
 * bestVehicleOnLine (the truck's axle pairs repeat shifts: 0 for every axle on its own
 * breakpoint, ±(P_a − P_b) for a pair either way); the array returned is read only.
 */
function sweepOnce(xs: Float64Array, vs: Float64Array, X: Float64Array, m: number, c: number, positive: boolean, w: LineWorkspace): Float64Array {
  const k = w.shifts.indexOf(c);
  if (k >= 0) return w.sweeps[k];
  const n = w.shifts.length;
  if (w.sweeps.length <= n || w.sweeps[n].length < m) w.sweeps[n] = new Float64Array(w.capacity);
  w.shifts.push(c);
  sweep(xs, vs, X, m, c, positive, w.sweeps[n]);
  return w.sweeps[n];
}

/**
 * Breakpoints into w.X; returns their count. With `positiveOnly`: the stations and zero
 * crossings that touch an interval where the line is positive (the breakpoints of its
 * positive part that are not inside a flat stretch of zero); else every station.
 */
function breakpointsInto(line: StationLine, positiveOnly: boolean, w: LineWorkspace): number {
  const X = line.xs;
  const V = line.values;
  const n = X.length;
  const need = positiveOnly ? 2 * n : n;
  if (w.capacity < need) Object.assign(w, lineWorkspace(2 * need));
  const out = w.X;
  let m = 0;
  if (!positiveOnly) {
    for (let j = 0; j < n; j++) out[m++] = X[j];
    return m;
  }
  for (let j = 0; j < n; j++) {
    if (j > 0) {
      const a = V[j - 1];
      const b = V[j];
      if ((a > 0 && b < 0) || (a < 0 && b > 0)) out[m++] = X[j - 1] + ((X[j] - X[j - 1]) * a) / (a - b);
    }
    const left = j > 0 && (V[j - 1] > 0 || V[j] > 0);
    const right = j < n - 1 && (V[j + 1] > 0 || V[j] > 0);
    if (V[j] > 0 || left || right) out[m++] = X[j];
  }
  return m;
}

/**
 * PL values of the line at X[j] + c for every j (X increasing), by one forward sweep;
 * zero beyond the stations; the positive part when `positive`.
 */
function sweep(xs: Float64Array, vs: Float64Array, X: Float64Array, m: number, c: number, positive: boolean, out: Float64Array): void {
  const n = xs.length;
  const x0 = xs[0];
  const xn = xs[n - 1];
  let k = 0;
  for (let j = 0; j < m; j++) {
    const x = X[j] + c;
    if (x < x0 || x > xn) {
      out[j] = 0;
      continue;
    }
    while (k < n - 2 && xs[k + 1] <= x) k++;
    const t = (x - xs[k]) / (xs[k + 1] - xs[k]);
    const v = vs[k] + t * (vs[k + 1] - vs[k]);
    out[j] = positive && v < 0 ? 0 : v;
  }
}

/**
 * The largest Σ W_a·max(0, ℓ(x_a)) (or Σ W_a·ℓ(x_a) with `countAdverse`) over every legal
 * position of the vehicle: exact, the same candidates as `bestVehicleOnLineReference`
 * (header, cases A and B), less those with the axle on a breakpoint inside a flat stretch
 * where max(0, ℓ) is zero: from such a vertex the axle can slide, with the effect linear in
 * the slide, to another vertex without loss (the legal-domain boundary "an axle on the deck"
 * is not active when the effect is positive, since a contributing axle is on the deck). For a candidate family "axle a at breakpoint j" the other axles
 * sit at X[j] + constant, so their ordinates come from forward sweeps, and the rear axle's
 * best ordinate over the interval its spacing sweeps comes from a sliding-window maximum
 * over the stations. Vehicles with several axles behind the gap (two rigid groups) use
 * twoGroups.ts, or the plain form when adverse axles are counted.
 */
export function bestVehicleOnLine(
  line: StationLine,
  v: VehicleShape,
  directions: readonly (1 | -1)[] = [1, -1],
  options: { countAdverse?: boolean } = {},
  work: LineWorkspace = lineWorkspace(),
): LineMaximum {
  const n = v.weights.length;
  const g = v.gapIndex;
  const variable = g < n;
  const positive = options.countAdverse !== true;
  // several axles behind the gap (two trucks): two rigid groups, exact by twoGroups.ts
  if (variable && n - g !== 1) return positive ? bestTwoGroupsOnLine(line, v, directions) : bestVehicleOnLineReference(line, v, directions, options);
  const xs = line.xs;
  const vs = line.values;
  const ns = xs.length;
  const m = breakpointsInto(line, positive, work);
  if (work.capacity < ns) Object.assign(work, lineWorkspace(2 * ns));
  if (m === 0) {
    // nothing positive anywhere: every legal position gives 0; the front axle at the deck's start is one
    const d0 = directions[0];
    const xf = d0 === 1 ? line.xMin : line.xMax;
    return variable ? { value: 0, frontAxleAt: xf, direction: d0, axleSpacing: v.sMin } : { value: 0, frontAxleAt: xf, direction: d0 };
  }
  work.shifts.length = 0;
  const { X, acc, tmp, argX, deque } = work;
  const W = v.weights;
  const P = v.basePositions;
  const lo = line.xMin - TOL;
  const hi = line.xMax + TOL;
  let bestV = -Infinity;
  let bestXf = NaN;
  let bestD: 1 | -1 = 1;
  let bestS = v.sMin;
  const onDeckAny = (xf: number, d: number, s: number): boolean => {
    const ds = s - v.sMin;
    for (let a = 0; a < n; a++) {
      const x = xf - d * (P[a] + (a >= g ? ds : 0));
      if (x >= lo && x <= hi) return true;
    }
    return false;
  };
  const ahead = variable ? g : n;
  for (const d of directions) {
    // (A) axle a (ahead of the gap, or any axle) at breakpoint j.
    for (let a = 0; a < ahead; a++) {
      for (let j = 0; j < m; j++) acc[j] = 0;
      for (let b = 0; b < ahead; b++) {
        const t = sweepOnce(xs, vs, X, m, d * (P[a] - P[b]), positive, work);
        const w = W[b];
        for (let j = 0; j < m; j++) acc[j] += w * t[j];
      }
      if (variable) {
        // rear axle r = g: at spacing s its x is X[j] + c0 − d·(s − sMin)
        const c0 = d * (P[a] - P[g]);
        const c1 = c0 - d * (v.sMax - v.sMin);
        const cl = Math.min(c0, c1);
        const ch = Math.max(c0, c1);
        const fLo = sweepOnce(xs, vs, X, m, cl, positive, work);
        const fHi = sweepOnce(xs, vs, X, m, ch, positive, work);
        // sliding maximum of station ordinates strictly inside (X[j] + cl, X[j] + ch)
        let head = 0;
        let tail = 0;
        let enter = 0;
        for (let j = 0; j < m; j++) {
          const wl = X[j] + cl;
          const wh = X[j] + ch;
          while (enter < ns && xs[enter] < wh) {
            const val = positive && vs[enter] < 0 ? 0 : vs[enter];
            while (tail > head && (positive && vs[deque[tail - 1]] < 0 ? 0 : vs[deque[tail - 1]]) <= val) tail--;
            deque[tail++] = enter;
            enter++;
          }
          while (tail > head && xs[deque[head]] <= wl) head++;
          let best = fLo[j];
          let bx = wl;
          if (fHi[j] > best) {
            best = fHi[j];
            bx = wh;
          }
          if (tail > head) {
            const k = deque[head];
            const val = positive && vs[k] < 0 ? 0 : vs[k];
            if (val > best) {
              best = val;
              bx = xs[k];
            }
          }
          tmp[j] = best;
          argX[j] = bx;
        }
        const wr = W[g];
        for (let j = 0; j < m; j++) {
          const total = acc[j] + wr * tmp[j];
          if (!(total > bestV)) continue;
          const xf = X[j] + d * P[a];
          // position at sMin is X[j] + c0; x = X[j] + c0 − d·(s − sMin)
          let s = v.sMin + d * (X[j] + c0 - argX[j]);
          s = s < v.sMin ? v.sMin : s > v.sMax ? v.sMax : s;
          if (positive && tmp[j] <= 0) s = v.sMin;
          if (!(X[j] >= lo && X[j] <= hi) && !onDeckAny(xf, d, s)) continue;
          bestV = total;
          bestXf = xf;
          bestD = d;
          bestS = s;
        }
      } else {
        for (let j = 0; j < m; j++) {
          if (!(acc[j] > bestV)) continue;
          const xf = X[j] + d * P[a];
          if (!(X[j] >= lo && X[j] <= hi) && !onDeckAny(xf, d, 0)) continue;
          bestV = acc[j];
          bestXf = xf;
          bestD = d;
        }
      }
    }
    // (B) the rear axle at breakpoint j with the spacing at a bound.
    if (variable) {
      for (const s of [v.sMin, v.sMax]) {
        const own = sweepOnce(xs, vs, X, m, 0, positive, work);
        const wr = W[g];
        for (let j = 0; j < m; j++) acc[j] = wr * own[j];
        for (let b = 0; b < g; b++) {
          const t = sweepOnce(xs, vs, X, m, d * (P[g] + s - v.sMin - P[b]), positive, work);
          const w = W[b];
          for (let j = 0; j < m; j++) acc[j] += w * t[j];
        }
        for (let j = 0; j < m; j++) {
          if (!(acc[j] > bestV)) continue;
          const xf = X[j] + d * (P[g] + s - v.sMin);
          if (!(X[j] >= lo && X[j] <= hi) && !onDeckAny(xf, d, s)) continue;
          bestV = acc[j];
          bestXf = xf;
          bestD = d;
          bestS = s;
        }
      }
    }
  }
  if (!Number.isFinite(bestV)) {
    throw new PlacementError([{ path: ['line'], message: 'no legal position of the vehicle was found on the line' }]);
  }
  return variable ? { value: bestV, frontAxleAt: bestXf, direction: bestD, axleSpacing: bestS } : { value: bestV, frontAxleAt: bestXf, direction: bestD };
}
