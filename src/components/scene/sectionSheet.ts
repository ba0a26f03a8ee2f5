/**
 * The deck's cross-section drawn as a section sheet: to scale, orthographic, with dimension
 * strings. This module computes every item of the drawing as plain numbers and text (no DOM),
 * so that the drawing's arithmetic can be checked on its own; SectionSheet.vue only draws it.
 *
 * Deck coordinates (as shared/deck/geometry.ts and shared/placement/rules.ts): transverse y in
 * metres from girder 1's centreline, positive to the right looking up-station (girder 1 on
 * the left); elevation h in metres above the top of the girders (h = 0; the slab soffit is at
 * the haunch, the girder bottom at −depth), positive up, as the 3D view's `elevations`.
 *
 * Drawing coordinates: SVG user units equal to CSS pixels of the container (the drawing is
 * laid out again for its container's width), x to the right, y downward. One scale `scale`
 * (px per m) for both axes — an orthographic section to scale:
 *   x = x0 + (y − deckLeft)·scale,   py = roadTop + (hRoad − h)·scale,
 * where hRoad is the roadway surface (slab top plus wearing surface).
 *
 * Dimension strings (lengths in the deck's unit system, ft to 3 decimals or m to 3, as the
 * deck's input boxes write them), one row each. Below the deck, nearest first: the overhangs
 * and each girder bay (centreline to centreline), then the overall deck width. Above it,
 * nearest first: the wheel lines within their lane, the lane edges from the barrier faces,
 * the outer wheel lines from the barrier faces, then the barriers and the roadway between
 * their faces (curb to curb). Texts stand on the side of their line away from the deck; a
 * text that does not fit inside its dimension goes to a further line of its row, clear of
 * every other text and of the extension lines that cross the row; rows never overlap.
 * Drafting layout: common practice, no source.
 */
import { DeckInputError, type Deck } from '@shared/deck/schema';
import { deckGeometry, type DeckGeometry } from '@shared/deck/geometry';
import { showLengths } from '@shared/quantities/inText';
import { fromUs, type UnitSystem } from '@shared/units';
import { formatValue } from '@/composables/useUnits';
import { girderOutline, sectionDrawing, type SectionDrawing } from './sceneModel';

/** Tyre width drawn, 20 in (the tyre contact width of Art. 3.6.1.2.5), m. Drawing only. */
export const TYRE_WIDTH = fromUs.in(20);
/** Tyre diameter drawn, m. Drawing only. */
export const TYRE_DIAMETER = 1.0;

/** Text sizes and spacings of the sheet, px. */
export const SHEET_TEXT = { dimension: 11, title: 11, girder: 12, lane: 11, line: 15 } as const;
const PAD = 10;
const ROW_GAP = 8;
const BAND_HEIGHT = 22;
const DEFAULT_WIDTH = 960;
const DEFAULT_MAX_HEIGHT = 520;
/** Left margin that holds the row titles, px (titles are left out on narrow sheets). */
const TITLE_MARGIN = 118;
const RIGHT_MARGIN = 18;
/** Most text lines one row stacks before letting texts overlap. */
const MAX_LEVELS = 4;

export interface SheetRequest {
  deck: Deck;
  /** Loaded lanes: left edge y (m) and left wheel line from that edge (m). */
  lanes: readonly { left: number; wheelOffset: number }[];
  laneWidth: number;
  /** Wheel line spacing, m. */
  gauge: number;
  studiedGirder: number;
  selectedLane?: number;
  units: UnitSystem;
  /** Width of the container, px. */
  width: number;
  /** Height the drawing should stay within, px (it sets the scale on narrow decks). */
  maxHeight?: number;
}

export type RowKey = 'wheel-to-barrier' | 'lanes' | 'wheels' | 'girders' | 'barriers' | 'overall';

/** One dimension of a string: from y to y (m), drawn between x1 and x2 (px). */
export interface DimSegment {
  from: number;
  to: number;
  /** to − from, m. */
  length: number;
  x1: number;
  x2: number;
}

/**
 * A text of a string: one dimension's length, or for a crowded string a run of equal
 * dimensions written "5 @ 9.667 ft = 48.333 ft". It covers [from, to], m.
 */
