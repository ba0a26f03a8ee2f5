/**
 * The refined run under the HL-93 loading (deck field refinedLoading 'hl93',
 * shared/grillage/refinedLoads.ts): (1 + IM)·(design truck or tandem) + design lane load in
 * every loaded lane, the same load on the beam line.
 * Sources: AASHTO LRFD Art. 3.6.1.2.4 (lane load 0.64 klf over 10 ft), Table 3.6.2.1-1
 * (IM 33 %, not on the lane load), Art. 3.6.1.3.1 (each portion of one sign loaded);
 * closed forms: a simple span's midspan moment under a uniform load wL²/8 (0.08·L² kip-ft
 * at 0.64 klf); two equal continuous spans under a uniform load over both, pier moment
 * −0.125·w·L² (three-moment equation).
 * Expectation (common practice, no source): a uniform lane load spreads across the deck more
 * evenly than the truck's wheel lines, so on a right deck the HL-93 factors are within 2 % of,
 * or below, the truck-alone factors.
 */
import { describe, expect, it } from 'vitest';
import { assertDeck, DeckInputError } from '../../../shared/deck/schema.js';
import { computeRefinedFactors } from '../../../shared/grillage/refinedFactors.js';
import { assertLoadingFits, beamLineEffect, strengthLoads } from '../../../shared/grillage/refinedLoads.js';
import { influenceLine, maxVehicleEffect } from '../../../shared/loads/influenceLine.js';
import { twoDesignTrucks } from '../../../shared/loads/beamLine.js';
import { DESIGN_TANDEM, DESIGN_TRUCK } from '../../../shared/loads/vehicles.js';
import { placementRules } from '../../../shared/placement/rules.js';
import { fromUs, toUs } from '../../../shared/units.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';
import { showLengths } from '../../../shared/quantities/inText.js';

const ft = fromUs.ft;

describe('the HL-93 load of the refined run on the beam line', () => {
  it('simple span: the lane adds 0.08·L² kip-ft at midspan to (1 + IM) times the vehicle (wL²/8, Art. 3.6.1.2.4)', () => {
    for (const Lft of [40, 100, 160]) {
      const beam = { spans: [ft(Lft)], continuous: false };
      const response = { kind: 'moment' as const, x: ft(Lft) / 2 };
      const [truck, tandem] = strengthLoads('hl93', false);
      const line = influenceLine(beam, response);
      const truckAlone = maxVehicleEffect(line, DESIGN_TRUCK, 'positive').value;
      const tandemAlone = maxVehicleEffect(line, DESIGN_TANDEM, 'positive').value;
      expect(toUs.kipFt(beamLineEffect(beam, response, truck, 'positive') - 1.33 * truckAlone)).toBeRelativelyClose(0.08 * Lft ** 2, 1e-9);
      expect(toUs.kipFt(beamLineEffect(beam, response, tandem, 'positive') - 1.33 * tandemAlone)).toBeRelativelyClose(0.08 * Lft ** 2, 1e-9);
    }
  });

  it('two equal continuous spans: the lane load over both gives −0.125·w·L² over the pier (three-moment equation)', () => {
    const L = ft(100);
    const beam = { spans: [L, L], continuous: true };
    const response = { kind: 'moment' as const, x: L };
    const [truck] = strengthLoads('hl93', true);
    const vehicle = 1.33 * maxVehicleEffect(influenceLine(beam, response), DESIGN_TRUCK, 'negative').value;
    expect(toUs.kipFt(beamLineEffect(beam, response, truck, 'negative') - vehicle)).toBeRelativelyClose(-0.125 * 0.64 * 100 ** 2, 1e-6);
    // over the pier a third load: 90 % of two design trucks with IM and 90 % of the lane load (Art. 3.6.1.3.1)
    const loads = strengthLoads('hl93', true, 4 * L);
    expect(loads).toHaveLength(3);
    const two = loads[2];
    expect(two.vehicle.axles).toHaveLength(6);
    const twoTrucks = maxVehicleEffect(influenceLine(beam, response), twoDesignTrucks(4 * L), 'negative').value;
    expect(beamLineEffect(beam, response, two, 'negative')).toBeRelativelyClose(0.9 * 1.33 * twoTrucks + 0.9 * fromUs.kipFt(-0.125 * 0.64 * 100 ** 2), 1e-6);
    // within a span (positive moment, shear) only the truck and the tandem
    expect(strengthLoads('hl93', false)).toHaveLength(2);
  });
});

