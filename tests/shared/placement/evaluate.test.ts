/**
 * One placement's effect. Sources:
 * - Closed form for a simple span (hand derivation by statics): the midspan moment influence
 *   line is a triangle of height L/4, so the design lane load (0.64 klf, Art. 3.6.1.2.4) gives
 *   0.64·L²/8 = 0.08·L² kip·ft and the design truck with its 32 kip axle at midspan and 14 ft
 *   spacings gives 18L − 280 kip·ft (Art. 3.6.1.2.2).
 * - Multiple presence factors, Table 3.6.1.1.2-1; neglected axles, Art. 3.6.1.3.1.
 */
import { describe, expect, it } from 'vitest';
import { DESIGN_TRUCK } from '../../../shared/loads/vehicles.js';
import { evaluateSurface, evaluateTransverse } from '../../../shared/placement/evaluate.js';
import { placementRules, PlacementError } from '../../../shared/placement/rules.js';
import { sampleSurface, type SurfaceLike } from '../../../shared/placement/sampledSurface.js';
import { rigidSectionLine } from '../../../shared/placement/transverseLines.js';
import { fromUs, toUs } from '../../../shared/units.js';

const ft = fromUs.ft;
const L = ft(80);
const width = ft(40);
/** A deck whose every wheel line sees the simple-span midspan moment line (a beam-line surface). */
const beamLine: SurfaceLike = {
  extent: { xMin: 0, xMax: L, yMin: -ft(2), yMax: width },
  at: (x, y) => (x < 0 || x > L || y < -ft(2) || y > width ? 0 : x <= L / 2 ? x / 2 : (L - x) / 2),
};
const rules = placementRules({ curbLeft: 0, curbRight: ft(38) });

