/**
 * Finding levels (shared/findings/levels.ts): one reading of every finding code, used by the
 * workspace, the review, the package and the CSV. The levels are the product's (common
 * practice, no source); the finding codes and what they mean are shared/lrfd/findings.ts's.
 * Decks: the invented Larchmont Ridge demo and test decks.
 */
import { describe, expect, it } from 'vitest';
import { FINDING_LEVEL_MARKS, FINDING_LEVELS, findingLevel, worstFindingLevel } from '../../../shared/findings/levels.js';
import type { FindingCode } from '../../../shared/lrfd/findings.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';
import { assertDeck } from '../../../shared/deck/schema.js';

const CODES: FindingCode[] = ['out-of-range', 'fallback', 'capped', 'not-applicable', 'policy', 'assumption', 'no-share'];

describe('finding levels', () => {
  it('read every code finding: a range left (used or replaced) is the top level, a correction that does not apply a note', () => {
    const levels = Object.fromEntries(CODES.map((c) => [c, findingLevel({ code: c })]));
    expect(levels).toEqual({
      'out-of-range': 'out-of-range',
      fallback: 'out-of-range',
      capped: 'warning',
      'no-share': 'warning',
      policy: 'assumption',
      assumption: 'assumption',
      'not-applicable': 'note',
    });
  });

  it('read the grillage’s findings by their severity, and a loose refined bound as a warning', () => {
    expect(findingLevel({ code: 'panel-aspect-ratio', severity: 'warning' })).toBe('warning');
    expect(findingLevel({ code: 'layout', severity: 'info' })).toBe('note');
    expect(findingLevel({ code: 'loose-bound', severity: 'info' })).toBe('warning');
  });

  it('give each level a mark of its own, and the highest of several findings', () => {
    expect(new Set(FINDING_LEVELS.map((l) => FINDING_LEVEL_MARKS[l])).size).toBe(4);
    expect(worstFindingLevel([])).toBeNull();
    expect(worstFindingLevel([{ code: 'not-applicable' }, { code: 'assumption' }])).toBe('assumption');
    expect(worstFindingLevel([{ code: 'capped' }, { code: 'fallback' }, { code: 'not-applicable' }])).toBe('out-of-range');
  });

  it('on the demo deck (20° skew, within every range) mark no value above a note or an assumption', () => {
    // the review says every formula is within its range there; the marks must not say otherwise
    const r = computeCodeFactors(assertDeck(quarryCreekDeck()));
    const levels = new Set(r.factors.flatMap((f) => f.findings.map((x) => findingLevel(x))));
    expect(levels.has('out-of-range')).toBe(false);
    expect([...levels].every((l) => l === 'note' || l === 'assumption')).toBe(true);
    expect(r.factors.some((f) => f.findings.some((x) => findingLevel(x) === 'note'))).toBe(true);
  });
});
