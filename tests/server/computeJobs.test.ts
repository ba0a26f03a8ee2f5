/** The worker pools' jobs as database records: each refined run and each calculation package
 *  is recorded with who asked, its state and timings, a failed one with the reason its
 *  requester was given, and a restart marks the jobs a stopped server left unfinished as
 *  failed (none stays "running" for ever). Read through the API, firm by firm. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, userId, type WorkflowContext } from './workflowHelpers.js';
import { quarryCreekDeck, quarryCreekUs } from '../fixtures/decks.js';
import { deckFromDisplay } from '../../shared/deck/units.js';
import { createApp } from '../../server/app.js';
import { analysisResults, computeJobs } from '../../server/db/schema.js';
import { INTERRUPTED } from '../../server/compute/jobRecords.js';
import { SOLVER_VERSION } from '../../shared/version.js';

interface JobView {
  id: number;
  url: string;
  kind: string;
  state: string;
  solverVersion: string;
  requestedBy: { id: number; name: string } | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  runMs: number | null;
  error: string | null;
}

const firstProject = async (a: Agent) => (await a.get('/api/projects')).body.projects[0].id as number;

/** Quarry Creek widened to twelve girders at 8 ft, 30° skew: a refined run of about a second. */
function twelveGirderDeck() {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.girders = { kind: 'uniform', count: 12, spacing: 8 };
  us.supports = [{ skew: 30 }, { skew: 30 }];
  return deckFromDisplay(us as never, 'US');
}

async function newVersion(a: Agent, message: string): Promise<{ deckId: number; versionId: number }> {
  const created = await send.post(a, `/api/projects/${await firstProject(a)}/decks`, { deck: quarryCreekDeck(), message });
  expect(created.status).toBe(201);
  return { deckId: created.body.deck.id, versionId: created.body.version.id };
}

