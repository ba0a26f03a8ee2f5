/**
 * Refined factors at the support lines: negative moment over interior supports of continuous
 * decks and bearing reactions.
 *
 * Sources
 * - Rigid-section method: commentary to AASHTO LRFD Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1 (with m,
 *   Table 3.6.1.1.2-1): with very stiff transverse members, no torsion and equal girders the
 *   deck section stays straight, every girder carries its rigid-section share of each wheel, and
 *   the refined factor of any effect equals the rigid-section share.
 * - Three-moment equation (Clapeyron), two equal spans L: a unit load at a from an end support
 *   gives M_B = −a·(L² − a²)/(4·L²) over the middle support; a uniform load w on both spans
 *   gives M_B = −w·L²/8 (any structural-analysis text, e.g. Timoshenko & Young, "Theory of
 *   Structures"; from memory).
 * - AASHTO LRFD Art. 3.6.1.3.1: negative moment between points of contraflexure and reactions
 *   at interior piers take 90 % of two design trucks (rear spacings 14 ft, at least 50 ft
 *   between the lead axle of one and the rear axle of the other) when it exceeds one truck.
 * - Statics: the bearing reactions of all girders balance any load (ΣR = P).
 */
import { describe, expect, it } from 'vitest';
import { deckGeometry } from '../../../shared/deck/geometry.js';
import { computeRefinedFactors } from '../../../shared/grillage/refinedFactors.js';
import { buildGrillage, influenceSurfaces } from '../../../shared/grillage/index.js';
import { compareFactors } from '../../../shared/grillage/compare.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { influenceLine, maxVehicleEffect } from '../../../shared/loads/influenceLine.js';
import { uniformLoadEffect } from '../../../shared/loads/movingLoad.js';
import { TWO_TRUCK_REDUCTION, twoDesignTrucks } from '../../../shared/loads/beamLine.js';
import { DESIGN_LANE_LOAD, DESIGN_TRUCK } from '../../../shared/loads/vehicles.js';
import { placementRulesForDeck } from '../../../shared/placement/rules.js';
import { governingTransversePlacement } from '../../../shared/placement/search.js';
import { rigidSectionLine } from '../../../shared/placement/transverseLines.js';
import { fromUs } from '../../../shared/units.js';
import { steelGirderDeck } from './fixtures.js';

/** M_B of two equal spans L under a unit load at x along both spans (three-moment equation). */
function twoSpanSupportMoment(x: number, L: number): number {
  const a = x <= L ? x : 2 * L - x;
  if (a <= 0 || a >= L) return 0;
  return (-a * (L * L - a * a)) / (4 * L * L);
}

describe('two equal spans: the beam line over the middle support (three-moment equation)', () => {
  const L = fromUs.ft(100);
  const beam = { spans: [L, L], continuous: true };
  const line = influenceLine(beam, { kind: 'moment', x: L });

  it('the influence line is the closed form', () => {
    for (let k = 1; k < 40; k++) {
      const x = (2 * L * k) / 40;
      expect(line.at(x)).toBeRelativelyClose(twoSpanSupportMoment(x, L), 1e-9);
    }
  });

  it('the lane load gives −0.125·w·L²', () => {
    expect(uniformLoadEffect(line, DESIGN_LANE_LOAD, 'negative')).toBeRelativelyClose(-0.125 * DESIGN_LANE_LOAD * L * L, 1e-9);
  });

  it('90 % of two design trucks follows Art. 3.6.1.3.1 (brute force over positions and headways on the closed form)', () => {
    expect(TWO_TRUCK_REDUCTION).toBe(0.9);
    const found = TWO_TRUCK_REDUCTION * maxVehicleEffect(line, twoDesignTrucks(2 * L), 'negative').value;
    // brute force: first truck's front axle at every 0.25 ft, headway from 50 ft in 1 ft steps, both directions (symmetric beam)
    const W = DESIGN_TRUCK.axles.map((a) => a.weight);
    const rel = [0, fromUs.ft(14), fromUs.ft(28)];
    let best = 0;
    for (let hw = fromUs.ft(50); hw <= 2 * L; hw += fromUs.ft(1)) {
      const axles = [...rel.map((p, i) => ({ p, w: W[i] })), ...rel.map((p, i) => ({ p: fromUs.ft(28) + hw + p, w: W[i] }))];
      for (let x0 = -fromUs.ft(28) - hw; x0 <= 2 * L; x0 += fromUs.ft(0.25)) {
        let m = 0;
        for (const a of axles) {
          const x = x0 + a.p;
          if (x > 0 && x < 2 * L) m += Math.min(0, a.w * twoSpanSupportMoment(x, L)); // axles that do not contribute are neglected
        }
        best = Math.min(best, m);
      }
    }
    expect(found).toBeLessThan(0);
    // 0.5 %: the brute force steps 0.25 ft and 1 ft; the search is exact
    expect(found).toBeLessThanOrEqual(0.9 * best * (1 - 1e-9));
    expect(found).toBeRelativelyClose(0.9 * best, 5e-3);
    // on 100 ft spans two trucks govern one truck (common practice, no source: beyond about 60 ft spans)
    expect(found).toBeLessThan(maxVehicleEffect(line, DESIGN_TRUCK, 'negative').value);
  });
});

