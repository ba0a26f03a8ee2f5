/**
 * The governing placement: the legal placement of 1..NL loaded lanes, their wheel lines and
 * (on a surface) their vehicles that gives the extreme effect of a response, times the
 * multiple presence factor m (AASHTO LRFD Art. 3.6.1.3.1, Table 3.6.1.1.2-1). It serves the
 * lever rule and the rigid-section method (transverse lines) and the grillage (surfaces).
 *
 * Units: as evaluate.ts. Transverse lines give a factor in lanes; surfaces give the response
 * in its unit (N·m, N). `sense: 'negative'` seeks the most negative effect.
 *
 * ─── Tolerance statement ──────────────────────────────────────────────────────────────
 * Transverse lines (piecewise linear): EXACT (up to floating-point rounding and the 1 nm
 * tolerance on the rules). Surfaces: EXACT for the sampled representation (bilinear on the
 * station grid, see sampledSurface.ts). Against the surface itself no legal placement with k
 * lanes exceeds the one found by more than m·k·ΣW·ε + (V_sample − V_surface) at the placement
 * found (at most 2·m·k·ΣW·ε), ε the largest difference between surface and sample (zero when
 * the surface is bilinear on the grid), plus the ramp allowance of longitudinal.ts (ΣW·|end
 * ordinate| over 1 µm, negligible). When the sample carries a measured error envelope E(x)
 * (sampledSurface.ts) and that bound exceeds `tightenAbove` of the effect, it is tightened by
 * a second exact search on the sample raised by E: every axle's share on the surface is at
 * most its share on the raised sample (in the sense sought, and so is its positive part), so
 * that search's optimum bounds every legal placement on the surface. When the sample carries
 * per-cell measurements (`cells`), the raised sample is built cell by cell (`raisedRows`):
 * each cell raises its own corners, by its error or to its largest ordinate, so a jump along
 * a skewed line raises only the cells it crosses, not whole columns. ε and E are measured at
 * the midpoints of the grid's cells and edges (a bound for a surface smooth between stations;
 * a jump the grid does not follow shows up as a large ε and a loose bound, which is why a
 * shear's surface is sampled in the frame of its skewed support line, where the jump is a
 * grid line). `tolerance.absolute` reports the bound.
 *
 * A sheared sample (s = x − c·y, sampledSurface.ts) is searched in its frame: the lane's line
 * is V(s) = ½(η(s, u) + η(s − c·G, u + G)) on the union of both wheel lines' stations (the
 * right wheel of an axle stands c·G behind the left one in s), the proof below holds with x
 * read as s (moving a vehicle along (c, 1) keeps every wheel's s, so step 1 is unchanged),
 * and a position found is returned in plan (front axle at s + c·u).
 *
 * ─── Proof ────────────────────────────────────────────────────────────────────────────
 * Notation: lane i has left edge p_i ∈ [L0, R0] (L0 the left curb face, R0 the right curb
 * face minus the lane width w), p_{i+1} ≥ p_i + w; its left wheel line is at u_i ∈ [p_i + a(p_i),
 * p_i + b(p_i)], a = 2 ft, b = w − 2 ft − gauge (the deck-overhang option widens the range of
 * a lane whose edge is a curb face, see rules.ts). Let H(u) be the largest effect of one
 * lane's vehicle with its left wheel line at u (for a line: ½(r(u) + r(u+gauge)); for a
 * surface: the best longitudinal position, spacing and direction, found exactly by
 * longitudinal.ts, each axle counting only when it contributes, Art. 3.6.1.3.1). The effect
 * of k lanes is m(k)·Σ H(u_i), and for a lane at p the best wheel line gives
 * g(p) = max{H(u) : u ∈ [p + a(p), p + b(p)]}.
 *
 * 1. H is convex between consecutive points of T = Y ∪ (Y − gauge), Y the transverse
 *    stations. For a fixed longitudinal position, each axle's share ½W(η(x,u) + η(x,u+gauge))
 *    is linear in u between points of T (the representation is linear in y between stations),
 *    so its positive part (a neglected axle counts zero) is convex there, and so is their sum;
 *    H is the largest of such functions, hence convex on each piece. (Lines: H itself is linear
 *    on each piece.) H is also continuous (each function is Lipschitz in u with one bound).
 * 2. So the largest H over an interval is at its ends or at a point of T inside it, and
 *    g(p) = max(H(p+a), H(p+b), max H over T ∩ [p+a, p+b]) is computed exactly from H at
 *    finitely many points (`exactLane`).
 * 3. Some optimal set of k lanes has every lane at a point of
 *      S = {c + j·w : c ∈ {t − a, t − b : t ∈ T} ∪ {L0, R0}, |j| < k} ∩ [L0, R0].
 *    Take an optimal set (it exists: g is upper semicontinuous on a compact set) and split it
 *    into blocks of lanes that touch (p_{i+1} = p_i + w). Call a block anchored if it touches a
 *    curb (a lane at L0 or R0) or has a lane with p + a or p + b in T. Shift an unanchored
 *    block rigidly by τ: until the next event (a lane's p + a or p + b meets T, or the block
 *    meets a neighbour or a curb) every lane's window keeps the same points of T inside and
 *    its ends stay inside pieces of T, so by 1. each g(p + τ) is convex in τ, and so is their
 *    sum; a convex function on an interval is largest at an end, so the block can be moved to
 *    an event without loss. Each move anchors the block or merges it with another, so after
 *    finitely many moves every block is anchored, and every lane sits at its anchor ± j·w.
 * 4. Dynamic programming over the sorted S (best set of k lanes ending at each candidate,
 *    from the best set of k − 1 lanes ending at least w to its left) gives the best set of
 *    lanes on S, which by 3. is the best set overall; × m(k), and the largest over k.
 * 5. Laziness keeps it fast without changing the result: the DP first uses for each
 *    candidate an upper bound of g (H at the points of T replaced by a cheap bound — every
 *    axle at the line's largest ordinate — until needed, and H at the ends of a window by the
 *    chord of those values, which bounds a convex function from above), then evaluates g
 *    exactly for the lanes of the current best set and repeats; a window's end is evaluated
 *    only when its chord exceeds the best value already known for the lane. When the best set
 *    uses exact values only, every other set's bound-valued total is at least its true total,
 *    so the set is optimal.
 * Surfaces: the representation differs from the surface by at most ε at every point, so each
 * placement's effect differs by at most m·k·ΣW·ε: the best legal placement on the surface is
 * at most the sample's optimum V_s + m·k·ΣW·ε, and the placement found (whose sample value is
 * V_s) has the true value V_t, so no legal placement beats it by more than
 * V_s − V_t + m·k·ΣW·ε ≤ 2·m·k·ΣW·ε.
 */