describe('refined factors under HL-93', () => {
  const right = () => assertDeck({ ...quarryCreekDeck(), supports: [{ skew: 0 }, { skew: 0 }] } as never);

  it('on a right deck every strength factor is within 2 % of, or below, the truck-alone factor, and names its vehicle', () => {
    const truck = computeRefinedFactors(right());
    const hl93 = computeRefinedFactors({ ...right(), refinedLoading: 'hl93' });
    expect(hl93.factors).toHaveLength(truck.factors.length);
    let below = 0;
    hl93.factors.forEach((f, i) => {
      const t = truck.factors[i];
      expect(f.label).toBe(t.label);
      if (f.effect.startsWith('fatigue')) {
        // fatigue keeps its one fatigue truck, without the lane load
        expect(f.value).toBe(t.value);
        return;
      }
      expect(f.value).toBeLessThanOrEqual(1.02 * t.value);
      if (f.value < t.value) below++;
      expect(['design truck × 1.33', 'design tandem × 1.33']).toContain(f.vehicle);
      expect(f.loads.map((l) => l.vehicle)).toEqual(['design truck × 1.33', 'design tandem × 1.33']);
      // the lane load is in every loaded lane of the governing placement, adding to the effect sought
      const sgn = f.sense === 'positive' ? 1 : -1;
      for (const l of f.lanes) expect(sgn * l.laneLoadEffect).toBeGreaterThan(0);
    });
    expect(below).toBeGreaterThan(0);
    // every row names the load that governs its lane case
    for (const r of hl93.rows) expect(r.effect.startsWith('fatigue') ? ['fatigue truck'] : ['HL-93 truck + lane', 'HL-93 tandem + lane']).toContain(r.vehicle);
    for (const r of truck.rows) expect(r.vehicle).toBe(r.effect.startsWith('fatigue') ? 'fatigue truck' : 'design truck');
    const loadsStep = hl93.trace.find((s) => s.label === 'Vehicles of the refined factors')!;
    expect(loadsStep.formula).toContain('(1 + IM)·(design truck or design tandem) + design lane load');
  });

  it('a continuous deck: negative moment and pier reactions weigh 90 % of two trucks with the lane load too, and name the governing vehicle', () => {
    const two = assertDeck({ ...quarryCreekDeck(), spans: [{ length: ft(90) }, { length: ft(90) }], continuous: true, supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }], refinedLoading: 'hl93' } as never);
    const r = computeRefinedFactors(two, { effects: ['negative-moment', 'reaction'] });
    const overPier = r.factors.filter((f) => f.point.kind === 'support-moment' || (f.point.kind === 'reaction' && f.point.support === 1));
    expect(overPier.length).toBe(2 * 6);
    for (const f of overPier) {
      expect(f.loads.map((l) => l.vehicle)).toEqual(['design truck × 1.33', 'design tandem × 1.33', 'two design trucks × 1.197']);
      // the factor is the largest girder effect over the largest beam-line effect of the three loads
      const sgn = f.sense === 'positive' ? 1 : -1;
      const eg = Math.max(...f.loads.map((l) => sgn * l.girderEffect));
      const e1 = Math.max(...f.loads.map((l) => sgn * l.beamLineEffect));
      expect(f.value).toBeRelativelyClose(eg / e1, 1e-12);
    }
    // at the end bearings only the truck and the tandem
    for (const f of r.factors.filter((x) => x.point.kind === 'reaction' && x.point.support !== 1)) expect(f.loads).toHaveLength(2);
  });

  it('equilibrium of the beam line: g × the beam line LL+IM is the girder effect the search found', () => {
    const hl93 = computeRefinedFactors({ ...right(), refinedLoading: 'hl93' }, { effects: ['moment'] });
    for (const f of hl93.factors) expect(f.value * f.beamLineEffect).toBeRelativelyClose(f.girderEffect, 1e-12);
  });

  it('refuses a lane narrower than the lane load, naming the field; an unknown loading is refused by the schema', () => {
    const rules = placementRules({ curbLeft: 0, curbRight: ft(24) });
    expect(() => assertLoadingFits('hl93', rules)).not.toThrow();
    try {
      assertLoadingFits('hl93', { ...rules, laneWidth: ft(9) });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DeckInputError);
      expect((e as DeckInputError).issues[0].path).toEqual(['refinedLoading']);
      // the lengths are tokens, shown in the reader's units (shared/quantities/inText.ts)
      expect(showLengths((e as DeckInputError).message, 'US')).toContain('are 9.00 ft wide, narrower than the 10.00 ft width of the design lane load');
      expect(showLengths((e as DeckInputError).message, 'SI')).toContain('are 2.743 m wide, narrower than the 3.048 m width');
    }
    expect(() => assertLoadingFits('design-truck', { ...rules, laneWidth: ft(9) })).not.toThrow();
    expect(() => assertDeck({ ...quarryCreekDeck(), refinedLoading: 'permit' } as never)).toThrow(/refined loading must be 'design-truck' or 'hl93'/);
  });
});
