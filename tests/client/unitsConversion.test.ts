/**
 * What the workspace shows and reads in each unit system. Conversions are exact by
 * definition: 1 ft = 0.3048 m and 1 in = 0.0254 m (international yard and pound, 1959;
 * NIST SP 811, Appendix B), 1 ksi = 6.894757293 MPa (NIST SP 811, B.8, to the printed digits).
 */
import { describe, expect, it } from 'vitest';
import { formatFactor, formatInput, formatValue, parseInput, plainNumber } from '@/composables/useUnits';
import { factorText } from '@shared/lrfd/words';

describe('input boxes', () => {
  it('shows an internal length in feet or metres', () => {
    expect(formatInput(3.048, 'length', 'US')).toBe('10');
    expect(formatInput(3.048, 'length', 'SI')).toBe('3.048');
    // 9 ft 8 in = 9.666… ft = 2.9464 m exactly.
    expect(formatInput((9 + 8 / 12) * 0.3048, 'length', 'US')).toBe('9.666667');
    expect(formatInput((9 + 8 / 12) * 0.3048, 'length', 'SI')).toBe('2.9464');
  });

  it('reads typed text back into internal units', () => {
    expect(parseInput('10', 'length', 'US')).toBeRelativelyClose(3.048, 1e-15);
    expect(parseInput('8', 'dimension', 'US')).toBeRelativelyClose(0.2032, 1e-15);
    expect(parseInput('203.2', 'dimension', 'SI')).toBeRelativelyClose(0.2032, 1e-15);
    // 1 ksi = 6.894757 MPa (NIST SP 811, B.8).
    expect(parseInput('1', 'stress', 'US')! / 1e6).toBeRelativelyClose(6.894757, 1e-7);
    expect(parseInput('2,5', 'length', 'SI')).toBe(2.5);
    expect(parseInput(' 1 200 ', 'length', 'SI')).toBe(1200);
    expect(parseInput('−3', 'angle', 'SI')).toBe(-3);
    expect(parseInput('1e-3', 'length', 'SI')).toBe(0.001);
  });

  it('gives undefined for an empty box and NaN for text that is not a number', () => {
    expect(parseInput('', 'length', 'US')).toBeUndefined();
    expect(parseInput('   ', 'length', 'US')).toBeUndefined();
    expect(parseInput('abc', 'length', 'US')).toBeNaN();
    expect(parseInput('12ft', 'length', 'US')).toBeNaN();
    expect(parseInput('1.2.3', 'length', 'US')).toBeNaN();
    expect(formatInput(undefined, 'length', 'US')).toBe('');
    expect(formatInput(Number.NaN, 'length', 'US')).toBe('');
  });

  it('round-trips what is typed in one system through the other and back', () => {
    const kinds = ['length', 'dimension', 'area', 'inertia', 'stress', 'unitWeight', 'angle'] as const;
    const typed = ['9.666667', '8.5', '767', '545894', '3.6', '0.15', '20'];
    kinds.forEach((kind, i) => {
      const stored = parseInput(typed[i], kind, 'US')!;
      const si = formatInput(stored, kind, 'SI');
      const storedAgain = parseInput(si, kind, 'SI')!;
      // Shown to 7 significant digits, so re-reading the SI text agrees to about 1e-7.
      expect(storedAgain).toBeRelativelyClose(stored, 1e-6);
      // The stored value itself is what the US box shows again: exactly what was typed.
      expect(formatInput(stored, kind, 'US')).toBe(typed[i]);
    });
  });
});

describe('reading values', () => {
  it('writes values with their unit symbols', () => {
    expect(formatValue(3.048, 'length', 'US')).toBe('10.00 ft');
    expect(formatValue(3.048, 'length', 'SI')).toBe('3.048 m');
    expect(formatValue(20, 'angle', 'US')).toBe('20.0°');
    expect(formatValue(undefined, 'length', 'US')).toBe('—');
    expect(formatValue(Number.NaN, 'length', 'US')).toBe('—');
    // a factor on screen reads as the review and the package print it (shared/lrfd/words.ts)
    expect(formatFactor(0.79614)).toBe('0.7961');
    expect(formatFactor(0.79614)).toBe(factorText(0.79614));
    expect(formatFactor(Number.POSITIVE_INFINITY)).toBe('—');
  });

  it('never writes an exponent: grouped thousands, three significant digits when small, round-off as 0', () => {
    // 2.4e10 mm⁴ (a steel girder's I in SI) as an engineer writes it; 1 mm⁴ = 1e-12 m⁴.
    expect(formatValue(2.4e-2, 'inertia', 'SI')).toBe('24,000,000,000 mm⁴');
    // A wheel line on girder 1 found by the search at 3.6e-16 ft is on it (common practice, no source: below 1e-9 of the unit is round-off).
    expect(formatValue(1.11e-16, 'length', 'US')).toBe('0.00 ft');
    // 0.0004 ft is a real value below the two decimals of ft: shown with three significant digits.
    expect(formatValue(0.0004 * 0.3048, 'length', 'US')).toBe('0.000400 ft');
    expect(plainNumber(-0.5, 3)).toBe('-0.500');
    for (const v of [1e-15, 3e-7, 2e12, -7e9]) expect(plainNumber(v, 2)).not.toMatch(/e/i);
  });
});
