/**
 * Placement rules: where design lanes and the wheels of their vehicles may go
 * (AASHTO LRFD Art. 3.6.1.1.1 design lanes, Art. 3.6.1.3.1 transverse position of the
 * truck or tandem, Art. 3.6.1.2 vehicle geometry).
 *
 * Units: internal SI (m, N). Transverse coordinate y is measured from girder 1's
 * centreline, positive to the right (as in deck/geometry.ts); the roadway runs from the
 * left curb face `curbLeft` to the right curb face `curbRight`. Longitudinal coordinate x
 * runs along girder 1's axis from support line 0 at girder 1 (as the influence surfaces use).
 *
 * A placement is
 * - the number of loaded lanes k (1..NL), chosen explicitly as the length of `lanes`;
 * - for each lane, its left edge (a whole design lane, `laneWidth` wide, anywhere inside
 *   the roadway; lanes never overlap, never a fraction of a lane), and the offset of its
 *   left wheel line from that edge (wheel lines `gauge` = 6 ft apart, each wheel centre at
 *   least 2 ft from its lane's edges: Art. 3.6.1.3.1);
 * - for evaluation on an influence surface, for each lane: the x of the vehicle's front
 *   axle, its direction of travel and the variable axle spacing. Each lane's vehicle is
 *   positioned on its own: Art. 3.6.1.3.1 places each design lane's vehicle for the extreme
 *   force effect and nothing ties the vehicles of different lanes together. Giving every
 *   lane the same longitudinal values (`withLongitudinal`) is one case of this.
 *
 * Direction of travel: +1 means the vehicle travels toward increasing x, so its front axle
 * has the largest x and axle a sits at x = frontAxleAt − position_a; −1 means the reverse
 * (x = frontAxleAt + position_a). A vehicle must have at least one axle on the deck's
 * length [xMin, xMax]; axles beyond the deck carry nothing.
 *
 * Deck-overhang option (Art. 3.6.1.3.1, first bullet): for the design of the deck overhang
 * a wheel centre may come as close as 1 ft to the face of the curb or railing. It is read
 * here as: on a lane edge that is the curb face, the wheel limit is 1 ft from the curb face
 * instead of 2 ft from the lane edge; on every other lane edge the 2 ft rule stays.
 *
 * The lane width, the gauge and the wheel distances are the deck's design values
 * (shared/loads/designValues.ts): 12 ft, 6 ft, 2 ft and 1 ft with the US customary values;
 * 3600 mm, 1800 mm, 600 mm and 300 mm with the SI edition's (AASHTO LRFD (SI) Art. 3.6.1.3.1,
 * Figure 3.6.1.2.2-1).
 *
 * Limits are checked with a tolerance of 1 nm (RULE_TOLERANCE) so that values that land on
 * a limit after arithmetic count as on it.
 */
import { DeckInputError, type Deck, type DeckIssue } from '../deck/schema.js';
import { deckGeometry } from '../deck/geometry.js';
import { designLanes } from '../lrfd/lanes.js';
import type { Vehicle } from '../loads/vehicles.js';
import { designValuesOf, US_CUSTOMARY_VALUES, type DesignValues } from '../loads/designValues.js';
import { toUs } from '../units.js';

/** Least distance from a wheel centre to its lane's edge, 2 ft (Art. 3.6.1.3.1; US customary values), m. */
export const WHEEL_TO_LANE_EDGE = US_CUSTOMARY_VALUES.wheelToLaneEdge;
/** Least distance from a wheel centre to the curb face for deck-overhang design, 1 ft (Art. 3.6.1.3.1; US customary values), m. */
export const WHEEL_TO_CURB_FOR_OVERHANG = US_CUSTOMARY_VALUES.wheelToCurbForOverhang;
/** Tolerance on every limit, m. */
export const RULE_TOLERANCE = 1e-9;

