/**
 * Deck cross-section geometry. Units: metres. Transverse offsets are measured from
 * girder 1's centreline (the left exterior girder), positive to the right.
 * de is positive when the curb or barrier face is outboard of the exterior girder's
 * centreline (AASHTO LRFD Art. 4.6.2.2.1, notation for de).
 */
import { DeckInputError, type Deck } from './schema.js';

export interface DeckGeometry {
  /** Girder centreline offsets from girder 1, m (first is 0). */
  offsets: number[];
  /** Spacing between girder i and i+1, m (length Nb − 1). */
  spacings: number[];
  /** Number of girders Nb. */
  girderCount: number;
  /** Deck edges, m. */
  deckLeft: number;
  deckRight: number;
  /** Inside faces of the barriers or curbs (edges of the roadway), m. */
  curbLeft: number;
  curbRight: number;
  /** Clear roadway width between curb faces w, m. */
  roadwayWidth: number;
  /** de on each side, m (positive: curb face outboard of the exterior girder). */
  deLeft: number;
  deRight: number;
}

/** Girder offsets normalised so that girder 1 is at 0, m. */
export function girderOffsets(deck: Pick<Deck, 'girders'>): number[] {
  const g = deck.girders;
  if (g.kind === 'uniform') return Array.from({ length: g.count }, (_, i) => i * g.spacing);
  const o0 = g.offsets[0];
  return g.offsets.map((o) => o - o0);
}

export function deckGeometry(deck: Deck): DeckGeometry {
  const offsets = girderOffsets(deck);
  const n = offsets.length;
  const spacings = offsets.slice(1).map((o, i) => o - offsets[i]);
  spacings.forEach((s, i) => {
    if (!(s > 0)) {
      throw new DeckInputError(['girders', 'offsets', i + 1], `girder ${i + 2} overlaps girder ${i + 1}: spacing must be greater than 0`);
    }
  });
  const deckLeft = -deck.overhangLeft;
  const deckRight = offsets[n - 1] + deck.overhangRight;
  const curbLeft = deckLeft + deck.barrierLeft.width;
  const curbRight = deckRight - deck.barrierRight.width;
  const roadwayWidth = curbRight - curbLeft;
  if (!(roadwayWidth > 0)) {
    throw new DeckInputError(['barrierRight', 'width'], 'the barriers leave no roadway between their inside faces');
  }
  return {
    offsets,
    spacings,
    girderCount: n,
    deckLeft,
    deckRight,
    curbLeft,
    curbRight,
    roadwayWidth,
    deLeft: deck.overhangLeft - deck.barrierLeft.width,
    deRight: deck.overhangRight - deck.barrierRight.width,
  };
}