import type { Vehicle } from '../loads/vehicles.js';
import { evaluateSurface, evaluateTransverse, type PlacementEffect, type Sense } from './evaluate.js';
import { RAMP, bestVehicleOnLine, lineWorkspace, vehicleShape, withLocator, type LongitudinalPosition, type StationLine, type VehicleShape } from './longitudinal.js';
import {
  PlacementError,
  RULE_TOLERANCE,
  checkPlacement,
  laneLeftMax,
  laneLeftMin,
  wheelOffsetRange,
  type LanePlacement,
  type Placement,
  type PlacementRules,
} from './rules.js';
import { cellIndex, raisedRows, type SampledSurface, type SurfaceLike } from './sampledSurface.js';
import { transverseAt, type TransverseLine } from './transverseLines.js';
import { laneStripTable, type LaneLoad, type LaneStripTable } from './laneStrip.js';
import { DESIGN_LANE_LOAD } from '../loads/vehicles.js';
import { factorText } from '../lrfd/words.js';

export interface ToleranceStatement {
  /** 'exact': transverse line; 'sampled': exact on the sampled surface, bounded against the surface. */
  kind: 'exact' | 'sampled';
  /** No legal placement exceeds the reported effect by more than this (response units; 0 for exact). */
  absolute: number;
  /** ε: representation error of the sampled surface (response per N), when sampled. */
  representationError?: number;
  /** Plain statement. */
  text: string;
}

/**
 * The bound a refined factor aims for: no legal placement exceeds the factor by more than
 * BOUND_TARGET_LANES lanes AND by more than BOUND_TARGET_PERCENT % of the factor (common
 * practice, no source: well below the rounding of a reported factor to two decimals).
 */
export const BOUND_TARGET_LANES = 0.005;
export const BOUND_TARGET_PERCENT = 0.5;

/** Whether a bound restated in lanes and percent (boundInLanes) meets both targets. */
export function meetsBoundTarget(bound: { lanes: number; percent: number }): boolean {
  return bound.lanes <= BOUND_TARGET_LANES && bound.percent <= BOUND_TARGET_PERCENT;
}

/** A ratio as a percentage an engineer reads: 0.012 → "1.2 %", below 0.01 % "< 0.01 %". */
function percent(ratio: number): string {
  if (!Number.isFinite(ratio)) return 'an unknown part';
  const p = ratio * 100;
  return p < 0.01 ? '< 0.01 %' : `${p < 1 ? p.toFixed(2) : p.toFixed(1)} %`;
}

/**
 * The bound of a governing placement restated for a distribution factor g = E / E_1: in lanes
 * (absolute / |E_1|) and as a percentage of g, so a reader never meets the response's internal
 * unit. `beamLineEffect` is E_1 (same unit as the effect), `factor` the reported g.
 * `meetsTarget`: within BOUND_TARGET_LANES lanes and BOUND_TARGET_PERCENT % of g (the text
 * then says so when it is not).
 */
