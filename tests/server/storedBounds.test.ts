/**
 * The other JSON the product stores from a request — review comment anchors, a trainee's
 * answer, placement and steps — is bounded by its request schema; the largest accepted value
 * of each is stored and read back unchanged through every route that shows it (API, in-process).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let versionId: number;
beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  const projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'for the bounds' });
  versionId = created.body.version.id;
});
afterAll(() => ctx.close());

describe('largest accepted stored values read back unchanged', () => {
  it('a review comment of 5000 characters with every anchor field', async () => {
    const reviewer = await signIn(ctx.app, demo.reviewer);
    const round = await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(ctx, demo.reviewer), note: 'n'.repeat(2000) });
    expect(round.status, JSON.stringify(round.body)).toBe(201);
    const reviewId = round.body.review?.id ?? round.body.id;
    const body = 'é'.repeat(5000);
    const anchor = { girder: 6, effect: 'fatigue-moment', method: 'interior-minimum', lanes: 'multiple' };
    const c = await send.post(reviewer, `/api/reviews/${reviewId}/comments`, { body, anchor });
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    expect((await send.post(reviewer, `/api/reviews/${reviewId}/comments`, { body: body + 'x', anchor })).status).toBe(400);
    expect((await send.post(reviewer, `/api/reviews/${reviewId}/comments`, { body: 'b', anchor: { ...anchor, extra: 1 } })).status).toBe(400);
    for (const who of [designer, reviewer]) {
      const got = await who.get(`/api/reviews/${reviewId}`);
      expect(got.status).toBe(200);
      const round2 = got.body.review ?? got.body;
      expect(round2.comments.map((x: { body: string; anchor: unknown }) => ({ body: x.body, anchor: x.anchor }))).toEqual([{ body, anchor }]);
    }
  });

  it('a submission with 40 full steps and 8 lanes', async () => {
    const instructor = await signIn(ctx.app, demo.instructor);
    const trainee = await signIn(ctx.app, demo.trainee);
    const made = await send.post(instructor, '/api/training/assignments', {
      kind: 'truck-position',
      versionId,
      params: { girder: 1, line: 'rigid-section' },
      tolerancePercent: 25,
      dueAt: new Date(Date.now() + 86400_000).toISOString(),
      traineeIds: [userId(ctx, demo.trainee)],
      instructions: 'i'.repeat(5000),
    });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const id = made.body.assignment.id;
    const steps = Array.from({ length: 40 }, (_, i) => ({ label: `${i}`.padEnd(200, 'l'), formula: 'f'.repeat(500), value: -1.2345678901234567e-300, note: 'n'.repeat(1000) }));
    const placement = { lanes: Array.from({ length: 8 }, (_, i) => ({ left: 1.2345678901234567 * i, wheelOffset: 0.6096000000000001 })) };
    const tooMany = await send.post(trainee, `/api/training/mine/${id}/submissions`, { value: 1, steps: [...steps, steps[0]], placement });
    expect(tooMany.status).toBe(400);
    const sub = await send.post(trainee, `/api/training/mine/${id}/submissions`, { value: 0.123456789012345, steps, placement });
    expect(sub.status, JSON.stringify(sub.body).slice(0, 300)).toBe(201);
    const mine = await trainee.get(`/api/training/mine/${id}`);
    const theirs = await instructor.get(`/api/training/assignments/${id}`);
    for (const view of [mine, theirs]) {
      expect(view.status).toBe(200);
      const s = (view.body.assignment ?? view.body).submissions[0];
      expect(s.steps).toEqual(steps);
      expect(s.placement).toEqual(placement);
      expect(s.value).toBe(0.123456789012345);
    }
  });
});
