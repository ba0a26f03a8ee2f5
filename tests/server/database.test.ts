/** The database: pragmas, migrations applied at start, seeding only an empty database. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Database from 'better-sqlite3';
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
    expect(sqlite.pragma('recursive_triggers', { simple: true })).toBe(1);
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

/**
 * Append-only tables refuse every conflict resolution that would swap a row: INSERT OR
 * REPLACE, REPLACE INTO and upserts, on the primary key and on each unique key, on the
 * product's connection (recursive_triggers on) and on a bare connection (pragma off).
 */
describe('append-only tables refuse replacing inserts', () => {
  type Row = Record<string, unknown>;
  const sqlite = () => ctx.db.$client;

  /** One row in each append-only table, made directly in SQL where the seed has none. */
  function ensureWorkflowRows(): void {
    const db = sqlite();
    const v = db.prepare('SELECT v.id, v.deck_id, d.project_id, p.firm_id, v.created_by FROM deck_versions v JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id LIMIT 1').get() as Row;
    if (!db.prepare('SELECT 1 FROM outbox_messages').get()) {
      db.prepare("INSERT INTO outbox_messages (firm_id, kind, message_id, from_address, to_addresses, subject, text_body, size_bytes) VALUES (?, 'test', '<m@x>', 'a@example.test', 'b@example.test', 'original subject', 'body', 4)").run(v.firm_id);
    }
    if (!db.prepare('SELECT 1 FROM review_comments').get()) {
      const round = db.prepare("INSERT INTO review_rounds (firm_id, project_id, deck_id, version_id, submitted_by, reviewer_id, state) VALUES (?, ?, ?, ?, ?, ?, 'awaiting-review')").run(v.firm_id, v.project_id, v.deck_id, v.id, v.created_by, v.created_by);
      db.prepare("INSERT INTO review_comments (round_id, author_id, body) VALUES (?, ?, 'original comment')").run(round.lastInsertRowid, v.created_by);
    }
    if (!db.prepare('SELECT 1 FROM submissions').get()) {
      const a = db
        .prepare("INSERT INTO assignments (firm_id, project_id, deck_id, version_id, kind, params_json, title, tolerance_percent, due_at, expected_json, created_by) VALUES (?, ?, ?, ?, 'factor', '{}', 't', 1, '2030-01-01T00:00:00Z', '{}', ?)")
        .run(v.firm_id, v.project_id, v.deck_id, v.id, v.created_by);
      db.prepare("INSERT INTO submissions (assignment_id, trainee_id, attempt, answer_json, steps_json, late, passed, grading_json) VALUES (?, ?, 1, '{\"value\":1}', '[]', 0, 0, '{}')").run(a.lastInsertRowid, v.created_by);
    }
  }

  /** Each append-only table, the text column a replacement would change, and its unique keys besides id. */
  const TABLES: { table: string; column: string; uniqueKeys: string[][] }[] = [
    { table: 'deck_versions', column: 'message', uniqueKeys: [['deck_id', 'number']] },
    { table: 'analysis_results', column: 'solver_version', uniqueKeys: [['version_id', 'method', 'solver_version']] },
    { table: 'audit_log', column: 'summary', uniqueKeys: [] },
    { table: 'outbox_messages', column: 'subject', uniqueKeys: [] },
    { table: 'review_comments', column: 'body', uniqueKeys: [] },
    { table: 'submissions', column: 'answer_json', uniqueKeys: [['assignment_id', 'trainee_id', 'attempt']] },
  ];

  /** The statements that would swap the row: same id, and same unique key under a new id. */
  function attacks(db: Database.Database, table: string, column: string, uniqueKeys: string[][]): { name: string; run: () => unknown }[] {
    const row = db.prepare(`SELECT * FROM ${table} ORDER BY id LIMIT 1`).get() as Row;
    const cols = Object.keys(row);
    const changed = { ...row, [column]: column === 'answer_json' ? '{"value":99}' : 'REPLACED' };
    const insert = (verb: string, values: Row, tail = '') => {
      const c = Object.keys(values);
      return () => db.prepare(`${verb} INTO ${table} (${c.join(', ')}) VALUES (${c.map((k) => `@${k}`).join(', ')}) ${tail}`).run(values);
    };
    const withoutId = Object.fromEntries(cols.filter((c) => c !== 'id').map((c) => [c, changed[c]]));
    const out = [
      { name: 'INSERT OR REPLACE (id)', run: insert('INSERT OR REPLACE', changed) },
      { name: 'REPLACE INTO (id)', run: insert('REPLACE', changed) },
      { name: 'UPSERT ON CONFLICT(id) DO UPDATE', run: insert('INSERT', changed, `ON CONFLICT(id) DO UPDATE SET ${column} = excluded.${column}`) },
      { name: 'UPSERT ON CONFLICT DO UPDATE', run: insert('INSERT', changed, `ON CONFLICT DO UPDATE SET ${column} = excluded.${column}`) },
    ];
    for (const key of uniqueKeys) {
      // keep the unique key as it is and change a column outside it
      const other = key.includes(column) ? 'created_at' : column;
      const same = { ...withoutId, ...Object.fromEntries(key.map((k) => [k, row[k]])), [other]: 'REPLACED' };
      out.push({ name: `INSERT OR REPLACE (${key.join(', ')})`, run: insert('INSERT OR REPLACE', same) });
      out.push({ name: `REPLACE INTO (${key.join(', ')})`, run: insert('REPLACE', same) });
      out.push({ name: `UPSERT ON CONFLICT(${key.join(', ')}) DO UPDATE`, run: insert('INSERT', same, `ON CONFLICT(${key.join(', ')}) DO UPDATE SET ${other} = excluded.${other}`) });
    }
    return out;
  }

  function expectAllRefused(db: Database.Database): void {
    ensureWorkflowRows();
    for (const { table, column, uniqueKeys } of TABLES) {
      const before = db.prepare(`SELECT * FROM ${table} ORDER BY id`).all();
      expect(before.length, table).toBeGreaterThan(0);
      for (const a of attacks(db, table, column, uniqueKeys)) {
        expect(a.run, `${table}: ${a.name}`).toThrow(/immutable|cannot be|append-only/);
      }
      expect(db.prepare(`SELECT * FROM ${table} ORDER BY id`).all(), table).toEqual(before);
    }
  }

  it('on the product connection (recursive triggers on)', () => {
    expectAllRefused(sqlite());
  });

  it('on a bare connection that never set recursive_triggers', () => {
    const bare = new Database(ctx.config.databaseUrl);
    try {
      expect(bare.pragma('recursive_triggers', { simple: true })).toBe(0);
      expectAllRefused(bare);
    } finally {
      bare.close();
    }
  });

  it('still takes ordinary inserts, and the outbox refuses deletes', () => {
    ensureWorkflowRows();
    const db = sqlite();
    const n = (db.prepare('SELECT COUNT(*) AS n FROM audit_log').get() as { n: number }).n;
    db.prepare("INSERT INTO audit_log (firm_id, action, entity_type, summary) VALUES (1, 'test', 'test', 'a new entry')").run();
    expect((db.prepare('SELECT COUNT(*) AS n FROM audit_log').get() as { n: number }).n).toBe(n + 1);
    expect(() => db.prepare('DELETE FROM outbox_messages').run()).toThrow(/cannot be deleted/);
  });
});