export function boundInLanes(tolerance: ToleranceStatement, beamLineEffect: number, factor: number): { lanes: number; percent: number; meetsTarget: boolean; text: string } {
  const lanes = tolerance.absolute / Math.abs(beamLineEffect);
  const share = factor !== 0 ? lanes / Math.abs(factor) : lanes === 0 ? 0 : Infinity;
  const lanesText = lanes === 0 ? '0' : lanes < 1e-4 ? '< 0.0001' : lanes.toFixed(4);
  const text =
    tolerance.kind === 'exact' || tolerance.absolute === 0
      ? `no legal placement exceeds this factor (${tolerance.text})`
      : `no legal placement exceeds this factor by more than ${lanesText} lanes (${percent(share)} of ${factorText(factor)}); ${tolerance.text}`;
  const meetsTarget = meetsBoundTarget({ lanes, percent: share * 100 });
  const miss = meetsTarget ? '' : `; this bound misses the target (${BOUND_TARGET_LANES} lanes and ${BOUND_TARGET_PERCENT} % of the value), so the factor must not back a reduction claim`;
  return { lanes, percent: share * 100, meetsTarget, text: text + miss };
}

export interface LaneCountResult {
  loadedLanes: number;
  multiplePresence: number;
  /** The effect with its sign, m included (lanes for lines, response units for surfaces). */
  value: number;
  placement: Placement;
  /** The placement evaluated (on the surface itself for surfaces). */
  effect: PlacementEffect;
}

export interface GoverningPlacement extends LaneCountResult {
  sense: Sense;
  /** Best result for each number of loaded lanes searched, in the order asked. */
  byLaneCount: LaneCountResult[];
  tolerance: ToleranceStatement;
  /** Work done, for the benchmark: exact lane evaluations and evaluations of H. */
  work: { candidates: number; exactLanes: number; wheelLineEvaluations: number; passes: number };
}

export interface SearchOptions {
  /** 'positive' (default): largest effect; 'negative': most negative effect. */
  sense?: Sense;
  /** Numbers of loaded lanes to search (default 1..NL). */
  laneCounts?: number[];
  /** Apply the multiple presence factor (default true; false for fatigue). */
  multiplePresence?: boolean;
}

interface LaneObjective<D> {
  /** Points T between which H is convex. */
  breakpoints: ArrayLike<number>;
  /** Exact H(u) (to be maximised) and what achieves it. */
  evaluate(u: number): { value: number; detail: D };
  /** A cheap upper bound of H(u) (optional; H is then evaluated at a point of T only when needed). */
  bound?(u: number): number;
}

interface LaneChoice<D> {
  left: number;
  wheel: number;
  detail: D;
  /** H at the wheel line: the lane's value on the sample, maximised sense. */
  value: number;
}

interface LaneSetResult<D> {
  k: number;
  total: number;
  lanes: LaneChoice<D>[];
}

function laneCountsFor(rules: PlacementRules, counts: number[] | undefined): number[] {
  const list = counts ?? Array.from({ length: rules.laneCount }, (_, i) => i + 1);
  if (!list.length) throw new PlacementError([{ path: ['laneCounts'], message: 'give at least one number of loaded lanes' }]);
  list.forEach((k, i) => {
    if (!Number.isInteger(k) || k < 1 || k > rules.laneCount) {
      throw new PlacementError([{ path: ['laneCounts', i], message: `the number of loaded lanes must be a whole number from 1 to ${rules.laneCount}; got ${k}` }]);
    }
  });
  return list;
}

