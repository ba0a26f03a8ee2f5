/**
 * Every deck quantity has a physical range (shared/deck/limits.ts): a value outside it is
 * refused by the schema with the field's path and the bound in SI and US customary units,
 * before any computation can size an array from it. The ranges are engineering judgement
 * (common practice, no source); the load modifiers' 0.95–1.05 is AASHTO LRFD Art. 1.3.3–1.3.5
 * (from memory). The published example deck and the demo decks lie inside every range.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseDeck, type DeckInput } from '../../../shared/deck/schema.js';
import { formatBound, MAX_DESIGN_LANES, PHYSICAL_LIMITS } from '../../../shared/deck/limits.js';
import { computeCodeFactors } from '../../../shared/lrfd/factors.js';
import { designLanes } from '../../../shared/lrfd/lanes.js';
import { deckFromDisplay } from '../../../shared/index.js';
import { demoDecks } from '../../../server/db/demoDecks.js';
import { quarryCreekDeck } from '../../fixtures/decks.js';

type Path = (string | number)[];

/** A copy of the deck with the value at `path` replaced. */
function withValue(deck: DeckInput, path: Path, value: unknown): unknown {
  const copy = structuredClone(deck) as Record<string | number, unknown>;
  let at = copy;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string | number, unknown>;
  at[path[path.length - 1]] = value;
  return copy;
}

/** A base deck on which each field can be set on its own: concrete materials, diaphragms with I. */
function base(): DeckInput {
  const d = quarryCreekDeck();
  return {
    ...d,
    section: { ...d.section, torsion: 0.05, depth: 1.8, width: 1.0, cells: 3 },
    materials: { deck: { kind: 'concrete', fc: 28e6, unitWeight: 23.5e3, K1: 1 }, girder: { kind: 'modulus', modulus: 30e9 } },
    diaphragms: { type: 'concrete-diaphragms', atSupports: true, intermediatePerSpan: 1, inertia: 0.1, modulus: 25e9 },
    loadModifiers: { ductility: 1, redundancy: 1, importance: 1 },
  };
}

const L = PHYSICAL_LIMITS;
const FIELDS: [Path, keyof typeof PHYSICAL_LIMITS][] = [
  [['girders', 'spacing'], 'girderSpacing'],
  [['overhangLeft'], 'overhang'],
  [['overhangRight'], 'overhang'],
  [['barrierLeft', 'width'], 'barrierWidth'],
  [['barrierRight', 'height'], 'barrierHeight'],
  [['slab', 'thickness'], 'slabThickness'],
  [['slab', 'haunch'], 'haunch'],
  [['slab', 'wearingSurface'], 'wearingSurface'],
  [['section', 'area'], 'girderArea'],
  [['section', 'inertia'], 'girderInertia'],
  [['section', 'centroidFromTop'], 'sectionDimension'],
  [['section', 'torsion'], 'torsion'],
  [['section', 'depth'], 'sectionDimension'],
  [['section', 'width'], 'sectionDimension'],
  [['materials', 'deck', 'fc'], 'concreteStrength'],
  [['materials', 'deck', 'unitWeight'], 'concreteUnitWeight'],
  [['materials', 'deck', 'K1'], 'K1'],
  [['materials', 'girder', 'modulus'], 'modulus'],
  [['spans', 0, 'length'], 'spanLength'],
  [['diaphragms', 'inertia'], 'diaphragmInertia'],
  [['diaphragms', 'modulus'], 'modulus'],
  [['loadModifiers', 'ductility'], 'loadModifier'],
  [['loadModifiers', 'importance'], 'loadModifier'],
];

function issuesAt(input: unknown, path: Path): string[] {
  const r = parseDeck(input);
  if (r.ok) return [];
  return r.issues.filter((i) => i.path.join('.') === path.join('.')).map((i) => i.message);
}

