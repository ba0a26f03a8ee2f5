/**
 * What a start does to an empty database, decided by the configuration:
 * - the demo firm, only when asked for (`--demo` or SEED_DEMO=true) and never in production
 *   (the configuration refuses SEED_DEMO there), with a random password unless DEMO_PASSWORD
 *   gives one; the password is printed once and kept beside the database file;
 * - otherwise the firm's first administrator from FIRST_ADMIN_EMAIL / FIRST_ADMIN_PASSWORD /
 *   FIRM_NAME, who must change that password at first sign-in;
 * - otherwise nothing: no account exists, and the log says how to create the first one.
 * A database that already has a firm is never touched.
 */
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { count } from 'drizzle-orm';
import type { Config } from '../config/env.js';
import type { Db } from './client.js';
import { firms, userRoles, users } from './schema.js';
import { demoCredentialsText, seedDemo } from './seed.js';
import { hashPassword, temporaryPassword } from '../auth/password.js';
import { recordAudit } from '../api/audit/auditService.js';

export type BootstrapOutcome = 'existing' | 'demo' | 'first-admin' | 'empty';

function isEmpty(db: Db): boolean {
  return (db.select({ n: count() }).from(firms).get()?.n ?? 0) === 0;
}

/** Creates the configured firm and its first administrator, who must change the password. */
export async function createFirstAdmin(db: Db, admin: NonNullable<Config['firstAdmin']>): Promise<void> {
  const hash = await hashPassword(admin.password);
  db.transaction((tx) => {
    const firm = tx.insert(firms).values({ name: admin.firmName }).returning().get();
    const user = tx.insert(users).values({ firmId: firm.id, email: admin.email, name: admin.name, passwordHash: hash, mustChangePassword: true }).returning().get();
    tx.insert(userRoles).values({ userId: user.id, role: 'admin' }).run();
    recordAudit(tx, { firmId: firm.id, projectId: null, actorId: user.id, action: 'create', entityType: 'user', entityId: user.id, summary: `first administrator ${admin.email} created at start-up` });
  });
}

/** Where the demo credentials are kept: beside the database file (not for an in-memory one). */
function credentialsFile(databaseUrl: string): string | null {
  if (databaseUrl === ':memory:') return null;
  return join(dirname(databaseUrl), 'demo-credentials.txt');
}

/**
 * Prepares an empty database as configured; `demoAsked` is the command line's `--demo`.
 * @throws Error when the demo is asked for in production.
 */
export async function bootstrapDatabase(db: Db, config: Config, log: (line: string) => void, demoAsked = false): Promise<BootstrapOutcome> {
  const wantDemo = config.seedDemo || demoAsked;
  if (wantDemo && config.env === 'production') {
    throw new Error('The demo firm is never seeded in production: its accounts would be open to anyone who reads the README. Set FIRST_ADMIN_EMAIL, FIRST_ADMIN_PASSWORD and FIRM_NAME instead.');
  }
  if (!isEmpty(db)) return 'existing';
  if (wantDemo) {
    const password = config.demoPassword ?? temporaryPassword();
    if (!(await seedDemo(db, password))) return 'existing';
    const text = demoCredentialsText(password);
    const file = credentialsFile(config.databaseUrl);
    if (file) writeFileSync(file, `${text}\n`, { mode: 0o600 });
    log(`Seeded an empty database with the invented demo firm (never done in production).\n${text}${file ? `\n(kept in ${file})` : ''}`);
    return 'demo';
  }
  if (config.firstAdmin) {
    await createFirstAdmin(db, config.firstAdmin);
    log(`Created firm "${config.firstAdmin.firmName}" and its first administrator ${config.firstAdmin.email}, who must change the password at first sign-in.`);
    return 'first-admin';
  }
  log('The database is empty and has no account. Restart with FIRST_ADMIN_EMAIL, FIRST_ADMIN_PASSWORD and FIRM_NAME set to create the first administrator (or `npm run demo` outside production for the invented demo firm).');
  return 'empty';
}