describe('rigid limit over the interior support (commentary to Art. 4.6.2.2.2d, Eq. C4.6.2.2.2d-1)', () => {
  // Five equal girders (overhang S/2), two continuous 100 ft spans, transverse EI × 10⁶, no torsion.
  const deck = steelGirderDeck({ girders: 5, spacingFt: 8, overhangFt: 4, barrierFt: 1.25, spansFt: [100, 100], continuous: true });
  const refined = computeRefinedFactors(deck, {
    grillage: { transverseStiffnessFactor: 1e6, torsionFactor: 0, segmentsPerSpan: 20 },
    effects: ['negative-moment', 'reaction'],
  });
  const rules = placementRulesForDeck(deck);
  const geo = deckGeometry(deck);
  for (let g = 0; g < 5; g++) {
    // Reactions are not rigid-section shares: a wheel on the support line is carried by the
    // members on that line straight to the bearings, which the rigid section does not describe.
    it(`girder ${g + 1}: the negative moment equals the rigid-section share`, () => {
      const rigid = governingTransversePlacement(rigidSectionLine(geo.offsets, g, geo.curbLeft, geo.curbRight), rules);
      const mine = refined.factors.filter((f) => f.girder === g);
      expect(mine.map((f) => f.effect).sort()).toEqual(['negative-moment', 'reaction', 'reaction', 'reaction']);
      for (const f of mine.filter((x) => x.effect === 'negative-moment')) {
        // 5e-3: very stiff, not rigid (as the positive-moment rigid-limit test)
        expect(f.value).toBeRelativelyClose(rigid.value, 5e-3);
        expect(f.tolerance.factor).toBeGreaterThanOrEqual(0);
      }
    });
  }

  it('the negative moment is the ratio of one design truck per lane to one truck on the beam line over the support', () => {
    const L = fromUs.ft(100);
    const B = maxVehicleEffect(influenceLine({ spans: [L, L], continuous: true }, { kind: 'moment', x: L }), DESIGN_TRUCK, 'negative').value;
    for (const f of refined.factors.filter((x) => x.effect === 'negative-moment')) {
      expect(f.vehicle).toBe('design truck');
      expect(f.loads.length).toBe(1);
      expect(f.beamLineEffect).toBeRelativelyClose(B, 1e-9);
      expect(f.value).toBeRelativelyClose(f.girderEffect / f.beamLineEffect, 1e-12);
      expect(f.trace[0].label).toMatch(/two-truck load of Art\. 3\.6\.1\.3\.1 is not placed on the grillage/);
    }
  });

  it('rows of method grillage sit on the code rows’ support keys, and the comparison lists them', () => {
    const code = computeCodeFactors(deck);
    const cmp = compareFactors(code, refined);
    for (const effect of ['negative-moment', 'reaction'] as const) {
      const rows = refined.rows.filter((r) => r.effect === effect);
      expect(rows.length).toBeGreaterThan(0);
      for (const r of rows) {
        expect(r.location.key).toMatch(/^support\d$/);
        expect(code.factors.some((c) => c.effect === effect && c.location.key === r.location.key)).toBe(true);
        const c = cmp.rows.find((x) => x.effect === effect && x.girderNumber === r.girderNumber && x.locationKey === r.location.key && x.lanes === r.lanes)!;
        expect(c.grillage).toBe(r.value);
        expect(c.code).toBeGreaterThan(0);
      }
    }
    expect(refined.rows.filter((r) => r.effect === 'negative-moment').every((r) => r.location.key === 'support2')).toBe(true);
  });
});

describe('statics: the bearing reactions balance the load', () => {
  it('Σ of every girder’s reaction surfaces is 1 anywhere on the deck (20° skew, two continuous spans)', () => {
    const deck = steelGirderDeck({ girders: 4, spansFt: [80, 100], continuous: true, skew: 20 });
    const model = buildGrillage(deck, { segmentsPerSpan: 12 });
    const responses = [];
    for (let g = 0; g < 4; g++) for (let j = 0; j <= 2; j++) responses.push({ kind: 'reaction' as const, girder: g, support: j });
    const surfaces = influenceSurfaces(model, responses);
    const e = model.extent;
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i < 7; i++) for (let k = 0; k < 5; k++) {
      xs.push(e.xMin + ((e.xMax - e.xMin) * (i + 0.37)) / 7);
      ys.push(e.yMin + ((e.yMax - e.yMin) * (k + 0.21)) / 5);
    }
    const table = model.transfer.tabulate(Float64Array.from(xs), Float64Array.from(ys));
    const sums = new Float64Array(xs.length);
    for (const s of surfaces) s.evaluate(table).forEach((v, p) => (sums[p] += v));
    for (const v of sums) expect(v).toBeRelativelyClose(1, 1e-9);
  });
});

describe('mesh convergence of the moment rows (twice the density; common practice, no source: within 1 %)', () => {
  it('each moment row carries the same row of a run at twice the segments, and its relative change', () => {
    const deck = steelGirderDeck({ girders: 4, spansFt: [90], skew: 15 });
    const checked = computeRefinedFactors(deck, { grillage: { segmentsPerSpan: 12 }, effects: ['moment', 'shear'], checkConvergence: true });
    const fine = computeRefinedFactors(deck, { grillage: { segmentsPerSpan: 24 }, effects: ['moment'] });
    const moments = checked.rows.filter((r) => r.effect === 'moment');
    expect(moments.length).toBe(4 * 2);
    for (const r of moments) {
      const f = fine.rows.find((x) => x.id === r.id)!;
      expect(r.convergence!.segmentsPerSpan).toBe(24);
      expect(r.convergence!.value).toBe(f.value);
      expect(r.convergence!.change).toBeRelativelyClose(Math.abs(f.value - r.value) / r.value, 1e-12);
      expect(r.convergence!.within).toBe(r.convergence!.change <= 0.01);
    }
    expect(checked.rows.filter((r) => r.effect !== 'moment').every((r) => r.convergence === undefined)).toBe(true);
    expect(computeRefinedFactors(deck, { grillage: { segmentsPerSpan: 12 }, effects: ['moment'] }).rows.every((r) => r.convergence === undefined)).toBe(true);
  });
});
