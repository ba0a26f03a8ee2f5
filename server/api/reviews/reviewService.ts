/**
 * Review rounds. A designer submits one deck version to a chosen reviewer of the firm; the
 * round then moves through plain-worded states (see `REVIEW_STATES` in db/schema.ts):
 *
 *   (no round: "in progress") ──submit──► awaiting review ──approve──► approved (locked)
 *                                             │   │
 *                                             │   └──send back──► sent back ──(designer saves a
 *                                             │                    new version and submits it:
 *                                             │                    a new round linked to this one)
 *                                             └──withdraw──► withdrawn (the version is in progress again)
 *
 * Rules
 * - Only the newest version of a deck can be submitted; a deck has at most one round awaiting
 *   review; a version that was approved or sent back cannot be submitted again.
 * - The reviewer must hold the reviewer role and must not be the submitter or the version's
 *   author. Only the assigned reviewer decides, never on their own version.
 * - Approving needs the refined-analysis decision (justified / not justified, with a reason);
 *   sending back needs a reason.
 * - An approved round is locked: no comments, no decision, no withdrawal (database triggers
 *   refuse changes too). Saving a new version of an approved deck is allowed and starts over:
 *   the new version is "in progress" and needs its own round; the approval stays with the
 *   version it approved.
 * - Comments come from the reviewer and the designer only, while the round is awaiting review
 *   or sent back (the designer answers the comments of a sent-back round, then resubmits).
 * Every state change is audited in the same transaction and the people concerned are e-mailed
 * after it commits.
 */
import { and, asc, count, desc, eq, inArray, lt, ne, or, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import {
  decks,
  deckVersions,
  projects,
  reviewComments,
  reviewRounds,
  userRoles,
  users,
  type DeckVersionRow,
  type ReviewRoundRow,
  type ReviewState,
  type Role,
} from '../../db/schema.js';
import { mayPerform } from '../../auth/permissions.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import { findDeck, listVersions } from '../decks/deckService.js';
import { cutPage, decodeCursor, DEFAULT_PAGE, updatedCursor, type Page, type PageRequest } from '../pagination.js';
import type { Mailer } from '../../mail/mailer.js';
import { reviewRequestedMessage, versionApprovedMessage, versionSentBackMessage, type VersionRef } from '../../mail/messages.js';
import { girderCountOf } from './versionResults.js';
import type { CommentAnchor, CommentBody, DecisionBody, ListQuery, RefinedBody, SubmitBody } from './reviewModel.js';
import { decisionConditions } from './refinedSummary.js';
import { conditionsWords, parseConditions } from '../../../shared/review/claimConditions.js';

export interface ReviewDeps {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
}

export interface Actor {
  id: number;
  firmId: number;
  name: string;
  roles: Role[];
}

export type VersionReviewState = ReviewState | 'in-progress';

export const STATE_WORDS: Record<VersionReviewState, string> = {
  'in-progress': 'in progress',
  'awaiting-review': 'awaiting review',
  approved: 'approved',
  'sent-back': 'sent back',
  withdrawn: 'withdrawn',
};

const REFINED_WORDS = (justified: boolean) => (justified ? 'refined analysis justified' : 'refined analysis not justified');

function userRef(db: Db, id: number | null) {
  if (id === null) return null;
  const u = db.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, id)).get();
  return u ?? { id, name: '', email: '' };
}

function isUniqueViolation(e: unknown): boolean {
  return typeof e === 'object' && e !== null && 'code' in e && String((e as { code: unknown }).code).startsWith('SQLITE_CONSTRAINT');
}

/** The round if it belongs to the firm; otherwise 404. */
export function findRound(db: Db, firmId: number, roundId: number): ReviewRoundRow {
  const r = db.select().from(reviewRounds).where(and(eq(reviewRounds.id, roundId), eq(reviewRounds.firmId, firmId))).get();
  if (!r) throw ApiError.notFound('review');
  return r;
}

/** A version with its deck and project, if they belong to the firm; otherwise 404. */
export function findVersion(db: Db, firmId: number, versionId: number) {
  const row = db
    .select({ v: deckVersions, d: decks, p: projects })
    .from(deckVersions)
    .innerJoin(decks, eq(decks.id, deckVersions.deckId))
    .innerJoin(projects, eq(projects.id, decks.projectId))
    .where(and(eq(deckVersions.id, versionId), eq(projects.firmId, firmId)))
    .get();
  if (!row) throw ApiError.notFound('deck version');
  return row;
}

