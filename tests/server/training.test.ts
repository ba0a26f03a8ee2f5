/** Training: exercises from deck versions, assignment by e-mail, grading against the product's
 *  own results with the instructor's tolerance, refusals and firm isolation. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { assignments, submissions } from '../../server/db/schema.js';
import { fromUs } from '../../shared/units.js';
import { quarryCreekDeck, quarryCreekUs } from '../fixtures/decks.js';
import { gradeHeadline, oneAnswerWords } from '../../shared/training/answerWords.js';
import { demo, signIn, type Agent } from './helpers.js';
import { addUser, makeWorkflowApp, otherFirm, outbox, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let instructor: Agent;
let trainee: Agent;
let trainee2: Agent;
let designer: Agent;
let outsider: Agent;
let versionId: number;
let codeRows: { id: string; value: number; girderKind: string; effect: string; lanes: string; method: string; adopted: boolean }[];
const due = () => new Date(Date.now() + 7 * 86400_000).toISOString();

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  instructor = await signIn(ctx.app, demo.instructor);
  trainee = await signIn(ctx.app, demo.trainee);
  designer = await signIn(ctx.app, demo.designer);
  trainee2 = (await addUser(ctx, 'second-trainee@larchmont-ridge.example', ['trainee'])).agent;
  outsider = await otherFirm(ctx);
  const projectId = (await designer.get('/api/projects')).body.projects[0].id;
  const created = await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'for training' });
  versionId = created.body.version.id;
  const v = await designer.get(`/api/decks/${created.body.deck.id}/versions/1?include=results`);
  codeRows = v.body.version.results.find((r: { method: string }) => r.method === 'code').data.factors;
});
afterAll(() => ctx.close());

const traineeId = () => userId(ctx, demo.trainee);

async function makeExercise(body: Record<string, unknown>) {
  const res = await send.post(instructor, '/api/training/assignments', { versionId, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()], ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.assignment;
}

// Hand calculation of the exterior girder's lever-rule factor, one lane, for the fixture deck
// (AASHTO LRFD Art. 4.6.2.2.1 lever rule; Art. 3.6.1.3.1 wheel 2 ft from the curb face;
// Table 3.6.1.1.2-1 m = 1.20; statics of the slab hinged over girder 2):
// de = 3.5 − 1.5 = 2.0 ft, so the outer wheel sits over girder 1 (ordinate 1.0); the inner wheel
// is 6 ft further, 9.6667 − 6 = 3.6667 ft from girder 2 (ordinate 3.6667 / 9.6667).
const S = quarryCreekUs.girders.spacing;
const LEVER_ONE_LANE = 1.2 * 0.5 * (1 + (S - 6) / S);

describe('factor exercises', () => {
  let exercise: { id: number; expected: { value: number; rowId: string; trace: { value: number }[] } };

  it('an instructor makes an exercise from a version; the trainee is e-mailed', async () => {
    exercise = await makeExercise({ kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' }, instructions: 'Use the rigid-section check too.' });
    const adopted = codeRows.find((r) => r.girderKind === 'exterior' && r.effect === 'moment' && r.lanes === 'multiple' && r.adopted)!;
    expect(exercise.expected.rowId).toBe(adopted.id);
    expect(exercise.expected.value).toBe(adopted.value);
    expect((exercise as unknown as { question: string }).question).toBe('the governing moment factor of the exterior girder with two or more loaded lanes, in span 1, skew correction included');
    const mail = (await outbox(ctx)).filter((m) => m.kind === 'assignment-given');
    expect(mail).toHaveLength(1);
    expect(mail[0].toAddresses).toBe(demo.trainee);
    expect(mail[0].textBody).toContain(`http://deckshare.test/training/${exercise.id}`);
  });

  it('the trainee sees the question but not the answer before submitting', async () => {
    const list = await trainee.get('/api/training/mine');
    expect(list.status).toBe(200);
    expect(list.body.assignments.map((a: { id: number; status: string; expected: unknown }) => [a.id, a.status, a.expected])).toEqual([[exercise.id, 'to do', null]]);
    const one = await trainee.get(`/api/training/mine/${exercise.id}`);
    expect(one.body.assignment.expected).toBeNull();
    expect(JSON.stringify(one.body)).not.toContain(String(exercise.expected.value));
  });

  it('grades a value within tolerance, matches the trainee’s steps to the trace, e-mails the grade, once only', async () => {
    const v = exercise.expected.value;
    const steps = [{ label: 'my rigid-section value', value: v * 1.004 }];
    const res = await send.post(trainee, `/api/training/mine/${exercise.id}/submissions`, { value: v * 1.005, steps });
    expect(res.status).toBe(201);
    expect(res.body.submission).toMatchObject({ passed: true, late: false, attempt: 1 });
    expect(res.body.submission.grading.checks[0]).toMatchObject({ name: 'value', expected: v, passed: true });
    expect(res.body.submission.grading.checks[0].differencePercent).toBeRelativelyClose(0.5, 1e-6);
    const last = res.body.submission.grading.stepMatches.at(-1);
    expect(last).toMatchObject({ productValue: v, traineeStep: 0 });
    expect(res.body.assignment.expected.trace.length).toBe(exercise.expected.trace.length);

    const graded = (await outbox(ctx)).filter((m) => m.kind === 'submission-graded');
    expect(graded).toHaveLength(1);
    expect(graded[0].subject).toBe(`${gradeHeadline(true)}: ${(exercise as unknown as { title: string }).title}`);
    const again = await send.post(trainee, `/api/training/mine/${exercise.id}/submissions`, { value: v });
    expect(again.status).toBe(409);
    expect(() => ctx.db.update(submissions).set({ passed: false }).run()).toThrow(/cannot be changed/);
  });

  it('grades a value outside tolerance as not passed; the instructor sees every submission and grade', async () => {
    const added = await send.patch(instructor, `/api/training/assignments/${exercise.id}`, { addTraineeIds: [userId(ctx, 'second-trainee@larchmont-ridge.example')] });
    expect(added.status).toBe(200);
    expect((await outbox(ctx)).filter((m) => m.kind === 'assignment-given').map((m) => m.toAddresses)).toContain('second-trainee@larchmont-ridge.example');
    const res = await send.post(trainee2, `/api/training/mine/${exercise.id}/submissions`, { value: exercise.expected.value * 0.9, steps: [] });
    expect(res.body.submission.passed).toBe(false);
    expect(res.body.submission.grading.checks[0].differencePercent).toBeRelativelyClose(10, 1e-6);
    expect(res.body.submission.grading.stepMatches.at(-1).traineeStep).toBeNull();
    expect((await outbox(ctx)).filter((m) => m.kind === 'submission-graded').at(-1)!.subject).toMatch(/^Outside the tolerance: /);

    const view = await instructor.get(`/api/training/assignments/${exercise.id}`);
    expect(view.body.assignment.submissions.map((s: { trainee: { name: string }; passed: boolean }) => [s.trainee.name, s.passed])).toEqual([
      ['Theo Brandt', true],
      ['second-trainee', false],
    ]);
    expect(view.body.assignment.trainees.map((t: { status: string }) => t.status).sort()).toEqual(['not passed', 'passed']);
    const list = await instructor.get('/api/training/assignments');
    expect(list.body.assignments[0]).toMatchObject({ id: exercise.id, traineeCount: 2, submittedCount: 2, passedCount: 1 });
  });

  it('the lever-rule shear factor matches the hand calculation, skew correction included', async () => {
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule' } });
    // Skew correction for shear at the obtuse corner, AASHTO LRFD Table 4.6.2.2.3c-1 (type k):
    // 1.0 + 0.20 (12.0 L ts³ / Kg)^0.3 tan θ, with Kg = n (I + A eg²) (Eq. 4.6.2.2.1-1),
    // n = Eg / Ed = √(f'c,girder / f'c,deck) for equal unit weights (Art. 5.4.2.4, pre-2015 Ec),
    // eg = centroid depth + ts / 2 (no haunch). Hand calculation from the fixture's inputs.
    const u = quarryCreekUs;
    const n = Math.sqrt(u.materials.girder.fc / u.materials.deck.fc);
    const eg = u.section.centroidFromTop + u.slab.thickness / 2;
    const Kg = n * (u.section.inertia + u.section.area * eg * eg);
    const L = u.spans[0].length;
    const skew = 1 + 0.2 * ((12 * L * u.slab.thickness ** 3) / Kg) ** 0.3 * Math.tan((u.supports[0].skew * Math.PI) / 180);
    expect(skew).toBeRelativelyClose(1.0516, 1e-4);
    expect(ex.expected.value).toBeRelativelyClose(LEVER_ONE_LANE * skew, 1e-6);
  });

  it('the e-mail says about answers what the page says: one answer, graded at once, final — no attempts, no "not yet"', async () => {
    // The page shows oneAnswerWords('to answer') above the submit button and oneAnswerWords('graded')
    // under the grade (src/views/TrainingExerciseView.vue); the e-mail carries the second and the grade's headline.
    expect(oneAnswerWords('to answer')).toMatch(/^You submit once: /);
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'interior', effect: 'shear', lanes: 'one', method: 'formula', skew: 'before' } });
    const res = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, { value: ex.expected.value * 1.2 });
    expect(res.body.submission.passed).toBe(false);
    const mail = (await outbox(ctx)).filter((m) => m.kind === 'submission-graded').at(-1)!;
    expect(mail.subject).toBe(`${gradeHeadline(false)}: ${ex.title}`);
    expect(mail.textBody).toContain(oneAnswerWords('graded'));
    expect(mail.textBody).toContain(`has been graded: ${gradeHeadline(false).toLowerCase()}.`);
    for (const text of [mail.subject, mail.textBody]) {
      expect(text).not.toMatch(/attempt/i);
      expect(text).not.toMatch(/not yet|try again|resubmit/i);
    }
    // And indeed a second answer is refused.
    expect((await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, { value: ex.expected.value })).status).toBe(409);
  });

  it('the user’s case: the lever-rule shear factor asked before the skew correction takes the literal 0.828 and never names L', async () => {
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule', skew: 'before' } });
    expect(ex.question).toBe('the lever-rule shear factor of the exterior girder (girder 1) with one loaded lane, in span 1, before the skew correction');
    // Without a title the exercise is titled by its question.
    expect(ex.title).toBe('The lever-rule shear factor of the exterior girder (girder 1) with one loaded lane, in span 1, before the skew correction');
    const row = codeRows.find((r) => r.id === 'exterior/shear/span1/one/lever-rule/g1')! as (typeof codeRows)[number] & { baseValue: number };
    expect(ex.expected.value).toBe(row.baseValue);
    expect(ex.expected.value).toBeRelativelyClose(LEVER_ONE_LANE, 1e-6);
    const res = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, { value: 0.828, steps: [{ label: 'inner wheel ordinate', value: 0.38 }] });
    expect(res.body.submission.passed).toBe(true);
    const labels = res.body.submission.grading.stepMatches.map((m: { label: string }) => m.label);
    expect(labels).toEqual(['Lever rule, girder 1, 1 loaded lane']);
    expect(res.body.submission.grading.summary).not.toMatch(/L for shear/);
  });

  it('refuses a governing value before the skew correction, naming params.skew', async () => {
    const res = await send.post(instructor, '/api/training/assignments', { versionId, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()], kind: 'factor', params: { girder: 'exterior', effect: 'shear', lanes: 'governing', method: 'governing', skew: 'before' } });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('body.params.skew');
    const bad = await send.post(instructor, '/api/training/assignments', { versionId, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()], kind: 'factor', params: { girder: 'exterior', effect: 'shear', lanes: 'one', method: 'lever-rule', skew: 'after' } });
    expect(bad.body.error.details[0]).toEqual({ path: 'body.params.skew', message: 'skew must be "with" or "before"' });
  });

  it('marks a submission after the due date as late', async () => {
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'interior', effect: 'moment', lanes: 'multiple', method: 'formula' } });
    ctx.db.update(assignments).set({ dueAt: new Date(Date.now() - 60_000).toISOString() }).where(eq(assignments.id, ex.id)).run();
    const res = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, { value: ex.expected.value });
    expect(res.body.submission).toMatchObject({ late: true, passed: true });
  });
});

describe('truck-position exercises', () => {
  it('the governing lever-rule position equals the hand calculation and the code engine', async () => {
    const ex = await makeExercise({ kind: 'truck-position', params: { girder: 1, line: 'lever-rule', laneCounts: [1] } });
    expect(ex.expected.value).toBeRelativelyClose(LEVER_ONE_LANE, 1e-9);
    const code = codeRows.find((r) => r.id === 'exterior/moment/span1/one/lever-rule/g1')!;
    expect(ex.expected.value).toBeRelativelyClose(code.value, 1e-9);
    // The governing left wheel line sits 2 ft inside the left curb face (Art. 3.6.1.3.1).
    const curbLeft = ex.roadway.curbLeft;
    expect(ex.expected.wheelLines[0][0] - curbLeft).toBeRelativelyClose(fromUs.ft(2), 1e-9);

    const good = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, {
      value: 0.828,
      placement: { lanes: [{ left: curbLeft, wheelOffset: fromUs.ft(2) }] },
      steps: [{ label: 'outer wheel over girder 1', value: 1 }],
    });
    expect(good.status).toBe(201);
    expect(good.body.submission.passed).toBe(true);
    expect(good.body.submission.grading.checks.map((c: { name: string }) => c.name)).toEqual(['value', 'placement']);
    // The final value answers the last step of the trace (index = number of steps given).
    expect(good.body.submission.grading.stepMatches.at(-1).traineeStep).toBe(1);
  });

  it('a placement that breaks the 2 ft rule fails with the rule named; a mirrored girder gives the same value', async () => {
    const ex = await makeExercise({ kind: 'truck-position', params: { girder: 6, line: 'lever-rule', laneCounts: [1] } });
    // Symmetry: the deck is symmetric, so girder 6 has girder 1's value.
    expect(ex.expected.value).toBeRelativelyClose(LEVER_ONE_LANE, 1e-9);
    const res = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, {
      value: 0.83,
      placement: { lanes: [{ left: ex.roadway.curbRight - ex.roadway.laneWidth, wheelOffset: ex.roadway.laneWidth - fromUs.ft(6) - fromUs.ft(1) }] },
    });
    expect(res.status).toBe(201);
    expect(res.body.submission.passed).toBe(false);
    expect(res.body.submission.grading.placementViolations[0].message).toContain('it must be at least 2.00 ft (Art. 3.6.1.3.1)');
  });

  it('asks for the placement', async () => {
    const ex = await makeExercise({ kind: 'truck-position', params: { girder: 1, line: 'rigid-section' } });
    const res = await send.post(trainee, `/api/training/mine/${ex.id}/submissions`, { value: ex.expected.value });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'body.placement', message: 'this exercise asks for the truck position: give the placement' }]);
  });
});

describe('refusals', () => {
  it('roles: trainees cannot make exercises, instructors cannot submit, designers see neither', async () => {
    const body = { kind: 'factor', versionId, params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' }, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()] };
    expect((await send.post(trainee, '/api/training/assignments', body)).status).toBe(403);
    expect((await designer.get('/api/training/assignments')).status).toBe(403);
    expect((await designer.get('/api/training/mine')).status).toBe(403);
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' } });
    expect((await send.post(instructor, `/api/training/mine/${ex.id}/submissions`, { value: 1 })).status).toBe(403);
    // A trainee not assigned gets 404.
    expect((await trainee2.get(`/api/training/mine/${ex.id}`)).status).toBe(404);
    expect((await send.post(trainee2, `/api/training/mine/${ex.id}/submissions`, { value: 1 })).status).toBe(404);
  });

  it('bad questions, trainees, due dates and tolerances are refused naming the field', async () => {
    const base = { versionId, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()] };
    const none = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'factor', params: { girder: 'interior', effect: 'moment', lanes: 'multiple', method: 'lever-rule' } });
    expect(none.status).toBe(400);
    expect(none.body.error.details[0].path).toBe('body.params');
    expect(none.body.error.details[0].message).toContain('the code does not use that method');
    const where = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'factor', params: { girder: 'interior', effect: 'moment', lanes: 'one', method: 'governing', location: 'span4' } });
    expect(where.body.error.details[0].message).toBe('no moment factor at span4: choose one of span1');
    const girder = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'truck-position', params: { girder: 9, line: 'lever-rule' } });
    expect(girder.body.error.details).toEqual([{ path: 'body.params.girder', message: 'the deck has 6 girders (1 to 6)' }]);
    const who = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' }, traineeIds: [userId(ctx, demo.designer)] });
    expect(who.body.error.details).toEqual([{ path: 'body.traineeIds.0', message: 'Dana Okonkwo does not hold the trainee role' }]);
    const past = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' }, dueAt: '2020-01-01T00:00:00Z' });
    expect(past.body.error.details).toEqual([{ path: 'body.dueAt', message: 'the due date must be in the future' }]);
    const tol = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'factor', params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' }, tolerancePercent: 0 });
    expect(tol.body.error.details[0]).toEqual({ path: 'body.tolerancePercent', message: 'tolerancePercent must be greater than 0' });
    const kind = await send.post(instructor, '/api/training/assignments', { ...base, kind: 'essay', params: {} });
    expect(kind.status).toBe(400);
    const value = await send.post(trainee, `/api/training/mine/1/submissions`, { value: 'about 0.8' });
    expect(value.body.error.details[0]).toEqual({ path: 'body.value', message: 'value must be a number' });
  });

  it('another firm gets 404', async () => {
    const ex = await makeExercise({ kind: 'factor', params: { girder: 'interior', effect: 'shear', lanes: 'multiple', method: 'governing' } });
    expect((await outsider.get(`/api/training/assignments/${ex.id}`)).status).toBe(404);
    expect((await send.patch(outsider, `/api/training/assignments/${ex.id}`, { instructions: 'x' })).status).toBe(404);
    expect((await outsider.get(`/api/training/mine/${ex.id}`)).status).toBe(404);
    expect((await send.post(outsider, `/api/training/mine/${ex.id}/submissions`, { value: 1 })).status).toBe(404);
    const made = await send.post(outsider, '/api/training/assignments', { kind: 'factor', versionId, params: { girder: 'exterior', effect: 'moment', lanes: 'one', method: 'governing' }, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId()] });
    expect(made.status).toBe(404);
    expect((await outsider.get('/api/training/assignments')).body.assignments).toEqual([]);
  });

  it('every step is in the project’s audit trail', async () => {
    const projectId = (await designer.get('/api/projects')).body.projects[0].id;
    const audit = (await designer.get(`/api/projects/${projectId}/audit`)).body.entries.filter((e: { entityType: string }) => e.entityType === 'exercise');
    const actions = new Set(audit.map((e: { action: string }) => e.action));
    expect([...actions].sort()).toEqual(['change', 'create', 'submit']);
  });
});
