/**
 * Placement rules: lanes inside the roadway, no overlap, wheels 2 ft from lane edges,
 * 1 ft from the curb face for overhang design; clampPlacement keeps dragging legal.
 * Sources: AASHTO LRFD Bridge Design Specifications, Art. 3.6.1.1.1 (12 ft design lanes,
 * NL = INT(w/12), 20–24 ft rule), Art. 3.6.1.3.1 (wheel centre 2.0 ft from the lane edge;
 * 1.0 ft from the curb face for the deck overhang), Art. 3.6.1.2.2 (6 ft gauge, 14–30 ft rear spacing).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DESIGN_TRUCK, DESIGN_TANDEM } from '../../../shared/loads/vehicles.js';
import {
  PlacementError,
  RULE_TOLERANCE,
  checkPlacement,
  clampPlacement,
  frontAxleRange,
  placementRules,
  wheelOffsetRange,
  withLongitudinal,
  type Placement,
} from '../../../shared/placement/rules.js';
import { DeckInputError } from '../../../shared/deck/schema.js';
import { fromUs } from '../../../shared/units.js';

const ft = fromUs.ft;

describe('placement rules', () => {
  it('a 44 ft roadway has three 12 ft lanes; the wheel offset runs 2 ft to 4 ft (Art. 3.6.1.1.1, 3.6.1.3.1)', () => {
    const r = placementRules({ curbLeft: -ft(1), curbRight: ft(43) });
    expect(r.laneCount).toBe(3);
    expect(r.laneWidth).toBeRelativelyClose(ft(12), 1e-12);
    const w = wheelOffsetRange(r, ft(10));
    expect(w.min).toBeRelativelyClose(ft(2), 1e-12);
    // 12 ft − 2 ft − 6 ft gauge
    expect(w.max).toBeRelativelyClose(ft(4), 1e-12);
  });

  it('a 22 ft roadway has two lanes of 11 ft (Art. 3.6.1.1.1, 20–24 ft rule); wheels 2 ft to 3 ft', () => {
    const r = placementRules({ curbLeft: 0, curbRight: ft(22) });
    expect(r.laneCount).toBe(2);
    expect(r.laneWidth).toBeRelativelyClose(ft(11), 1e-12);
    expect(wheelOffsetRange(r, ft(5)).max).toBeRelativelyClose(ft(3), 1e-12);
  });

  it('the deck-overhang option allows 1 ft from the curb face only on a lane edge at the curb (Art. 3.6.1.3.1)', () => {
    const r = placementRules({ curbLeft: 0, curbRight: ft(40) }, { overhang: true });
    expect(wheelOffsetRange(r, 0).min).toBeRelativelyClose(ft(1), 1e-12);
    expect(wheelOffsetRange(r, ft(0.5)).min).toBeRelativelyClose(ft(2), 1e-12);
    // lane against the right curb: right wheel 1 ft from the curb ⇒ left wheel offset 12 − 1 − 6 = 5 ft
    expect(wheelOffsetRange(r, ft(28)).max).toBeRelativelyClose(ft(5), 1e-12);
    const plain = placementRules({ curbLeft: 0, curbRight: ft(40) });
    expect(wheelOffsetRange(plain, 0).min).toBeRelativelyClose(ft(2), 1e-12);
  });

  it('reports each broken rule in plain words, naming the field', () => {
    const r = placementRules({ curbLeft: 0, curbRight: ft(40) });
    const bad: Placement = {
      lanes: [
        { left: -ft(1), wheelOffset: ft(1) },
        { left: ft(5), wheelOffset: ft(5) },
      ],
    };
    const v = checkPlacement(bad, r);
    const codes = v.map((x) => x.code).sort();
    expect(codes).toEqual(['lane-outside-roadway', 'lanes-overlap', 'wheel-near-lane-edge', 'wheel-near-lane-edge']);
    expect(v.find((x) => x.code === 'lanes-overlap')!.path).toEqual(['lanes', 1, 'left']);
    expect(v.find((x) => x.code === 'lane-outside-roadway')!.message).toMatch(/left curb face/);
    expect(checkPlacement({ lanes: [] }, r)[0].code).toBe('lane-count');
    expect(checkPlacement({ lanes: [0, 1, 2, 3].map((i) => ({ left: i * ft(12), wheelOffset: ft(2) })) }, r)[0].code).toBe('lane-count');
  });

  it('checks the vehicle: direction, variable spacing 14–30 ft, an axle on the deck', () => {
    const r = placementRules({ curbLeft: 0, curbRight: ft(40) });
    const extent = { xMin: 0, xMax: ft(100) };
    const lane = { left: 0, wheelOffset: ft(3), frontAxleAt: ft(50), direction: 1 as const, axleSpacing: ft(31) };
    expect(checkPlacement({ lanes: [lane] }, r, { vehicle: DESIGN_TRUCK, extent })[0].code).toBe('axle-spacing');
    expect(checkPlacement({ lanes: [{ ...lane, axleSpacing: ft(14) }] }, r, { vehicle: DESIGN_TRUCK, extent })).toEqual([]);
    expect(checkPlacement({ lanes: [{ ...lane, axleSpacing: ft(14) }] }, r, { vehicle: DESIGN_TANDEM, extent })[0].code).toBe('axle-spacing');
    const off = { ...lane, axleSpacing: ft(14), frontAxleAt: -ft(0.5) };
    expect(checkPlacement({ lanes: [off] }, r, { vehicle: DESIGN_TRUCK, extent })[0].code).toBe('vehicle-off-deck');
    expect(checkPlacement({ lanes: [{ left: 0, wheelOffset: ft(3) }] }, r, { vehicle: DESIGN_TRUCK })[0].code).toBe('longitudinal-missing');
  });

  it('bad input gives a typed error naming the field, never NaN', () => {
    const r = placementRules({ curbLeft: 0, curbRight: ft(40) });
    expect(() => clampPlacement({ lanes: [{ left: NaN, wheelOffset: 0 }] }, r)).toThrow(PlacementError);
    try {
      clampPlacement({ lanes: [{ left: NaN, wheelOffset: 0 }] }, r);
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as PlacementError).path).toEqual(['lanes', 0, 'left']);
    }
    expect(() => placementRules({ curbLeft: 0, curbRight: ft(11) })).toThrow(DeckInputError);
    expect(() => clampPlacement({ lanes: [{ left: 0, wheelOffset: 0 }] }, r, { dragged: 3 })).toThrow(/dragged/);
  });
});

describe('clampPlacement', () => {
  const rules = placementRules({ curbLeft: -ft(2), curbRight: ft(50) });
  const extent = { xMin: 0, xMax: ft(90) };
  const raw = fc.record({
    k: fc.integer({ min: 1, max: rules.laneCount }),
    lefts: fc.array(fc.double({ min: -30, max: 30, noNaN: true }), { minLength: 4, maxLength: 4 }),
    offsets: fc.array(fc.double({ min: -3, max: 6, noNaN: true }), { minLength: 4, maxLength: 4 }),
    xf: fc.array(fc.double({ min: -60, max: 90, noNaN: true }), { minLength: 4, maxLength: 4 }),
    dir: fc.array(fc.constantFrom(1 as const, -1 as const), { minLength: 4, maxLength: 4 }),
    s: fc.array(fc.double({ min: 0, max: 15, noNaN: true }), { minLength: 4, maxLength: 4 }),
    dragged: fc.option(fc.integer({ min: 0, max: 3 }), { nil: undefined }),
  });
  type Raw = typeof raw extends fc.Arbitrary<infer T> ? T : never;
  const build = (v: Raw): Placement => ({
    lanes: Array.from({ length: v.k }, (_, i) => ({
      left: v.lefts[i],
      wheelOffset: v.offsets[i],
      frontAxleAt: v.xf[i],
      direction: v.dir[i],
      axleSpacing: v.s[i],
    })),
  });

  it('always returns a legal placement (property, 2,000 random drags)', () => {
    fc.assert(
      fc.property(raw, (v) => {
        const d = v.dragged !== undefined && v.dragged < v.k ? v.dragged : undefined;
        const p = clampPlacement(build(v), rules, { dragged: d, vehicle: DESIGN_TRUCK, extent });
        expect(checkPlacement(p, rules, { vehicle: DESIGN_TRUCK, extent })).toEqual([]);
        expect(p.lanes.length).toBe(v.k);
      }),
      { numRuns: 2000 },
    );
  }, 60000);

  it('leaves a legal placement unchanged and is idempotent', () => {
    fc.assert(
      fc.property(raw, (v) => {
        const once = clampPlacement(build(v), rules, { vehicle: DESIGN_TRUCK, extent });
        const twice = clampPlacement(once, rules, { vehicle: DESIGN_TRUCK, extent });
        twice.lanes.forEach((l, i) => {
          expect(Math.abs(l.left - once.lanes[i].left)).toBeLessThanOrEqual(RULE_TOLERANCE);
          expect(l.wheelOffset).toBe(once.lanes[i].wheelOffset);
          expect(l.frontAxleAt).toBe(once.lanes[i].frontAxleAt);
        });
      }),
      { numRuns: 500 },
    );
  });

  it('the dragged lane stays where it is put and pushes its neighbour', () => {
    const p: Placement = { lanes: [{ left: 0, wheelOffset: ft(3) }, { left: ft(14), wheelOffset: ft(3) }] };
    const moved = clampPlacement({ lanes: [{ ...p.lanes[0], left: ft(6) }, p.lanes[1]] }, rules, { dragged: 0 });
    expect(moved.lanes[0].left).toBeRelativelyClose(ft(6), 1e-12);
    expect(moved.lanes[1].left).toBeRelativelyClose(ft(18), 1e-12);
    // dragged beyond the right curb: stops where lane 2 still fits
    const far = clampPlacement({ lanes: [{ ...p.lanes[0], left: ft(45) }, p.lanes[1]] }, rules, { dragged: 0 });
    expect(far.lanes[1].left).toBeRelativelyClose(ft(50) - ft(12), 1e-12);
    expect(far.lanes[0].left).toBeRelativelyClose(ft(50) - ft(24), 1e-12);
  });

  it('keeps at least one axle on the deck, travelling either way', () => {
    const r = frontAxleRange(DESIGN_TRUCK, 1, ft(14), extent);
    expect(r.min).toBe(0);
    expect(r.max).toBeRelativelyClose(ft(90 + 28), 1e-12);
    const p = withLongitudinal({ lanes: [{ left: 0, wheelOffset: ft(3) }] }, { frontAxleAt: -ft(100), direction: -1, axleSpacing: ft(20) });
    const c = clampPlacement(p, rules, { vehicle: DESIGN_TRUCK, extent });
    expect(c.lanes[0].frontAxleAt).toBeRelativelyClose(-ft(34), 1e-12);
  });
});
