/**
 * The governing position along a line of a vehicle whose axles form two rigid groups with a
 * variable gap between them — several axles behind the gap, such as the two design trucks of
 * AASHTO LRFD Art. 3.6.1.3.1 (14 ft rear spacings, at least 50 ft from the rear axle of one to
 * the lead axle of the other): exact, for the effect with the axles that do not contribute
 * neglected (each axle counts W·max(0, ℓ), Art. 3.6.1.3.1).
 *
 * Units: as longitudinal.ts (x in m, ordinates per N, weights in N, the effect in response
 * units).
 *
 * Why it is exact. Fix the direction d. With xf the front axle's x and t = s − sMin ∈ [0, T]
 * (T = sMax − sMin), the front group gives A(xf) = Σ_{a<g} W_a·ℓ⁺(xf − d·p_a) and the rear
 * group, whose first axle stands at z = xf − d·(p_g + t), gives B(z) = Σ_{a≥g} W_a·ℓ⁺(z −
 * d·(p_a − p_g)), ℓ⁺ = max(0, ℓ). So the best over the gap is
 *     F(xf) = A(xf) + max{ B(z) : z ∈ [xf + c_lo, xf + c_hi] },
 * (d = +1: c_lo = −p_g − T, c_hi = −p_g; d = −1: c_lo = p_g, c_hi = p_g + T). A and B are
 * piecewise linear; their breakpoints are the line's stations and zero crossings shifted by
 * the axle offsets. Between two consecutive points of
 *     C = bp(A) ∪ (bp(B) − c_lo) ∪ (bp(B) − c_hi)
 * A is linear, each end of the window stays inside one linear piece of B (so B there is
 * linear in xf) and the breakpoints of B inside the window do not change (so their largest
 * value is a constant): F is the largest of linear functions plus a linear one, convex, and
 * its largest value on the piece is at an end. Beyond the outermost points of C, F is linear
 * and falls to zero. So the largest F is at a point of C, and the window's largest B is at an
 * end or at a breakpoint of B inside it. Each point of C is evaluated: the ordinates by
 * forward sweeps over the sorted candidates, the window's largest breakpoint value by a
 * sliding-window maximum (a monotone deque), so the work is O((|C| + stations) per sweep).
 * The position found with a positive effect has a contributing axle, which is on the deck;
 * when nothing is positive the effect is 0 at a legal position (the front axle at a deck end).
 */
// a cycle with longitudinal.ts (which dispatches here): only functions cross it, called after both load
import { breakpointsOf, type LineMaximum, type StationLine, type VehicleShape } from './longitudinal.js';

/** out[j] = Σ_k W_k·ℓ⁺(P[j] + offsets[k]) for increasing P. */
function groupAt(line: StationLine, P: Float64Array, weights: number[], offsets: number[], out: Float64Array): void {
  out.fill(0);
  const xs = line.xs;
  const vs = line.values;
  const n = xs.length;
  const x0 = xs[0];
  const xn = xs[n - 1];
  for (let k = 0; k < weights.length; k++) {
    const w = weights[k];
    const c = offsets[k];
    let i = 0;
    for (let j = 0; j < P.length; j++) {
      const x = P[j] + c;
      if (x < x0 || x > xn) continue;
      while (i < n - 2 && xs[i + 1] <= x) i++;
      const v = vs[i] + ((x - xs[i]) / (xs[i + 1] - xs[i])) * (vs[i + 1] - vs[i]);
      if (v > 0) out[j] += w * v;
    }
  }
}

/** The union of two increasing arrays, increasing, without repeats within 1e-12 m. */
function union(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length);
  let i = 0;
  let j = 0;
  let k = 0;
  while (i < a.length || j < b.length) {
    const x = j >= b.length || (i < a.length && a[i] <= b[j]) ? a[i++] : b[j++];
    if (k === 0 || x - out[k - 1] > 1e-12) out[k++] = x;
  }
  return out.subarray(0, k);
}

/** The union of `base + shift` over the shifts (base increasing). */
function shiftedUnion(base: Float64Array, shifts: number[]): Float64Array {
  let out: Float64Array = new Float64Array(0);
  for (const c of shifts) out = union(out, base.map((x) => x + c));
  return out;
}

/**
 * The largest Σ W_a·max(0, ℓ(x_a)) over every legal position of a vehicle with a variable
 * gap before axle `v.gapIndex` (any number of axles behind it), both directions unless told.
 */
export function bestTwoGroupsOnLine(line: StationLine, v: VehicleShape, directions: readonly (1 | -1)[] = [1, -1]): LineMaximum {
  const n = v.weights.length;
  const g = v.gapIndex;
  const P = v.basePositions;
  const T = v.sMax - v.sMin;
  const bp = breakpointsOf(line, true);
  let best: LineMaximum = { value: 0, frontAxleAt: directions[0] === 1 ? line.xMin : line.xMax, direction: directions[0], axleSpacing: v.sMin };
  for (const d of directions) {
    const frontW: number[] = [];
    const frontOff: number[] = [];
    for (let a = 0; a < g; a++) {
      frontW.push(v.weights[a]);
      frontOff.push(-d * P[a]);
    }
    const rearW: number[] = [];
    const rearOff: number[] = [];
    for (let a = g; a < n; a++) {
      rearW.push(v.weights[a]);
      rearOff.push(-d * (P[a] - P[g]));
    }
    const cLo = d === 1 ? -P[g] - T : P[g];
    const cHi = d === 1 ? -P[g] : P[g] + T;
    // breakpoints of B (in z), then the candidates: those of A (in xf) and B's seen from each window end
    const Z = shiftedUnion(bp, rearOff.map((o) => -o));
    const C = union(shiftedUnion(bp, frontOff.map((o) => -o)), shiftedUnion(Z, [-cLo, -cHi]));
    const A = new Float64Array(C.length);
    const lo = new Float64Array(C.length);
    const hi = new Float64Array(C.length);
    const BZ = new Float64Array(Z.length);
    groupAt(line, C, frontW, frontOff, A);
    const shifted = new Float64Array(C.length);
    for (let j = 0; j < C.length; j++) shifted[j] = C[j] + cLo;
    groupAt(line, shifted, rearW, rearOff, lo);
    for (let j = 0; j < C.length; j++) shifted[j] = C[j] + cHi;
    groupAt(line, shifted, rearW, rearOff, hi);
    groupAt(line, Z, rearW, rearOff, BZ);
    // sliding maximum of B over the breakpoints strictly inside (xf + cLo, xf + cHi)
    const deque = new Int32Array(Z.length);
    let head = 0;
    let tail = 0;
    let enter = 0;
    for (let j = 0; j < C.length; j++) {
      const wl = C[j] + cLo;
      const wh = C[j] + cHi;
      while (enter < Z.length && Z[enter] < wh) {
        while (tail > head && BZ[deque[tail - 1]] <= BZ[enter]) tail--;
        deque[tail++] = enter++;
      }
      while (tail > head && Z[deque[head]] <= wl) head++;
      let rear = lo[j];
      let z = wl;
      if (hi[j] > rear) {
        rear = hi[j];
        z = wh;
      }
      if (tail > head && BZ[deque[head]] > rear) {
        rear = BZ[deque[head]];
        z = Z[deque[head]];
      }
      const value = A[j] + rear;
      if (value > best.value) {
        // z = xf − d·(p_g + t)
        const t = Math.min(T, Math.max(0, d === 1 ? C[j] - P[g] - z : z - C[j] - P[g]));
        best = { value, frontAxleAt: C[j], direction: d, axleSpacing: v.sMin + t };
      }
    }
  }
  return best;
}
