/**
 * The cross-section sheet's arithmetic (src/components/scene/sectionSheet.ts): its dimension
 * strings add up to the deck (overhang + Σ bays + overhang = deck width; barrier + roadway +
 * barrier = deck width; lane edges and wheel lines chain across the roadway), the drawing is
 * orthographic (one scale for both axes), every length prints in the deck's unit system with
 * the app's precision (ft or m to 3 decimals, no exponent, no foreign unit), and texts of one
 * row never overlap, nor do rows. Plane geometry, hand derivation; drafting conventions
 * (strings stacked in rows, texts above their line) are common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { assertDeck, type Deck } from '@shared/deck/schema';
import { deckFromDisplay } from '@shared/deck/units';
import { deckGeometry } from '@shared/deck/geometry';
import { placementRulesForDeck, clampPlacement, WHEEL_TO_LANE_EDGE } from '@shared/placement/rules';
import { fromUs, toUs } from '@shared/units';
import { deckTemplate } from '@/components/deck/deckTemplates';
import { sectionDrawing } from '@/components/scene/sceneModel';
import { layoutSheet, placeTexts, transverseAt, type DimRow, type RowKey, type Sheet, type SheetRequest } from '@/components/scene/sectionSheet';

const GAUGE = fromUs.ft(6);
const LANE = fromUs.ft(12);

const precast = assertDeck(deckTemplate('precast-one-span').build());
const twelve = assertDeck(deckTemplate('steel-wide-twelve').build());
/** An SI deck entered in m and mm: five steel girders at 3.0 m, 1.0 m overhangs, 0.45 m barriers. */
const metric = assertDeck(
  deckFromDisplay(
    {
      ...(deckTemplate('steel-three-span').build() as Deck),
      girders: { kind: 'uniform', count: 5, spacing: 3.0 },
      overhangLeft: 1.0,
      overhangRight: 1.0,
      barrierLeft: { width: 0.45, height: 810 },
      barrierRight: { width: 0.45, height: 810 },
      slab: { thickness: 225, haunch: 50, wearingSurface: 0 },
      section: { area: 45000, inertia: 2.4e10, centroidFromTop: 820, torsion: 4.5e6, depth: 1700 },
      materials: { deck: { kind: 'concrete', fc: 30, unitWeight: 23.5 }, girder: { kind: 'modulus', modulus: 200000 } },
      spans: [{ length: 36 }],
      continuous: false,
      supports: [{ skew: 0 }, { skew: 0 }],
      diaphragms: { type: 'none' },
    },
    'SI',
  ),
);

/** Lanes laid out by the placement rules from the left barrier face, wheels 2 ft inside the lane. */
function rulesLanes(deck: Deck, count: number) {
  const rules = placementRulesForDeck(deck);
  const g = deckGeometry(deck);
  const lanes = Array.from({ length: Math.min(count, rules.laneCount) }, (_, i) => ({ left: g.curbLeft + i * (rules.laneWidth + 0.4), wheelOffset: 0 }));
  return { lanes: clampPlacement({ lanes }, rules).lanes, laneWidth: rules.laneWidth };
}

function sheetOf(deck: Deck, units: 'US' | 'SI', width = 900, laneCount = 2): Sheet {
  const { lanes, laneWidth } = rulesLanes(deck, laneCount);
  const s = layoutSheet({ deck, lanes, laneWidth, gauge: GAUGE, studiedGirder: 0, units, width });
  if (!s.ok) throw new Error(s.message);
  return s;
}

const row = (s: Sheet, key: RowKey): DimRow => {
  const r = s.rows.find((x) => x.key === key);
  if (!r) throw new Error(`no row ${key}`);
  return r;
};
const sum = (r: DimRow) => r.segments.reduce((a, x) => a + x.length, 0);