describe('compute jobs as records', () => {
  let ctx: WorkflowContext;
  let designer: Agent;
  let reviewer: Agent;

  beforeAll(async () => {
    ctx = await makeWorkflowApp();
    designer = await signIn(ctx.app, demo.designer);
    reviewer = await signIn(ctx.app, demo.reviewer);
  });
  afterAll(() => ctx.close());

  it('records the refined run (asked for by the reviewer) and the package (by the designer), done with their timings', async () => {
    const { deckId, versionId } = await newVersion(designer, 'for the job records');
    const round = await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(ctx, demo.reviewer) });
    expect((await reviewer.get(`/api/reviews/${round.body.review.id}`)).status).toBe(200);
    expect((await designer.get(`/api/reports/decks/${deckId}/versions/1/package.pdf`)).status).toBe(200);
    const res = await designer.get(`/api/decks/${deckId}/versions/1/jobs`);
    expect(res.status).toBe(200);
    const jobs = res.body.jobs as JobView[];
    // newest first; the package reused the stored refined result (no second refined job)
    expect(jobs.map((j) => [j.kind, j.state])).toEqual([
      ['package', 'done'],
      ['refined', 'done'],
    ]);
    const [pkg, refined] = jobs;
    expect(refined.requestedBy).toEqual({ id: userId(ctx, demo.reviewer), name: expect.any(String) });
    expect(pkg.requestedBy?.id).toBe(userId(ctx, demo.designer));
    for (const j of jobs) {
      expect(j.solverVersion).toBe(SOLVER_VERSION);
      expect(j.error).toBeNull();
      expect(j.runMs).toBeGreaterThan(0);
      expect(Date.parse(j.startedAt!)).toBeGreaterThanOrEqual(Date.parse(j.createdAt));
      expect(Date.parse(j.finishedAt!)).toBeGreaterThanOrEqual(Date.parse(j.startedAt!));
    }
  });

  it('a restart marks the jobs a stopped server left queued or running as failed, with the reason', async () => {
    const { deckId, versionId } = await newVersion(designer, 'interrupted');
    const left = ['queued', 'running'].map(
      (state) => ctx.db.insert(computeJobs).values({ kind: 'refined', versionId, requestedBy: null, state: state as 'queued' | 'running', solverVersion: SOLVER_VERSION }).returning().get().id,
    );
    const lines: string[] = [];
    // the server starts again on the same database
    createApp({ db: ctx.db, config: ctx.config, log: (l) => lines.push(l), refinedPool: ctx.refinedPool, packagePool: ctx.packagePool });
    for (const id of left) {
      const row = ctx.db.select().from(computeJobs).where(eq(computeJobs.id, id)).get()!;
      expect(row.state).toBe('failed');
      expect(row.error).toBe(INTERRUPTED);
      expect(row.finishedAt).not.toBeNull();
    }
    expect(lines.some((l) => l.includes('2 compute job(s) left unfinished'))).toBe(true);
    const view = (await designer.get(`/api/decks/${deckId}/versions/1/jobs`)).body.jobs as JobView[];
    expect(view.map((j) => j.state)).toEqual(['failed', 'failed']);
    expect(view[0].error).toContain('The server stopped before this job finished');
  });

  it('a client that prefers to poll gets the round at once with 202 and the job to follow, then the summary', async () => {
    const { versionId } = await newVersion(designer, 'polled');
    const round = await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(ctx, demo.reviewer) });
    const url = `/api/reviews/${round.body.review.id}`;
    const first = await reviewer.get(url).set('Prefer', 'respond-async');
    expect(first.status).toBe(202);
    expect(first.body.summary).toBeNull();
    expect(first.body.review.id).toBe(round.body.review.id);
    expect(['queued', 'running']).toContain(first.body.job.state);
    expect(first.body.job.kind).toBe('refined');
    expect(first.headers.location).toBe(`/api/jobs/${first.body.job.id}`);
    // a second poller joins the same job
    const again = await designer.get(url).set('Prefer', 'respond-async');
    expect(again.status).toBe(202);
    expect(again.body.job.id).toBe(first.body.job.id);
    let job = first.body.job as JobView;
    const end = Date.now() + 60_000;
    while (job.state === 'queued' || job.state === 'running') {
      if (Date.now() > end) throw new Error('the refined job never ended');
      await new Promise((r) => setTimeout(r, 50));
      const res = await reviewer.get(first.headers.location);
      expect(res.status).toBe(200);
      job = res.body.job;
    }
    expect(job.state).toBe('done');
    // the result is stored: the same request is answered in full
    const done = await reviewer.get(url).set('Prefer', 'respond-async');
    expect(done.status).toBe(200);
    expect(done.body.summary.refined.available).toBe(true);
    // without the preference the server waits, as before (and the job is not run twice)
    expect((await reviewer.get(url)).status).toBe(200);
    const jobs = (await designer.get(`/api/decks/${round.body.review.deck.id}/versions/1/jobs`)).body.jobs as JobView[];
    expect(jobs.filter((j) => j.kind === 'refined')).toHaveLength(1);
  });

  it('another firm cannot read a version\'s jobs; a version that does not exist is 404', async () => {
    const { deckId } = await newVersion(designer, 'private');
    const outsider = await otherFirm(ctx);
    expect((await outsider.get(`/api/decks/${deckId}/versions/1/jobs`)).status).toBe(404);
    await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
    const [job] = (await designer.get(`/api/decks/${deckId}/versions/1/jobs`)).body.jobs as JobView[];
    expect((await designer.get(`/api/jobs/${job.id}`)).body.job).toEqual(job);
    expect((await outsider.get(`/api/jobs/${job.id}`)).status).toBe(404);
    const missing = await designer.get(`/api/decks/${deckId}/versions/9/jobs`);
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toContain('version 9');
  });
});

describe('a running refined job says where it is', () => {
  it('shows the phase and the factors found so far while a worker runs it', async () => {
    const c = await makeWorkflowApp();
    try {
      const designer = await signIn(c.app, demo.designer);
      const created = await send.post(designer, `/api/projects/${await firstProject(designer)}/decks`, { deck: twelveGirderDeck(), message: 'twelve girders' });
      expect(created.status).toBe(201);
      const round = await send.post(designer, '/api/reviews', { versionId: created.body.version.id, reviewerId: userId(c, demo.reviewer) });
      const first = await designer.get(`/api/reviews/${round.body.review.id}`).set('Prefer', 'respond-async');
      expect(first.status).toBe(202);
      const seen: { phase: string; done: number; total: number }[] = [];
      let state = first.body.job.state as string;
      const end = Date.now() + 60_000;
      while (state === 'queued' || state === 'running') {
        if (Date.now() > end) throw new Error('the refined job never ended');
        const res = await designer.get(first.headers.location);
        state = res.body.job.state;
        if (res.body.job.progress) seen.push(res.body.job.progress);
        await new Promise((r) => setTimeout(r, 10));
      }
      expect(state).toBe('done');
      const search = seen.filter((p) => p.phase === 'search');
      expect(search.length).toBeGreaterThan(0);
      for (const p of search) {
        expect(p.done).toBeGreaterThanOrEqual(0);
        expect(p.done).toBeLessThan(p.total);
      }
      // counts never go back within the search
      search.forEach((p, i) => i > 0 && expect(p.done).toBeGreaterThanOrEqual(search[i - 1].done));
      // a finished job carries no progress
      const jobs = (await designer.get(`/api/decks/${created.body.deck.id}/versions/1/jobs`)).body.jobs as (JobView & { progress: unknown })[];
      expect(jobs[0].progress).toBeNull();
    } finally {
      await c.close();
    }
  });
});

