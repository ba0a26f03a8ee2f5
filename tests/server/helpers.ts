/** Test helpers: an in-process app on a temporary SQLite file, seeded with the demo firm,
 *  and signed-in supertest agents that send the CSRF header. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { Express } from 'express';
import { loadConfig, type Config } from '../../server/config/env.js';
import { openDatabase, type Db } from '../../server/db/client.js';
import { seedDemo } from '../../server/db/seed.js';

/** The demo users' password in tests (the server itself picks a random one unless DEMO_PASSWORD is set). */
export const DEMO_PASSWORD = 'deckshare-demo-1';
import { createApp } from '../../server/app.js';
import { refinedPoolFor, type RefinedPool } from '../../server/compute/refinedPool.js';
import { packagePoolFor, type PackagePool } from '../../server/compute/packagePool.js';
import { closePasswordHashing } from '../../server/auth/password.js';

export interface TestContext {
  app: Express;
  db: Db;
  config: Config;
  dir: string;
  /** The app's refined-analysis worker pool. */
  refinedPool: RefinedPool;
  packagePool: PackagePool;
  close(): Promise<void>;
}

export async function makeTestApp(overrides: Partial<Config> = {}): Promise<TestContext> {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-test-'));
  const config = loadConfig({ NODE_ENV: 'test', DATABASE_URL: join(dir, 'test.db'), LOG_REQUESTS: 'false', CLIENT_DIST: join(dir, 'no-client') }, overrides);
  const db = openDatabase(config.databaseUrl);
  await seedDemo(db, DEMO_PASSWORD);
  const refinedPool = refinedPoolFor(config);
  const packagePool = packagePoolFor(config);
  const app = createApp({ db, config, log: () => {}, refinedPool, packagePool });
  return {
    app,
    db,
    config,
    dir,
    refinedPool,
    packagePool,
    async close() {
      await refinedPool.close();
      await packagePool.close();
      await (app.locals.studyRunner as { close(): Promise<void> }).close();
      db.$client.close();
      rmSync(dir, { recursive: true, force: true });
      // Worker threads stop (awaited, so the next app of this file starts a fresh pool); the
      // next hash starts them again.
      await closePasswordHashing();
    },
  };
}

export type Agent = ReturnType<typeof request.agent> & { csrf: string };

/** Signs in and returns an agent whose cookie jar holds the session; `csrf` is the token. */
export async function signIn(app: Express, email: string, password = DEMO_PASSWORD): Promise<Agent> {
  const agent = request.agent(app) as Agent;
  const res = await agent.post('/api/auth/login').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const csrf = cookies.map((c) => /^ds_csrf=([^;]+)/.exec(c)?.[1]).find(Boolean);
  if (!csrf) throw new Error('no CSRF cookie');
  agent.csrf = csrf;
  return agent;
}

export const demo = {
  admin: 'admin@larchmont-ridge.example',
  designer: 'designer@larchmont-ridge.example',
  reviewer: 'reviewer@larchmont-ridge.example',
  instructor: 'instructor@larchmont-ridge.example',
  trainee: 'trainee@larchmont-ridge.example',
};