describe('dimension strings add up (plane geometry)', () => {
  const s = sheetOf(precast, 'US');
  const g = deckGeometry(precast);
  const width = g.deckRight - g.deckLeft;

  it('overhang + Σ bays + overhang = deck width, each bay the girder spacing', () => {
    const r = row(s, 'girders');
    expect(sum(r)).toBeRelativelyClose(width, 1e-12);
    expect(r.segments[0].length).toBeRelativelyClose(precast.overhangLeft, 1e-12);
    expect(r.segments.at(-1)!.length).toBeRelativelyClose(precast.overhangRight, 1e-12);
    const bays = r.segments.slice(1, -1);
    expect(bays).toHaveLength(5);
    for (const b of bays) expect(b.length).toBeRelativelyClose(fromUs.ft(9 + 8 / 12), 1e-12);
    // 9 ft 8 in prints as 9.667 ft (ft to 3 decimals), one text per bay when they fit
    expect(r.texts.map((t) => t.text)).toEqual(['3.500 ft', ...Array(5).fill('9.667 ft'), '3.500 ft']);
  });

  it('barrier + curb-to-curb roadway + barrier = deck width', () => {
    const r = row(s, 'barriers');
    expect(sum(r)).toBeRelativelyClose(width, 1e-12);
    expect(r.texts.map((x) => x.text)).toEqual(['1.500 ft', `${toUs.ft(g.roadwayWidth).toFixed(3)} ft`, '1.500 ft']);
    expect(row(s, 'overall').texts.map((x) => x.text)).toEqual([`${toUs.ft(width).toFixed(3)} ft`]);
  });

  it('lane edges chain from barrier face to barrier face: each edge + lane width = the next edge', () => {
    const r = row(s, 'lanes');
    expect(sum(r)).toBeRelativelyClose(g.roadwayWidth, 1e-12);
    expect(r.segments[0].from).toBeRelativelyClose(g.curbLeft, 1e-12);
    expect(r.segments.at(-1)!.to).toBeRelativelyClose(g.curbRight, 1e-12);
    for (let i = 1; i < r.segments.length; i++) expect(r.segments[i].from).toBe(r.segments[i - 1].to);
    const { lanes, laneWidth } = rulesLanes(precast, 2);
    for (const l of lanes) {
      const lane = r.segments.find((x) => Math.abs(x.from - l.left) < 1e-12)!;
      expect(lane.to).toBeRelativelyClose(l.left + laneWidth, 1e-12);
      expect(r.texts.find((t) => t.from === lane.from)?.text).toBe('12.000 ft');
    }
  });

  it('wheel lines chain across each lane: offset + gauge + rest = lane width; 2 ft from the lane edge (AASHTO LRFD Art. 3.6.1.3.1)', () => {
    const r = row(s, 'wheels');
    expect(r.segments).toHaveLength(6);
    for (let lane = 0; lane < 2; lane++) {
      const [a, b, c] = r.segments.slice(lane * 3, lane * 3 + 3);
      expect(a.length + b.length + c.length).toBeRelativelyClose(LANE, 1e-12);
      expect(b.length).toBeRelativelyClose(GAUGE, 1e-12);
      expect(a.length).toBeGreaterThanOrEqual(WHEEL_TO_LANE_EDGE - 1e-9);
      expect(c.length).toBeGreaterThanOrEqual(WHEEL_TO_LANE_EDGE - 1e-9);
    }
    expect(r.texts.slice(0, 3).map((t) => t.text)).toEqual(['2.000 ft', '6.000 ft', '4.000 ft']);
  });

  it('gives the outer wheel lines from the barrier faces', () => {
    const r = row(s, 'wheel-to-barrier');
    const { lanes } = rulesLanes(precast, 2);
    const wheels = lanes.flatMap((l) => [l.left + l.wheelOffset, l.left + l.wheelOffset + GAUGE]);
    expect(r.segments[0].length).toBeRelativelyClose(Math.min(...wheels) - g.curbLeft, 1e-12);
    expect(r.segments[1].length).toBeRelativelyClose(g.curbRight - Math.max(...wheels), 1e-12);
  });

  it('draws each dimension between the x of its ends at the sheet scale', () => {
    for (const r of s.rows) {
      for (const seg of r.segments) expect(seg.x2 - seg.x1).toBeRelativelyClose(seg.length * s.scale, 1e-9);
    }
  });
});

describe('an orthographic section to scale (plane geometry)', () => {
  for (const [name, deck, units] of [['precast, US', precast, 'US'], ['steel, SI', metric, 'SI'], ['twelve girders, US', twelve, 'US']] as const) {
    it(`${name}: one scale across and up`, () => {
      const s = sheetOf(deck, units);
      const g = deckGeometry(deck);
      const d = sectionDrawing(deck);
      expect(s.slab.width / (g.deckRight - g.deckLeft)).toBeRelativelyClose(s.scale, 1e-9);
      expect(s.slab.height / deck.slab.thickness).toBeRelativelyClose(s.scale, 1e-9);
      const ys = s.girders[0].points.map((p) => p[1]);
      expect((Math.max(...ys) - Math.min(...ys)) / d.depth).toBeRelativelyClose(s.scale, 1e-9);
      const xs = s.girders.map((gd) => gd.labelX);
      for (let i = 1; i < xs.length; i++) expect((xs[i] - xs[i - 1]) / (g.offsets[i] - g.offsets[i - 1])).toBeRelativelyClose(s.scale, 1e-9);
      // the drawing fits its container
      expect(s.slab.x).toBeGreaterThanOrEqual(0);
      expect(s.slab.x + s.slab.width).toBeLessThanOrEqual(s.width);
    });
  }

  it('turns a drawing x back into the transverse position it was drawn from', () => {
    const s = sheetOf(precast, 'US');
    const g = deckGeometry(precast);
    for (const y of [g.deckLeft, 0, 3.1, g.deckRight]) expect(transverseAt(s, s.x0 + (y - g.deckLeft) * s.scale)).toBeCloseTo(y, 9);
    const lane = s.lanes[0];
    expect(transverseAt(s, lane.band.x)).toBeRelativelyClose(rulesLanes(precast, 2).lanes[0].left, 1e-9);
  });

  it('highlights the girder under study and labels G1..Gn', () => {
    const { lanes, laneWidth } = rulesLanes(precast, 1);
    const s = layoutSheet({ deck: precast, lanes, laneWidth, gauge: GAUGE, studiedGirder: 3, units: 'US', width: 900 }) as Sheet;
    expect(s.girders.map((x) => x.label)).toEqual(['G1', 'G2', 'G3', 'G4', 'G5', 'G6']);
    expect(s.girders.filter((x) => x.studied).map((x) => x.label)).toEqual(['G4']);
  });
});