export interface DimText {
  from: number;
  to: number;
  text: string;
  x: number;
  /** Baseline, px. */
  y: number;
  /** Text line of the row: 0 just above the dimension line, 1 above that… */
  level: number;
  width: number;
  /** A text moved aside from its dimension points to the dimension's middle: x1, y1 → x2, y2, px. */
  leader: [number, number, number, number] | null;
}

export interface ExtensionLine {
  x: number;
  y1: number;
  y2: number;
}

export interface DimRow {
  key: RowKey;
  title: string;
  /** y of the dimension line, px. */
  lineY: number;
  /** Band of the row (its texts and line), px. */
  top: number;
  bottom: number;
  segments: DimSegment[];
  texts: DimText[];
  extensions: ExtensionLine[];
}

export interface SheetRect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface SheetGirder {
  index: number;
  label: string;
  studied: boolean;
  /** Outline, px. */
  points: [number, number][];
  haunch: SheetRect | null;
  labelX: number;
  labelY: number;
}

export interface SheetWheelPair {
  /** Wheel line x, px. */
  xs: [number, number];
  tyres: SheetRect[];
  axleY: number;
  /** Area that grabs the wheel pair, px. */
  grab: SheetRect;
}

export interface SheetLane {
  index: number;
  selected: boolean;
  band: SheetRect;
  label: string;
  wheels: SheetWheelPair;
}

export interface Sheet {
  ok: true;
  width: number;
  height: number;
  /** px per m, both axes. */
  scale: number;
  units: UnitSystem;
  /** x of the deck's left edge, px. */
  x0: number;
  /** y of the roadway surface, px. */
  roadTop: number;
  slab: SheetRect;
  wearing: SheetRect | null;
  barriers: [number, number][][];
  girders: SheetGirder[];
  steel: boolean;
  lanes: SheetLane[];
  rows: DimRow[];
  /** Whether the rows' titles are drawn (wide enough sheets). */
  titles: boolean;
  /** Deck coordinates of the drawing's ends, m. */
  deckLeft: number;
  deckRight: number;
}

export interface SheetProblem {
  ok: false;
  message: string;
}

// ---- small helpers ------------------------------------------------------------------------

/** A length as the sheet prints it: ft to 3 decimals or m to 3, never an exponent. */
export function sheetLength(m: number, units: UnitSystem): string {
  return formatValue(Math.abs(m), 'length', units, { decimals: 3, zeroBelowPrecision: true });
}

/** Advance widths of Open Sans, em: digits 0.572, narrow marks and letters less, "m" more. */
const NARROW = new Set(['.', ',', ' ', ':', 'i', 'l', 'j', 'f', 't', 'r', '(', ')', '–', '-']);
const WIDE = new Set(['m', 'w', 'M', 'W', '@']);
export function textWidth(text: string, fontPx: number): number {
  let em = 0;
  for (const ch of text) {
    if (/[0-9]/.test(ch)) em += 0.572;
    else if (NARROW.has(ch)) em += 0.3;
    else if (WIDE.has(ch)) em += 0.9;
    else if (/[A-Z]/.test(ch)) em += 0.66;
    else em += 0.56;
  }
  return em * fontPx;
}

function finiteAll(...values: number[]): boolean {
  return values.every(Number.isFinite);
}

// ---- step 1: what is drawn, in metres -----------------------------------------------------

interface Measured {
  g: DeckGeometry;
  section: SectionDrawing;
  wearing: number;
  barrierHeight: [number, number];
  lanes: { index: number; left: number; right: number; wheels: [number, number] }[];
}

/** The deck's geometry and the lanes that can be drawn (lanes with a value that is not finite are left out). */
function measure(r: SheetRequest): Measured | string {
  let g: DeckGeometry;
  try {
    g = deckGeometry(r.deck);
  } catch (e) {
    if (e instanceof DeckInputError) return e.issues.map((i) => i.message).join('; ');
    return e instanceof Error ? e.message : String(e);
  }
  const section = sectionDrawing(r.deck);
  const wearing = r.deck.slab.wearingSurface ?? 0;
  const barrierHeight: [number, number] = [r.deck.barrierLeft.height ?? 0, r.deck.barrierRight.height ?? 0];
  const sizes = [g.deckLeft, g.deckRight, section.depth, section.slabThickness, section.haunch, wearing, ...barrierHeight, ...g.offsets];
  if (!finiteAll(...sizes) || !(g.deckRight - g.deckLeft > 0) || !(section.depth > 0) || !(section.slabThickness > 0)) {
    return 'a dimension of the deck is missing or not a number';
  }
  const laneOk = finiteAll(r.laneWidth, r.gauge) && r.laneWidth > 0 && r.gauge >= 0;
  const lanes = laneOk
    ? r.lanes
        .map((l, index) => ({ index, left: l.left, right: l.left + r.laneWidth, wheels: [l.left + l.wheelOffset, l.left + l.wheelOffset + r.gauge] as [number, number] }))
        .filter((l) => finiteAll(l.left, l.wheels[0]))
    : [];
  return { g, section, wearing, barrierHeight, lanes };
}

