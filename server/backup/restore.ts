/**
 * Restore: check that a file is a whole Deckshare database — SQLite's header, integrity_check,
 * the migration ledger naming only migrations this code knows, and (when it is current) every
 * table of the schema — then copy it into place with the online backup API through a
 * temporary file that is checked, flushed and renamed. An existing database is never replaced
 * unless asked (`force`); the server must be stopped first.
 */
import Database from 'better-sqlite3';
import { closeSync, existsSync, mkdirSync, openSync, readSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { readMigrationFiles } from 'drizzle-orm/migrator';
import { getTableConfig, SQLiteTable } from 'drizzle-orm/sqlite-core';
import { databaseFilePath, MIGRATIONS } from '../db/client.js';
import * as schema from '../db/schema.js';
import { BackupError, flushToDisk, integrityOf, temporaryBeside } from './backup.js';

export interface BackupInspection {
  file: string;
  bytes: number;
  migrationsApplied: number;
  migrationsKnown: number;
  tables: number;
}

export interface RestoreResult extends BackupInspection {
  database: string;
  replaced: boolean;
}

const SQLITE_HEADER = 'SQLite format 3\u0000';

function hasSqliteHeader(file: string): boolean {
  const fd = openSync(file, 'r');
  try {
    const buf = Buffer.alloc(16);
    return readSync(fd, buf, 0, 16, 0) === 16 && buf.toString('latin1') === SQLITE_HEADER;
  } finally {
    closeSync(fd);
  }
}

function schemaTableNames(): string[] {
  const values: unknown[] = Object.values(schema);
  return values.filter((t): t is SQLiteTable => t instanceof SQLiteTable).map((t) => getTableConfig(t).name);
}

function tableNames(db: Database.Database): Set<string> {
  const rows = db.prepare("select name from sqlite_master where type = 'table'").all() as { name: string }[];
  return new Set(rows.map((r) => r.name));
}

/** Checks the migration ledger and the tables; returns how many migrations the file has. */
function checkDeckshareSchema(db: Database.Database, file: string): { applied: number; known: number; tables: number } {
  const tables = tableNames(db);
  if (!tables.has('__drizzle_migrations')) throw new BackupError(`${file} is an SQLite database but not a Deckshare database (it has no migration ledger)`);
  const known = readMigrationFiles({ migrationsFolder: MIGRATIONS });
  const knownHashes = new Set(known.map((m) => m.hash));
  const applied = db.prepare('select hash from __drizzle_migrations').all() as { hash: string }[];
  if (applied.length === 0) throw new BackupError(`${file} has an empty migration ledger: not a Deckshare database`);
  const unknown = applied.filter((m) => !knownHashes.has(m.hash));
  if (unknown.length) throw new BackupError(`${file} has ${unknown.length} migration(s) this version of Deckshare does not know: it comes from another version or another program`);
  // Only a current file must have every table; an older one gains the rest at the next start.
  const missing = applied.length === known.length ? schemaTableNames().filter((t) => !tables.has(t)) : [];
  if (missing.length) throw new BackupError(`${file} lacks the tables ${missing.join(', ')}: not a whole Deckshare database`);
  return { applied: applied.length, known: known.length, tables: tables.size };
}

/** Everything restore checks before it writes anything. Throws a BackupError naming the problem. */
export function inspectBackup(path: string): BackupInspection {
  const file = resolve(path);
  if (!existsSync(file)) throw new BackupError(`no file at ${file}`);
  if (statSync(file).size === 0 || !hasSqliteHeader(file)) throw new BackupError(`${file} is not an SQLite database`);
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    const integrity = integrityOf(db);
    if (integrity !== 'ok') throw new BackupError(`${file} fails integrity_check: ${integrity}`);
    const s = checkDeckshareSchema(db, file);
    return { file, bytes: statSync(file).size, migrationsApplied: s.applied, migrationsKnown: s.known, tables: s.tables };
  } finally {
    db.close();
  }
}

function refuseExisting(database: string, force: boolean): boolean {
  const present = [database, `${database}-wal`].some((f) => existsSync(f));
  if (present && !force) throw new BackupError(`a database already exists at ${database}: restore into an empty data folder, or pass --force (with the server stopped) to replace it`);
  return present;
}

/** Copies the checked file to a temporary file beside the target, checks it and renames it in. */
async function copyInto(file: string, database: string): Promise<void> {
  const temp = temporaryBeside(database);
  const source = new Database(file, { readonly: true, fileMustExist: true });
  try {
    await source.backup(temp, { progress: ({ remainingPages }) => remainingPages });
    const copy = new Database(temp, { readonly: true });
    const integrity = integrityOf(copy);
    copy.close();
    if (integrity !== 'ok') throw new BackupError(`the restored copy failed integrity_check: ${integrity}`);
    flushToDisk(temp);
    // The old database's write-ahead log must not be replayed onto the restored file.
    rmSync(`${database}-wal`, { force: true });
    rmSync(`${database}-shm`, { force: true });
    renameSync(temp, database);
    flushToDisk(dirname(database));
  } finally {
    source.close();
    rmSync(temp, { force: true });
  }
}

export async function restoreDatabase(backupFile: string, databaseUrl: string, options: { force?: boolean } = {}): Promise<RestoreResult> {
  const path = databaseFilePath(databaseUrl);
  if (path === ':memory:') throw new BackupError('cannot restore into an in-memory database');
  const database = resolve(path);
  const inspection = inspectBackup(backupFile);
  if (inspection.file === database) throw new BackupError('the backup file and the database are the same file');
  const replaced = refuseExisting(database, options.force ?? false);
  mkdirSync(dirname(database), { recursive: true });
  await copyInto(inspection.file, database);
  return { ...inspection, database, replaced };
}
