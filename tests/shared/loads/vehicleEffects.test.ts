/**
 * Moving HL-93 vehicles on influence lines.
 *
 * Closed forms for a simple span L (ft, kip, kip·ft) — hand derivations, written out here:
 *
 * Truck at midspan (triangular line, peak L/4; the extreme has an axle at the peak):
 *   middle axle at the peak, 14 ft rear spacing: 32·L/4 + (8 + 32)·(L/4 − 7) = 18L − 280,
 *   with every axle on the span for L ≥ 28 ft; the other placements give 18L − 336 (rear
 *   axle at the peak) and 16L − 224 (front axle neglected), both smaller for L ≥ 28 ft.
 *   For L < 28 ft only the axle at the peak is on the span: 32·L/4 = 8L.
 * Truck, absolute maximum moment (the moment under an axle is greatest when midspan bisects
 *   the distance between that axle and the resultant of the loads on the span):
 *   resultant 18.667 ft behind the front axle = 4.667 ft (= 14/3) behind the middle axle;
 *   middle axle at x = L/2 − 7/3 ft:  M = 72·(L/2 − 7/3)²/L − 8·14 = 18L − 280 + 392/L.
 *   Valid while all three axles stay on the span (L ≥ 32.67 ft) and while it beats the two
 *   32 kip axles alone (front axle neglected or off the span), which give
 *   64·(L/2 − 3.5)²/L = 16L − 224 + 784/L at x = L/2 − 3.5 ft:
 *   (18L − 280 + 392/L) − (16L − 224 + 784/L) = 2L − 56 − 392/L ≥ 0  ⇔  L² − 28L − 196 ≥ 0
 *   ⇔  L ≥ 14 + √392 = 33.80 ft. Below 33.80 ft (and above 21 ft, both 32 kip axles on the
 *   span) the absolute maximum is 16L − 224 + 784/L.
 * Tandem at midspan: 25·L/4 + 25·(L/4 − 2) = 12.5L − 50 (L ≥ 8 ft); absolute maximum at
 *   x = L/2 − 1 ft: 50·(L/2 − 1)²/L = 12.5L − 50 + 50/L.
 * Lane load at midspan: 0.64·L²/8 = 0.08L²; end shear 0.64·L/2 = 0.32L.
 * End shear: truck (rear axle at the support, front axle last): 32 + 32(L − 14)/L +
 *   8(L − 28)/L = 72 − 672/L (L ≥ 28 ft); tandem 25 + 25(L − 4)/L = 50 − 100/L.
 * Fatigue truck at midspan (30 ft rear spacing): middle axle at the peak:
 *   32·L/4 + 8(L/4 − 7) + 32(L/4 − 15) = 18L − 536 for L ≥ 60 ft; for 28 ≤ L < 60 ft the
 *   rear axle is off the span: 10L − 56.
 *
 * Continuous spans have no such closed forms for a moving truck; there the engine is
 * checked against an independent brute-force search (dense positions and spacings) on the
 * three-moment-equation influence lines (see influenceLine.test.ts for their derivation).
 * The brute force can only find less (it samples), so the engine must be ≥ it and within
 * a small sampling margin above it.
 */
import { describe, expect, it } from 'vitest';
import {
  BeamAnalysis,
  DESIGN_LANE_LOAD,
  DESIGN_TANDEM,
  DESIGN_TRUCK,
  DeckInputError,
  FATIGUE_TRUCK,
  fromUs,
  influenceLine,
  maxVehicleEffect,
  toUs,
  twoDesignTrucks,
  uniformLoadEffect,
  type InfluenceLine,
  type Vehicle,
} from '../../../shared/index.js';

const RTOL = 1e-9;
const span = (Lft: number) => ({ spans: [fromUs.ft(Lft)], continuous: false });
const momentAt = (Lft: number, xft: number) => influenceLine(span(Lft), { kind: 'moment', x: fromUs.ft(xft) });
const kipFt = (nm: number) => toUs.kipFt(nm);