/** Steps 2–5 of the proof. */
function searchLaneSets<D>(rules: PlacementRules, objective: LaneObjective<D>, laneCounts: number[]) {
  const lw = rules.laneWidth;
  const L0 = laneLeftMin(rules);
  const R0 = laneLeftMax(rules);
  const a = rules.wheelToLaneEdge;
  const b = lw - a - rules.gauge;
  const tol = RULE_TOLERANCE;
  const uLo = L0 + wheelOffsetRange(rules, L0).min;
  const uHi = R0 + wheelOffsetRange(rules, R0).max;

  // T within reach, plus the ends of the reach.
  const tList: number[] = [uLo, uHi];
  for (let i = 0; i < objective.breakpoints.length; i++) {
    const t = objective.breakpoints[i];
    if (t > uLo && t < uHi) tList.push(t);
  }
  tList.sort((x, y) => x - y);
  const T: number[] = [];
  for (const t of tList) if (!T.length || t - T[T.length - 1] > 1e-12) T.push(t);

  let wheelLineEvaluations = 0;
  const cache = new Map<number, { value: number; detail: D }>();
  const H = (u: number) => {
    let r = cache.get(u);
    if (!r) {
      r = objective.evaluate(u);
      wheelLineEvaluations++;
      cache.set(u, r);
    }
    return r;
  };
  // H at the points of T: an upper bound first (objective.bound), made exact when needed.
  const HT = new Float64Array(T.length);
  const HTexact = new Uint8Array(T.length);
  for (let j = 0; j < T.length; j++) {
    if (objective.bound) HT[j] = objective.bound(T[j]);
    else {
      HT[j] = H(T[j]).value;
      HTexact[j] = 1;
    }
  }
  const exactT = (j: number) => {
    if (!HTexact[j]) {
      HT[j] = H(T[j]).value;
      HTexact[j] = 1;
    }
  };

  // Chord upper bound of H at u (convex between points of T; HT bounds H at those points).
  const chord = (u: number): number => {
    if (u <= T[0]) return HT[0];
    if (u >= T[T.length - 1]) return HT[T.length - 1];
    let lo = 0;
    let hi = T.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (T[mid] <= u) lo = mid;
      else hi = mid;
    }
    const t = (u - T[lo]) / (T[hi] - T[lo]);
    return HT[lo] + t * (HT[hi] - HT[lo]);
  };
  const firstAtLeast = (u: number): number => {
    let lo = 0;
    let hi = T.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (T[mid] < u) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };

  // Candidate lane edges S (step 3).
  const K = Math.max(...laneCounts);
  const base: number[] = [L0, R0];
  for (const t of T) base.push(t - a, t - b);
  const sList: number[] = [];
  for (const c of base) {
    for (let j = -(K - 1); j <= K - 1; j++) {
      const p = c + j * lw;
      if (p >= L0 - tol && p <= R0 + tol) sList.push(Math.min(R0, Math.max(L0, p)));
    }
  }
  sList.sort((x, y) => x - y);
  const S: number[] = [];
  for (const p of sList) if (!S.length || p - S[S.length - 1] > 1e-10) S.push(p);
  const M = S.length;

  // Windows and bounds (step 5).
  const alpha = new Float64Array(M);
  const beta = new Float64Array(M);
  const tFirst = new Int32Array(M);
  const tEnd = new Int32Array(M);
  const val = new Float64Array(M);
  const exact = new Uint8Array(M);
  const bestWheel = new Float64Array(M);
  for (let i = 0; i < M; i++) {
    const r = wheelOffsetRange(rules, S[i]);
    alpha[i] = S[i] + r.min;
    beta[i] = S[i] + r.max;
    tFirst[i] = firstAtLeast(alpha[i] - 1e-12);
    let j = tFirst[i];
    while (j < T.length && T[j] <= beta[i] + 1e-12) j++;
    tEnd[i] = j;
  }
  const boundLane = (i: number) => {
    let best = Math.max(chord(alpha[i]), chord(beta[i]));
    for (let j = tFirst[i]; j < tEnd[i]; j++) if (HT[j] > best) best = HT[j];
    val[i] = best;
  };
  for (let i = 0; i < M; i++) boundLane(i);
  let exactLanes = 0;
  const exactLane = (i: number) => {
    let best = -Infinity;
    let u = NaN;
    for (let j = tFirst[i]; j < tEnd[i]; j++) {
      exactT(j);
      if (HT[j] > best) {
        best = HT[j];
        u = T[j];
      }
    }
    // An end whose chord bound cannot beat what is known needs no evaluation (H ≤ chord).
    if (!Number.isFinite(best) || chord(alpha[i]) > best) {
      const ha = H(alpha[i]).value;
      if (ha > best || !Number.isFinite(best)) {
        best = ha;
        u = alpha[i];
      }
    }
    if (chord(beta[i]) > best) {
      const hb = H(beta[i]).value;
      if (hb > best) {
        best = hb;
        u = beta[i];
      }
    }
    val[i] = best;
    bestWheel[i] = Math.min(beta[i], Math.max(alpha[i], u));
    exact[i] = 1;
    exactLanes++;
  };

  // Last candidate at least one lane width to the left of each candidate.
  const prevIdx = new Int32Array(M);
  {
    let j = -1;
    for (let i = 0; i < M; i++) {
      while (j + 1 < M && S[j + 1] <= S[i] - lw + 1e-9) j++;
      prevIdx[i] = j;
    }
  }
  const dp: Float64Array[] = [];
  const from: Int32Array[] = [];
  const runDp = () => {
    dp.length = 0;
    from.length = 0;
    dp.push(Float64Array.from(val));
    from.push(new Int32Array(M).fill(-1));
    for (let k = 2; k <= K; k++) {
      const prev = dp[k - 2];
      const pm = new Float64Array(M);
      const pmArg = new Int32Array(M);
      let m = -Infinity;
      let arg = -1;
      for (let j = 0; j < M; j++) {
        if (prev[j] > m) {
          m = prev[j];
          arg = j;
        }
        pm[j] = m;
        pmArg[j] = arg;
      }
      const cur = new Float64Array(M);
      const fr = new Int32Array(M);
      for (let i = 0; i < M; i++) {
        const j = prevIdx[i];
        if (j < 0 || !Number.isFinite(pm[j])) {
          cur[i] = -Infinity;
          fr[i] = -1;
        } else {
          cur[i] = val[i] + pm[j];
          fr[i] = pmArg[j];
        }
      }
      dp.push(cur);
      from.push(fr);
    }
  };
  const reconstruct = (k: number): { total: number; idx: number[] } => {
    const row = dp[k - 1];
    let best = -Infinity;
    let at = -1;
    for (let i = 0; i < M; i++) {
      if (row[i] > best) {
        best = row[i];
        at = i;
      }
    }
    const idx: number[] = [];
    let kk = k;
    while (at >= 0 && kk >= 1) {
      idx.push(at);
      at = from[kk - 1][at];
      kk--;
    }
    return { total: best, idx: idx.reverse() };
  };

  const done = new Map<number, { total: number; idx: number[] }>();
  let passes = 0;
  while (done.size < new Set(laneCounts).size) {
    passes++;
    runDp();
    const refine: number[] = [];
    for (const k of laneCounts) {
      if (done.has(k)) continue;
      const r = reconstruct(k);
      if (r.idx.length !== k || !Number.isFinite(r.total)) {
        throw new PlacementError([{ path: ['laneCounts'], message: `${k} lanes do not fit on the roadway` }]);
      }
      const open = r.idx.filter((i) => !exact[i]);
      if (open.length === 0) done.set(k, r);
      else refine.push(...open);
    }
    for (const i of new Set(refine)) exactLane(i);
    // Points of T made exact tighten the bounds of the other lanes.
    for (let i = 0; i < M; i++) if (!exact[i]) boundLane(i);
  }
  const results: LaneSetResult<D>[] = laneCounts.map((k) => {
    const r = done.get(k)!;
    return {
      k,
      total: r.total,
      lanes: r.idx.map((i) => ({ left: S[i], wheel: bestWheel[i], detail: H(bestWheel[i]).detail, value: val[i] })),
    };
  });
  return { results, work: { candidates: M, exactLanes, wheelLineEvaluations, passes } };
}