describe('a run the pool refuses now', () => {
  it('a polling client still gets the round, with the refusal where the summary would be', async () => {
    const c = await makeWorkflowApp({ refinedThreads: 1, refinedJobsPerUser: 1 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const big = await send.post(designer, `/api/projects/${await firstProject(designer)}/decks`, { deck: twelveGirderDeck(), message: 'twelve girders' });
      const { versionId } = await newVersion(designer, 'second deck');
      const round = await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(c, demo.reviewer) });
      // the designer's one allowed run is busy with the twelve-girder deck
      const running = designer.get(`/api/reports/decks/${big.body.deck.id}/versions/1/factors.csv`).then((r) => r);
      const end = Date.now() + 30_000;
      while (c.refinedPool.stats().jobs === 0) {
        if (Date.now() > end) throw new Error('the first job never reached the pool');
        await new Promise((r) => setTimeout(r, 2));
      }
      const res = await designer.get(`/api/reviews/${round.body.review.id}`).set('Prefer', 'respond-async');
      expect(res.status).toBe(200);
      expect(res.body.review.id).toBe(round.body.review.id);
      expect(res.body.summary).toBeNull();
      expect(res.body.refusal.code).toBe('refined_user_limit');
      expect(res.body.refusal.message).toContain('the most one user may have at once on this server (1)');
      expect(res.body.refusal.retryAfterSeconds).toBeGreaterThanOrEqual(1);
      // a client that waits is told with the status, as before
      expect((await designer.get(`/api/reviews/${round.body.review.id}`)).status).toBe(429);
      expect((await running).status).toBe(200);
    } finally {
      await c.close();
    }
  });
});

