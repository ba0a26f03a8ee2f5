/**
 * Where drawings live: a folder outside the web root (default `attachments/` beside the
 * database file, e.g. data/attachments/), each file under a random 32-hex-digit name with no
 * extension. The type is decided from the file's first bytes, never from its name or the
 * browser's claim.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, unlinkSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

/** Largest drawing accepted, bytes. */
export const MAX_ATTACHMENT_BYTES = 20 * 1024 * 1024;

export type DrawingType = 'application/pdf' | 'image/png' | 'image/jpeg';

const SIGNATURES: { type: DrawingType; bytes: number[] }[] = [
  { type: 'application/pdf', bytes: [0x25, 0x50, 0x44, 0x46, 0x2d] }, // "%PDF-"
  { type: 'image/png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { type: 'image/jpeg', bytes: [0xff, 0xd8, 0xff] },
];

/** The drawing type from the content's magic bytes, or null when it is none of PDF, PNG, JPEG. */
export function detectDrawingType(content: Uint8Array): DrawingType | null {
  for (const s of SIGNATURES) {
    if (content.length >= s.bytes.length && s.bytes.every((b, i) => content[i] === b)) return s.type;
  }
  return null;
}

export function defaultAttachmentsDir(databaseUrl: string): string {
  const path = databaseUrl.startsWith('file:') ? databaseUrl.slice(5) : databaseUrl;
  return path === ':memory:' ? resolve('data', 'attachments') : join(dirname(resolve(path)), 'attachments');
}

export function newStoredName(): string {
  return randomBytes(16).toString('hex');
}

const STORED_NAME = /^[0-9a-f]{32}$/;

export function storedPath(dir: string, storedName: string): string {
  if (!STORED_NAME.test(storedName)) throw new Error(`not a stored attachment name: ${storedName}`);
  return join(dir, storedName);
}

export function writeStored(dir: string, storedName: string, content: Buffer): void {
  mkdirSync(dir, { recursive: true, mode: 0o700 });
  writeFileSync(storedPath(dir, storedName), content, { flag: 'wx', mode: 0o600 });
}

export function removeStored(dir: string, storedName: string): void {
  try {
    unlinkSync(storedPath(dir, storedName));
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
  }
}
