/**
 * The effect of one placement: the fast path for dragging.
 *
 * Units: internal SI. Transverse lines: ordinates are a girder's share of a unit load, and
 * the effect is in design lanes (a distribution factor): m × Σ_lanes ½·(r(y_left) + r(y_right)),
 * each lane carrying one vehicle of unit weight on two wheel lines. Surfaces: ordinates are
 * response per unit downward force (m for a moment, dimensionless for a shear or reaction)
 * and the effect is in the response's unit (N·m or N): m × Σ_lanes Σ_axles ½·W_a·(η(x_a, y_left)
 * + η(x_a, y_right)), plus, when asked for, the design lane load of each lane. No dynamic load
 * allowance is applied here.
 *
 * Axles that do not contribute to the extreme effect of the chosen sense are neglected
 * (Art. 3.6.1.3.1): an axle counts ½·W_a·(η_left + η_right) only when that has the sign of
 * `sense` (default 'positive'); `countAdverseAxles: true` counts every axle.
 *
 * Multiple presence factor m (Table 3.6.1.1.2-1) for the number of loaded lanes, unless
 * `multiplePresence: false` (fatigue: Art. 3.6.1.4.3b removes it).
 *
 * Lane load (Art. 3.6.1.2.4): w = 0.64 klf spread uniformly over a 10 ft strip, here centred
 * on the lane's vehicle (so it lies in the lane for every legal wheel offset), applied only
 * over the lengths where it adds to the effect of the chosen sense (Art. 3.6.1.3.1). Across the
 * strip the surface is integrated exactly at its transverse stations when it is sampled,
 * else by Simpson's rule with 4 intervals; along the deck, at the sampled surface's stations
 * (exact for it) or at 100 equal intervals (trapezoids), with the sign changes of the strip
 * integral located exactly.
 */
import { multiplePresenceFactor } from '../lrfd/lanes.js';
import type { Vehicle } from '../loads/vehicles.js';
import { DESIGN_LANE_LOAD, LANE_LOAD_WIDTH } from '../loads/vehicles.js';
import {
  assertPlacement,
  axleStations,
  wheelLines,
  type Placement,
  type PlacementRules,
} from './rules.js';
import type { SampledSurface, SurfaceLike } from './sampledSurface.js';
import { transverseAt, type TransverseLine } from './transverseLines.js';

export type Sense = 'positive' | 'negative';

export interface LaneEffect {
  /** 0-based lane index in the placement. */
  lane: number;
  /** Lane edges, m. */
  left: number;
  right: number;
  /** y of the left and right wheel lines, m. */
  wheelLines: [number, number];
  /** Surfaces: axle positions (m), weights (N), contribution before m (response units), and whether it counts. */
  axles?: { x: number; weight: number; contribution: number; counted: boolean }[];
  /** This lane's vehicle effect before m. */
  vehicleValue: number;
  /** This lane's lane-load effect before m (0 when not asked for). */
  laneLoadValue: number;
}

export interface PlacementEffect {
  /** m × Σ lane effects: lanes (transverse lines) or the response's unit (surfaces). */
  value: number;
  loadedLanes: number;
  multiplePresence: number;
  lanes: LaneEffect[];
}

export interface EvaluateOptions {
  /** Apply the multiple presence factor (default true). */
  multiplePresence?: boolean;
  /** Check the placement against the rules first (default true; throws PlacementError). */
  check?: boolean;
}

function presence(k: number, on: boolean | undefined): number {
  return on === false ? 1 : multiplePresenceFactor(k);
}

/**
 * Effect of a placement on a transverse line (lever rule, rigid section): a distribution
 * factor in lanes. Longitudinal values in the placement are ignored.
 */
export function evaluateTransverse(line: TransverseLine, placement: Placement, rules: PlacementRules, options: EvaluateOptions = {}): PlacementEffect {
  if (options.check !== false) assertPlacement(placement, rules);
  const k = placement.lanes.length;
  const m = presence(k, options.multiplePresence);
  let sum = 0;
  const lanes: LaneEffect[] = placement.lanes.map((l, i) => {
    const w = wheelLines(rules, l);
    const v = 0.5 * (transverseAt(line, w[0]) + transverseAt(line, w[1]));
    sum += v;
    return { lane: i, left: l.left, right: l.left + rules.laneWidth, wheelLines: w, vehicleValue: v, laneLoadValue: 0 };
  });
  return { value: m * sum, loadedLanes: k, multiplePresence: m, lanes };
}

export interface SurfaceEvaluateOptions extends EvaluateOptions {
  /** The sense of the extreme sought (default 'positive'): decides which axles are neglected and which lengths the lane load covers. */
  sense?: Sense;
  /** Count every axle, contributing or not (default false: Art. 3.6.1.3.1 neglects the others). */
  countAdverseAxles?: boolean;
  /** Add the design lane load in each lane, over the lengths that add to `sense`. */
  laneLoad?: { intensity?: number /* N/m, default 0.64 klf */; width?: number /* m, default 10 ft */ };
}

