/**
 * HL-93 vehicles and the fatigue truck against the AASHTO LRFD Bridge Design
 * Specifications: Art. 3.6.1.2.2 (design truck, Figure 3.6.1.2.2-1), Art. 3.6.1.2.3 (design
 * tandem), Art. 3.6.1.2.4 (design lane load), Art. 3.6.1.4.1 (fatigue truck).
 */
import { describe, expect, it } from 'vitest';
import {
  DESIGN_LANE_LOAD,
  DESIGN_TANDEM,
  DESIGN_TRUCK,
  DeckInputError,
  FATIGUE_TRUCK,
  LANE_LOAD_WIDTH,
  WHEEL_GAUGE,
  toUs,
  vehicleWeight,
  withAxleSpacing,
} from '../../../shared/index.js';

const kips = (v: { axles: { weight: number }[] }) => v.axles.map((a) => toUs.kip(a.weight));
const feet = (v: { axles: { position: number }[] }) => v.axles.map((a) => toUs.ft(a.position));

describe('vehicles (Art. 3.6.1.2, 3.6.1.4)', () => {
  it('design truck: 8, 32, 32 kip; 14 ft; rear spacing 14 ft to 30 ft; 6 ft gauge (Art. 3.6.1.2.2)', () => {
    kips(DESIGN_TRUCK).forEach((k, i) => expect(k).toBeRelativelyClose([8, 32, 32][i], 1e-12));
    feet(DESIGN_TRUCK).forEach((f, i) => expect(f).toBeCloseTo([0, 14, 28][i], 10));
    expect(DESIGN_TRUCK.variableSpacing?.axleIndex).toBe(2);
    expect(toUs.ft(DESIGN_TRUCK.variableSpacing!.min)).toBeRelativelyClose(14, 1e-12);
    expect(toUs.ft(DESIGN_TRUCK.variableSpacing!.max)).toBeRelativelyClose(30, 1e-12);
    expect(toUs.ft(DESIGN_TRUCK.gauge)).toBeRelativelyClose(6, 1e-12);
    expect(toUs.kip(vehicleWeight(DESIGN_TRUCK))).toBeRelativelyClose(72, 1e-12);
  });

  it('design tandem: 2 × 25 kip at 4 ft (Art. 3.6.1.2.3)', () => {
    kips(DESIGN_TANDEM).forEach((k) => expect(k).toBeRelativelyClose(25, 1e-12));
    expect(toUs.ft(DESIGN_TANDEM.axles[1].position)).toBeRelativelyClose(4, 1e-12);
    expect(DESIGN_TANDEM.variableSpacing).toBeUndefined();
    expect(toUs.ft(WHEEL_GAUGE)).toBeRelativelyClose(6, 1e-12);
  });

  it('fatigue truck: the design truck with a constant 30 ft rear spacing (Art. 3.6.1.4.1)', () => {
    kips(FATIGUE_TRUCK).forEach((k, i) => expect(k).toBeRelativelyClose([8, 32, 32][i], 1e-12));
    feet(FATIGUE_TRUCK).forEach((f, i) => expect(f).toBeCloseTo([0, 14, 44][i], 10));
    expect(FATIGUE_TRUCK.variableSpacing).toBeUndefined();
  });

  it('design lane load 0.64 klf over 10 ft (Art. 3.6.1.2.4)', () => {
    expect(toUs.klf(DESIGN_LANE_LOAD)).toBeRelativelyClose(0.64, 1e-12);
    expect(toUs.ft(LANE_LOAD_WIDTH)).toBeRelativelyClose(10, 1e-12);
  });

  it('withAxleSpacing fixes the rear spacing and moves the rear axle; 30 ft gives the fatigue truck layout', () => {
    const t = withAxleSpacing(DESIGN_TRUCK, DESIGN_TRUCK.variableSpacing!.max);
    t.axles.forEach((a, i) => expect(a.position).toBeCloseTo(FATIGUE_TRUCK.axles[i].position, 12));
    expect(t.variableSpacing).toBeUndefined();
    const mid = withAxleSpacing(DESIGN_TRUCK, 0.5 * (DESIGN_TRUCK.variableSpacing!.min + DESIGN_TRUCK.variableSpacing!.max));
    expect(toUs.ft(mid.axles[2].position)).toBeRelativelyClose(14 + 22, 1e-12);
  });

  it('withAxleSpacing rejects spacings outside 14–30 ft and vehicles without a variable spacing', () => {
    for (const bad of [DESIGN_TRUCK.variableSpacing!.min * 0.99, DESIGN_TRUCK.variableSpacing!.max * 1.01, Number.NaN]) {
      expect(() => withAxleSpacing(DESIGN_TRUCK, bad)).toThrow(DeckInputError);
    }
    try {
      withAxleSpacing(DESIGN_TANDEM, 2);
      throw new Error('expected an error');
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).path).toEqual(['axleSpacing']);
    }
  });
});