describe('a failed job keeps its reason', () => {
  it('a refined run stopped by the time limit is recorded failed with the message its requester got', async () => {
    // a limit of 1 ms: every refined run is stopped as soon as a worker starts it
    const c = await makeWorkflowApp({ refinedJobMs: 1 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const { deckId } = await newVersion(designer, 'too slow');
      const res = await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`);
      expect(res.status).toBe(503);
      const jobs = (await designer.get(`/api/decks/${deckId}/versions/1/jobs`)).body.jobs as JobView[];
      expect(jobs).toHaveLength(1);
      expect(jobs[0]).toMatchObject({ kind: 'refined', state: 'failed', error: res.body.error.message });
      expect(jobs[0].error).toContain('ran longer than this server\'s limit');
      expect(jobs[0].startedAt).not.toBeNull();
    } finally {
      await c.close();
    }
  });
});

/** Twenty girders at 8 ft over two continuous 110 ft spans at 30° skew: a refined run of several seconds, long enough to be cancelled. */
function twentyGirderDeck() {
  const us = structuredClone(quarryCreekUs) as unknown as Record<string, unknown>;
  us.girders = { kind: 'uniform', count: 20, spacing: 8 };
  us.spans = [{ length: 110 }, { length: 110 }];
  us.continuous = true;
  us.supports = [{ skew: 30 }, { skew: 30 }, { skew: 30 }];
  return deckFromDisplay(us as never, 'US');
}

async function untilState(a: Agent, url: string, wanted: (s: string) => boolean): Promise<JobView> {
  const end = Date.now() + 60_000;
  for (;;) {
    const job = (await a.get(url)).body.job as JobView;
    if (wanted(job.state)) return job;
    if (Date.now() > end) throw new Error(`job ${job.id} stayed ${job.state}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

describe('cancelling a refined job', () => {
  it('the user who asked stops a running and a queued job; waiting requests are told who cancelled it; nothing is stored and asking again runs it anew', async () => {
    const c = await makeWorkflowApp({ refinedThreads: 1 });
    try {
      const designer = await signIn(c.app, demo.designer);
      const reviewer = await signIn(c.app, demo.reviewer);
      const project = await firstProject(designer);
      const heavy = await send.post(designer, `/api/projects/${project}/decks`, { deck: twentyGirderDeck(), message: 'twenty girders' });
      expect(heavy.status).toBe(201);
      const light = await newVersion(designer, 'queued behind it');
      const heavyPdf = `/api/reports/decks/${heavy.body.deck.id}/versions/1/package.pdf`;
      const lightCsv = `/api/reports/decks/${light.deckId}/versions/1/factors.csv`;

      // the package route answers at once with the refined job it waits for
      const first = await designer.get(heavyPdf).set('Prefer', 'respond-async');
      expect(first.status).toBe(202);
      expect(first.body.job.kind).toBe('refined');
      expect(first.headers.location).toBe(`/api/jobs/${first.body.job.id}`);
      const running = await untilState(designer, first.headers.location, (s) => s !== 'queued');
      expect(running.state).toBe('running');
      // a request that waits joins the same job
      const waiting = designer.get(`/api/reports/decks/${heavy.body.deck.id}/versions/1/envelopes.csv`).then((r) => r);
      // the one thread is busy: the next version's job waits in the queue
      const second = await designer.get(lightCsv).set('Prefer', 'respond-async');
      expect(second.status).toBe(202);
      expect(second.body.job.state).toBe('queued');

      // only the requester (or an administrator) may cancel
      const refused = await send.post(reviewer, `/api/jobs/${running.id}/cancel`, {});
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toContain('only the user who asked for job');

      const queuedCancel = await send.post(designer, `/api/jobs/${second.body.job.id}/cancel`, {});
      expect(queuedCancel.status).toBe(200);
      expect(queuedCancel.body.job.state).toBe('cancelled');
      expect(queuedCancel.body.job.error).toContain('cancelled by Dana Okonkwo before it started');
      const runningCancel = await send.post(designer, `/api/jobs/${running.id}/cancel`, {});
      expect(runningCancel.status).toBe(200);
      expect(runningCancel.body.job).toMatchObject({ state: 'cancelled' });
      expect(runningCancel.body.job.error).toContain('cancelled by Dana Okonkwo while it ran');
      expect(runningCancel.body.job.finishedAt).not.toBeNull();

      const told = await waiting;
      expect(told.status).toBe(409);
      expect(told.body.error.code).toBe('refined_cancelled');
      expect(told.body.error.message).toBe(runningCancel.body.job.error);
      // a finished job cannot be cancelled again
      const again = await send.post(designer, `/api/jobs/${running.id}/cancel`, {});
      expect(again.status).toBe(409);
      expect(again.body.error.code).toBe('job_finished');
      expect(again.body.error.message).toContain('is already cancelled');

      // nothing was stored: asking again starts a new job, which runs to the end
      const stored = ctxResults(c, [heavy.body.version.id, light.versionId]);
      expect(stored).toEqual([]);
      const anew = await designer.get(lightCsv).set('Prefer', 'respond-async');
      expect(anew.status).toBe(202);
      expect(anew.body.job.id).not.toBe(second.body.job.id);
      expect((await untilState(designer, anew.headers.location, (s) => s !== 'queued' && s !== 'running')).state).toBe('done');
      const csv = await designer.get(lightCsv).set('Prefer', 'respond-async');
      expect(csv.status).toBe(200);
      expect(csv.headers['content-type']).toContain('text/csv');
      const states = ((await designer.get(`/api/decks/${light.deckId}/versions/1/jobs`)).body.jobs as JobView[]).map((j) => j.state);
      expect(states).toEqual(['done', 'cancelled']);
      expect(c.refinedPool.stats()).toMatchObject({ cancelled: 2 });
    } finally {
      await c.close();
    }
  });
});

/** The versions among `versionIds` that have a grillage result stored. */
function ctxResults(c: WorkflowContext, versionIds: number[]): number[] {
  return c.db
    .select({ versionId: analysisResults.versionId })
    .from(analysisResults)
    .where(and(eq(analysisResults.method, 'grillage'), inArray(analysisResults.versionId, versionIds)))
    .all()
    .map((r) => r.versionId);
}