/**
 * Effect of a placement on an influence surface (or a sampled surface), response units.
 * Every lane needs frontAxleAt, direction and (for a variable spacing) axleSpacing.
 */
export function evaluateSurface(
  surface: SurfaceLike,
  placement: Placement,
  rules: PlacementRules,
  vehicle: Vehicle,
  options: SurfaceEvaluateOptions = {},
): PlacementEffect {
  if (options.check !== false) assertPlacement(placement, rules, { vehicle, extent: surface.extent });
  const k = placement.lanes.length;
  const m = presence(k, options.multiplePresence);
  const sense = options.sense ?? 'positive';
  const sgn = sense === 'positive' ? 1 : -1;
  let sum = 0;
  const lanes: LaneEffect[] = placement.lanes.map((l, i) => {
    const w = wheelLines(rules, l);
    const xs = axleStations(vehicle, l as Required<typeof l>);
    let v = 0;
    const axles = xs.map((x, a) => {
      const W = vehicle.axles[a].weight;
      const c = 0.5 * W * (surface.at(x, w[0]) + surface.at(x, w[1]));
      const counted = options.countAdverseAxles === true || sgn * c > 0;
      if (counted) v += c;
      return { x, weight: W, contribution: c, counted };
    });
    let lane = 0;
    if (options.laneLoad) lane = laneLoadEffect(surface, (w[0] + w[1]) / 2, { ...options.laneLoad, sense });
    sum += v + lane;
    return { lane: i, left: l.left, right: l.left + rules.laneWidth, wheelLines: w, axles, vehicleValue: v, laneLoadValue: lane };
  });
  return { value: m * sum, loadedLanes: k, multiplePresence: m, lanes };
}

function isSampled(s: SurfaceLike): s is SampledSurface {
  return (s as SampledSurface).rows !== undefined && (s as SampledSurface).xs instanceof Float64Array;
}

/**
 * Lane-load effect of one strip centred at y = centre (m), response units: ∫ q·η over the
 * strip, only over the lengths where the strip integral has the sign of `sense`.
 */
export function laneLoadEffect(surface: SurfaceLike, centre: number, load: { sense: Sense; intensity?: number; width?: number }): number {
  const width = load.width ?? LANE_LOAD_WIDTH;
  const q = (load.intensity ?? DESIGN_LANE_LOAD) / width; // N/m²
  const y0 = centre - width / 2;
  const y1 = centre + width / 2;
  const sgn = load.sense === 'positive' ? 1 : -1;
  let xs: ArrayLike<number>;
  let stripAt: (x: number) => number;
  if (isSampled(surface)) {
    xs = surface.xs;
    const ys = surface.ys;
    // Breakpoints in y inside the strip: trapezoid on them is exact for a bilinear surface.
    const yb: number[] = [y0];
    for (let j = 0; j < ys.length; j++) if (ys[j] > y0 && ys[j] < y1) yb.push(ys[j]);
    yb.push(y1);
    stripAt = (x: number) => {
      let s = 0;
      let prev = surface.at(x, yb[0]);
      for (let j = 1; j < yb.length; j++) {
        const cur = surface.at(x, yb[j]);
        s += 0.5 * (prev + cur) * (yb[j] - yb[j - 1]);
        prev = cur;
      }
      return s;
    };
  } else {
    const e = surface.extent;
    const n = 100;
    const arr = new Float64Array(n + 1);
    for (let i = 0; i <= n; i++) arr[i] = e.xMin + ((e.xMax - e.xMin) * i) / n;
    xs = arr;
    const ny = 4;
    stripAt = (x: number) => {
      const h = (y1 - y0) / ny;
      let s = surface.at(x, y0) + surface.at(x, y1);
      for (let j = 1; j < ny; j++) s += (j % 2 ? 4 : 2) * surface.at(x, y0 + j * h);
      return (s * h) / 3;
    };
  }
  // ∫ max(0, sgn·f) dx of the piecewise-linear f through the stations, then back to the sign.
  let total = 0;
  let xPrev = xs[0];
  let fPrev = sgn * stripAt(xPrev);
  for (let i = 1; i < xs.length; i++) {
    const x = xs[i];
    const f = sgn * stripAt(x);
    const h = x - xPrev;
    if (fPrev >= 0 && f >= 0) total += 0.5 * (fPrev + f) * h;
    else if (fPrev > 0 || f > 0) {
      const pos = Math.max(fPrev, f);
      const neg = Math.min(fPrev, f);
      total += (0.5 * pos * pos * h) / (pos - neg);
    }
    xPrev = x;
    fPrev = f;
  }
  return sgn * q * total;
}
