/**
 * Why one code value governs (shared/lrfd/choice.ts): every candidate of a girder kind,
 * effect and location is listed with what became of it, and the step's value is the one
 * `selectGoverning` picked — never recomputed. Decks and hand values as in handCalcs.test.ts
 * (AASHTO LRFD 9th edition):
 *  - type a, 5 @ 8 ft, skew 40°: the exterior moment with two lanes is the rigid-section value
 *    0.725 (Eq. C4.6.2.2.2d-1) over e·g_interior, since the exterior girder is not taken
 *    below the rigid-section value (Art. 4.6.2.2.2d);
 *  - type e, Nb = 3: the formula and the lever rule count by their lesser (Table 4.6.2.2.2d-1,
 *    "Nb = 3" row), then the larger lane case governs (Art. 3.6.1.1.2).
 */
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, governingChoice, governingFactor } from '../../../shared/index.js';
import { pickRow, usDeck } from './decks.js';

const tan = (deg: number) => Math.tan((deg * Math.PI) / 180);

describe('the governing value and its candidates', () => {
  const skewed = computeCodeFactors(usDeck({ supports: [{ skew: 40 }, { skew: 40 }], diaphragms: { type: 'steel-cross-frames', intermediatePerSpan: 3 } }));
  const stiff = 520000 / (12 * 80 * 8 ** 3);
  const skewM = 1 - 0.25 * stiff ** 0.25 * (8 / 80) ** 0.5 * tan(40) ** 1.5;

  it('lists the formula beside the rigid-section value that overrides it, with the rule and article', () => {
    const c = governingChoice(skewed.factors, { girder: 'exterior', effect: 'moment', locationKey: 'span1' }, 'multiple')!;
    const formula = pickRow(skewed, 'exterior', 'moment', 'multiple', 'formula');
    expect(c.candidates.map((x) => x.method).sort()).toEqual(['formula', 'rigid-section']);
    expect(c.candidates.find((x) => x.method === 'rigid-section')!.outcome).not.toBe('not adopted');
    expect(c.candidates.find((x) => x.method === 'formula')!.outcome).toBe('not adopted');
    expect(c.step.value).toBeRelativelyClose(0.725 * skewM, 1e-12);
    // Every candidate is an input of the step, with its own value.
    expect(c.step.inputs.map((i) => i.value)).toEqual(expect.arrayContaining([formula.value, c.step.value]));
    expect(c.step.formula).toMatch(/not taken below the rigid-section value/);
    expect(c.step.article).toContain('Art. 4.6.2.2.2d');
    // The formula value really is the smaller (else the rule would be wrong here).
    expect(formula.value).toBeLessThan(c.step.value);
  });

  it('over both lane cases, the step ends on the governing value and names the lane rule', () => {
    const c = governingChoice(skewed.factors, { girder: 'exterior', effect: 'moment', locationKey: 'span1' }, 'governing')!;
    expect(c.step.value).toBe(governingFactor(skewed, 'exterior', 'moment', 'span1')!.value);
    expect(c.candidates.filter((x) => x.outcome === 'governs')).toHaveLength(1);
    expect(new Set(c.candidates.map((x) => x.lanes))).toEqual(new Set(['one', 'multiple']));
    expect(c.step.formula).toMatch(/larger of the two lane cases governs/);
    expect(c.step.article).toContain('Art. 3.6.1.1.2');
    // Symbols say the lane case when both cases are shown.
    expect(c.step.inputs.every((i) => /lane/.test(i.symbol))).toBe(true);
  });

  it('three girders: the lesser of the formula and the lever rule counts', () => {
    const three = computeCodeFactors(
      usDeck({
        sectionType: 'e',
        girders: { kind: 'uniform', count: 3, spacing: 9 },
        overhangLeft: 4,
        overhangRight: 4,
        slab: { thickness: 7 },
        section: { area: 600, inertia: 40000, eg: 20 },
        materials: { deck: { kind: 'modulus', modulus: 3600 }, girder: { kind: 'modulus', modulus: 3600 } },
        spans: [{ length: 50 }],
      }),
    );
    const c = governingChoice(three.factors, { girder: 'exterior', effect: 'moment', locationKey: 'span1' }, 'multiple')!;
    const lesser = c.candidates.filter((x) => pickRow(three, 'exterior', 'moment', 'multiple', x.method).combine === 'lesser-of');
    expect(lesser.length).toBeGreaterThanOrEqual(2);
    expect(c.step.formula).toMatch(/lesser of the/);
    expect(c.step.article).toContain('Table 4.6.2.2.2d-1');
    // The adopted value is the least of the lesser-of pair when nothing else is larger (hand: 13/18 = 0.7222 lever rule).
    expect(c.step.value).toBeRelativelyClose(Math.min(...lesser.map((x) => x.value)), 1e-12);
  });

  it('a scope without rows gives nothing', () => {
    expect(governingChoice(skewed.factors, { girder: 'exterior', effect: 'moment', locationKey: 'span9' }, 'governing')).toBeNull();
  });
});
