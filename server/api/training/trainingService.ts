/**
 * Training exercises made from deck versions. An instructor asks a question about one saved
 * version, assigns it to trainees of the firm with a due date and a tolerance; the product's
 * answer (value and the steps of the quantity asked for) is frozen when the exercise is made.
 * A trainee submits once: the answer is graded at once against the frozen answer and the
 * grade is final; the trainee is e-mailed in the words of the exercise page
 * (shared/training/answerWords.ts), and from then on sees their steps beside the trace. Submissions after the due date are accepted
 * and marked late. Submissions are append-only (database triggers). The instructor may open an
 * exercise to all: from then on every trainee sees the answer and the version's results, and
 * the exercise takes no more answers.
 */
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { assignments, assignmentTrainees, submissions, userRoles, users, type AssignmentRow, type DeckVersionRow, type SubmissionRow } from '../../db/schema.js';
import { computeCodeFactors, hasTraceParts, withTraceParts, type CodeFactorResult } from '../../../shared/lrfd/index.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import type { Mailer } from '../../mail/mailer.js';
import { assignmentGivenMessage, submissionGradedMessage } from '../../mail/messages.js';
import { findVersion, type Actor } from '../reviews/reviewService.js';
import { codeResultsOf, deckOf } from '../reviews/versionResults.js';
import { expectedFactor, expectedTruckPosition, grade, type ExpectedAnswer, type Grading } from './trainingQuestions.js';
import type { AssignmentBody, AssignmentUpdate, FactorParams, SubmissionBody, TruckPositionParams } from './trainingModel.js';

export interface TrainingDeps {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
}

export const CAUTION = 'Results are aids to a licensed engineer’s judgement; local codes, owner policies and licensed practice govern.';

function userName(db: Db, id: number) {
  return db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, id)).get() ?? { id, name: '', email: '' };
}

function userRef(db: Db, id: number | null) {
  if (id === null) return null;
  const u = userName(db, id);
  return { id: u.id, name: u.name };
}

function findAssignment(db: Db, firmId: number, assignmentId: number): AssignmentRow {
  const a = db.select().from(assignments).where(and(eq(assignments.id, assignmentId), eq(assignments.firmId, firmId))).get();
  if (!a) throw ApiError.notFound('exercise');
  return a;
}

function traineesOf(db: Db, assignmentId: number) {
  return db
    .select({ id: users.id, name: users.name, email: users.email, assignedAt: assignmentTrainees.assignedAt })
    .from(assignmentTrainees)
    .innerJoin(users, eq(users.id, assignmentTrainees.traineeId))
    .where(eq(assignmentTrainees.assignmentId, assignmentId))
    .orderBy(asc(users.name))
    .all();
}

function presentSubmission(db: Db, s: SubmissionRow) {
  const t = userName(db, s.traineeId);
  const answer = JSON.parse(s.answerJson) as { value: number; placement?: unknown };
  return {
    id: s.id,
    trainee: { id: t.id, name: t.name },
    attempt: s.attempt,
    value: answer.value,
    placement: answer.placement ?? null,
    steps: JSON.parse(s.stepsJson) as SubmissionBody['steps'],
    late: s.late,
    passed: s.passed,
    grading: JSON.parse(s.gradingJson) as Grading,
    submittedAt: s.submittedAt,
  };
}

function presentAssignment(db: Db, a: AssignmentRow, withAnswer: boolean) {
  const row = findVersion(db, a.firmId, a.versionId);
  const creator = userName(db, a.createdBy);
  const expected = JSON.parse(a.expectedJson) as ExpectedAnswer;
  return {
    id: a.id,
    kind: a.kind as 'factor' | 'truck-position',
    params: JSON.parse(a.paramsJson) as FactorParams | TruckPositionParams,
    title: a.title,
    question: expected.question,
    instructions: a.instructions,
    tolerancePercent: a.tolerancePercent,
    dueAt: a.dueAt,
    overdue: new Date(a.dueAt) < new Date(),
    project: { id: row.p.id, name: row.p.name, units: row.p.units },
    deck: { id: row.d.id, name: row.d.name },
    version: { id: row.v.id, number: row.v.number },
    createdBy: { id: creator.id, name: creator.name },
    createdAt: a.createdAt,
    /** When and by whom the exercise was opened to all (answer and results shown to every trainee), or null. */
    openedToAll: a.resultsOpenedAt ? { at: a.resultsOpenedAt, by: userRef(db, a.resultsOpenedBy) } : null,
    /** What the trainee needs to draw the roadway for a placement (never the answer). */
    roadway: expected.roadway ? { curbLeft: expected.roadway.curbLeft, curbRight: expected.roadway.curbRight, laneWidth: expected.roadway.laneWidth, laneCount: expected.roadway.laneCount, girderOffsets: expected.roadway.girderOffsets, gauge: expected.roadway.gauge, wheelToLaneEdge: expected.roadway.wheelToLaneEdge } : null,
    expected: withAnswer ? expected : null,
    caution: CAUTION,
  };
}

