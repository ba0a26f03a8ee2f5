/**
 * Open Sans for the PDF reports, embedded from @fontsource/open-sans's .woff subsets. A
 * subset covers part of Unicode, so text is split into runs, each set in the first subset
 * that has every glyph of the run (latin, then greek, math, latin-ext, symbols). A character
 * no subset has is replaced by its compatibility form (NFKD: "ᵢ" → "i") or, failing that, by
 * a plain-text equivalent ("→" → "->"), so nothing prints as an empty box.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import type PDFDocument from 'pdfkit';

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

/** Registers every subset of the weights with the document. */
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

/** Text with every character printable in Open Sans. */
export function printable(text: string, w: Weight = 'regular'): string {
  let out = '';
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    if (cp < 0x20 && ch !== '\n') continue;
    if (ch === '\n' || fontFor(cp, w)) {
      out += ch;
      continue;
    }
    const plain = PLAIN[ch] ?? ch.normalize('NFKD');
    out += [...plain].every((c) => fontFor(c.codePointAt(0)!, w)) ? plain : '?';
  }
  return out;
}

/** Splits text into runs of one font each. */
export function runs(text: string, w: Weight = 'regular'): { font: string; text: string }[] {
  const out: { font: string; text: string }[] = [];
  const base = subset('latin', w).name;
  for (const ch of printable(text, w)) {
    const font = ch === ' ' || ch === '\n' ? (out.at(-1)?.font ?? base) : (fontFor(ch.codePointAt(0)!, w) ?? base);
    const last = out.at(-1);
    if (last && last.font === font) last.text += ch;
    else out.push({ font, text: ch });
  }
  return out;
}

export function baseFont(w: Weight = 'regular'): string {
  return subset('latin', w).name;
}

export type TextOptions = PDFKit.Mixins.TextOptions;

/**
 * Writes text at (x, y) — or at the current position when x is undefined — switching fonts
 * between runs; wraps within `options.width`.
 */
export function write(doc: PDFKit.PDFDocument, text: string, x: number | undefined, y: number | undefined, options: TextOptions & { weight?: Weight; size?: number } = {}): void {
  const { weight = 'regular', size, ...opts } = options;
  if (size) doc.fontSize(size);
  const parts = runs(text, weight);
  if (parts.length === 0) return;
  parts.forEach((p, i) => {
    doc.font(p.font);
    const o = { ...opts, continued: i < parts.length - 1 ? true : (opts.continued ?? false) };
    if (i === 0 && x !== undefined && y !== undefined) doc.text(p.text, x, y, o);
    else doc.text(p.text, o);
  });
}

/** Height of text set in the base font of `weight` at the current size within `width`. */
export function heightOf(doc: PDFKit.PDFDocument, text: string, width: number, weight: Weight = 'regular'): number {
  doc.font(baseFont(weight));
  return doc.heightOfString(printable(text, weight), { width });
}

export type Doc = InstanceType<typeof PDFDocument>;
