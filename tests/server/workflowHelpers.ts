/** Helpers for the workflow tests (reviews, training, mail, attachments, imports, reports):
 *  an in-process app with a real local SMTP service whose messages land in the outbox, a second
 *  firm to prove isolation, and request shorthands that send the CSRF header. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Express } from 'express';
import { asc, eq } from 'drizzle-orm';
import { loadConfig, type Config } from '../../server/config/env.js';
import { openDatabase, type Db } from '../../server/db/client.js';
import { seedDemo } from '../../server/db/seed.js';
import { createApp } from '../../server/app.js';
import { firms, outboxMessages, userRoles, users, type Role } from '../../server/db/schema.js';
import { hashPassword } from '../../server/auth/password.js';
import { createSmtpMailer, type Mailer } from '../../server/mail/mailer.js';
import { startLocalSmtp, type LocalSmtp } from '../../server/mail/localSmtp.js';
import { DEMO_PASSWORD, signIn, type Agent } from './helpers.js';
import { refinedPoolFor, type RefinedPool } from '../../server/compute/refinedPool.js';
import { packagePoolFor, type PackagePool } from '../../server/compute/packagePool.js';

export interface WorkflowContext {
  app: Express;
  db: Db;
  config: Config;
  dir: string;
  attachmentsDir: string;
  mailer: Mailer;
  smtp: LocalSmtp;
  /** The app's refined-analysis worker pool. */
  refinedPool: RefinedPool;
  packagePool: PackagePool;
  close(): Promise<void>;
}

export async function makeWorkflowApp(overrides: Partial<Config> = {}): Promise<WorkflowContext> {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-workflow-'));
  const config = loadConfig({ NODE_ENV: 'test', DATABASE_URL: join(dir, 'test.db'), LOG_REQUESTS: 'false', CLIENT_DIST: join(dir, 'no-client'), PUBLIC_URL: 'http://deckshare.test' }, overrides);
  const db = openDatabase(config.databaseUrl);
  await seedDemo(db, DEMO_PASSWORD);
  const smtp = await startLocalSmtp({ db, port: 0 });
  const lines: string[] = [];
  const mailer = createSmtpMailer({ host: smtp.host, port: smtp.port, auth: smtp.auth, from: 'Deckshare <no-reply@deckshare.test>', tagMessages: true, log: (l) => lines.push(l) });
  const attachmentsDir = join(dir, 'files');
  const refinedPool = refinedPoolFor(config);
  const packagePool = packagePoolFor(config);
  const app = createApp({ db, config, log: (l) => lines.push(l), mailer, attachmentsDir, refinedPool, packagePool });
  return {
    app,
    db,
    config,
    dir,
    attachmentsDir,
    mailer,
    smtp,
    refinedPool,
    packagePool,
    async close() {
      await refinedPool.close();
      await packagePool.close();
      await mailer.idle();
      mailer.close();
      await smtp.close();
      db.$client.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Adds a user to the demo firm (or another firm) and signs them in. */
export async function addUser(ctx: WorkflowContext, email: string, roles: Role[], firmId?: number): Promise<{ id: number; agent: Agent }> {
  const firm = firmId ?? ctx.db.select().from(firms).orderBy(asc(firms.id)).get()!.id;
  const u = ctx.db
    .insert(users)
    .values({ firmId: firm, email, name: email.split('@')[0], passwordHash: await hashPassword('workflow-pass-1'), mustChangePassword: false })
    .returning()
    .get();
  for (const role of roles) ctx.db.insert(userRoles).values({ userId: u.id, role }).run();
  return { id: u.id, agent: await signIn(ctx.app, email, 'workflow-pass-1') };
}

/** A second firm with one user holding every role, to prove firm isolation. */
export async function otherFirm(ctx: WorkflowContext): Promise<Agent> {
  const firm = ctx.db.insert(firms).values({ name: 'Other Firm' }).returning().get();
  return (await addUser(ctx, 'everyone@other-firm.example', ['admin', 'designer', 'reviewer', 'instructor', 'trainee'], firm.id)).agent;
}

export function userId(ctx: WorkflowContext, email: string): number {
  return ctx.db.select({ id: users.id }).from(users).where(eq(users.email, email)).get()!.id;
}

/** Every outbox message so far, oldest first, after the mailer has delivered what it queued. */
export async function outbox(ctx: WorkflowContext) {
  await ctx.mailer.idle();
  return ctx.db.select().from(outboxMessages).orderBy(asc(outboxMessages.id)).all();
}

export const send = {
  post: (a: Agent, url: string, body?: unknown) => a.post(url).set('X-CSRF-Token', a.csrf).send(body as object),
  put: (a: Agent, url: string, body?: unknown) => a.put(url).set('X-CSRF-Token', a.csrf).send(body as object),
  patch: (a: Agent, url: string, body?: unknown) => a.patch(url).set('X-CSRF-Token', a.csrf).send(body as object),
  del: (a: Agent, url: string) => a.delete(url).set('X-CSRF-Token', a.csrf),
};