export interface PlacementRules {
  /** Left curb (or barrier) face, m (y). */
  curbLeft: number;
  /** Right curb (or barrier) face, m (y). */
  curbRight: number;
  /** Width of one design lane, m (12 ft, or w/2 for 20 ft ≤ w ≤ 24 ft; SI edition 3.6 m, or w/2 for 6.0 m ≤ w ≤ 7.2 m). */
  laneWidth: number;
  /** Number of design lanes NL. */
  laneCount: number;
  /** Transverse spacing of the wheel lines, m (6 ft; SI edition 1.8 m). */
  gauge: number;
  /** Least distance from a wheel centre to its lane's edge, m (2 ft; SI edition 0.6 m). */
  wheelToLaneEdge: number;
  /** Deck-overhang option: least distance from a wheel centre to a curb face, m (1 ft; SI edition 0.3 m); null when off. */
  wheelToCurb: number | null;
  /** Which design values the rules come from (shared/loads/designValues.ts); absent: the US customary ones. */
  designValues?: DesignValues['name'];
}

/** Options of the rules: the deck-overhang rule, a wheel gauge other than the vehicles', the design values. */
export interface PlacementRuleOptions {
  overhang?: boolean;
  gauge?: number;
  /** The deck's design values; the US customary ones by default. */
  values?: DesignValues;
}

/** One loaded lane. */
export interface LanePlacement {
  /** y of the lane's left edge, m. */
  left: number;
  /** Distance from the lane's left edge to the left wheel line, m. */
  wheelOffset: number;
  /** Surfaces only: x of the front axle, m. */
  frontAxleAt?: number;
  /** Surfaces only: +1 travelling toward increasing x, −1 toward decreasing x. */
  direction?: 1 | -1;
  /** Surfaces only, vehicles with a variable spacing: that spacing, m. */
  axleSpacing?: number;
}

/** A placement: k = lanes.length loaded lanes. */
export interface Placement {
  lanes: LanePlacement[];
}

export type PlacementViolationCode =
  | 'lane-count'
  | 'not-finite'
  | 'lane-outside-roadway'
  | 'lanes-overlap'
  | 'wheel-near-lane-edge'
  | 'longitudinal-missing'
  | 'direction'
  | 'axle-spacing'
  | 'vehicle-off-deck';

/** One broken rule, in plain words. `path` names the field, e.g. ['lanes', 1, 'left']. */
export interface PlacementViolation {
  code: PlacementViolationCode;
  path: (string | number)[];
  message: string;
}

/** A typed error for a placement or placement input that cannot be used; `issues` name each field and rule. */
export class PlacementError extends DeckInputError {
  constructor(issues: DeckIssue[]) {
    super(issues);
    this.name = 'PlacementError';
  }
}

function fail(path: (string | number)[], message: string): never {
  throw new PlacementError([{ path, message }]);
}

const ft = (m: number) => `${toUs.ft(m).toFixed(2)} ft`;

/**
 * Rules from a roadway.
 * @param roadway curbLeft, curbRight: y of the curb faces, m (curbRight − curbLeft ≥ one design lane).
 * @param options overhang: apply the deck-overhang rule (wheel centre 1 ft, SI edition 300 mm,
 *   from the curb face); gauge: wheel-line spacing, m (default the design values' 6 ft or
 *   1800 mm); values: the deck's design values (default the US customary ones).
 */
export function placementRules(roadway: { curbLeft: number; curbRight: number }, options: PlacementRuleOptions = {}): PlacementRules {
  const { curbLeft, curbRight } = roadway;
  if (!Number.isFinite(curbLeft)) fail(['curbLeft'], 'the left curb face must be a finite number of metres');
  if (!Number.isFinite(curbRight)) fail(['curbRight'], 'the right curb face must be a finite number of metres');
  const values = options.values ?? US_CUSTOMARY_VALUES;
  const lanes = designLanes(curbRight - curbLeft, values);
  const gauge = options.gauge ?? values.gauge;
  if (!(Number.isFinite(gauge) && gauge > 0)) fail(['gauge'], 'the wheel gauge must be a positive number of metres');
  if (lanes.width - 2 * values.wheelToLaneEdge - gauge < -RULE_TOLERANCE) {
    const shown = values.name === 'us-customary' ? ft : (m: number) => `${m.toFixed(3)} m`;
    fail(['gauge'], `a ${shown(gauge)} wheel gauge does not fit in a ${shown(lanes.width)} lane with wheels ${values.printed.wheelToLaneEdge} from its edges`);
  }
  const rules: PlacementRules = {
    curbLeft,
    curbRight,
    laneWidth: lanes.width,
    laneCount: lanes.count,
    gauge,
    wheelToLaneEdge: values.wheelToLaneEdge,
    wheelToCurb: options.overhang ? values.wheelToCurbForOverhang : null,
  };
  // named only when not the default, so the US customary rules are the same object as before
  if (values.name !== 'us-customary') rules.designValues = values.name;
  return rules;
}