function toLane(rules: PlacementRules, c: { left: number; wheel: number }): LanePlacement {
  const r = wheelOffsetRange(rules, c.left);
  const offset = Math.min(r.max, Math.max(r.min, c.wheel - c.left));
  return { left: c.left, wheelOffset: offset };
}

function pickGoverning(sense: Sense, list: LaneCountResult[]): LaneCountResult {
  const sgn = sense === 'positive' ? 1 : -1;
  let best = list[0];
  for (const r of list) if (sgn * r.value > sgn * best.value) best = r;
  return best;
}

/**
 * Governing placement on a transverse line (lever rule, rigid section): exact.
 * The line must cover the roadway (curb face to curb face).
 */
export function governingTransversePlacement(line: TransverseLine, rules: PlacementRules, options: SearchOptions = {}): GoverningPlacement {
  const sense = options.sense ?? 'positive';
  const sgn = sense === 'positive' ? 1 : -1;
  const counts = laneCountsFor(rules, options.laneCounts);
  if (line.ys[0] > rules.curbLeft + RULE_TOLERANCE || line.ys[line.ys.length - 1] < rules.curbRight - RULE_TOLERANCE) {
    throw new PlacementError([{ path: ['line'], message: 'the transverse line must cover the roadway from curb face to curb face' }]);
  }
  const G = rules.gauge;
  const bp: number[] = [];
  for (const y of line.ys) bp.push(y, y - G);
  const objective: LaneObjective<null> = {
    breakpoints: bp,
    evaluate: (u) => ({ value: sgn * 0.5 * (transverseAt(line, u) + transverseAt(line, u + G)), detail: null }),
  };
  const { results, work } = searchLaneSets(rules, objective, counts);
  const byLaneCount = results.map((r): LaneCountResult => {
    const placement: Placement = { lanes: r.lanes.map((c) => toLane(rules, c)) };
    const effect = evaluateTransverse(line, placement, rules, { multiplePresence: options.multiplePresence });
    return { loadedLanes: r.k, multiplePresence: effect.multiplePresence, value: effect.value, placement, effect };
  });
  const g = pickGoverning(sense, byLaneCount);
  return {
    ...g,
    sense,
    byLaneCount,
    tolerance: { kind: 'exact', absolute: 0, text: 'exact: the transverse line is piecewise linear and every breakpoint was checked' },
    work,
  };
}

