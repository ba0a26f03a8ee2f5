/** Long lists come a page at a time (server/api/pagination.ts): a deck with 5,000 versions, a
 *  project's audit, the outbox and the review rounds. Pages never repeat or skip a row, carry
 *  the total, stay small, and a malformed cursor is a 400 naming it. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';
import { deckVersions } from '../../server/db/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

let ctx: WorkflowContext;
let designer: Agent;
let admin: Agent;
let deckId: number;
let projectId: number;
const VERSIONS = 5000;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  admin = await signIn(ctx.app, demo.admin);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'version 1' });
  deckId = created.body.deck.id;
  // 4,999 more versions written straight to the table (saving each through the API would
  // compute its factors 4,999 times); versions are append-only, inserts are allowed
  const first = ctx.db.select().from(deckVersions).all().find((v) => v.deckId === deckId)!;
  const sqlite = ctx.db.$client;
  const insert = sqlite.prepare('INSERT INTO deck_versions (deck_id, number, deck_json, message, created_by) VALUES (?, ?, ?, ?, ?)');
  sqlite.transaction(() => {
    for (let n = 2; n <= VERSIONS; n++) insert.run(deckId, n, first.deckJson, `version ${n}`, first.createdBy);
  })();
}, 60_000);
afterAll(() => ctx.close());

describe('a deck with 5,000 versions', () => {
  it('opens with its newest 50 versions and the total, in a small answer', async () => {
    const res = await designer.get(`/api/decks/${deckId}`);
    expect(res.status).toBe(200);
    expect(res.body.versions).toHaveLength(50);
    expect(res.body.versions[0].number).toBe(VERSIONS);
    expect(res.body.page).toMatchObject({ limit: 50, total: VERSIONS });
    expect(res.body.page.nextCursor).toEqual(expect.any(String));
    // a version summary is about 250 characters (id, number, message, author, dates): 50 of them
    // and the deck heading stay well under 30,000
    expect(res.text.length).toBeLessThan(30_000);
  });

  it('pages through every version once, newest first, 200 at a time', async () => {
    const seen: number[] = [];
    let cursor: string | null = null;
    let pages = 0;
    do {
      const res = await designer.get(`/api/decks/${deckId}/versions`).query({ limit: 200, ...(cursor ? { cursor } : {}) });
      expect(res.status).toBe(200);
      expect(res.text.length).toBeLessThan(100_000); // 200 summaries of about 250 characters
      seen.push(...res.body.versions.map((v: { number: number }) => v.number));
      cursor = res.body.page.nextCursor;
      pages++;
    } while (cursor);
    expect(pages).toBe(VERSIONS / 200);
    expect(seen).toEqual(Array.from({ length: VERSIONS }, (_, i) => VERSIONS - i));
  });

  it('the review status of its versions is paged the same way, with the latest approved version', async () => {
    const res = await designer.get('/api/reviews/status').query({ deckId, limit: 10 });
    expect(res.status).toBe(200);
    expect(res.body.versions.map((v: { number: number }) => v.number)).toEqual(Array.from({ length: 10 }, (_, i) => VERSIONS - i));
    expect(res.body.page.total).toBe(VERSIONS);
    expect(res.body.latestApprovedNumber).toBeNull();
  });

  it('refuses a malformed cursor and an out-of-range limit, naming them', async () => {
    for (const cursor of ['not a cursor', 'eyJ4IjoxfQ', 'e30']) {
      const res = await designer.get(`/api/decks/${deckId}/versions`).query({ cursor });
      expect(res.status, cursor).toBe(400);
      expect(res.body.error.details[0].path).toBe('query.cursor');
    }
    for (const limit of ['0', '201', '2.5', 'many']) {
      const res = await designer.get(`/api/decks/${deckId}/versions`).query({ limit });
      expect(res.status, limit).toBe(400);
      expect(res.body.error.details[0].path).toBe('query.limit');
    }
  });
});

describe('the other long lists', () => {
  it('audit, outbox and review rounds page without repeats and carry their totals', async () => {
    const reviewerId = userId(ctx, demo.reviewer);
    // three review rounds (each audited and e-mailed) on three new decks
    for (let i = 0; i < 3; i++) {
      const d = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: { ...quarryCreekDeck(), name: `Paged deck ${i}` }, message: 'first' });
      expect((await send.post(designer, '/api/reviews', { versionId: d.body.version.id, reviewerId })).status).toBe(201);
    }
    await ctx.mailer.idle();
    const walk = async (a: Agent, url: string, key: string, query: Record<string, unknown> = {}) => {
      const ids: number[] = [];
      let cursor: string | null = null;
      let total = -1;
      do {
        const res = await a.get(url).query({ ...query, limit: 2, ...(cursor ? { cursor } : {}) });
        expect(res.status, url).toBe(200);
        expect(res.body[key].length).toBeLessThanOrEqual(2);
        ids.push(...res.body[key].map((r: { id: number }) => r.id));
        total = res.body.page.total;
        cursor = res.body.page.nextCursor;
      } while (cursor);
      expect(new Set(ids).size, url).toBe(ids.length);
      expect(ids.length, url).toBe(total);
      return ids;
    };
    const audit = await walk(designer, `/api/projects/${projectId}/audit`, 'entries');
    expect(audit.length).toBeGreaterThanOrEqual(4);
    expect([...audit].sort((a, b) => b - a)).toEqual(audit);
    expect((await walk(admin, '/api/mail/outbox', 'messages')).length).toBeGreaterThanOrEqual(3);
    expect(await walk(designer, '/api/reviews', 'reviews', { view: 'submitted' })).toHaveLength(3);
  });
});
