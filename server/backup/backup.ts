/**
 * A consistent copy of the live database with SQLite's online backup API (better-sqlite3's
 * `db.backup`), safe while the server runs: the copy is read through its own read-only
 * connection, which in WAL mode never blocks the server's writes. The copy is written to a
 * temporary file beside the destination, switched to a single self-contained file (no WAL),
 * checked with integrity_check, flushed to disk and only then renamed into place, so a
 * destination file is always either absent or a whole, checked backup.
 */
import Database from 'better-sqlite3';
import { closeSync, existsSync, fsyncSync, mkdirSync, openSync, renameSync, rmSync, statSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { basename, dirname, join, resolve } from 'node:path';
import { databaseFilePath } from '../db/client.js';

export interface BackupOptions {
  /** Replace an existing destination file. */
  overwrite?: boolean;
  /**
   * Pages copied per step. Default: everything in one step, which reads one snapshot and so
   * never restarts when the server writes meanwhile; smaller steps yield to the event loop
   * between steps and restart the copy after any write by another connection.
   */
  pagesPerStep?: number;
}

export interface BackupResult {
  file: string;
  bytes: number;
  pages: number;
  ms: number;
}

export class BackupError extends Error {
  override name = 'BackupError';
}

/** A temporary name in the destination's folder, so the final rename stays on one disk. */
export function temporaryBeside(file: string): string {
  return join(dirname(file), `.${basename(file)}.partial-${process.pid}-${randomBytes(4).toString('hex')}`);
}

/** Flushes a file (and, for the rename to last, its folder) to disk. */
export function flushToDisk(path: string): void {
  const fd = openSync(path, 'r');
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** integrity_check's answer, or the error that stopped it (a malformed file throws). */
export function integrityOf(db: Database.Database): string {
  try {
    return (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join('; ');
  } catch (e) {
    return e instanceof Error ? e.message : String(e);
  }
}

/** Copies `source` (an open database, or a file path opened read-only) into a temporary file. */
async function copyTo(source: Database.Database, temp: string, pagesPerStep: number | undefined): Promise<number> {
  const progress = await source.backup(temp, { progress: ({ remainingPages }) => pagesPerStep ?? remainingPages });
  return progress.totalPages;
}

/** Makes the copy one self-contained file and checks it; throws when the check fails. */
function sealCopy(temp: string): void {
  const copy = new Database(temp);
  try {
    copy.pragma('journal_mode = DELETE');
    const integrity = integrityOf(copy);
    if (integrity !== 'ok') throw new BackupError(`the copy failed integrity_check: ${integrity}`);
  } finally {
    copy.close();
  }
}

export async function backupDatabase(source: string | Database.Database, destination: string, options: BackupOptions = {}): Promise<BackupResult> {
  const t0 = Date.now();
  const file = resolve(destination);
  if (existsSync(file) && !options.overwrite) throw new BackupError(`${file} already exists: choose another name (or overwrite it)`);
  mkdirSync(dirname(file), { recursive: true });
  const db = typeof source === 'string' ? openSource(source) : source;
  const temp = temporaryBeside(file);
  try {
    const pages = await copyTo(db, temp, options.pagesPerStep);
    sealCopy(temp);
    flushToDisk(temp);
    renameSync(temp, file);
    flushToDisk(dirname(file));
    return { file, bytes: statSync(file).size, pages, ms: Date.now() - t0 };
  } finally {
    rmSync(temp, { force: true });
    if (typeof source === 'string') db.close();
  }
}

function openSource(url: string): Database.Database {
  const path = databaseFilePath(url);
  if (path === ':memory:') throw new BackupError('an in-memory database cannot be backed up from another process');
  if (!existsSync(path)) throw new BackupError(`no database at ${resolve(path)}`);
  return new Database(path, { readonly: true, fileMustExist: true });
}
