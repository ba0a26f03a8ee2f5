/**
 * Fonts of the PDF reports. Open Sans, embedded from @fontsource/open-sans's .woff subsets, sets
 * everything it can: text is split into runs, each set in the first subset that has every glyph
 * of the run (latin, then greek, math, latin-ext, symbols). A character no Open Sans subset has
 * is replaced by a plain-text equivalent ("→" → "->") or its compatibility form (NFKD: "ᵢ" →
 * "i") when Open Sans can set that; otherwise it is set, glyph by glyph, in the fallback font
 * that has it (Noto Sans SC for CJK, Noto Emoji for emoji: see fallbackFonts.ts), loaded and
 * registered with the document only when the text needs it. What no font has prints as "?".
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import type PDFDocument from 'pdfkit';
import { fallbackFor, type FallbackWeight } from './fallbackFonts.js';

const require = createRequire(import.meta.url);
const FILES = join(dirname(require.resolve('@fontsource/open-sans/package.json')), 'files');
/** pdfkit's own font engine (its dependency), to ask which glyphs a subset holds. */
const fontkit = createRequire(require.resolve('pdfkit'))('fontkit') as { openSync(path: string): { hasGlyphForCodePoint(cp: number): boolean } };

const SUBSETS = ['latin', 'greek', 'math', 'latin-ext', 'symbols'] as const;
type Subset = (typeof SUBSETS)[number];
export type Weight = 'regular' | 'bold' | 'italic';

const WEIGHT_FILE: Record<Weight, string> = { regular: '400-normal', bold: '700-normal', italic: '400-italic' };

interface LoadedSubset {
  name: string;
  path: string;
  has(cp: number): boolean;
}

const cache = new Map<string, LoadedSubset>();

function subset(s: Subset, w: Weight): LoadedSubset {
  const key = `${s}-${w}`;
  let f = cache.get(key);
  if (!f) {
    const path = join(FILES, `open-sans-${s}-${WEIGHT_FILE[w]}.woff`);
    const font = fontkit.openSync(path);
    f = { name: `OpenSans-${key}`, path, has: (cp) => font.hasGlyphForCodePoint(cp) };
    cache.set(key, f);
  }
  return f;
}

const PLAIN: Record<string, string> = { '→': '->', '←': '<-', '⇒': '=>', '✓': 'yes', '✗': 'no', '…': '...' };

/** Characters left out: emoji presentation selectors, the joiner, skin-tone modifiers (colours, in a monochrome font). */
const isLeftOut = (cp: number) => cp === 0xfe0e || cp === 0xfe0f || cp === 0x200d || (cp >= 0x1f3fb && cp <= 0x1f3ff);

const FALLBACK_WEIGHT: Record<Weight, FallbackWeight> = { regular: 400, bold: 700, italic: 400 };

/** Registers every Open Sans subset of the weights with the document (fallbacks come later, when needed). */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  for (const w of Object.keys(WEIGHT_FILE) as Weight[]) {
    for (const s of SUBSETS) {
      const f = subset(s, w);
      doc.registerFont(f.name, f.path);
    }
  }
}

function fontFor(cp: number, w: Weight): string | null {
  for (const s of SUBSETS) {
    const f = subset(s, w);
    if (f.has(cp)) return f.name;
  }
  return null;
}

interface Glyphs {
  text: string;
  /** The font of the text; null: Open Sans, each character in the subset that has it. */
  fallback: { name: string; path: string } | null;
}

/** How one character prints: itself in Open Sans, an Open Sans stand-in, itself in a fallback, or "?". */
function resolve(ch: string, w: Weight): Glyphs | null {
  const cp = ch.codePointAt(0)!;
  if ((cp < 0x20 && ch !== '\n') || isLeftOut(cp)) return null;
  if (ch === '\n' || fontFor(cp, w)) return { text: ch, fallback: null };
  for (const stand of [PLAIN[ch], ch.normalize('NFKD')]) {
    if (stand && [...stand].every((c) => fontFor(c.codePointAt(0)!, w))) return { text: stand, fallback: null };
  }
  const fallback = fallbackFor(cp, FALLBACK_WEIGHT[w]);
  return fallback ? { text: ch, fallback } : { text: '?', fallback: null };
}

export interface Run {
  font: string;
  text: string;
  /** File of a fallback font, to register with the document before use. */
  path?: string;
}

/** Splits text into runs of one font each (spaces and line breaks stay with the Open Sans run before; after a fallback run they start an Open Sans run). */
export function runs(text: string, w: Weight = 'regular'): Run[] {
  const out: Run[] = [];
  const base = subset('latin', w).name;
  for (const ch of text) {
    const g = resolve(ch, w);
    if (!g) continue;
    for (const c of g.text) {
      const last = out.at(-1);
      const blank = c === ' ' || c === '\n';
      const run: Run = g.fallback ? { font: g.fallback.name, text: c, path: g.fallback.path } : { font: blank ? (last && !last.path ? last.font : base) : (fontFor(c.codePointAt(0)!, w) ?? base), text: c };
      if (last && last.font === run.font) last.text += c;
      else out.push(run);
    }
  }
  return out;
}