function latestNumber(db: Db, deckId: number): number {
  return db.select({ n: deckVersions.number }).from(deckVersions).where(eq(deckVersions.deckId, deckId)).orderBy(desc(deckVersions.number)).limit(1).get()?.n ?? 0;
}

function versionRef(row: ReturnType<typeof findVersion>): VersionRef {
  return { projectName: row.p.name, deckName: row.d.name, versionNumber: row.v.number };
}

function isOwnVersion(actorId: number, round: ReviewRoundRow, version: DeckVersionRow): boolean {
  return actorId === round.submittedBy || actorId === version.createdBy;
}

function isParticipant(actorId: number, round: ReviewRoundRow, version: DeckVersionRow): boolean {
  return actorId === round.reviewerId || actorId === round.submittedBy || actorId === version.createdBy;
}

function anchorWords(a: CommentAnchor | null): string {
  if (!a) return 'the deck as a whole';
  const parts = [
    a.girder !== undefined && `girder ${a.girder}`,
    a.effect && a.effect.replace('-', ' '),
    a.method && a.method.replace('-', ' '),
    a.lanes && (a.lanes === 'one' ? 'one lane' : 'two or more lanes'),
  ].filter(Boolean);
  return parts.join(', ');
}

function presentComment(db: Db, c: typeof reviewComments.$inferSelect) {
  const author = userRef(db, c.authorId)!;
  return {
    id: c.id,
    roundId: c.roundId,
    parentId: c.parentId,
    author: { id: author.id, name: author.name },
    body: c.body,
    anchor: c.anchorJson === null ? null : (JSON.parse(c.anchorJson) as CommentAnchor),
    anchorText: anchorWords(c.anchorJson === null ? null : (JSON.parse(c.anchorJson) as CommentAnchor)),
    createdAt: c.createdAt,
  };
}

function allowedFor(db: Db, actor: Actor, r: ReviewRoundRow, v: DeckVersionRow) {
  const open = r.state === 'awaiting-review';
  const own = isOwnVersion(actor.id, r, v);
  const newer = latestNumber(db, v.deckId) > v.number;
  return {
    comment: (open || r.state === 'sent-back') && isParticipant(actor.id, r, v) && mayPerform(actor.roles, 'review:comment'),
    decide: open && actor.id === r.reviewerId && !own && mayPerform(actor.roles, 'review:decide'),
    withdraw: open && actor.id === r.submittedBy,
    resubmit: r.state === 'sent-back' && own && newer && mayPerform(actor.roles, 'review:submit'),
  };
}

function presentRound(db: Db, actor: Actor, r: ReviewRoundRow) {
  const row = findVersion(db, r.firmId, r.versionId);
  const latest = latestNumber(db, row.d.id);
  const commentCount = db.select({ id: reviewComments.id }).from(reviewComments).where(eq(reviewComments.roundId, r.id)).all().length;
  const next = db.select({ id: reviewRounds.id }).from(reviewRounds).where(eq(reviewRounds.previousRoundId, r.id)).orderBy(desc(reviewRounds.id)).get();
  const decided = r.state === 'approved' || r.state === 'sent-back';
  const submitter = userRef(db, r.submittedBy)!;
  const reviewer = userRef(db, r.reviewerId)!;
  const author = userRef(db, row.v.createdBy)!;
  const decider = userRef(db, r.decidedBy);
  return {
    id: r.id,
    state: r.state,
    stateLabel: STATE_WORDS[r.state],
    project: { id: row.p.id, name: row.p.name, units: row.p.units },
    deck: { id: row.d.id, name: row.d.name },
    version: {
      id: row.v.id,
      number: row.v.number,
      girderCount: girderCountOf(row.v),
      message: row.v.message,
      createdAt: row.v.createdAt,
      createdBy: { id: author.id, name: author.name },
      isLatest: row.v.number === latest,
      latestNumber: latest,
    },
    submittedBy: { id: submitter.id, name: submitter.name },
    reviewer: { id: reviewer.id, name: reviewer.name },
    previousRoundId: r.previousRoundId,
    nextRoundId: next?.id ?? null,
    submissionNote: r.submissionNote,
    decision: decided && decider ? { outcome: r.state === 'approved' ? ('approve' as const) : ('send-back' as const), note: r.decisionNote ?? '', by: { id: decider.id, name: decider.name }, at: r.decidedAt } : null,
    refinedAnalysis: r.refinedJustified === null ? null : { justified: r.refinedJustified, reason: r.refinedReason ?? '', at: r.refinedDecidedAt, label: REFINED_WORDS(r.refinedJustified), ...conditionsView(r.refinedConditions) },
    commentCount,
    createdAt: r.createdAt,
    updatedAt: r.updatedAt,
    allowed: allowedFor(db, actor, r, row.v),
  };
}