// ---- step 2: the dimension strings, in metres ---------------------------------------------

interface Chain {
  key: RowKey;
  title: string;
  place: 'above' | 'below';
  /** Dimensions [from, to], m; a string may have gaps (the two outer wheel offsets). */
  spans: [number, number][];
  /** y of the extension lines that cross the row's texts (those of the rows beyond it), m. */
  crossing: number[];
  /** Which dimensions keep their text when the string is too crowded for all of them (all when absent). */
  keep?: boolean[];
}

/** Ends of a string's dimensions, m. */
function stopsOf(spans: [number, number][]): number[] {
  return [...new Set(spans.flat())];
}

/**
 * Extension lines run from each row to the deck, so they cross every row between: the rows
 * nearer the deck. A row's own lines stop at its dimension line, and its texts stand on the
 * line's far side from the deck, so they do not cross its own texts.
 */
function withCrossings(chains: Omit<Chain, 'crossing'>[]): Chain[] {
  return chains.map((c, i) => ({ ...c, crossing: chains.filter((o, j) => j > i && o.place === c.place).flatMap((o) => stopsOf(o.spans)) }));
}

/** The wheel lines of each lane: edge → wheel, wheel → wheel, wheel → edge; crowded, the left offsets and one gauge keep their text. */
function wheelChain(lanes: Measured['lanes']): { spans: [number, number][]; keep: boolean[] } {
  const spans: [number, number][] = [];
  const keep: boolean[] = [];
  lanes.forEach((l, i) => {
    for (const sp of through([l.left, l.wheels[0], l.wheels[1], l.right])) {
      spans.push(sp);
      const offset = Math.abs(sp[0] - l.left) < 1e-9;
      const gauge = Math.abs(sp[0] - l.wheels[0]) < 1e-9;
      keep.push(offset || (gauge && i === 0));
    }
  });
  return { spans, keep };
}

/** A continuous string through `stops` (sorted), zero-length dimensions dropped. */
function through(stops: number[]): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 1; i < stops.length; i++) if (stops[i] - stops[i - 1] > 1e-6) out.push([stops[i - 1], stops[i]]);
  return out;
}

/** The six strings of the sheet, nearest the deck first on each side. */
export function dimensionChains(m: Pick<Measured, 'g' | 'lanes'>): Chain[] {
  const { g, lanes } = m;
  const sorted = [...lanes].sort((a, b) => a.left - b.left);
  const laneStops = [g.curbLeft, ...sorted.flatMap((l) => [l.left, l.right]), g.curbRight];
  const wheels = wheelChain(sorted);
  const wheelLines = sorted.flatMap((l) => l.wheels);
  const outer: [number, number][] = [];
  if (wheelLines.length) {
    const first = Math.min(...wheelLines);
    const last = Math.max(...wheelLines);
    if (first - g.curbLeft > 1e-6) outer.push([g.curbLeft, first]);
    if (g.curbRight - last > 1e-6) outer.push([last, g.curbRight]);
  }
  return withCrossings([
    { key: 'wheels', title: 'wheel lines', place: 'above', spans: wheels.spans, keep: wheels.keep },
    { key: 'lanes', title: 'lanes', place: 'above', spans: through(laneStops) },
    { key: 'wheel-to-barrier', title: 'wheel to barrier', place: 'above', spans: outer },
    { key: 'barriers', title: 'barriers, roadway', place: 'above', spans: through([g.deckLeft, g.curbLeft, g.curbRight, g.deckRight]) },
    { key: 'girders', title: 'girder spacing', place: 'below', spans: through([g.deckLeft, ...g.offsets, g.deckRight]) },
    { key: 'overall', title: 'deck width', place: 'below', spans: [[g.deckLeft, g.deckRight]] },
  ]);
}