export interface SurfaceSearchOptions extends SearchOptions {
  /** Evaluate the result on this surface (default: the surface that was sampled). */
  source?: SurfaceLike;
  /** Directions of travel to search (default both). */
  directions?: (1 | -1)[];
  /**
   * When the sample carries an error envelope and the plain bound 2·m·k·ΣW·ε exceeds this
   * fraction of the effect, search the sample raised by the envelope as well, for a tighter
   * bound (default 0.005).
   */
  tightenAbove?: number;
  /**
   * Add the design lane load in every loaded lane (laneStrip.ts: 0.64 klf over 10 ft unless
   * given, centred on the lane's vehicle, on the lengths that add to the effect). The search
   * stays exact for the lane load interpolated between knots; the bound adds m·k times the
   * interpolation's measured deviation and the load's share of the sample's error ε.
   */
  laneLoad?: LaneLoad;
}

/** The reach of a vehicle's left wheel line across the roadway (the ends of T, search.ts step 2). */
function wheelReach(rules: PlacementRules): { uLo: number; uHi: number } {
  const L0 = laneLeftMin(rules);
  const R0 = laneLeftMax(rules);
  return { uLo: L0 + wheelOffsetRange(rules, L0).min, uHi: R0 + wheelOffsetRange(rules, R0).max };
}

/**
 * The stations of one lane's line V(s) = ½(η(s, u) + η(s − c·G, u + G)) in the sample's
 * frame (s the left wheel's frame coordinate, c the shear, G the gauge): each wheel line's
 * stations with a ramp to zero RAMP beyond its ends (longitudinal.ts), the right one's shifted
 * by c·G, merged (points closer than 1e-10 m are one). For each merged station, the cell and
 * weight of each wheel line's interpolation (cell −1: beyond that line, zero). With c = 0 the
 * two coincide and the line is the stations with their ramps.
 */
function laneLineStations(xs: Float64Array, shift: number) {
  const nx = xs.length;
  const own = new Float64Array(nx + 2);
  own[0] = xs[0] - RAMP;
  own.set(xs, 1);
  own[nx + 1] = xs[nx - 1] + RAMP;
  let X: Float64Array;
  if (shift === 0) X = own;
  else {
    const all = Array.from(own);
    for (const x of own) all.push(x + shift);
    all.sort((a, b) => a - b);
    const out: number[] = [];
    for (const x of all) if (!out.length || x - out[out.length - 1] > 1e-10) out.push(x);
    X = Float64Array.from(out);
  }
  /** The cell of xs holding x and its weight; cell −1 beyond the stations (the ramps and past them). */
  const locate = (x: number): [number, number] => {
    if (x <= xs[0] || x >= xs[nx - 1]) {
      if (x === xs[0]) return [0, 0];
      if (x === xs[nx - 1]) return [nx - 2, 1];
      return [-1, 0];
    }
    const i = cellIndex(xs, x);
    return [i, (x - xs[i]) / (xs[i + 1] - xs[i])];
  };
  const m = X.length;
  const leftCell = new Int32Array(m);
  const leftT = new Float64Array(m);
  const rightCell = new Int32Array(m);
  const rightT = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    [leftCell[k], leftT[k]] = locate(X[k]);
    [rightCell[k], rightT[k]] = locate(X[k] - shift);
  }
  return { X, leftCell, leftT, rightCell, rightT };
}

/** Steps 1–5 on a sample: the best lane sets per lane count, totals in the maximised sense (m not applied). */
function searchSample(
  xs: Float64Array,
  ys: Float64Array,
  rows: Float64Array[],
  extent: { xMin: number; xMax: number },
  rules: PlacementRules,
  shape: VehicleShape,
  sgn: number,
  counts: number[],
  directions: (1 | -1)[],
  lane: LaneStripTable | null = null,
  shear = 0,
) {
  const G = rules.gauge;
  const st = laneLineStations(xs, shear * G);
  const m = st.X.length;
  const template: StationLine = withLocator(st.X, new Float64Array(m), extent.xMin, extent.xMax);
  const V = new Float64Array(m);
  const line: StationLine = { ...template, values: V };
  const workspace = lineWorkspace(2 * m);
  const h = 0.5 * sgn;
  const weights = (y: number): [number, number, number] => {
    const j = cellIndex(ys, y);
    const t = (y - ys[j]) / (ys[j + 1] - ys[j]);
    return [j, 1 - t, t];
  };
  const { leftCell, leftT, rightCell, rightT } = st;
  /**
   * V ← sense × ½(η(s, u) + η(s − c·G, u + G)) at the line's stations; the line's deck, where
   * an axle counts as on it (rules.ts: the extent's x-range in plan), in the frame at u.
   */
  let filledAt = NaN;
  const fill = (u: number) => {
    // the bound and then the exact value are often asked at the same u
    if (u === filledAt) return;
    filledAt = u;
    line.xMin = extent.xMin - shear * u;
    line.xMax = extent.xMax - shear * u;
    const [j1, a1, b1] = weights(u);
    const [j2, a2, b2] = weights(u + G);
    const r1 = rows[j1];
    const s1 = rows[j1 + 1];
    const r2 = rows[j2];
    const s2 = rows[j2 + 1];
    for (let k = 0; k < m; k++) {
      let v = 0;
      let i = leftCell[k];
      if (i >= 0) {
        const t = leftT[k];
        v += a1 * (r1[i] + t * (r1[i + 1] - r1[i])) + b1 * (s1[i] + t * (s1[i + 1] - s1[i]));
      }
      i = rightCell[k];
      if (i >= 0) {
        const t = rightT[k];
        v += a2 * (r2[i] + t * (r2[i + 1] - r2[i])) + b2 * (s2[i] + t * (s2[i + 1] - s2[i]));
      }
      V[k] = h * v;
    }
  };
  const bp: number[] = [];
  for (const y of ys) bp.push(y, y - G);
  // the lane load interpolated between its knots is linear there: H stays convex between the union
  if (lane) for (const u of lane.knots) bp.push(u);
  const laneAt = lane ? lane.at : () => 0;
  const objective: LaneObjective<LongitudinalPosition> = {
    breakpoints: bp,
    evaluate: (u) => {
      fill(u);
      const best = bestVehicleOnLine(line, shape, directions, {}, workspace);
      // back to plan: the front axle's left wheel stands at s + c·u
      const detail: LongitudinalPosition = { frontAxleAt: best.frontAxleAt + shear * u, direction: best.direction };
      if (best.axleSpacing !== undefined) detail.axleSpacing = best.axleSpacing;
      return { value: best.value + laneAt(u), detail };
    },
    // Every axle at the line's largest (positive) ordinate: an upper bound of H(u).
    bound: (u) => {
      fill(u);
      let mx = 0;
      for (let k = 0; k < m; k++) if (V[k] > mx) mx = V[k];
      return shape.totalWeight * mx + laneAt(u);
    },
  };
  return searchLaneSets(rules, objective, counts);
}

