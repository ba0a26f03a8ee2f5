/**
 * The calculation package of a deck version, as a PDF (pdfkit; Open Sans embedded, with Noto
 * Sans SC and Noto Emoji subsets only for the characters that need them): a cover
 * (project, deck, version, author, reviewer, status), the inputs and derived section
 * properties, the governing factors, every factor with its trace and article, the governing
 * placements drawn on the cross-section (lanes, wheels, girders), the comparison of methods,
 * the findings, the girder HL-93 effects, the refined-analysis summary and decision, the review
 * record, the cautions and a signature block. Quantities are printed in the project's unit
 * system; formula inputs also show the unit the code's formula uses when it differs.
 */
import { showLengths } from '../../shared/quantities/inText.js';
import PDFDocument from 'pdfkit';
import { SECTION_TYPE_DESCRIPTIONS, type Deck } from '../../shared/deck/schema.js';
import { deckGeometry } from '../../shared/deck/geometry.js';
import type { FactorRow } from '../../shared/lrfd/index.js';
import { stepForDisplay, zeroIfNegligible, type TraceStep } from '../../shared/trace.js';
import { fromUs, toDisplay, unitSymbol, type QuantityKind, type UnitSystem } from '../../shared/units.js';
import { baseFont, fitLine, heightOf, registerFonts, write, type Weight } from './pdfFonts.js';
import type { ReportData } from './reportData.js';
import { PRODUCT_VERSION } from '../../shared/version.js';
import { formatTimestamp } from '../../shared/time/timestamps.js';
import { FINDING_LEVEL_WORDS, findingLevel } from '../../shared/findings/levels.js';
import { boundText, factorText, ratioText } from '../../shared/lrfd/words.js';
import { adoptedValue, grillageRowOfKind } from '../../shared/grillage/compare.js';

/** A finding's level in words, with its code (shared/findings/levels.ts). */
const levelWords = (f: { code: string; severity?: string }) => `${FINDING_LEVEL_WORDS[findingLevel(f)]} (${f.code})`;

export const PACKAGE_CAUTION = 'Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';

const PAGE = { width: 612, height: 792, margin: 54 };
const CONTENT_W = PAGE.width - 2 * PAGE.margin;
const BOTTOM = PAGE.height - PAGE.margin - 18;
const INK = '#1d2733';
const MUTED = '#5b6673';
const RULE = '#c9d1da';
const BAND = '#eef2f6';
const ACCENT = '#2d6a73';
const LANE = '#7fb7be';
const WHEEL = '#b8652a';

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** A number for print: grouping above 10,000, scientific notation for very large or small values. */
export function num(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return String(v);
  // Round-off residue (e.g. 1e-16 ft for a wheel over a girder) prints as zero.
  if (Math.abs(v) < 1e-9) v = 0;
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e9 || a < 1e-4)) {
    const exp = Math.floor(Math.log10(a));
    const mant = v / 10 ** exp;
    return `${mant.toFixed(3)}×10${String(exp).split('').map((c) => SUPERSCRIPT[c]).join('')}`;
  }
  if (a >= 10000) return v.toLocaleString('en-US', { maximumFractionDigits: 0 });
  return v.toFixed(decimals);
}

const DECIMALS: Record<QuantityKind, number> = { length: 3, dimension: 2, area: 1, lengthSquared: 1, inertia: 0, stress: 1, unitWeight: 4, force: 1, moment: 1, lineLoad: 3, angle: 1, none: 4 };

/** An internal value in the display unit of its kind. */
export function qty(value: number, kind: QuantityKind, units: UnitSystem, options: { zeroBelowPrecision?: boolean } = {}): string {
  const sym = unitSymbol(kind, units);
  const d = kind === 'dimension' && units === 'SI' ? 0 : kind === 'none' && Number.isInteger(value) ? 0 : DECIMALS[kind];
  const raw = toDisplay(value, kind, units);
  // In traces a value that rounds to zero at the decimals printed reads 0 (shared/trace.ts).
  const shown = num(options.zeroBelowPrecision ? zeroIfNegligible(raw, 0, d) : raw, d);
  return sym ? (sym === '°' ? `${shown}°` : `${shown} ${sym}`) : shown;
}

/**
 * A trace step's inputs on one line, "S = 8.000 ft;  Σx² = 640.0 ft²", each in the report's
 * units with the formula's US value where that unit differs; residue prints as 0.
 */
export function traceInputsText(s: TraceStep, units: UnitSystem): string {
  return s.inputs
    .map((i) => {
      const shown = qty(i.value, i.kind, units, { zeroBelowPrecision: true });
      const fd = i.formulaUnit === 'in⁴' ? 0 : 3;
      const formulaUnit = i.formulaUnit && i.formulaValue !== undefined && i.formulaUnit !== unitSymbol(i.kind, units) ? ` (${num(zeroIfNegligible(i.formulaValue, 0, fd), fd)} ${i.formulaUnit} in the formula)` : '';
      return `${i.symbol} = ${shown}${formulaUnit}`;
    })
    .join(';  ');
}

/** A factor as the review summary and the version comparison write it (shared/lrfd/words.ts). */
const factor = factorText;

/** Short words for why a reduction is not claimed (the review panel gives the full sentence). */
const WITHHELD_SHORT: Record<string, string> = {
  'not-design-girder': 'girder {g} governs',
  'bound-unknown': 'bound not stored',
  'bound-misses-target': 'bound misses target',
  'convergence-unknown': 'mesh not checked',
  'mesh-unconverged': 'mesh not converged',
  'diaphragms-left-out': 'diaphragms left out',
  'mesh-aspect-ratio': 'panel aspect ratio above 5',
};

