/**
 * Which set of the code's empirical formulas applies to a deck: the cross-section types
 * a…k of AASHTO LRFD Table 4.6.2.2.1-1 grouped the way Tables 4.6.2.2.2b-1, 4.6.2.2.2d-1,
 * 4.6.2.2.3a-1 and 4.6.2.2.3b-1 group them. No units.
 *
 * - 'beam-slab'    a, e, k; and i, j when the beams are connected enough to act as a unit
 * - 'spread-box'   b, c (concrete deck on spread box beams)
 * - 'multicell'    d (cast-in-place concrete multicell box; "girders" are the webs)
 * - 'adjacent-box' f; and g when connected enough to act as a unit
 * - 'keyed'        h; and g, i, j connected only enough to prevent relative vertical
 *                  displacement at the interface (the S/D method and the lever rule)
 */
import { DeckInputError, type Deck, type SectionType } from '../deck/schema.js';

export type FormulaFamily = 'beam-slab' | 'spread-box' | 'multicell' | 'adjacent-box' | 'keyed';

export const FAMILY_DESCRIPTIONS: Record<FormulaFamily, string> = {
  'beam-slab': 'beams with a concrete deck (types a, e, k; i, j acting as a unit)',
  'spread-box': 'concrete deck on spread box beams (types b, c)',
  multicell: 'cast-in-place concrete multicell box (type d)',
  'adjacent-box': 'adjacent box beams acting as a unit (types f, g)',
  keyed: 'precast members connected only by shear keys (types h; g, i, j not acting as a unit)',
};

/** Types whose classification depends on `section.actsAsUnit`. */
const NEEDS_CONNECTION: SectionType[] = ['g', 'i', 'j'];

/**
 * The formula family of a deck.
 * @throws DeckInputError naming `section.actsAsUnit` when types g, i, j do not say how the beams are connected.
 */
export function formulaFamily(deck: Pick<Deck, 'sectionType' | 'section'>): FormulaFamily {
  const t = deck.sectionType;
  if (NEEDS_CONNECTION.includes(t) && deck.section.actsAsUnit === undefined) {
    throw new DeckInputError(
      ['section', 'actsAsUnit'],
      `section type ${t} needs to say whether the beams are connected enough to act as a unit (Tables 4.6.2.2.2b-1 and 4.6.2.2.3a-1 treat the two cases differently)`,
    );
  }
  switch (t) {
    case 'a':
    case 'e':
    case 'k':
      return 'beam-slab';
    case 'i':
    case 'j':
      return deck.section.actsAsUnit ? 'beam-slab' : 'keyed';
    case 'b':
    case 'c':
      return 'spread-box';
    case 'd':
      return 'multicell';
    case 'f':
      return 'adjacent-box';
    case 'g':
      return deck.section.actsAsUnit ? 'adjacent-box' : 'keyed';
    case 'h':
      return 'keyed';
  }
}

/** Beam-slab cross-sections to which the rigid-section check of Art. 4.6.2.2.2d applies. */
export function rigidSectionApplies(deck: Pick<Deck, 'sectionType' | 'diaphragms'>): boolean {
  return ['a', 'b', 'c', 'e', 'k'].includes(deck.sectionType) && deck.diaphragms.type !== 'none';
}

/** Constant K of the S/D method (Table 4.6.2.2.2b-1, types h; g, i, j not acting as a unit). */
export const SD_CONSTANT_K: Record<NonNullable<Deck['section']['beamShape']>, number> = {
  'solid-rectangular': 0.7,
  'voided-rectangular': 0.8,
  box: 1.0,
  channel: 2.2,
  tee: 2.0,
  'double-tee': 2.0,
};