const traineeError = (i: number, message: string) => ApiError.badRequest(`traineeIds.${i}: ${message}`, [{ path: `body.traineeIds.${i}`, message }]);

function checkTrainees(db: Db, firmId: number, ids: number[]) {
  const found = ids.map((id) => db.select().from(users).where(and(eq(users.id, id), eq(users.firmId, firmId))).get());
  found.forEach((u, i) => {
    if (!u) throw traineeError(i, 'no such user in your firm');
    if (u.disabled) throw traineeError(i, `${u.name} is disabled`);
    const roles = db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, u.id)).all().map((r) => r.role);
    if (!roles.includes('trainee')) throw traineeError(i, `${u.name} does not hold the trainee role`);
  });
  return found.map((u) => u!);
}

function exerciseLink(publicUrl: string, id: number) {
  return `${publicUrl.replace(/\/$/, '')}/training/${id}`;
}

/**
 * The version's code results with the parts of every row's trace (span length, skew), which a
 * factor question needs to keep only the steps of its quantity: results stored before the
 * solver recorded the parts take them from a fresh computation where the rows agree
 * (shared/lrfd/quantity.ts withTraceParts).
 */
function codeRowsWithParts(db: Db, v: DeckVersionRow): CodeFactorResult {
  const { result } = codeResultsOf(db, v);
  if (hasTraceParts(result)) return result;
  return withTraceParts(result, computeCodeFactors(deckOf(v)));
}

export function listTrainees(db: Db, firmId: number) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .innerJoin(userRoles, and(eq(userRoles.userId, users.id), eq(userRoles.role, 'trainee')))
    .where(and(eq(users.firmId, firmId), eq(users.disabled, false)))
    .orderBy(asc(users.name))
    .all();
}

export function createAssignment(deps: TrainingDeps, actor: Actor, body: AssignmentBody) {
  const { db } = deps;
  const row = findVersion(db, actor.firmId, body.versionId);
  if (row.p.archived) throw ApiError.conflict('the project is archived: restore it before making exercises from it');
  if (new Date(body.dueAt) <= new Date()) throw ApiError.badRequest('dueAt: the due date must be in the future', [{ path: 'body.dueAt', message: 'the due date must be in the future' }]);
  const ids = [...new Set(body.traineeIds)];
  const trainees = checkTrainees(db, actor.firmId, ids);
  const expected = body.kind === 'factor' ? expectedFactor(codeRowsWithParts(db, row.v), body.params) : expectedTruckPosition(deckOf(row.v), body.params);
  const title = body.title?.trim() || expected.question.charAt(0).toUpperCase() + expected.question.slice(1);
  const dueAt = new Date(body.dueAt).toISOString();
  const a = db.transaction((tx) => {
    const a = tx
      .insert(assignments)
      .values({
        firmId: actor.firmId,
        projectId: row.p.id,
        deckId: row.d.id,
        versionId: row.v.id,
        kind: body.kind,
        paramsJson: JSON.stringify(body.params),
        title,
        instructions: body.instructions,
        tolerancePercent: body.tolerancePercent,
        dueAt,
        expectedJson: JSON.stringify(expected),
        createdBy: actor.id,
      })
      .returning()
      .get();
    for (const t of trainees) tx.insert(assignmentTrainees).values({ assignmentId: a.id, traineeId: t.id }).run();
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId: row.p.id,
      actorId: actor.id,
      action: 'create',
      entityType: 'exercise',
      entityId: a.id,
      summary: `made the exercise “${title}” from version ${row.v.number} of deck “${row.d.name}” for ${trainees.map((t) => t.name).join(', ')} (due ${dueAt.slice(0, 10)}, tolerance ${body.tolerancePercent} %)`,
    });
    return a;
  });
  for (const t of trainees) {
    deps.mailer.queue(assignmentGivenMessage({ firmId: actor.firmId, to: { name: t.name, email: t.email }, instructor: actor.name, title, question: `${expected.question} — deck “${row.d.name}”, version ${row.v.number} (project “${row.p.name}”).`, dueAt, link: exerciseLink(deps.publicUrl, a.id) }));
  }
  return instructorView(db, actor.firmId, a.id);
}