describe('physical ranges of the deck', () => {
  it('the base deck of these checks is valid', () => {
    const r = parseDeck(base());
    expect(r.ok ? [] : r.issues).toEqual([]);
  });

  it.each(FIELDS)('%j: huge, non-finite and just-outside values are refused naming the field and both units', (path, limit) => {
    const range = L[limit];
    for (const bad of [1e308, -1e308, Number.POSITIVE_INFINITY, Number.NaN, range.max * 1.001 + 1e-12]) {
      const messages = issuesAt(withValue(base(), path, bad), path);
      expect(messages, `${path.join('.')} = ${bad}`).toHaveLength(1);
    }
    const tooBig = issuesAt(withValue(base(), path, range.max * 1.001 + 1e-12), path)[0];
    expect(tooBig).toContain(`at most ${formatBound(range.max, range.kind)}`);
    if (range.kind === 'length') expect(tooBig).toMatch(/ m \(.* ft\)/);
    if (range.min > 0) {
      expect(issuesAt(withValue(base(), path, range.min * 0.999), path)[0]).toContain(`at least ${formatBound(range.min, range.kind)}`);
      expect(issuesAt(withValue(base(), path, 0), path)[0]).toMatch(/greater than 0/);
    }
  });

  it.each(FIELDS)('%j: both ends of the range are accepted', (path, limit) => {
    const range = L[limit];
    const ends = range.min > 0 ? [range.min, range.max] : [range.max];
    for (const v of ends) expect(issuesAt(withValue(base(), path, v), path), `${path.join('.')} = ${v}`).toEqual([]);
  });

  it('counts are bounded: girders, spans, cells, intermediate diaphragms', () => {
    expect(issuesAt(withValue(base(), ['girders', 'count'], 41), ['girders', 'count'])[0]).toMatch(/at most 40/);
    expect(issuesAt(withValue(base(), ['section', 'cells'], 1e9), ['section', 'cells'])[0]).toMatch(/at most 40/);
    expect(issuesAt(withValue(base(), ['diaphragms', 'intermediatePerSpan'], 1e6), ['diaphragms', 'intermediatePerSpan'])).toHaveLength(1);
    const spans = Array.from({ length: 13 }, () => ({ length: 20 }));
    const supports = Array.from({ length: 14 }, () => ({ skew: 0 }));
    expect(issuesAt({ ...base(), spans, supports }, ['spans'])[0]).toMatch(/at most 12/);
  });

  it('offsets: each gap within the spacing range, each offset within ±200 m', () => {
    const at = (offsets: number[]) => parseDeck({ ...base(), girders: { kind: 'offsets', offsets } });
    const close = at([0, 0.1, 3, 6]);
    expect(close.ok).toBe(false);
    if (!close.ok) expect(close.issues.map((i) => i.path.join('.'))).toEqual(['girders.offsets.1']);
    const wide = at([0, 3, 30]);
    expect(wide.ok).toBe(false);
    if (!wide.ok) expect(wide.issues[0].message).toContain(`to ${formatBound(L.girderSpacing.max, 'length')}`);
    const far = at([0, 3, 1e300]);
    expect(far.ok).toBe(false);
    expect(at([150, 153, 156]).ok).toBe(true);
  });

  it('the whole deck is at most 80 m wide; the widest accepted deck computes with at most 21 lanes', () => {
    // 40 girders at 2 m plus two 1.5 m overhangs: 81 m, refused
    const tooWide = parseDeck({ ...base(), girders: { kind: 'uniform', count: 40, spacing: 2 }, overhangLeft: 1.5, overhangRight: 1.5 });
    expect(tooWide.ok).toBe(false);
    if (!tooWide.ok) expect(tooWide.issues[0]).toMatchObject({ path: ['girders'], message: expect.stringMatching(/81 m \(265\.7 ft\) wide.*at most 80 m \(262\.5 ft\)/) });
    const widest = parseDeck({ ...base(), girders: { kind: 'uniform', count: 40, spacing: 2 }, overhangLeft: 1, overhangRight: 1 });
    expect(widest.ok).toBe(true);
    if (!widest.ok) return;
    const result = computeCodeFactors(widest.deck);
    // 80 m less two 0.4572 m barriers = 79.09 m = 259.5 ft: INT(259.5 / 12) = 21 lanes (Art. 3.6.1.1.1)
    expect(result.derived.designLanes).toBe(21);
  });

  it('lanes are never laid out past the guard, whatever width reaches them', () => {
    expect(() => designLanes(1e308)).toThrow(new RegExp(`at most ${MAX_DESIGN_LANES} are computed`));
    expect(() => designLanes(3.6576 * (MAX_DESIGN_LANES + 1))).toThrow(/design lanes/);
    expect(designLanes(3.6576 * MAX_DESIGN_LANES + 0.01).count).toBe(MAX_DESIGN_LANES);
  });

  it('the published example deck and the demo decks lie within every range', () => {
    const file = JSON.parse(readFileSync('public/examples/fhwa-psc-step-5-1.deck.json', 'utf8')) as { units: 'US'; deck: unknown };
    const example = parseDeck(deckFromDisplay(file.deck, file.units));
    expect(example.ok ? [] : example.issues).toEqual([]);
    for (const d of demoDecks()) expect(parseDeck(d.deck).ok).toBe(true);
  });
});