describe('simple span, closed forms (hand derivation above)', () => {
  it('design truck at midspan: 18L − 280 kip·ft (L ≥ 28 ft), 8L below', () => {
    for (const L of [28, 40, 60, 100, 110, 150, 200]) {
      const e = maxVehicleEffect(momentAt(L, L / 2), DESIGN_TRUCK, 'positive');
      expect(kipFt(e.value)).toBeRelativelyClose(18 * L - 280, RTOL);
      expect(toUs.ft(e.axleSpacing!)).toBeRelativelyClose(14, 1e-9); // shortest rear spacing governs
    }
    for (const L of [16, 20, 26]) expect(kipFt(maxVehicleEffect(momentAt(L, L / 2), DESIGN_TRUCK, 'positive').value)).toBeRelativelyClose(8 * L, RTOL);
  });

  it('design truck, absolute maximum: 18L − 280 + 392/L at L/2 − 7/3 ft for L ≥ 33.8 ft; 16L − 224 + 784/L at L/2 − 3.5 ft below', () => {
    for (const L of [34, 40, 60, 110, 160]) {
      const e = maxVehicleEffect(momentAt(L, L / 2 - 7 / 3), DESIGN_TRUCK, 'positive');
      expect(kipFt(e.value)).toBeRelativelyClose(18 * L - 280 + 392 / L, RTOL);
    }
    for (const L of [24, 30, 33]) {
      const e = maxVehicleEffect(momentAt(L, L / 2 - 3.5), DESIGN_TRUCK, 'positive');
      expect(kipFt(e.value)).toBeRelativelyClose(16 * L - 224 + 784 / L, RTOL);
    }
    // It is the maximum over the span: no section on a fine grid exceeds it.
    for (const L of [30, 60]) {
      const exact = L >= 14 + Math.sqrt(392) ? 18 * L - 280 + 392 / L : 16 * L - 224 + 784 / L;
      const a = new BeamAnalysis(span(L), { pointsPerSpan: 200 });
      let most = 0;
      for (let i = 0; i <= 200; i++) most = Math.max(most, kipFt(maxVehicleEffect(a.influenceLine({ kind: 'moment', x: a.nodes[i] }), DESIGN_TRUCK, 'positive').value));
      expect(most).toBeLessThanOrEqual(exact * (1 + 1e-9));
      expect(most).toBeGreaterThan(exact * (1 - 2e-4)); // the grid passes within L/400 of the critical section
    }
  });

  it('design tandem: 12.5L − 50 at midspan, 12.5L − 50 + 50/L at L/2 − 1 ft', () => {
    for (const L of [10, 30, 60, 110]) {
      expect(kipFt(maxVehicleEffect(momentAt(L, L / 2), DESIGN_TANDEM, 'positive').value)).toBeRelativelyClose(12.5 * L - 50, RTOL);
      expect(kipFt(maxVehicleEffect(momentAt(L, L / 2 - 1), DESIGN_TANDEM, 'positive').value)).toBeRelativelyClose(12.5 * L - 50 + 50 / L, RTOL);
    }
  });

  it('lane load: 0.08L² at midspan, 0.32L end shear', () => {
    for (const L of [20, 60, 110, 180]) {
      expect(kipFt(uniformLoadEffect(momentAt(L, L / 2), DESIGN_LANE_LOAD, 'positive'))).toBeRelativelyClose(0.08 * L * L, RTOL);
      const v = influenceLine(span(L), { kind: 'shear', x: 0, side: 'right' });
      expect(toUs.kip(uniformLoadEffect(v, DESIGN_LANE_LOAD, 'positive'))).toBeRelativelyClose(0.32 * L, RTOL);
      expect(uniformLoadEffect(momentAt(L, L / 2), DESIGN_LANE_LOAD, 'negative')).toBe(0);
    }
  });

  it('end shear: truck 72 − 672/L (L ≥ 28 ft), tandem 50 − 100/L', () => {
    for (const L of [28, 50, 110, 200]) {
      const v = influenceLine(span(L), { kind: 'shear', x: 0, side: 'right' });
      expect(toUs.kip(maxVehicleEffect(v, DESIGN_TRUCK, 'positive').value)).toBeRelativelyClose(72 - 672 / L, RTOL);
      expect(toUs.kip(maxVehicleEffect(v, DESIGN_TANDEM, 'positive').value)).toBeRelativelyClose(50 - 100 / L, RTOL);
      // The reaction line gives the same.
      const r = influenceLine(span(L), { kind: 'reaction', support: 0 });
      expect(toUs.kip(maxVehicleEffect(r, DESIGN_TRUCK, 'positive').value)).toBeRelativelyClose(72 - 672 / L, RTOL);
    }
  });

  it('fatigue truck at midspan: 18L − 536 (L ≥ 60 ft), 10L − 56 (28 ≤ L < 60 ft)', () => {
    for (const L of [60, 90, 150]) expect(kipFt(maxVehicleEffect(momentAt(L, L / 2), FATIGUE_TRUCK, 'positive').value)).toBeRelativelyClose(18 * L - 536, RTOL);
    for (const L of [30, 40, 55]) expect(kipFt(maxVehicleEffect(momentAt(L, L / 2), FATIGUE_TRUCK, 'positive').value)).toBeRelativelyClose(10 * L - 56, RTOL);
  });

  it('a line given only by stations (linear between them) gives the same truck moment', () => {
    const L = fromUs.ft(90);
    const tri: InfluenceLine = { xs: Float64Array.from([0, L / 2, L]), values: Float64Array.from([0, L / 4, 0]), at: () => 0 };
    expect(kipFt(maxVehicleEffect(tri, DESIGN_TRUCK, 'positive').value)).toBeRelativelyClose(18 * 90 - 280, RTOL);
  });

  it('reports where the axles stand: the middle axle on the peak, each ordinate and weight', () => {
    const L = 110;
    const e = maxVehicleEffect(momentAt(L, L / 2), DESIGN_TRUCK, 'positive');
    expect(toUs.ft(e.axles[1].position)).toBeRelativelyClose(L / 2, 1e-9);
    const sum = e.axles.reduce((s, a) => s + (a.counted ? a.weight * a.ordinate : 0), 0);
    expect(sum).toBeRelativelyClose(e.value, 1e-12);
  });
});

