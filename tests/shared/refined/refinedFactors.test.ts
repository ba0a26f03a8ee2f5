/**
 * Refined (grillage) distribution factors through the whole chain: mesh, factorisation,
 * influence surfaces, sampling, governing placement, beam-line normalisation.
 *
 * Sources
 * - Rigid-section method: commentary to AASHTO LRFD Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1,
 *   R = NL/Nb + X_ext·Σe/Σx² (with m, Table 3.6.1.1.2-1): a grillage with very stiff
 *   transverse members and no torsion must give it.
 * - Comparisons of the Art. 4.6.2.2 formulas with refined analyses (NCHRP Report 592,
 *   "Simplified Live Load Distribution Factor Equations", 2007, from memory: the formulas are
 *   generally conservative for right slab-on-girder decks within their range): here the
 *   refined factor must not exceed the code's governing value by more than 5 % (a tolerance
 *   for the model's idealisation), and must not fall below 60 % of it (a sanity floor).
 * - Skew: the code reduces the interior moment factor for θ from 30° to 60° (Art. 4.6.2.2.2e,
 *   1 − c1·(tan θ)^1.5); with transverse members perpendicular to the girders the refined
 *   interior moment factor must fall as θ rises over that range too.
 * - Statics (beam theory): on a right simple span the girder moments across a section sum to
 *   the static moment of the loads, so one lane's girder shares of its beam-line moment sum
 *   to m = 1.2 when the truck stands where the beam-line moment is largest.
 * - Mesh convergence (common practice, no source): < 1 % change from the default mesh to
 *   twice its density.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { deckGeometry } from '../../../shared/deck/geometry.js';
import { DeckInputError } from '../../../shared/deck/schema.js';
import { computeRefinedFactors, REFINED_SEGMENTS_PER_SPAN, type RefinedFactor, type RefinedResult } from '../../../shared/grillage/refinedFactors.js';
import { buildGrillage, influenceSurfaces } from '../../../shared/grillage/index.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { DESIGN_TRUCK } from '../../../shared/loads/vehicles.js';
import { evaluateSurface, evaluateTransverse } from '../../../shared/placement/evaluate.js';
import { clampPlacement, placementRulesForDeck } from '../../../shared/placement/rules.js';
import { governingTransversePlacement } from '../../../shared/placement/search.js';
import { rigidSectionLine, transverseAt } from '../../../shared/placement/transverseLines.js';
import { fromUs } from '../../../shared/units.js';
import { bulbTeeDeck, steelGirderDeck } from './fixtures.js';

const find = (r: RefinedResult, girder: number, effect: RefinedFactor['effect'], pick: (f: RefinedFactor) => boolean = () => true) =>
  r.factors.filter((f) => f.girder === girder && f.effect === effect && pick(f));

describe('rigid limit (commentary to Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1)', () => {
  // Five equal girders (overhang S/2 makes the exterior flange equal), transverse EI × 10⁶, no torsion.
  const deck = steelGirderDeck({ girders: 5, spacingFt: 8, overhangFt: 4, barrierFt: 1.25 });
  const refined = computeRefinedFactors(deck, { grillage: { transverseStiffnessFactor: 1e6, torsionFactor: 0 }, effects: ['moment'] });
  const rules = placementRulesForDeck(deck);
  const geo = deckGeometry(deck);
  for (let g = 0; g < 5; g++) {
    it(`girder ${g + 1}: the grillage gives the rigid-section factor`, () => {
      const line = rigidSectionLine(geo.offsets, g, geo.curbLeft, geo.curbRight);
      const rigid = governingTransversePlacement(line, rules);
      const f = find(refined, g, 'moment')[0];
      // 5e-3: EI × 10⁶ is very stiff, not rigid, and the search takes the largest of the tiny differences
      expect(f.value).toBeRelativelyClose(rigid.value, 5e-3);
      // Each lane count whose trucks all bear on the girder's side (no axle neglected) matches too.
      rigid.byLaneCount.forEach((r, i) => {
        const allPositive = r.placement.lanes.every((l) => [l.left + l.wheelOffset, l.left + l.wheelOffset + rules.gauge].every((y) => transverseAt(line, y) >= 0));
        if (allPositive) expect(f.byLaneCount[i].factor).toBeRelativelyClose(r.value, 5e-3);
        // never below: dropping a truck's adverse share can only raise the grillage's value
        expect(f.byLaneCount[i].factor).toBeGreaterThanOrEqual(r.value * (1 - 5e-3));
      });
    });
  }
});

describe('right decks within the formulas’ range: refined at or below the code (NCHRP Report 592)', () => {
  for (const deck of [steelGirderDeck(), bulbTeeDeck()]) {
    it(deck.name, () => {
      const refined = computeRefinedFactors(deck, { effects: ['moment', 'shear'] });
      const code = computeCodeFactors(deck);
      for (const effect of ['moment', 'shear'] as const) {
        for (const kind of ['interior', 'exterior'] as const) {
          const governing = code.governing.find((x) => x.girder === kind && x.effect === effect)!;
          const rows = refined.rows.filter((r) => r.effect === effect && r.girderKind === kind);
          const top = Math.max(...rows.map((r) => r.value));
          expect(top).toBeLessThanOrEqual(governing.value * 1.05);
          expect(top).toBeGreaterThanOrEqual(governing.value * 0.6);
        }
      }
    });
  }
});

describe('skew (Art. 4.6.2.2.2e): with perpendicular transverse members the interior moment factor falls from 30° to 60°', () => {
  const skews = [30, 45, 60];
  const results = skews.map((skew) => {
    const deck = steelGirderDeck({ skew });
    const refined = computeRefinedFactors(deck, { grillage: { layout: 'perpendicular' }, effects: ['moment'] });
    const code = computeCodeFactors(deck).governing.find((x) => x.girder === 'interior' && x.effect === 'moment')!.value;
    const interior = Math.max(...refined.factors.filter((f) => f.girderKind === 'interior').map((f) => f.value));
    return { skew, interior, code, layout: refined.layout };
  });
  it('refined and code values both decrease, and by comparable amounts', () => {
    results.forEach((r) => expect(r.layout).toBe('perpendicular'));
    for (let i = 1; i < results.length; i++) {
      expect(results[i].interior).toBeLessThan(results[i - 1].interior);
      expect(results[i].code).toBeLessThan(results[i - 1].code);
    }
    // the refined fall from 30° to 60° is of the code's order: between half and three times it
    const refinedDrop = 1 - results[2].interior / results[0].interior;
    const codeDrop = 1 - results[2].code / results[0].code;
    expect(refinedDrop).toBeGreaterThan(0.5 * codeDrop);
    expect(refinedDrop).toBeLessThan(3 * codeDrop);
  });
});

describe(`mesh convergence: default (${REFINED_SEGMENTS_PER_SPAN} segments per span) to twice the density, < 1 %`, () => {
  const cases = [
    { name: 'right simple span, moment and shear', deck: steelGirderDeck(), effects: undefined },
    { name: 'three continuous spans 80-100-80 ft, moment and shear', deck: steelGirderDeck({ spansFt: [80, 100, 80], continuous: true }), effects: undefined },
    { name: '30° skew, perpendicular members, moment', deck: steelGirderDeck({ skew: 30 }), effects: ['moment', 'fatigue-moment'] as RefinedFactor['effect'][] },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const a = computeRefinedFactors(c.deck, { effects: c.effects });
      const b = computeRefinedFactors(c.deck, { effects: c.effects, grillage: { segmentsPerSpan: 2 * REFINED_SEGMENTS_PER_SPAN } });
      expect(a.segmentsPerSpan).toBe(REFINED_SEGMENTS_PER_SPAN);
      expect(a.factors.length).toBe(b.factors.length);
      a.factors.forEach((f, i) => {
        expect(b.factors[i].label).toBe(f.label);
        expect(Math.abs(f.value / b.factors[i].value - 1)).toBeLessThan(0.01);
      });
    }, 60000);
  }
});

describe('identities', () => {
  const deck = steelGirderDeck();
  const refined = computeRefinedFactors(deck);

  it('a symmetric deck gives mirror-image girders the same factors', () => {
    const Nb = refined.girderCount;
    for (const f of refined.factors) {
      const mirror = refined.factors.find(
        (g) =>
          g.girder === Nb - 1 - f.girder &&
          g.effect === f.effect &&
          g.point.kind === f.point.kind &&
          (g.point.kind === 'moment' || (g.point.support === (f.point as { support: number }).support && (g.point.kind !== 'shear' || g.point.side === (f.point as { side: string }).side))),
      )!;
      expect(mirror.value).toBeRelativelyClose(f.value, 1e-6);
    }
  });

  it('every factor is m·E_girder/E_beam of its own placement; fatigue has one lane and no m', () => {
    const rules = placementRulesForDeck(deck);
    const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
    const surfaces = influenceSurfaces(model, refined.factors.map((f) => f.response));
    refined.factors.forEach((f, i) => {
      const vehicle = f.vehicle === DESIGN_TRUCK.name ? DESIGN_TRUCK : undefined;
      if (f.effect.startsWith('fatigue')) {
        expect(f.loadedLanes).toBe(1);
        expect(f.multiplePresence).toBe(1);
        return;
      }
      const e = evaluateSurface(surfaces[i], f.placement, rules, vehicle!, { sense: f.sense });
      expect(e.value).toBeRelativelyClose(f.girderEffect, 1e-9);
      expect(f.value).toBeRelativelyClose(f.girderEffect / f.beamLineEffect, 1e-12);
      expect(f.trace.map((t) => t.article).join(' ')).toMatch(/4\.6\.3\.3/);
    });
  });

  it('statics: one lane at the interior girder’s governing placement — the girder shares sum to m = 1.2', () => {
    const rules = placementRulesForDeck(deck);
    const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
    const f = find(refined, 2, 'moment')[0];
    const one = f.byLaneCount[0];
    const surfaces = influenceSurfaces(model, Array.from({ length: refined.girderCount }, (_, g) => ({ kind: 'girder-moment' as const, girder: g, span: 0, fraction: 0.5 })));
    // every axle counted on every girder (superposition; neglecting a girder's adverse axles would break it)
    const total = surfaces.reduce((s, surf) => s + evaluateSurface(surf, one.placement, rules, DESIGN_TRUCK, { multiplePresence: false, countAdverseAxles: true }).value, 0);
    // Static midspan moment of the truck where it stands, by hand: Σ P·(x for x ≤ L/2, L − x beyond)/2.
    const L = deck.spans[0].length;
    const lane = one.placement.lanes[0];
    const pos = [0, fromUs.ft(14), fromUs.ft(14) + (lane.axleSpacing as number)];
    const W = DESIGN_TRUCK.axles.map((a) => a.weight);
    const statics = pos.reduce((s, p, k) => {
      const x = (lane.frontAxleAt as number) - (lane.direction as number) * p;
      return s + (x < 0 || x > L ? 0 : W[k] * (x <= L / 2 ? x / 2 : (L - x) / 2));
    }, 0);
    expect(total).toBeRelativelyClose(statics, 1e-6);
    // the truck stands where the beam-line moment is largest, so the shares sum to m
    expect(statics).toBeRelativelyClose(f.beamLineEffect, 1e-9);
  });

  it('no dragged legal placement on the grillage beats the governing one beyond its stated bound (fast-check)', () => {
    const rules = placementRulesForDeck(deck);
    const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
    const picks = [find(refined, 0, 'moment')[0], find(refined, 2, 'moment')[0], find(refined, 1, 'shear', (f) => f.point.kind === 'shear' && f.point.side === 'right')[0]];
    const surfaces = influenceSurfaces(model, picks.map((p) => p.response));
    const ext = surfaces[0].extent;
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: picks.length - 1 }),
        fc.integer({ min: 1, max: rules.laneCount }),
        fc.array(fc.record({ left: fc.double({ min: -2, max: 15, noNaN: true }), off: fc.double({ min: 0, max: 2, noNaN: true }), xf: fc.double({ min: -5, max: 45, noNaN: true }), dir: fc.constantFrom(1 as const, -1 as const), s: fc.double({ min: 4, max: 10, noNaN: true }) }), { minLength: 4, maxLength: 4 }),
        (which, k, raw) => {
          const f = picks[which];
          const placement = clampPlacement(
            { lanes: raw.slice(0, k).map((r) => ({ left: r.left, wheelOffset: r.off, frontAxleAt: r.xf, direction: r.dir, axleSpacing: r.s })) },
            rules,
            { vehicle: DESIGN_TRUCK, extent: ext },
          );
          const e = evaluateSurface(surfaces[which], placement, rules, DESIGN_TRUCK, { sense: f.sense }).value;
          const sgn = f.sense === 'positive' ? 1 : -1;
          expect(sgn * e).toBeLessThanOrEqual(sgn * f.girderEffect + f.tolerance.absolute + 1e-9 * Math.abs(f.girderEffect));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('rows of method "grillage": one per girder number, effect, span and lane case, with unique ids', () => {
    const ids = new Set(refined.rows.map((r) => r.id));
    expect(ids.size).toBe(refined.rows.length);
    expect(refined.rows.every((r) => r.method === 'grillage' && typeof r.girder === 'number')).toBe(true);
    // 6 girders × (moment, shear: one and multiple; fatigue moment, fatigue shear: one; reactions at 2 supports: one and multiple)
    expect(refined.rows.length).toBe(6 * (6 + 2 * 2));
    const interiorShear = refined.rows.find((r) => r.girderNumber === 3 && r.effect === 'shear' && r.lanes === 'multiple')!;
    const ends = find(refined, 2, 'shear').map((f) => Math.max(...f.byLaneCount.filter((c) => c.loadedLanes > 1).map((c) => c.factor)));
    expect(interiorShear.value).toBeRelativelyClose(Math.max(...ends), 1e-12);
    expect(refined.caution).toMatch(/licensed engineer/);
  });
});

describe('bad input', () => {
  it('names the option and the rule', () => {
    const deck = steelGirderDeck();
    expect(() => computeRefinedFactors(deck, { stationsPerSegment: 0 })).toThrow(DeckInputError);
    expect(() => computeRefinedFactors(deck, { stationsPerSegment: 0 })).toThrow(/stationsPerSegment must be a whole number/);
    expect(() => computeRefinedFactors(deck, { effects: ['torque' as never] })).toThrow(/effect must be one of/);
    expect(() => computeRefinedFactors(deck, { grillage: { segmentsPerSpan: -3 } })).toThrow(/segmentsPerSpan/);
  });
});

describe('the transverse-only fast path agrees with itself', () => {
  it('evaluateTransverse of the governing rigid placement equals its value', () => {
    const deck = steelGirderDeck();
    const geo = deckGeometry(deck);
    const rules = placementRulesForDeck(deck);
    const line = rigidSectionLine(geo.offsets, 0, geo.curbLeft, geo.curbRight);
    const g = governingTransversePlacement(line, rules);
    expect(evaluateTransverse(line, g.placement, rules).value).toBeRelativelyClose(g.value, 1e-12);
  });
});
