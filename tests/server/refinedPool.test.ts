/** The refined-analysis pool through the API: a grillage run never holds up other requests,
 *  concurrent requests of one version share one job, and the limits (time, queue, model
 *  size) answer with a clear envelope while the server keeps serving. The workers load the
 *  solver's TypeScript through the tsx loader (vitest's transform does not reach them), so
 *  every refined answer here also proves that. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { makeWorkflowApp, send, userId } from './workflowHelpers.js';
import { analysisResults } from '../../server/db/schema.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import type { DeckInput } from '../../shared/deck/schema.js';
import { quarryCreekDeck, quarryCreekUs } from '../fixtures/decks.js';
import { assertDeck } from '../../shared/deck/schema.js';
import { RefinedPool } from '../../server/compute/refinedPool.js';

/** Quarry Creek with `girders` girders at `spacing` ft and `spans` spans of 110 ft, 30° skew. */
function wideDeck(name: string, girders: number, spans = 1, spacing = 8): DeckInput {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.name = name;
  us.girders = { kind: 'uniform', count: girders, spacing };
  us.spans = Array.from({ length: spans }, () => ({ length: 110 }));
  us.supports = Array.from({ length: spans + 1 }, () => ({ skew: 30 }));
  us.continuous = spans > 1;
  return deckFromDisplay(us as never, 'US') as unknown as DeckInput;
}

/** A 12-girder, 30° skew deck: a refined run of about a second, long beside any other request. */
const twelveGirderDeck = (name: string) => wideDeck(name, 12);

async function until(what: string, test: () => boolean, ms = 60_000): Promise<void> {
  const end = Date.now() + ms;
  while (!test()) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

async function newDeck(a: Agent, deck: DeckInput): Promise<{ deckId: number; versionId: number }> {
  const projectId = (await a.get('/api/projects')).body.projects[0].id as number;
  const res = await a.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', a.csrf).send({ deck, message: 'for the pool' });
  expect(res.status).toBe(201);
  return { deckId: res.body.deck.id, versionId: res.body.version.id };
}

const grillageRows = (c: Pick<TestContext, 'db'>, versionId: number) =>
  c.db.select().from(analysisResults).where(and(eq(analysisResults.versionId, versionId), eq(analysisResults.method, 'grillage'))).all();

describe('refined analyses off the request thread', () => {
  let ctx: TestContext;
  let designer: Agent;
  beforeAll(async () => {
    ctx = await makeTestApp({ refinedThreads: 1 });
    designer = await signIn(ctx.app, demo.designer);
  });
  afterAll(() => ctx.close());

  it('answers another request while a refined job runs in the pool', async () => {
    const { deckId, versionId } = await newDeck(designer, twelveGirderDeck('Pool deck A'));
    const finished: string[] = [];
    const refined = designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`).then((r) => {
      finished.push('refined');
      return r;
    });
    await until('the job to start in a worker', () => ctx.refinedPool.stats().running === 1);
    const me = await designer.get('/api/auth/me');
    finished.push('me');
    const health = await designer.get('/api/health');
    finished.push('health');
    const csv = await refined;

    expect(me.status).toBe(200);
    expect(health.status).toBe(200);
    expect(csv.status).toBe(200);
    expect(finished).toEqual(['me', 'health', 'refined']);
    expect(csv.text.split('\n').some((l) => l.includes('grillage'))).toBe(true);
    expect(grillageRows(ctx, versionId)).toHaveLength(1);
    const stats = ctx.refinedPool.stats();
    expect(stats).toMatchObject({ jobs: 1, completed: 1, running: 0, queued: 0, failed: 0 });
    expect(stats.workers).toBeGreaterThanOrEqual(1);
  });

  it('runs one job for concurrent requests of the same version', async () => {
    const { deckId, versionId } = await newDeck(designer, twelveGirderDeck('Pool deck B'));
    const before = ctx.refinedPool.stats();
    const first = designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`).then((r) => r);
    await until('the first request to queue its job', () => ctx.refinedPool.stats().jobs === before.jobs + 1);
    const second = designer.get(`/api/reports/decks/${deckId}/versions/1/envelopes.csv`).then((r) => r);
    const [a, b] = await Promise.all([first, second]);
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    const after = ctx.refinedPool.stats();
    expect(after.jobs - before.jobs).toBe(1);
    expect(after.shared - before.shared).toBe(1);
    expect(grillageRows(ctx, versionId)).toHaveLength(1);
  });
});

