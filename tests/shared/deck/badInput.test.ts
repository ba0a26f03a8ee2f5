/**
 * Bad decks give a typed error naming the field and the rule — never NaN, never a silent
 * default. Rules: girders must not overlap and spacing must be positive (geometry, common
 * practice, no source); the roadway must hold one 12 ft design lane (AASHTO LRFD
 * Art. 3.6.1.1.1); the properties a section type's formulas read must be given (Tables
 * 4.6.2.2.2b-1 and 4.6.2.2.3a-1); a skew of 90° or more is not a skew (Art. 4.6.2.2.2e uses
 * tan θ).
 */
import { describe, expect, it } from 'vitest';
import { assertDeck, computeCodeFactors, computeCodeFactorsFromInput, deckFromDisplay, DeckInputError } from '../../../shared/index.js';
import { BASE_US, usDeck } from '../lrfd/decks.js';

function errorOf(fn: () => unknown): DeckInputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof DeckInputError) return e;
    throw new Error(`expected a DeckInputError, got ${String(e)}`);
  }
  throw new Error('expected a DeckInputError, nothing was thrown');
}

const paths = (e: DeckInputError) => e.issues.map((i) => i.path.join('.'));

describe('bad decks', () => {
  it('overlapping girders', () => {
    const e = errorOf(() => usDeck({ girders: { kind: 'offsets', offsets: [0, 8, 8, 16] } }));
    expect(paths(e)).toContain('girders.offsets.2');
    expect(e.message).toMatch(/overlapping|right of/);
    const e2 = errorOf(() => usDeck({ girders: { kind: 'offsets', offsets: [0, 8, 6, 16] } }));
    expect(paths(e2)).toContain('girders.offsets.2');
  });
  it('non-positive spacing', () => {
    for (const spacing of [0, -3]) {
      const e = errorOf(() => usDeck({ girders: { kind: 'uniform', count: 5, spacing } }));
      expect(paths(e)).toContain('girders.spacing');
      expect(e.message).toMatch(/greater than 0/);
    }
    const nan = errorOf(() => usDeck({ girders: { kind: 'uniform', count: 5, spacing: Number.NaN } }));
    expect(paths(nan)).toContain('girders.spacing');
  });
  it('a roadway narrower than one design lane', () => {
    // 2 girders at 6 ft with 2 ft overhangs and 1.5 ft barriers: 7 ft between the faces.
    const deck = usDeck({ girders: { kind: 'uniform', count: 2, spacing: 6 }, overhangLeft: 2, overhangRight: 2 });
    const e = errorOf(() => computeCodeFactors(deck));
    expect(paths(e)).toEqual(['barrierRight.width']);
    expect(e.message).toMatch(/narrower than one 12 ft design lane/);
    // Barriers that leave nothing at all.
    const e2 = errorOf(() => computeCodeFactors(usDeck({ barrierLeft: { width: 20 }, barrierRight: { width: 20 } })));
    expect(paths(e2)[0]).toMatch(/barrier/);
  });
  it('missing properties for the chosen section type', () => {
    const noI = errorOf(() => usDeck({ sectionType: 'k', section: { area: 1085, centroidFromTop: 35.62 } }));
    expect(paths(noI)).toContain('section.inertia');
    const noEg = errorOf(() => usDeck({ sectionType: 'a', section: { area: 50, inertia: 20000 } }));
    expect(paths(noEg)).toContain('section.centroidFromTop');
    const noD = errorOf(() => usDeck({ sectionType: 'b', section: {} }));
    expect(paths(noD)).toContain('section.depth');
    const noCells = errorOf(() => usDeck({ sectionType: 'd', section: { depth: 60 } }));
    expect(paths(noCells)).toContain('section.cells');
    const noJ = errorOf(() => usDeck({ sectionType: 'f', section: { inertia: 1e5, width: 48 } }));
    expect(paths(noJ)).toContain('section.torsion');
    // Checked by the engine: the S/D constant K, the connection of types g, i, j, the web depth of type d.
    const noShape = errorOf(() => computeCodeFactors(usDeck({ sectionType: 'h', section: { width: 60 } })));
    expect(paths(noShape)).toEqual(['section.beamShape']);
    const noUnit = errorOf(() => computeCodeFactors(usDeck({ sectionType: 'i', section: { area: 50, inertia: 2e4, eg: 30, width: 96 } })));
    expect(paths(noUnit)).toEqual(['section.actsAsUnit']);
    const noWebDepth = errorOf(() => computeCodeFactors(usDeck({ sectionType: 'd', section: { cells: 4 } })));
    expect(paths(noWebDepth)).toEqual(['section.depth']);
  });
  it('skew of 90° or more', () => {
    for (const skew of [90, 95, -90]) {
      const e = errorOf(() => usDeck({ supports: [{ skew: 0 }, { skew }] }));
      expect(paths(e)).toContain('supports.1.skew');
      expect(e.message).toMatch(/90/);
    }
  });
  it('a support list that does not match the spans', () => {
    const e = errorOf(() => usDeck({ supports: [{ skew: 0 }, { skew: 0 }, { skew: 0 }] }));
    expect(paths(e)).toContain('supports');
  });
  it('unvalidated input goes through the schema first', () => {
    const e = errorOf(() => computeCodeFactorsFromInput(deckFromDisplay({ ...BASE_US, slab: { thickness: -1 } }, 'US')));
    expect(paths(e)).toContain('slab.thickness');
    expect(() => assertDeck({})).toThrow(DeckInputError);
  });
});
