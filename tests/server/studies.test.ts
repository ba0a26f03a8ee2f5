/** Parameter studies through the API: create, progress, stored points, cancel and resume, CSV, roles. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { computeCodeFactors } from '../../shared/lrfd/factors.js';
import { computeRefinedFactors } from '../../shared/grillage/refinedFactors.js';
import { assertDeck } from '../../shared/deck/schema.js';
import { summarizeRows, type PointSummary } from '../../shared/studies/pointResult.js';
import { studies } from '../../server/db/schema.js';
import { interruptStudies, type StudyRunner } from '../../server/compute/studyRunner.js';

let ctx: TestContext;
let designer: Agent;
let reviewer: Agent;
let trainee: Agent;
let projectId: number;
let deckId: number;

beforeAll(async () => {
  ctx = await makeTestApp();
  designer = await signIn(ctx.app, demo.designer);
  reviewer = await signIn(ctx.app, demo.reviewer);
  trainee = await signIn(ctx.app, demo.trainee);
  projectId = (await designer.get('/api/projects')).body.projects[0].id;
  deckId = (await designer.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', designer.csrf).send({ deck: quarryCreekDeck(), message: 'study base' })).body.deck.id;
});
afterAll(() => ctx.close());

const runner = () => ctx.app.locals.studyRunner as StudyRunner;
const create = (sweep: unknown, name = 'sweep') => designer.post(`/api/projects/${projectId}/studies`).set('X-CSRF-Token', designer.csrf).send({ name, deckId, versionNumber: 1, sweep });
async function finished(id: number) {
  await runner().settled(id);
  return (await designer.get(`/api/studies/${id}`)).body as { study: { state: string; pointsDone: number; pointsTotal: number }; points: { index: number; values: number[]; summary: PointSummary | null; error: string | null }[] };
}
async function pointDeck(id: number, index: number) {
  return (await designer.get(`/api/studies/${id}/points/${index + 1}/deck`)).body.deck;
}
function expectSameSummary(got: PointSummary, expected: PointSummary) {
  expect(Object.keys(got.values).sort()).toEqual(Object.keys(expected.values).sort());
  for (const [k, v] of Object.entries(expected.values)) {
    const g = got.values[k as keyof PointSummary['values']]!;
    expect(Math.abs(g.governing - v!.governing)).toBeLessThanOrEqual(1e-12);
    expect(Object.keys(g.byMethod).sort()).toEqual(Object.keys(v!.byMethod).sort());
    for (const [m, x] of Object.entries(v!.byMethod)) expect(Math.abs(g.byMethod[m as 'formula']! - x)).toBeLessThanOrEqual(1e-12);
  }
}

describe('a code-only sweep', () => {
  it('computes every point in the workers, and each equals a single-deck computation of its deck (to 1e-12)', async () => {
    const res = await create({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 45, step: 15 } }, { parameter: 'overhang', values: { kind: 'list', values: [0.6, 1.2] } }] });
    expect(res.status).toBe(201);
    expect(res.body.study.pointsTotal).toBe(8);
    const { study, points } = await finished(res.body.study.id);
    expect(study.state).toBe('done');
    expect(points).toHaveLength(8);
    for (const p of points) {
      const deck = await pointDeck(res.body.study.id, p.index);
      expect(deck.supports.map((s: { skew: number }) => s.skew)).toEqual([p.values[0], p.values[0]]);
      expect(deck.overhangLeft).toBe(p.values[1]);
      expectSameSummary(p.summary!, summarizeRows(computeCodeFactors(assertDeck(deck)).factors, null));
    }
  });

  it('a parameter that makes the deck invalid at some points: those carry the deck\'s own message, the others compute', async () => {
    const res = await create({ axes: [{ parameter: 'slabThickness', values: { kind: 'list', values: [0.2, 1.5, 0.22] } }] });
    const { study, points } = await finished(res.body.study.id);
    expect(study.state).toBe('done');
    expect(points.map((p) => p.error === null)).toEqual([true, false, true]);
    expect(points[1].error).toMatch(/slab\.thickness: slab thickness must be at most/);
    expect(points[1].summary).toBeNull();
  });

  it('CSV: every point with its inputs in the project\'s units, its factors and the caution', async () => {
    const units = (await designer.get(`/api/projects/${projectId}`)).body.project.units as 'US' | 'SI';
    const res = await create({ axes: [{ parameter: 'girderSpacing', values: { kind: 'list', values: [2.4384, 3.048] } }] });
    await finished(res.body.study.id);
    const csv = await reviewer.get(`/api/studies/${res.body.study.id}/study.csv`);
    expect(csv.status).toBe(200);
    const lines = csv.text.split('\r\n');
    expect(lines[0]).toMatch(new RegExp(`^point,girderSpacing_${units === 'US' ? 'ft' : 'm'},interior/moment/governing,`));
    const first = Number(lines[1].split(',')[1]);
    expect(first).toBeCloseTo(units === 'US' ? 8 : 2.4384, 9); // 2.4384 m = 8 ft exactly
    expect(csv.text).toMatch(/licensed engineer/);
  });
});

describe('bad input', () => {
  it('a range with no points is refused and says why', async () => {
    const res = await create({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 40, to: 10, step: 5 } }] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/sweep\.axes\.0\.values: parameter 1 \(skew of every support line\) has no points/);
  });

  it('more points than the firm\'s limit says the count and proposes a coarser step', async () => {
    const res = await create({ axes: [{ parameter: 'skew', values: { kind: 'range', from: 0, to: 60, step: 1 } }, { parameter: 'overhang', values: { kind: 'range', from: 0, to: 1.5, step: 0.01 } }] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/the study has 9,211 points, more than this firm's limit of 2,000: try a step of 2° for parameter 1 and a step of 0\.05 m/);
  });
});

describe('cancel and resume', () => {
  it('cancel mid-study keeps the finished points and marks it cancelled; resume computes only the rest', async () => {
    const res = await create({ axes: [{ parameter: 'skew', values: { kind: 'list', values: [0, 10, 20, 30, 40, 50] } }], grillage: 'all' }, 'grillage');
    const id = res.body.study.id as number;
    let done = 0;
    for (let i = 0; i < 600 && done < 1; i++) {
      await new Promise((r) => setTimeout(r, 100));
      done = (await designer.get(`/api/studies/${id}`)).body.study.pointsDone;
    }
    expect(done).toBeGreaterThanOrEqual(1);
    const cancel = await designer.post(`/api/studies/${id}/cancel`).set('X-CSRF-Token', designer.csrf);
    expect(cancel.status).toBe(200);
    expect(cancel.body.study.state).toBe('cancelled');
    const after = await finished(id);
    expect(after.study.state).toBe('cancelled');
    expect(after.points.length).toBeGreaterThanOrEqual(1);
    expect(after.points.length).toBeLessThan(6);
    const kept = after.points.map((p) => p.index);
    // the grillage of a stored point equals a single-deck refined run of its deck (to 1e-12)
    const p0 = after.points[0];
    const deck = assertDeck(await pointDeck(id, p0.index));
    expectSameSummary(p0.summary!, summarizeRows(computeCodeFactors(deck).factors, computeRefinedFactors(deck).rows));
    expect(p0.summary!.values['interior/moment']!.byMethod.grillage).toBeGreaterThan(0);

    const resume = await designer.post(`/api/studies/${id}/resume`).set('X-CSRF-Token', designer.csrf);
    expect(resume.status).toBe(200);
    const end = await finished(id);
    expect(end.study.state).toBe('done');
    expect(end.points.map((p) => p.index)).toEqual([0, 1, 2, 3, 4, 5]);
    for (const k of kept) expect(end.points[k].summary).toEqual(after.points.find((p) => p.index === k)!.summary);
  }, 120_000);

  it('a study a stopped server left running becomes interrupted at start-up and can be resumed', async () => {
    const res = await create({ axes: [{ parameter: 'overhang', values: { kind: 'list', values: [0.9, 1.1] } }] });
    await finished(res.body.study.id);
    ctx.db.update(studies).set({ state: 'running' }).where(eq(studies.id, res.body.study.id)).run();
    expect(interruptStudies(ctx.db)).toBe(1);
    expect((await designer.get(`/api/studies/${res.body.study.id}`)).body.study.state).toBe('interrupted');
    await designer.post(`/api/studies/${res.body.study.id}/resume`).set('X-CSRF-Token', designer.csrf);
    expect((await finished(res.body.study.id)).study.state).toBe('done');
  });
});

describe('roles', () => {
  it('reviewers read studies but cannot start one; trainees do not see them', async () => {
    expect((await reviewer.get(`/api/projects/${projectId}/studies`)).status).toBe(200);
    expect((await reviewer.post(`/api/projects/${projectId}/studies`).set('X-CSRF-Token', reviewer.csrf).send({ name: 'x', deckId, versionNumber: 1, sweep: {} })).status).toBe(403);
    expect((await trainee.get(`/api/projects/${projectId}/studies`)).status).toBe(403);
    const list = (await designer.get(`/api/projects/${projectId}/studies`)).body.studies;
    expect((await trainee.get(`/api/studies/${list[0].id}`)).status).toBe(403);
  });
});
