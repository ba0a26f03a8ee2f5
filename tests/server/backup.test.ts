/**
 * Backup and restore (server/backup): a backup taken while saves keep arriving restores to a
 * database that passes integrity_check and holds every save acknowledged before the backup
 * began; restore refuses files that are not whole Deckshare databases and never replaces an
 * existing one unless forced; periodic backups keep only the newest K files.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Database from 'better-sqlite3';
import { copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { backupDatabase } from '../../server/backup/backup.js';
import { inspectBackup, restoreDatabase } from '../../server/backup/restore.js';
import { backupFileName, startPeriodicBackup } from '../../server/backup/periodic.js';
import { loadConfig } from '../../server/config/env.js';

let ctx: TestContext;
let agent: Agent;
let deckId: number;
let baseDeck: Record<string, unknown>;
/** A backup taken in the first test, reused by the refusal tests. */
let goodBackup: string;

interface Ack {
  tag: string;
  number: number;
}

async function save(tag: string): Promise<Ack> {
  const res = await agent
    .post(`/api/decks/${deckId}/versions`)
    .set('X-CSRF-Token', agent.csrf)
    .send({ deck: { ...baseDeck, name: `${String(baseDeck.name)} · ${tag}` }, message: tag });
  if (res.status !== 201) throw new Error(`save ${tag}: ${res.status} ${JSON.stringify(res.body)}`);
  return { tag, number: res.body.version.number as number };
}

/** `count` saves from each of `writers` concurrent writers. */
async function concurrentSaves(prefix: string, writers: number, count: number): Promise<Ack[]> {
  const acks: Ack[] = [];
  await Promise.all(
    Array.from({ length: writers }, async (_, w) => {
      for (let i = 0; i < count; i++) acks.push(await save(`${prefix}-${w}-${i}`));
    }),
  );
  return acks;
}

function integrity(file: string): string {
  const db = new Database(file, { readonly: true });
  try {
    return (db.pragma('integrity_check') as { integrity_check: string }[]).map((r) => r.integrity_check).join('; ');
  } finally {
    db.close();
  }
}

beforeAll(async () => {
  ctx = await makeTestApp();
  agent = await signIn(ctx.app, demo.designer);
  const projects = await agent.get('/api/projects');
  const decks = await agent.get(`/api/projects/${projects.body.projects[0].id}/decks`);
  deckId = decks.body.decks[0].id;
  const v1 = await agent.get(`/api/decks/${deckId}/versions/1`);
  baseDeck = v1.body.version.deck;
});
afterAll(() => ctx.close());

describe('backup while saves arrive', () => {
  it('restores to an intact database holding every save acknowledged before the backup began', async () => {
    const before = await concurrentSaves('before', 3, 5);
    goodBackup = join(ctx.dir, 'backups', 'during-writes.db');
    // Small steps yield to the event loop, so the writers' saves land while the copy runs
    // (SQLite restarts the copy after each of them).
    const [backup, during] = await Promise.all([backupDatabase(ctx.config.databaseUrl, goodBackup, { pagesPerStep: 4 }), concurrentSaves('during', 4, 6)]);
    expect(during).toHaveLength(24);
    expect(backup.bytes).toBeGreaterThan(0);
    expect(existsSync(`${goodBackup}-wal`)).toBe(false);

    const target = join(ctx.dir, 'restored', 'deckshare.db');
    const restored = await restoreDatabase(goodBackup, target);
    expect(restored.replaced).toBe(false);
    expect(integrity(target)).toBe('ok');

    const db = new Database(target, { readonly: true });
    try {
      const version = db.prepare('select deck_json, message from deck_versions where deck_id = ? and number = ?');
      for (const ack of before) {
        const row = version.get(deckId, ack.number) as { deck_json: string; message: string } | undefined;
        expect(row, `save ${ack.tag}`).toBeDefined();
        expect(row!.message).toBe(ack.tag);
        expect(JSON.parse(row!.deck_json)).toEqual({ ...baseDeck, name: `${String(baseDeck.name)} · ${ack.tag}` });
      }
      // Each save writes its version and its results in one transaction: the copy holds both or neither.
      const orphans = db.prepare('select count(*) as n from deck_versions v where not exists (select 1 from analysis_results r where r.version_id = v.id)').get() as { n: number };
      expect(orphans.n).toBe(0);
    } finally {
      db.close();
    }
  });
});