const EFFECT_WORDS: Record<string, string> = {
  moment: 'Moment',
  'negative-moment': 'Negative moment',
  shear: 'Shear',
  reaction: 'Reaction',
  'fatigue-moment': 'Fatigue moment',
  'fatigue-shear': 'Fatigue shear',
  deflection: 'Deflection',
};
const METHOD_WORDS: Record<string, string> = {
  formula: 'empirical formula',
  'lever-rule': 'lever rule',
  'rigid-section': 'rigid section',
  'equal-share': 'equal share',
  'interior-minimum': 'not less than interior',
  grillage: 'grillage',
};

class Writer {
  y = PAGE.margin;
  constructor(
    readonly doc: PDFKit.PDFDocument,
    readonly units: UnitSystem,
  ) {}

  newPage(): void {
    this.doc.addPage({ size: 'LETTER', margin: PAGE.margin });
    this.y = PAGE.margin;
  }

  need(h: number): void {
    if (this.y + h > BOTTOM) this.newPage();
  }

  text(s: string, o: { size?: number; weight?: Weight; color?: string; indent?: number; width?: number; gap?: number } = {}): void {
    const size = o.size ?? 9;
    const width = o.width ?? CONTENT_W - (o.indent ?? 0);
    this.doc.fontSize(size);
    const h = heightOf(this.doc, s, width, o.weight ?? 'regular');
    this.need(h);
    this.doc.fillColor(o.color ?? INK);
    write(this.doc, s, PAGE.margin + (o.indent ?? 0), this.y, { width, weight: o.weight ?? 'regular', lineGap: 1 });
    this.y += h + (o.gap ?? 3);
  }

  /** `keep`: room needed below the heading for what follows it, so a heading never ends a page. */
  heading(s: string, level: 1 | 2 = 1, keep = 40): void {
    const size = level === 1 ? 14 : 11;
    this.need(size + keep);
    if (level === 1) this.y += 6;
    this.text(s, { size, weight: 'bold', color: level === 1 ? ACCENT : INK, gap: level === 1 ? 2 : 3 });
    if (level === 1) {
      this.doc.moveTo(PAGE.margin, this.y).lineTo(PAGE.margin + CONTENT_W, this.y).lineWidth(0.8).strokeColor(ACCENT).stroke();
      this.y += 8;
    }
  }

  caution(): void {
    this.doc.fontSize(8.5);
    const h = heightOf(this.doc, PACKAGE_CAUTION, CONTENT_W - 20, 'italic') + 10;
    this.need(h + 6);
    this.doc.rect(PAGE.margin, this.y, CONTENT_W, h).fillColor('#fbf4e8').fill();
    this.doc.rect(PAGE.margin, this.y, 3, h).fillColor(WHEEL).fill();
    this.doc.fillColor(INK);
    write(this.doc, PACKAGE_CAUTION, PAGE.margin + 12, this.y + 5, { width: CONTENT_W - 20, weight: 'italic' });
    this.y += h + 8;
  }

  /** A table; widths are fractions of the content width. Cells wrap. */
  table(headers: string[], rows: string[][], widths: number[], o: { size?: number; bold?: (r: number) => boolean; align?: ('left' | 'right')[] } = {}): void {
    const size = o.size ?? 8;
    const ws = widths.map((w) => w * CONTENT_W);
    const pad = 3;
    const rowHeight = (cells: string[], weight: Weight) => {
      this.doc.fontSize(size);
      return Math.max(...cells.map((c, i) => heightOf(this.doc, c, ws[i] - 2 * pad, weight))) + 2 * pad;
    };
    const drawRow = (cells: string[], weight: Weight, fill: string | null) => {
      const h = rowHeight(cells, weight);
      if (fill) this.doc.rect(PAGE.margin, this.y, CONTENT_W, h).fillColor(fill).fill();
      let x = PAGE.margin;
      cells.forEach((c, i) => {
        this.doc.fillColor(INK).fontSize(size);
        write(this.doc, c, x + pad, this.y + pad, { width: ws[i] - 2 * pad, weight, align: o.align?.[i] ?? 'left', lineGap: 0 });
        x += ws[i];
      });
      this.y += h;
      this.doc.moveTo(PAGE.margin, this.y).lineTo(PAGE.margin + CONTENT_W, this.y).lineWidth(0.4).strokeColor(RULE).stroke();
    };
    const headH = rowHeight(headers, 'bold');
    this.need(headH + rowHeight(rows[0] ?? headers, 'regular') + 4);
    drawRow(headers, 'bold', BAND);
    rows.forEach((r, i) => {
      const h = rowHeight(r, 'regular');
      if (this.y + h > BOTTOM) {
        this.newPage();
        drawRow(headers, 'bold', BAND);
      }
      drawRow(r, o.bold?.(i) ? 'bold' : 'regular', null);
    });
    this.y += 8;
  }

  /** Label/value pairs in two columns. */
  pairs(items: [string, string][], labelWidth = 0.36): void {
    this.table(['Item', 'Value'], items.map(([a, b]) => [a, b]), [labelWidth, 1 - labelWidth], { size: 8.5 });
  }

