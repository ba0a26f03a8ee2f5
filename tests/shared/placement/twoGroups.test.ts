/**
 * The exact search of a vehicle with several axles behind its variable gap (two rigid groups,
 * shared/placement/twoGroups.ts) against the plain form of the search (every candidate of
 * longitudinal.ts's header, cases A and B) and a dense scan, on random lines; and the two
 * design trucks of AASHTO LRFD Art. 3.6.1.3.1 (14 ft rear spacings, at least 50 ft from the
 * rear axle of one to the lead axle of the other) over the pier of two equal continuous spans,
 * whose negative moment each truck adds to (closed form: both trucks over the middles of the
 * two spans, the position an engineer checks by hand; the search may only do better).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { twoDesignTrucks } from '../../../shared/loads/beamLine.js';
import { influenceLine, maxVehicleEffect } from '../../../shared/loads/influenceLine.js';
import type { Vehicle } from '../../../shared/loads/vehicles.js';
import { bestVehicleOnLine, bestVehicleOnLineReference, lineAt, stationLine, vehicleShape } from '../../../shared/placement/longitudinal.js';
import { axlePositions } from '../../../shared/placement/rules.js';
import { bestTwoGroupsOnLine } from '../../../shared/placement/twoGroups.js';
import { fromUs } from '../../../shared/units.js';

const ft = fromUs.ft;

const valueAt = (line: ReturnType<typeof stationLine>, v: Vehicle, xf: number, d: 1 | -1, s: number | undefined) =>
  axlePositions(v, s).reduce((sum, p, k) => sum + v.axles[k].weight * Math.max(0, lineAt(line, xf - d * p)), 0);

describe('two rigid groups with a variable gap', () => {
  const vehicles: Vehicle[] = [
    twoDesignTrucks(ft(300)),
    {
      name: 'test pair',
      axles: [
        { weight: 10, position: 0 },
        { weight: 30, position: 3 },
        { weight: 20, position: 8 },
        { weight: 25, position: 10 },
        { weight: 5, position: 11 },
      ],
      gauge: ft(6),
      variableSpacing: { axleIndex: 2, min: 5, max: 9 },
    },
  ];

  it('equals the plain form of the search on random lines, and its position gives its value', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0.5, max: 8, noNaN: true }), { minLength: 3, maxLength: 25 }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 26, maxLength: 26 }),
        fc.constantFrom(0, 1),
        (gaps, ords, which) => {
          const v = vehicles[which];
          const xs = [0];
          for (const g of gaps) xs.push(xs[xs.length - 1] + g);
          const line = stationLine(xs, xs.map((_, i) => ords[i]));
          const shape = vehicleShape(v);
          const fast = bestTwoGroupsOnLine(line, shape);
          const plain = bestVehicleOnLineReference(line, shape);
          const scale = v.axles.reduce((s, a) => s + a.weight, 0) * Math.max(...ords.map(Math.abs), 1e-300);
          // 1e-8 of the problem's magnitude, as longitudinal.test.ts allows the two forms of the
          // one-gap search: the forms reach an axle on the 1 µm end ramp by different roundings
          // (one drawn case differed by 3e-9 of the effect, 1.2e-9 of the scale)
          expect(Math.abs(fast.value - plain.value)).toBeLessThanOrEqual(1e-8 * Math.max(scale, plain.value));
          // the dispatcher uses it for such vehicles
          expect(bestVehicleOnLine(line, shape).value).toBe(fast.value);
          if (fast.value > 0) {
            expect(fast.axleSpacing!).toBeGreaterThanOrEqual(v.variableSpacing!.min - 1e-12);
            expect(fast.axleSpacing!).toBeLessThanOrEqual(v.variableSpacing!.max + 1e-12);
            // relative to the problem's magnitude (total weight × largest ordinate), as above; 1e-7
            // of it because an axle recomputed from the front axle can land a rounding error onto
            // the 1 µm ramp beyond a deck end, whose slope is the end ordinate over 1e-6 m
            expect(Math.abs(valueAt(line, v, fast.frontAxleAt, fast.direction, fast.axleSpacing) - fast.value)).toBeLessThanOrEqual(1e-7 * Math.max(scale, fast.value));
          }
        },
      ),
      { numRuns: 60 },
    );
  }, 60000);

  it('over the pier of two equal 100 ft continuous spans: at least the hand position with one truck in each span', () => {
    const L = ft(100);
    const line0 = influenceLine({ spans: [L, L], continuous: true }, { kind: 'moment', x: L });
    const xs = Array.from({ length: 401 }, (_, i) => (2 * L * i) / 400);
    const line = stationLine(xs, xs.map((x) => -line0.at(x)));
    const v = twoDesignTrucks(ft(400));
    const best = bestTwoGroupsOnLine(line, vehicleShape(v));
    // hand position: each truck's middle axle at the middle of a span, travelling +x
    const mid1 = L / 2;
    const mid2 = 1.5 * L;
    const xf = mid2 + ft(14);
    const headway = xf - ft(28) - (mid1 + ft(14));
    expect(headway).toBeGreaterThanOrEqual(ft(50));
    const hand = valueAt(line, v, xf, 1, headway);
    expect(best.value).toBeGreaterThanOrEqual(hand * (1 - 1e-12));
    // and one truck alone gives less than two (both spans hog the pier)
    const one = maxVehicleEffect(line0, { ...v, axles: v.axles.slice(0, 3), variableSpacing: undefined }, 'negative').value;
    expect(best.value).toBeGreaterThan(-one * 1.2);
  });
});