export type ReviewView = ReturnType<typeof presentRound>;

/** A round with its comments and the earlier rounds it answers (newest first). */
export function getReview(db: Db, actor: Actor, roundId: number) {
  const r = findRound(db, actor.firmId, roundId);
  const comments = db.select().from(reviewComments).where(eq(reviewComments.roundId, r.id)).orderBy(asc(reviewComments.id)).all();
  const earlier: ReturnType<typeof presentEarlier>[] = [];
  let prevId = r.previousRoundId;
  const seen = new Set<number>([r.id]);
  while (prevId !== null && !seen.has(prevId)) {
    seen.add(prevId);
    const p = db.select().from(reviewRounds).where(and(eq(reviewRounds.id, prevId), eq(reviewRounds.firmId, actor.firmId))).get();
    if (!p) break;
    earlier.push(presentEarlier(db, p));
    prevId = p.previousRoundId;
  }
  return { ...presentRound(db, actor, r), comments: comments.map((c) => presentComment(db, c)), earlierRounds: earlier };
}

function presentEarlier(db: Db, p: ReviewRoundRow) {
  const v = db.select({ number: deckVersions.number }).from(deckVersions).where(eq(deckVersions.id, p.versionId)).get();
  const comments = db.select().from(reviewComments).where(eq(reviewComments.roundId, p.id)).orderBy(asc(reviewComments.id)).all();
  return {
    id: p.id,
    versionNumber: v?.number ?? 0,
    state: p.state,
    stateLabel: STATE_WORDS[p.state],
    decisionNote: p.decisionNote,
    decidedAt: p.decidedAt,
    comments: comments.map((c) => presentComment(db, c)),
  };
}

/** A page of review rounds, most recently changed first (server/api/pagination.ts). */
export function listReviews(db: Db, actor: Actor, q: ListQuery): { reviews: ReviewView[]; page: Page } {
  const where: SQL[] = [eq(reviewRounds.firmId, actor.firmId)];
  if (q.view === 'assigned') where.push(eq(reviewRounds.reviewerId, actor.id));
  if (q.view === 'submitted') where.push(eq(reviewRounds.submittedBy, actor.id));
  if (q.state) where.push(eq(reviewRounds.state, q.state));
  if (q.deckId !== undefined) {
    findDeck(db, actor.firmId, q.deckId);
    where.push(eq(reviewRounds.deckId, q.deckId));
  }
  const total = db.select({ n: count() }).from(reviewRounds).where(and(...where)).get()?.n ?? 0;
  const after = decodeCursor(q.cursor, updatedCursor);
  if (after) {
    where.push(or(lt(reviewRounds.updatedAt, after.updatedAt), and(eq(reviewRounds.updatedAt, after.updatedAt), lt(reviewRounds.id, after.id)))!);
  }
  const rows = db
    .select()
    .from(reviewRounds)
    .where(and(...where))
    .orderBy(desc(reviewRounds.updatedAt), desc(reviewRounds.id))
    .limit(q.limit + 1)
    .all();
  const cut = cutPage(rows, q.limit, total, (r) => ({ updatedAt: r.updatedAt, id: r.id }));
  return { reviews: cut.rows.map((r) => presentRound(db, actor, r)), page: cut.page };
}

/** The review state of a page of a deck's versions (newest first), and its latest approved version. */
export function deckReviewStatus(db: Db, firmId: number, deckId: number, req: PageRequest = { limit: DEFAULT_PAGE }) {
  const { versions, page } = listVersions(db, firmId, deckId, req);
  const ids = versions.map((v) => v.id);
  const rounds = ids.length ? db.select().from(reviewRounds).where(and(eq(reviewRounds.deckId, deckId), inArray(reviewRounds.versionId, ids))).orderBy(desc(reviewRounds.id)).all() : [];
  const out = versions.map((v) => {
    const latest = rounds.find((r) => r.versionId === v.id);
    const state: VersionReviewState = !latest || latest.state === 'withdrawn' ? 'in-progress' : latest.state;
    return { versionId: v.id, number: v.number, state, stateLabel: STATE_WORDS[state], roundId: latest?.id ?? null };
  });
  const approved = db
    .select({ number: deckVersions.number })
    .from(reviewRounds)
    .innerJoin(deckVersions, eq(deckVersions.id, reviewRounds.versionId))
    .where(and(eq(reviewRounds.deckId, deckId), eq(reviewRounds.state, 'approved')))
    .orderBy(desc(deckVersions.number))
    .limit(1)
    .get();
  return { deckId, versions: out, page, latestApprovedNumber: approved?.number ?? null };
}

