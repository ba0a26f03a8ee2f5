/**
 * Scope of the rigid-section check, AASHTO LRFD Art. 4.6.2.2.2d: the commentary to the
 * article names cross-section types a, e and k of Table 4.6.2.2.1-1 as the ones whose
 * factors were derived without diaphragms or cross-frames and so need the additional
 * investigation (wording from memory; no copy of the code was at hand to quote). Other
 * types take the check only through the owner-policy switch `rigidSectionAnyType`; no
 * type takes it without diaphragms or cross-frames. The trace says which case applied.
 *
 * Closed form checked on the policy case (Eq. C4.6.2.2.2d-1, R = NL/Nb + X_ext·Σe/Σx²):
 * 5 girders at 8 ft, x = −16, −8, 0, 8, 16 ft, Σx² = 640 ft²; curb face 1.5 ft outside
 * girder 1 (3 ft overhang − 1.5 ft barrier), truck centre 2 + 3 = 5 ft from the curb face
 * (Art. 3.6.1.3.1), so e1 = −17.5 + 5 = −12.5 ft and e2 = e1 + 12 = −0.5 ft.
 *   one lane:  m = 1.2, R = 1/5 + 16·12.5/640 = 0.5125, m·R = 0.615
 *   two lanes: m = 1.0, R = 2/5 + 16·13/640 = 0.725
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, rigidSectionScope, RIGID_SECTION_TYPES, type CodeFactorResult } from '../../../shared/index.js';
import { pickRow, usDeck, type DeckOverrides } from './decks.js';

const withFrames = { diaphragms: { type: 'steel-cross-frames', atSupports: true, intermediatePerSpan: 2 } };

/** Section properties each type needs (Table 4.6.2.2.1-1 types and the formulas' inputs). */
const SECTION_OF: Record<string, DeckOverrides> = {
  a: { section: { area: 50, inertia: 20000, eg: 30 } },
  e: { section: { area: 500, inertia: 90000, eg: 25 } },
  k: { section: { area: 700, inertia: 200000, eg: 28 } },
  b: { section: { depth: 54 } },
  c: { section: { depth: 54 } },
  d: { section: { cells: 4, depth: 60 } },
  i: { section: { area: 500, inertia: 90000, eg: 25, width: 36, actsAsUnit: true } },
  j: { section: { area: 500, inertia: 90000, eg: 25, width: 36, actsAsUnit: true } },
};

function deckOf(type: string, over: DeckOverrides = {}) {
  return usDeck({ sectionType: type, ...SECTION_OF[type], ...withFrames, ...over });
}

function scopeStep(r: CodeFactorResult) {
  const s = r.trace.find((t) => t.label.startsWith('Rigid-section check for the exterior girders'));
  if (!s) throw new Error('the derived trace has no rigid-section scope step');
  return s;
}

const hasRigidRows = (r: CodeFactorResult) => r.factors.some((x) => x.method === 'rigid-section');