describe('lengths in the deck unit system', () => {
  /** The lengths a text holds: "9.667 ft", or "5 @ 9.667 ft = 48.333 ft" for a crowded run of equal bays. */
  const lengthsIn = (t: string) => t.replace(/^\d+ @ /, '').split(' = ');
  const texts = (s: Sheet) => s.rows.flatMap((r) => r.texts.flatMap((x) => lengthsIn(x.text)));

  it('a US deck prints ft to 3 decimals, never m, never an exponent', () => {
    for (const deck of [precast, twelve]) {
      for (const t of texts(sheetOf(deck, 'US'))) {
        expect(t).toMatch(/^\d{1,3}(,\d{3})*\.\d{3} ft$/);
        expect(t).not.toMatch(/\bm\b|e[+-]?\d/);
      }
    }
  });

  it('an SI deck prints m to 3 decimals, never ft, never an exponent', () => {
    const all = texts(sheetOf(metric, 'SI'));
    for (const t of all) {
      expect(t).toMatch(/^\d+\.\d{3} m$/);
      expect(t).not.toMatch(/ft|e[+-]?\d/);
    }
    expect(row(sheetOf(metric, 'SI'), 'girders').texts.map((x) => x.text)).toEqual(['1.000 m', '3.000 m', '3.000 m', '3.000 m', '3.000 m', '1.000 m']);
  });

  it('a dimension that is round-off residue prints 0, not an exponent', () => {
    // a wheel line 3.6e-16 m from a lane edge after arithmetic is left out of the string
    const g = deckGeometry(precast);
    const s = layoutSheet({ deck: precast, lanes: [{ left: g.curbLeft + 1e-16, wheelOffset: WHEEL_TO_LANE_EDGE }], laneWidth: LANE, gauge: GAUGE, studiedGirder: 0, units: 'US', width: 900 }) as Sheet;
    for (const t of texts(s)) expect(t).not.toMatch(/e[+-]?\d/);
    expect(row(s, 'lanes').texts[0].text).toBe('12.000 ft');
  });
});