// ---- step 3: texts of a string on lines that do not collide -------------------------------

export interface PlacedText {
  cx: number;
  width: number;
  level: number;
  /** No free place was found: the text was put on the top line over whatever is there. */
  forced: boolean;
}

export interface TextItem {
  /** The dimension's ends, px. */
  x1: number;
  x2: number;
  /** The text's width, px. */
  width: number;
}

/** Clearance kept between a text and a line or another text, px. */
const CLEAR = 3;

/** The centre nearest `c` for a text of `width` in [lo, hi] clear of `blocked` intervals, or null. */
function nearestFree(c: number, width: number, lo: number, hi: number, blocked: [number, number][]): number | null {
  const cuts = blocked.filter(([a, b]) => b > lo && a < hi).sort((p, q) => p[0] - q[0]);
  let best: number | null = null;
  let start = lo;
  for (const [a, b] of [...cuts, [hi, hi] as [number, number]]) {
    if (a - start >= width) {
      const cx = Math.min(Math.max(c, start + width / 2), a - width / 2);
      if (best === null || Math.abs(cx - c) < Math.abs(best - c)) best = cx;
    }
    start = Math.max(start, b);
  }
  return best;
}

/**
 * Lines for the texts of one string. On the first line (next to the dimension line) a
 * text stands inside its own dimension, between its ticks; a text that does not fit there
 * goes to a further line, as near its dimension as it can (the further the line, the farther
 * aside it may stand; a leader then points to its dimension). No text covers another text or an
 * extension line (`crossing`, x in px) on its line. A string with more texts than `MAX_LEVELS`
 * lines can hold puts the rest on its top line, as near their dimension as they come.
 */
export function placeTexts(items: TextItem[], crossing: number[], minX: number, maxX: number): PlacedText[] {
  const lines: [number, number][][] = Array.from({ length: MAX_LEVELS }, () => crossing.map((x) => [x - CLEAR, x + CLEAR] as [number, number]));
  const order = items.map((_, i) => i).sort((a, b) => items[a].x1 + items[a].x2 - (items[b].x1 + items[b].x2));
  const placed: PlacedText[] = new Array(items.length);
  for (const i of order) {
    const { x1, x2, width } = items[i];
    const mid = (x1 + x2) / 2;
    let spot: PlacedText | null = null;
    for (let level = 0; level < MAX_LEVELS && !spot; level++) {
      // how far a text may stand aside from its dimension grows with the line it is on
      const reach = (x2 - x1) / 2 + width / 2 + 12 + 36 * level;
      const lo = level === 0 ? x1 + CLEAR + 1 : Math.max(minX, mid - reach - width / 2);
      const hi = level === 0 ? x2 - CLEAR - 1 : Math.min(maxX, mid + reach + width / 2);
      const cx = nearestFree(mid, width, lo, hi, lines[level]);
      if (cx !== null) spot = { cx, width, level, forced: false };
    }
    const fallback = Math.min(Math.max(mid, minX + width / 2), maxX - width / 2);
    const chosen = spot ?? { cx: fallback, width, level: MAX_LEVELS - 1, forced: true };
    lines[chosen.level].push([chosen.cx - width / 2 - CLEAR, chosen.cx + width / 2 + CLEAR]);
    placed[i] = chosen;
  }
  return placed;
}

// ---- step 4: the scale -------------------------------------------------------------------

interface Frame {
  width: number;
  x0: number;
  scale: number;
  titles: boolean;
}

/** Height of the structure and what stands on it, m: tyres or barriers above the road, the girders below. */
function structureHeight(m: Measured): number {
  const above = Math.max(TYRE_DIAMETER, ...m.barrierHeight.map((h) => h - m.wearing));
  return above + m.wearing + m.section.slabThickness + m.section.haunch + m.section.depth;
}

/** Px needed beside the structure: rows, the lane band, labels, padding. */
function fixedHeight(rowLines: number[]): number {
  const rows = rowLines.reduce((a, n) => a + n * SHEET_TEXT.line + ROW_GAP, 0);
  return 2 * PAD + rows + BAND_HEIGHT + 8 + 2 * SHEET_TEXT.line + 10;
}