  /** One trace step in two or three lines: "label: formula", the inputs, "= value [article]". */
  traceStep(step: TraceStep, indent = 10): void {
    const s = stepForDisplay(step);
    const inputs = traceInputsText(s, this.units);
    const lines: { text: string; weight: Weight; color: string }[] = [
      { text: `${showLengths(s.label, this.units)}:  ${showLengths(s.formula, this.units)}`, weight: 'regular', color: INK },
      ...(inputs ? [{ text: `with ${inputs}`, weight: 'regular' as Weight, color: MUTED }] : []),
      { text: `= ${qty(s.value, s.kind, this.units, { zeroBelowPrecision: true })}   [${s.article}]${s.note ? `   ${showLengths(s.note, this.units)}` : ''}`, weight: 'bold', color: ACCENT },
    ];
    this.doc.fontSize(8);
    const w = CONTENT_W - indent - 6;
    const heights = lines.map((l) => heightOf(this.doc, l.text, w, l.weight));
    const h = heights.reduce((a, b) => a + b + 0.5, 0) + 3;
    this.need(h);
    this.doc.moveTo(PAGE.margin + indent, this.y).lineTo(PAGE.margin + indent, this.y + h - 3).lineWidth(1.2).strokeColor(LANE).stroke();
    let y = this.y;
    lines.forEach((l, i) => {
      this.doc.fillColor(l.color).fontSize(8);
      write(this.doc, l.text, PAGE.margin + indent + 6, y, { width: w, weight: l.weight });
      y += heights[i] + 0.5;
    });
    this.y += h + 2;
  }
}

function deckInputs(deck: Deck, units: UnitSystem): [string, string][] {
  const g = deck.girders;
  const L = (m: number) => qty(m, 'length', units);
  const D = (m: number) => qty(m, 'dimension', units);
  const mat = (m: Deck['materials']['deck']) =>
    m.kind === 'modulus' ? `E = ${qty(m.modulus, 'stress', units)}` : `f'c = ${qty(m.fc, 'stress', units)}, wc = ${qty(m.unitWeight, 'unitWeight', units)}, K1 = ${m.K1}, Ec by the ${m.modulusEquation === 'current' ? 'current' : 'pre-2015'} equation of Art. 5.4.2.4`;
  const s = deck.section;
  const section = [
    s.area !== undefined && `A = ${qty(s.area, 'area', units)}`,
    s.inertia !== undefined && `I = ${qty(s.inertia, 'inertia', units)}`,
    s.centroidFromTop !== undefined && `centroid ${D(s.centroidFromTop)} below the top`,
    s.eg !== undefined && `eg = ${D(s.eg)}`,
    s.depth !== undefined && `d = ${D(s.depth)}`,
    s.width !== undefined && `b = ${D(s.width)}`,
    s.torsion !== undefined && `J = ${qty(s.torsion, 'inertia', units)}`,
    s.cells !== undefined && `Nc = ${s.cells}`,
    s.beamShape !== undefined && `shape: ${s.beamShape}`,
    s.actsAsUnit !== undefined && (s.actsAsUnit ? 'beams act as a unit' : 'beams connected only against relative displacement'),
  ].filter(Boolean);
  const policies = [
    deck.policy.exteriorNotLessThanInterior && 'exterior girder not less than interior (Art. 2.5.2.7.1)',
    deck.policy.leverRuleWithoutMultiplePresence && 'lever rule for one lane without multiple presence',
    deck.policy.floorAtEqualShare && 'every factor at least m·NL/Nb',
    deck.policy.rigidSectionAnyType && 'rigid-section check on every section type with diaphragms or cross-frames (not only a, e, k)',
  ].filter(Boolean);
  return [
    ['Deck', deck.name],
    ['Cross-section type (Table 4.6.2.2.1-1)', `${deck.sectionType}: ${SECTION_TYPE_DESCRIPTIONS[deck.sectionType]}`],
    ['Girders', g.kind === 'uniform' ? `${g.count} at ${L(g.spacing)} spacing` : `${g.offsets.length} at offsets ${g.offsets.map((o) => num(toDisplay(o - g.offsets[0], 'length', units), 3)).join(', ')} ${unitSymbol('length', units)}`],
    ['Overhangs (girder centreline to deck edge)', `left ${L(deck.overhangLeft)}, right ${L(deck.overhangRight)}`],
    ['Barriers (deck edge to traffic face)', `left ${L(deck.barrierLeft.width)}, right ${L(deck.barrierRight.width)}`],
    ['Slab', `ts = ${D(deck.slab.thickness)}, haunch ${D(deck.slab.haunch)}, wearing surface ${D(deck.slab.wearingSurface)}`],
    ['Girder section (girder alone)', section.join('; ') || '—'],
    ['Deck concrete', mat(deck.materials.deck)],
    ['Girder material', mat(deck.materials.girder)],
    ...(deck.materials.modularRatio !== undefined ? [['Modular ratio entered', num(deck.materials.modularRatio, 4)] as [string, string]] : []),
    ['Spans', `${deck.spans.map((s) => L(s.length)).join(', ')}${deck.spans.length > 1 ? (deck.continuous ? ', continuous' : ', simple spans') : ''}`],
    ['Skew at the supports', deck.supports.map((s, i) => `support ${i + 1}: ${s.skew.toFixed(1)}°`).join(', ')],
    ['Diaphragms', `${deck.diaphragms.type.replace(/-/g, ' ')}${deck.diaphragms.type !== 'none' ? `, ${deck.diaphragms.atSupports ? 'at the supports' : 'not at the supports'}, ${deck.diaphragms.intermediatePerSpan} intermediate per span` : ''}`],
    ['Owner policies', policies.join('; ') || 'none'],
    ['Load modifiers', `ηD = ${deck.loadModifiers.ductility}, ηR = ${deck.loadModifiers.redundancy}, ηI = ${deck.loadModifiers.importance}`],
  ];
}