describe('texts that do not collide', () => {
  /** Extension lines (of every row) that run through text t's glyphs (cap height ~8 px above its baseline). */
  const linesThrough = (s: Sheet, t: DimRow['texts'][number]) =>
    s.rows.flatMap((r) => r.extensions).filter((e) => Math.min(e.y1, e.y2) < t.y - 1 && Math.max(e.y1, e.y2) > t.y - 8 && Math.abs(e.x - t.x) < t.width / 2);
  const overlaps = (s: Sheet, r: DimRow) => {
    const found: string[] = [];
    for (let i = 0; i < r.texts.length; i++) {
      for (let j = i + 1; j < r.texts.length; j++) {
        const a = r.texts[i];
        const b = r.texts[j];
        if (a.level !== b.level) continue;
        if (Math.abs(a.x - b.x) < (a.width + b.width) / 2) found.push(`${a.text} / ${b.text}`);
      }
      // nor does an extension line run through it
      for (const e of linesThrough(s, r.texts[i])) found.push(`${r.texts[i].text} / line at ${e.x.toFixed(1)}`);
    }
    return found;
  };
  const rowsApart = (s: Sheet) => {
    const sorted = [...s.rows].sort((a, b) => a.top - b.top);
    for (let i = 1; i < sorted.length; i++) expect(sorted[i].top).toBeGreaterThanOrEqual(sorted[i - 1].bottom - 1e-9);
    // every text of a row lies inside the row's band and inside the sheet
    for (const r of s.rows) {
      for (const t of r.texts) {
        expect(t.y - 11).toBeGreaterThanOrEqual(r.top - 1e-9);
        expect(t.y + 3).toBeLessThanOrEqual(r.bottom);
        // on the far side of the dimension line from the deck, clear of its ticks (±3 px)
        if (r.top < s.roadTop) expect(t.y).toBeLessThanOrEqual(r.lineY - 4);
        else expect(t.y - 9).toBeGreaterThanOrEqual(r.lineY + 3);
        expect(t.x - t.width / 2).toBeGreaterThanOrEqual(0);
        expect(t.x + t.width / 2).toBeLessThanOrEqual(s.width);
      }
    }
  };

  for (const width of [820, 1450]) {
    for (const [name, deck, units, lanes] of [['precast', precast, 'US', 2], ['twelve girders, seven lanes', twelve, 'US', 7], ['steel SI', metric, 'SI', 3]] as const) {
      it(`${name} at ${width} px: no text over another, rows apart`, () => {
        const s = sheetOf(deck, units, width, lanes);
        for (const r of s.rows) expect(overlaps(s, r), r.key).toEqual([]);
        rowsApart(s);
        // the demo decks fit their container: no sideways scrolling at 1280 or 1920 px windows
        expect(s.width).toBe(width);
      });
    }
  }

  it('random decks and lane positions: texts never overlap texts or lines, rows never overlap (a crowded deck widens its sheet)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 14 }),
        fc.double({ min: 1.2, max: 4.5, noNaN: true }),
        fc.double({ min: 0.5, max: 2.2, noNaN: true }),
        fc.integer({ min: 1, max: 4 }),
        fc.integer({ min: 700, max: 2000 }),
        (count, spacing, overhang, lanes, width) => {
          const deck = assertDeck({ ...precast, girders: { kind: 'uniform', count, spacing }, overhangLeft: overhang, overhangRight: overhang });
          fc.pre(deckGeometry(deck).roadwayWidth >= LANE); // a roadway that holds one design lane
          const { lanes: placed, laneWidth } = rulesLanes(deck, lanes);
          const s = layoutSheet({ deck, lanes: placed, laneWidth, gauge: GAUGE, studiedGirder: 0, units: 'US', width });
          if (!s.ok) return;
          for (const r of s.rows) expect(overlaps(s, r), r.key).toEqual([]);
          rowsApart(s);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('draws a deck too crowded for its container on a wider sheet (it scrolls sideways) rather than texts over texts', () => {
    const deck = assertDeck({ ...precast, girders: { kind: 'uniform', count: 40, spacing: 1.3 }, overhangLeft: 0.6, overhangRight: 0.6 });
    const s = sheetOf(deck, 'US', 700, 7);
    expect(s.width).toBeGreaterThan(700);
    for (const r of s.rows) expect(overlaps(s, r), r.key).toEqual([]);
    rowsApart(s);
  });

  it('lifts a text that does not fit beside its neighbour to the next line', () => {
    // the first two do not fit inside their 10 and 20 px dimensions: both go up, side by side
    // above them; the third stands inside its 100 px dimension; the fourth moves off a crossing line
    const placed = placeTexts([{ x1: 100, x2: 110, width: 40 }, { x1: 110, x2: 130, width: 40 }, { x1: 300, x2: 400, width: 40 }, { x1: 500, x2: 600, width: 40 }], [550], 0, 1000);
    expect(placed.map((p) => p.level)).toEqual([1, 1, 0, 0]);
    expect(Math.abs(placed[0].cx - placed[1].cx)).toBeGreaterThanOrEqual(40);
    expect(placed[2].cx).toBe(350);
    expect(Math.abs(placed[3].cx - 550)).toBeGreaterThanOrEqual(20);
    expect(placed.every((p) => !p.forced)).toBe(true);
  });
});

describe('a deck that cannot be drawn', () => {
  const base: Omit<SheetRequest, 'deck'> = { lanes: [], laneWidth: LANE, gauge: GAUGE, studiedGirder: 0, units: 'US', width: 900 };

  it('says why instead of drawing nonsense', () => {
    const noRoadway = { ...precast, barrierLeft: { width: 9, height: 0.8 }, barrierRight: { width: 9, height: 0.8 } } as Deck;
    const s = layoutSheet({ ...base, deck: noRoadway });
    expect(s.ok).toBe(false);
    if (!s.ok) expect(s.message).toBe('The cross-section cannot be drawn: the barriers leave no roadway between their inside faces.');
    const nan = { ...precast, overhangLeft: Number.NaN } as Deck;
    const t = layoutSheet({ ...base, deck: nan });
    expect(t.ok).toBe(false);
  });

  it('leaves out a lane whose values are not numbers, and lays out a zero-width container at a default width', () => {
    const s = layoutSheet({ ...base, deck: precast, lanes: [{ left: Number.NaN, wheelOffset: 0.6 }, { left: 0, wheelOffset: 0.6 }], width: 0 });
    expect(s.ok).toBe(true);
    if (s.ok) {
      expect(s.lanes.map((l) => l.index)).toEqual([1]);
      expect(s.width).toBeGreaterThan(0);
    }
  });
});
