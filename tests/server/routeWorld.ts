/** A populated firm for the route-wide tests (hostile input, firm isolation): one project with a
 *  deck of two versions, a review round with a comment, a drawing, an exercise, a user to
 *  manage and outbox messages; then one well-formed request per route (its path parameters,
 *  query and body, or multipart file) that those tests mutate or replay. A route without a
 *  sample here makes both tests fail, so a new route cannot go untested. */
import { sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client.js';
import { quarryCreekDeck } from '../fixtures/decks.js';
import { demo, signIn, type Agent } from './helpers.js';
import { outbox, send, userId, type WorkflowContext } from './workflowHelpers.js';
import type { RouteInfo } from './routeTable.js';
import { girderLayoutTemplate } from '../../server/api/imports/girderLayoutCsv.js';
import { encodeCursor } from '../../server/api/pagination.js';
import { computeJobs } from '../../server/db/schema.js';
import { SOLVER_VERSION } from '../../shared/version.js';

/** The smallest PNG of the attachment tests (PNG specification §5.2 signature + IHDR start). */
export const PNG = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000', 'hex');

export interface WorldIds {
  projectId: number;
  deckId: number;
  versionId: number;
  versionNumber: number;
  reviewId: number;
  commentId: number;
  attachmentId: number;
  assignmentId: number;
  /** A compute job of the first version (server/compute/jobRecords.ts). */
  jobId: number;
  messageId: number;
  managedUserId: number;
  traineeId: number;
  reviewerId: number;
  /** A two-point code-only study of the first version. */
  studyId: number;
  /** A well-formed invitation token that names no invitation. */
  token: string;
}

/** Saved placements in the workspace's format (server/api/decks/placementsModel.ts). */
const PLACEMENTS = { format: 'deckshare-placements-1', vehicle: 'design truck', lanes: [{ left: 0.6, wheelOffset: 0.6 }], studied: { girder: 0, effect: 'moment' } };

const due = () => new Date(Date.now() + 7 * 86400_000).toISOString();

function ok<T extends { status: number; body: unknown }>(res: T, what: string): T {
  if (res.status >= 300) throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body)}`);
  return res;
}

/** Fills the demo firm of `ctx` with one of everything and returns the ids. */
export async function buildWorld(ctx: WorkflowContext): Promise<WorldIds> {
  const designer = await signIn(ctx.app, demo.designer);
  const reviewer = await signIn(ctx.app, demo.reviewer);
  const instructor = await signIn(ctx.app, demo.instructor);
  const admin = await signIn(ctx.app, demo.admin);
  const projectId = (await designer.get('/api/projects')).body.projects[0].id as number;
  const created = ok(await send.post(designer, `/api/projects/${projectId}/decks`, { deck: quarryCreekDeck(), message: 'first layout' }), 'deck');
  const deckId = created.body.deck.id as number;
  const versionId = created.body.version.id as number;
  const second = ok(await send.post(designer, `/api/decks/${deckId}/versions`, { deck: { ...quarryCreekDeck(), overhangLeft: 1.2 }, message: 'second layout' }), 'version 2');
  const reviewerId = userId(ctx, demo.reviewer);
  const review = ok(await send.post(designer, '/api/reviews', { versionId: second.body.version.id, reviewerId, note: 'please check' }), 'review');
  const reviewId = review.body.review.id as number;
  const comment = ok(await send.post(reviewer, `/api/reviews/${reviewId}/comments`, { body: 'Check the overhang.' }), 'comment');
  const drawing = ok(await designer.post(`/api/projects/${projectId}/attachments`).set('X-CSRF-Token', designer.csrf).attach('file', PNG, { filename: 'plan.png', contentType: 'image/png' }), 'drawing');
  const traineeId = userId(ctx, demo.trainee);
  const exercise = ok(
    await send.post(instructor, '/api/training/assignments', { kind: 'factor', versionId, params: { girder: 'exterior', effect: 'moment', lanes: 'multiple', method: 'governing' }, tolerancePercent: 1, dueAt: due(), traineeIds: [traineeId] }),
    'exercise',
  );
  const managed = ok(await send.post(admin, '/api/admin/users', { email: 'managed@larchmont-ridge.example', name: 'Managed User', roles: ['designer'] }), 'user');
  const messages = await outbox(ctx);
  if (messages.length === 0) throw new Error('no outbox message');
  const study = ok(
    await send.post(designer, `/api/projects/${projectId}/studies`, { name: 'Skew sweep', deckId, versionNumber: 1, sweep: { axes: [{ parameter: 'skew', values: { kind: 'list', values: [0, 20] } }], grillage: 'none' } }),
    'study',
  );
  // Its points are computed in the background: let it finish, so nothing is written while the tests look.
  for (let i = 0; i < 200; i++) {
    const now = await designer.get(`/api/studies/${study.body.study.id}`);
    if (now.body.study.state !== 'running') break;
    await new Promise((r) => setTimeout(r, 50));
  }
  const jobId = ctx.db.insert(computeJobs).values({ kind: 'refined', versionId, requestedBy: null, state: 'done', solverVersion: SOLVER_VERSION }).returning().get().id;
  return {
    projectId,
    deckId,
    versionId,
    versionNumber: 1,
    reviewId,
    commentId: comment.body.comment.id,
    attachmentId: drawing.body.attachment.id,
    assignmentId: exercise.body.assignment.id,
    jobId,
    messageId: messages[0].id,
    managedUserId: managed.body.user.id,
    traineeId,
    reviewerId,
    studyId: study.body.study.id,
    token: 'A'.repeat(43),
  };
}

export interface SampleRequest {
  params?: Record<string, string | number>;
  query?: Record<string, string>;
  body?: Record<string, unknown>;
  /** Multipart routes: the file and the text fields. */
  file?: { field: string; content: Buffer; filename: string; contentType: string; fields?: Record<string, string> };
  /** Set when the route must not be called by the shared signed-in agent (it would end its session). */
  anonymous?: boolean;
}

/** One well-formed request per route, keyed `METHOD /path`. */
export function sampleRequests(ids: WorldIds): Record<string, SampleRequest> {
  const version = { deckId: ids.deckId, number: ids.versionNumber };
  return {
    'GET /api/health': {},
    'POST /api/auth/login': { anonymous: true, body: { email: 'nobody@larchmont-ridge.example', password: 'wrong-password-1' } },
    'POST /api/auth/logout': { anonymous: true },
    'GET /api/auth/me': {},
    'GET /api/auth/session': {},
    // The current password is wrong on purpose: a mutated body can never change the password.
    'POST /api/auth/password': { body: { currentPassword: 'not-the-password-1', newPassword: 'a-new-long-password-2' } },
    'GET /api/invitations': {},
    'POST /api/invitations': { body: { userId: ids.managedUserId } },
    'GET /api/invitations/:token': { anonymous: true, params: { token: ids.token } },
    'POST /api/invitations/:token/accept': { anonymous: true, params: { token: ids.token }, body: { password: 'a-new-long-password-2' } },
    'GET /api/projects': { query: { archived: 'include' } },
    'POST /api/projects': { body: { name: 'Hostile Creek', ownerAgency: 'County', location: 'Mile 3', units: 'US', notes: '' } },
    'GET /api/projects/:projectId': { params: { projectId: ids.projectId } },
    'PATCH /api/projects/:projectId': { params: { projectId: ids.projectId }, body: { notes: 'checked' } },
    'GET /api/projects/:projectId/audit': { params: { projectId: ids.projectId }, query: { limit: '5' } },
    'GET /api/projects/:projectId/decks': { params: { projectId: ids.projectId } },
    'POST /api/projects/:projectId/decks': { params: { projectId: ids.projectId }, body: { deck: quarryCreekDeck() as unknown as Record<string, unknown>, message: 'hostile save', placements: PLACEMENTS } },
    'GET /api/decks/:deckId': { params: { deckId: ids.deckId }, query: { limit: '1' } },
    'GET /api/decks/:deckId/versions': { params: { deckId: ids.deckId }, query: { limit: '1', cursor: encodeCursor({ number: 2 }) } },
    'POST /api/decks/:deckId/versions': { params: { deckId: ids.deckId }, body: { deck: quarryCreekDeck() as unknown as Record<string, unknown>, message: 'hostile save', basedOnVersionId: ids.versionId, placements: PLACEMENTS } },
    'GET /api/decks/:deckId/versions/:number': { params: version },
    'GET /api/decks/:deckId/versions/:number/jobs': { params: version },
    'GET /api/decks/:deckId/versions/:number/factors': { params: version },
    'GET /api/jobs/:jobId': { params: { jobId: ids.jobId } },
    // the sample job is done: a cancel is refused (409) whatever the body
    'POST /api/jobs/:jobId/cancel': { params: { jobId: ids.jobId }, body: {} },
    'GET /api/admin/users': {},
    'POST /api/admin/users': { body: { email: 'new-user@larchmont-ridge.example', name: 'New User', roles: ['trainee'] } },
    'PATCH /api/admin/users/:userId': { params: { userId: ids.managedUserId }, body: { name: 'Managed Again', roles: ['designer'], disabled: false } },
    'POST /api/admin/users/:userId/reset-password': { params: { userId: ids.managedUserId } },
    'GET /api/mail/outbox': { query: { kind: 'assignment-given', to: 'trainee', limit: '10', cursor: encodeCursor({ id: 1_000_000 }) } },
    'GET /api/mail/outbox/:messageId': { params: { messageId: ids.messageId } },
    'GET /api/projects/:projectId/attachments': { params: { projectId: ids.projectId } },
    'POST /api/projects/:projectId/attachments': { params: { projectId: ids.projectId }, file: { field: 'file', content: PNG, filename: 'elevation.png', contentType: 'image/png', fields: { title: 'Elevation' } } },
    'GET /api/attachments/:attachmentId/download': { params: { attachmentId: ids.attachmentId } },
    'DELETE /api/attachments/:attachmentId': { params: { attachmentId: ids.attachmentId } },
    'GET /api/reviews': { query: { view: 'all', state: 'awaiting-review', deckId: String(ids.deckId) } },
    'GET /api/reviews/reviewers': {},
    'GET /api/reviews/status': { query: { deckId: String(ids.deckId) } },
    'POST /api/reviews': { body: { versionId: ids.versionId, reviewerId: ids.reviewerId, note: 'again' } },
    'GET /api/reviews/:reviewId': { params: { reviewId: ids.reviewId } },
    'POST /api/reviews/:reviewId/comments': { params: { reviewId: ids.reviewId }, body: { body: 'A remark.', anchor: { girder: 1, effect: 'moment', method: 'lever-rule', lanes: 'one' }, parentId: ids.commentId } },
    'PUT /api/reviews/:reviewId/refined-analysis': { params: { reviewId: ids.reviewId }, body: { justified: true, reason: 'skewed supports' } },
    'POST /api/reviews/:reviewId/decision': { params: { reviewId: ids.reviewId }, body: { outcome: 'send-back', note: 'reduce the overhang' } },
    'POST /api/reviews/:reviewId/withdraw': { params: { reviewId: ids.reviewId } },
    'GET /api/training/questions': {},
    'GET /api/training/trainees': {},
    'GET /api/training/assignments': {},
    'POST /api/training/assignments': {
      body: { kind: 'factor', versionId: ids.versionId, params: { girder: 'interior', effect: 'shear', lanes: 'one', method: 'lever-rule', location: 'span1' }, title: 'Shear', instructions: 'By hand.', tolerancePercent: 2, dueAt: due(), traineeIds: [ids.traineeId] },
    },
    'GET /api/training/assignments/:assignmentId': { params: { assignmentId: ids.assignmentId } },
    'PATCH /api/training/assignments/:assignmentId': { params: { assignmentId: ids.assignmentId }, body: { dueAt: due(), instructions: 'Show the steps.', addTraineeIds: [ids.traineeId] } },
    'GET /api/training/mine': {},
    'GET /api/training/mine/:assignmentId': { params: { assignmentId: ids.assignmentId } },
    'POST /api/training/mine/:assignmentId/submissions': { params: { assignmentId: ids.assignmentId }, body: { value: 0.8, steps: [{ label: 'S', formula: 'S = 9.67 ft', value: 9.67, note: '' }], placement: { lanes: [{ left: 0.5, wheelOffset: 0.6 }] } } },
    'GET /api/imports/girder-layout/template': { query: { units: 'SI' } },
    'POST /api/imports/girder-layout': { file: { field: 'file', content: Buffer.from(girderLayoutTemplate('US')), filename: 'layout.csv', contentType: 'text/csv', fields: { deckId: String(ids.deckId), message: 'imported', dryRun: 'true' } } },
    'GET /api/reports/decks/:deckId/versions/:number/package.pdf': { params: version },
    'GET /api/reports/decks/:deckId/versions/:number/factors.csv': { params: version },
    'GET /api/reports/decks/:deckId/versions/:number/envelopes.csv': { params: version },
    'GET /api/projects/:projectId/studies': { params: { projectId: ids.projectId } },
    'POST /api/projects/:projectId/studies': { params: { projectId: ids.projectId }, body: { name: 'Spacing sweep', deckId: ids.deckId, versionNumber: 1, sweep: { axes: [{ parameter: 'overhang', values: { kind: 'range', from: 0.9, to: 1.2, step: 0.3 } }], grillage: 'none' } } },
    'GET /api/studies/:studyId': { params: { studyId: ids.studyId } },
    'POST /api/studies/:studyId/cancel': { params: { studyId: ids.studyId } },
    'POST /api/studies/:studyId/resume': { params: { studyId: ids.studyId } },
    'GET /api/studies/:studyId/points/:number/deck': { params: { studyId: ids.studyId, number: 1 } },
    'GET /api/studies/:studyId/study.csv': { params: { studyId: ids.studyId } },
  };
}

/** The route's path with its parameters filled in (values URL-encoded). */
export function fillPath(route: RouteInfo, params: Record<string, string | number> = {}): string {
  return route.path.replace(/:(\w+)/g, (_m, name: string) => {
    if (!(name in params)) throw new Error(`${route.key}: no sample value for :${name}`);
    return encodeURIComponent(String(params[name]));
  });
}

/** Sends a request built from parts, with the CSRF header of the agent. */
export function sendRequest(agent: Agent, method: string, url: string, parts: { query?: Record<string, string>; rawBody?: string; file?: SampleRequest['file'] }) {
  const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let req = agent[m](url).set('X-CSRF-Token', agent.csrf ?? 'none');
  if (parts.query) req = req.query(parts.query);
  if (parts.file) {
    for (const [k, v] of Object.entries(parts.file.fields ?? {})) req = req.field(k, v);
    return req.attach(parts.file.field, parts.file.content, { filename: parts.file.filename, contentType: parts.file.contentType });
  }
  if (parts.rawBody !== undefined) return req.set('Content-Type', 'application/json').send(parts.rawBody);
  return req;
}

/** Row count of every table of the database (the migrations' own bookkeeping left out). */
export function tableCounts(db: Db): Record<string, number> {
  const tables = db.all<{ name: string }>(sql`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%'`);
  const out: Record<string, number> = {};
  for (const { name } of tables) out[name] = db.get<{ n: number }>(sql.raw(`select count(*) as n from "${name}"`))!.n;
  return out;
}

/** Tables whose rows can never change or go (database triggers refuse updates and deletes):
 *  their row counts tell all that a request wrote to them. */
const APPEND_ONLY = new Set(['deck_versions', 'analysis_results', 'audit_log', 'review_comments', 'submissions', 'outbox_messages']);

/** The stored state a request could change: the row count of every table and the content of
 *  every table whose rows can be updated. Equal before and after means nothing was written. */
export function databaseState(db: Db): string {
  const counts = tableCounts(db);
  const contents = Object.keys(counts)
    .filter((t) => !APPEND_ONLY.has(t))
    .map((t) => `${t}:${JSON.stringify(db.all(sql.raw(`select * from "${t}" order by rowid`)))}`);
  return `${JSON.stringify(counts)}\n${contents.join('\n')}`;
}
