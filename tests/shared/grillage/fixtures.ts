/**
 * Invented example decks for the grillage tests (Larchmont Ridge Engineering scenario),
 * in internal SI units. Not real structures.
 */
import { fromUs } from '../../../shared/units.js';
import { assertDeck, type Deck, type DeckInput } from '../../../shared/deck/schema.js';

export interface DeckSpec {
  girders?: number;
  spacingFt?: number;
  offsetsFt?: number[];
  spansFt?: number[];
  skew?: number | number[];
  continuous?: boolean;
  overhangLeftFt?: number;
  overhangRightFt?: number;
  barrierFt?: number;
  diaphragms?: DeckInput['diaphragms'];
  torsionIn4?: number;
}

/** A steel-girder deck (type a) with an 8 in slab; lengths given in ft for readability. */
export function steelDeck(spec: DeckSpec = {}): Deck {
  const spans = spec.spansFt ?? [100];
  const skews = Array.isArray(spec.skew) ? spec.skew : new Array(spans.length + 1).fill(spec.skew ?? 0);
  const input: DeckInput = {
    name: 'Larchmont Ridge test deck',
    sectionType: 'a',
    girders: spec.offsetsFt
      ? { kind: 'offsets', offsets: spec.offsetsFt.map(fromUs.ft) }
      : { kind: 'uniform', count: spec.girders ?? 5, spacing: fromUs.ft(spec.spacingFt ?? 8) },
    overhangLeft: fromUs.ft(spec.overhangLeftFt ?? 3),
    overhangRight: fromUs.ft(spec.overhangRightFt ?? 3),
    barrierLeft: { width: fromUs.ft(spec.barrierFt ?? 1.25) },
    barrierRight: { width: fromUs.ft(spec.barrierFt ?? 1.25) },
    slab: { thickness: fromUs.in(8), haunch: fromUs.in(2) },
    section: {
      area: fromUs.in2(40),
      inertia: fromUs.in4(10000),
      centroidFromTop: fromUs.in(18),
      ...(spec.torsionIn4 !== undefined ? { torsion: fromUs.in4(spec.torsionIn4) } : {}),
    },
    materials: {
      deck: { kind: 'concrete', fc: fromUs.ksi(4) },
      girder: { kind: 'modulus', modulus: fromUs.ksi(29000) },
    },
    spans: spans.map((l) => ({ length: fromUs.ft(l) })),
    continuous: spec.continuous ?? false,
    supports: skews.map((s) => ({ skew: s })),
    diaphragms: spec.diaphragms ?? { type: 'none' },
  };
  return assertDeck(input);
}