/** Rules for a deck's roadway (curb faces from deck/geometry.ts), with the deck's design values. */
export function placementRulesForDeck(deck: Deck, options: Omit<PlacementRuleOptions, 'values'> = {}): PlacementRules {
  const g = deckGeometry(deck);
  return placementRules({ curbLeft: g.curbLeft, curbRight: g.curbRight }, { ...options, values: designValuesOf(deck) });
}

/** Leftmost legal left edge of a lane, m. */
export function laneLeftMin(rules: PlacementRules): number {
  return rules.curbLeft;
}
/** Rightmost legal left edge of a lane, m. */
export function laneLeftMax(rules: PlacementRules): number {
  return rules.curbRight - rules.laneWidth;
}

/**
 * Legal range of the left wheel line's offset from the lane's left edge, m, for a lane whose
 * left edge is at `left` (m). With the deck-overhang option the limit on a lane edge that is
 * a curb face is 1 ft from that face.
 */
export function wheelOffsetRange(rules: PlacementRules, left: number): { min: number; max: number } {
  let min = rules.wheelToLaneEdge;
  let max = rules.laneWidth - rules.wheelToLaneEdge - rules.gauge;
  if (rules.wheelToCurb !== null) {
    if (Math.abs(left - rules.curbLeft) <= RULE_TOLERANCE) min = Math.min(min, rules.wheelToCurb);
    if (Math.abs(left + rules.laneWidth - rules.curbRight) <= RULE_TOLERANCE) {
      max = Math.max(max, rules.laneWidth - rules.wheelToCurb - rules.gauge);
    }
  }
  return { min, max };
}

/** y of the two wheel lines of a lane, m. */
export function wheelLines(rules: PlacementRules, lane: LanePlacement): [number, number] {
  const yl = lane.left + lane.wheelOffset;
  return [yl, yl + rules.gauge];
}

/** Positions of a vehicle's axles behind its front axle, m, with the variable spacing set to `spacing`. */
export function axlePositions(vehicle: Vehicle, spacing?: number): number[] {
  const vs = vehicle.variableSpacing;
  if (!vs || spacing === undefined) return vehicle.axles.map((a) => a.position);
  const k = vs.axleIndex;
  const shift = spacing - (vehicle.axles[k].position - vehicle.axles[k - 1].position);
  return vehicle.axles.map((a, i) => (i >= k ? a.position + shift : a.position));
}

/** x of each axle of a lane's vehicle, m. */
export function axleStations(vehicle: Vehicle, lane: Required<Pick<LanePlacement, 'frontAxleAt' | 'direction'>> & LanePlacement): number[] {
  const pos = axlePositions(vehicle, lane.axleSpacing);
  return pos.map((p) => lane.frontAxleAt - lane.direction * p);
}

/** Legal range of the front axle's x, m: at least one axle on [xMin, xMax]. */
export function frontAxleRange(
  vehicle: Vehicle,
  direction: 1 | -1,
  spacing: number | undefined,
  extent: { xMin: number; xMax: number },
): { min: number; max: number } {
  const pos = axlePositions(vehicle, spacing);
  const length = pos[pos.length - 1];
  return direction === 1 ? { min: extent.xMin, max: extent.xMax + length } : { min: extent.xMin - length, max: extent.xMax };
}

export interface CheckOptions {
  /** The vehicle, to check the longitudinal values (surfaces). */
  vehicle?: Vehicle;
  /** The deck's length range, m, to check that each vehicle has an axle on the deck. */
  extent?: { xMin: number; xMax: number };
}

