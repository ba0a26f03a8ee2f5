/**
 * Fallback fonts for the PDF reports, for characters Open Sans lacks: Noto Sans SC (CJK, with
 * kana, hangul-free symbols and full-width forms) and Noto Emoji (monochrome). Both come from
 * @fontsource packages as many small .woff subsets, each named with its Unicode ranges in the
 * package's CSS (`unicode-range`). The ranges are read once; a subset file is opened only when
 * a printed character falls in it, so a report without such characters loads none of them.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';

const require = createRequire(import.meta.url);
/** pdfkit's own font engine (its dependency), to ask which glyphs a subset holds. */
const fontkit = createRequire(require.resolve('pdfkit'))('fontkit') as { openSync(path: string): { hasGlyphForCodePoint(cp: number): boolean } };

export type FallbackWeight = 400 | 700;

interface Family {
  /** Font name prefix in the PDF. */
  name: string;
  pkg: string;
}

const CJK: Family = { name: 'NotoSansSC', pkg: '@fontsource/noto-sans-sc' };
const EMOJI: Family = { name: 'NotoEmoji', pkg: '@fontsource/noto-emoji' };

interface Subset {
  /** Name to register with the PDF document. */
  name: string;
  path: string;
  ranges: [number, number][];
}

export interface FallbackFont {
  name: string;
  path: string;
}

const catalogs = new Map<string, Subset[]>();
const opened = new Map<string, { hasGlyphForCodePoint(cp: number): boolean }>();
const chosen = new Map<string, FallbackFont | null>();

/** "U+4e00-4e0f,U+fe30" → [[0x4e00, 0x4e0f], [0xfe30, 0xfe30]]. */
function parseUnicodeRange(value: string): [number, number][] {
  return value.split(',').flatMap((part) => {
    const m = /U\+([0-9a-f?]+)(?:-([0-9a-f]+))?/i.exec(part.trim());
    if (!m) return [];
    if (m[1].includes('?')) return [[parseInt(m[1].replace(/\?/g, '0'), 16), parseInt(m[1].replace(/\?/g, 'f'), 16)] as [number, number]];
    return [[parseInt(m[1], 16), parseInt(m[2] ?? m[1], 16)] as [number, number]];
  });
}

/** Every subset of one family and weight, with its ranges, from the package's `<weight>.css`. */
function catalog(family: Family, weight: FallbackWeight): Subset[] {
  const key = `${family.name}-${weight}`;
  let subsets = catalogs.get(key);
  if (subsets) return subsets;
  const root = dirname(require.resolve(`${family.pkg}/package.json`));
  const css = readFileSync(join(root, `${weight}.css`), 'utf8');
  subsets = [...css.matchAll(/@font-face\s*{([^}]*)}/g)].flatMap(([, block]) => {
    const file = /url\(\.\/files\/([^)]+\.woff)\)/.exec(block)?.[1];
    const range = /unicode-range:\s*([^;]+);/.exec(block)?.[1];
    if (!file || !range) return [];
    return [{ name: `${family.name}-${file.replace(/\.woff$/, '')}`, path: join(root, 'files', file), ranges: parseUnicodeRange(range) }];
  });
  catalogs.set(key, subsets);
  return subsets;
}

function hasGlyph(s: Subset, cp: number): boolean {
  let font = opened.get(s.path);
  if (!font) {
    font = fontkit.openSync(s.path);
    opened.set(s.path, font);
  }
  return font.hasGlyphForCodePoint(cp);
}

function inFamily(family: Family, cp: number, weight: FallbackWeight): FallbackFont | null {
  for (const s of catalog(family, weight)) {
    if (s.ranges.some(([lo, hi]) => cp >= lo && cp <= hi) && hasGlyph(s, cp)) return { name: s.name, path: s.path };
  }
  return null;
}

const PICTOGRAPHIC = /\p{Extended_Pictographic}/u;

/**
 * The fallback subset that draws the code point, or null: pictographs (emoji) from Noto Emoji
 * first, everything else from Noto Sans SC first, each family trying the other after.
 */
export function fallbackFor(cp: number, weight: FallbackWeight): FallbackFont | null {
  const key = `${cp}-${weight}`;
  if (chosen.has(key)) return chosen.get(key)!;
  const order = PICTOGRAPHIC.test(String.fromCodePoint(cp)) ? [EMOJI, CJK] : [CJK, EMOJI];
  let found: FallbackFont | null = null;
  for (const family of order) {
    found = inFamily(family, cp, weight);
    if (found) break;
  }
  chosen.set(key, found);
  return found;
}
