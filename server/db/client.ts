/**
 * Opens the SQLite database (better-sqlite3) with WAL journaling, foreign keys, a busy
 * timeout and recursive triggers (so the implicit delete of a REPLACE fires the append-only
 * tables' DELETE triggers too; their BEFORE INSERT triggers refuse it on any connection),
 * applies the committed migrations, and returns the Drizzle handle.
 *
 * Durability: `synchronous = FULL` in WAL mode syncs the write-ahead log at every commit, so a
 * save the API acknowledged survives a power loss or an operating-system crash, not only a
 * crash of the process (which NORMAL already survives). The cost is one fsync per commit.
 */
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as schema from './schema.js';

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

/** The committed migrations (also read by server/backup to recognise a Deckshare database). */
export const MIGRATIONS = resolve(dirname(fileURLToPath(import.meta.url)), 'migrations');

/** The file path of a DATABASE_URL: a path, optionally prefixed "file:", or ":memory:". */
export function databaseFilePath(url: string): string {
  return url.startsWith('file:') ? url.slice(5) : url;
}

/** `url`: a file path (optionally prefixed "file:") or ":memory:". */
export function openDatabase(url: string): Db {
  const path = databaseFilePath(url);
  if (path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
  const sqlite = new Database(path);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = FULL');
  sqlite.pragma('recursive_triggers = ON');
  const db = drizzle(sqlite, { schema }) as Db;
  migrate(db, { migrationsFolder: MIGRATIONS });
  return db;
}