export function updateAssignment(deps: TrainingDeps, actor: Actor, assignmentId: number, body: AssignmentUpdate) {
  const { db } = deps;
  const a = findAssignment(db, actor.firmId, assignmentId);
  const existing = new Set(traineesOf(db, a.id).map((t) => t.id));
  const added = body.addTraineeIds ? checkTrainees(db, actor.firmId, [...new Set(body.addTraineeIds)]).filter((t) => !existing.has(t.id)) : [];
  if (body.dueAt !== undefined && new Date(body.dueAt) <= new Date()) throw ApiError.badRequest('dueAt: the due date must be in the future', [{ path: 'body.dueAt', message: 'the due date must be in the future' }]);
  const dueAt = body.dueAt !== undefined ? new Date(body.dueAt).toISOString() : a.dueAt;
  const opening = body.openToAll === true && a.resultsOpenedAt === null;
  db.transaction((tx) => {
    tx.update(assignments)
      .set({ dueAt, instructions: body.instructions ?? a.instructions, ...(opening ? { resultsOpenedAt: new Date().toISOString(), resultsOpenedBy: actor.id } : {}) })
      .where(eq(assignments.id, a.id))
      .run();
    for (const t of added) tx.insert(assignmentTrainees).values({ assignmentId: a.id, traineeId: t.id }).run();
    const what = [
      body.dueAt !== undefined && `due ${dueAt.slice(0, 10)}`,
      body.instructions !== undefined && 'instructions',
      added.length > 0 && `added ${added.map((t) => t.name).join(', ')}`,
      opening && 'opened to all (the answer and the version’s results are shown to every trainee)',
    ]
      .filter(Boolean)
      .join('; ');
    recordAudit(tx, { firmId: actor.firmId, projectId: a.projectId, actorId: actor.id, action: 'change', entityType: 'exercise', entityId: a.id, summary: `changed the exercise “${a.title}”: ${what || 'no change'}` });
  });
  const expected = JSON.parse(a.expectedJson) as ExpectedAnswer;
  const row = findVersion(db, actor.firmId, a.versionId);
  for (const t of added) {
    deps.mailer.queue(assignmentGivenMessage({ firmId: actor.firmId, to: { name: t.name, email: t.email }, instructor: actor.name, title: a.title, question: `${expected.question} — deck “${row.d.name}”, version ${row.v.number} (project “${row.p.name}”).`, dueAt, link: exerciseLink(deps.publicUrl, a.id) }));
  }
  return instructorView(db, actor.firmId, a.id);
}

/** The instructors' list: every exercise of the firm with counts. */
export function listAssignments(db: Db, firmId: number) {
  return db
    .select()
    .from(assignments)
    .where(eq(assignments.firmId, firmId))
    .orderBy(desc(assignments.id))
    .all()
    .map((a) => {
      const trainees = traineesOf(db, a.id);
      const subs = db.select().from(submissions).where(eq(submissions.assignmentId, a.id)).all();
      return { ...presentAssignment(db, a, false), traineeCount: trainees.length, submittedCount: new Set(subs.map((s) => s.traineeId)).size, passedCount: subs.filter((s) => s.passed).length };
    });
}

/** One exercise for instructors: the answer, the trainees and every submission with its grade. */
export function instructorView(db: Db, firmId: number, assignmentId: number) {
  const a = findAssignment(db, firmId, assignmentId);
  const subs = db.select().from(submissions).where(eq(submissions.assignmentId, a.id)).orderBy(asc(submissions.id)).all().map((s) => presentSubmission(db, s));
  const trainees = traineesOf(db, a.id).map((t) => {
    const mine = subs.filter((s) => s.trainee.id === t.id);
    const last = mine.at(-1);
    return { id: t.id, name: t.name, email: t.email, status: last ? (last.passed ? 'passed' : 'not passed') : 'not submitted', late: last?.late ?? false, submittedAt: last?.submittedAt ?? null };
  });
  return { ...presentAssignment(db, a, true), trainees, submissions: subs };
}

