/** Starts the server: reads the environment, sizes the password-hashing pool, opens (and
 *  migrates) the database, prepares an empty one as configured (server/db/bootstrap.ts: the
 *  demo firm only with `--demo` or SEED_DEMO=true outside production, or a first
 *  administrator), starts the refined-analysis pool and, when configured, periodic backups,
 *  listens, and shuts down cleanly on SIGINT/SIGTERM (connections, a backup in progress, mail,
 *  hashing threads, refined-analysis threads, database). */
import { loadConfig } from './config/env.js';
import { openDatabase } from './db/client.js';
import { bootstrapDatabase } from './db/bootstrap.js';
import { createApp } from './app.js';
import { startMail } from './mail/setup.js';
import { closePasswordHashing, configurePasswordHashing } from './auth/password.js';
import { refinedPoolFor } from './compute/refinedPool.js';
import { packagePoolFor } from './compute/packagePool.js';
import type { StudyRunner } from './compute/studyRunner.js';
import { startPeriodicBackup } from './backup/periodic.js';

async function main() {
  const config = loadConfig();
  await configurePasswordHashing({ threads: config.passwordHashThreads, queue: config.passwordHashQueue });
  const db = openDatabase(config.databaseUrl);
  await bootstrapDatabase(db, config, (line) => console.log(line), process.argv.includes('--demo'));
  const mail = await startMail(db, process.env, (line) => console.log(line));
  console.log(`Mail: ${mail.mailer.description}${mail.local ? ' (messages kept in the outbox, read by admins under Mail)' : ''}`);
  const refinedPool = refinedPoolFor(config);
  const packagePool = packagePoolFor(config);
  console.log(`Refined analyses: ${config.refinedThreads} worker thread(s), ${config.refinedJobMs / 1000} s per run, ${config.refinedQueue} waiting at most`);
  const app = createApp({ db, config, mailer: mail.mailer, refinedPool, packagePool });
  const server = app.listen(config.port, config.host, (err?: Error) => {
    if (err) {
      console.error(`Deckshare could not listen on ${config.host}:${config.port}: ${err.message}`);
      process.exit(1);
    }
    console.log(`Deckshare is serving on http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${config.port} (database ${config.databaseUrl})`);
  });
  const backups = config.backup ? startPeriodicBackup({ databaseUrl: config.databaseUrl, ...config.backup, log: (line) => console.log(line) }) : null;
  if (config.backup) console.log(`Backups: every ${config.backup.everyMinutes} min into ${config.backup.dir}, newest ${config.backup.keep} kept`);
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: closing connections…`);
    server.close(() => {
      void Promise.allSettled([backups?.stop(), mail.close(), closePasswordHashing(), refinedPool.close(), packagePool.close(), (app.locals.studyRunner as StudyRunner).close()]).then(() => {
        db.$client.close();
        console.log('Deckshare stopped.');
        process.exit(0);
      });
    });
    server.closeAllConnections();
    setTimeout(() => process.exit(1), 5000).unref();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
