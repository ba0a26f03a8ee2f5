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

/**
 * Section types the rigid-section check covers without an owner policy. The commentary to
 * AASHTO LRFD Art. 4.6.2.2.2d says the additional investigation is required because the
 * distribution factors of multigirder cross-sections, types "a", "e" and "k" of
 * Table 4.6.2.2.1-1, were derived without considering diaphragms or cross-frames (wording
 * from memory; the text could not be checked against a copy of the code here). Types i and
 * j acting as a unit use the same formulas but are not named there, so they, like every
 * other type, take the check only when the owner's policy asks for it.
 */
export const RIGID_SECTION_TYPES: readonly SectionType[] = ['a', 'e', 'k'];

export interface RigidSectionScope {
  applies: boolean;
  /** Why: the section type is one the commentary names, an owner policy asks for it, the
   *  deck has no diaphragms or cross-frames, or the type is not named and no policy asks. */
  basis: 'section-type' | 'owner-policy' | 'no-diaphragms' | 'type-not-covered';
  /** Plain sentence for the trace and the findings. */
  reason: string;
  article: string;
}

const RIGID_ARTICLE = 'AASHTO LRFD Art. 4.6.2.2.2d and its commentary';
const RIGID_POLICY_ARTICLE = 'owner policy (rigid-section check beyond types a, e, k of Table 4.6.2.2.1-1)';

/**
 * Whether the rigid-section check of Art. 4.6.2.2.2d applies to a deck's exterior girders,
 * and why. The article's text speaks of beam-slab cross-sections with diaphragms or
 * cross-frames (from memory), so the check never applies without them, policy or not.
 */
export function rigidSectionScope(deck: Pick<Deck, 'sectionType' | 'diaphragms' | 'policy'>): RigidSectionScope {
  const t = deck.sectionType;
  const named = RIGID_SECTION_TYPES.includes(t);
  if (deck.diaphragms.type === 'none') {
    return {
      applies: false,
      basis: 'no-diaphragms',
      reason: `not applied: the deck has no diaphragms or cross-frames, which the rigid-section check presumes`,
      article: RIGID_ARTICLE,
    };
  }
  if (named) {
    return {
      applies: true,
      basis: 'section-type',
      reason: `applied: section type ${t} is one of types a, e, k named by the commentary, and the deck has ${diaphragmWords(deck)}`,
      article: RIGID_ARTICLE,
    };
  }
  if (deck.policy.rigidSectionAnyType) {
    return {
      applies: true,
      basis: 'owner-policy',
      reason: `applied by owner policy: section type ${t} is not one of types a, e, k, but the owner's policy asks for the check on every type with diaphragms or cross-frames`,
      article: RIGID_POLICY_ARTICLE,
    };
  }
  return {
    applies: false,
    basis: 'type-not-covered',
    reason: `not applied: section type ${t} is not one of types a, e, k named by the commentary (an owner policy can ask for it)`,
    article: RIGID_ARTICLE,
  };
}

function diaphragmWords(deck: Pick<Deck, 'diaphragms'>): string {
  return deck.diaphragms.type === 'steel-cross-frames' ? 'steel cross-frames' : 'concrete diaphragms';
}

/** Whether the rigid-section check of Art. 4.6.2.2.2d applies (see `rigidSectionScope` for why). */
export function rigidSectionApplies(deck: Pick<Deck, 'sectionType' | 'diaphragms' | 'policy'>): boolean {
  return rigidSectionScope(deck).applies;
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