/**
 * Every rule the placement breaks, in plain words (empty when legal). Longitudinal values are
 * checked only when `options.vehicle` is given; each lane then needs frontAxleAt and
 * direction (and axleSpacing when the vehicle has a variable spacing).
 */
export function checkPlacement(placement: Placement, rules: PlacementRules, options: CheckOptions = {}): PlacementViolation[] {
  const out: PlacementViolation[] = [];
  const lanes = placement?.lanes;
  if (!Array.isArray(lanes) || lanes.length < 1 || lanes.length > rules.laneCount) {
    out.push({
      code: 'lane-count',
      path: ['lanes'],
      message: `the number of loaded lanes must be a whole number from 1 to ${rules.laneCount} (the roadway's design lanes); got ${Array.isArray(lanes) ? lanes.length : 'none'}`,
    });
    return out;
  }
  const tol = RULE_TOLERANCE;
  lanes.forEach((lane, i) => {
    const n = i + 1;
    if (!Number.isFinite(lane.left)) {
      out.push({ code: 'not-finite', path: ['lanes', i, 'left'], message: `lane ${n}: the left edge must be a finite number of metres` });
      return;
    }
    if (!Number.isFinite(lane.wheelOffset)) {
      out.push({ code: 'not-finite', path: ['lanes', i, 'wheelOffset'], message: `lane ${n}: the wheel offset must be a finite number of metres` });
      return;
    }
    if (lane.left < laneLeftMin(rules) - tol) {
      out.push({
        code: 'lane-outside-roadway',
        path: ['lanes', i, 'left'],
        message: `lane ${n} starts ${ft(laneLeftMin(rules) - lane.left)} beyond the left curb face; a design lane must lie wholly within the roadway (Art. 3.6.1.1.1)`,
      });
    }
    if (lane.left > laneLeftMax(rules) + tol) {
      out.push({
        code: 'lane-outside-roadway',
        path: ['lanes', i, 'left'],
        message: `lane ${n} ends ${ft(lane.left - laneLeftMax(rules))} beyond the right curb face; a design lane must lie wholly within the roadway (Art. 3.6.1.1.1)`,
      });
    }
    const r = wheelOffsetRange(rules, lane.left);
    if (lane.wheelOffset < r.min - tol) {
      out.push({
        code: 'wheel-near-lane-edge',
        path: ['lanes', i, 'wheelOffset'],
        message: `lane ${n}: the left wheel centre is ${ft(lane.wheelOffset)} from the lane's left edge; it must be at least ${ft(r.min)} (Art. 3.6.1.3.1)`,
      });
    }
    if (lane.wheelOffset > r.max + tol) {
      out.push({
        code: 'wheel-near-lane-edge',
        path: ['lanes', i, 'wheelOffset'],
        message: `lane ${n}: the right wheel centre is ${ft(rules.laneWidth - lane.wheelOffset - rules.gauge)} from the lane's right edge; it must be at least ${ft(rules.laneWidth - rules.gauge - r.max)} (Art. 3.6.1.3.1)`,
      });
    }
    if (i > 0 && Number.isFinite(lanes[i - 1].left) && lane.left < lanes[i - 1].left + rules.laneWidth - tol) {
      out.push({
        code: 'lanes-overlap',
        path: ['lanes', i, 'left'],
        message: `lane ${n} overlaps lane ${i} by ${ft(lanes[i - 1].left + rules.laneWidth - lane.left)}; lanes are listed left to right and may not overlap`,
      });
    }
    const v = options.vehicle;
    if (!v) return;
    if (lane.frontAxleAt === undefined || lane.direction === undefined) {
      out.push({
        code: 'longitudinal-missing',
        path: ['lanes', i, lane.frontAxleAt === undefined ? 'frontAxleAt' : 'direction'],
        message: `lane ${n}: an influence surface needs the front axle's position and the direction of travel`,
      });
      return;
    }
    if (!Number.isFinite(lane.frontAxleAt)) {
      out.push({ code: 'not-finite', path: ['lanes', i, 'frontAxleAt'], message: `lane ${n}: the front axle position must be a finite number of metres` });
      return;
    }
    if (lane.direction !== 1 && lane.direction !== -1) {
      out.push({ code: 'direction', path: ['lanes', i, 'direction'], message: `lane ${n}: the direction of travel must be +1 or −1` });
      return;
    }
    const vs = v.variableSpacing;
    if (vs) {
      if (lane.axleSpacing === undefined || !Number.isFinite(lane.axleSpacing)) {
        out.push({ code: 'axle-spacing', path: ['lanes', i, 'axleSpacing'], message: `lane ${n}: the ${v.name} needs its variable axle spacing as a finite number of metres` });
        return;
      }
      if (lane.axleSpacing < vs.min - tol || lane.axleSpacing > vs.max + tol) {
        out.push({
          code: 'axle-spacing',
          path: ['lanes', i, 'axleSpacing'],
          message: `lane ${n}: the ${v.name}'s variable axle spacing must lie from ${ft(vs.min)} to ${ft(vs.max)} (Art. 3.6.1.2.2); got ${ft(lane.axleSpacing)}`,
        });
        return;
      }
    } else if (lane.axleSpacing !== undefined) {
      out.push({ code: 'axle-spacing', path: ['lanes', i, 'axleSpacing'], message: `lane ${n}: the ${v.name} has no variable axle spacing` });
      return;
    }
    if (options.extent) {
      const fr = frontAxleRange(v, lane.direction, lane.axleSpacing, options.extent);
      if (lane.frontAxleAt < fr.min - tol || lane.frontAxleAt > fr.max + tol) {
        out.push({
          code: 'vehicle-off-deck',
          path: ['lanes', i, 'frontAxleAt'],
          message: `lane ${n}: the ${v.name} is wholly off the deck; at least one axle must be on it`,
        });
      }
    }
  });
  return out;
}

