/** The calculation-package pool through the API: a PDF is laid out on a worker thread while
 *  the request thread keeps answering, and a full pool answers 503 with Retry-After and a
 *  reason instead of queueing without end (the server keeps serving). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

let ctx: WorkflowContext;
let designer: Agent;
let deckId: number;

beforeAll(async () => {
  // one thread and no waiting room: a second package while one is laid out is refused
  ctx = await makeWorkflowApp({ packageThreads: 1, packageQueue: 0 });
  designer = await signIn(ctx.app, demo.designer);
  const projectId = (await designer.get('/api/projects')).body.projects[0].id as number;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'for the package pool' });
  deckId = created.body.deck.id;
  // the version's refined result is stored first, so the packages below only lay out
  expect((await designer.get(`/api/reports/decks/${deckId}/versions/1/factors.csv`)).status).toBe(200);
});
afterAll(() => ctx.close());

describe('the calculation-package pool', () => {
  it('answers other requests while a package is laid out, and refuses a second one with Retry-After', async () => {
    const url = `/api/reports/decks/${deckId}/versions/1/package.pdf`;
    // (a supertest request is sent when awaited: `.then` sends it now)
    const first = designer.get(url).buffer(true).then((r) => r);
    // wait until the first package is in the pool (its data gathered, its layout begun)
    const end = Date.now() + 30_000;
    while (ctx.packagePool.stats().inFlight === 0) {
      if (Date.now() > end) throw new Error('the first package never reached the pool');
      await new Promise((r) => setTimeout(r, 2));
    }
    const [second, me] = await Promise.all([designer.get(url), designer.get('/api/auth/me')]);
    expect(me.status).toBe(200);
    expect(second.status).toBe(503);
    expect(second.body.error.code).toBe('package_busy');
    expect(second.body.error.message).toMatch(/laying out as many calculation packages as it can \(1 at once\)\. Try again in \d+ s\./);
    expect(Number(second.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    const done = await first;
    expect(done.status).toBe(200);
    expect(done.headers['content-type']).toBe('application/pdf');
    expect(ctx.packagePool.stats()).toMatchObject({ jobs: 1, completed: 1, refusedBusy: 1, inFlight: 0 });
    // once it is done, the next package is accepted
    expect((await designer.get(url)).status).toBe(200);
    expect(ctx.packagePool.stats()).toMatchObject({ jobs: 2, completed: 2 });
  });
});