/** The largest scale that fits the deck's width, and its height within `maxHeight`. */
function chooseFrame(m: Measured, width: number, maxHeight: number, rowLines: number[]): Frame {
  const titles = width >= 560;
  const left = titles ? TITLE_MARGIN : 12;
  const usable = Math.max(40, width - left - RIGHT_MARGIN);
  const deckWidth = m.g.deckRight - m.g.deckLeft;
  const byWidth = usable / deckWidth;
  const byHeight = Math.max(4, maxHeight - fixedHeight(rowLines)) / structureHeight(m);
  const scale = Math.min(byWidth, byHeight);
  const x0 = left + (usable - deckWidth * scale) / 2;
  return { width, x0, scale, titles };
}

// ---- step 5: laying the sheet out --------------------------------------------------------

interface Layout {
  frame: Frame;
  xOf: (y: number) => number;
  pyOf: (h: number) => number;
  hRoad: number;
  roadTop: number;
  bandTop: number;
  girderBottom: number;
  rows: DimRow[];
  height: number;
}

interface TextSpan {
  from: number;
  to: number;
  text: string;
}

/** One text per dimension. */
function eachLength(spans: [number, number][], units: UnitSystem): TextSpan[] {
  return spans.map(([from, to]) => ({ from, to, text: sheetLength(to - from, units) }));
}

/** Runs of three or more equal dimensions in one text, "n @ s = total"; the rest one text each. */
function equalRuns(spans: [number, number][], units: UnitSystem): TextSpan[] {
  const out: TextSpan[] = [];
  let i = 0;
  while (i < spans.length) {
    const length = spans[i][1] - spans[i][0];
    let j = i + 1;
    while (j < spans.length && Math.abs(spans[j][1] - spans[j][0] - length) < 1e-6) j++;
    if (j - i >= 3) {
      const [from, to] = [spans[i][0], spans[j - 1][1]];
      out.push({ from, to, text: `${j - i} @ ${sheetLength(length, units)} = ${sheetLength(to - from, units)}` });
      i = j;
    } else {
      out.push({ from: spans[i][0], to: spans[i][1], text: sheetLength(length, units) });
      i++;
    }
  }
  return out;
}

/**
 * Ways of writing a string, first choice first: every dimension; runs of equal dimensions
 * once ("5 @ 9.667 ft = 48.333 ft"); only the dimensions it keeps when crowded.
 */
function textChoices(chain: Chain, units: UnitSystem): TextSpan[][] {
  const choices = [eachLength(chain.spans, units), equalRuns(chain.spans, units)];
  const keep = chain.keep;
  if (keep) choices.push(eachLength(chain.spans.filter((_, i) => keep[i]), units));
  return choices;
}

/**
 * Texts of one string at the frame's scale, written the first way (textChoices) whose texts
 * all find a free place on at most two lines; else the way that leaves the fewest without one,
 * then the fewest lines.
 */
function rowTexts(chain: Chain, xOf: (y: number) => number, frame: Frame, units: UnitSystem) {
  const minX = frame.titles ? frame.x0 - 8 : 4;
  const place = (spans: TextSpan[]) => {
    const items = spans.map((t) => ({ ...t, x1: xOf(t.from), x2: xOf(t.to), width: textWidth(t.text, SHEET_TEXT.dimension) }));
    const placed = placeTexts(items, chain.crossing.map(xOf), minX, frame.width - 4);
    return { items, placed, forced: placed.filter((p) => p.forced).length };
  };
  const linesOf = (placed: PlacedText[]) => (placed.length ? Math.max(...placed.map((p) => p.level)) + 1 : 1);
  // a text without a free place costs most, a third line or more next, a lighter way of writing least
  const cost = (t: ReturnType<typeof place>, choice: number) => t.forced * 100 + Math.max(0, linesOf(t.placed) - 2) * 10 + choice;
  let best: { texts: ReturnType<typeof place>; cost: number } | null = null;
  for (const [i, choice] of textChoices(chain, units).entries()) {
    const texts = place(choice);
    const c = cost(texts, i);
    if (!best || c < best.cost) best = { texts, cost: c };
    if (c === 0) break;
  }
  const texts = (best as { texts: ReturnType<typeof place> }).texts;
  return { ...texts, lines: linesOf(texts.placed) };
}