describe('restore refuses what it cannot trust', () => {
  const folder = () => {
    const dir = join(ctx.dir, `refusals-${Math.random().toString(36).slice(2)}`);
    mkdirSync(dir);
    return dir;
  };

  it('refuses a file that is not an SQLite database', async () => {
    const dir = folder();
    const file = join(dir, 'notes.db');
    writeFileSync(file, 'these are meeting notes, not a database\n'.repeat(100));
    await expect(restoreDatabase(file, join(dir, 'data', 'deckshare.db'))).rejects.toThrow(/is not an SQLite database/);
    expect(existsSync(join(dir, 'data', 'deckshare.db'))).toBe(false);
  });

  it('refuses an SQLite database of another program', async () => {
    const dir = folder();
    const file = join(dir, 'other.db');
    const other = new Database(file);
    other.exec('create table recipes (id integer primary key, title text)');
    other.close();
    await expect(restoreDatabase(file, join(dir, 'deckshare.db'))).rejects.toThrow(/not a Deckshare database/);
  });

  it('refuses a Deckshare database whose migrations this version does not know', async () => {
    const dir = folder();
    const file = join(dir, 'foreign.db');
    copyFileSync(goodBackup, file);
    const db = new Database(file);
    db.prepare('update __drizzle_migrations set hash = ? where rowid = (select max(rowid) from __drizzle_migrations)').run('0'.repeat(64));
    db.close();
    await expect(restoreDatabase(file, join(dir, 'deckshare.db'))).rejects.toThrow(/migration\(s\) this version of Deckshare does not know/);
  });

  it('refuses a corrupt backup with the integrity_check finding', async () => {
    const dir = folder();
    const file = join(dir, 'corrupt.db');
    const bytes = readFileSync(goodBackup);
    const pageSize = bytes.readUInt16BE(16);
    // Overwrite everything after the first two pages (the schema page stays readable).
    for (let i = pageSize * 2; i < bytes.length; i++) bytes[i] = (i * 7919) & 0xff;
    writeFileSync(file, bytes);
    expect(() => inspectBackup(file)).toThrow(/fails integrity_check/);
    await expect(restoreDatabase(file, join(dir, 'deckshare.db'))).rejects.toThrow(/fails integrity_check/);
    expect(readdirSync(dir)).toEqual(['corrupt.db']);
  });

  it('never replaces an existing database unless forced, and leaves no partial file', async () => {
    const dir = folder();
    const target = join(dir, 'deckshare.db');
    await restoreDatabase(goodBackup, target);
    await expect(restoreDatabase(goodBackup, target)).rejects.toThrow(/a database already exists at .*--force/);
    const forced = await restoreDatabase(goodBackup, target, { force: true });
    expect(forced.replaced).toBe(true);
    expect(integrity(target)).toBe('ok');
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
  });
});

describe('periodic backups', () => {
  it('keeps only the newest K backups and leaves other files alone', async () => {
    const dir = join(ctx.dir, 'periodic');
    mkdirSync(dir);
    writeFileSync(join(dir, 'README.txt'), 'operator notes');
    let minute = 0;
    const clock = () => new Date(Date.UTC(2026, 0, 1, 3, minute++));
    const periodic = startPeriodicBackup({ databaseUrl: ctx.config.databaseUrl, dir, everyMinutes: 60, keep: 3, log: () => {}, now: clock });
    try {
      for (let i = 0; i < 5; i++) await periodic.runOnce();
    } finally {
      await periodic.stop();
    }
    const names = [2, 3, 4].map((m) => backupFileName(new Date(Date.UTC(2026, 0, 1, 3, m))));
    expect(readdirSync(dir).sort()).toEqual(['README.txt', ...names].sort());
    for (const n of names) expect(integrity(join(dir, n))).toBe('ok');
  });

  it('is off by default and validates its settings', () => {
    expect(loadConfig({}).backup).toBeNull();
    expect(loadConfig({ BACKUP_DIR: '/srv/deckshare-backups' }).backup).toEqual({ dir: '/srv/deckshare-backups', everyMinutes: 60, keep: 7 });
    expect(() => loadConfig({ BACKUP_DIR: '/srv/b', BACKUP_EVERY_MINUTES: '0' })).toThrow(/BACKUP_EVERY_MINUTES/);
    expect(() => loadConfig({ BACKUP_DIR: '/srv/b', BACKUP_KEEP: 'two' })).toThrow(/BACKUP_KEEP/);
  });
});
