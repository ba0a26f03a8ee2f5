/**
 * HL-93 beam-line envelopes (one design lane), AASHTO LRFD Art. 3.6.1.3.1 and
 * Table 3.6.2.1-1.
 *
 * Hand derivations used (see vehicleEffects.test.ts for the vehicle closed forms):
 * - Simple span, midspan: LL+IM = max[1.33·(18L − 280), 1.33·(12.5L − 50)] + 0.08L² kip·ft;
 *   end shear: max[1.33·(72 − 672/L), 1.33·(50 − 100/L)] + 0.32L kip; the fatigue truck:
 *   1.15·(18L − 536) (L ≥ 60 ft). IM 33 % on truck and tandem only, 15 % for fatigue
 *   (Table 3.6.2.1-1).
 * - Two equal continuous spans under a uniform load on both: M(x) = wx(L − x)/2 − (wL²/8)(x/L)
 *   in span 1, zero at x = 3L/4 — the points of contraflexure are at 0.75 L and 1.25 L
 *   (three-moment equation, hand derivation). Between them the negative moment also takes
 *   0.90·[(1 + IM)·(two trucks) + lane] (Art. 3.6.1.3.1); so does the pier reaction.
 * - Identities (common practice, no source): mirror symmetry of a symmetric beam;
 *   max ≥ 0 ≥ min; every value is finite.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  BeamAnalysis,
  DESIGN_LANE_LOAD,
  DESIGN_TANDEM,
  DESIGN_TRUCK,
  DeckInputError,
  IM_DECK_JOINTS,
  IM_FATIGUE,
  IM_STRENGTH_SERVICE,
  TWO_TRUCK_REDUCTION,
  fromUs,
  hl93BeamLineEffects,
  maxVehicleEffect,
  toUs,
  twoDesignTrucks,
  uniformLoadEffect,
  type BeamModel,
} from '../../../shared/index.js';

const RTOL = 1e-9;
const ft = fromUs.ft;

describe('constants (Table 3.6.2.1-1, Art. 3.6.1.3.1)', () => {
  it('IM 33 %, 15 % fatigue, 75 % deck joints; two trucks at 90 % with ≥ 50 ft headway', () => {
    expect(IM_STRENGTH_SERVICE).toBe(0.33);
    expect(IM_FATIGUE).toBe(0.15);
    expect(IM_DECK_JOINTS).toBe(0.75);
    expect(TWO_TRUCK_REDUCTION).toBe(0.9);
    const two = twoDesignTrucks(ft(500));
    expect(two.axles.map((a) => Math.round(toUs.ft(a.position) * 1e6) / 1e6)).toEqual([0, 14, 28, 78, 92, 106]);
    expect(toUs.ft(two.variableSpacing!.min)).toBeRelativelyClose(50, 1e-12);
  });
});

describe('simple span envelopes (hand derivation)', () => {
  it('L = 110 ft: midspan 1.33·1700 + 968 kip·ft (truck governs), end shear, reaction, fatigue', () => {
    const L = 110;
    const r = hl93BeamLineEffects({ spans: [ft(L)], continuous: false });
    expect(r.points.map((p) => p.fraction)).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]);
    const mid = r.points[5];
    expect(toUs.ft(mid.x)).toBeRelativelyClose(55, 1e-12);
    expect(toUs.kipFt(mid.moment.max.value)).toBeRelativelyClose(1.33 * (18 * L - 280) + 0.08 * L * L, RTOL);
    expect(mid.moment.max.governing).toBe('design truck');
    expect(toUs.kipFt(mid.moment.max.laneEffect)).toBeRelativelyClose(0.08 * L * L, RTOL);
    expect(toUs.ft(mid.moment.max.position!.axleSpacing!)).toBeRelativelyClose(14, 1e-9);
    expect(mid.moment.min.value).toBe(0);
    expect(mid.moment.min.governing).toBe('none');
    const end = r.points[0];
    const shear = 1.33 * (72 - 672 / L) + 0.32 * L;
    expect(toUs.kip(end.shear.max.value)).toBeRelativelyClose(shear, RTOL);
    expect(end.shearSide).toBe('right');
    expect(r.points[10].shearSide).toBe('left');
    expect(toUs.kip(r.points[10].shear.min.value)).toBeRelativelyClose(-shear, RTOL);
    expect(toUs.kip(r.reactions[0].reaction.max.value)).toBeRelativelyClose(shear, RTOL);
    expect(toUs.kipFt(mid.fatigueMoment!.max.value)).toBeRelativelyClose(1.15 * (18 * L - 536), RTOL);
    expect(mid.fatigueMoment!.max.governing).toBe('fatigue truck');
    expect(r.contraflexurePoints).toEqual([]);
    expect(r.points.every((p) => !p.negativeMomentRegion)).toBe(true);
  });

  it('L = 30 ft: the tandem governs at midspan (12.5L − 50 = 325 > 18L − 280 = 260)', () => {
    const L = 30;
    const mid = hl93BeamLineEffects({ spans: [ft(L)], continuous: false }).points[5];
    expect(mid.moment.max.governing).toBe('design tandem');
    expect(toUs.kipFt(mid.moment.max.value)).toBeRelativelyClose(1.33 * (12.5 * L - 50) + 0.08 * L * L, RTOL);
    const truck = mid.moment.max.candidates.find((c) => c.loading === 'design truck')!;
    expect(toUs.kipFt(truck.value)).toBeRelativelyClose(1.33 * (18 * L - 280) + 0.08 * L * L, RTOL);
  });

  it('a chain of simple spans: each span behaves as a single span; the pier reaction takes two trucks into account', () => {
    const r = hl93BeamLineEffects({ spans: [ft(60), ft(60)], continuous: false });
    const single = hl93BeamLineEffects({ spans: [ft(60)], continuous: false });
    for (let i = 0; i <= 10; i++) {
      expect(r.points[i].moment.max.value).toBeRelativelyClose(single.points[i].moment.max.value, 1e-9);
      expect(r.points[11 + i].moment.max.value).toBeRelativelyClose(single.points[i].moment.max.value, 1e-9);
    }
    expect(r.reactions[1].interior).toBe(true);
    expect(r.reactions[1].reaction.max.candidates.map((c) => c.loading)).toContain('two design trucks');
  });
});

describe('two equal continuous spans', () => {
  const Lft = 100;
  const L = ft(Lft);
  const beam: BeamModel = { spans: [L, L], continuous: true };
  const r = hl93BeamLineEffects(beam);

  it('points of contraflexure under uniform load at 0.75 L and 1.25 L; the negative-moment region between them', () => {
    expect(r.contraflexurePoints.length).toBe(2);
    expect(r.contraflexurePoints[0]).toBeRelativelyClose(0.75 * L, 1e-9);
    expect(r.contraflexurePoints[1]).toBeRelativelyClose(1.25 * L, 1e-9);
    const flags = r.points.map((p) => `${p.span}:${p.fraction}:${p.negativeMomentRegion}`);
    expect(flags.filter((f) => f.endsWith('true'))).toEqual(['0:0.8:true', '0:0.9:true', '0:1:true', '1:0:true', '1:0.1:true', '1:0.2:true']);
  });

  it('pier moment: the most negative of truck + lane, tandem + lane and 0.90·[1.33·(two trucks) + lane]; lane −0.08L²', () => {
    const pier = r.points[10];
    const line = new BeamAnalysis(beam).influenceLine({ kind: 'moment', x: L });
    const lane = uniformLoadEffect(line, DESIGN_LANE_LOAD, 'negative');
    expect(toUs.kipFt(lane)).toBeRelativelyClose(-0.08 * Lft * Lft, RTOL);
    const truck = maxVehicleEffect(line, DESIGN_TRUCK, 'negative').value;
    const tandem = maxVehicleEffect(line, DESIGN_TANDEM, 'negative').value;
    const two = maxVehicleEffect(line, twoDesignTrucks(2 * L), 'negative').value;
    const expected = Math.min(1.33 * truck + lane, 1.33 * tandem + lane, 0.9 * (1.33 * two + lane));
    expect(pier.moment.min.value).toBeRelativelyClose(expected, RTOL);
    expect(pier.moment.min.governing).toBe('two design trucks');
    expect(pier.moment.min.reduction).toBe(0.9);
    // Two trucks are not applied outside the negative-moment region.
    expect(r.points[5].moment.min.candidates.map((c) => c.loading)).not.toContain('two design trucks');
    expect(r.points[9].moment.min.candidates.map((c) => c.loading)).toContain('two design trucks');
    // Where the trace says so.
    expect(pier.moment.min.trace.some((s) => s.article.includes('3.6.1.3.1'))).toBe(true);
    expect(pier.moment.min.trace.some((s) => s.article.includes('Table 3.6.2.1-1'))).toBe(true);
  });

  it('pier reaction: two design trucks considered for the maximum; lane part 0.8L kip', () => {
    const pier = r.reactions[1];
    expect(pier.interior).toBe(true);
    expect(pier.reaction.max.candidates.map((c) => c.loading)).toContain('two design trucks');
    expect(toUs.kip(pier.reaction.max.laneEffect)).toBeRelativelyClose(0.8 * Lft, RTOL);
    expect(r.reactions[0].reaction.max.candidates.map((c) => c.loading)).not.toContain('two design trucks');
  });

  it('mirror symmetry: moment at f of span 1 equals moment at 1 − f of span 2; shears change sign', () => {
    for (let i = 0; i <= 10; i++) {
      const a = r.points[i];
      const b = r.points[21 - i];
      expect(a.moment.max.value).toBeRelativelyClose(b.moment.max.value, 1e-9);
      expect(a.moment.min.value).toBeRelativelyClose(b.moment.min.value, 1e-9);
      expect(a.shear.max.value).toBeRelativelyClose(-b.shear.min.value, 1e-9);
    }
  });
});

describe('properties (fast-check)', () => {
  it('every envelope is finite, max ≥ 0 ≥ min, and the value is that of the governing loading', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 3, max: 90, noNaN: true }), { minLength: 1, maxLength: 4 }),
        fc.boolean(),
        (spans, continuous) => {
          const r = hl93BeamLineEffects({ spans, continuous });
          const extremes = r.points.flatMap((p) => [p.moment, p.shear, p.fatigueMoment!, p.fatigueShear!]).concat(r.reactions.map((q) => q.reaction));
          for (const env of extremes) {
            expect(Number.isFinite(env.max.value) && Number.isFinite(env.min.value)).toBe(true);
            expect(env.max.value).toBeGreaterThanOrEqual(env.min.value);
            expect(env.max.value).toBeGreaterThanOrEqual(0);
            expect(env.min.value).toBeLessThanOrEqual(0);
            for (const e of [env.max, env.min]) {
              if (e.governing === 'none') continue;
              expect(e.candidates.find((c) => c.loading === e.governing)!.value).toBe(e.value);
            }
          }
        },
      ),
      { numRuns: 25 },
    );
  });
});

describe('bad input', () => {
  it('rejects bad fractions and bad beams with typed errors', () => {
    expect(() => hl93BeamLineEffects({ spans: [10], continuous: false }, { fractions: [0.5, 1.2] })).toThrow(DeckInputError);
    expect(() => hl93BeamLineEffects({ spans: [10], continuous: false }, { fractions: [] })).toThrow(DeckInputError);
    expect(() => hl93BeamLineEffects({ spans: [10, -1], continuous: true })).toThrow(/span 2/);
    expect(() => hl93BeamLineEffects({ spans: [], continuous: true })).toThrow(/at least one span/);
  });
});
