/**
 * Properties (fast-check) of the code-method engine:
 * 1. For any valid deck, every factor is a finite number and every governing factor is
 *    positive (or the engine refuses the deck with a typed DeckInputError) — never NaN or
 *    Infinity. Rigid-section rows may be negative (uplift of a girder far from the lanes,
 *    statics of Eq. C4.6.2.2.2d-1).
 * 2. Every input outside a range of applicability of the tables in use yields a finding
 *    naming that parameter (AASHTO LRFD Tables 4.6.2.2.2b-1, 4.6.2.2.2d-1, 4.6.2.2.3a-1,
 *    4.6.2.2.3b-1).
 * 3. The interior moment factor rises with the girder spacing, within the formulas' range
 *    (3.5 ft ≤ S ≤ 16 ft, Table 4.6.2.2.2b-1) and within the lever-rule range beyond it.
 *    Across S = 16 ft it may fall: for short spans the formula at 16 ft exceeds the lever
 *    rule just past it (e.g. L = 40 ft), a step the code itself makes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeCodeFactors, DeckInputError, SECTION_TYPES, type Deck } from '../../../shared/index.js';
import { usDeck } from './decks.js';

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

const deckArb = fc
  .record({
    sectionType: fc.constantFrom(...SECTION_TYPES),
    count: fc.integer({ min: 2, max: 12 }),
    spacing: num(2, 22),
    uneven: fc.option(fc.array(num(2, 22), { minLength: 1, maxLength: 11 }), { nil: undefined }),
    overhangL: num(0, 8),
    overhangR: num(0, 8),
    barrierL: num(0, 2.5),
    barrierR: num(0, 2.5),
    ts: num(3, 14),
    haunch: num(0, 4),
    area: num(10, 2000),
    inertia: num(1000, 2e6),
    eg: num(5, 80),
    torsion: num(1000, 2e6),
    depth: num(10, 130),
    width: num(20, 80),
    cells: fc.integer({ min: 1, max: 12 }),
    shape: fc.constantFrom('solid-rectangular', 'voided-rectangular', 'box', 'channel', 'tee', 'double-tee'),
    unit: fc.boolean(),
    n: num(0.5, 12),
    spans: fc.array(num(10, 320), { minLength: 1, maxLength: 4 }),
    continuous: fc.boolean(),
    skews: fc.array(num(-80, 80), { minLength: 5, maxLength: 5 }),
    diaphragm: fc.constantFrom('none', 'concrete-diaphragms', 'steel-cross-frames'),
    policy: fc.record({ exteriorNotLessThanInterior: fc.boolean(), leverRuleWithoutMultiplePresence: fc.boolean(), floorAtEqualShare: fc.boolean() }),
  })
  .map((p) => {
    const girders =
      p.uneven && p.uneven.length >= 1
        ? { kind: 'offsets', offsets: p.uneven.reduce((o, s) => [...o, o[o.length - 1] + s], [0]) }
        : { kind: 'uniform', count: p.count, spacing: p.spacing };
    return {
      sectionType: p.sectionType,
      girders,
      overhangLeft: p.overhangL,
      overhangRight: p.overhangR,
      barrierLeft: { width: p.barrierL },
      barrierRight: { width: p.barrierR },
      slab: { thickness: p.ts, haunch: p.haunch },
      section: { area: p.area, inertia: p.inertia, eg: p.eg, torsion: p.torsion, depth: p.depth, width: p.width, cells: p.cells, beamShape: p.shape, actsAsUnit: p.unit },
      materials: { deck: { kind: 'modulus', modulus: 4000 }, girder: { kind: 'modulus', modulus: 4000 * p.n } },
      spans: p.spans.map((length) => ({ length })),
      continuous: p.continuous,
      supports: p.skews.slice(0, p.spans.length + 1).map((skew) => ({ skew })),
      diaphragms: { type: p.diaphragm },
      policy: p.policy,
    };
  });

function computeOrRefuse(over: Record<string, unknown>) {
  let deck: Deck;
  try {
    deck = usDeck(over);
  } catch (e) {
    if (e instanceof DeckInputError) return undefined;
    throw e;
  }
  try {
    return computeCodeFactors(deck);
  } catch (e) {
    if (e instanceof DeckInputError) {
      expect(e.issues.length).toBeGreaterThan(0);
      expect(e.issues[0].path.length).toBeGreaterThan(0);
      return undefined;
    }
    throw e;
  }
}

describe('properties of the code-method engine', () => {
  it('no NaN or Infinity for any valid deck', () => {
    let computed = 0;
    fc.assert(
      fc.property(deckArb, (over) => {
        const r = computeOrRefuse(over);
        if (!r) return;
        computed++;
        expect(r.factors.length).toBeGreaterThan(0);
        for (const row of r.factors) {
          expect(Number.isFinite(row.value), `${row.id} = ${row.value}`).toBe(true);
          // The rigid-section check may give uplift (R < 0) on a girder far from the lanes; every other value is ≥ 0.
          if (row.method !== 'rigid-section') expect(row.value, row.id).toBeGreaterThanOrEqual(0);
          expect(row.skewFactor).toBeGreaterThan(0);
          expect(Number.isFinite(row.skewFactor)).toBe(true);
          for (const s of row.trace) expect(Number.isFinite(s.value), `${row.id}: ${s.label}`).toBe(true);
        }
        for (const g of r.governing) {
          expect(Number.isFinite(g.value)).toBe(true);
          expect(g.value).toBeGreaterThanOrEqual(0);
          // A zero share (e.g. the lever rule with the nearest wheel right over the adjacent
          // girder) is statics, but it must never pass silently.
          if (g.value === 0) expect(r.findings.some((f) => f.code === 'no-share' && f.message.includes(g.effect))).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
    expect(computed).toBeGreaterThan(100);
  });

  // Ranges per family: [symbol, deck override producing a value outside, family setup].
  const beamSlab = { sectionType: 'k', section: { area: 800, inertia: 300000, eg: 35 }, girders: { kind: 'uniform', count: 6, spacing: 8 }, spans: [{ length: 100 }] };
  const outside: [string, string, fc.Arbitrary<Record<string, unknown>>][] = [
    ['beam-slab', 'ts', fc.oneof(num(3, 4.45), num(12.05, 16)).map((ts) => ({ ...beamSlab, slab: { thickness: ts } }))],
    ['beam-slab', 'L', fc.oneof(num(8, 19.9), num(240.1, 400)).map((L) => ({ ...beamSlab, spans: [{ length: L }] }))],
    ['beam-slab', 'S', fc.oneof(num(2, 3.45), num(16.05, 24)).map((S) => ({ ...beamSlab, girders: { kind: 'uniform', count: 6, spacing: S } }))],
    ['beam-slab', 'Kg', num(0.5, 5).map((I) => ({ ...beamSlab, section: { area: 1, inertia: I, eg: 1 } }))],
    ['beam-slab', 'de', fc.oneof(num(5.6, 8), num(-2.5, -1.05)).map((de) => ({ ...beamSlab, overhangLeft: 3 + de, overhangRight: 3 + de, barrierLeft: { width: 3 }, barrierRight: { width: 3 } }))],
    ['spread-box', 'd', fc.oneof(num(8, 17.9), num(65.1, 90)).map((d) => ({ sectionType: 'c', section: { depth: d }, girders: { kind: 'uniform', count: 4, spacing: 10 } }))],
    ['spread-box', 'L', num(140.5, 300).map((L) => ({ sectionType: 'c', section: { depth: 48 }, girders: { kind: 'uniform', count: 4, spacing: 10 }, spans: [{ length: L }] }))],
    ['multicell', 'Nc', fc.integer({ min: 1, max: 2 }).map((nc) => ({ sectionType: 'd', section: { cells: nc, depth: 60 }, girders: { kind: 'uniform', count: 5, spacing: 9 }, spans: [{ length: 100 }] }))],
    ['adjacent-box', 'b', fc.oneof(num(20, 34.9), num(60.1, 80)).map((b) => ({ sectionType: 'f', section: { inertia: 1e5, torsion: 1.5e5, width: b }, girders: { kind: 'uniform', count: 8, spacing: 4 } }))],
    ['adjacent-box', 'Nb', fc.integer({ min: 2, max: 4 }).map((nb) => ({ sectionType: 'f', section: { inertia: 1e5, torsion: 1.5e5, width: 48 }, girders: { kind: 'uniform', count: nb, spacing: 8 } }))],
  ];
  for (const [family, symbol, arb] of outside) {
    it(`a ${family} input ${symbol} outside its range yields a finding naming ${symbol}`, () => {
      fc.assert(
        fc.property(arb, (over) => {
          const r = computeOrRefuse(over);
          if (!r) return;
          expect(r.derived.family).toBe(family);
          expect(r.findings.some((f) => f.parameter === symbol && (f.code === 'out-of-range' || f.code === 'fallback'))).toBe(true);
        }),
        { numRuns: 40 },
      );
    });
  }

  it('a finding states the limit and by how much it failed', () => {
    const r = computeCodeFactors(usDeck({ ...beamSlab, girders: { kind: 'uniform', count: 6, spacing: 17.2 } }));
    const f = r.findings.find((x) => x.parameter === 'S' && x.code === 'fallback')!;
    expect(f.message).toBe('S = 17.20 ft exceeds 16.0 ft by 1.20 ft: lever rule used');
    expect(f.limit).toBe(16);
    expect(f.excess).toBeCloseTo(1.2, 9);
  });

  it('the interior moment factor rises with spacing (formula range, then lever-rule range)', () => {
    const pair = fc.oneof(fc.tuple(num(3.5, 16), num(3.5, 16)), fc.tuple(num(16.01, 24), num(16.01, 24)));
    fc.assert(
      fc.property(pair, num(20, 240), ([a, b], L) => {
        const [s1, s2] = a < b ? [a, b] : [b, a];
        const g = (S: number) =>
          computeCodeFactors(usDeck({ ...beamSlab, girders: { kind: 'uniform', count: 6, spacing: S }, spans: [{ length: L }] })).governing.find(
            (x) => x.girder === 'interior' && x.effect === 'moment',
          )!.value;
        expect(g(s2)).toBeGreaterThanOrEqual(g(s1) - 1e-12);
      }),
      { numRuns: 80 },
    );
  });
});