/**
 * An axle the search puts exactly on a station can land a rounding error to the wrong side of
 * a jump of the surface (a deck end, a shear's support) when its x is recomputed from the
 * front axle. Keep the lane's best of its front-axle position moved by 0, ±1 nm and ±0.1 µm.
 */
function nudged(source: SurfaceLike, lane: LanePlacement, rules: PlacementRules, vehicle: Vehicle, sense: Sense, sampleValue: number): LanePlacement {
  const sgn = sense === 'positive' ? 1 : -1;
  const here = sgn * evaluateSurface(source, { lanes: [lane] }, rules, vehicle, { multiplePresence: false, sense, check: false }).value;
  // Within rounding of the sample's value (or above it): nothing to mend.
  if (here >= sampleValue - 1e-9 * Math.abs(sampleValue)) return lane;
  let best = lane;
  let bestV = here;
  for (const d of [1e-9, -1e-9, 1e-7, -1e-7]) {
    const trial = { ...lane, frontAxleAt: (lane.frontAxleAt as number) + d };
    if (checkPlacement({ lanes: [trial] }, rules, { vehicle, extent: source.extent }).length) continue;
    const v = sgn * evaluateSurface(source, { lanes: [trial] }, rules, vehicle, { multiplePresence: false, sense, check: false }).value;
    if (v > bestV) {
      bestV = v;
      best = trial;
    }
  }
  return best;
}

/** Lane-load tables per sampled surface (laneStrip.ts), kept while the surface lives. */
const laneTables = new WeakMap<SampledSurface, Map<string, LaneStripTable>>();

/** Adds each lane's lane-load effect (signed, response units) to an evaluated placement, m included. */
function withLaneLoad(effect: PlacementEffect, laneValues: number[]): void {
  let sum = 0;
  effect.lanes.forEach((l, i) => {
    l.laneLoadValue = laneValues[i];
    sum += laneValues[i];
  });
  effect.value += effect.multiplePresence * sum;
}

/**
 * Governing placement of `vehicle` in 1..NL lanes on a sampled influence surface: exact on the
 * sample, within `tolerance.absolute` of the best legal placement on the surface itself.
 */
