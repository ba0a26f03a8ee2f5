/**
 * /api/reviews — review rounds of deck versions.
 * - GET  /                      review:read    list (?view=assigned|submitted|all, ?state, ?deckId)
 * - GET  /reviewers             review:submit  users who may be chosen as reviewer
 * - GET  /status?deckId=        review:read    review state of every version of a deck
 * - POST /                      review:submit  submit `{ versionId, reviewerId, note? }`
 * - GET  /:reviewId             review:read    the round, its comments, earlier rounds, the refined-analysis summary
 * - POST /:reviewId/comments    review:comment `{ body, anchor?, parentId? }` (reviewer and designer of the round)
 * - PUT  /:reviewId/refined-analysis  review:decide `{ justified, reason }` (the assigned reviewer)
 * - POST /:reviewId/decision    review:decide  `{ outcome: 'approve'|'send-back', note }` (the assigned reviewer)
 * - POST /:reviewId/withdraw    review:submit  (the submitter, while awaiting review)
 */
import { Router } from 'express';
import type { Config } from '../../config/env.js';
import type { Db } from '../../db/client.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import type { Mailer } from '../../mail/mailer.js';
import { commentBody, decisionBody, listQuery, refinedBody, statusQuery, submitBody } from './reviewModel.js';
import { addComment, decide, deckReviewStatus, findRound, getReview, listReviewers, listReviews, recordRefinedDecision, submitForReview, withdrawReview, type ReviewDeps } from './reviewService.js';
import { refinedSummaryOf } from './refinedSummary.js';
import { startRefinedResults } from './refinedResults.js';
import { ApiError } from '../../middleware/errors.js';
import { answerWithJob, pendingJobView, prefersAsync } from '../jobs/pendingJob.js';
import { findVersion } from './reviewService.js';
import { assertResultsVisible } from '../training/withheldResults.js';
import type { RefinedPool } from '../../compute/refinedPool.js';

export function reviewRouter(db: Db, config: Config, mailer: Mailer, pool: RefinedPool): Router {
  const r = Router();
  const deps: ReviewDeps = { db, mailer, publicUrl: config.publicUrl };
  const reviewId = validate({ params: idParams('reviewId') });

  r.get('/', allow('review:read'), validate({ query: listQuery }), (req, res) => {
    res.json(listReviews(db, req.user!, res.locals.query));
  });
  r.get('/reviewers', allow('review:submit'), (req, res) => {
    res.json({ reviewers: listReviewers(db, req.user!) });
  });
  r.get('/status', allow('review:read'), validate({ query: statusQuery }), (req, res) => {
    res.json(deckReviewStatus(db, req.user!.firmId, res.locals.query.deckId, res.locals.query));
  });
  r.post('/', allow('review:submit'), validate({ body: submitBody }), (req, res) => {
    res.status(201).json({ review: submitForReview(deps, req.user!, res.locals.body) });
  });
  r.get('/:reviewId', allow('review:read'), reviewId, async (req, res) => {
    const round = findRound(db, req.user!.firmId, res.locals.params.reviewId);
    // The round's comments and summary quote the version's results.
    assertResultsVisible(db, req.user!, round.versionId);
    const review = getReview(db, req.user!, round.id);
    const v = findVersion(db, req.user!.firmId, round.versionId).v;
    // A client that prefers to poll gets the round at once with 202 and the refined job the summary waits for.
    const async = prefersAsync(req);
    const refined = startRefinedResults(db, pool, v, req.user!);
    const pending = async ? pendingJobView(db, pool, req.user!.firmId, refined) : null;
    if (pending) {
      answerWithJob(res, pending, { review, summary: null });
      return;
    }
    let summary;
    try {
      summary = await refinedSummaryOf(db, pool, v, await refined.results);
    } catch (e) {
      // The pool refused the run now (a limit, or full) or it was cancelled: that client still gets the round, with the reason where the summary would be.
      if (!(async && e instanceof ApiError && (e.status === 429 || e.status === 503 || e.status === 409))) throw e;
      const retryAfter = Number(e.headers?.['Retry-After']);
      res.json({ review, summary: null, job: null, refusal: { code: e.code, message: e.message, retryAfterSeconds: Number.isFinite(retryAfter) ? retryAfter : null } });
      return;
    }
    res.json({ review, summary });
  });
  r.post('/:reviewId/comments', allow('review:comment'), validate({ params: idParams('reviewId'), body: commentBody }), (req, res) => {
    res.status(201).json({ comment: addComment(deps, req.user!, res.locals.params.reviewId, res.locals.body) });
  });
  r.put('/:reviewId/refined-analysis', allow('review:decide'), validate({ params: idParams('reviewId'), body: refinedBody }), (req, res) => {
    res.json({ review: recordRefinedDecision(deps, req.user!, res.locals.params.reviewId, res.locals.body) });
  });
  r.post('/:reviewId/decision', allow('review:decide'), validate({ params: idParams('reviewId'), body: decisionBody }), (req, res) => {
    res.json({ review: decide(deps, req.user!, res.locals.params.reviewId, res.locals.body) });
  });
  r.post('/:reviewId/withdraw', allow('review:submit'), reviewId, (req, res) => {
    res.json({ review: withdrawReview(deps, req.user!, res.locals.params.reviewId) });
  });
  return r;
}
