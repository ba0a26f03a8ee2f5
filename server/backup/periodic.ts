/**
 * Periodic backups inside the server (off unless BACKUP_DIR is set): every N minutes a
 * consistent copy named deckshare-<UTC time>.db is written to the folder, then only the newest
 * K such files are kept. Other files in the folder are never touched. A run never overlaps the
 * previous one; `stop()` waits for a run in progress.
 */
import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { backupDatabase } from './backup.js';

export interface PeriodicBackupSettings {
  databaseUrl: string;
  dir: string;
  everyMinutes: number;
  keep: number;
  log: (line: string) => void;
  /** The clock (tests pass their own). */
  now?: () => Date;
}

export interface PeriodicBackup {
  /** Makes one backup now and applies retention; returns the file written. */
  runOnce(): Promise<string>;
  stop(): Promise<void>;
}

const NAME = /^deckshare-\d{4}-\d{2}-\d{2}T\d{2}-\d{2}-\d{2}-\d{3}Z\.db$/;

export function backupFileName(at: Date): string {
  return `deckshare-${at.toISOString().replace(/[:.]/g, '-')}.db`;
}

/** Deletes all but the newest `keep` backups (by the time in their names); returns the deleted. */
export function pruneBackups(dir: string, keep: number): string[] {
  const ours = readdirSync(dir).filter((f) => NAME.test(f)).sort();
  const old = ours.slice(0, Math.max(0, ours.length - keep));
  for (const f of old) rmSync(join(dir, f), { force: true });
  return old;
}

export function startPeriodicBackup(s: PeriodicBackupSettings): PeriodicBackup {
  const now = s.now ?? (() => new Date());
  let running: Promise<string> | null = null;
  const runOnce = (): Promise<string> => {
    if (running) return running;
    running = (async () => {
      mkdirSync(s.dir, { recursive: true });
      const r = await backupDatabase(s.databaseUrl, join(s.dir, backupFileName(now())));
      const pruned = pruneBackups(s.dir, s.keep);
      s.log(`Backup written: ${r.file} (${(r.bytes / 1024 / 1024).toFixed(1)} MB, ${r.ms} ms)${pruned.length ? `; removed ${pruned.length} older` : ''}`);
      return r.file;
    })().finally(() => (running = null));
    return running;
  };
  const timer = setInterval(() => {
    runOnce().catch((e: unknown) => s.log(`Backup failed: ${e instanceof Error ? e.message : String(e)}`));
  }, s.everyMinutes * 60_000);
  timer.unref();
  return {
    runOnce,
    async stop() {
      clearInterval(timer);
      await running?.catch(() => {});
    },
  };
}