/** Independent brute force: dense front-axle positions, both directions, each layout. */
function bruteForce(f: (x: number) => number, total: number, layouts: { o: number[]; w: number[] }[], sense: 1 | -1, step: number): number {
  let best = 0;
  for (const { o, w } of layouts) {
    const len = o[o.length - 1];
    for (const d of [1, -1]) {
      for (let p = -len - step; p <= total + len + step; p += step) {
        let s = 0;
        for (let i = 0; i < o.length; i++) {
          const x = p - d * o[i];
          if (x < 0 || x > total) continue;
          const y = sense * f(x);
          if (y > 0) s += w[i] * y;
        }
        best = Math.max(best, s);
      }
    }
  }
  return best;
}

const W8 = fromUs.kip(8);
const W32 = fromUs.kip(32);
const ft = fromUs.ft;

function truckLayouts(stepFt: number) {
  const out: { o: number[]; w: number[] }[] = [];
  for (let s = 14; s <= 30 + 1e-9; s += stepFt) out.push({ o: [0, ft(14), ft(14 + s)], w: [W8, W32, W32] });
  return out;
}

function twoTruckLayouts(maxFt: number, stepFt: number) {
  const out: { o: number[]; w: number[] }[] = [];
  for (let g = 50; g <= maxFt + 1e-9; g += stepFt) {
    out.push({ o: [0, ft(14), ft(28), ft(28 + g), ft(42 + g), ft(56 + g)], w: [W8, W32, W32, W8, W32, W32] });
  }
  return out;
}