/** Users of the firm who may be chosen as reviewer (not the caller, not disabled). */
export function listReviewers(db: Db, actor: Actor) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .innerJoin(userRoles, and(eq(userRoles.userId, users.id), eq(userRoles.role, 'reviewer')))
    .where(and(eq(users.firmId, actor.firmId), eq(users.disabled, false), ne(users.id, actor.id)))
    .orderBy(asc(users.name))
    .all();
}

function reviewLink(publicUrl: string, roundId: number) {
  return `${publicUrl.replace(/\/$/, '')}/reviews/${roundId}`;
}

const reviewerError = (message: string) => ApiError.badRequest(`reviewerId: ${message}`, [{ path: 'body.reviewerId', message }]);

export function submitForReview(deps: ReviewDeps, actor: Actor, body: SubmitBody): ReviewView {
  const { db } = deps;
  const row = findVersion(db, actor.firmId, body.versionId);
  if (row.p.archived) throw ApiError.conflict('the project is archived: restore it before submitting for review');

  const reviewer = db.select().from(users).where(and(eq(users.id, body.reviewerId), eq(users.firmId, actor.firmId))).get();
  if (!reviewer) throw reviewerError('no such user in your firm');
  if (reviewer.disabled) throw reviewerError(`${reviewer.name} is disabled`);
  const roles = db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, reviewer.id)).all().map((x) => x.role);
  if (!roles.includes('reviewer')) throw reviewerError(`${reviewer.name} does not hold the reviewer role`);
  if (reviewer.id === actor.id) throw reviewerError('you cannot review your own submission: choose another reviewer');
  if (reviewer.id === row.v.createdBy) throw reviewerError(`${reviewer.name} saved this version and cannot review it`);

  const latest = latestNumber(db, row.d.id);
  if (row.v.number !== latest) throw ApiError.conflict(`version ${row.v.number} is not the newest version of “${row.d.name}” (${latest}): submit the newest`);
  const ofVersion = db.select().from(reviewRounds).where(eq(reviewRounds.versionId, row.v.id)).all();
  if (ofVersion.some((r) => r.state === 'approved')) throw ApiError.conflict(`version ${row.v.number} is already approved: an approved version is locked`);
  if (ofVersion.some((r) => r.state === 'sent-back')) throw ApiError.conflict(`version ${row.v.number} was sent back: save a new version with the changes and submit that`);
  const open = db.select().from(reviewRounds).where(and(eq(reviewRounds.deckId, row.d.id), eq(reviewRounds.state, 'awaiting-review'))).get();
  if (open) {
    const by = userRef(db, open.reviewerId)!;
    throw ApiError.conflict(`version ${findVersion(db, actor.firmId, open.versionId).v.number} of “${row.d.name}” is already awaiting review by ${by.name}: withdraw it first`);
  }
  const lastDecided = db
    .select()
    .from(reviewRounds)
    .where(and(eq(reviewRounds.deckId, row.d.id), inArray(reviewRounds.state, ['approved', 'sent-back'])))
    .orderBy(desc(reviewRounds.id))
    .get();
  const previous = lastDecided?.state === 'sent-back' ? lastDecided : undefined;

  let round: ReviewRoundRow;
  try {
    round = db.transaction((tx) => {
      const r = tx
        .insert(reviewRounds)
        .values({
          firmId: actor.firmId,
          projectId: row.p.id,
          deckId: row.d.id,
          versionId: row.v.id,
          submittedBy: actor.id,
          reviewerId: reviewer.id,
          previousRoundId: previous?.id ?? null,
          submissionNote: body.note,
        })
        .returning()
        .get();
      const answering = previous ? `, answering the comments on version ${findVersion(db, actor.firmId, previous.versionId).v.number}` : '';
      recordAudit(tx, {
        firmId: actor.firmId,
        projectId: row.p.id,
        actorId: actor.id,
        action: 'submit',
        entityType: 'review',
        entityId: r.id,
        summary: `submitted version ${row.v.number} of deck “${row.d.name}” for review by ${reviewer.name}${answering}`,
      });
      return r;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw ApiError.conflict(`“${row.d.name}” already has a version awaiting review`);
    throw e;
  }
  deps.mailer.queue(
    reviewRequestedMessage({
      firmId: actor.firmId,
      to: { name: reviewer.name, email: reviewer.email },
      from: actor.name,
      version: versionRef(row),
      note: body.note,
      link: reviewLink(deps.publicUrl, round.id),
      resubmission: previous !== undefined,
    }),
  );
  return presentRound(db, actor, round);
}

function closedMessage(r: ReviewRoundRow, versionNumber: number): string {
  switch (r.state) {
    case 'approved':
      return `version ${versionNumber} is approved: an approved version is locked`;
    case 'sent-back':
      return `version ${versionNumber} was sent back: this round is closed`;
    case 'withdrawn':
      return `the submission of version ${versionNumber} was withdrawn: this round is closed`;
    default:
      return `version ${versionNumber} is awaiting review`;
  }
}

/** Updates an open round inside a transaction; a concurrent change makes it a 409. */
function updateOpenRound(tx: Pick<Db, 'update'>, roundId: number, set: Partial<typeof reviewRounds.$inferInsert>): void {
  const res = tx
    .update(reviewRounds)
    .set({ ...set, updatedAt: new Date().toISOString() })
    .where(and(eq(reviewRounds.id, roundId), eq(reviewRounds.state, 'awaiting-review')))
    .run();
  if (res.changes !== 1) throw ApiError.conflict('the review changed meanwhile: reload and try again');
}

export function withdrawReview(deps: ReviewDeps, actor: Actor, roundId: number): ReviewView {
  const { db } = deps;
  const r = findRound(db, actor.firmId, roundId);
  const row = findVersion(db, actor.firmId, r.versionId);
  if (actor.id !== r.submittedBy) throw ApiError.forbidden('only the designer who submitted this version may withdraw it');
  if (r.state !== 'awaiting-review') throw ApiError.conflict(closedMessage(r, row.v.number));
  db.transaction((tx) => {
    updateOpenRound(tx, r.id, { state: 'withdrawn' });
    recordAudit(tx, { firmId: actor.firmId, projectId: r.projectId, actorId: actor.id, action: 'withdraw', entityType: 'review', entityId: r.id, summary: `withdrew version ${row.v.number} of deck “${row.d.name}” from review` });
  });
  return presentRound(db, actor, findRound(db, actor.firmId, r.id));
}

export function addComment(deps: ReviewDeps, actor: Actor, roundId: number, body: CommentBody) {
  const { db } = deps;
  const r = findRound(db, actor.firmId, roundId);
  const row = findVersion(db, actor.firmId, r.versionId);
  if (!isParticipant(actor.id, r, row.v)) throw ApiError.forbidden('only the reviewer and the designer of this round may comment');
  if (r.state === 'approved' || r.state === 'withdrawn') throw ApiError.conflict(closedMessage(r, row.v.number));
  if (body.parentId !== undefined) {
    const parent = db.select().from(reviewComments).where(and(eq(reviewComments.id, body.parentId), eq(reviewComments.roundId, r.id))).get();
    if (!parent) throw ApiError.badRequest('parentId: no such comment in this review round', [{ path: 'body.parentId', message: 'no such comment in this review round' }]);
  }
  if (body.anchor?.girder !== undefined) {
    const n = girderCountOf(row.v);
    if (body.anchor.girder > n) {
      throw ApiError.badRequest(`anchor.girder: the deck has ${n} girders`, [{ path: 'body.anchor.girder', message: `the deck has ${n} girders (1 to ${n})` }]);
    }
  }
  const c = db.transaction((tx) => {
    const c = tx
      .insert(reviewComments)
      .values({ roundId: r.id, authorId: actor.id, parentId: body.parentId ?? null, body: body.body, anchorJson: body.anchor ? JSON.stringify(body.anchor) : null })
      .returning()
      .get();
    const what = body.parentId !== undefined ? 'answered a comment' : 'commented';
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId: r.projectId,
      actorId: actor.id,
      action: 'comment',
      entityType: 'review',
      entityId: r.id,
      summary: `${what} on version ${row.v.number} of deck “${row.d.name}” (${anchorWords(body.anchor ?? null)})`,
    });
    return c;
  });
  return presentComment(db, c);
}

