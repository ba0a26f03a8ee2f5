/** A trainee cannot read the results of a deck version while an exercise on it is open for
 *  them: the version's stored results, the review round and its summary, the calculation
 *  package, the CSV tables and the comparison of versions are withheld (the deck inputs stay readable) until they submit;
 *  other readers and other versions are unaffected. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { addUser, makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let designer: Agent;
let instructor: Agent;
let trainee: Agent;
let otherTrainee: Agent;
/** A trainee who also reviews, so the review and report routes are open to them by role. */
let dual: Agent;
let deckId: number;
let reviewId: number;
let exerciseId: number;
let dualExerciseId: number;
const due = () => new Date(Date.now() + 7 * 86400_000).toISOString();
const question = { kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' }, tolerancePercent: 1 };

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  instructor = await signIn(ctx.app, demo.instructor);
  trainee = await signIn(ctx.app, demo.trainee);
  otherTrainee = (await addUser(ctx, 'other-trainee@larchmont-ridge.example', ['trainee'])).agent;
  const dualUser = await addUser(ctx, 'trainee-reviewer@larchmont-ridge.example', ['trainee', 'reviewer']);
  dual = dualUser.agent;
  const projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'exercise deck' });
  deckId = created.body.deck.id;
  const versionId = created.body.version.id;
  reviewId = (await send.post(designer, '/api/reviews', { versionId, reviewerId: userId(ctx, demo.reviewer) })).body.review.id;
  await send.post(designer, `/api/decks/${deckId}/versions`, { deck: { ...quarryCreekDeck(), overhangLeft: 1.2 }, message: 'a later layout' });
  const make = async (traineeIds: number[]) => {
    const res = await send.post(instructor, '/api/training/assignments', { ...question, versionId, dueAt: due(), traineeIds });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.assignment.id as number;
  };
  exerciseId = await make([userId(ctx, demo.trainee)]);
  dualExerciseId = await make([dualUser.id]);
});
afterAll(() => ctx.close());

const version1 = (a: Agent) => a.get(`/api/decks/${deckId}/versions/1?include=results`);
const reports = () => ['package.pdf', 'factors.csv', 'envelopes.csv'].map((f) => `/api/reports/decks/${deckId}/versions/1/${f}`);

