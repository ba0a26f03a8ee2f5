/**
 * The deck view's plan geometry. Support line j is x = A_j + B_j·y with B_j = tan θ_j, span
 * lengths measured at the centreline of the girder group (the grillage mesh's convention,
 * shared/grillage/mesh.ts); plane geometry, hand derivation.
 */
import { describe, expect, it } from 'vitest';
import { assertDeck } from '@shared/deck/schema';
import { fromUs } from '@shared/units';
import { laneDrawings, planFrame, sectionDrawing, supportLineX, toPlan, toWorld } from '@/components/scene/sceneModel';
import { deckTemplate } from '@/components/deck/deckTemplates';

// The workspace's one-span precast starting deck: six girders at 9 ft 8 in, 110 ft span, 20° skew.
const deck = assertDeck(deckTemplate('precast-one-span').build());

describe('plan frame', () => {
  const f = planFrame(deck);

  it('runs support line 0 through girder 1 and keeps the span at the centreline', () => {
    expect(supportLineX(f, 0, 0)).toBe(0);
    // 110 ft span measured at y_c, the middle of the girder group (5 × 9 ft 8 in / 2).
    expect(f.yc).toBeRelativelyClose((5 * fromUs.ft(9 + 8 / 12)) / 2, 1e-12);
    expect(supportLineX(f, 1, f.yc) - supportLineX(f, 0, f.yc)).toBeRelativelyClose(fromUs.ft(110), 1e-12);
  });

  it('turns each support line by its skew: dx/dy = tan θ', () => {
    const dy = 5;
    expect((supportLineX(f, 0, dy) - supportLineX(f, 0, 0)) / dy).toBeRelativelyClose(Math.tan((20 * Math.PI) / 180), 1e-12);
    // Parallel supports: every girder has the same span.
    for (const y of f.offsets) expect(supportLineX(f, 1, y) - supportLineX(f, 0, y)).toBeRelativelyClose(fromUs.ft(110), 1e-12);
  });

  it('maps plan points to the view and back', () => {
    const [wx, , wz] = toWorld(f, 12.5, 3.25, 0.4);
    expect(toPlan(f, { x: wx, z: wz })).toEqual({ x: 12.5, y: 3.25 });
  });

  it('draws a precast girder at its entered depth d', () => {
    expect(sectionDrawing(deck).depth).toBeRelativelyClose(fromUs.in(72), 1e-12);
  });
});

describe('lanes as drawn', () => {
  it('puts the axles behind the front axle in the direction of travel', () => {
    const vehicle = { positions: [0, fromUs.ft(14), fromUs.ft(28)], weights: [1, 4, 4], gauge: fromUs.ft(6) };
    const [up] = laneDrawings([{ left: 1, wheelOffset: fromUs.ft(2), frontAxleAt: 20, direction: 1 }], fromUs.ft(12), vehicle, 0);
    expect(up.axles).toEqual([20, 20 - fromUs.ft(14), 20 - fromUs.ft(28)]);
    expect(up.wheels[1] - up.wheels[0]).toBeRelativelyClose(fromUs.ft(6), 1e-12);
    expect(up.right - up.left).toBeRelativelyClose(fromUs.ft(12), 1e-12);
    const [down] = laneDrawings([{ left: 1, wheelOffset: fromUs.ft(2), frontAxleAt: 20, direction: -1 }], fromUs.ft(12), vehicle, 0);
    expect(down.axles).toEqual([20, 20 + fromUs.ft(14), 20 + fromUs.ft(28)]);
  });
});
