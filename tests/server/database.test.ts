/** The database: pragmas, migrations applied at start, seeding only an empty database. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { makeTestApp, type TestContext } from './helpers.js';
import { seedDemo, DEMO_USERS } from '../../server/db/seed.js';
import { analysisResults, auditLog, deckVersions, firms, projects, users } from '../../server/db/schema.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await makeTestApp();
});
afterAll(() => ctx.close());

describe('database', () => {
  it('runs in WAL mode with foreign keys on and a busy timeout', () => {
    const sqlite = ctx.db.$client;
    expect(sqlite.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
    expect(Number(sqlite.pragma('busy_timeout', { simple: true }))).toBeGreaterThanOrEqual(1000);
  });

  it('seeded one firm, one user per demo role and two projects', () => {
    expect(ctx.db.select({ n: count() }).from(firms).get()!.n).toBe(1);
    expect(ctx.db.select({ n: count() }).from(users).get()!.n).toBe(DEMO_USERS.length);
    expect(ctx.db.select({ n: count() }).from(projects).get()!.n).toBeGreaterThanOrEqual(2);
    // each demo project opens with one saved deck version whose factors were computed
    expect(ctx.db.select({ n: count() }).from(deckVersions).get()!.n).toBe(2);
    expect(ctx.db.select({ n: count() }).from(analysisResults).get()!.n).toBeGreaterThanOrEqual(2);
  });

  it('never seeds a database that already has data', async () => {
    const before = ctx.db.select({ n: count() }).from(users).get()!.n;
    expect(await seedDemo(ctx.db, 'another-password-1')).toBe(false);
    expect(ctx.db.select({ n: count() }).from(users).get()!.n).toBe(before);
  });

  it('refuses to edit or delete audit entries', () => {
    expect(() => ctx.db.update(auditLog).set({ summary: 'rewritten' }).run()).toThrow(/cannot be edited/);
    expect(() => ctx.db.delete(auditLog).run()).toThrow(/cannot be edited/);
  });
});