/** Lines each string needs at the frame's scale, and how many of its texts found no free place. */
function textsAt(chains: Chain[], frame: Frame, m: Measured, units: UnitSystem): { lines: number[]; forced: number } {
  const xOf = (y: number) => frame.x0 + (y - m.g.deckLeft) * frame.scale;
  const rows = chains.map((c) => rowTexts(c, xOf, frame, units));
  return { lines: rows.map((t) => t.lines), forced: rows.reduce((a, t) => a + t.forced, 0) };
}

/** Widths tried, as multiples of the container's, for a deck too crowded to dimension legibly in it. */
const WIDENING = [1, 1.25, 1.5, 2, 2.5, 3];

/**
 * The frame of the sheet: the container's width, unless the deck is so wide for it that its
 * texts cannot all stand apart at 11 px — then the least wider sheet (which scrolls sideways)
 * where they can. Texts need more lines at a smaller scale, so the scale is settled with the
 * lines it needs.
 */
function legibleFrame(m: Measured, chains: Chain[], width: number, maxHeight: number, units: UnitSystem): Frame {
  let best: { frame: Frame; forced: number } | null = null;
  for (const k of WIDENING) {
    const first = chooseFrame(m, width * k, maxHeight * k, chains.map(() => 1));
    const frame = chooseFrame(m, width * k, maxHeight * k, textsAt(chains, first, m, units).lines);
    const forced = textsAt(chains, frame, m, units).forced;
    if (!best || forced < best.forced) best = { frame, forced };
    if (forced === 0) break;
  }
  return (best as { frame: Frame }).frame;
}

/** A line from a text that stands aside to the middle of its dimension, or null when it stands over it. */
function leaderOf(it: TextItem, x: number, y: number, lineY: number, above: boolean): [number, number, number, number] | null {
  const mid = (it.x1 + it.x2) / 2;
  if (Math.abs(x - mid) <= it.width / 2) return null;
  const edge = x > mid ? x - it.width / 2 - 1 : x + it.width / 2 + 1;
  return above ? [edge, y - 4, mid, lineY - 2] : [edge, y - 5, mid, lineY + 2];
}

/** Where a row's dimension line and text lines go: texts above the line over the deck, below it under the deck. */
function rowLines(place: Chain['place'], top: number, lines: number) {
  const L = SHEET_TEXT.line;
  if (place === 'above') {
    const lineY = top + lines * L + 4;
    return { lineY, baseline: (level: number) => lineY - 4 - level * L, bottom: lineY + ROW_GAP };
  }
  const lineY = top + 4;
  return { lineY, baseline: (level: number) => lineY + L + 1 + level * L, bottom: lineY + 4 + lines * L + ROW_GAP };
}

/** One string as a row whose band starts at `top`. */
function buildRow(chain: Chain, top: number, xOf: (y: number) => number, frame: Frame, units: UnitSystem): DimRow {
  const { items, placed, lines } = rowTexts(chain, xOf, frame, units);
  const { lineY, baseline, bottom } = rowLines(chain.place, top, lines);
  const segments: DimSegment[] = chain.spans.map(([from, to]) => ({ from, to, length: to - from, x1: xOf(from), x2: xOf(to) }));
  const texts: DimText[] = items.map((it, i) => {
    const x = placed[i].cx;
    const y = baseline(placed[i].level);
    return { from: it.from, to: it.to, text: it.text, x, y, level: placed[i].level, width: it.width, leader: leaderOf(it, x, y, lineY, chain.place === 'above') };
  });
  return { key: chain.key, title: chain.title, lineY, top, bottom, segments, texts, extensions: [] };
}

/** Rows stacked from `top` downward, each below the one before. */
function stackRows(chains: Chain[], top: number, xOf: (y: number) => number, frame: Frame, units: UnitSystem): DimRow[] {
  const rows: DimRow[] = [];
  let y = top;
  for (const c of chains) {
    const row = buildRow(c, y, xOf, frame, units);
    rows.push(row);
    y = row.bottom;
  }
  return rows;
}