function rowTitle(r: FactorRow): string {
  const girder = r.girderNumber !== undefined && r.girderKind === 'exterior' ? `Exterior girder ${r.girderNumber}` : r.girderKind === 'interior' ? 'Interior girder' : 'Exterior girder';
  const lanes = r.lanes === 'one' ? 'one lane' : r.loadedLanes ? `${r.loadedLanes} lanes` : 'two or more lanes';
  return `${girder} · ${EFFECT_WORDS[r.effect]} · ${r.location.description} · ${lanes} · ${METHOD_WORDS[r.method] ?? r.method}`;
}

interface Drawn {
  title: string;
  value: number;
  lanes: { left: number; right: number }[];
  wheels: number[];
  girder: number;
}

/** The governing placements to draw: the lever rule and the rigid-section case of the exterior girder. */
function placementsToDraw(data: ReportData): Drawn[] {
  const out: Drawn[] = [];
  const ext = data.code.factors.filter((r) => r.girderKind === 'exterior' && r.effect === 'moment');
  const lever = ext.find((r) => r.leverRule && r.lanes === 'one') ?? ext.find((r) => r.leverRule);
  if (lever?.leverRule) {
    const ws = lever.leverRule;
    const c = ws.cases[ws.governingCase];
    out.push({
      title: `Lever rule, girder ${ws.girder + 1}, ${c.loadedLanes} loaded lane${c.loadedLanes === 1 ? '' : 's'} (m = ${c.multiplePresence.toFixed(2)}): g = ${factor(c.value)}`,
      value: c.value,
      lanes: c.trucks.map((t) => ({ left: t.laneLeft, right: t.laneRight })),
      wheels: c.trucks.flatMap((t) => t.wheels.map((w) => w.offset)),
      girder: ws.girder,
    });
  }
  const rigid = ext.find((r) => r.rigidSection && r.lanes === 'multiple') ?? ext.find((r) => r.rigidSection);
  if (rigid?.rigidSection) {
    const ws = rigid.rigidSection;
    const c = ws.cases[ws.governingMultiple ?? ws.governingOne];
    const g = deckGeometry(data.input);
    const lw = data.code.derived.designLaneWidth;
    const gauge = lever?.leverRule?.gauge ?? 1.8288;
    const edge = lever?.leverRule?.wheelToLaneEdge ?? 0.6096;
    const lanes = c.eccentricities.map((e) => {
      const centre = ws.centroid + e;
      const left = e < 0 ? Math.max(g.curbLeft, centre - gauge / 2 - edge) : Math.min(g.curbRight - lw, centre + gauge / 2 + edge - lw);
      return { left, right: left + lw, centre };
    });
    out.push({
      title: `Rigid section, girder ${ws.girder + 1}, ${c.loadedLanes} loaded lane${c.loadedLanes === 1 ? '' : 's'} (m = ${c.multiplePresence.toFixed(2)}): g = ${factor(c.value)}`,
      value: c.value,
      lanes: lanes.map((l) => ({ left: l.left, right: l.right })),
      wheels: lanes.flatMap((l) => [l.centre - gauge / 2, l.centre + gauge / 2]),
      girder: ws.girder,
    });
  }
  return out;
}

function drawCrossSection(w: Writer, data: ReportData, p: Drawn): void {
  const doc = w.doc;
  const g = deckGeometry(data.input);
  w.need(185);
  w.text(p.title, { size: 9, weight: 'bold' });
  const top = w.y + 62;
  const x0 = PAGE.margin + 10;
  const span = g.deckRight - g.deckLeft;
  const scale = (CONTENT_W - 20) / span;
  const X = (y: number) => x0 + (y - g.deckLeft) * scale;
  const slabT = 7;
  // Lanes
  p.lanes.forEach((l, i) => {
    doc.rect(X(l.left), top - 40, (l.right - l.left) * scale, 14).fillOpacity(0.35).fillColor(LANE).fill().fillOpacity(1);
    doc.rect(X(l.left), top - 40, (l.right - l.left) * scale, 14).lineWidth(0.6).strokeColor(ACCENT).stroke();
    doc.fillColor(INK).font(baseFont('bold')).fontSize(7).text(`Lane ${i + 1}`, X(l.left) + 3, top - 37, { width: (l.right - l.left) * scale - 6, lineBreak: false });
  });
  // Slab and barriers
  doc.rect(X(g.deckLeft), top, span * scale, slabT).fillColor('#b9c2cc').fill();
  doc.rect(X(g.deckLeft), top - 14, (g.curbLeft - g.deckLeft) * scale, 14).fillColor('#8d98a5').fill();
  doc.rect(X(g.curbRight), top - 14, (g.deckRight - g.curbRight) * scale, 14).fillColor('#8d98a5').fill();
  // Girders (I shapes)
  const depth = 38;
  g.offsets.forEach((o, i) => {
    const cx = X(o);
    const fl = Math.min(16, 0.45 * scale * Math.min(...(g.spacings.length ? g.spacings : [1])));
    const colour = i === p.girder ? WHEEL : '#4a5663';
    doc.rect(cx - fl / 2, top + slabT, fl, 3).fillColor(colour).fill();
    doc.rect(cx - 1.3, top + slabT + 3, 2.6, depth - 6).fillColor(colour).fill();
    doc.rect(cx - fl / 2, top + slabT + depth - 3, fl, 3).fillColor(colour).fill();
    doc.fillColor(i === p.girder ? WHEEL : MUTED).font(baseFont(i === p.girder ? 'bold' : 'regular')).fontSize(7).text(`G${i + 1}`, cx - 10, top + slabT + depth + 3, { width: 20, align: 'center' });
  });
  // Wheels: arrows onto the slab
  for (const y of p.wheels) {
    const cx = X(y);
    doc.moveTo(cx, top - 24).lineTo(cx, top - 3).lineWidth(1.4).strokeColor(WHEEL).stroke();
    doc.polygon([cx - 3, top - 6], [cx + 3, top - 6], [cx, top - 1]).fillColor(WHEEL).fill();
    doc.circle(cx, top - 26, 2.5).fillColor(WHEEL).fill();
  }
  // Dimension: the first wheel from the left curb face
  const first = Math.min(...p.wheels);
  const dimY = top - 50;
  // Curb (barrier) faces
  for (const c of [g.curbLeft, g.curbRight]) doc.moveTo(X(c), top - 56).lineTo(X(c), top).lineWidth(0.4).dash(2, { space: 2 }).strokeColor(MUTED).stroke().undash();
  doc.moveTo(X(g.curbLeft), dimY).lineTo(X(first), dimY).lineWidth(0.5).strokeColor(MUTED).stroke();
  doc.moveTo(X(g.curbLeft), dimY - 3).lineTo(X(g.curbLeft), dimY + 3).stroke();
  doc.moveTo(X(first), dimY - 3).lineTo(X(first), dimY + 3).stroke();
  doc.fillColor(MUTED);
  write(doc, `${qty(first - g.curbLeft, 'length', w.units)} from the barrier face`, X(g.curbLeft) + 2, dimY - 10, { size: 6.5, width: 150, lineBreak: false });
  // Spacing note
  doc.fillColor(MUTED);
  const spacingText = g.spacings.every((s) => Math.abs(s - g.spacings[0]) < 1e-9) ? `${g.girderCount} girders at ${qty(g.spacings[0], 'length', w.units)}` : `${g.girderCount} girders, spacings ${g.spacings.map((s) => num(toDisplay(s, 'length', w.units), 2)).join(', ')} ${unitSymbol('length', w.units)}`;
  write(doc, `${spacingText}; roadway ${qty(g.roadwayWidth, 'length', w.units)} between barrier faces; wheel lines ${qty(fromUs.ft(6), 'length', w.units)} apart, ${qty(fromUs.ft(2), 'length', w.units)} from the lane edge (Art. 3.6.1.3.1); girder considered in colour.`, PAGE.margin, top + slabT + depth + 14, { size: 7, width: CONTENT_W });
  w.y = top + slabT + depth + 34;
}