export function governingSurfacePlacement(
  surface: SampledSurface,
  rules: PlacementRules,
  vehicle: Vehicle,
  options: SurfaceSearchOptions = {},
): GoverningPlacement {
  const sense = options.sense ?? 'positive';
  const sgn = sense === 'positive' ? 1 : -1;
  const counts = laneCountsFor(rules, options.laneCounts);
  const { xs, ys, rows } = surface;
  if (ys[0] > rules.curbLeft + RULE_TOLERANCE || ys[ys.length - 1] < rules.curbRight - RULE_TOLERANCE) {
    throw new PlacementError([{ path: ['surface', 'extent'], message: 'the influence surface must cover the roadway from curb face to curb face' }]);
  }
  const shape = vehicleShape(vehicle);
  const directions = options.directions ?? [1, -1];
  const reach = wheelReach(rules);
  /** The lane load's table on the sample (or its raised form), shared by every vehicle searched on this surface. */
  const laneOf = (r: ArrayLike<number>[], raised: boolean) => {
    const load = options.laneLoad;
    if (!load) return null;
    const key = `${raised}|${sgn}|${load.intensity ?? ''}|${load.width ?? ''}|${rules.gauge}|${reach.uLo}|${reach.uHi}`;
    let tables = laneTables.get(surface);
    if (!tables) laneTables.set(surface, (tables = new Map()));
    let t = tables.get(key);
    if (!t) tables.set(key, (t = laneStripTable(xs, ys, r, sgn, rules.gauge, reach.uLo, reach.uHi, load)));
    return t;
  };
  const lane = laneOf(rows, false);
  const { results, work } = searchSample(xs, ys, rows, surface.extent, rules, shape, sgn, counts, directions, lane, surface.shear);
  const source = options.source ?? surface.source;
  const eps = surface.representationError;
  const byLaneCount = results.map((r): LaneCountResult => {
    // the vehicle's share is mended and evaluated on the surface itself, the lane load's on the sample (exact there)
    const placement: Placement = { lanes: r.lanes.map((c) => nudged(source, { ...toLane(rules, c), ...c.detail }, rules, vehicle, sense, c.value - (lane ? lane.at(c.wheel) : 0))) };
    const effect = evaluateSurface(source, placement, rules, vehicle, { multiplePresence: options.multiplePresence, sense });
    if (lane) withLaneLoad(effect, r.lanes.map((c) => sgn * lane.exact(c.wheel)));
    return { loadedLanes: r.k, multiplePresence: effect.multiplePresence, value: effect.value, placement, effect };
  });
  const g = pickGoverning(sense, byLaneCount);
  // Per lane count: what a legal placement on the surface could add beyond the one found. No
  // placement exceeds the sample's optimum on the surface by more than m·k·ΣW·ε, and the
  // sample's optimum exceeds the found placement's true value by what was just measured.
  // With the lane load, each lane adds its interpolation's deviation and q·(length sampled)·ε
  // (the strip integral of an error of at most ε per unit area, over its width, times q/width).
  const laneExtra = lane ? lane.deviation + (options.laneLoad?.intensity ?? DESIGN_LANE_LOAD) * (xs[xs.length - 1] - xs[0]) * eps : 0;
  const gaps = byLaneCount.map((r, i) => Math.max(0, r.multiplePresence * results[i].total - sgn * r.value) + r.multiplePresence * r.loadedLanes * (shape.totalWeight * eps + laneExtra));
  let method = 'plain';
  const env = surface.errorEnvelope;
  if (env && eps > 0 && Math.max(...gaps) > (options.tightenAbove ?? 0.005) * Math.abs(g.value)) {
    // Search the sample raised by the envelope: an upper bound of every placement on the surface.
    const raised = raisedRows(surface, sgn) ?? rows.map((row) => row.map((v, i) => v + sgn * env[i]));
    const raisedLane = laneOf(raised, true);
    const upper = searchSample(xs, ys, raised, surface.extent, rules, shape, sgn, counts, directions, raisedLane, surface.shear);
    work.wheelLineEvaluations += upper.work.wheelLineEvaluations;
    work.exactLanes += upper.work.exactLanes;
    upper.results.forEach((u, i) => {
      const r = byLaneCount[i];
      const gap = Math.max(0, r.multiplePresence * (u.total + r.loadedLanes * (raisedLane ? raisedLane.deviation : 0)) - sgn * r.value);
      if (gap < gaps[i]) {
        gaps[i] = gap;
        method = 'raised';
      }
    });
  }
  let top = -Infinity;
  byLaneCount.forEach((r, i) => (top = Math.max(top, sgn * r.value + gaps[i])));
  const bound = Math.max(0, top - sgn * g.value);
  const text =
    eps === 0
      ? surface.representationMeasured
        ? 'exact: the surface equals its sampled representation at every point checked (bilinear on the station grid)'
        : 'exact for the sampled representation (bilinear on the station grid); the representation error was not measured'
      : method === 'raised'
        ? 'exact for the sampled representation; bounded against the surface by a search of the sample raised by its measured error envelope'
        : `exact for the sampled representation; bounded against the surface by m·k·ΣW·ε plus the sample's excess at the placement found (ε, measured at cell and edge midpoints, is ${percent(eps / surface.maxOrdinate)} of the largest ordinate)`;
  const laneText = lane ? `; the lane load (Art. 3.6.1.2.4) centred on each vehicle, interpolated across the deck between knots ${lane.knots.length > 1 ? 'at most 1 ft apart' : ''} (its largest measured deviation is in the bound)` : '';
  return {
    ...g,
    sense,
    byLaneCount,
    tolerance: { kind: 'sampled', absolute: bound, representationError: eps, text: text + laneText },
    work,
  };
}
