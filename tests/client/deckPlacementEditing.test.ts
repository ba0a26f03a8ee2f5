/**
 * Editing a placement in the workspace keeps it legal: design lanes 12 ft wide within the
 * curb-to-curb width, never overlapping (AASHTO LRFD Art. 3.6.1.1.1), each wheel centre at
 * least 2 ft from its lane's edges with the wheel lines 6 ft apart (Art. 3.6.1.3.1,
 * Art. 3.6.1.2.2), and the number of loaded lanes from 1 to NL (Art. 3.6.1.1.1). The rules
 * themselves are shared/placement's checkPlacement; these tests check that every edit the
 * workspace makes lands on a placement the rules accept.
 */
import { describe, expect, it } from 'vitest';
import { checkPlacement, placementRules, type PlacementRules } from '@shared/placement/rules';
import { DESIGN_TRUCK } from '@shared/loads/vehicles';
import { fromUs } from '@shared/units';
import { applyRules, ease, interpolateLanes, layoutLanes, setLongitudinal, stepLane, type PlacementContext } from '@/components/factors/placementEditing';

// A 52 ft roadway between curb faces at −2 ft and 50 ft: four 12 ft design lanes (INT(52/12) = 4).
const rules: PlacementRules = placementRules({ curbLeft: fromUs.ft(-2), curbRight: fromUs.ft(50) });
const ctx: PlacementContext = { rules, vehicle: DESIGN_TRUCK, extent: { xMin: 0, xMax: fromUs.ft(110) } };
const longitudinal = { frontAxleAt: fromUs.ft(60), direction: 1 as const, axleSpacing: fromUs.ft(14) };

function legal(lanes: ReturnType<typeof layoutLanes>): void {
  expect(checkPlacement({ lanes }, rules, { vehicle: DESIGN_TRUCK, extent: ctx.extent })).toEqual([]);
}

describe('laying out loaded lanes', () => {
  it('places the chosen number of lanes side by side from the left curb, wheels 2 ft inside', () => {
    expect(rules.laneCount).toBe(4);
    const lanes = layoutLanes(3, [], ctx, longitudinal);
    expect(lanes).toHaveLength(3);
    lanes.forEach((l, i) => {
      expect(l.left).toBeRelativelyClose(fromUs.ft(-2 + 12 * i), 1e-12);
      expect(l.wheelOffset).toBeRelativelyClose(fromUs.ft(2), 1e-12);
    });
    legal(lanes);
  });

  it('never loads more lanes than the roadway has, nor fewer than one', () => {
    expect(layoutLanes(9, [], ctx, longitudinal)).toHaveLength(4);
    expect(layoutLanes(0, [], ctx, longitudinal)).toHaveLength(1);
  });

  it('keeps the lanes already placed when one is added', () => {
    const one = stepLane(layoutLanes(1, [], ctx, longitudinal), 0, 'lane', fromUs.ft(5), ctx);
    const two = layoutLanes(2, one, ctx, longitudinal);
    expect(two[0].left).toBeRelativelyClose(one[0].left, 1e-12);
    expect(two[1].left).toBeRelativelyClose(one[0].left + rules.laneWidth, 1e-12);
    legal(two);
  });
});

describe('moving a lane or its wheels', () => {
  it('stops a lane at the right curb face however far it is pushed', () => {
    let lanes = layoutLanes(1, [], ctx, longitudinal);
    for (let i = 0; i < 80; i++) lanes = stepLane(lanes, 0, 'lane', fromUs.ft(1), ctx);
    // The lane's right edge is on the right curb face: left = 50 − 12 = 38 ft.
    expect(lanes[0].left).toBeRelativelyClose(fromUs.ft(38), 1e-9);
    legal(lanes);
  });

  it('pushes the neighbouring lane instead of overlapping it', () => {
    let lanes = layoutLanes(2, [], ctx, longitudinal);
    lanes = stepLane(lanes, 0, 'lane', fromUs.ft(10), ctx);
    expect(lanes[1].left - lanes[0].left).toBeGreaterThanOrEqual(rules.laneWidth - 1e-9);
    legal(lanes);
    // The dragged lane keeps its place; the other moved.
    expect(lanes[0].left).toBeRelativelyClose(fromUs.ft(8), 1e-9);
  });

  it('keeps the wheels at least 2 ft from both lane edges', () => {
    let lanes = layoutLanes(1, [], ctx, longitudinal);
    lanes = stepLane(lanes, 0, 'wheels', fromUs.ft(-3), ctx);
    expect(lanes[0].wheelOffset).toBeRelativelyClose(fromUs.ft(2), 1e-12);
    lanes = stepLane(lanes, 0, 'wheels', fromUs.ft(20), ctx);
    // 12 ft lane − 2 ft − 6 ft gauge = 4 ft: the largest left-wheel offset.
    expect(lanes[0].wheelOffset).toBeRelativelyClose(fromUs.ft(4), 1e-12);
    legal(lanes);
  });

  it('refuses a lane edge that is not a number with a typed error naming the lane', () => {
    const lanes = layoutLanes(1, [], ctx, longitudinal);
    expect(() => applyRules([{ ...lanes[0], left: Number.NaN }], ctx)).toThrow(/lane 1: the left edge must be a finite number/);
  });

  it('moves every vehicle to a new longitudinal position, clamped to the deck', () => {
    const lanes = setLongitudinal(layoutLanes(2, [], ctx, longitudinal), { frontAxleAt: fromUs.ft(500), direction: 1, axleSpacing: fromUs.ft(40) }, ctx);
    // The rear spacing is clamped to 30 ft (Art. 3.6.1.2.2); the front axle to the last position
    // that leaves an axle on the deck: 110 ft + 14 ft + 30 ft.
    lanes.forEach((l) => {
      expect(l.axleSpacing).toBeRelativelyClose(fromUs.ft(30), 1e-12);
      expect(l.frontAxleAt).toBeRelativelyClose(fromUs.ft(154), 1e-12);
    });
    legal(lanes);
  });
});

describe('the animation to a governing placement', () => {
  it('starts and ends exactly at the two placements and stays legal in between', () => {
    const from = layoutLanes(2, [], ctx, longitudinal);
    const to = stepLane(stepLane(layoutLanes(2, [], ctx, { ...longitudinal, frontAxleAt: fromUs.ft(70) }), 1, 'lane', fromUs.ft(12), ctx), 0, 'wheels', fromUs.ft(2), ctx);
    expect(interpolateLanes(from, to, 0)).toEqual(from.map((l, i) => ({ ...l, direction: to[i].direction })));
    expect(interpolateLanes(from, to, 1)).toEqual(to);
    for (const t of [0.1, 0.25, 0.5, 0.75, 0.9]) legal(interpolateLanes(from, to, t));
    expect(ease(0)).toBe(0);
    expect(ease(1)).toBe(1);
    expect(ease(0.5)).toBe(0.5);
  });
});
