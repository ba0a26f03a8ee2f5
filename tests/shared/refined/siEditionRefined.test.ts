/**
 * The refined (grillage) run with the SI edition's design values (deck field designValues
 * 'si-edition', shared/loads/designValues.ts).
 * Sources: AASHTO LRFD (SI) Art. 3.6.1.2.2–3.6.1.2.4 (35/145/145 kN truck, 2 × 110 kN tandem,
 * 9.3 N/mm over 3000 mm), Art. 3.6.1.3.1 (600 mm from the lane edge; two trucks 4300 mm rear
 * spacings at least 15 000 mm apart), Table 3.6.2.1-1 (IM 33 %); from memory of the 4th
 * edition 2007 SI and earlier. Closed forms: wL²/8 for the lane load at midspan of a simple
 * span; the pier moment −wL²/8 of two equal continuous spans under a uniform load over both
 * (three-moment equation). Identity: g × E_1 = E_g, the factor's own definition.
 */
import { showLengths } from '../../../shared/quantities/inText.js';
import { describe, expect, it } from 'vitest';
import { assertDeck, DeckInputError } from '../../../shared/deck/schema.js';
import { computeRefinedFactors } from '../../../shared/grillage/refinedFactors.js';
import { assertLoadingFits, beamLineEffect, strengthLoads } from '../../../shared/grillage/refinedLoads.js';
import { influenceLine, maxVehicleEffect } from '../../../shared/loads/influenceLine.js';
import { twoDesignTrucks } from '../../../shared/loads/beamLine.js';
import { SI_EDITION_VALUES, US_CUSTOMARY_VALUES } from '../../../shared/loads/designValues.js';
import { placementRules } from '../../../shared/placement/rules.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';

const right = (designValues?: 'si-edition' | 'us-customary') =>
  assertDeck({ ...quarryCreekDeck(), supports: [{ skew: 0 }, { skew: 0 }], ...(designValues ? { designValues } : {}) } as never);

describe('the SI edition HL-93 load on the beam line', () => {
  it('simple 30 m span: the lane adds wL²/8 = 9.3·30²/8 kN·m to (1 + IM) times the SI vehicle', () => {
    const beam = { spans: [30], continuous: false };
    const response = { kind: 'moment' as const, x: 15 };
    const [truck, tandem] = strengthLoads('hl93', false, 0, SI_EDITION_VALUES);
    const line = influenceLine(beam, response);
    expect(truck.laneWidth).toBe(3.0);
    expect(beamLineEffect(beam, response, truck, 'positive') - 1.33 * maxVehicleEffect(line, SI_EDITION_VALUES.truck, 'positive').value).toBeRelativelyClose((9300 * 30 * 30) / 8, 1e-9);
    expect(beamLineEffect(beam, response, tandem, 'positive') - 1.33 * maxVehicleEffect(line, SI_EDITION_VALUES.tandem, 'positive').value).toBeRelativelyClose((9300 * 30 * 30) / 8, 1e-9);
  });

  it('over a pier: 90 % of two SI trucks (4.3 m rear spacings, at least 15 m apart) and of the lane load', () => {
    const L = 30;
    const beam = { spans: [L, L], continuous: true };
    const response = { kind: 'moment' as const, x: L };
    const loads = strengthLoads('hl93', true, 4 * L, SI_EDITION_VALUES);
    const twoSi = twoDesignTrucks(4 * L, SI_EDITION_VALUES);
    // first truck 0, 4.3, 8.6 m; the second's lead axle at least 15 m behind the first's rear axle
    expect(twoSi.axles.map((a) => a.position).slice(0, 4)).toEqual([0, 4.3, 8.6, 8.6 + 15]);
    expect(twoSi.variableSpacing!.min).toBe(15);
    const two = maxVehicleEffect(influenceLine(beam, response), twoSi, 'negative').value;
    expect(beamLineEffect(beam, response, loads[2], 'negative')).toBeRelativelyClose(0.9 * 1.33 * two - 0.9 * 0.125 * 9300 * L * L, 1e-6);
    expect(loads[2].reason).toContain('AASHTO LRFD (SI) Art. 3.6.1.3.1');
  });

  it('the 3000 mm lane load fits a 3.25 m lane of the two-lane rule; narrower lanes are refused naming the field', () => {
    const rules = placementRules({ curbLeft: 0, curbRight: 6.5 }, { values: SI_EDITION_VALUES });
    expect(rules.laneWidth).toBeCloseTo(3.25, 12);
    expect(() => assertLoadingFits('hl93', rules, SI_EDITION_VALUES)).not.toThrow();
    try {
      assertLoadingFits('hl93', { ...rules, laneWidth: 2.9 }, SI_EDITION_VALUES);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).issues[0].path).toEqual(['refinedLoading']);
      // lengths in the message are shown in the reader's units (shared/quantities/inText.ts)
      expect(showLengths((e as DeckInputError).message, 'SI')).toContain('2.900 m wide, narrower than the 3.000 m width of the design lane load');
    }
  });
});

describe('refined factors with the SI edition values', () => {
  it('use the SI lanes and vehicles, name the source, and keep g × E_1 = E_g', () => {
    const si = computeRefinedFactors({ ...right('si-edition'), refinedLoading: 'hl93' }, { effects: ['moment'] });
    expect(si.designLaneWidth).toBe(3.6);
    expect(si.wheelGauge).toBe(1.8);
    const step = si.trace.find((s) => s.label.startsWith('Design values'))!;
    expect(step.article.startsWith('AASHTO LRFD (SI)')).toBe(true);
    for (const f of si.factors) {
      expect(f.value * f.beamLineEffect).toBeRelativelyClose(f.girderEffect, 1e-12);
      for (const l of f.lanes) expect(l.wheelOffset).toBeGreaterThanOrEqual(0.6 - 1e-9);
    }
    // the beam line of a factor is the SI truck's: 35/145/145 kN with IM and the 9.3 N/mm lane
    const f = si.factors.find((x) => x.effect === 'moment')!;
    const truck = f.loads.find((l) => l.vehicle === 'design truck × 1.33')!;
    expect(truck.beamLineEffect).toBeGreaterThan(0);
  });

  it('switched to the converted US customary values: exactly the results of the deck without the field', () => {
    const switched = computeRefinedFactors(right('us-customary'), { effects: ['moment', 'fatigue-moment'] });
    const before = computeRefinedFactors(right(), { effects: ['moment', 'fatigue-moment'] });
    expect(switched).toEqual(before);
    expect(switched.designLaneWidth).toBe(US_CUSTOMARY_VALUES.laneWidth);
    const si = computeRefinedFactors(right('si-edition'), { effects: ['moment', 'fatigue-moment'] });
    expect(si.factors.map((f) => f.value)).not.toEqual(before.factors.map((f) => f.value));
  });
});