describe('evaluateSurface', () => {
  it('design truck with its 32 kip axle at midspan: 18L − 280 kip·ft per lane, × m', () => {
    const lane = { left: ft(3), wheelOffset: ft(3), frontAxleAt: L / 2 + ft(14), direction: 1 as const, axleSpacing: ft(14) };
    const one = evaluateSurface(beamLine, { lanes: [lane] }, rules, DESIGN_TRUCK);
    expect(toUs.kipFt(one.lanes[0].vehicleValue)).toBeRelativelyClose(18 * 80 - 280, 1e-12);
    expect(one.value).toBeRelativelyClose(1.2 * one.lanes[0].vehicleValue, 1e-12);
    const two = evaluateSurface(beamLine, { lanes: [lane, { ...lane, left: ft(20) }] }, rules, DESIGN_TRUCK);
    expect(two.multiplePresence).toBe(1);
    expect(two.value).toBeRelativelyClose(2 * one.lanes[0].vehicleValue, 1e-12);
    const three = evaluateSurface(beamLine, { lanes: [{ ...lane, left: 0 }, { ...lane, left: ft(12) }, { ...lane, left: ft(24) }] }, rules, DESIGN_TRUCK);
    expect(three.multiplePresence).toBe(0.85);
    expect(evaluateSurface(beamLine, { lanes: [lane] }, rules, DESIGN_TRUCK, { multiplePresence: false }).value).toBeRelativelyClose(one.lanes[0].vehicleValue, 1e-12);
  });

  it('design lane load over the whole span: 0.08·L² kip·ft, on the surface and on its sample', () => {
    const lane = { left: ft(3), wheelOffset: ft(3), frontAxleAt: L / 2 + ft(14), direction: 1 as const, axleSpacing: ft(14) };
    const e = evaluateSurface(beamLine, { lanes: [lane] }, rules, DESIGN_TRUCK, { laneLoad: {} });
    expect(toUs.kipFt(e.lanes[0].laneLoadValue)).toBeRelativelyClose(0.08 * 80 * 80, 1e-4);
    const sampled = sampleSurface(beamLine, { xs: [0, L / 2, L], ys: [-ft(2), width] });
    const es = evaluateSurface(sampled, { lanes: [lane] }, rules, DESIGN_TRUCK, { laneLoad: {} });
    expect(toUs.kipFt(es.lanes[0].laneLoadValue)).toBeRelativelyClose(0.08 * 80 * 80, 1e-12);
  });

  it('lane load only where it adds: over the positive part of a line that changes sign', () => {
    // η = x − L/2 (negative then positive): positive part ∫ = (L/2)²/2, lane load effect w·L²/8.
    const s: SurfaceLike = { extent: beamLine.extent, at: (x, y) => (x < 0 || x > L || y < -ft(2) || y > width ? 0 : x - L / 2) };
    const sampled = sampleSurface(s, { xs: [0, L / 2, L], ys: [-ft(2), width] });
    const lane = { left: ft(3), wheelOffset: ft(3), frontAxleAt: L, direction: 1 as const, axleSpacing: ft(14) };
    const pos = evaluateSurface(sampled, { lanes: [lane] }, rules, DESIGN_TRUCK, { laneLoad: {}, sense: 'positive' });
    expect(toUs.kipFt(pos.lanes[0].laneLoadValue)).toBeRelativelyClose(0.08 * 80 * 80, 1e-12);
    const neg = evaluateSurface(sampled, { lanes: [lane] }, rules, DESIGN_TRUCK, { laneLoad: {}, sense: 'negative' });
    expect(toUs.kipFt(neg.lanes[0].laneLoadValue)).toBeRelativelyClose(-0.08 * 80 * 80, 1e-12);
  });

  it('neglects axles that do not contribute (Art. 3.6.1.3.1), or counts all when asked', () => {
    const s: SurfaceLike = { extent: beamLine.extent, at: (x) => (x < 0 || x > L ? 0 : x < ft(20) ? -1 : 1) };
    // front axle at 30 ft: front (8 k) at 30 ft counts +1; middle at 16 ft and rear at 2 ft count −1 each
    const lane = { left: ft(3), wheelOffset: ft(3), frontAxleAt: ft(30), direction: 1 as const, axleSpacing: ft(14) };
    const e = evaluateSurface(s, { lanes: [lane] }, rules, DESIGN_TRUCK, { multiplePresence: false });
    expect(toUs.kip(e.value)).toBeRelativelyClose(8, 1e-12);
    expect(e.lanes[0].axles!.map((a) => a.counted)).toEqual([true, false, false]);
    const all = evaluateSurface(s, { lanes: [lane] }, rules, DESIGN_TRUCK, { multiplePresence: false, countAdverseAxles: true });
    expect(toUs.kip(all.value)).toBeRelativelyClose(8 - 64, 1e-12);
    const neg = evaluateSurface(s, { lanes: [lane] }, rules, DESIGN_TRUCK, { multiplePresence: false, sense: 'negative' });
    expect(toUs.kip(neg.value)).toBeRelativelyClose(-64, 1e-12);
  });

  it('refuses an illegal placement with the rule in plain words', () => {
    const lane = { left: ft(30), wheelOffset: ft(3), frontAxleAt: ft(30), direction: 1 as const, axleSpacing: ft(14) };
    expect(() => evaluateSurface(beamLine, { lanes: [lane] }, rules, DESIGN_TRUCK)).toThrow(PlacementError);
    expect(() => evaluateSurface(beamLine, { lanes: [lane] }, rules, DESIGN_TRUCK)).toThrow(/right curb face/);
  });
});

describe('evaluateTransverse', () => {
  it('rigid section, one truck 2 ft from the curb: m·(1/Nb + x·e/Σx²) (Eq. C4.6.2.2.2d-1), hand computation', () => {
    const offsets = [0, ft(8), ft(16), ft(24), ft(32)];
    const r = placementRules({ curbLeft: -ft(2), curbRight: ft(34) });
    const line = rigidSectionLine(offsets, 0, r.curbLeft, r.curbRight);
    const e = evaluateTransverse(line, { lanes: [{ left: r.curbLeft, wheelOffset: ft(2) }] }, r);
    // truck centre at 3 ft from girder 1; girders' centre at 16 ft: e = 13 ft; x = 16 ft; Σx² = 2·(8² + 16²) = 640 ft²
    expect(e.value).toBeRelativelyClose(1.2 * (1 / 5 + (16 * 13) / 640), 1e-12);
  });
});
