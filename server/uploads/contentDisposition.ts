/**
 * The Content-Disposition header of a download: the name as stored (any Unicode) in the
 * RFC 5987 / RFC 6266 `filename*=UTF-8''…` parameter, and a plain-ASCII `filename="…"` for
 * clients that do not read it (accents dropped, other characters replaced by "_").
 */

/** RFC 5987 attr-char: everything else is percent-encoded from its UTF-8 bytes. */
function encodeRfc5987(value: string): string {
  return encodeURIComponent(value).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
}

/** An ASCII stand-in for the name: "ü-ñ-橋梁.pdf" → "u-n-__.pdf". */
export function asciiFallback(name: string): string {
  const ascii = name
    .normalize('NFKD')
    .replace(/\p{M}/gu, '')
    .replace(/[^\x20-\x7e]/gu, '_')
    .replace(/["\\]/g, '_');
  return ascii.trim() || 'download';
}

export function contentDisposition(name: string, type: 'attachment' | 'inline' = 'attachment'): string {
  const fallback = asciiFallback(name);
  if (fallback === name) return `${type}; filename="${name}"`;
  return `${type}; filename="${fallback}"; filename*=UTF-8''${encodeRfc5987(name)}`;
}