/** Vertical positions of the whole sheet at the frame's scale. */
function layOut(m: Measured, chains: Chain[], frame: Frame, units: UnitSystem): Layout {
  const xOf = (y: number) => frame.x0 + (y - m.g.deckLeft) * frame.scale;
  const above = chains.filter((c) => c.place === 'above').reverse(); // farthest first, from the top
  const below = chains.filter((c) => c.place === 'below');
  const topRows = stackRows(above, PAD, xOf, frame, units);
  const rowsBottom = topRows.length ? topRows[topRows.length - 1].bottom : PAD;
  const bandTop = rowsBottom + 2;
  const hRoad = m.section.haunch + m.section.slabThickness + m.wearing;
  const tyre = TYRE_DIAMETER * frame.scale;
  const barrierAboveRoad = Math.max(...m.barrierHeight.map((h) => h - m.wearing)) * frame.scale;
  const roadTop = Math.max(bandTop + BAND_HEIGHT + 6 + tyre, rowsBottom + 4 + barrierAboveRoad);
  const pyOf = (h: number) => roadTop + (hRoad - h) * frame.scale;
  const girderBottom = pyOf(-m.section.depth);
  const labelsBottom = girderBottom + 2 * SHEET_TEXT.line + 2;
  const bottomRows = stackRows(below, labelsBottom, xOf, frame, units);
  const height = (bottomRows.length ? bottomRows[bottomRows.length - 1].bottom : labelsBottom) + PAD;
  return { frame, xOf, pyOf, hRoad, roadTop, bandTop, girderBottom, rows: [...topRows, ...bottomRows], height };
}

// ---- step 6: the drawing's shapes --------------------------------------------------------

function rect(x1: number, y1: number, x2: number, y2: number): SheetRect {
  return { x: Math.min(x1, x2), y: Math.min(y1, y2), width: Math.abs(x2 - x1), height: Math.abs(y2 - y1) };
}

/** A barrier between the deck edge `edge` and its inside face `face` (plain sloped inside face; drawing only). */
function barrierShape(L: Layout, edge: number, face: number, height: number, slabTop: number): [number, number][] {
  const w = face - edge;
  if (!(Math.abs(w) > 1e-6) || !(height > 0)) return [];
  const topWidth = Math.sign(w) * Math.max(0.4 * Math.abs(w), Math.min(Math.abs(w), 0.15));
  const base = L.pyOf(slabTop);
  const top = L.pyOf(slabTop + height);
  return [
    [L.xOf(edge), base],
    [L.xOf(face), base],
    [L.xOf(edge + topWidth), top],
    [L.xOf(edge), top],
  ];
}

function girders(m: Measured, L: Layout, studied: number): SheetGirder[] {
  const outline = girderOutline(m.section);
  const haunch = m.section.haunch;
  return m.g.offsets.map((y, index) => ({
    index,
    label: `G${index + 1}`,
    studied: index === studied,
    points: outline.map(([z, h]) => [L.xOf(y + z), L.pyOf(h)] as [number, number]),
    haunch: haunch > 1e-6 ? rect(L.xOf(y - m.section.flangeWidth / 2), L.pyOf(0), L.xOf(y + m.section.flangeWidth / 2), L.pyOf(haunch)) : null,
    labelX: L.xOf(y),
    labelY: L.girderBottom + SHEET_TEXT.line + 2,
  }));
}

function laneShapes(m: Measured, L: Layout, selected: number): SheetLane[] {
  const s = L.frame.scale;
  const tyreW = Math.max(4, TYRE_WIDTH * s);
  const tyreH = Math.max(8, TYRE_DIAMETER * s);
  return m.lanes.map((l) => {
    const band = rect(L.xOf(l.left), L.bandTop, L.xOf(l.right), L.bandTop + BAND_HEIGHT);
    const xs: [number, number] = [L.xOf(l.wheels[0]), L.xOf(l.wheels[1])];
    const tyres = xs.map((x) => rect(x - tyreW / 2, L.roadTop - tyreH, x + tyreW / 2, L.roadTop));
    const label = textWidth(`Lane ${l.index + 1}`, SHEET_TEXT.lane) + 10 <= band.width ? `Lane ${l.index + 1}` : `${l.index + 1}`;
    return {
      index: l.index,
      selected: l.index === selected,
      band,
      label,
      wheels: { xs, tyres, axleY: L.roadTop - tyreH / 2, grab: rect(xs[0] - tyreW, L.roadTop - tyreH - 2, xs[1] + tyreW, L.roadTop) },
    };
  });
}