function assignedTo(db: Db, assignmentId: number, traineeId: number): boolean {
  return db.select().from(assignmentTrainees).where(and(eq(assignmentTrainees.assignmentId, assignmentId), eq(assignmentTrainees.traineeId, traineeId))).get() !== undefined;
}

/** The exercises given to a trainee, newest first. */
export function myAssignments(db: Db, actor: Actor) {
  const ids = db.select({ id: assignmentTrainees.assignmentId }).from(assignmentTrainees).where(eq(assignmentTrainees.traineeId, actor.id)).all().map((r) => r.id);
  if (ids.length === 0) return [];
  return db
    .select()
    .from(assignments)
    .where(and(eq(assignments.firmId, actor.firmId), inArray(assignments.id, ids)))
    .orderBy(desc(assignments.dueAt))
    .all()
    .map((a) => {
      const mine = db.select().from(submissions).where(and(eq(submissions.assignmentId, a.id), eq(submissions.traineeId, actor.id))).orderBy(desc(submissions.id)).get();
      return { ...presentAssignment(db, a, false), status: mine ? (mine.passed ? 'passed' : 'not passed') : 'to do', submittedAt: mine?.submittedAt ?? null };
    });
}

/** One exercise for its trainee: the answer and trace only once they have submitted. */
export function traineeView(db: Db, actor: Actor, assignmentId: number) {
  const a = findAssignment(db, actor.firmId, assignmentId);
  if (!assignedTo(db, a.id, actor.id)) throw ApiError.notFound('exercise');
  const mine = db.select().from(submissions).where(and(eq(submissions.assignmentId, a.id), eq(submissions.traineeId, actor.id))).orderBy(asc(submissions.id)).all().map((s) => presentSubmission(db, s));
  return { ...presentAssignment(db, a, mine.length > 0 || a.resultsOpenedAt !== null), submissions: mine };
}

export function submitAnswer(deps: TrainingDeps, actor: Actor, assignmentId: number, body: SubmissionBody) {
  const { db } = deps;
  const a = findAssignment(db, actor.firmId, assignmentId);
  if (!assignedTo(db, a.id, actor.id)) throw ApiError.notFound('exercise');
  const previous = db.select().from(submissions).where(and(eq(submissions.assignmentId, a.id), eq(submissions.traineeId, actor.id))).all();
  if (previous.length > 0) throw ApiError.conflict('you have already submitted this exercise: your answer has been graded and the product’s trace is shown beside your steps');
  if (a.resultsOpenedAt !== null) throw ApiError.conflict('the instructor has opened this exercise to all: its answer is shown, so it takes no more answers');
  const row = findVersion(db, actor.firmId, a.versionId);
  const expected = JSON.parse(a.expectedJson) as ExpectedAnswer;
  const grading = grade(deckOf(row.v), a.kind, JSON.parse(a.paramsJson), expected, body, a.tolerancePercent);
  const late = new Date() > new Date(a.dueAt);
  const s = db.transaction((tx) => {
    const s = tx
      .insert(submissions)
      .values({
        assignmentId: a.id,
        traineeId: actor.id,
        attempt: 1,
        answerJson: JSON.stringify({ value: body.value, ...(body.placement ? { placement: body.placement } : {}) }),
        stepsJson: JSON.stringify(body.steps),
        late,
        passed: grading.passed,
        gradingJson: JSON.stringify(grading),
      })
      .returning()
      .get();
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId: a.projectId,
      actorId: actor.id,
      action: 'submit',
      entityType: 'exercise',
      entityId: a.id,
      summary: `submitted an answer to “${a.title}”${late ? ' (late)' : ''}: ${grading.passed ? 'within' : 'outside'} the ${a.tolerancePercent} % tolerance`,
    });
    return s;
  });
  const me = userName(db, actor.id);
  deps.mailer.queue(submissionGradedMessage({ firmId: actor.firmId, to: { name: me.name, email: me.email }, title: a.title, passed: grading.passed, summary: grading.summary, link: exerciseLink(deps.publicUrl, a.id) }));
  return { submission: presentSubmission(db, s), exercise: traineeView(db, actor, a.id) };
}
