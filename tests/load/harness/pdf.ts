/** Is a byte string a whole PDF? Header, %%EOF trailer, a startxref offset that points at the
 *  cross-reference section, and (when poppler's pdftotext is installed) text that reads back. */
import { spawnSync } from 'node:child_process';

export interface PdfCheck {
  complete: boolean;
  reason: string;
  /** Whether pdftotext read the caution line back; null when pdftotext is not installed. */
  cautionReadBack: boolean | null;
}

function structureProblem(pdf: Buffer): string | null {
  if (pdf.subarray(0, 5).toString('latin1') !== '%PDF-') return 'no %PDF- header';
  const tail = pdf.subarray(Math.max(0, pdf.length - 1024)).toString('latin1');
  if (!/%%EOF\s*$/.test(tail)) return 'no %%EOF trailer';
  const m = /startxref\s+(\d+)\s+%%EOF\s*$/.exec(tail);
  if (!m) return 'no startxref before the trailer';
  const at = Number(m[1]);
  const found = pdf.subarray(at, at + 4).toString('latin1');
  if (found !== 'xref') return `startxref points at "${found}", not at the cross-reference table`;
  return null;
}

function readCaution(pdf: Buffer): boolean | null {
  const run = spawnSync('pdftotext', ['-', '-'], { input: pdf, maxBuffer: 64 * 1024 * 1024 });
  if (run.error) return null;
  return run.status === 0 && /licensed engineer/.test(run.stdout.toString().replace(/\s+/g, ' '));
}

export function checkPdf(pdf: Buffer): PdfCheck {
  const problem = structureProblem(pdf);
  if (problem) return { complete: false, reason: problem, cautionReadBack: null };
  const caution = readCaution(pdf);
  if (caution === false) return { complete: false, reason: 'pdftotext could not read the caution line', cautionReadBack: false };
  return { complete: true, reason: 'header, %%EOF trailer and cross-reference table present', cautionReadBack: caution };
}
