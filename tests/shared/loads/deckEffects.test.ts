/**
 * Girder LL+IM of a deck = governing distribution factor × beam-line effect (AASHTO LRFD
 * Art. 4.6.2.2), with the factor chosen per force effect and place: negative moment near an
 * interior support uses that support's negative-moment factor, whose span length is the
 * average of the adjacent spans (commentary Table C4.6.2.2.1-1).
 */
import { describe, expect, it } from 'vitest';
import { assertDeck } from '../../../shared/deck/schema.js';
import { deckFromDisplay } from '../../../shared/deck/units.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { deckGirderEffects } from '../../../shared/loads/deckEffects.js';

// Invented three-span steel deck (demo-style data; the checks are identities, not published values).
const deck = assertDeck(
  deckFromDisplay(
    {
      name: 'unequal continuous spans',
      sectionType: 'a',
      girders: { kind: 'uniform', count: 5, spacing: 9 },
      overhangLeft: 3,
      overhangRight: 3,
      barrierLeft: { width: 1.5 },
      barrierRight: { width: 1.5 },
      slab: { thickness: 8.5, haunch: 2 },
      section: { area: 60, inertia: 50000, centroidFromTop: 30 },
      materials: { deck: { kind: 'concrete', fc: 4 }, girder: { kind: 'modulus', modulus: 29000 } },
      spans: [{ length: 80 }, { length: 140 }, { length: 80 }],
      continuous: true,
      supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }, { skew: 0 }],
      diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 3, topChordArea: 3.75, bottomChordArea: 3.75, diagonalArea: 2.86, frameDepth: 36 },
    },
    'US',
  ),
);

describe('deck girder effects', () => {
  const code = computeCodeFactors(deck);
  const effects = deckGirderEffects(deck, code);

  it('gives both girder kinds, each point equal to its factor times the beam-line value', () => {
    for (const kind of ['interior', 'exterior'] as const) {
      const g = effects.girders[kind]!;
      expect(g.points.length).toBe(effects.beamLine.points.length);
      g.points.forEach((p, i) => {
        const line = effects.beamLine.points[i];
        expect(p.moment.max.value).toBeRelativelyClose(p.moment.max.factor * line.moment.max.value, 1e-12);
        expect(p.shear.max.value).toBeRelativelyClose(p.shear.max.factor * line.shear.max.value, 1e-12);
      });
    }
  });

  it('uses the span factor for positive moment and the pier factor for negative moment near a pier', () => {
    const g = effects.girders.interior!;
    const spanFactor = code.governing.find((f) => f.girder === 'interior' && f.effect === 'moment' && f.location.span === 1)!.value;
    const pierFactor = code.governing.find((f) => f.girder === 'interior' && f.effect === 'negative-moment' && f.location.support === 1)!.value;
    expect(pierFactor).not.toBeCloseTo(spanFactor, 4); // L differs: (80 + 140)/2 ft against 140 ft
    const mid = g.points.find((p) => p.span === 1 && Math.abs(p.fraction - 0.5) < 1e-9)!;
    expect(mid.moment.max.factor).toBe(spanFactor);
    const atPier = g.points.find((p) => p.span === 0 && Math.abs(p.fraction - 1) < 1e-9)!;
    expect(atPier.moment.min.factor).toBe(pierFactor);
    expect(atPier.moment.min.value).toBeLessThan(0);
  });
});