/** Where each string's extension lines end: the feature each stop measures, px. */
function extensionTarget(key: RowKey, y: number, m: Measured, L: Layout, studied: number): number {
  const g = m.g;
  const onFace = Math.abs(y - g.curbLeft) < 1e-6 || Math.abs(y - g.curbRight) < 1e-6;
  const wheel = m.lanes.some((l) => Math.abs(l.wheels[0] - y) < 1e-6 || Math.abs(l.wheels[1] - y) < 1e-6);
  if (key === 'barriers') {
    if (onFace) return L.roadTop;
    const height = y < (g.deckLeft + g.deckRight) / 2 ? m.barrierHeight[0] : m.barrierHeight[1];
    return L.pyOf(m.section.haunch + m.section.slabThickness + Math.max(0, height)); // the barrier's top at the deck edge
  }
  if (key === 'wheels' || key === 'wheel-to-barrier' || key === 'lanes') {
    if (wheel) return L.roadTop - Math.max(8, TYRE_DIAMETER * L.frame.scale); // the tyre's top
    return onFace ? L.roadTop : L.bandTop; // a barrier face, or a lane edge
  }
  const girder = g.offsets.findIndex((o) => Math.abs(o - y) < 1e-6);
  // below the girder's label (and its "under study" note), not through them
  if (key === 'girders' && girder >= 0) return L.girderBottom + SHEET_TEXT.line * (girder === studied ? 2 : 1) + 4;
  return L.pyOf(m.section.haunch);
}

/** Extension lines of every string: from just past the dimension line to 3 px short of the feature. */
function addExtensions(rows: DimRow[], m: Measured, L: Layout, studied: number): void {
  for (const row of rows) {
    const stops = [...new Set(row.segments.flatMap((s) => [s.from, s.to]))];
    row.extensions = stops.map((y) => {
      const target = extensionTarget(row.key, y, m, L, studied);
      const x = L.xOf(y);
      return target > row.lineY ? { x, y1: row.lineY - 3, y2: target - 3 } : { x, y1: row.lineY + 3, y2: target + 3 };
    });
  }
}

// ---- the sheet ----------------------------------------------------------------------------

/** The section sheet of a deck and its lanes, or the reason it cannot be drawn. */
export function layoutSheet(r: SheetRequest): Sheet | SheetProblem {
  const measured = measure(r);
  if (typeof measured === 'string') return { ok: false, message: `The cross-section cannot be drawn: ${showLengths(measured, r.units)}.` };
  const width = Number.isFinite(r.width) && r.width >= 200 ? r.width : DEFAULT_WIDTH;
  const maxHeight = Number.isFinite(r.maxHeight) && (r.maxHeight ?? 0) > 150 ? (r.maxHeight as number) : DEFAULT_MAX_HEIGHT;
  const chains = dimensionChains(measured);
  const frame = legibleFrame(measured, chains, width, maxHeight, r.units);
  const L = layOut(measured, chains, frame, r.units);
  addExtensions(L.rows, measured, L, r.studiedGirder);
  const g = measured.g;
  const slabTop = measured.section.haunch + measured.section.slabThickness;
  return {
    ok: true,
    width: frame.width,
    height: L.height,
    scale: frame.scale,
    units: r.units,
    x0: frame.x0,
    roadTop: L.roadTop,
    slab: rect(L.xOf(g.deckLeft), L.pyOf(slabTop), L.xOf(g.deckRight), L.pyOf(measured.section.haunch)),
    wearing: measured.wearing > 1e-6 ? rect(L.xOf(g.curbLeft), L.pyOf(slabTop + measured.wearing), L.xOf(g.curbRight), L.pyOf(slabTop)) : null,
    barriers: [
      barrierShape(L, g.deckLeft, g.curbLeft, measured.barrierHeight[0], slabTop),
      barrierShape(L, g.deckRight, g.curbRight, measured.barrierHeight[1], slabTop),
    ].filter((b) => b.length > 0),
    girders: girders(measured, L, r.studiedGirder),
    steel: ['a', 'b', 'c'].includes(r.deck.sectionType),
    lanes: laneShapes(measured, L, r.selectedLane ?? -1),
    rows: L.rows,
    titles: frame.titles,
    deckLeft: g.deckLeft,
    deckRight: g.deckRight,
  };
}

/** Transverse position y (m) under drawing x (px): the inverse of the sheet's x = x0 + (y − deckLeft)·scale. */
export function transverseAt(sheet: Pick<Sheet, 'x0' | 'scale' | 'deckLeft'>, x: number): number {
  return sheet.deckLeft + (x - sheet.x0) / sheet.scale;
}