describe('rigid-section check scope (AASHTO LRFD Art. 4.6.2.2.2d and commentary)', () => {
  it('names exactly types a, e and k as covered by default', () => {
    expect([...RIGID_SECTION_TYPES].sort()).toEqual(['a', 'e', 'k']);
  });

  for (const type of ['a', 'e', 'k']) {
    it(`type ${type} with cross-frames: applied by default, and the trace says it is one of a, e, k`, () => {
      const r = computeCodeFactors(deckOf(type));
      expect(hasRigidRows(r)).toBe(true);
      const step = scopeStep(r);
      expect(step.value).toBe(1);
      expect(step.note).toContain(`section type ${type} is one of types a, e, k`);
      const row = pickRow(r, 'exterior', 'moment', 'one', 'rigid-section');
      expect(row.trace.some((t) => t.note?.includes(`section type ${type} is one of types a, e, k`))).toBe(true);
      expect(row.findings.some((f) => f.code === 'policy')).toBe(false);
    });
  }

  for (const type of ['b', 'c', 'd', 'i', 'j']) {
    it(`type ${type} with cross-frames: not applied unless the owner policy asks, and the trace says why`, () => {
      const r = computeCodeFactors(deckOf(type));
      expect(hasRigidRows(r)).toBe(false);
      const step = scopeStep(r);
      expect(step.value).toBe(0);
      expect(step.note).toContain(`section type ${type} is not one of types a, e, k`);
      expect(r.findings.some((f) => f.code === 'not-applicable' && f.message.includes('rigid-section') && f.article.includes('4.6.2.2.2d'))).toBe(true);

      const on = computeCodeFactors(deckOf(type, { policy: { rigidSectionAnyType: true } }));
      expect(hasRigidRows(on)).toBe(true);
      expect(scopeStep(on).note).toContain('applied by owner policy');
      const row = pickRow(on, 'exterior', 'moment', 'one', 'rigid-section');
      expect(row.findings.some((f) => f.code === 'policy' && f.message.includes(`section type ${type}`))).toBe(true);
    });
  }

  it('type b by owner policy gives the closed-form rigid-section values (Eq. C4.6.2.2.2d-1)', () => {
    const r = computeCodeFactors(deckOf('b', { policy: { rigidSectionAnyType: true } }));
    const one = pickRow(r, 'exterior', 'moment', 'one', 'rigid-section');
    const two = pickRow(r, 'exterior', 'moment', 'multiple', 'rigid-section');
    expect(one.baseValue).toBeRelativelyClose(1.2 * (1 / 5 + (16 * 12.5) / 640), 1e-12);
    expect(two.baseValue).toBeRelativelyClose(2 / 5 + (16 * 13) / 640, 1e-12);
    // Identity: the type does not enter the rigid-body statics; type a gives the same numbers.
    const a = computeCodeFactors(deckOf('a'));
    expect(pickRow(a, 'exterior', 'moment', 'one', 'rigid-section').baseValue).toBeRelativelyClose(one.baseValue, 1e-12);
    expect(pickRow(a, 'exterior', 'moment', 'multiple', 'rigid-section').baseValue).toBeRelativelyClose(two.baseValue, 1e-12);
  });

  it('the switch adds nothing for types a, e, k', () => {
    const off = computeCodeFactors(deckOf('a'));
    const on = computeCodeFactors(deckOf('a', { policy: { rigidSectionAnyType: true } }));
    expect(on.factors.map((x) => [x.id, x.value])).toEqual(off.factors.map((x) => [x.id, x.value]));
    expect(on.findings.some((f) => f.code === 'policy')).toBe(false);
  });

  it('without diaphragms or cross-frames no type takes the check, policy or not', () => {
    for (const type of ['a', 'b']) {
      const r = computeCodeFactors(deckOf(type, { diaphragms: { type: 'none' }, policy: { rigidSectionAnyType: true } }));
      expect(hasRigidRows(r)).toBe(false);
      expect(scopeStep(r).note).toContain('no diaphragms or cross-frames');
    }
  });

  it('rigidSectionScope gives the basis of each case', () => {
    const frames = { type: 'concrete-diaphragms' as const, atSupports: true, intermediatePerSpan: 0, includeInGrillage: true };
    const policy = (on: boolean) => ({ exteriorNotLessThanInterior: false, leverRuleWithoutMultiplePresence: false, floorAtEqualShare: false, rigidSectionAnyType: on });
    expect(rigidSectionScope({ sectionType: 'e', diaphragms: frames, policy: policy(false) }).basis).toBe('section-type');
    expect(rigidSectionScope({ sectionType: 'c', diaphragms: frames, policy: policy(false) }).basis).toBe('type-not-covered');
    expect(rigidSectionScope({ sectionType: 'c', diaphragms: frames, policy: policy(true) }).basis).toBe('owner-policy');
    expect(rigidSectionScope({ sectionType: 'k', diaphragms: { ...frames, type: 'none' }, policy: policy(true) }).basis).toBe('no-diaphragms');
  });
});
