/**
 * Command-line restore of a backup into an empty data folder (stop the server first):
 *
 *   npm run restore -- <file> [--database <path>] [--force]
 *
 * Checks the file (an SQLite database that passes integrity_check, with Deckshare's migration
 * ledger and tables), then copies it to DATABASE_URL (or --database) through a temporary file
 * and a rename. An existing database is replaced only with --force. Exit code 1 when the file
 * is refused or the copy fails, 2 for a usage error.
 */
import { restoreDatabase } from '../backup/restore.js';
import { parseBackupArgs, runCommand } from './backupArgs.js';

const USAGE = 'usage: npm run restore -- <file> [--database <path>] [--force]';

runCommand(async () => {
  const args = parseBackupArgs(process.argv.slice(2), USAGE);
  const r = await restoreDatabase(args.file, args.databaseUrl, { force: args.force });
  const later = r.migrationsKnown - r.migrationsApplied;
  console.log(`Restored ${r.file} into ${r.database}${r.replaced ? ' (replaced the database that was there)' : ''}: integrity_check ok, ${r.tables} tables, ${r.migrationsApplied} of ${r.migrationsKnown} migrations${later ? ` (the other ${later} are applied at the next start)` : ''}`);
});
