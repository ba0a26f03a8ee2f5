/** What a start does to an empty database (server/db/bootstrap.ts): a production start never
 *  seeds the demo firm, so no account answers to a published password; the first
 *  administrator comes from the environment and must change the password; the demo firm is
 *  seeded only when asked for, with a password nobody has read in a README. */
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { loadConfig } from '../../server/config/env.js';
import { openDatabase, type Db } from '../../server/db/client.js';
import { bootstrapDatabase } from '../../server/db/bootstrap.js';
import { DEMO_USERS } from '../../server/db/seed.js';
import { createApp } from '../../server/app.js';
import { firms, users } from '../../server/db/schema.js';

/** The password the README once printed for every demo user. */
const PUBLISHED_PASSWORD = 'deckshare-demo-1';
const SECRET = 'a-production-secret-of-at-least-32-characters';

const open: { db: Db; dir: string }[] = [];
function emptyDatabase() {
  const dir = mkdtempSync(join(tmpdir(), 'deckshare-start-'));
  const db = openDatabase(join(dir, 'deckshare.db'));
  open.push({ db, dir });
  return { db, dir, url: join(dir, 'deckshare.db') };
}
afterEach(() => {
  for (const o of open.splice(0)) {
    o.db.$client.close();
    rmSync(o.dir, { recursive: true, force: true });
  }
});

const quiet = () => {};
const signInWith = (app: ReturnType<typeof createApp>, email: string, password: string) => request(app).post('/api/auth/login').send({ email, password });

describe('a production start on an empty database', () => {
  it('creates no account: no demo e-mail signs in with the published password', async () => {
    const { db, url } = emptyDatabase();
    const config = loadConfig({ NODE_ENV: 'production', JWT_SECRET: SECRET, DATABASE_URL: url, LOG_REQUESTS: 'false' });
    expect(config.seedDemo).toBe(false);
    const lines: string[] = [];
    expect(await bootstrapDatabase(db, config, (l) => lines.push(l))).toBe('empty');
    expect(db.select({ n: count() }).from(users).get()!.n).toBe(0);
    expect(lines.join('\n')).toMatch(/FIRST_ADMIN_EMAIL/);
    const app = createApp({ db, config, log: quiet });
    for (const u of DEMO_USERS) expect((await signInWith(app, u.email, PUBLISHED_PASSWORD)).status).toBe(401);
  });

  it('refuses SEED_DEMO and --demo in production, saying why', async () => {
    expect(() => loadConfig({ NODE_ENV: 'production', JWT_SECRET: SECRET, SEED_DEMO: 'true' })).toThrow(/SEED_DEMO: the demo firm is never seeded in production/);
    const { db, url } = emptyDatabase();
    const config = loadConfig({ NODE_ENV: 'production', JWT_SECRET: SECRET, DATABASE_URL: url });
    await expect(bootstrapDatabase(db, config, quiet, true)).rejects.toThrow(/never seeded in production/);
    expect(db.select({ n: count() }).from(firms).get()!.n).toBe(0);
  });

  it('creates the first administrator from the environment, who must change the password first', async () => {
    const { db, url } = emptyDatabase();
    const env = { NODE_ENV: 'production', JWT_SECRET: SECRET, DATABASE_URL: url, FIRST_ADMIN_EMAIL: ' Chief@Example.org ', FIRST_ADMIN_PASSWORD: 'first-start-password-42', FIRM_NAME: 'Tamsin Vale Structures' };
    // production cookies are Secure; supertest speaks plain http, so this app sends them without
    const config = loadConfig(env, { secureCookies: false });
    expect(await bootstrapDatabase(db, config, quiet)).toBe('first-admin');
    expect(db.select().from(users).all().map((u) => [u.email, u.mustChangePassword])).toEqual([['chief@example.org', true]]);
    const app = createApp({ db, config, log: quiet });
    const agent = request.agent(app);
    const login = await agent.post('/api/auth/login').send({ email: 'chief@example.org', password: 'first-start-password-42' });
    expect(login.status).toBe(200);
    expect(login.body.user.mustChangePassword).toBe(true);
    // until the password is changed, nothing else is allowed
    expect((await agent.get('/api/projects')).status).toBe(403);
    // a second start finds a firm and touches nothing
    expect(await bootstrapDatabase(db, config, quiet)).toBe('existing');
    expect(db.select({ n: count() }).from(users).get()!.n).toBe(1);
  });

  it('refuses a half-given first administrator and a short initial password', () => {
    expect(() => loadConfig({ FIRST_ADMIN_EMAIL: 'a@example.org' })).toThrow(/set both or neither/);
    expect(() => loadConfig({ FIRST_ADMIN_EMAIL: 'a@example.org', FIRST_ADMIN_PASSWORD: 'short', FIRM_NAME: 'X' })).toThrow(/at least 12 characters/);
    expect(() => loadConfig({ FIRST_ADMIN_EMAIL: 'a@example.org', FIRST_ADMIN_PASSWORD: 'long-enough-password' })).toThrow(/FIRM_NAME/);
  });
});

describe('the demo firm outside production', () => {
  it('is not seeded unless asked for', async () => {
    const { db, url } = emptyDatabase();
    const config = loadConfig({ NODE_ENV: 'development', DATABASE_URL: url });
    expect(await bootstrapDatabase(db, config, quiet)).toBe('empty');
    expect(db.select({ n: count() }).from(firms).get()!.n).toBe(0);
  });

  it('asked for, gets a random password, printed once and kept beside the database (owner-only file)', async () => {
    const { db, dir, url } = emptyDatabase();
    const config = loadConfig({ NODE_ENV: 'development', DATABASE_URL: url });
    const lines: string[] = [];
    expect(await bootstrapDatabase(db, config, (l) => lines.push(l), true)).toBe('demo');
    const password = /password is (\S+)/.exec(lines.join('\n'))![1];
    expect(password).not.toBe(PUBLISHED_PASSWORD);
    expect(password.length).toBeGreaterThanOrEqual(12);
    const file = join(dir, 'demo-credentials.txt');
    expect(readFileSync(file, 'utf8')).toContain(password);
    expect(statSync(file).mode & 0o077).toBe(0);
    const app = createApp({ db, config, log: quiet });
    expect((await signInWith(app, DEMO_USERS[0].email, PUBLISHED_PASSWORD)).status).toBe(401);
    expect((await signInWith(app, DEMO_USERS[0].email, password)).status).toBe(200);
  });

  it('DEMO_PASSWORD chooses the password (for scripted tours and browser tests)', async () => {
    const { db, url } = emptyDatabase();
    const config = loadConfig({ NODE_ENV: 'development', DATABASE_URL: url, SEED_DEMO: 'true', DEMO_PASSWORD: 'chosen-demo-password' });
    expect(await bootstrapDatabase(db, config, quiet)).toBe('demo');
    const app = createApp({ db, config, log: quiet });
    expect((await signInWith(app, DEMO_USERS[1].email, 'chosen-demo-password')).status).toBe(200);
  });
});