describe('two equal continuous spans: engine against an independent brute force on the three-moment lines', () => {
  const check = (engine: number, brute: number) => {
    expect(engine).toBeGreaterThanOrEqual(brute * (1 - 1e-9));
    expect(engine).toBeLessThanOrEqual(brute * (1 + 2e-3));
  };

  it('negative moment at the pier, single truck: the rear spacing is chosen (longer than 14 ft on short spans)', () => {
    for (const Lft of [40, 140]) {
      const L = ft(Lft);
      const mB = (x: number) => {
        const u = x <= L ? x / L : (2 * L - x) / L;
        return (-L / 4) * u * (1 - u * u);
      };
      const e = maxVehicleEffect(influenceLine({ spans: [L, L], continuous: true }, { kind: 'moment', x: L }), DESIGN_TRUCK, 'negative');
      check(-e.value, bruteForce(mB, 2 * L, truckLayouts(0.5), -1, ft(0.1)));
      if (Lft === 40) expect(toUs.ft(e.axleSpacing!)).toBeGreaterThan(14.5);
    }
  });

  it('negative moment at the pier and pier reaction, two design trucks with headway ≥ 50 ft', () => {
    const Lft = 140;
    const L = ft(Lft);
    const u = (x: number) => (x <= L ? x / L : (2 * L - x) / L);
    const mB = (x: number) => (-L / 4) * u(x) * (1 - u(x) ** 2);
    const rB = (x: number) => (3 * u(x) - u(x) ** 3) / 2;
    const two = twoDesignTrucks(2 * L);
    const a = new BeamAnalysis({ spans: [L, L], continuous: true });
    const em = maxVehicleEffect(a.influenceLine({ kind: 'moment', x: L }), two, 'negative');
    check(-em.value, bruteForce(mB, 2 * L, twoTruckLayouts(2 * Lft, 1), -1, ft(0.5)));
    expect(toUs.ft(em.axleSpacing!)).toBeGreaterThanOrEqual(50 - 1e-9);
    const er = maxVehicleEffect(a.influenceLine({ kind: 'reaction', support: 1 }), two, 'positive');
    check(er.value, bruteForce(rB, 2 * L, twoTruckLayouts(2 * Lft, 1), 1, ft(0.5)));
  });

  it('positive moment at 0.4 L of span 1, truck both senses', () => {
    const L = ft(90);
    const x = 0.4 * L;
    const f = (xi: number) => {
      const simple = xi <= L ? (xi <= x ? (xi * (L - x)) / L : (x * (L - xi)) / L) : 0;
      const v = xi <= L ? xi / L : (2 * L - xi) / L;
      return simple + ((-L / 4) * v * (1 - v * v) * x) / L;
    };
    const line = influenceLine({ spans: [L, L], continuous: true }, { kind: 'moment', x });
    check(maxVehicleEffect(line, DESIGN_TRUCK, 'positive').value, bruteForce(f, 2 * L, truckLayouts(0.5), 1, ft(0.1)));
    check(-maxVehicleEffect(line, DESIGN_TRUCK, 'negative').value, bruteForce(f, 2 * L, truckLayouts(0.5), -1, ft(0.1)));
  });

  it('lane load on the negative portions at the pier: −0.08L² (uniform load on both spans, −wL²/8); pier reaction 1.25·wL = 0.8L kip', () => {
    for (const Lft of [60, 140]) {
      const L = ft(Lft);
      const a = new BeamAnalysis({ spans: [L, L], continuous: true });
      expect(kipFt(uniformLoadEffect(a.influenceLine({ kind: 'moment', x: L }), DESIGN_LANE_LOAD, 'negative'))).toBeRelativelyClose(-0.08 * Lft * Lft, RTOL);
      expect(toUs.kip(uniformLoadEffect(a.influenceLine({ kind: 'reaction', support: 1 }), DESIGN_LANE_LOAD, 'positive'))).toBeRelativelyClose(0.8 * Lft, RTOL);
    }
  });
});

describe('bad input', () => {
  const line = momentAt(50, 25);
  it('rejects a bad sense and bad vehicles with typed errors', () => {
    expect(() => maxVehicleEffect(line, DESIGN_TRUCK, 'up' as 'positive')).toThrow(DeckInputError);
    const noAxles: Vehicle = { name: 'empty', axles: [], gauge: 1 };
    expect(() => maxVehicleEffect(line, noAxles, 'positive')).toThrow(/at least one axle/);
    const negative: Vehicle = { name: 'bad', axles: [{ weight: -1, position: 0 }], gauge: 1 };
    try {
      maxVehicleEffect(line, negative, 'positive');
      throw new Error('expected an error');
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).path).toEqual(['vehicle', 'axles', 0, 'weight']);
    }
    expect(() => uniformLoadEffect(line, -3, 'positive')).toThrow(DeckInputError);
  });
});
