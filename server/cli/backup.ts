/**
 * Command-line backup of the live database, safe while the server runs:
 *
 *   npm run backup -- <file> [--database <path>] [--force]
 *
 * The database is DATABASE_URL (default ./data/deckshare.db) unless --database names one.
 * Writes a consistent, self-contained copy (server/backup/backup.ts); an existing <file> is
 * kept unless --force. Exit code 1 when the backup fails, 2 for a usage error.
 */
import { backupDatabase } from '../backup/backup.js';
import { parseBackupArgs, runCommand } from './backupArgs.js';

const USAGE = 'usage: npm run backup -- <file> [--database <path>] [--force]';

runCommand(async () => {
  const args = parseBackupArgs(process.argv.slice(2), USAGE);
  const r = await backupDatabase(args.databaseUrl, args.file, { overwrite: args.force });
  console.log(`Backed up ${args.databaseUrl} to ${r.file}: ${(r.bytes / 1024 / 1024).toFixed(2)} MB, ${r.pages} pages, integrity_check ok, ${r.ms} ms`);
});