/** Text with every character printable in Open Sans or a fallback font. */
export function printable(text: string, w: Weight = 'regular'): string {
  return runs(text, w)
    .map((r) => r.text)
    .join('');
}

export function baseFont(w: Weight = 'regular'): string {
  return subset('latin', w).name;
}

export type TextOptions = PDFKit.Mixins.TextOptions;

const registered = new WeakMap<PDFKit.PDFDocument, Set<string>>();

/** Selects the run's font, registering a fallback subset with this document on first use. */
function useFont(doc: PDFKit.PDFDocument, run: Run): void {
  if (run.path) {
    let names = registered.get(doc);
    if (!names) registered.set(doc, (names = new Set()));
    if (!names.has(run.font)) {
      doc.registerFont(run.font, run.path);
      names.add(run.font);
    }
  }
  doc.font(run.font);
}

/**
 * Writes text at (x, y) — or at the current position when x is undefined — switching fonts
 * between runs (pdfkit's `continued`, so lines wrap across runs); wraps within `options.width`.
 */
export function write(doc: PDFKit.PDFDocument, text: string, x: number | undefined, y: number | undefined, options: TextOptions & { weight?: Weight; size?: number } = {}): void {
  const { weight = 'regular', size, ...opts } = options;
  if (size) doc.fontSize(size);
  const parts = runs(text, weight);
  if (parts.length === 0) return;
  parts.forEach((p, i) => {
    useFont(doc, p);
    const o = { ...opts, continued: i < parts.length - 1 ? true : (opts.continued ?? false) };
    if (i === 0 && x !== undefined && y !== undefined) doc.text(p.text, x, y, o);
    else doc.text(p.text, o);
  });
}

/**
 * Lines of mixed-font text within `width`, wrapped greedily at spaces and between CJK
 * characters (where pdfkit's line breaker may break too), each word measured in its runs' fonts.
 */
function mixedLineCount(doc: PDFKit.PDFDocument, parts: Run[], width: number): number {
  const pieces = parts.flatMap((p) => p.text.split(/(\n| +|(?<=[\u3000-\u9fff\uf900-\ufaff])|(?=[\u3000-\u9fff\uf900-\ufaff]))/u).filter(Boolean).map((t) => ({ run: p, t })));
  let lines = 1;
  let x = 0;
  for (const { run, t } of pieces) {
    if (t === '\n') {
      lines++;
      x = 0;
      continue;
    }
    useFont(doc, run);
    const wWord = doc.widthOfString(t);
    if (/^ +$/.test(t)) {
      x += wWord;
      continue;
    }
    if (x > 0 && x + wWord > width) {
      lines++;
      x = 0;
    }
    x += wWord;
    while (x > width) {
      lines++;
      x -= width;
    }
  }
  return lines;
}

/** Width of one line of text at the current size, in the fonts it will be set in. */
export function widthOf(doc: PDFKit.PDFDocument, text: string, weight: Weight = 'regular'): number {
  let width = 0;
  for (const p of runs(text, weight)) {
    useFont(doc, p);
    width += doc.widthOfString(p.text);
  }
  doc.font(baseFont(weight));
  return width;
}

/** The text, shortened with "..." at the end when it is wider than one line of `width`. */
export function fitLine(doc: PDFKit.PDFDocument, text: string, width: number, weight: Weight = 'regular'): string {
  if (widthOf(doc, text, weight) <= width) return text;
  const chars = [...text];
  let lo = 0;
  let hi = chars.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (widthOf(doc, `${chars.slice(0, mid).join('').trimEnd()}...`, weight) <= width) lo = mid;
    else hi = mid - 1;
  }
  return `${chars.slice(0, lo).join('').trimEnd()}...`;
}

/** Height of text at the current size within `width`, in the fonts it will be set in. */
export function heightOf(doc: PDFKit.PDFDocument, text: string, width: number, weight: Weight = 'regular'): number {
  const parts = runs(text, weight);
  if (!parts.some((p) => p.path)) {
    doc.font(baseFont(weight));
    return doc.heightOfString(parts.map((p) => p.text).join(''), { width });
  }
  const lines = mixedLineCount(doc, parts, width);
  const lineHeight = Math.max(
    ...parts.map((p) => {
      useFont(doc, p);
      return doc.currentLineHeight(true);
    }),
  );
  doc.font(baseFont(weight));
  return lines * lineHeight;
}

export type Doc = InstanceType<typeof PDFDocument>;