describe('the limits of the pool', () => {
  it('stops a job over the time limit with a clear 503, and the server keeps serving', async () => {
    const c = await makeTestApp({ refinedThreads: 1, refinedJobMs: 1 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const { deckId, versionId } = await newDeck(designer, quarryCreekDeck());
      const res = await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('refined_time_limit');
      expect(res.body.error.message).toMatch(/ran longer than this server's limit of 0\.001 s and was stopped/);
      expect(res.body.error.message).toMatch(/coarser mesh/);
      expect(grillageRows(c, versionId)).toHaveLength(0);

      expect((await designer.get('/api/auth/me')).status).toBe(200);
      expect((await designer.get('/api/health')).status).toBe(200);
      // the stopped worker was replaced: the next job runs (and is stopped) again
      const again = await designer.get(`/api/reports/decks/${deckId}/versions/1/envelopes.csv`);
      expect(again.status).toBe(503);
      expect(again.body.error.code).toBe('refined_time_limit');
      expect(c.refinedPool.stats()).toMatchObject({ jobs: 2, timedOut: 2, completed: 0, running: 0, queued: 0 });
    } finally {
      await c.close();
    }
  });

  it('refuses a job when the queue is full: 503 with Retry-After', async () => {
    const c = await makeTestApp({ refinedThreads: 1, refinedQueue: 0 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const a = await newDeck(designer, twelveGirderDeck('Queue deck A'));
      const b = await newDeck(designer, quarryCreekDeck());
      const first = designer.get(`/api/reports/decks/${a.deckId}/versions/1/factors.csv`).then((r) => r);
      await until('the first job to be queued', () => c.refinedPool.stats().jobs === 1);
      const busy = await designer.get(`/api/reports/decks/${b.deckId}/versions/1/factors.csv`);
      expect(busy.status).toBe(503);
      expect(busy.body.error.code).toBe('refined_busy');
      const retryAfter = Number(busy.headers['retry-after']);
      expect(Number.isInteger(retryAfter) && retryAfter >= 1).toBe(true);
      expect(busy.body.error.message).toContain(`Try again in ${retryAfter} s`);
      expect(busy.body.error.details).toEqual([{ path: 'Retry-After', message: `${retryAfter} seconds` }]);
      expect((await first).status).toBe(200);
      // once the first job is done, the refused one is accepted
      expect((await designer.get(`/api/reports/decks/${b.deckId}/versions/1/factors.csv`)).status).toBe(200);
      expect(c.refinedPool.stats()).toMatchObject({ jobs: 2, completed: 2, refusedBusy: 1 });
    } finally {
      await c.close();
    }
  });

  it('limits the jobs one user, and one firm, may have at once: 429 with Retry-After and the setting to raise', async () => {
    const c = await makeTestApp({ refinedThreads: 1, refinedJobsPerUser: 1, refinedJobsPerFirm: 2 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const reviewer = await signIn(c.app, demo.reviewer);
      const admin = await signIn(c.app, demo.admin);
      const a = await newDeck(designer, twelveGirderDeck('Limit deck A'));
      const b = await newDeck(designer, twelveGirderDeck('Limit deck B'));
      const d = await newDeck(designer, quarryCreekDeck());
      const first = designer.get(`/api/reports/decks/${a.deckId}/versions/1/factors.csv`).then((r) => r);
      await until('the first job to be queued', () => c.refinedPool.stats().jobs === 1);
      // the same user, another version: over the per-user limit
      const mine = await designer.get(`/api/reports/decks/${b.deckId}/versions/1/factors.csv`);
      expect(mine.status).toBe(429);
      expect(mine.body.error.code).toBe('refined_user_limit');
      expect(mine.body.error.message).toContain('You already have 1 refined (grillage) analysis queued or running, the most one user may have at once on this server (1)');
      expect(mine.body.error.message).toContain('REFINED_JOBS_PER_USER');
      expect(Number(mine.headers['retry-after'])).toBeGreaterThanOrEqual(1);
      // joining the job already running for a version is free
      const joined = designer.get(`/api/reports/decks/${a.deckId}/versions/1/envelopes.csv`).then((r) => r);
      // another user of the firm may queue one; a third job of the firm is over the firm's limit
      const second = reviewer.get(`/api/reports/decks/${b.deckId}/versions/1/factors.csv`).then((r) => r);
      await until('the second job to be queued', () => c.refinedPool.stats().jobs === 2);
      const firm = await admin.get(`/api/reports/decks/${d.deckId}/versions/1/factors.csv`);
      expect(firm.status).toBe(429);
      expect(firm.body.error.code).toBe('refined_firm_limit');
      expect(firm.body.error.message).toContain('Your firm already has 2 refined (grillage) analyses queued or running');
      expect((await first).status).toBe(200);
      expect((await joined).status).toBe(200);
      expect((await second).status).toBe(200);
      expect(c.refinedPool.stats()).toMatchObject({ jobs: 2, completed: 2, shared: 1, refusedOverUserLimit: 1, refusedOverFirmLimit: 1 });
      // with the jobs done, the refused request goes through
      expect((await admin.get(`/api/reports/decks/${d.deckId}/versions/1/factors.csv`)).status).toBe(200);
    } finally {
      await c.close();
    }
  });

  it('does not queue a deck above the model-size limit, and says why in the summary', async () => {
    const c = await makeWorkflowApp({ refinedMaxNodeGirders: 1000 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const reviewer = await signIn(c.app, demo.reviewer);
      const projectId = (await designer.get('/api/projects')).body.projects[0].id;
      const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'six girders' });
      const versionId = created.body.version.id as number;
      const round = await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(c, demo.reviewer) });
      expect(round.status).toBe(201);
      const res = await reviewer.get(`/api/reviews/${round.body.review.id}`);
      expect(res.status).toBe(200);
      expect(res.body.summary.refined.available).toBe(false);
      // Quarry Creek: 6 girders, one span, 20° skew (skew-parallel): 6 × (40 + 1 + 1) = 252 nodes × 6 lines
      expect(res.body.summary.refined.note).toContain('about 252 nodes × 6 girder lines = 1,512, above this server\'s limit of 1,000');
      expect(res.body.summary.refined.note).toContain('REFINED_MAX_NODE_GIRDERS');
      expect(c.refinedPool.stats()).toMatchObject({ jobs: 0, refusedTooLarge: 1 });
      expect(grillageRows(c, versionId)).toHaveLength(0);
    } finally {
      await c.close();
    }
  });

  it('reports a worker that runs out of memory, and replaces it', async () => {
    // Measured on this machine: the three-girder run below needs between 12 and 16 MB of heap
    // and the forty-girder, two-span run fails at 64 MB; 40 MB leaves room on both sides.
    const pool = new RefinedPool({ threads: 1, queue: 1, jobMs: 120_000, workerMemoryMb: 40, maxNodeGirders: 1e9, log: () => {} });
    try {
      const big = assertDeck(wideDeck('Forty girders', 40, 2, 6));
      const failure = await pool.run('big', big, JSON.stringify(big)).then(
        () => null,
        (e: { status?: number; code?: string; message?: string }) => e,
      );
      expect(failure).toMatchObject({ status: 503, code: 'refined_out_of_memory' });
      expect(failure?.message).toContain('memory allowance of 40 MB');
      // a deck that fits runs on the replacement worker (three girders: the run, with its moment
      // rows again at twice the mesh density, stays well inside 40 MB)
      const small = assertDeck(wideDeck('Three girders', 3));
      const answer = await pool.run('small', small, JSON.stringify(small));
      expect(answer.rows?.length).toBeGreaterThan(0);
      expect(pool.stats()).toMatchObject({ jobs: 2, outOfMemory: 1, completed: 1 });
    } finally {
      await pool.close();
    }
    // Running out of memory takes the worker about 26 s on a quiet 2-core machine (the collector
    // works harder as the heap fills) and more on a busy one: a generous limit, against a hang only.
  }, 120_000);
});