function mayDecide(actor: Actor, r: ReviewRoundRow, v: DeckVersionRow, reviewerName: string): void {
  if (isOwnVersion(actor.id, r, v)) throw ApiError.forbidden('you saved or submitted this version: you cannot review your own work');
  if (actor.id !== r.reviewerId) throw ApiError.forbidden(`only the assigned reviewer (${reviewerName}) may decide on this version`);
}

/** A decision's stored conditions and their sentence (both null for a decision recorded before conditions were kept). */
function conditionsView(text: string | null) {
  const conditions = parseConditions(text);
  return { conditions, conditionsWords: conditions ? conditionsWords(conditions) : null };
}

export function recordRefinedDecision(deps: ReviewDeps, actor: Actor, roundId: number, body: RefinedBody): ReviewView {
  const { db } = deps;
  const r = findRound(db, actor.firmId, roundId);
  const row = findVersion(db, actor.firmId, r.versionId);
  mayDecide(actor, r, row.v, userRef(db, r.reviewerId)!.name);
  if (r.state !== 'awaiting-review') throw ApiError.conflict(closedMessage(r, row.v.number));
  const changed = r.refinedJustified !== null;
  // the evidence the decision is made on, kept with it
  const conditions = decisionConditions(db, row.v);
  db.transaction((tx) => {
    updateOpenRound(tx, r.id, { refinedJustified: body.justified, refinedReason: body.reason, refinedDecidedAt: conditions.at, refinedConditions: JSON.stringify(conditions) });
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId: r.projectId,
      actorId: actor.id,
      action: changed ? 'change' : 'refined-decision',
      entityType: 'review',
      entityId: r.id,
      summary: `${changed ? 'changed the refined-analysis decision to' : 'recorded for'} version ${row.v.number} of deck “${row.d.name}”${changed ? '' : ':'} ${REFINED_WORDS(body.justified)} — ${body.reason}. ${conditionsWords(conditions)}`,
    });
  });
  return presentRound(db, actor, findRound(db, actor.firmId, r.id));
}

