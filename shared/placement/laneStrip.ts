/**
 * The design lane load of one lane on a sampled influence surface, as a function of where the
 * lane's vehicle stands across the deck, tabulated for the exact placement search (search.ts).
 *
 * The load: q = 0.64 klf spread uniformly over a 10 ft width (AASHTO LRFD Art. 3.6.1.2.4),
 * centred on the lane's vehicle (on the middle of its two wheel lines, as evaluate.ts places
 * it), and put only on the lengths where it adds to the effect sought (Art. 3.6.1.3.1: "each
 * portion loaded"). For a vehicle whose left wheel line is at u the strip is centred at
 * c = u + gauge/2 and its effect on the sample is
 *     Λ(u) = (q / width) · ∫ max(0, σ·S(x, c)) dx,   S(x, c) = ∫_{c−width/2}^{c+width/2} η(x, y) dy,
 * σ = +1 for the largest effect, −1 for the most negative, η the sampled surface (bilinear on
 * its station grid: S is exact per station, the x integral is the trapezoid with the zero
 * crossings of σ·S found exactly, as evaluate.ts `laneLoadEffect` does).
 *
 * The search needs the lane's value convex between known points of u (search.ts, step 1).
 * Λ is not (S is quadratic in c between the points where a strip edge meets a station), so the
 * search uses Λ̃, the piecewise-linear interpolant of Λ on knots every KNOT_STEP across the
 * reach and where a strip edge meets a station; the vehicle's part stays convex between its
 * own breakpoints and Λ̃ is linear between knots, so their sum is convex between the union and
 * the search stays exact for it. How far Λ̃ is from Λ is measured at the midpoint of every
 * knot interval (`deviation`: for a quadratic piece the midpoint is where a chord is farthest
 * from it; with the positive part the measure is an estimate, as the sample's own ε is), and
 * the search adds m·k·deviation to its bound.
 *
 * On a sample in a sheared frame (sampledSurface.ts) x reads s = x − c·y: the loaded portions
 * then end on lines of the frame's skew (for a shear or a reaction, parallel to its support
 * line, so a loaded span ends on its support lines), not at right angles to the girders.
 *
 * Units: y, u, c and x in m; q in N/m; the surface in response per N; Λ in response units,
 * in the sense sought (never negative).
 */
import { DESIGN_LANE_LOAD, LANE_LOAD_WIDTH } from '../loads/vehicles.js';
import { fromUs } from '../units.js';
import { cellIndex } from './sampledSurface.js';

/** Spacing of the interpolation knots of Λ̃ across the roadway, 1 ft. */
export const KNOT_STEP = fromUs.ft(1);

export interface LaneLoad {
  /** N/m (default 0.64 klf). */
  intensity?: number;
  /** m (default 10 ft). */
  width?: number;
}

export interface LaneStripTable {
  /** Knots in u (the vehicle's left wheel line), increasing. */
  knots: Float64Array;
  /** Λ at the knots. */
  values: Float64Array;
  /** Largest |Λ − Λ̃| found at the midpoints of the knot intervals. */
  deviation: number;
  /** Λ̃ at u (linear between knots; the end values beyond them). */
  at(u: number): number;
  /** Λ at u itself (on the sample), for a placement found. */
  exact(u: number): number;
}

/**
 * Tabulates Λ for a vehicle of `gauge` whose left wheel line ranges over [uLo, uHi], on the
 * sample (xs × ys, rows[j][i] the ordinate at xs[i], ys[j]) in the sense `sgn`.
 */
export function laneStripTable(xs: Float64Array, ys: Float64Array, rows: ArrayLike<number>[], sgn: number, gauge: number, uLo: number, uHi: number, load: LaneLoad = {}): LaneStripTable {
  const width = load.width ?? LANE_LOAD_WIDTH;
  const q = (load.intensity ?? DESIGN_LANE_LOAD) / width;
  const nx = xs.length;
  const ny = ys.length;
  // Running integral of η in y at each station: F[i·ny + j] = ∫_{ys[0]}^{ys[j]} η(xs[i], y) dy.
  const F = new Float64Array(nx * ny);
  for (let i = 0; i < nx; i++) {
    let acc = 0;
    F[i * ny] = 0;
    for (let j = 1; j < ny; j++) {
      acc += 0.5 * (rows[j - 1][i] + rows[j][i]) * (ys[j] - ys[j - 1]);
      F[i * ny + j] = acc;
    }
  }
  /** ∫_{ys[0]}^{y} η(xs[i], ·) (η taken as 0 outside the grid, as the sample does). */
  const running = (i: number, y: number, j: number): number => {
    if (y <= ys[0]) return 0;
    if (y >= ys[ny - 1]) return F[i * ny + ny - 1];
    const h = ys[j + 1] - ys[j];
    const t = y - ys[j];
    const f0 = rows[j][i];
    const f1 = rows[j + 1][i];
    return F[i * ny + j] + f0 * t + (0.5 * (f1 - f0) * t * t) / h;
  };
  const exact = (u: number): number => {
    const c = u + gauge / 2;
    const y0 = c - width / 2;
    const y1 = c + width / 2;
    const j0 = cellIndex(ys, y0);
    const j1 = cellIndex(ys, y1);
    let total = 0;
    let fPrev = sgn * (running(0, y1, j1) - running(0, y0, j0));
    for (let i = 1; i < nx; i++) {
      const f = sgn * (running(i, y1, j1) - running(i, y0, j0));
      const h = xs[i] - xs[i - 1];
      if (fPrev >= 0 && f >= 0) total += 0.5 * (fPrev + f) * h;
      else if (fPrev > 0 || f > 0) {
        const pos = fPrev > f ? fPrev : f;
        const neg = fPrev > f ? f : fPrev;
        total += (0.5 * pos * pos * h) / (pos - neg);
      }
      fPrev = f;
    }
    return q * total;
  };

  // Knots: every KNOT_STEP across the reach, and where a strip edge meets a station.
  const list: number[] = [uLo, uHi];
  const steps = Math.ceil((uHi - uLo) / KNOT_STEP);
  for (let k = 1; k < steps; k++) list.push(uLo + ((uHi - uLo) * k) / steps);
  for (let j = 0; j < ny; j++) {
    for (const u of [ys[j] - width / 2 - gauge / 2, ys[j] + width / 2 - gauge / 2]) if (u > uLo && u < uHi) list.push(u);
  }
  list.sort((a, b) => a - b);
  const knotList: number[] = [];
  for (const u of list) if (!knotList.length || u - knotList[knotList.length - 1] > 1e-9) knotList.push(u);
  const knots = Float64Array.from(knotList);
  const values = knots.map(exact);
  let deviation = 0;
  for (let k = 1; k < knots.length; k++) {
    const mid = 0.5 * (knots[k - 1] + knots[k]);
    const d = Math.abs(exact(mid) - 0.5 * (values[k - 1] + values[k]));
    if (d > deviation) deviation = d;
  }
  const at = (u: number): number => {
    const n = knots.length;
    if (u <= knots[0]) return values[0];
    if (u >= knots[n - 1]) return values[n - 1];
    const k = cellIndex(knots, u);
    const t = (u - knots[k]) / (knots[k + 1] - knots[k]);
    return values[k] + t * (values[k + 1] - values[k]);
  };
  return { knots, values, deviation, at, exact };
}
