/**
 * Text a person types (names, titles, messages, notes, comments): one rule everywhere, in the
 * API, the forms and the deck files.
 * - Unicode NFC normalisation, so "é" typed as e + U+0301 and as U+00E9 is one name, and the
 *   screen, the PDF and the audit show the same characters.
 * - Refused, with the field, the character's code point and its position (1-based, in
 *   characters): control characters (C0, DEL, C1 — except line feed and tab in multi-line
 *   text; a carriage return before a line feed is dropped), the bidirectional embedding,
 *   override and isolate controls U+202A–U+202E and U+2066–U+2069 (they make a name read
 *   differently from what it holds), and lone surrogates (not text).
 * - Trimmed, then bounded in length.
 */
import { z } from 'zod';

export interface ForbiddenCharacter {
  /** 1-based position in characters (code points) of the normalised text. */
  position: number;
  codePoint: number;
  why: string;
}

const hex = (cp: number) => `U+${cp.toString(16).toUpperCase().padStart(4, '0')}`;

/** Why the rule refuses one code point, or null when it is allowed. */
function refusal(cp: number, multiline: boolean): string | null {
  if (cp >= 0xd800 && cp <= 0xdfff) return 'a broken character (lone surrogate)';
  if ((cp < 0x20 || (cp >= 0x7f && cp <= 0x9f)) && !(multiline && (cp === 0x0a || cp === 0x09))) return 'a control character';
  if ((cp >= 0x202a && cp <= 0x202e) || (cp >= 0x2066 && cp <= 0x2069)) {
    return 'a bidirectional control character (it makes the text read differently from what it holds)';
  }
  return null;
}

/** The first character the rule refuses, or null. */
export function forbiddenCharacter(text: string, multiline: boolean): ForbiddenCharacter | null {
  let position = 0;
  for (const ch of text) {
    position++;
    const cp = ch.codePointAt(0)!;
    const why = refusal(cp, multiline);
    if (why) return { position, codePoint: cp, why };
  }
  return null;
}

/** The text in NFC without the characters the rule refuses (for text nobody typed: file names). */
export function withoutForbiddenCharacters(text: string): string {
  let out = '';
  for (const ch of text.normalize('NFC')) if (!refusal(ch.codePointAt(0)!, false)) out += ch;
  return out;
}

/** The message for a refused character. */
export function forbiddenCharacterMessage(what: string, f: ForbiddenCharacter): string {
  return `${what} contains ${f.why}, ${hex(f.codePoint)}, at character ${f.position}: remove it`;
}

/**
 * A zod string for text a person types.
 * @param what the field's name in messages, e.g. "project name".
 * @param max largest length in characters (UTF-16 units, as the rest of the API counts).
 * @param options multiline: allow line feeds and tabs; min: smallest length after trimming.
 */
export function personText(what: string, max: number, options: { multiline?: boolean; min?: number; minMessage?: string } = {}) {
  const multiline = options.multiline ?? false;
  let s = z
    .string({ error: `${what} must be text` })
    .normalize('NFC')
    .overwrite((v) => (multiline ? v.replace(/\r\n?/g, '\n') : v))
    .trim()
    .superRefine((v, ctx) => {
      const f = forbiddenCharacter(v, multiline);
      if (f) ctx.addIssue({ code: 'custom', message: forbiddenCharacterMessage(what, f) });
    });
  if (options.min !== undefined) s = s.min(options.min, options.minMessage ?? `${what} is required`);
  return s.max(max, `${what} must be at most ${max} characters`);
}

/**
 * A message written for the API (lower-case start, no full stop, "e-mail or password is wrong")
 * as a sentence on a screen: first letter upper-case, a full stop unless it ends in one already.
 */
export function asSentence(message: string): string {
  const text = message.trim();
  if (!text) return text;
  const first = text[0].toLocaleUpperCase('en-US') + text.slice(1);
  return /[.!?…:)”"]$/.test(first) ? first : `${first}.`;
}