function comparisonRows(data: ReportData): { rows: string[][]; bold: Set<number> } {
  const rows: string[][] = [];
  const bold = new Set<number>();
  const groups = new Map<string, FactorRow[]>();
  for (const r of data.code.factors) {
    const k = `${r.girderKind}|${r.effect}|${r.location.key}|${r.lanes}`;
    (groups.get(k) ?? groups.set(k, []).get(k)!).push(r);
  }
  for (const list of groups.values()) {
    const r0 = list[0];
    const by = (m: string) => {
      const hits = list.filter((r) => r.method === m);
      return hits.length ? hits.map((h) => `${factor(h.value)}${h.adopted ? ' *' : ''}`).join(' / ') : '—';
    };
    const other = list.filter((r) => !['formula', 'lever-rule', 'rigid-section'].includes(r.method));
    // The grillage value of the same lane case: the row of the kind, as the workspace's comparison reads it.
    const grillageRow = grillageRowOfKind(data.refinedRows ?? [], { kind: r0.girderKind, effect: r0.effect, lanes: r0.lanes, locationKey: r0.location.key });
    const adopted = adoptedValue(list);
    if (list.some((r) => r.governing)) bold.add(rows.length);
    rows.push([
      r0.girderKind,
      EFFECT_WORDS[r0.effect],
      r0.location.description,
      r0.lanes === 'one' ? 'one' : 'two or more',
      by('formula'),
      by('lever-rule'),
      by('rigid-section'),
      other.length ? other.map((o) => `${factor(o.value)} (${METHOD_WORDS[o.method]})${o.adopted ? ' *' : ''}`).join(', ') : '—',
      grillageRow ? factor(grillageRow.value) : '—',
      adopted !== undefined ? factor(adopted) : '—',
    ]);
  }
  return { rows, bold };
}