export function decide(deps: ReviewDeps, actor: Actor, roundId: number, body: DecisionBody): ReviewView {
  const { db } = deps;
  const r = findRound(db, actor.firmId, roundId);
  const row = findVersion(db, actor.firmId, r.versionId);
  mayDecide(actor, r, row.v, userRef(db, r.reviewerId)!.name);
  if (r.state !== 'awaiting-review') throw ApiError.conflict(closedMessage(r, row.v.number));
  if (body.outcome === 'approve' && r.refinedJustified === null) {
    throw ApiError.conflict('record whether a refined analysis is justified (with the reason) before approving');
  }
  const approve = body.outcome === 'approve';
  const now = new Date().toISOString();
  db.transaction((tx) => {
    updateOpenRound(tx, r.id, { state: approve ? 'approved' : 'sent-back', decidedBy: actor.id, decidedAt: now, decisionNote: body.note });
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId: r.projectId,
      actorId: actor.id,
      action: approve ? 'approve' : 'return',
      entityType: 'review',
      entityId: r.id,
      summary: approve
        ? `approved version ${row.v.number} of deck “${row.d.name}”${body.note ? `: ${body.note}` : ''}`
        : `sent back version ${row.v.number} of deck “${row.d.name}”: ${body.note}`,
    });
  });
  const decided = findRound(db, actor.firmId, r.id);
  const link = reviewLink(deps.publicUrl, r.id);
  const recipients = [...new Set([r.submittedBy, row.v.createdBy])].map((id) => userRef(db, id)!).filter((u) => u.email);
  for (const to of recipients) {
    if (approve) {
      deps.mailer.queue(versionApprovedMessage({ firmId: actor.firmId, to, reviewer: actor.name, version: versionRef(row), note: body.note, refined: `${REFINED_WORDS(decided.refinedJustified!)} — ${decided.refinedReason}`, link }));
    } else {
      const count = db.select({ id: reviewComments.id }).from(reviewComments).where(eq(reviewComments.roundId, r.id)).all().length;
      deps.mailer.queue(versionSentBackMessage({ firmId: actor.firmId, to, reviewer: actor.name, version: versionRef(row), note: body.note, commentCount: count, link }));
    }
  }
  return presentRound(db, actor, decided);
}

/** Rounds a user takes part in that are still open (for a dashboard count). */
export function openRoundsFor(db: Db, actor: Actor) {
  return db
    .select({ id: reviewRounds.id })
    .from(reviewRounds)
    .where(and(eq(reviewRounds.firmId, actor.firmId), eq(reviewRounds.state, 'awaiting-review'), or(eq(reviewRounds.reviewerId, actor.id), eq(reviewRounds.submittedBy, actor.id))))
    .all().length;
}
