/** Argument parsing shared by the backup and restore commands: one file, --database, --force. */
import { loadConfig } from '../config/env.js';

export class UsageError extends Error {}

export interface BackupArgs {
  file: string;
  databaseUrl: string;
  force: boolean;
}

export function parseBackupArgs(argv: string[], usage: string): BackupArgs {
  let file: string | undefined;
  let database: string | undefined;
  let force = false;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--force') force = true;
    else if (a === '--database') database = argv[++i];
    else if (a.startsWith('--database=')) database = a.slice('--database='.length);
    else if (a.startsWith('-')) throw new UsageError(`unknown option ${a}\n${usage}`);
    else if (file) throw new UsageError(`one file only\n${usage}`);
    else file = a;
  }
  if (!file) throw new UsageError(usage);
  if (database === '') throw new UsageError(`--database needs a path\n${usage}`);
  // The database defaults to the server's DATABASE_URL (same default and validation).
  return { file, databaseUrl: database ?? loadConfig().databaseUrl, force };
}

/** Runs a command's body: usage errors exit 2, refused or failed operations exit 1, no stack. */
export function runCommand(body: () => Promise<void>): void {
  body().then(
    () => process.exit(0),
    (e: unknown) => {
      console.error(e instanceof Error ? e.message : String(e));
      process.exit(e instanceof UsageError ? 2 : 1);
    },
  );
}