/** Builds the PDF; resolves with its bytes. */
export function calculationPackagePdf(data: ReportData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'LETTER',
    margin: PAGE.margin,
    bufferPages: true,
    info: {
      Title: `Calculation package — ${data.deck.name}, version ${data.version.number}`,
      Author: data.author.name,
      Subject: `Live-load distribution factors, project ${data.project.name}`,
      Creator: 'Deckshare',
    },
  });
  registerFonts(doc);
  doc.font(baseFont());
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const w = new Writer(doc, data.units);
  const u = data.units;

  // ── Cover ────────────────────────────────────────────────────────────────────────────
  doc.rect(0, 0, PAGE.width, 8).fillColor(ACCENT).fill();
  w.y = 96;
  w.text('Calculation package', { size: 11, color: MUTED, weight: 'bold' });
  w.text('Live-load distribution factors', { size: 24, weight: 'bold', gap: 2 });
  w.text(`${data.deck.name} — version ${data.version.number}`, { size: 15, color: ACCENT, gap: 24 });
  const statusNote =
    data.status.state === 'approved'
      ? `approved${data.status.decidedAt ? ` on ${data.status.decidedAt.slice(0, 10)}` : ''}`
      : data.status.label + (data.version.number < data.version.latestNumber ? ` (version ${data.version.latestNumber} is newer)` : '');
  w.pairs(
    [
      ['Project', data.project.name],
      ['Owner agency', data.project.ownerAgency || '—'],
      ['Location', data.project.location || '—'],
      ['Deck', data.deck.name],
      ['Version', `${data.version.number}: ${data.version.message} (saved ${formatTimestamp(data.version.createdAt, 'UTC')})`],
      ['Author', data.author.name],
      ['Reviewer', data.reviewer ? data.reviewer.name : 'not submitted for review'],
      ['Review status', statusNote],
      ['Refined analysis', data.refinedDecision ? `${data.refinedDecision.justified ? 'justified' : 'not justified'} — ${data.refinedDecision.reason}` : 'no decision recorded'],
      ['Units', u === 'US' ? 'US customary (ft, in, kip)' : 'SI (m, mm, kN)'],
      ['Software', `Deckshare ${PRODUCT_VERSION}, solver ${data.solverVersion} (${data.resultSource === 'stored' ? 'results stored with the version' : 'computed from the version'})`],
      ['Printed', formatTimestamp(data.generatedAt, 'UTC')],
    ],
    0.26,
  );
  w.caution();
  w.text('Contents: 1 Inputs and derived properties · 2 Governing factors · 3 Every factor with its trace · 4 Governing placements · 5 Comparison of methods · 6 Findings · 7 Girder live-load effects · 8 Refined analysis · 9 Review record and signatures', { size: 8.5, color: MUTED });

  // ── 1 Inputs ────────────────────────────────────────────────────────────────────────
  w.newPage();
  w.heading('1  Inputs and derived section properties');
  w.pairs(deckInputs(data.input, u));
  w.heading('Derived values', 2);
  const d = data.code.derived;
  w.pairs([
    ['Formula family', d.family],
    ['Number of girders Nb', String(d.girderCount)],
    ['Girder spacing', d.uniformSpacing ? qty(d.spacings[0], 'length', u) : d.spacings.map((s) => qty(s, 'length', u)).join(', ')],
    ...(d.interiorSpacing !== undefined ? [['S used for interior girders', `${qty(d.interiorSpacing, 'length', u)} (girder ${d.interiorSpacingGirder})`] as [string, string]] : []),
    ['Deck width', qty(d.deckWidth, 'length', u)],
    ['Clear roadway w', qty(d.roadwayWidth, 'length', u)],
    ['Design lanes NL', `${d.designLanes} of ${qty(d.designLaneWidth, 'length', u)}`],
    ['de, left / right', `${qty(d.deLeft, 'length', u)} / ${qty(d.deRight, 'length', u)}`],
    ['E deck / E girder', `${qty(d.deckModulus, 'stress', u)} / ${qty(d.girderModulus, 'stress', u)}`],
    ['Modular ratio n', num(d.modularRatio, 4)],
    ...(d.eg !== undefined ? [['eg', qty(d.eg, 'dimension', u)] as [string, string]] : []),
    ...(d.Kg !== undefined ? [['Kg', qty(d.Kg, 'inertia', u)] as [string, string]] : []),
    ['Cross-section symmetric', d.symmetric ? 'yes' : 'no'],
  ]);
  for (const s of data.code.trace) w.traceStep(s, 0);

  // ── 2 Governing factors ─────────────────────────────────────────────────────────────
  w.heading('2  Governing distribution factors');
  w.text('The value adopted for each girder, effect and place: the largest of the lane cases, each lane case taking the value its method prescribes.', { color: MUTED });
  w.table(
    ['Girder', 'Effect', 'Where', 'g (lanes)', 'Governed by'],
    data.code.governing.map((g) => [g.girder, EFFECT_WORDS[g.effect], g.location.description, factor(g.value), g.reason]),
    [0.13, 0.17, 0.2, 0.12, 0.38],
    { align: ['left', 'left', 'left', 'right', 'left'] },
  );
  w.caution();

  // ── 3 Every factor with its trace ───────────────────────────────────────────────────
  w.heading('3  Every factor with its trace', 1, 150);
  w.text('Each factor lists the steps that produced it: the formula in the code’s notation, its inputs (in the formula’s own unit where that differs), the value and the article. * marks the adopted value of a lane case; “governing” marks the value adopted for the girder and effect.', { color: MUTED });
  // Rows whose steps repeat an earlier row's formulas and values (e.g. a reaction worked exactly
  // as the shear next to it) point at that row instead of repeating the steps.
  const printed = new Map<string, string>();
  for (const r of data.code.factors) {
    const signature = r.trace.map((t) => `${t.formula}|${t.value.toPrecision(12)}|${t.inputs.map((i) => i.value.toPrecision(12)).join(',')}`).join('#');
    const same = printed.get(signature);
    // Keep a factor's title with its first step.
    w.need(same ? 30 : 80);
    w.text(`${rowTitle(r)} — g = ${factor(r.value)}${r.governing ? '  (governing)' : r.adopted ? '  *' : ''}`, { size: 9.5, weight: 'bold', gap: 2 });
    if (same) w.text(`Same steps, inputs and values as: ${same}.`, { size: 8, color: MUTED, indent: 10 });
    else {
      printed.set(signature, rowTitle(r));
      for (const s of r.trace) w.traceStep(s);
    }
    for (const f of r.findings) w.text(`Finding, ${levelWords(f)}: ${showLengths(f.message, data.units)}${f.message.includes(f.article) ? '' : ` [${f.article}]`}`, { size: 8, color: WHEEL, indent: 10 });
    w.y += 4;
  }

  // ── 4 Placements ────────────────────────────────────────────────────────────────────
  w.heading('4  Governing placements on the cross-section', 1, 210);
  const drawn = placementsToDraw(data);
  if (drawn.length === 0) w.text('No lever-rule or rigid-section case applies to this deck.', { color: MUTED });
  for (const p of drawn) drawCrossSection(w, data, p);

  // ── 5 Comparison ────────────────────────────────────────────────────────────────────
  w.heading('5  Comparison of methods');
  w.text(
    data.summary.refined.available
      ? 'Code methods beside the grillage (refined) value, the largest of the girders of each kind. * adopted value of the lane case; bold rows hold the governing value.'
      : `Code methods side by side. * adopted value of the lane case; bold rows hold the governing value. ${showLengths(data.summary.refined.note, data.units)}`,
    { color: MUTED },
  );
  const cmp = comparisonRows(data);
  w.table(['Girder', 'Effect', 'Where', 'Lanes', 'Formula', 'Lever rule', 'Rigid section', 'Other', 'Grillage', 'Adopted'], cmp.rows, [0.085, 0.1, 0.09, 0.08, 0.095, 0.095, 0.105, 0.16, 0.085, 0.105], {
    size: 7.5,
    bold: (i) => cmp.bold.has(i),
  });

  // ── 6 Findings ──────────────────────────────────────────────────────────────────────
  w.heading('6  Findings');
  if (data.code.findings.length === 0) w.text('No findings: every formula was used within its range of applicability.', { color: MUTED });
  else w.table(['Level', 'Finding', 'Article'], data.code.findings.map((f) => [levelWords(f), showLengths(f.message, data.units), f.article]), [0.17, 0.56, 0.27]);

  // ── 7 Girder effects ────────────────────────────────────────────────────────────────
  w.heading('7  Girder live-load effects (HL-93, LL+IM)');
  w.text('Girder LL+IM = g × the per-lane HL-93 envelope (design truck or tandem with the design lane load, IM = 33 %; Art. 3.6.1.3.1, 3.6.2.1, 4.6.2.2). Tenth points of each span.', { color: MUTED });
  for (const e of data.envelopes) {
    w.heading(`${e.girder === 'interior' ? 'Interior' : 'Exterior'} girder`, 2);
    w.table(
      ['Span', 'x/L', `x (${unitSymbol('length', u)})`, `M max (${unitSymbol('moment', u)})`, `M min (${unitSymbol('moment', u)})`, `V max (${unitSymbol('force', u)})`, `V min (${unitSymbol('force', u)})`, 'g moment', 'g shear', 'Governing loading'],
      e.effects.points.map((p) => [
        String(p.span + 1),
        p.fraction.toFixed(1),
        num(toDisplay(p.x, 'length', u), 2),
        num(toDisplay(p.moment.max.value, 'moment', u), 1),
        num(toDisplay(p.moment.min.value, 'moment', u), 1),
        num(toDisplay(p.shear.max.value, 'force', u), 1),
        num(toDisplay(p.shear.min.value, 'force', u), 1),
        factor(p.moment.max.factor),
        factor(p.shear.max.factor),
        p.moment.max.governing,
      ]),
      [0.06, 0.06, 0.08, 0.12, 0.12, 0.1, 0.1, 0.09, 0.09, 0.18],
      { size: 7.5, align: ['left', 'right', 'right', 'right', 'right', 'right', 'right', 'right', 'right', 'left'] },
    );
  }
  w.caution();

  // ── 8 Refined analysis ──────────────────────────────────────────────────────────────
  w.heading('8  Refined analysis: summary and decision');
  const s = data.summary;
  for (const i of s.indicators) w.text(`• ${i}`);
  w.heading('Range of applicability, fallbacks and caps', 2);
  if (s.rangeFindings.length === 0) w.text('None: every empirical formula was used within its range.', { color: MUTED });
  else w.table(['Level', 'Finding', 'Article'], s.rangeFindings.map((f) => [levelWords(f), showLengths(f.message, data.units), f.article]), [0.17, 0.56, 0.27]);
  w.heading('Skew', 2);
  w.text(s.skew.words);
  if (s.skew.effects.length) {
    w.table(
      ['Girder', 'Effect', 'Where', 'Method', 'g before skew', 'Skew factor', 'g', 'Change'],
      s.skew.effects.map((e) => [e.girder, EFFECT_WORDS[e.effect], e.location, METHOD_WORDS[e.method] ?? e.method, factor(e.baseValue), e.skewFactor.toFixed(4), factor(e.value), `${e.changePercent >= 0 ? '+' : ''}${e.changePercent.toFixed(1)} %`]),
      [0.1, 0.14, 0.12, 0.16, 0.13, 0.11, 0.1, 0.14],
      { align: ['left', 'left', 'left', 'left', 'right', 'right', 'right', 'right'] },
    );
  }
  w.heading('Refined / code ratios and the possible reduction in girder moment', 2);
  if (!s.refined.available) w.text(showLengths(s.refined.note, data.units), { color: MUTED });
  else {
    w.text(`Loads of the refined factors: ${s.refined.loads}.`, { color: MUTED });
    w.table(
      ['Girder', 'Effect', 'Where', 'Grillage g', 'Stated bound', 'Governing load', 'Code g', 'Ratio'],
      s.refined.ratios.map((r) => [
        `${r.girder} (${r.girderKind})`,
        EFFECT_WORDS[r.effect],
        r.location,
        factor(r.refined),
        boundText(r.bound),
        r.vehicle ?? '—',
        factor(r.code),
        ratioText(r.ratio),
      ]),
      [0.12, 0.11, 0.14, 0.1, 0.16, 0.17, 0.1, 0.1],
      { align: ['left', 'left', 'left', 'right', 'right', 'left', 'right', 'right'] },
    );
    w.table(
      ['Girder', 'Where', `Per-lane M (${unitSymbol('moment', u)})`, `Code M (${unitSymbol('moment', u)})`, `Refined M (${unitSymbol('moment', u)})`, 'Reduction', 'Claimable'],
      s.refined.momentReductions.map((r) => [
        `${r.girder} (${r.girderKind})`,
        r.location,
        num(toDisplay(r.perLaneMoment, 'moment', u), 1),
        num(toDisplay(r.codeMoment, 'moment', u), 1),
        num(toDisplay(r.refinedMoment, 'moment', u), 1),
        `${num(toDisplay(r.reduction, 'moment', u), 1)} (${r.reductionPercent.toFixed(1)} %)`,
        r.claimable ? 'yes' : `no: ${r.withheld.map((w) => WITHHELD_SHORT[w].replace('{g}', String(r.designGirder))).join('; ')}`,
      ]),
      [0.14, 0.13, 0.14, 0.14, 0.14, 0.16, 0.15],
      { align: ['left', 'left', 'right', 'right', 'right', 'right', 'left'] },
    );
    const largest = s.refined.largestReduction;
    w.text(
      largest
        ? `Largest claimable reduction (the largest of the rows marked “yes”): ${largest.reductionPercent.toFixed(1)} % (girder ${largest.girder}, ${largest.location}).`
        : 'No reduction can be claimed.',
      { weight: 'bold' },
    );
  }
  w.heading('Reviewer’s decision', 2);
  w.text(
    data.refinedDecision
      ? `${data.refinedDecision.justified ? 'A refined analysis is justified' : 'A refined analysis is not justified'}${data.reviewer ? ` (${data.reviewer.name}${data.refinedDecision.at ? `, ${data.refinedDecision.at.slice(0, 10)}` : ''})` : ''}: ${data.refinedDecision.reason}`
      : 'No decision on a refined analysis has been recorded for this version.',
    { weight: 'bold' },
  );
  if (data.refinedDecision?.conditions) w.text(data.refinedDecision.conditions, { color: MUTED });

  // ── 9 Review record and signatures ──────────────────────────────────────────────────
  w.heading('9  Review record, cautions and signatures');
  if (data.rounds.length === 0) w.text('This version has not been submitted for review.', { color: MUTED });
  else
    w.table(
      ['Round', 'Submitted by', 'Reviewer', 'Submitted', 'State', 'Decided', 'Note'],
      data.rounds.map((r) => [String(r.id), r.submittedBy, r.reviewer, r.submittedAt.slice(0, 10), r.label, r.decidedAt ? r.decidedAt.slice(0, 10) : '—', r.note ?? '']),
      [0.08, 0.15, 0.15, 0.12, 0.13, 0.12, 0.25],
    );
  w.heading('Cautions', 2);
  w.caution();
  for (const c of [
    'The approximate methods of AASHTO LRFD Art. 4.6.2.2 apply within their ranges of applicability; the findings above list every departure and what the product did about it.',
    'Girder effects use the HL-93 loading on a beam line; dead loads, other live loads and load combinations are outside this package.',
    'Check the inputs against the drawings: the results are only as good as the deck entered.',
  ])
    w.text(`• ${c}`, { size: 8.5 });
  w.heading('Signatures', 2, 220);
  const sig = (label: string, nameText: string, x: number, y: number) => {
    doc.fillColor(MUTED);
    write(doc, label, x, y, { size: 8, width: 220 });
    doc.moveTo(x, y + 44).lineTo(x + 220, y + 44).lineWidth(0.6).strokeColor(INK).stroke();
    doc.fillColor(INK);
    write(doc, nameText, x, y + 48, { size: 8.5, width: 220, weight: 'bold' });
    doc.moveTo(x, y + 92).lineTo(x + 140, y + 92).lineWidth(0.6).strokeColor(INK).stroke();
    doc.fillColor(MUTED);
    write(doc, 'Date', x, y + 95, { size: 7.5, width: 140 });
  };
  const sy = w.y + 4;
  sig('Prepared by', data.author.name, PAGE.margin, sy);
  sig('Checked by', data.reviewer?.name ?? '', PAGE.margin + CONTENT_W / 2 + 10, sy);
  w.y = sy + 120;
  w.text('Licensed engineer in responsible charge: name, licence number and seal', { size: 8, color: MUTED });
  doc.rect(PAGE.margin, w.y, 160, 80).lineWidth(0.6).strokeColor(RULE).stroke();
  w.y += 88;

  // ── Footers ─────────────────────────────────────────────────────────────────────────
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.moveTo(PAGE.margin, PAGE.height - 40).lineTo(PAGE.margin + CONTENT_W, PAGE.height - 40).lineWidth(0.4).strokeColor(RULE).stroke();
    doc.fillColor(MUTED).font(baseFont()).fontSize(7);
    const footer = fitLine(doc, `${data.project.name} · ${data.deck.name} · version ${data.version.number} · ${data.status.label}`, CONTENT_W * 0.7 - 4);
    write(doc, footer, PAGE.margin, PAGE.height - 35, { width: CONTENT_W * 0.7, lineBreak: false });
    doc.font(baseFont()).text(`page ${i + 1} of ${range.count}`, PAGE.margin + CONTENT_W * 0.7, PAGE.height - 35, { width: CONTENT_W * 0.3, align: 'right', lineBreak: false });
    write(doc, PACKAGE_CAUTION, PAGE.margin, PAGE.height - 26, { width: CONTENT_W, lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return done;
}