/** Throws a PlacementError listing every broken rule; returns the placement when legal. */
export function assertPlacement(placement: Placement, rules: PlacementRules, options: CheckOptions = {}): Placement {
  const v = checkPlacement(placement, rules, options);
  if (v.length) throw new PlacementError(v.map((x) => ({ path: x.path, message: x.message })));
  return placement;
}

const clamp = (v: number, lo: number, hi: number) => (v < lo ? lo : v > hi ? hi : v);

/**
 * The legal placement nearest to `placement`, for dragging: lanes keep their left-to-right
 * order (they push each other rather than pass through), stay inside the roadway and do not
 * overlap; wheel offsets, axle spacings and front-axle positions are clamped into range.
 *
 * - `dragged`: index of the lane being dragged. It keeps its position where the others can
 *   still fit, and pushes its neighbours. Without it, the lane edges are moved the least in
 *   the least-squares sense (isotonic regression of the edges, then the roadway bounds).
 * - `vehicle` and `extent` (m): clamp the longitudinal values too. A missing direction is an
 *   error (there is no silent default).
 *
 * Throws PlacementError when the lane count is outside 1..NL or a value is not finite.
 */
export function clampPlacement(
  placement: Placement,
  rules: PlacementRules,
  options: { dragged?: number; vehicle?: Vehicle; extent?: { xMin: number; xMax: number } } = {},
): Placement {
  const lanes = placement?.lanes;
  if (!Array.isArray(lanes) || lanes.length < 1 || lanes.length > rules.laneCount) {
    fail(['lanes'], `the number of loaded lanes must be a whole number from 1 to ${rules.laneCount}; got ${Array.isArray(lanes) ? lanes.length : 'none'}`);
  }
  lanes.forEach((l, i) => {
    if (!Number.isFinite(l.left)) fail(['lanes', i, 'left'], `lane ${i + 1}: the left edge must be a finite number of metres`);
    if (!Number.isFinite(l.wheelOffset)) fail(['lanes', i, 'wheelOffset'], `lane ${i + 1}: the wheel offset must be a finite number of metres`);
  });
  const k = lanes.length;
  const lw = rules.laneWidth;
  const lo = laneLeftMin(rules);
  const hi = laneLeftMax(rules);
  let lefts: number[];
  const d = options.dragged;
  if (d !== undefined) {
    if (!Number.isInteger(d) || d < 0 || d >= k) fail(['dragged'], `the dragged lane must be an index from 0 to ${k - 1}`);
    lefts = lanes.map((l) => l.left);
    lefts[d] = clamp(lefts[d], lo + d * lw, hi - (k - 1 - d) * lw);
    for (let i = d + 1; i < k; i++) lefts[i] = clamp(lefts[i], lefts[i - 1] + lw, hi - (k - 1 - i) * lw);
    for (let i = d - 1; i >= 0; i--) lefts[i] = clamp(lefts[i], lo + i * lw, lefts[i + 1] - lw);
  } else {
    // q_i = left_i − i·lw must be non-decreasing and within [lo, hi − (k−1)·lw]:
    // pool-adjacent-violators gives the least-squares non-decreasing fit, then clip.
    const q = lanes.map((l, i) => l.left - i * lw);
    const blocks: { sum: number; n: number }[] = [];
    for (const v of q) {
      blocks.push({ sum: v, n: 1 });
      while (blocks.length > 1) {
        const b = blocks[blocks.length - 1];
        const a = blocks[blocks.length - 2];
        if (a.sum / a.n <= b.sum / b.n) break;
        a.sum += b.sum;
        a.n += b.n;
        blocks.pop();
      }
    }
    const fit: number[] = [];
    for (const b of blocks) for (let j = 0; j < b.n; j++) fit.push(b.sum / b.n);
    const qHi = hi - (k - 1) * lw;
    lefts = fit.map((v, i) => clamp(v, lo, qHi) + i * lw);
  }
  const v = options.vehicle;
  return {
    lanes: lanes.map((l, i) => {
      const left = lefts[i];
      const r = wheelOffsetRange(rules, left);
      const out: LanePlacement = { left, wheelOffset: clamp(l.wheelOffset, r.min, r.max) };
      if (!v) {
        if (l.frontAxleAt !== undefined) out.frontAxleAt = l.frontAxleAt;
        if (l.direction !== undefined) out.direction = l.direction;
        if (l.axleSpacing !== undefined) out.axleSpacing = l.axleSpacing;
        return out;
      }
      if (l.direction !== 1 && l.direction !== -1) fail(['lanes', i, 'direction'], `lane ${i + 1}: the direction of travel must be +1 or −1`);
      if (l.frontAxleAt === undefined || !Number.isFinite(l.frontAxleAt)) {
        fail(['lanes', i, 'frontAxleAt'], `lane ${i + 1}: the front axle position must be a finite number of metres`);
      }
      out.direction = l.direction;
      const vs = v.variableSpacing;
      if (vs) {
        if (l.axleSpacing === undefined || !Number.isFinite(l.axleSpacing)) {
          fail(['lanes', i, 'axleSpacing'], `lane ${i + 1}: the ${v.name} needs its variable axle spacing as a finite number of metres`);
        }
        out.axleSpacing = clamp(l.axleSpacing, vs.min, vs.max);
      }
      out.frontAxleAt = l.frontAxleAt;
      if (options.extent) {
        const fr = frontAxleRange(v, l.direction, out.axleSpacing, options.extent);
        out.frontAxleAt = clamp(l.frontAxleAt, fr.min, fr.max);
      }
      return out;
    }),
  };
}

/** The placement with every lane's vehicle at the same longitudinal position (m), direction and spacing (m). */
export function withLongitudinal(
  placement: Placement,
  longitudinal: { frontAxleAt: number; direction: 1 | -1; axleSpacing?: number },
): Placement {
  return {
    lanes: placement.lanes.map((l) => {
      const out: LanePlacement = { left: l.left, wheelOffset: l.wheelOffset, frontAxleAt: longitudinal.frontAxleAt, direction: longitudinal.direction };
      if (longitudinal.axleSpacing !== undefined) out.axleSpacing = longitudinal.axleSpacing;
      return out;
    }),
  };
}
