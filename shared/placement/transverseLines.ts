/**
 * Transverse influence lines: the share of a unit wheel load at y that one girder takes,
 * for the code's transverse methods.
 *
 * Units: y in m from girder 1's centreline, positive right; ordinates are dimensionless
 * (girder reaction per unit downward load, upward positive). A line is piecewise linear
 * between its stations and must cover the roadway it is used on.
 *
 * - Lever rule (Art. 4.6.2.2.1, "lever rule"; commentary C4.6.2.2.1): the deck is taken as
 *   hinged over every girder, so a load between two adjacent girders is shared by those two
 *   by statics; a load on an overhang is carried by the exterior girder and the girder next to
 *   it as a simple beam with a cantilever (the adjacent girder's share is then negative).
 * - Rigid-section method (commentary to Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1): the cross-section
 *   deflects and rotates as a rigid body, R = 1/Nb + x·e/Σx² per unit load, with x the girder's
 *   and e the load's distance from the centre of gravity of the girders.
 */
import { PlacementError } from './rules.js';

export interface TransverseLine {
  /** Stations, m, strictly increasing. */
  ys: Float64Array;
  /** Ordinates at the stations; linear in between. */
  values: Float64Array;
  /** Plain description, e.g. "lever rule, girder 1". */
  label: string;
}

/** A validated piecewise-linear transverse line. ys in m, strictly increasing; values finite. */
export function transverseLine(ys: ArrayLike<number>, values: ArrayLike<number>, label = 'transverse influence line'): TransverseLine {
  if (ys.length < 2 || ys.length !== values.length) {
    throw new PlacementError([{ path: ['line', 'ys'], message: 'a transverse line needs at least two stations and one ordinate per station' }]);
  }
  for (let i = 0; i < ys.length; i++) {
    if (!Number.isFinite(ys[i])) throw new PlacementError([{ path: ['line', 'ys', i], message: 'every station must be a finite number of metres' }]);
    if (!Number.isFinite(values[i])) throw new PlacementError([{ path: ['line', 'values', i], message: 'every ordinate must be finite' }]);
    if (i > 0 && !(ys[i] > ys[i - 1])) throw new PlacementError([{ path: ['line', 'ys', i], message: 'stations must increase strictly from left to right' }]);
  }
  return { ys: Float64Array.from(ys), values: Float64Array.from(values), label };
}

/** Ordinate of a line at y (m). Throws PlacementError when y lies outside the line's stations. */
export function transverseAt(line: TransverseLine, y: number): number {
  const { ys, values } = line;
  const n = ys.length;
  const tol = 1e-9;
  if (!(y >= ys[0] - tol && y <= ys[n - 1] + tol)) {
    throw new PlacementError([{ path: ['line'], message: `y = ${y} m lies outside the transverse line (${ys[0]} m to ${ys[n - 1]} m); the line must cover the roadway` }]);
  }
  if (y <= ys[0]) return values[0];
  if (y >= ys[n - 1]) return values[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ys[mid] <= y) lo = mid;
    else hi = mid;
  }
  const t = (y - ys[lo]) / (ys[hi] - ys[lo]);
  return values[lo] + t * (values[hi] - values[lo]);
}

function checkOffsets(offsets: readonly number[], girder: number): void {
  if (offsets.length < 2) throw new PlacementError([{ path: ['offsets'], message: 'at least two girders are needed' }]);
  for (let i = 0; i < offsets.length; i++) {
    if (!Number.isFinite(offsets[i])) throw new PlacementError([{ path: ['offsets', i], message: 'girder offsets must be finite' }]);
    if (i > 0 && !(offsets[i] > offsets[i - 1])) throw new PlacementError([{ path: ['offsets', i], message: 'girder offsets must increase strictly' }]);
  }
  if (!Number.isInteger(girder) || girder < 0 || girder >= offsets.length) {
    throw new PlacementError([{ path: ['girder'], message: `girder index must be a whole number from 0 to ${offsets.length - 1}` }]);
  }
}

function buildLine(left: number, right: number, points: number[], f: (y: number) => number, label: string): TransverseLine {
  if (!(right > left)) throw new PlacementError([{ path: ['roadway'], message: 'the right end of the line must lie to the right of its left end' }]);
  const ys = [left, ...points.filter((p) => p > left && p < right), right];
  return transverseLine(ys, ys.map(f), label);
}

/**
 * Lever-rule line of girder `girder` (0-based), over [left, right] m (usually the curb faces).
 * @param offsets girder centreline offsets, m, increasing.
 */
export function leverRuleLine(offsets: readonly number[], girder: number, left: number, right: number): TransverseLine {
  checkOffsets(offsets, girder);
  const n = offsets.length;
  const o = offsets;
  const i = girder;
  const f = (y: number): number => {
    // Panel left of girder i (between i−1 and i), extended over the left overhang when i−1 is the exterior girder.
    if (i > 0 && y <= o[i] && (y >= o[i - 1] || i - 1 === 0)) return (y - o[i - 1]) / (o[i] - o[i - 1]);
    if (i < n - 1 && y >= o[i] && (y <= o[i + 1] || i + 1 === n - 1)) return (o[i + 1] - y) / (o[i + 1] - o[i]);
    // Overhangs of the exterior girder itself.
    if (i === 0 && y <= o[0]) return (o[1] - y) / (o[1] - o[0]);
    if (i === n - 1 && y >= o[n - 1]) return (y - o[n - 2]) / (o[n - 1] - o[n - 2]);
    return 0;
  };
  return buildLine(left, right, [...o], f, `lever rule, girder ${girder + 1}`);
}

/**
 * Rigid-section line of girder `girder` (0-based): R = 1/Nb + x·e/Σx² per unit load, over [left, right] m.
 * @param offsets girder centreline offsets, m, increasing.
 */
export function rigidSectionLine(offsets: readonly number[], girder: number, left: number, right: number): TransverseLine {
  checkOffsets(offsets, girder);
  const n = offsets.length;
  const centre = offsets.reduce((s, v) => s + v, 0) / n;
  const sumX2 = offsets.reduce((s, v) => s + (v - centre) ** 2, 0);
  const x = offsets[girder] - centre;
  const f = (y: number) => 1 / n + (x * (y - centre)) / sumX2;
  return buildLine(left, right, [], f, `rigid section, girder ${girder + 1}`);
}