describe('results withheld during an open exercise', () => {
  it('the exercise page gives the trainee the question, never the answer, before they submit', async () => {
    const res = await trainee.get(`/api/training/mine/${exerciseId}`);
    expect(res.status).toBe(200);
    expect(res.body.assignment.expected).toBeNull();
    expect(res.body.assignment.openedToAll).toBeNull();
  });

  it('the trainee reads the deck of the version but not its results, and is told why', async () => {
    // Asking for the results' data is refused outright (403 with the reason).
    const asked = await version1(trainee);
    expect(asked.status).toBe(403);
    expect(asked.body.error).toMatchObject({ code: 'results_withheld', details: [] });
    expect(asked.body.error.message).toMatch(/hidden until you submit/);
    expect(JSON.stringify(asked.body)).not.toMatch(/"factors"|"governing"/);
    // The version itself answers with its inputs and why its results are hidden.
    const res = await trainee.get(`/api/decks/${deckId}/versions/1`);
    expect(res.status).toBe(200);
    expect(res.body.version.deck.name).toBe(quarryCreekDeck().name);
    expect(res.body.version.results).toEqual([]);
    expect(res.body.version.resultsWithheld).toMatchObject({ reason: 'open-exercise', exercises: [{ id: exerciseId }] });
    expect(res.body.version.resultsWithheld.message).toMatch(/hidden until you submit/);
    expect(JSON.stringify(res.body)).not.toMatch(/"factors"|"governing"/);
  });

  it('other versions, other trainees and the designer still see the results', async () => {
    const later = await trainee.get(`/api/decks/${deckId}/versions/2`);
    expect(later.body.version.resultsWithheld).toBeNull();
    expect(later.body.version.results.map((r: { method: string }) => r.method)).toContain('code');
    for (const a of [otherTrainee, designer]) {
      const res = await version1(a);
      expect(res.body.version.resultsWithheld).toBeNull();
      expect(res.body.version.results.find((r: { method: string }) => r.method === 'code').data.factors.length).toBeGreaterThan(0);
    }
  });

  it('the comparison of versions withholds the version\'s factors from the trainee (403 results_withheld), not the other version\'s', async () => {
    const res = await trainee.get(`/api/decks/${deckId}/versions/1/factors`).set('Prefer', 'respond-async');
    expect(res.status).toBe(403);
    expect(res.body.error).toMatchObject({ code: 'results_withheld', details: [] });
    expect(JSON.stringify(res.body)).not.toMatch(/"rows"|"governing"/);
    const later = await trainee.get(`/api/decks/${deckId}/versions/2/factors`).set('Prefer', 'respond-async');
    expect([200, 202]).toContain(later.status);
    expect(later.body.factors.code.governing.length).toBeGreaterThan(0);
    expect((await otherTrainee.get(`/api/decks/${deckId}/versions/1/factors`).set('Prefer', 'respond-async')).body.factors.code.rows.length).toBeGreaterThan(0);
  });

  it('a trainee who also reviews gets 403 results_withheld from the review round and every report of that version', async () => {
    const review = await dual.get(`/api/reviews/${reviewId}`);
    expect(review.status).toBe(403);
    expect(review.body.error).toMatchObject({ code: 'results_withheld', details: [] });
    expect(review.body.error.message).toMatch(/hidden until you submit/);
    const reviewer = await signIn(ctx.app, demo.reviewer);
    expect((await reviewer.get(`/api/reviews/${reviewId}`)).status).toBe(200);
    for (const url of reports()) {
      const res = await dual.get(url);
      expect(res.status, url).toBe(403);
      expect(res.body.error.code, url).toBe('results_withheld');
      expect((await reviewer.get(url)).status, url).toBe(200);
    }
  });

  it('after submitting, the trainee sees the results everywhere', async () => {
    const sub = await send.post(trainee, `/api/training/mine/${exerciseId}/submissions`, { value: 0.7 });
    expect(sub.status).toBe(201);
    const res = await version1(trainee);
    expect(res.body.version.resultsWithheld).toBeNull();
    expect(res.body.version.results.map((r: { method: string }) => r.method)).toContain('code');
    expect((await trainee.get(`/api/decks/${deckId}/versions/1/factors`).set('Prefer', 'respond-async')).body.factors.code.rows.length).toBeGreaterThan(0);

    expect((await send.post(dual, `/api/training/mine/${dualExerciseId}/submissions`, { value: 0.7 })).status).toBe(201);
    expect((await dual.get(`/api/reviews/${reviewId}`)).status).toBe(200);
    for (const url of reports()) expect((await dual.get(url)).status, url).toBe(200);
  });
});

describe('an exercise opened to all', () => {
  let openId: number;
  let notSubmitted: Agent;
  beforeAll(async () => {
    const extra = await addUser(ctx, 'late-trainee@larchmont-ridge.example', ['trainee']);
    notSubmitted = extra.agent;
    const versionId = (await designer.get(`/api/decks/${deckId}/versions/1`)).body.version.id;
    const res = await send.post(instructor, '/api/training/assignments', { ...question, versionId, dueAt: due(), traineeIds: [extra.id] });
    openId = res.body.assignment.id;
    expect((await version1(notSubmitted)).status).toBe(403);
  });

  it('only an instructor opens it, and it stays open', async () => {
    expect((await send.patch(notSubmitted, `/api/training/assignments/${openId}`, { openToAll: true })).status).toBe(403);
    const bad = await send.patch(instructor, `/api/training/assignments/${openId}`, { openToAll: false });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error)).toMatch(/openToAll can only be true/);
    const res = await send.patch(instructor, `/api/training/assignments/${openId}`, { openToAll: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.assignment.openedToAll).toMatchObject({ by: { id: userId(ctx, demo.instructor) } });
    // Opening again changes nothing (the first opening is kept); the database refuses to close it.
    const again = await send.patch(instructor, `/api/training/assignments/${openId}`, { openToAll: true });
    expect(again.body.assignment.openedToAll.at).toBe(res.body.assignment.openedToAll.at);
    expect(() => ctx.db.$client.prepare('UPDATE assignments SET results_opened_at = NULL WHERE id = ?').run(openId)).toThrow(/stays open/);
  });

  it('shows the answer and the results to a trainee who has not submitted, and takes no more answers', async () => {
    const mine = await notSubmitted.get(`/api/training/mine/${openId}`);
    expect(mine.body.assignment.expected.value).toBeGreaterThan(0);
    const res = await version1(notSubmitted);
    expect(res.status).toBe(200);
    expect(res.body.version.resultsWithheld).toBeNull();
    const late = await send.post(notSubmitted, `/api/training/mine/${openId}/submissions`, { value: 0.7 });
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/opened this exercise to all/);
  });
});
