/** Study sweeps: the points, the deck of each point, and the factors' trends against the code. */
import { describe, expect, it } from 'vitest';
import { deckAtPoint, parseSweep, studyPoints, SweepError, STUDY_POINT_LIMIT, type SweepInput } from '../../../shared/studies/sweep.js';
import { computeCodePoint, studyKey, summarizeRows } from '../../../shared/studies/pointResult.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { assertDeck, type DeckInput } from '../../../shared/deck/schema.js';
import { fromUs, toUs } from '../../../shared/units.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';

const sweepOf = (input: SweepInput) => {
  const r = parseSweep(input);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.sweep;
};
const square = (): DeckInput => ({ ...quarryCreekDeck(), supports: [{ skew: 0 }, { skew: 0 }] });
const ft = (v: number) => fromUs.ft(v);

describe('study points', () => {
  it('a range gives its ends and every step between, a grid the product of two axes', () => {
    const one = studyPoints(sweepOf({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 45, step: 5 } }] }));
    expect(one.map((p) => p.values[0])).toEqual([0, 5, 10, 15, 20, 25, 30, 35, 40, 45]);
    const grid = studyPoints(sweepOf({ axes: [{ parameter: 'skew', values: { kind: 'list', values: [0, 30] } }, { parameter: 'overhang', values: { kind: 'range', from: 0.5, to: 1.5, step: 0.5 } }] }));
    expect(grid).toHaveLength(6);
    expect(grid[4].values).toEqual([30, 1]);
  });

  it('a range that ends before it starts has no points, and says so', () => {
    const s = sweepOf({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 30, to: 10, step: 5 } }] });
    expect(() => studyPoints(s)).toThrow(SweepError);
    expect(() => studyPoints(s)).toThrow(/has no points.*to is less than from/);
  });

  it('a step of zero or less is refused with its field', () => {
    const r = parseSweep({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 10, step: 0 } }] });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toEqual({ path: ['axes', 0, 'values', 'step'], message: 'the step must be greater than 0' });
  });

  it('more points than the limit says the count and proposes a coarser step within the limit', () => {
    const s = sweepOf({ axes: [{ parameter: 'girderSpacing', values: { kind: 'range', from: 1, to: 4, step: 0.001 } }] });
    let message = '';
    try {
      studyPoints(s);
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toMatch(/^the study has 3,001 points, more than this firm's limit of 2,000: try a step of 0\.002 m \(/);
    const proposed = sweepOf({ axes: [{ parameter: 'girderSpacing', values: { kind: 'range', from: 1, to: 4, step: 0.002 } }] });
    expect(studyPoints(proposed).length).toBeLessThanOrEqual(STUDY_POINT_LIMIT);
  });

  it("a point's deck changes only the swept parameter, and leaves the saved deck as it was", () => {
    const deck = quarryCreekDeck();
    const before = JSON.stringify(deck);
    const s = sweepOf({ axes: [{ parameter: 'spanLength', values: { kind: 'list', values: [40] } }, { parameter: 'overhang', values: { kind: 'list', values: [1.2] } }] });
    const at = deckAtPoint(deck, s, [40, 1.2]);
    expect(JSON.stringify(deck)).toBe(before);
    expect(at.spans[0].length).toBe(40);
    expect([at.overhangLeft, at.overhangRight]).toEqual([1.2, 1.2]);
    expect({ ...at, spans: deck.spans, overhangLeft: deck.overhangLeft, overhangRight: deck.overhangRight }).toEqual(deck);
  });

  it('a parameter that makes the deck invalid at a point gives that point the deck\'s own message; the others compute', () => {
    const s = sweepOf({ axes: [{ parameter: 'slabThickness', values: { kind: 'list', values: [0.2, 2] } }] });
    const [ok, bad] = studyPoints(s).map((p) => computeCodePoint(deckAtPoint(quarryCreekDeck(), s, p.values)));
    expect(ok.ok).toBe(true);
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error).toMatch(/^slab\.thickness: slab thickness must be at most 1000 mm/);
  });
});

