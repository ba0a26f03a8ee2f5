/**
 * The sample a refined factor is searched on (shared/grillage/refinedFactors.ts, steps 3 and
 * 4b): where its grid lines must lie so that no cell straddles a jump of the surface, and which
 * way a refinement samples denser. Checked on the grillage's own influence surfaces (exact at
 * any point: loadTransfer.ts), so the reference is closed-form, not a published value (common
 * practice, no source): a bilinear sample of a surface that is smooth in every cell has a
 * small measured error, one whose cell straddles a jump has an error of the order of the jump.
 *
 * Decks: the invented Larchmont Ridge test decks (tests/shared/refined/fixtures.ts) and the
 * FHWA prestressed-girder example deck (public/examples/fhwa-psc-step-5-1.deck.json).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { assertDeck, type Deck } from '../../../shared/deck/schema.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { buildGrillage } from '../../../shared/grillage/model.js';
import { influenceSurfaces } from '../../../shared/grillage/influenceSurface.js';
import type { GrillageResponse } from '../../../shared/grillage/responses.js';
import { baseDensity, nextDensity, REFINED_SEGMENTS_PER_SPAN, sampleSurfaces } from '../../../shared/grillage/refinedFactors.js';
import { placementRulesForDeck } from '../../../shared/placement/rules.js';
import { steelGirderDeck } from './fixtures.js';

function sampled(deck: Deck, response: GrillageResponse, momentPoints: { x: number; y: number }[] = []) {
  const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
  const surfaces = influenceSurfaces(model, [response]);
  const { sampled: [s] } = sampleSurfaces(model, [response], surfaces, placementRulesForDeck(deck), {}, momentPoints);
  return { model, s };
}

describe('refined sample: no cell straddles a jump of the surface', () => {
  it('a pier shear, sampled in the frame of its support line, has no error on that line (perpendicular layout, 25°)', () => {
    // Before the support line was the station s = A exactly, A + B·y − c·y came out a rounding
    // error to either side, points on it fell on the wrong span, and the error was 0.875 of the
    // largest ordinate (the shear's jump); smooth cells measure about 0.3 % here.
    const deck = steelGirderDeck({ girders: 6, spacingFt: 10, skew: 25, spansFt: [100, 100], continuous: true });
    const { model, s } = sampled(deck, { kind: 'girder-shear', girder: 2, support: 1, side: 'left' });
    expect(model.layout).toBe('perpendicular');
    expect(s.shear).toBe(model.mesh.supportB[1]);
    expect([...s.xs]).toContain(model.mesh.supportA[1]);
    expect(s.representationError).toBeLessThan(0.01 * s.maxOrdinate);
  });

  it('the same on a skew-parallel layout, where the lines’ support nodes are snapped onto the support station (16°, three spans)', () => {
    // before: 0.50 of the largest ordinate
    const deck = steelGirderDeck({ girders: 11, spacingFt: 6, skew: 16, spansFt: [94, 94, 94], continuous: true });
    const { model, s } = sampled(deck, { kind: 'girder-shear', girder: 6, support: 1, side: 'right' });
    expect(model.layout).toBe('skew-parallel');
    expect(s.representationError).toBeLessThan(0.01 * s.maxOrdinate);
  });

  it('an exterior girder’s moment surface jumps at its moment point under the overhang (the couple of the rigid cantilever transfer), and the sample steps there', () => {
    // loadTransfer.ts rule 1: a load on the overhang reaches the outer line with the couple
    // My = −P·(x − x_line); the couple's moment jumps by My as x_line passes the moment point.
    // Without the 1 µm steps beside the moment point the cell after it straddled the jump
    // (measured 0.19 of 6.1 N·m/N, 3 %); with them the error is that of smooth cells.
    const f = JSON.parse(readFileSync('public/examples/fhwa-psc-step-5-1.deck.json', 'utf8')) as { units: 'US' | 'SI'; deck: unknown };
    const deck = assertDeck(deckFromDisplay(f.deck as never, f.units));
    const model = buildGrillage(deck, { segmentsPerSpan: REFINED_SEGMENTS_PER_SPAN });
    const line = model.mesh.lines.find((l) => l.kind === 'girder' && l.girder === 0)!;
    const x0 = model.mesh.supportA[0] + model.mesh.supportB[0] * line.y;
    const x1 = model.mesh.supportA[1] + model.mesh.supportB[1] * line.y;
    const point = { x: x0 + 0.4 * (x1 - x0), y: line.y };
    const { s } = sampled(deck, { kind: 'girder-moment', girder: 0, span: 0, fraction: 0.4 }, [point]);
    expect(s.representationError).toBeLessThan(0.001 * s.maxOrdinate);
  });
});

describe('refined sample: a refinement samples denser where the error lies', () => {
  const d = { perSegment: 1, perStrip: 4 };
  const grid = (nx: number, ny: number) => ({ xs: new Float64Array(nx), ys: new Float64Array(ny) });
  it('doubles the stations when the error is along the rows, the rows when it is across, both when comparable', () => {
    expect(nextDensity(d, { errorAlong: 1e-2, errorAcross: 1e-15, ...grid(100, 30) })).toEqual({ perSegment: 2, perStrip: 4 });
    expect(nextDensity(d, { errorAlong: 1e-15, errorAcross: 1e-2, ...grid(100, 30) })).toEqual({ perSegment: 1, perStrip: 8 });
    expect(nextDensity(d, { errorAlong: 1e-2, errorAcross: 0.6e-2, ...grid(100, 30) })).toEqual({ perSegment: 2, perStrip: 8 });
  });
  it('grows the other way at a cap, and stops at both caps and at the largest grid', () => {
    expect(nextDensity({ perSegment: 16, perStrip: 2 }, { errorAlong: 1, errorAcross: 0, ...grid(100, 30) })).toEqual({ perSegment: 16, perStrip: 4 });
    expect(nextDensity({ perSegment: 16, perStrip: 16 }, { errorAlong: 1, errorAcross: 1, ...grid(100, 30) })).toBeNull();
    // 80,000 points may double once more (one way), 120,000 not at all (200,000 at most)
    expect(nextDensity(d, { errorAlong: 1, errorAcross: 1, ...grid(1000, 80) })).toEqual({ perSegment: 2, perStrip: 4 });
    expect(nextDensity(d, { errorAlong: 1, errorAcross: 1, ...grid(1000, 120) })).toBeNull();
  });
  it('starts a skewed frame of the perpendicular layout with rows enough for the node lines crossing its strips', () => {
    // 2·|tan θ|·w/h: 25°, 10 ft strips, 2.5 ft stations → 3.7 → 4 rows; 45°, 8 ft, 2.5 ft → 6.4 → 8 rows
    const a = buildGrillage(steelGirderDeck({ girders: 6, spacingFt: 10, skew: 25, spansFt: [100] }), { segmentsPerSpan: 40 });
    const b = buildGrillage(steelGirderDeck({ girders: 8, spacingFt: 8, skew: 45, spansFt: [100] }), { segmentsPerSpan: 40 });
    expect(baseDensity(a, {}, a.mesh.supportB[0]).perStrip).toBe(4);
    expect(baseDensity(b, {}, b.mesh.supportB[0]).perStrip).toBe(8);
    // in the plan frame of a skewed deck and along a right deck's frame: the defaults of old
    expect(baseDensity(b, {}, 0).perStrip).toBe(2);
    const right = buildGrillage(steelGirderDeck({ girders: 6, spacingFt: 10, skew: 0, spansFt: [100] }), { segmentsPerSpan: 40 });
    expect(baseDensity(right, {}, 0).perStrip).toBe(1);
  });
});
