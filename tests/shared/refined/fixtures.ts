/**
 * Decks for the refined-factor checks (invented Larchmont Ridge Engineering scenario), built
 * in US customary values and converted with the product's named conversions.
 */
import { assertDeck, type Deck, type DeckInput } from '../../../shared/deck/schema.js';
import { fromUs } from '../../../shared/units.js';

export interface Spec {
  girders?: number;
  spacingFt?: number;
  spansFt?: number[];
  skew?: number;
  continuous?: boolean;
  overhangFt?: number;
  barrierFt?: number;
  diaphragms?: DeckInput['diaphragms'];
}

/** Steel plate girders (type a) with an 8 in slab: A = 60 in², I = 30,000 in⁴, centroid 24 in below the top. */
export function steelGirderDeck(spec: Spec = {}): Deck {
  const spans = spec.spansFt ?? [100];
  return assertDeck({
    name: 'Larchmont Ridge — Alder Brook crossing (test deck)',
    sectionType: 'a',
    girders: { kind: 'uniform', count: spec.girders ?? 6, spacing: fromUs.ft(spec.spacingFt ?? 8) },
    overhangLeft: fromUs.ft(spec.overhangFt ?? 3),
    overhangRight: fromUs.ft(spec.overhangFt ?? 3),
    barrierLeft: { width: fromUs.ft(spec.barrierFt ?? 1.25) },
    barrierRight: { width: fromUs.ft(spec.barrierFt ?? 1.25) },
    slab: { thickness: fromUs.in(8), haunch: fromUs.in(2) },
    section: { area: fromUs.in2(60), inertia: fromUs.in4(30000), centroidFromTop: fromUs.in(24) },
    materials: { deck: { kind: 'concrete', fc: fromUs.ksi(4) }, girder: { kind: 'modulus', modulus: fromUs.ksi(29000) } },
    spans: spans.map((l) => ({ length: fromUs.ft(l) })),
    continuous: spec.continuous ?? false,
    supports: new Array(spans.length + 1).fill(0).map(() => ({ skew: spec.skew ?? 0 })),
    diaphragms: spec.diaphragms ?? { type: 'none' },
  });
}

/**
 * Precast bulb-tee girders (type k): the section of the FHWA prestressed-girder design example
 * (BT-72: A = 767 in², I = 545,894 in⁴, yt = 35.4 in; six girders at 9'-8", 110 ft, 8 in slab,
 * de = 1.83 ft), built here as a right deck.
 */
export function bulbTeeDeck(skew = 0): Deck {
  return assertDeck({
    name: 'Larchmont Ridge — Cedar Hollow overpass (test deck)',
    sectionType: 'k',
    girders: { kind: 'uniform', count: 6, spacing: fromUs.ft(9 + 8 / 12) },
    overhangLeft: fromUs.ft(3.5),
    overhangRight: fromUs.ft(3.5),
    barrierLeft: { width: fromUs.ft(1.67) },
    barrierRight: { width: fromUs.ft(1.67) },
    slab: { thickness: fromUs.in(8), haunch: 0 },
    section: { area: fromUs.in2(767), inertia: fromUs.in4(545894), centroidFromTop: fromUs.in(35.4), depth: fromUs.in(72) },
    materials: {
      deck: { kind: 'concrete', fc: fromUs.ksi(4), modulusEquation: 'pre-2015' },
      girder: { kind: 'concrete', fc: fromUs.ksi(6), modulusEquation: 'pre-2015' },
    },
    spans: [{ length: fromUs.ft(110) }],
    continuous: false,
    supports: [{ skew }, { skew }],
    diaphragms: { type: 'concrete-diaphragms', atSupports: true, intermediatePerSpan: 0, width: fromUs.in(10), depth: fromUs.in(64) },
  });
}