describe('every point equals a single-deck computation', () => {
  it('code methods: the same factors to 1e-12 at each point of a two-parameter grid', () => {
    const s = sweepOf({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 50, step: 25 } }, { parameter: 'girderSpacing', values: { kind: 'list', values: [ft(8), ft(12)] } }] });
    for (const p of studyPoints(s)) {
      const out = computeCodePoint(deckAtPoint(quarryCreekDeck(), s, p.values));
      if (!out.ok) throw new Error(out.error);
      // the same deck, written out by hand: the identity the study must keep
      const single = computeCodeFactors(assertDeck({ ...quarryCreekDeck(), supports: [{ skew: p.values[0] }, { skew: p.values[0] }], girders: { kind: 'uniform', count: 6, spacing: p.values[1] } }));
      const expected = summarizeRows(single.factors, null);
      for (const [key, v] of Object.entries(expected.values)) {
        const got = out.summary.values[key as keyof typeof expected.values]!;
        expect(Math.abs(got.governing - v!.governing)).toBeLessThanOrEqual(1e-12);
        for (const [m, x] of Object.entries(v!.byMethod)) expect(Math.abs(got.byMethod[m as 'formula']! - x)).toBeLessThanOrEqual(1e-12);
      }
    }
  });
});

describe('trends against the code', () => {
  it('interior moment, two or more lanes, rises with S as (S/9.5)^0.6·(S/L)^0.2 (AASHTO LRFD Table 4.6.2.2.2b-1)', () => {
    const spacings = [6, 8, 10, 12, 14].map(ft);
    const s = sweepOf({ axes: [{ parameter: 'girderSpacing', values: { kind: 'list', values: spacings } }] });
    const rows = studyPoints(s).map((p) => {
      const r = computeCodeFactors(assertDeck(deckAtPoint(square(), s, p.values)));
      return r.factors.find((f) => f.id === 'interior/moment/span1/multiple/formula')!;
    });
    for (let i = 1; i < rows.length; i++) {
      expect(rows[i].value).toBeGreaterThan(rows[i - 1].value);
      // L, ts and Kg are held, so g − 0.075 scales as S^(0.6 + 0.2) (Table 4.6.2.2.2b-1)
      const ratio = (rows[i].value - 0.075) / (rows[0].value - 0.075);
      expect(ratio).toBeCloseTo((spacings[i] / spacings[0]) ** 0.8, 10);
    }
  });

  it('the moment skew reduction starts at 30° and is 1 − c1·tan^1.5θ beyond (AASHTO LRFD Table 4.6.2.2.2e-1)', () => {
    const s = sweepOf({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 45, step: 5 } }] });
    const results = studyPoints(s).map((p) => computeCodeFactors(assertDeck(deckAtPoint(quarryCreekDeck(), s, p.values))));
    const formula = results.map((r) => r.factors.find((f) => f.id === 'interior/moment/span1/multiple/formula')!.value);
    const skews = studyPoints(s).map((p) => p.values[0]);
    skews.forEach((theta, i) => {
      if (theta < 30) expect(formula[i]).toBe(formula[0]);
      else expect(formula[i]).toBeLessThan(formula[0]);
    });
    const d = results[0].derived;
    const L = toUs.ft(d.spans[0]), S = toUs.ft(d.interiorSpacing!), ts = toUs.in(quarryCreekDeck().slab.thickness), Kg = toUs.in4(d.Kg!);
    const c1 = 0.25 * (Kg / (12 * L * ts ** 3)) ** 0.25 * (S / L) ** 0.5;
    expect(formula[9] / formula[0]).toBeCloseTo(1 - c1 * Math.tan((45 * Math.PI) / 180) ** 1.5, 10);
  });

  it('a sweep of S across 16 ft shows the fallback from there on (AASHTO LRFD Table 4.6.2.2.2b-1: 3.5 ≤ S ≤ 16.0 ft, lever rule beyond)', () => {
    const s = sweepOf({ axes: [{ parameter: 'girderSpacing', values: { kind: 'list', values: [13, 14, 15, 16, 17, 18].map(ft) } }] });
    const flags = studyPoints(s).map((p) => {
      const out = computeCodePoint(deckAtPoint({ ...square(), girders: { kind: 'uniform', count: 4, spacing: 1 } }, s, p.values));
      if (!out.ok) throw new Error(out.error);
      return out.summary.values[studyKey('interior', 'moment')]!.fallback;
    });
    expect(flags).toEqual([false, false, false, false, true, true]);
  });
});
