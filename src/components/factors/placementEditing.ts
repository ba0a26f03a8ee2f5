/**
 * Editing a placement in the workspace: laying out a chosen number of loaded lanes, moving a
 * lane or its wheels by a keyboard step, and the in-between placements of the animation to a
 * governing position. Every result goes through the placement rules (shared/placement's
 * clampPlacement), so what the user can reach is always legal.
 *
 * Units: m; y from girder 1's centreline (positive right), x along girder 1 from support 0.
 */
import { clampPlacement, laneLeftMin, type LanePlacement, type PlacementRules } from '@shared/placement/rules';
import type { Vehicle } from '@shared/loads/vehicles';
import { designValuesOf, US_CUSTOMARY_VALUES, vehicleOf } from '@shared/loads/designValues';
import type { VehicleKey } from '@/stores/useDeckStore';

/**
 * The vehicle of `key` in the design values the rules were made with (`rules.designValues`,
 * shared/placement/rules.ts; without rules, a deck's): the SI edition's 35/145/145 kN truck on
 * an SI-edition deck, the 8/32/32 kip truck otherwise.
 */
export function vehicleFor(key: VehicleKey, source: { designValues?: PlacementRules['designValues'] } | null | undefined): Vehicle {
  return vehicleOf(source ? designValuesOf(source) : US_CUSTOMARY_VALUES, key) ?? US_CUSTOMARY_VALUES.truck;
}

export interface LongitudinalDefault {
  frontAxleAt: number;
  direction: 1 | -1;
  axleSpacing?: number;
}

export interface PlacementContext {
  rules: PlacementRules;
  vehicle: Vehicle;
  /** Deck length range, m. */
  extent: { xMin: number; xMax: number };
}

/** Applies the rules; `dragged` keeps that lane where it is when the others can still fit. */
export function applyRules(lanes: LanePlacement[], ctx: PlacementContext, dragged?: number): LanePlacement[] {
  const complete = lanes.map((l) => withVehicle(l, ctx.vehicle));
  return clampPlacement({ lanes: complete }, ctx.rules, { dragged, vehicle: ctx.vehicle, extent: ctx.extent }).lanes;
}

/** A lane with the longitudinal values the vehicle needs (a spacing only when it has a variable one). */
function withVehicle(lane: LanePlacement, vehicle: Vehicle): LanePlacement {
  const out: LanePlacement = { left: lane.left, wheelOffset: lane.wheelOffset, frontAxleAt: lane.frontAxleAt ?? 0, direction: lane.direction ?? 1 };
  const vs = vehicle.variableSpacing;
  if (vs) out.axleSpacing = lane.axleSpacing ?? vs.min;
  return out;
}

/**
 * `count` loaded lanes: the existing ones kept (left to right), new ones added side by side to
 * their right (or from the left curb), each with its wheels the least distance (2 ft, SI edition
 * 600 mm) from its left edge and the
 * given longitudinal position; then the rules.
 */
export function layoutLanes(count: number, existing: LanePlacement[], ctx: PlacementContext, longitudinal: LongitudinalDefault): LanePlacement[] {
  const k = Math.max(1, Math.min(ctx.rules.laneCount, Math.round(count)));
  const lanes = existing.slice(0, k).map((l) => ({ ...l }));
  while (lanes.length < k) {
    const previous = lanes[lanes.length - 1];
    const left = previous ? previous.left + ctx.rules.laneWidth : laneLeftMin(ctx.rules);
    lanes.push({ left, wheelOffset: ctx.rules.wheelToLaneEdge, ...longitudinal });
  }
  return applyRules(lanes, ctx, undefined);
}

/** Moves lane `index` (or its wheels within it) by `delta` m across the roadway. */
export function stepLane(lanes: LanePlacement[], index: number, what: 'lane' | 'wheels', delta: number, ctx: PlacementContext): LanePlacement[] {
  const next = lanes.map((l) => ({ ...l }));
  const lane = next[index];
  if (!lane) return lanes;
  if (what === 'lane') lane.left += delta;
  else lane.wheelOffset += delta;
  return applyRules(next, ctx, index);
}

/** Every lane's vehicle at the same longitudinal position (on an effect change). */
export function setLongitudinal(lanes: LanePlacement[], longitudinal: LongitudinalDefault, ctx: PlacementContext): LanePlacement[] {
  return applyRules(lanes.map((l) => ({ ...l, ...longitudinal })), ctx);
}

/** Smooth step used by the animation (ease in and out), t in [0, 1]. */
export function ease(t: number): number {
  const u = Math.min(1, Math.max(0, t));
  return u * u * (3 - 2 * u);
}

/**
 * The placement a fraction `t` of the way from `from` to `to` (same number of lanes): edges,
 * wheel offsets, front axles and spacings interpolated; the direction of travel is the
 * target's from the start. Lanes stay ordered and apart because both ends are legal and the
 * rule set is convex in the lane edges.
 */
export function interpolateLanes(from: LanePlacement[], to: LanePlacement[], t: number): LanePlacement[] {
  const s = ease(t);
  return to.map((b, i) => {
    const a = from[i] ?? b;
    const mix = (p: number | undefined, q: number | undefined) => (p === undefined || q === undefined ? q : p + (q - p) * s);
    const out: LanePlacement = {
      left: a.left + (b.left - a.left) * s,
      wheelOffset: a.wheelOffset + (b.wheelOffset - a.wheelOffset) * s,
    };
    const front = a.direction === b.direction ? mix(a.frontAxleAt, b.frontAxleAt) : b.frontAxleAt;
    if (front !== undefined) out.frontAxleAt = front;
    if (b.direction !== undefined) out.direction = b.direction;
    const spacing = mix(a.axleSpacing, b.axleSpacing);
    if (spacing !== undefined) out.axleSpacing = spacing;
    return out;
  });
}
