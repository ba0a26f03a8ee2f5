/** Checks a stopped (or killed) server's SQLite file: PRAGMA integrity_check and its size. */
import Database from 'better-sqlite3';
import { existsSync, statSync } from 'node:fs';

export interface DatabaseCheck {
  integrity: string;
  /** Bytes of the database file plus its write-ahead log, if any. */
  bytes: number;
  versions: number;
}

export function checkDatabase(path: string): DatabaseCheck {
  // Read-only: after a SIGKILL the write-ahead log and its index are still beside the file and
  // SQLite reads committed transactions from them, as the next start of the server would.
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    const rows = db.pragma('integrity_check') as { integrity_check: string }[];
    const versions = (db.prepare('select count(*) as n from deck_versions').get() as { n: number }).n;
    const integrity = rows.map((r) => r.integrity_check).join('; ');
    const wal = `${path}-wal`;
    const bytes = statSync(path).size + (existsSync(wal) ? statSync(wal).size : 0);
    return { integrity, bytes, versions };
  } finally {
    db.close();
  }
}

/** Versions stored for one deck (read-only, the server stopped). */
export function versionsOfDeck(path: string, deckId: number): number {
  const db = new Database(path, { readonly: true, fileMustExist: true });
  try {
    return (db.prepare('select count(*) as n from deck_versions where deck_id = ?').get(deckId) as { n: number }).n;
  } finally {
    db.close();
  }
}

export function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(2)} MB`;
}
