/**
 * Lengths inside the solver's sentences, shown in the reader's units
 * (shared/quantities/inText.ts). Conversion: 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B).
 * Precision as an engineer writes lengths: ft to 2 decimals, m to 3 (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { lengthInText, showLengths } from '../../../shared/quantities/inText.js';
import { buildGrillage } from '../../../shared/grillage/model.js';
import { assertDeck } from '../../../shared/deck/schema.js';
import { fromUs } from '../../../shared/units.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';

describe('lengths in sentences', () => {
  it('shows a token in ft for US customary and in m for SI, and leaves other text alone', () => {
    const text = `near x = ${lengthInText(73.65)}: ${lengthInText(0.3048)} along by ${lengthInText(-1.5)} across`;
    expect(showLengths(text, 'US')).toBe('near x = 241.63 ft: 1.00 ft along by -4.92 ft across');
    expect(showLengths(text, 'SI')).toBe('near x = 73.650 m: 0.305 m along by -1.500 m across');
    expect(showLengths('no lengths here, 3 m of text', 'US')).toBe('no lengths here, 3 m of text');
    // full precision is kept in the token: the shown value rounds the exact length
    expect(showLengths(lengthInText(fromUs.ft(12.345)), 'US')).toBe('12.35 ft');
  });

  it('a US deck whose mesh has an elongated panel reads its finding in ft, with no metres and no token left', () => {
    const deck = assertDeck({ ...quarryCreekDeck(), spans: [{ length: fromUs.ft(30) }] } as never);
    const model = buildGrillage(deck, { segmentsPerSpan: 40 });
    const f = model.findings.find((x) => x.code === 'panel-aspect-ratio')!;
    expect(f).toBeDefined();
    const us = showLengths(f.message, 'US');
    expect(us).toMatch(/near x = [\d.]+ ft: 0\.75 ft along the girders by 10\.29 ft across/);
    expect(us).not.toMatch(/\d m\b/);
    expect(us).not.toContain('{{len:');
    expect(showLengths(f.message, 'SI')).toMatch(/0\.229 m along the girders by 3\.136 m across/);
  });
});
