/**
 * Reading a calculation package in a test: the response body as bytes (supertest's `parse`),
 * and the PDF's text by poppler's pdftotext (Debian package poppler-utils), whitespace folded.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export function binary(res: { on(e: string, f: (c?: Buffer) => void): void }, cb: (e: Error | null, b: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c) => chunks.push(c!));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

export function pdfText(pdf: Buffer): string {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-pdf-'));
  const file = join(dir, 'package.pdf');
  writeFileSync(file, pdf);
  const r = spawnSync('pdftotext', ['-enc', 'UTF-8', file, '-'], { encoding: 'utf8' });
  if (r.error) throw new Error(`pdftotext is needed to read the PDF (apt-get install -y poppler-utils): ${r.error.message}`);
  if (r.status !== 0) throw new Error(`pdftotext failed: ${r.stderr}`);
  return r.stdout.replace(/\s+/g, ' ');
}
